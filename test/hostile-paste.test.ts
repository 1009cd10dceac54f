// Pasted and typed numbers, the hostile corpus (test/fixtures/hostile/paste-*, and the few part-*, calc-*,
// export-* and material-* files below): values copied from datasheet PDFs, e-mails, web pages, test-machine
// software and spreadsheets in other locales. The rule (docs/files-and-formats.md, "Numbers people paste and
// type"): a value is read as the user meant it where a convention makes the meaning certain, else refused with
// its line, its text and what to change; a unit is never dropped. Each case names what it did before.
// Expected values are the digits as written, read by the convention named beside them (common practice
// unless a source is given); expected messages are the project's own wording.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../cli/cli";
import { runPartCommand } from "../cli/part-command";
import { readPositiveNumbers } from "../functions/cells";
import { materialFitAnswer } from "../src/design/material-fit-answer";
import { importAnswer, readRecordTable } from "../src/design/record-import-answer";
import { explainNotANumber } from "../src/input/number-text";
import { parsePasted } from "../taskpane/app/parse-pasted";
import { parseElementTable } from "../taskpane/app/parse-table";

const at = (name: string) => join("test/fixtures/hostile", name);
const read = (name: string) => readFileSync(at(name), "utf8");
const paste = (name: string, options = {}) => parsePasted(read(name), options);

function capture() {
  const io = { stdout: "", stderr: "", out: (t: string) => (io.stdout += t), err: (t: string) => (io.stderr += t), errIsTTY: false };
  return io;
}

describe("the shared reader, in files, cells and records", () => {
  it("calc-unit-in-cell: a cell '0.41 GPa' in a range of strengths says what it holds (it said only 'is not a number')", async () => {
    const io = capture();
    expect(await main(["calc", at("calc-unit-in-cell.csv"), "--json"], io)).toBe(0);
    expect(io.stderr).toContain(
      'strengths, row 2 is not a number: "0.41 GPa" carries a unit ("GPa"): type the number alone, every value in one unit (1 GPa = 1000 MPa)',
    );
  });
  it("export-unit-in-load-cell: a load cell '4.1 kN' in a [N] column leaves that specimen out with the unit named", () => {
    const a = importAnswer({
      table: readRecordTable(read("export-unit-in-load-cell.csv"), false),
      configuration: "bar-flexure",
      columns: { id: 0, load: 1, depth: 2 },
      fixed: { outerSpan: 40, innerSpan: 20, width: 4 },
      population: "",
    });
    expect(a.specimens[0].problem).toBe('Load [N] "4.1 kN" carries a unit ("kN"): type the number alone, every value in one unit (1 kN = 1000 N)');
    expect(a.specimens[1].strength).toBeGreaterThan(0);
  });
  it("cells: text in a range names the text and what to change, also for a number stored as text", () => {
    expect(() => readPositiveNumbers([[400], ["412 MPa"]], "strengths")).toThrow(
      'strengths, row 2 is not a number: "412 MPa" carries a unit ("MPa"): type the number alone, every value in one unit (1 GPa = 1000 MPa)',
    );
    expect(() => readPositiveNumbers([[400], ["412"]], "strengths")).toThrow(
      'strengths, row 2 is not a number: it holds "412" as text; enter it as a number (numbers stored as text are not read)',
    );
  });
  it("paste-fullwidth-digits and paste-arabic-indic-digits: digits of East Asian input and Arabic text (refused as 'use a point')", () => {
    // Unicode Standard sec. 4.6: each run of decimal digits (Nd) holds 0-9 in order; U+066B is the Arabic decimal separator.
    expect(paste("paste-fullwidth-digits.txt").strengths).toEqual([412.5, 398, 455]);
    expect(paste("paste-arabic-indic-digits.txt").strengths).toEqual([412.5, 398, 455]);
  });
  it("paste-table-unicode-minus: U+2212 is a minus, so -40 is a compressive stress (refused as 'not a number')", () => {
    expect(parseElementTable(read("paste-table-unicode-minus.txt")).stresses).toEqual([[100.5], [-40], [250]]);
  });
  it("part-error-value: brittle part refuses the same line (it skipped it as a comment and reported fewer elements, exit 0)", async () => {
    const io = capture();
    expect(await runPartCommand([at("part-error-value.csv"), "--modulus", "8"], io)).toBe(1);
    expect(io.stderr).toBe(
      'brittle part: line 3: "#DIV/0!" is a spreadsheet error value, not a number: correct it in the sheet it came from, or leave the value out ' +
        "(a line that begins with a spreadsheet error value is no comment)\n",
    );
  });
  it("material-first-line-unit: '412 MPa' on line 1 is refused, not skipped as a header (the specimen vanished without a word)", () => {
    expect(() => materialFitAnswer({ text: read("material-first-line-unit.txt"), flaws: "volume", poisson: 0.22, decimalComma: false })).toThrow(
      'line 1: "412 MPa" carries a unit ("MPa")',
    );
  });
});

describe("explainNotANumber stays silent where it has nothing to add", () => {
  it("typos and headers get the generic reason", () => {
    for (const t of ["49S.3", "4x0", "abc", "1_000", "Strength (MPa)"]) expect(explainNotANumber(t), t).toBeNull();
  });
});

