// The direct path of `brittle calc` (cli/direct-evaluation.ts) against the reference it must match
// exactly: the embedded engine, HyperFormula 3.5 (cli/evaluate-workbook.ts), on the same workbooks.
// Each case states whether the direct path takes it, so a path that quietly declined everything
// (and so matched trivially) fails here; declined cases must still give the engine's result.
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { evaluateDirectly, isTextKeptAsWritten, parseCall } from "../cli/direct-evaluation";
import { evaluateWorkbook } from "../cli/evaluate-workbook";
import { parseCsv, readCsvBytes, type LoadedWorkbook } from "../cli/workbook-io";
import { main, type Io } from "../cli/cli";
import { checkRangeBudget } from "../cli/range-budget";
import { guarded } from "../functions/registry";
import { spillShapes } from "../functions/spill-shapes";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { SeededRandom } from "../src/numeric/random";

let metadata: FunctionMetadata[];
beforeAll(async () => {
  metadata = (await generateMetadata()).functions;
});

const csv = (text: string): LoadedWorkbook => ({ kind: "csv", sheets: { Sheet: parseCsv(text) } });

function direct(workbook: LoadedWorkbook) {
  return evaluateDirectly(workbook, metadata, guarded, new Set(Object.keys(spillShapes)));
}

/** Both paths on one workbook: the direct result (when taken) equals the engine's, cell for cell. */
function crossCheck(workbook: LoadedWorkbook): boolean {
  const engine = evaluateWorkbook(workbook, metadata);
  const fast = direct(workbook);
  if (fast) {
    expect(fast.grids).toEqual(engine.grids);
    expect(fast.formulas).toEqual(engine.formulas);
    expect(fast.refusedNames).toEqual(engine.refusedNames);
  }
  return fast !== undefined;
}

// Strengths for the inputs only (the reference is the engine, not these numbers).
const strengths = ["strength", "412.5", "388.1", "455.0", "401.7", "367.9", "430.2"];

/** A field as a CSV writes it: quoted when it holds a comma or a quote. */
const field = (v: string) => (/[",]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);

/** The strengths in column A, the formulas in column B (one a row), column C left blank. */
function sheetWith(...formulas: string[]): string {
  const lines: string[] = [];
  for (let i = 0; i < Math.max(strengths.length, formulas.length); i++) lines.push(`${strengths[i] ?? ""},${field(formulas[i] ?? "")},`);
  return lines.join("\n") + "\n";
}

/** One column, a cell a line. */
const column = (...cells: string[]) => cells.map(field).join("\n") + "\n";

describe("taken directly, with the engine's results", () => {
  const cases: [string, string[]][] = [
    ["modulus and characteristic strength", ["=BRITTLE.MODULUS(A2:A7)", "=BRITTLE.CHARSTRENGTH($A$2:$A$7)"]],
    ["a method given as text, a censoring range of blanks", ['=BRITTLE.MODULUS(A2:A7,C2:C7,"LSQ")', '=BRITTLE.CHARSTRENGTH(A2:A7,C2:C7,"MLE-RAW")']],
    ["a range reaching past the data (blanks)", ["=BRITTLE.MODULUS(A2:A40)"]],
    ["number literals, negative ones too", ["=BRITTLE.FAILPROB(300,10,400)", "=BRITTLE.FAILPROB(-5,10,400)", "=BRITTLE.DESIGNSTRESS(0.999,10,400,40)"]],
    ["a single cell as a range", ["=BRITTLE.MODULUS(A2)"]],
    ["one cell holding a number as a number argument", ["=BRITTLE.FAILPROB(A2,10,400)"]],
    ["a method the function does not know", ['=BRITTLE.MODULUS(A2:A7,C2:C7,"NEWTON")']],
    ["a range holding the header text", ["=BRITTLE.MODULUS(A1:A7)"]],
    ["a range of blanks only", ["=BRITTLE.MODULUS(Z2:Z9)"]],
    ["ranges and number arguments reading formula cells, in a chain", ["=BRITTLE.MODULUS(A2:A7)", "=BRITTLE.CHARSTRENGTH(A2:A7)", "=BRITTLE.DESIGNSTRESS(0.999,B1,B2,40)", "=BRITTLE.FAILPROB(B3,B1,B2)", "=BRITTLE.MODULUS(B1:B2)"]],
    // The engine's plugin passes null for an empty argument (cli/engine.ts), required or optional.
    ["empty arguments: an optional range, a trailing one, a required number", ['=BRITTLE.MODULUS(A2:A7,,"LSQ")', '=BRITTLE.CHARSTRENGTH(A2:A7,,"MLE-RAW")', "=BRITTLE.MODULUS(A2:A7,)", "=BRITTLE.FAILPROB(300,,400)", "=BRITTLE.FAILPROB(,10,400)", "=BRITTLE.MODULUS(,)"]],
    ["a formula read before its own row is reached", ["=BRITTLE.FAILPROB(B7,10,400)", "", "", "", "", "", "=BRITTLE.CHARSTRENGTH(A2:A7)"]],
  ];
  for (const [name, formulas] of cases) {
    it(name, () => {
      expect(crossCheck(csv(sheetWith(...formulas)))).toBe(true);
    });
  }

  it("a quoted number, which the CSV reader reads as a number (quotes only protect delimiters)", () => {
    expect(crossCheck(csv('410\n"388"\n395\n=BRITTLE.MODULUS(A1:A3)\n'))).toBe(true);
  });

  it("errors inside a range: text, TRUE, a blank, too few values", () => {
    const text = "x,y,z\n410,n/a,TRUE\n395,388,\n,402,\n=BRITTLE.MODULUS(A2:A4),=BRITTLE.MODULUS(B2:B4),=BRITTLE.MODULUS(C2:C4)\n";
    expect(crossCheck(csv(text))).toBe(true);
    const got = direct(csv(text))!;
    expect(got.formulas.every((f) => f.error !== undefined)).toBe(true); // each of these is an error cell in the engine too
  });

  it("a thousand rows of thirty seeded strengths, two fits per row", () => {
    const random = new SeededRandom(20261202);
    const lines = [Array.from({ length: 30 }, (_, k) => `s${k + 1}`).concat(["m", "sigma0"]).join(",")];
    for (let r = 2; r <= 1001; r++) {
      const row = Array.from({ length: 30 }, () => (300 * Math.pow(random.exponential(), 1 / 12)).toFixed(3));
      lines.push([...row, `=BRITTLE.MODULUS(A${r}:AD${r})`, `=BRITTLE.CHARSTRENGTH(A${r}:AD${r})`].join(","));
    }
    expect(crossCheck(csv(lines.join("\n")))).toBe(true);
  });
});

describe("left to the engine", () => {
  const declined: [string, string][] = [
    ["a range reaching a formula cell whose result is an error", column("410", "=BRITTLE.MODULUS(A1)", "=BRITTLE.MODULUS(A1:A2)")],
    ["a number argument from a formula cell whose result is an error", column("410", "=BRITTLE.MODULUS(A1)", "=BRITTLE.FAILPROB(A2,10,400)")],
    ["a circular reference", column("410", "388", "=BRITTLE.MODULUS(A1:A4)", "=BRITTLE.FAILPROB(A3,10,400)")],
    ["a formula reading itself", column("410", "388", "=BRITTLE.MODULUS(A1:A3)")],
    ["a number argument from a blank cell", "strength,other\n410,\n,\n\"=BRITTLE.FAILPROB(B2,10,400)\",\n"],
    ["a number argument from a text cell", column("strength", "=BRITTLE.FAILPROB(A1,10,400)")],
    ["percent text in a range", '410\n"50%"\n395\n=BRITTLE.MODULUS(A1:A3)\n'],
    ["currency text", '410\n"$5"\n395\n=BRITTLE.MODULUS(A1:A3)\n'],
    ["a date as text", "410\n12/05/2020\n395\n=BRITTLE.MODULUS(A1:A3)\n"],
    ["a time as text", '410\n"3 pm"\n395\n=BRITTLE.MODULUS(A1:A3)\n'],
    ["an apostrophe-prefixed value", "410\n'388\n395\n=BRITTLE.MODULUS(A1:A3)\n"],
    ["an error code as text", '410\n"#N/A"\n395\n=BRITTLE.MODULUS(A1:A3)\n'],
    ["TRUE as quoted text", '410\n"TRUE"\n395\n=BRITTLE.MODULUS(A1:A3)\n'],
    ["a built-in function", column("410", "388", "395", "=SUM(A1:A3)")],
    ["arithmetic around a call", column("410", "388", "395", "=BRITTLE.MODULUS(A1:A3)+1")],
    ["a lower-case name", column("410", "388", "395", "=brittle.modulus(A1:A3)")],
    ["spaces", column("410", "388", "395", "=BRITTLE.MODULUS( A1:A3 )")],
    ["an array result", column("410", "388", "395", "=BRITTLE.FIT(A1:A3)")],
    ["an unknown function", column("410", "388", "395", "=BRITTLE.NOPE(A1:A3)")],
    ["too many arguments", column("410", "388", "395", '=BRITTLE.MODULUS(A1:A3,A1:A3,"MLE","x")')],
    ["too few arguments", column("=BRITTLE.FAILPROB(300,10)")],
    ["another sheet", column("410", "388", "395", "=BRITTLE.MODULUS(Sheet!A1:A3)")],
    ["a column range", column("410", "388", "395", "=BRITTLE.MODULUS(A:A)")],
    ["a reversed range", column("410", "388", "395", "=BRITTLE.MODULUS(A3:A1)")],
    ["a range to the last row", column("410", "388", "395", "=BRITTLE.MODULUS(A1:A1048576)")],
    ["an exponent literal", column("=BRITTLE.FAILPROB(3e2,10,400)")],
    ["minus zero as a literal", column("=BRITTLE.FAILPROB(-0,10,400)")],
    ["a text literal with a doubled quote", column("410", "388", "395", '=BRITTLE.MODULUS(A1:A3,B1:B3,"a""b")')],
    ["a number given where a range belongs", column("=BRITTLE.MODULUS(5)")],
  ];
  for (const [name, text] of declined) {
    it(name, () => {
      expect(crossCheck(csv(text))).toBe(false);
    });
  }

  it("an .xlsx workbook, and defined names", () => {
    const sheets = { Sheet: parseCsv("410\n388\n395\n=BRITTLE.MODULUS(A1:A3)") };
    expect(direct({ kind: "xlsx", sheets })).toBeUndefined();
    expect(direct({ kind: "csv", sheets, names: [{ name: "S", formula: "Sheet!$A$1:$A$3" } as never] })).toBeUndefined();
  });
});

describe("the shipped example", () => {
  it("examples/quick-check.csv (a design stress from the fitted cells) is taken, with the engine's results", () => {
    const rows = readCsvBytes(readFileSync(join(import.meta.dirname, "..", "examples", "quick-check.csv"))).rows;
    expect(crossCheck({ kind: "csv", sheets: { "quick-check": rows } })).toBe(true);
  });
});

describe("the hostile .csv corpus (test/fixtures/hostile)", () => {
  const dir = join(import.meta.dirname, "fixtures", "hostile");
  const files = readdirSync(dir).filter((f) => f.endsWith(".csv"));
  it("gives the engine's result on every file that reads", () => {
    expect(files.length).toBeGreaterThan(10);
    let taken = 0;
    for (const file of files) {
      let rows;
      try {
        rows = readCsvBytes(readFileSync(join(dir, file))).rows;
      } catch {
        continue; // files the reader refuses never reach an evaluator
      }
      const workbook: LoadedWorkbook = { kind: "csv", sheets: { [file.replace(/\W/g, "_")]: rows } };
      try {
        checkRangeBudget(workbook, file);
      } catch {
        continue; // refused before evaluation, as brittle calc does
      }
      if (crossCheck(workbook)) taken++;
    }
    expect(taken).toBeGreaterThan(0);
  });

  it("calc-text-read-as-values.csv: text the engine reads as numbers inside a BRITTLE range goes to the engine", () => {
    const rows = readCsvBytes(readFileSync(join(dir, "calc-text-read-as-values.csv"))).rows;
    const workbook: LoadedWorkbook = { kind: "csv", sheets: { S: rows } };
    expect(crossCheck(workbook)).toBe(false);
    // The engine reads "50%" as 0.5, "$5" as 5 and "3 pm" as a time: the fit sees numbers there, not text.
    expect(evaluateWorkbook(workbook, metadata).grids.S[1][1]).toBe(0.5);
  });
});

describe("text the engine keeps as written", () => {
  it("headers and labels pass; anything the engine may read as a value does not", () => {
    for (const t of ["strength", "s1", "Modulus (ML unbiased)", "n/a", "GPa 2024", "m", "pm", "$", "%"]) expect(isTextKeptAsWritten(t), t).toBe(true);
    for (const t of ["50%", "$5", "1e3", "12/05/2020", "3 pm", "am 1", "- pm", "\tpm", "TRUE", "false", "#N/A", "'x1", "", " ", "=A1", "1é"])
      expect(isTextKeptAsWritten(t), t).toBe(false);
  });

  it("agrees with the engine on each of those texts shown in a cell", () => {
    for (const t of ["strength", "s1", "Modulus (ML unbiased)", "n/a", "GPa 2024", "m", "pm", "$", "%"]) {
      const engine = evaluateWorkbook({ kind: "csv", sheets: { S: [[t]] } }, metadata);
      expect(engine.grids.S).toEqual([[t]]);
    }
  });
});

describe("formula reading", () => {
  it("splits arguments at commas outside quotes", () => {
    expect(parseCall('=BRITTLE.MODULUS(A2:AD2,B1,"a,b")')).toEqual({
      name: "MODULUS",
      args: [
        { kind: "range", top: 1, left: 0, bottom: 1, right: 29 },
        { kind: "range", top: 0, left: 1, bottom: 0, right: 1 },
        { kind: "text", value: "a,b" },
      ],
    });
    expect(parseCall('=BRITTLE.MODULUS(A1,"open)')).toBeUndefined();
  });
});

describe("brittle calc on a .csv the direct path takes", () => {
  it("prints the grid the engine gives", async () => {
    const { mkdtempSync, writeFileSync } = await import("node:fs");
    const { tmpdir } = await import("node:os");
    const file = join(mkdtempSync(join(tmpdir(), "brittle-direct-")), "bars.csv");
    const text = "strength,m\n412.5,=BRITTLE.MODULUS(A2:A7)\n388.1,=BRITTLE.CHARSTRENGTH(A2:A7)\n455.0,\n401.7,\n367.9,\n430.2,\n";
    writeFileSync(file, text);
    let stdout = "";
    const io: Io = { out: (t) => (stdout += t), err: () => {} };
    expect(await main(["calc", file, "--json"], io)).toBe(0);
    const workbook = { kind: "csv" as const, sheets: { bars: parseCsv(text) } };
    expect(direct(workbook)).toBeDefined();
    expect(JSON.parse(stdout)).toEqual(evaluateWorkbook(workbook, metadata).grids);
  });
});
