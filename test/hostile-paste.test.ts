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
import { classifyNumber, explainNotANumber, readTypedNumber } from "../src/input/number-text";
import { fieldNumber, FieldError } from "../taskpane/app/dom";
import { parsePasted, PasteError } from "../taskpane/app/parse-pasted";
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
    // The full-width comma separates items and digit groups in East Asian text, so it is no decimal mark.
    expect(() => parsePasted("４１２，５\n３９８\n")).toThrow('Line 1: "４１２，５" is not a number');
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

describe("the strengths box", () => {
  it("paste-unit-gpa: '0.41 GPa' among MPa values is refused naming the factor (it was taken for a censoring flag 'GPa')", () => {
    expect(() => paste("paste-unit-gpa.txt")).toThrow(
      new PasteError('Line 2: "0.41 GPa" carries a unit ("GPa"): type the number alone, every value in one unit (1 GPa = 1000 MPa).'),
    );
  });
  it("paste-unit-each-line: '412 MPa' on every line is refused at line 1, with the unit named", () => {
    expect(() => paste("paste-unit-each-line.txt")).toThrow(/^Line 1: "412 MPa" carries a unit \("MPa"\)/);
  });
  it("paste-times-ten: 4.12×10^2, 3.98 x 10², 4.30·10² are powers of ten as people type them (refused, or split into three values)", () => {
    expect(paste("paste-times-ten.txt").strengths).toEqual([412, 398, 455, 430]);
    // "4.12 x 10" has no power: a size (4.12 by 10), never read as a number.
    expect(classifyNumber("4.12 x 10").kind).toBe("not-a-number");
  });
  it("paste-zero-width: zero-width spaces and direction marks around a value are blanks (the line was 'not a number')", () => {
    const r = paste("paste-zero-width.txt");
    expect(r.strengths).toEqual([412, 398, 455, 430]);
    expect(r.notes).toEqual(["Blank line 4 skipped."]);
  });
  it("paste-zero-width-inside: one inside a number is refused and shown, not printed as an invisible '412'", () => {
    expect(() => paste("paste-zero-width-inside.txt")).toThrow(
      new PasteError('Line 2: "4<U+200B>12" holds an invisible character inside (shown as <U+...>), copied from a web page or a document: retype the number.'),
    );
  });
  it("paste-quoted-values: a value in double quotes is the value (refused as '\"412.5\" is not a number')", () => {
    expect(paste("paste-quoted-values.txt").strengths).toEqual([412.5, 398.1, 455]);
  });
  it("paste-trailing-commas: '412,' on every line reads the same as strength-and-blank-flag or decimal comma, so it is read (it was refused as ambiguous)", () => {
    const r = paste("paste-trailing-commas.txt");
    expect(r.strengths).toEqual([412, 398, 455]);
    expect(r.censored ?? [false, false, false]).toEqual([false, false, false]);
  });
  it("paste-missing-first-line: 'n/a' on line 1 is a missing value, not a header to skip (it was skipped as a header)", () => {
    expect(() => paste("paste-missing-first-line.txt")).toThrow(new PasteError('Line 1: "n/a" marks a missing value: leave the value (or its line) out, or type the number.'));
  });
  it("paste-nbsp-thousands: '1 250' with a no-break space is thousands, refused (it was 'strength 1 with the flag 250')", () => {
    expect(() => paste("paste-nbsp-thousands.txt")).toThrow(
      new PasteError('Line 1: "1\u00a0250" has thousands separators, which are not read: write the number without them.'),
    );
  });
  it("paste-header-with-number: a header holding a number is named as such (it was 'expected a strength and at most one flag, found 4 values')", () => {
    expect(() => paste("paste-header-with-number.txt")).toThrow(
      new PasteError('Line 1: "Strength at 20 °C" is not a number (a header line must hold no number: remove the number from it, or the line).'),
    );
  });

  it("paste-zero-line: a typed 0 is no specimen, as in a cell range, and the note says so (it vanished without a word)", () => {
    const r = paste("paste-zero-line.txt");
    expect(r.strengths).toEqual([412, 398, 455]);
    expect(r.notes).toEqual(["Line 2 skipped: a zero strength is no specimen."]);
  });
});

describe("marks, words and error values are refused with the reason", () => {
  // One hostile value per line of paste-marks-and-words.txt; each is pasted between two good strengths. Before, every
  // one was 'is not a number (use a point as the decimal separator)' or a complaint about a censoring flag.
  const reasons: Record<string, string> = {
    "412*": 'ends in a footnote mark ("*")',
    "412a": 'ends in a footnote mark ("a")',
    "412¹": 'ends in a footnote mark ("¹")',
    "(412)": "is in parentheses (a negative number in accounting notation, or a remark?): type -412 or 412",
    "412 (invalid)": 'has a remark after the number ("(invalid)")',
    "~412": 'is marked approximate ("~")',
    ">412": 'is a bound (">"), not a measured value: type the measured number alone; a specimen that did not break is censored',
    "<412": 'is a bound ("<"), not a measured value: type the measured number alone',
    "412%": "is a percentage: type it as a plain number (4.12)",
    "#N/A": "is a spreadsheet error value, not a number",
    "#DIV/0!": "is a spreadsheet error value, not a number",
    "#VALUE!": "is a spreadsheet error value, not a number",
    "—": "marks a missing value",
    "-": "marks a missing value",
    "n/a": "marks a missing value",
    "412 N/mm²": 'carries a unit ("N/mm²"): type the number alone, every value in one unit (1 N/mm² = 1 MPa)',
    "4.1 kN": 'carries a unit ("kN")',
    "412MPa": 'carries a unit ("MPa")',
    "–412": "begins with a dash (U+2013), not a minus sign",
    "'412": "begins with an apostrophe",
    "0x1A": "is written in another base",
    inf: "is infinite, not a number",
    "4,12E+02 MPa": 'carries a unit ("MPa")',
    "¹²": "holds a superscript digit",
  };
  const lines = read("paste-marks-and-words.txt").split("\n").filter((l) => l !== "");

  it("covers every line of the file", () => {
    expect(lines.sort()).toEqual(Object.keys(reasons).sort());
  });

  for (const [text, reason] of Object.entries(reasons)) {
    it(`${JSON.stringify(text)}: ${reason}`, () => {
      let message = "";
      try {
        parsePasted(`400\n${text}\n420\n`);
      } catch (error) {
        expect(error).toBeInstanceOf(PasteError);
        message = (error as Error).message;
      }
      expect(message.startsWith(`Line 2: "${text}" `)).toBe(true);
      expect(message).toContain(reason);
      // The element-table box and the cells give the same reason for the same text.
      expect(() => parseElementTable(`400\t1\n${text}\t1\n`)).toThrow(reason);
      expect(() => readPositiveNumbers([[400], [text]], "strengths")).toThrow(reason);
    });
  }



});

describe("the element-table box", () => {
  it("paste-table-error-value: '#DIV/0!' where a stress was is refused (it was skipped as a '#' comment, and the element lost)", () => {
    expect(() => parseElementTable(read("paste-table-error-value.txt"))).toThrow(
      'Line 3: "#DIV/0!" is a spreadsheet error value, not a number: correct it in the sheet it came from, or leave the value out.',
    );
    expect(parseElementTable("# mesh of 2 Dec\n100.5\t2\n").stresses).toEqual([[100.5]]); // a comment is still a comment
  });


  it("paste-table-nbsp-thousands: '1 250 2 500' (no-break spaces) is refused, not three stresses 1, 250, 2 and a size 500", () => {
    expect(() => parseElementTable(read("paste-table-nbsp-thousands.txt"))).toThrow('Line 1: "1\u00a0250" has thousands separators');
  });

  it("a first line the rules refuse ('1,250', '412 MPa') is refused, not skipped as a header (the element was lost, noted as a header)", () => {
    expect(() => parseElementTable("1,250\t2\n300\t1\n")).toThrow('Line 1: "1,250" could be 1250');
    expect(() => parseElementTable("412 MPa\t2\n300\t1\n")).toThrow('Line 1: "412 MPa" carries a unit');
    expect(parseElementTable("s (MPa)\tV\n300\t1\n").stresses).toEqual([[300]]);
  });
});

describe("explainNotANumber stays silent where it has nothing to add", () => {
  it("typos and headers get the generic reason", () => {
    for (const t of ["49S.3", "4x0", "abc", "1_000", "Strength (MPa)"]) expect(explainNotANumber(t), t).toBeNull();
  });
});

describe("values typed into the form's fields", () => {
  const field = (text: string, rule = {}) => fieldNumber("f", text, "applied peak stress", rule);

  it("'1.250' is refused as 1250 or 1.25 (it was read as 1.25: a stress 1000 times too low passes any check)", () => {
    expect(() => field("1.250")).toThrow(
      new FieldError("f", 'The applied peak stress "1.250" could be 1250 (with a thousands separator) or 1.25: type 1250 for the first, 1.2500 for the second.'),
    );
    expect(() => fieldNumber("f", "1.000", "number of parts per lot", { integer: true })).toThrow(/could be 1000 \(with a thousands separator\) or 1/);
    expect(field("0.250")).toBe(0.25); // a lone 0 before the point: no thousands reading
  });

  it("hexadecimal and units are refused (0x10 was read as 16; '412 MPa' was 'use a point as the decimal separator')", () => {
    expect(() => field("0x10")).toThrow(/is written in another base/);
    expect(() => field("412 MPa")).toThrow('The applied peak stress "412 MPa" carries a unit ("MPa")');
    expect(() => field("412,5")).toThrow('"412,5" has a decimal comma: use a point as the decimal separator (412.5)');
    expect(field("\u2212 5".replace(" ", ""))).toBe(-5);
  });

  it("a probability may be typed as a percentage, moved two places rather than divided (it was 'not a number')", () => {
    expect(fieldNumber("f", "99.99 %", "required survival probability", { probability: true })).toBe(0.9999);
    expect(fieldNumber("f", "95%", "confidence", { probability: true })).toBe(0.95);
    expect(() => field("41 %")).toThrow("is a percentage: type it as a plain number (0.41)");
  });

  it("readTypedNumber keeps a field's decimal rule: either mark where the field took both, '1,250' refused there too", () => {
    expect(readTypedNumber("0,22", { decimalMark: "either" })).toEqual({ ok: true, value: 0.22 });
    expect(readTypedNumber("1,250", { decimalMark: "either" }).ok).toBe(false);
    expect(readTypedNumber("1,250", { decimalMark: "comma" })).toEqual({ ok: true, value: 1.25 });
    expect(readTypedNumber("40 mm", { decimalMark: "either" })).toEqual({ ok: false, reason: 'carries a unit ("mm"): type the number alone, every value in one unit' });
  });
});
