// Hostile files from ordinary machines, second sweep (test/fixtures/hostile/): each case names what the
// reader did before (a wrong number, a dropped row, a verdict from misread data, an unhelpful message)
// and checks the right value or the exact refusal. Values come from the file's own text read by the
// rule stated beside them, or from Number() per ECMAScript.
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import JSZip from "jszip";
import { afterAll, describe, expect, it } from "vitest";
import { main } from "../cli/cli";
import { runPartCommand } from "../cli/part-command";
import { firstDuplicateKey } from "../src/design/json-duplicate-keys";
import { fixture, relativeError } from "./helpers";

const HOSTILE = "test/fixtures/hostile";
const at = (name: string) => join(HOSTILE, name);

// The strengths in the csv-* files are dataset complete-n10-m10-s350; its maximum-likelihood modulus and
// characteristic strength are 40-digit mpmath solutions (test/fixtures/generate_weibull_fits.py -> weibull_fits.json).
const data = fixture("weibull_fits.json").datasets.find((d: { id: string }) => d.id === "complete-n10-m10-s350");

// The element table of part-european.csv (stresses 100.5, -40, 250; sizes 2, 1, 0.5). Source: the definitions
// S_E = sum V_e (s_e / s_max)^m and Pf = 1 - exp(-S_E (s_max / sigma_0)^m) (ASTM C1683, Annex A3; compression counts nothing).
const S = 2 * (100.5 / 250) ** 8 + 0.5;
const Pf = -Math.expm1(-S * (250 / 400) ** 8);

async function calcGrid(name: string): Promise<{ code: number; grid: (number | string | null)[][]; stderr: string }> {
  const io = capture();
  const code = await main(["calc", at(name), "--json"], io);
  return { code, grid: code === 0 ? (Object.values(JSON.parse(io.stdout))[0] as (number | string | null)[][]) : [], stderr: io.stderr };
}

function capture() {
  const io = { stdout: "", stderr: "", out: (t: string) => (io.stdout += t), err: (t: string) => (io.stderr += t), errIsTTY: false };
  return io;
}

describe("design-check files", () => {
  it("check-duplicate-key: a second \"survival\" line is refused with both lines (the last one won silently and turned FAIL into PASS)", async () => {
    const io = capture();
    expect(await main(["check", at("check-duplicate-key.check.json")], io)).toBe(2);
    expect(io.stdout).toBe("");
    // Lines 39 and 40 of the file hold "survival": 0.9999 and "survival": 0.9 (read off the file).
    expect(io.stderr).toBe(
      `brittle check: ${at("check-duplicate-key.check.json")}: requirement.survival: written twice (lines 39 and 40); ` +
        "a JSON reader would keep only the last one: remove the one you do not mean\n",
    );
    const lines = readFileSync(at("check-duplicate-key.check.json"), "utf8").split("\n");
    expect([lines[38].trim(), lines[39].trim()]).toEqual(['"survival": 0.9999,', '"survival": 0.9']);
  });

  it("check-decimal-commas-in-list: [412,5, 398,1, ...] is refused, not read as twenty strengths (the verdict came from 412, 5, 398, 1, ...)", async () => {
    const io = capture();
    expect(await main(["check", at("check-decimal-commas-in-list.check.json"), "--json"], io)).toBe(2);
    // Line 7 of the file holds the list, typed with decimal commas (read off the file).
    expect(JSON.parse(io.stdout).error).toMatchObject({ field: "material.strengths" });
    expect(io.stderr).toMatch(/: material\.strengths: line 7: \[412,5, 398,1, .*\.\.\. separates numbers by "," in some places and ", " in others: decimal commas\?/);
    // A list written one way throughout is read as written, nested lists are named by their place.
    const { mixedListSeparators } = await import("../src/design/json-decimal-commas");
    const { pathAt } = await import("../src/design/json-duplicate-keys");
    expect(mixedListSeparators('{"s": [412.5,398.1,455], "t": [1, 2, 3]}')).toBeNull();
    const nested = '{"part": {"stresses": [[1, 2, 3], [100,5, 0, 0]]}}';
    expect(pathAt(nested, mixedListSeparators(nested)!.position + 1)).toBe("part.stresses[1]");
  });

  it("the duplicate-key scan follows nesting, arrays and escaped quotes, and passes distinct keys", () => {
    expect(firstDuplicateKey('{"a": {"b": 1}, "c": {"b": 2}, "d": [{"x": 1}, {"x": 2}]}')).toBeNull();
    expect(firstDuplicateKey('{"k\\"": "a\\"b", "k": 1, "k\\"": 2}')).toEqual({ path: "", key: 'k"', firstLine: 1, line: 1 });
    expect(firstDuplicateKey('{"d": [1, {"x": 1,\n"x": 2}]}')).toEqual({ path: "d[1]", key: "x", firstLine: 1, line: 2 });
    // "\u0061" and "a" are the same key once decoded (ECMA-404, section 9).
    expect(firstDuplicateKey('{"a": 1, "\\u0061": 2}')).toMatchObject({ key: "a" });
  });
});

describe('a first line "sep=;" (the delimiter line spreadsheet exports write)', () => {
  it("calc: the line states the delimiter and is no row, so A2:A11 are the ten strengths (it was row 1: COUNT gave 9, the fit #VALUE!)", async () => {
    for (const name of ["csv-sep-semicolon.csv", "csv-sep-tab-bom.csv", "csv-sep-comma.csv"]) {
      const { code, grid, stderr } = await calcGrid(name);
      expect(code, name).toBe(0);
      expect(relativeError(grid[1][1] as number, data.ml.shapeFloat), name).toBeLessThan(1e-12); // mpmath, weibull_fits.json
      expect(relativeError(grid[2][1] as number, data.ml.scaleFloat), name).toBeLessThan(1e-12); // mpmath, weibull_fits.json
      expect(grid[3][1], name).toBe(10); // lines 3-12 of the file hold ten strengths (counted in the file)
      expect(grid.map((r) => r[0]).slice(1), name).toEqual(data.strengths);
      expect(stderr, name).toMatch(/-delimited \(stated on line 1 by "sep=(;|,|<tab>)", which is no row\)/);
    }
  });

  it("calc: a sep= line naming a delimiter a sheet cannot have is refused in one line", async () => {
    const { readCsvBytes } = await import("../cli/workbook-io");
    expect(() => readCsvBytes(new TextEncoder().encode("sep=|\na|b\n1|2\n"))).toThrow('line 1 ("sep=|") names "|" as the delimiter; a .csv sheet may be delimited by commas, semicolons or tabs');
  });

  it("part: the line is skipped and named, not taken for a header ('no stress columns recognised in the header (sep=, )')", async () => {
    for (const name of ["part-sep-semicolon.csv", "part-sep-tab-bom.csv"]) {
      const io = capture();
      expect(await runPartCommand([at(name), "--modulus", "8", "--scale", "400", "--json"], io), `${name}: ${io.stderr}`).toBe(0);
      const r = JSON.parse(io.stdout);
      expect(relativeError(r.effectiveSize, S), name).toBeLessThan(1e-14);
      expect(relativeError(r.failureProbability, Pf), name).toBeLessThan(1e-13);
      expect(r.rows, name).toBe(3);
      expect(io.stderr, name).toBe("brittle part: skipped line 1 (delimiter line), line 2 (comment), line 5 (blank)\n");
    }
    const io = capture();
    expect(await runPartCommand([at("part-sep-semicolon.csv"), "--modulus", "8", "--delimiter", ","], io)).toBe(1);
    expect(io.stderr).toBe('brittle part: line 1 ("sep=;") states the delimiter ";", but --delimiter says ",": remove one\n');
  });
});

describe("quoted numbers in a CSV sheet", () => {
  it("csv-quoted-every-field: quoted decimal-comma numbers are numbers (they were text: COUNT 0, SUM 0, the fit #VALUE!, exit 0)", async () => {
    const { code, grid } = await calcGrid("csv-quoted-every-field.csv");
    expect(code).toBe(0);
    expect(grid.slice(1).map((r) => r[0])).toEqual(data.strengths);
    expect(relativeError(grid[1][1] as number, data.ml.shapeFloat)).toBeLessThan(1e-12); // mpmath, weibull_fits.json
    expect(relativeError(grid[2][1] as number, data.ml.scaleFloat)).toBeLessThan(1e-12); // mpmath, weibull_fits.json
    expect(grid[3][1]).toBe(10); // ten strengths on lines 2-11 (counted in the file)
    // The exact decimal sum of the ten values as written in the file (816249/250, summed by hand with fractions).
    expect(relativeError(grid[4][1] as number, 3264.996)).toBeLessThan(1e-14);
  });

  it('csv-quoted-thousands: a quoted "1.250" follows the thousands rule (the engine read it as 1.25, so twice the load was 2.5)', async () => {
    const io = capture();
    expect(await main(["calc", at("csv-quoted-thousands.csv"), "--json"], io)).toBe(1);
    expect(io.stdout).toBe("");
    expect(io.stderr).toBe(
      `brittle: ${at("csv-quoted-thousands.csv")}: line 2, field 1: "1.250" could be 1250 (thousands separator) or 1.25 (decimal point), ` +
        "and no other number settles it: remove thousands separators, or state the decimal mark (--decimal-comma or --decimal-point; in the form, the decimal-comma switch)\n",
    );
  });
});

describe("element tables with text beyond ASCII", () => {
  it("part-utf8-names: UTF-8 headers and ids are read as written (they were 'Ï1 (MPa)' and 'Ecke-Ã¤', so --stress σ1 found no column)", async () => {
    const io = capture();
    const args = [at("part-utf8-names.csv"), "--modulus", "8", "--scale", "400", "--stress", "σ1 (MPa),σ2,σ3", "--size", "Volumen (mm³)", "--id", "Elément", "--json"];
    expect(await runPartCommand(args, io), io.stderr).toBe(0);
    const r = JSON.parse(io.stdout);
    expect(r.columns.labels).toEqual({ stress: ["σ1 (MPa)", "σ2", "σ3"], size: "Volumen (mm³)", id: "Elément" });
    expect(r.hotSpots.map((h: { id: string }) => h.id)).toEqual(["Mitte", "Ecke-ä"]); // the two elements in tension
    // Principal stresses (100.5, 0, 0), (-40, 0, 0), (250, 0, 0): PIA counts the tensile one only, so S_E as above.
    expect(relativeError(r.effectiveSize, S)).toBeLessThan(1e-14);
    expect(relativeError(r.failureProbability, Pf)).toBeLessThan(1e-13);
  });

  it("part-unicode-minus: a U+2212 minus sign is a minus (it was refused, and once printed as 'â40'), so -40 is compression", async () => {
    const io = capture();
    expect(await runPartCommand([at("part-unicode-minus.csv"), "--modulus", "8", "--scale", "400", "--json"], io), io.stderr).toBe(0);
    const r = JSON.parse(io.stdout);
    expect(r.rows).toBe(3);
    // The elements of part-european.csv (100.5, -40, 250; sizes 2, 1, 0.5): S_E and Pf as defined above (ASTM C1683, Annex A3).
    expect(relativeError(r.effectiveSize, S)).toBeLessThan(1e-14);
    expect(relativeError(r.failureProbability, Pf)).toBeLessThan(1e-13);
  });
});

describe("workbooks (built by make-hostile-workbooks.ts)", () => {
  const dir = mkdtempSync(join(tmpdir(), "brittle-hostile-files-"));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it("xlsx-numbers-as-text: numbers stored as text stay text, as in a spreadsheet (they were fitted as strengths: SUM 3264.996, a modulus)", async () => {
    const io = capture();
    expect(await main(["calc", at("xlsx-numbers-as-text.xlsx"), "--json"], io)).toBe(0);
    const grid = JSON.parse(io.stdout).Data as (number | string | null)[][];
    // Text cells show as written: an inline string, plain shared strings, a rich-text one ("29" bold + "5.195").
    expect(grid.map((r) => r[0])).toEqual(["Strength (MPa, as text)", ...data.strengths.map(String)]);
    // SUM and COUNT skip text in a reference (ECMA-376 Part 1, 18.17.7, SUM and COUNT; from memory).
    expect(grid[0][1]).toBe(0);
    expect(grid[1][1]).toBe(0);
    // Text in a range of strengths is #VALUE! naming its row (the error policy, README "Errors in cells" and docs/functions.md).
    expect(grid[2][1]).toBe("#VALUE!");
    // The message says what the cell holds and what to change (it said only "is not a number").
    expect(io.stderr).toMatch(/^Data!B3: #VALUE!: strengths, row 1 is not a number: it holds "[0-9.]+" as text; enter it as a number \(numbers stored as text are not read\)$/m);
    expect(relativeError(grid[0][3] as number, data.ml.shapeFloat)).toBeLessThan(1e-12); // the same values as numbers: mpmath, weibull_fits.json
  });

  it("xlsx-long-sheet-name: a sheet name over 31 characters is refused in one line naming it (the reader stopped on 'Worksheet name already exists')", async () => {
    const io = capture();
    expect(await main(["calc", at("xlsx-long-sheet-name.xlsx"), "--json"], io)).toBe(1);
    expect(io.stdout).toBe("");
    // The name as written into the package by make-hostile-workbooks.ts: 34 characters, counted in the file.
    expect(io.stderr).toBe(
      `brittle: ${at("xlsx-long-sheet-name.xlsx")}: the sheet name "Four-point bend, lot 7, 2026 (MPa)" has 34 characters; ` +
        "brittle reads sheet names of at most 31, as most spreadsheets allow: rename the sheet\n",
    );
  });

  it("xlsx-iso-date-cells: a date stored as ISO text (cell type d) is its serial number (2024-03-01 was read as 2024)", async () => {
    const io = capture();
    expect(await main(["calc", at("xlsx-iso-date-cells.xlsx"), "--json"], io)).toBe(0);
    // 1900 system (ECMA-376 Part 1, 18.17.4.1): from 1 March 1900 on, the days since 1899-12-30, here by ECMAScript Date.UTC;
    // 28 February 1900 is day 31 + 28 = 59 counted from 1 January 1900 as day 1.
    const day = (Date.UTC(2024, 2, 1) - Date.UTC(1899, 11, 30)) / 86400000;
    expect(JSON.parse(io.stdout).Dates).toEqual([
      [day, day + 1],
      [59, 59],
    ]);
  });

  it("a date cell whose text is not an ISO date is refused with its cell; an empty date cell leaves the next cells alone", async () => {
    const { isoDateCellsToSerials } = await import("../cli/xlsx-iso-dates");
    expect(() => isoDateCellsToSerials('<c r="C3" t="d"><v>01/03/2024</v></c>', 25569, "book.xlsx: xl/worksheets/sheet1.xml")).toThrow(
      'book.xlsx: xl/worksheets/sheet1.xml, cell C3: the date "01/03/2024" is not an ISO 8601 date (YYYY-MM-DD or YYYY-MM-DDThh:mm:ss)',
    );
    const xml = '<c r="A1" t="d"/><c r="B1"><v>5</v></c><c r="C1" t="d"><v>1904-01-02</v></c>';
    expect(isoDateCellsToSerials(xml, 24107, "p")).toBe('<c r="A1" t="d"/><c r="B1"><v>5</v></c><c r="C1"><v>1</v></c>'); // day 1 of the 1904 system
  });

  it("xlsx-hidden-sheet-and-dimension: a hidden sheet, a percent cell, formulas without cached values and a lying dimension tag read as they are", async () => {
    const io = capture();
    expect(await main(["calc", at("xlsx-hidden-sheet-and-dimension.xlsx"), "--json"], io)).toBe(0);
    const grids = JSON.parse(io.stdout);
    expect(grids.Data.map((r: number[]) => r[0])).toEqual(data.strengths); // all ten rows, though the dimension says A1
    expect(relativeError(grids.Summary[0][0], data.ml.shapeFloat)).toBeLessThan(1e-12); // mpmath, weibull_fits.json
    expect(grids.Summary[0].slice(1)).toEqual([0.9, 0.9 * 2]); // 90 % is the number 0.9; B1*2 by ECMAScript arithmetic
  });

  it("xlsx-1904-dates: a 1904-system workbook computes with its own serial numbers (dates were 1462 days later, and --out wrote them)", async () => {
    // 2024-03-01 in the 1904 system: 120 years of 365 days, 30 leap days (1904-2020), 31 + 29 days of 2024 = 43890
    // (ECMA-376 Part 1, 18.17.4.1); A1+1 is the next day. The engine's own date functions count in the same
    // system: DATE(2024,3,1) is that serial again, YEAR(A1) is 2024 (with day 0 at 1899-12-30 they gave 45352 and 2020).
    const io = capture();
    expect(await main(["calc", at("xlsx-1904-dates.xlsx"), "--json"], io)).toBe(0);
    expect(JSON.parse(io.stdout).Dates).toEqual([[43890, 43891, 43890, 2024]]);
    const out = join(dir, "dates-1904.xlsx");
    expect(await main(["calc", at("xlsx-1904-dates.xlsx"), "--out", out], capture())).toBe(0);
    const zip = await JSZip.loadAsync(readFileSync(out));
    expect(await zip.file("xl/workbook.xml")!.async("string")).toMatch(/date1904="1"/);
    expect(await zip.file("xl/worksheets/sheet1.xml")!.async("string")).toMatch(/<c r="B1"[^>]*><f>A1\+1<\/f><v>43891<\/v><\/c>/);
  });
});

describe("hand-edited check files that are not JSON", () => {
  // Each message keeps the place the JSON reader gives and adds what to remove. The places are read off the
  // files: line 42 holds `"lotSize": 5000, // parts a year` with "//" at column 20; line 45 is the "}" after `"proof": null,`.
  const cases: [string, RegExp][] = [
    ["check-line-comment.check.json", /: not a JSON file: line 42, column 20: .* \(comments are not allowed in JSON: remove them\)\n$/],
    ["check-block-comment.check.json", /: not a JSON file: .*\(comments are not allowed in JSON: remove them\)\n$/],
    ["check-trailing-comma.check.json", /: not a JSON file: line 45, column 1: .* \(a comma before a closing bracket is not allowed in JSON: remove it\)\n$/],
    // Line 41 holds `"appliedStress": NaN,` (or +150, or 150,5), the value from column 20; line 21 holds `'stressUnit': 'MPa',`.
    ["check-nan-literal.check.json", /: not a JSON file: line 41, column 20: Unexpected token 'N' \(a word where a number belongs: JSON numbers are digits\)\n$/],
    ["check-plus-sign.check.json", /: not a JSON file: line 41, column 20: Unexpected token '\+' \(a JSON number has no plus sign: remove it\)\n$/],
    ["check-single-quotes.check.json", /: not a JSON file: line 21, column 3: .* \(JSON takes double quotes around names and text\)\n$/],
    ["check-decimal-comma-number.check.json", /: not a JSON file: line 41, column 24: .* \(a decimal comma\? JSON numbers take a point: 150\.5, not 150,5\)\n$/],
  ];
  for (const [name, message] of cases) {
    it(`${name}: refused in one line that says what to remove (the reader's own words only, before)`, async () => {
      const io = capture();
      expect(await main(["check", at(name)], io)).toBe(2);
      expect(io.stdout).toBe("");
      expect(io.stderr).toMatch(message);
      expect(io.stderr.trim().split("\n")).toHaveLength(1);
    });
  }
});

describe("thousands separators of other locales", () => {
  it("a thin space (U+2009) or a curly apostrophe (U+2019) between digit groups is refused (the cell was text and SUM gave 980.5 for 1250.5 + 980.5)", async () => {
    for (const [name, text] of [
      ["csv-thin-space-thousands.csv", "1\u2009250,5"],
      ["csv-curly-apostrophe-thousands.csv", "1\u2019250.5"],
    ]) {
      const io = capture();
      expect(await main(["calc", at(name), "--json"], io), name).toBe(1);
      expect(io.stdout, name).toBe("");
      expect(io.stderr, name).toBe(`brittle: ${at(name)}: line 2, field 1: "${text}" has thousands separators, which are not read: write the number without them\n`);
    }
  });
});

describe("the end-of-file mark (Ctrl-Z) of older DOS and Windows programs", () => {
  it("csv-ctrl-z-end: no row, and the read line says so (it was 'line 2 has 1 field, but line 1 has 2 (delimiter: semicolon)')", async () => {
    const { code, grid, stderr } = await calcGrid("csv-ctrl-z-end.csv");
    expect(code).toBe(0);
    expect(relativeError(grid[1][1] as number, data.ml.shapeFloat)).toBeLessThan(1e-12); // mpmath, weibull_fits.json
    expect(grid).toHaveLength(11); // the header and ten strengths, as in csv-crlf.csv without the mark
    expect(stderr).toMatch(/; the end-of-file mark \(Ctrl-Z\) after the last line is no row\n/);
  });

  it("part-ctrl-z-end: the mark's line is skipped and named (it was 'line 7: expected at least 3 fields as on line 2, found 1')", async () => {
    const io = capture();
    expect(await runPartCommand([at("part-ctrl-z-end.csv"), "--modulus", "8", "--scale", "400", "--json"], io), io.stderr).toBe(0);
    const r = JSON.parse(io.stdout);
    expect(relativeError(r.effectiveSize, S)).toBeLessThan(1e-14);
    expect(relativeError(r.failureProbability, Pf)).toBeLessThan(1e-13);
    expect(io.stderr).toBe("brittle part: skipped line 1 (comment), line 4 (blank), line 7 (end-of-file mark)\n");
  });
});

describe("numbers as Fortran programs print them", () => {
  it("part-fortran-exponent: 1.005D+02 is 1.005E+02 (the D exponent of Fortran's double precision; it was 'is not a number')", async () => {
    const io = capture();
    expect(await runPartCommand([at("part-fortran-exponent.txt"), "--modulus", "8", "--scale", "400", "--top", "3", "--json"], io), io.stderr).toBe(0);
    const r = JSON.parse(io.stdout);
    // Each value is Number() of the field with D written as E (ECMAScript StringToNumber; D = E from memory, Fortran's D edit descriptor).
    const rows = readFileSync(at("part-fortran-exponent.txt"), "latin1").trim().split("\n").slice(1).map((l) => l.trim().split(/\s+/));
    for (const h of r.hotSpots) {
      const fields = rows[h.line - 2];
      expect(h.principal, `line ${h.line}`).toEqual([Number(fields[1].replace(/d/i, "E"))]);
      expect(h.size, `line ${h.line}`).toBe(Number(fields[2].replace(/d/i, "E")));
    }
    expect(r.hotSpots).toHaveLength(2); // the two elements in tension
    expect(relativeError(r.effectiveSize, S)).toBeLessThan(1e-14); // the table of part-european.csv, as above
    expect(relativeError(r.failureProbability, Pf)).toBeLessThan(1e-13);
  });
});
