// End to end: a workbook of formulas typed as a user would (mixed case,
// blanks in ranges, the saved _xldudf_ form, errors in inputs) evaluated in
// the embedded engine and through the brittle command. Reference values:
// the 40-digit ML solution (mpmath, weibull_fits.json) and mpmath
// distribution values (weibull_distribution.json).
import { mkdtempSync, writeFileSync, existsSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import ExcelJS from "exceljs";
import { beforeAll, describe, expect, it } from "vitest";
import { main, type Io } from "../cli/cli";
import { evaluateWorkbook } from "../cli/evaluate-workbook";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { normaliseFormula } from "../cli/engine";
import { parseCsv } from "../cli/workbook-io";
import { fixture, relativeError } from "./helpers";

const data = fixture("weibull_fits.json").datasets.find((d: any) => d.id === "complete-n10-m10-s350");
const dist = fixture("weibull_distribution.json").quantileFromSurvival;

let metadata: FunctionMetadata[];
beforeAll(async () => {
  metadata = (await generateMetadata()).functions;
});

function capture(): Io & { stdout: string; stderr: string } {
  const io = { stdout: "", stderr: "", out: (t: string) => (io.stdout += t), err: (t: string) => (io.stderr += t) };
  return io;
}

function sheetWithData(formulas: string[]): (number | string | null)[][] {
  const rows: (number | string | null)[][] = data.strengths.map((s: number) => [s]);
  rows.splice(3, 0, [null]); // a blank row inside the range, as users leave them
  formulas.forEach((f, i) => {
    while (rows.length <= i) rows.push([null]);
    rows[i][1] = f;
  });
  return rows;
}

describe("embedded engine", () => {
  it("evaluates BRITTLE formulas as typed, with blanks in ranges", () => {
    const sheet = sheetWithData([
      '=BRITTLE.MODULUS(A1:A12, , "MLE-RAW")',
      '=brittle.charstrength(A1:A12,,"mle-raw")',
      `=BRITTLE.DESIGNSTRESS(${dist.survival[3]}, ${dist.shape[3]}, ${dist.scale[3]})`,
      "=BRITTLE.FAILPROB(B3, 10, 400)",
      '=_xldudf_BRITTLE_MODULUS(A1:A12,,"MLE-RAW")',
      "=BRITTLE.MODULUS(A1:A12, C1:C12)",
      "=BRITTLE.FAILPROB(-1, 10, 400)",
      '=BRITTLE.FAILPROB("abc", 10, 400)',
      "=BRITTLE.DESIGNSTRESS(1.5, 10, 400)",
      "=BRITTLE.MODULUS(A1:A12, D1:D3)",
      "=BRITTLE.MODULUS(E1:E5)",
    ]);
    const { formulas } = evaluateWorkbook({ kind: "csv", sheets: { Bend: sheet.map((r) => r.map((v) => v ?? null)) } }, metadata);
    const v = formulas.map((f) => f.value);
    expect(relativeError(v[0] as number, data.ml.shapeFloat)).toBeLessThan(1e-12);
    expect(relativeError(v[1] as number, data.ml.scaleFloat)).toBeLessThan(1e-12);
    expect(relativeError(v[2] as number, dist.stress[3])).toBeLessThan(1e-13);
    expect(typeof v[3]).toBe("number");
    expect(v[4]).toBe(v[0]);
    expect(typeof v[5]).toBe("number"); // an all-blank censoring column means no censoring
    expect(v[6]).toBe("#VALUE!");
    expect(v[7]).toBe("#VALUE!");
    expect(v[8]).toBe("#VALUE!");
    expect(v[9]).toBe("#VALUE!"); // mismatched ranges
    expect(v[10]).toBe("#VALUE!"); // an empty range has no specimens
    expect(formulas[9].message).toMatch(/same rows and columns/);
  });

  it("checks every documented example: each 'Example: =... is about V' evaluates to V", () => {
    const examples = metadata
      .map((f) => /Example: (=BRITTLE\.[^\n]*?\)) is about (-?[\d.]+(?:[eE][+-]?\d+)?)/.exec(f.description.replace(/\n/g, " ")))
      .filter((m): m is RegExpExecArray => m !== null);
    expect(examples.length).toBeGreaterThanOrEqual(8);
    const { formulas } = evaluateWorkbook({ kind: "csv", sheets: { Docs: examples.map((m) => [m[1]]) } }, metadata);
    formulas.forEach((f, i) => {
      const want = Number(examples[i][2].replace(/\.$/, ""));
      const digits = examples[i][2].replace(/[eE].*$/, "").replace(/^-?0\.0*|[.-]/g, "").length;
      expect(typeof f.value, f.formula).toBe("number");
      expect(relativeError(f.value as number, want), f.formula).toBeLessThan(Math.max(5 * 10 ** -digits, 1e-12));
    });
  });
});

describe("brittle calc", () => {
  const dir = mkdtempSync(join(tmpdir(), "brittle-calc-"));
  const csv = join(dir, "bend.csv");
  writeFileSync(
    csv,
    ["Strength,Result", ...data.strengths.map((s: number, i: number) => (i === 0 ? `${s},"=BRITTLE.MODULUS(A2:A11,,""MLE-RAW"")"` : i === 1 ? `${s},=BRITTLE.FAILPROB(300;10;400)` : `${s},`))].join("\n") + "\n",
  );

  it("--json prints the computed grid with errors as code text", async () => {
    const io = capture();
    expect(await main(["calc", csv, "--json"], io)).toBe(0);
    const grid = JSON.parse(io.stdout).bend;
    expect(grid[0]).toEqual(["Strength", "Result"]);
    expect(relativeError(grid[1][1], data.ml.shapeFloat)).toBeLessThan(1e-12);
    // A semicolon list separator is a parse error: the engine's own #ERROR! is shown as the standard #VALUE!
    // (ECMA-376 Part 1, 18.17.2.6 lists the error values a file may hold), its message on stderr.
    expect(grid[2][1]).toBe("#VALUE!");
    expect(io.stderr).toMatch(/bend!B3: #VALUE!: the formula cannot be read: ";" where a closing parenthesis \) or a comma was expected/);
  });

  it("--out writes formulas with values, never over the input, and refuses an existing file without --force", async () => {
    const out = join(dir, "bend-filled.xlsx");
    const io = capture();
    expect(await main(["calc", csv, "--out", out], io)).toBe(0);
    const book = new ExcelJS.Workbook();
    await book.xlsx.readFile(out);
    const cell = book.worksheets[0].getCell("B2");
    expect(cell.formula).toBe('BRITTLE.MODULUS(A2:A11,,"MLE-RAW")');
    expect(relativeError(cell.result as number, data.ml.shapeFloat)).toBeLessThan(1e-12);

    const before = readFileSync(csv, "utf8");
    const again = capture();
    expect(await main(["calc", csv, "--out", csv], again)).toBe(2);
    expect(again.stderr).toMatch(/never writes over its input/);
    expect(await main(["calc", csv, "--out", out], capture())).toBe(2);
    expect(await main(["calc", csv, "--out", out, "--force"], capture())).toBe(0);
    expect(readFileSync(csv, "utf8")).toBe(before);

    // The written workbook reads back, and its saved formulas evaluate again.
    const back = capture();
    expect(await main(["calc", out, "--json"], back)).toBe(0);
    expect(relativeError(JSON.parse(back.stdout).bend[1][1], data.ml.shapeFloat)).toBeLessThan(1e-12);
  });

  it("gives a one-line error and a non-zero exit for unreadable or malformed files", async () => {
    const missing = capture();
    expect(await main(["calc", join(dir, "nope.xlsx")], missing)).toBe(1);
    expect(missing.stderr.trim().split("\n")).toHaveLength(1);

    const broken = join(dir, "broken.xlsx");
    writeFileSync(broken, "this is not a zip archive");
    const bad = capture();
    expect(await main(["calc", broken], bad)).toBe(1);
    expect(bad.stderr).toMatch(/cannot read .*broken\.xlsx/);
    expect(bad.stderr.trim().split("\n")).toHaveLength(1);

    const quote = join(dir, "quote.csv");
    writeFileSync(quote, 'a,"unclosed\n1,2\n');
    const q = capture();
    expect(await main(["calc", quote], q)).toBe(1);
    expect(q.stderr).toMatch(/quoted field/);

    const other = capture();
    expect(await main(["calc", join(dir, "data.ods")], other)).toBe(1);
    expect(await main(["calc"], capture())).toBe(2);
    expect(await main(["frobnicate"], capture())).toBe(2);
    expect(existsSync(join(dir, "data.ods"))).toBe(false);
  });
});

describe("formula text the engine could not read as a spreadsheet does", () => {
  it("rewrites saved add-in names and upper-case exponents, never inside text", () => {
    expect(normaliseFormula('=_xldudf_BRITTLE_fit(A1:A9)+1E-3*2.5E+3-"_xldudf_BRITTLE_X(3E5)"')).toBe(
      '=BRITTLE.FIT(A1:A9)+1e-3*2.5e+3-"_xldudf_BRITTLE_X(3E5)"',
    );
    expect(normaliseFormula("=LOG10(A1)*E3")).toBe("=LOG10(A1)*E3");
  });

  it("writes TRUE and FALSE in an array constant as the functions, leaving text, calls and names outside arrays alone", () => {
    expect(normaliseFormula('=BRITTLE.FIT({412;398},{FALSE;true},"MLE")')).toBe('=BRITTLE.FIT({412;398},{FALSE();TRUE()},"MLE")');
    expect(normaliseFormula('=AND({"TRUE",TRUE ;FALSE()})+IF(TRUE,1,0)')).toBe('=AND({"TRUE",TRUE() ;FALSE()})+IF(TRUE,1,0)');
    expect(normaliseFormula('={"a}",TRUE}')).toBe('={"a}",TRUE()}');
    expect(normaliseFormula("={1;TRUEX}")).toBe("={1;TRUEX}");
  });
});

describe("CSV reading", () => {
  it("reads quoted fields, doubled quotes, numbers, booleans and formulas", () => {
    expect(parseCsv('a,"b, c","say ""hi""",1.5e3,TRUE,"=BRITTLE.MEANSTRENGTH(10,400)"\r\n,,\n')).toEqual([
      ["a", "b, c", 'say "hi"', 1500, true, "=BRITTLE.MEANSTRENGTH(10,400)"],
      [],
    ]);
  });
});
