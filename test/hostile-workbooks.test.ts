// The hostile workbook corpus (test/fixtures/hostile/xlsx-*.xlsx and calc-*.csv, built by
// make-hostile-workbooks.ts beside them): each case names the failure it guards against and checks
// the correct value, or the clear one-line error and exit code. Values come from the 40-digit ML fit
// (mpmath, weibull_fits.json dataset complete-n10-m10-s350), jstat, or the spreadsheet rule named.
import { spawnSync } from "node:child_process";
import { existsSync, linkSync, mkdtempSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import ExcelJS from "exceljs";
import jStat from "jstat";
import JSZip from "jszip";
import { describe, expect, it } from "vitest";
import { EXIT_FORMULA_ERRORS, main, type Io } from "../cli/cli";
import { writeAtomically } from "../cli/atomic-write";
import { STANDARD_ERRORS } from "../cli/error-values";
import { readCell } from "../cli/evaluate-workbook";
import { judgeFormula, SAFE_BUILTINS } from "../cli/formula-safety";
import { checkWorkbookSize } from "../cli/workbook-limits";
import { loadXlsx } from "../cli/xlsx-read";
import { readablePackage } from "../cli/xlsx-parts";
import { fixture, relativeError } from "./helpers";

const CORPUS = join(import.meta.dirname, "fixtures", "hostile");
const corpus = (name: string) => join(CORPUS, name);
const data = fixture("weibull_fits.json").datasets.find((d: any) => d.id === "complete-n10-m10-s350");
const strengths: number[] = data.strengths;
const mlShape: number = data.ml.shapeFloat; // mpmath, 40 digits, via test/fixtures/generate_weibull_fits.py
const dir = mkdtempSync(join(tmpdir(), "brittle-hostile-"));

function capture(): Io & { stdout: string; stderr: string } {
  const io = { stdout: "", stderr: "", out: (t: string) => (io.stdout += t), err: (t: string) => (io.stderr += t) };
  return io;
}

async function calcJson(file: string, ...extra: string[]): Promise<{ code: number; grids: Record<string, any[][]>; stderr: string }> {
  const io = capture();
  const code = await main(["calc", file, "--json", ...extra], io);
  return { code, grids: code === 0 || code === EXIT_FORMULA_ERRORS ? JSON.parse(io.stdout) : {}, stderr: io.stderr };
}

async function readBack(path: string): Promise<ExcelJS.Workbook> {
  const book = new ExcelJS.Workbook();
  await book.xlsx.readFile(path);
  return book;
}

describe("sheet extent: memory follows the filled cells, not the rectangle they span", () => {
  it("xlsx-far-corner: A1 and XFD1048576 evaluate under a 1 GB heap (once minutes and an out-of-memory abort at 4 GB)", () => {
    // A child process with a capped heap: a dense grid of 17 billion cells cannot fit, so this fails if one is built.
    const run = spawnSync(process.execPath, ["--max-old-space-size=1024", "bin/run-ts.js", "cli/run.ts", "calc", corpus("xlsx-far-corner.xlsx"), "--json"], {
      encoding: "utf8",
      maxBuffer: 64 * 1024 * 1024,
    });
    expect(run.stderr).toBe("");
    expect(run.status).toBe(0);
    const grid = JSON.parse(run.stdout).Corner;
    expect(grid[0]).toEqual([445.3, 446.3]); // SUM(A1, XFD1048576) = 445.3 + 1, plain arithmetic
    expect(grid).toHaveLength(1048576);
    expect(grid[1048575]).toHaveLength(16384);
    expect(grid[1048575][16383]).toBe(1);
  }, 180_000);

  it("xlsx-far-formatting: a huge column width and a styled last row are not content", async () => {
    const { code, grids } = await calcJson(corpus("xlsx-far-formatting.xlsx"));
    expect(code).toBe(0);
    expect(grids.Data).toHaveLength(strengths.length);
    expect(grids.Data[0]).toEqual([strengths[0], strengths.length]); // COUNT(A:A) counts the ten strengths
  });

  it("refuses a workbook beyond the cell limit or a sheet's size with one line, not an abort", async () => {
    await expect(loadXlsx(corpus("xlsx-shared-formulas.xlsx"), { maxCells: 5 })).rejects.toThrow(/holds more than 5 filled cells; brittle calc evaluates at most 5$/);
    const tooLong = { kind: "csv" as const, sheets: { Long: { length: 1048577, forEach: () => {} } as never } };
    expect(() => checkWorkbookSize(tooLong, "long.csv")).toThrow(/sheet Long has 1,048,577 rows; a sheet holds at most 1,048,576/);
    const wide: unknown[] = [];
    wide[16384] = 1;
    expect(() => checkWorkbookSize({ kind: "csv", sheets: { Wide: [wide as never] } }, "wide.csv")).toThrow(/row 1 of sheet Wide has 16,385 fields/);
  });

  it("calc-huge-range: a formula over three million empty cells is refused in one line naming the cell (the engine took minutes and gigabytes)", async () => {
    const io = capture();
    expect(await main(["calc", corpus("calc-huge-range.csv")], io)).toBe(1);
    // The last line is the error (a line before it may say how the CSV was read).
    expect(io.stderr.trim().split("\n").at(-1)).toBe(
      `brittle: ${corpus("calc-huge-range.csv")}: calc-huge-range!B2: the range A2:C1000000 spans 2,999,997 cells; brittle calc evaluates at most 2,000,000 (whole columns such as A:A count nothing)`,
    );
  });

  it("calc-full-height-range: A1:A1048576 is read as the column A:A, so it costs the filled cells only", async () => {
    const { code, grids } = await calcJson(corpus("calc-full-height-range.csv"));
    expect(code).toBe(0);
    // SUM over column A = 1 + 2 (the header is text); COUNT twice over two numbers = 4 (plain arithmetic).
    expect(grids["calc-full-height-range"].slice(1).map((row) => row[1])).toEqual([3, 4]);
  });

  it("refuses a package whose parts unpack beyond the stated limits before reading them (a zip bomb)", async () => {
    const bytes = readFileSync(corpus("xlsx-far-corner.xlsx"));
    await expect(readablePackage(bytes, "bomb.xlsx", { part: 100, total: 1e9 })).rejects.toThrow(/^bomb\.xlsx: part .* unpacks to 1 MB; brittle reads parts of at most 1 MB$/);
    await expect(readablePackage(bytes, "bomb.xlsx", { part: 1e9, total: 1000 })).rejects.toThrow(/^bomb\.xlsx unpacks to 1 MB; brittle reads workbooks of at most 1 MB unpacked$/);
  });
});

describe("parts the workbook reader cannot take", () => {
  it("xlsx-chart-and-comment: a chart with a text box stops exceljs ('reading anchors'); calc reads the cells and says what a copy loses", async () => {
    // The failure guarded against, as the reader alone shows it (exceljs issue 2591).
    await expect(new ExcelJS.Workbook().xlsx.readFile(corpus("xlsx-chart-and-comment.xlsx"))).rejects.toThrow(/reading 'anchors'/);
    const { code, grids } = await calcJson(corpus("xlsx-chart-and-comment.xlsx"));
    expect(code).toBe(0);
    expect(relativeError(grids.Data[0][1], mlShape)).toBeLessThan(1e-12);

    const out = join(dir, "chart-copy.xlsx");
    const io = capture();
    expect(await main(["calc", corpus("xlsx-chart-and-comment.xlsx"), "--out", out], io)).toBe(0);
    expect(io.stderr).toMatch(/not carried over into .*chart-copy\.xlsx: 1 chart, 1 comment \(cell values, formulas, styles and defined names are\)/);
    const copy = await readBack(out);
    expect(copy.getWorksheet("Data")!.getCell("B1").formula).toBe('BRITTLE.MODULUS(A1:A10,,"MLE-RAW")');
  });

  it("xlsx-image: an image is dropped from the copy and named", async () => {
    const io = capture();
    expect(await main(["calc", corpus("xlsx-image.xlsx"), "--out", join(dir, "image-copy.xlsx")], io)).toBe(0);
    expect(io.stderr).toMatch(/not carried over into .*: 1 image \(/);
  });

  it("xlsx-defined-names: names work in formulas; a name over the whole sheet no longer hangs the reader", async () => {
    // exceljs expands Data!$A$1:$XFD$1048576 cell by cell (17 billion objects): the names are read from the file instead.
    const { code, grids, stderr } = await calcJson(corpus("xlsx-defined-names.xlsx"));
    expect(code).toBe(0);
    // Rows 1 to 1048576 over every column: 17 billion cells, beyond the range budget, so the engine never builds it.
    expect(stderr).toBe("brittle: note: the defined name WholeRows is not evaluated (invalid here, or its range is too large); formulas using it show #NAME?\n");
    const [b1, , b3, b4, b5] = grids.Data.slice(0, 5).map((row) => row[1]);
    expect(relativeError(b1, mlShape)).toBeLessThan(1e-12); // =BRITTLE.MODULUS(Strengths,,"MLE-RAW")
    expect(b3).toBe(1.998); // Survival*2 with Survival = 0.999
    expect(b4).toBe(strengths.length); // COUNT(WholeColumn)
    expect(b5).toBe(strengths[0]); // a sheet-scoped name
  });

  it("xlsx-defined-names: a copy keeps the names, except one whose formula calls the web", async () => {
    const out = join(dir, "names-copy.xlsx");
    const io = capture();
    expect(await main(["calc", corpus("xlsx-defined-names.xlsx"), "--out", out], io)).toBe(0);
    expect(io.stderr).toMatch(/defined name left out of the copy: Lookup: it calls WEBSERVICE, which is not on the safe list/);
    const xml = await (await JSZip.loadAsync(readFileSync(out))).file("xl/workbook.xml")!.async("string");
    expect(xml).toMatch(/<definedName name="Strengths">Data!\$A\$1:\$A\$10<\/definedName>/);
    expect(xml).toMatch(/name="WholeSheet"/);
    expect(xml).not.toMatch(/WEBSERVICE/);
    const back = await calcJson(out);
    expect(back.code).toBe(0);
    expect(relativeError(back.grids.Data[0][1], mlShape)).toBeLessThan(1e-12);
  });
});

describe("cells the reader reports differently from a spreadsheet", () => {
  it("xlsx-merged-cells: a merged range holds one value, not one per cell (the specimen counted three times)", async () => {
    // The reader alone repeats the first cell's value in A2 and A3.
    expect((await readBack(corpus("xlsx-merged-cells.xlsx"))).getWorksheet("Merged")!.getCell("A2").value).toBe(strengths[0]);
    const { grids } = await calcJson(corpus("xlsx-merged-cells.xlsx"));
    expect(grids.Merged[0][1]).toBe(strengths.length); // COUNT(A1:A12): only a merged range's first cell holds a value (common practice)
    expect(relativeError(grids.Merged[1][1], mlShape)).toBeLessThan(1e-12);
  });

  it("xlsx-shared-formulas: every cell of a shared formula evaluates its own row", async () => {
    const { grids } = await calcJson(corpus("xlsx-shared-formulas.xlsx"));
    expect(grids.Data.map((row) => row[1])).toEqual(strengths.map((s) => s * 2));
  });

  it("xlsx-quoted-sheet-name: a sheet named with quotes, spaces and brackets is referred to", async () => {
    const { grids } = await calcJson(corpus("xlsx-quoted-sheet-name.xlsx"));
    expect(relativeError(grids.Summary[0][0], mlShape)).toBeLessThan(1e-12);
  });

  it("xlsx-dates: a date is its serial number in the 1900 date system", async () => {
    // 2024-03-01 is day 45352 counted from 1899-12-30 (ECMA-376 Part 1, 18.17.4.1; Python datetime difference).
    const { grids } = await calcJson(corpus("xlsx-dates.xlsx"));
    expect(grids.Dates[0]).toEqual([45352, 45353]);
  });

  it("xlsx-logical-literals and calc-logical-literals: bare TRUE and FALSE are logical constants (#NAME? before)", async () => {
    // As any spreadsheet: IF(TRUE,1,2) = 1, IF(FALSE,1,2) = 2 (ECMA-376 Part 1, 18.17.7 IF, TRUE, FALSE).
    const xlsx = await calcJson(corpus("xlsx-logical-literals.xlsx"));
    expect(xlsx.grids.Logic.map((row) => row[0])).toEqual([1, 2, 3, true, 5, true]);
    const csv = await calcJson(corpus("calc-logical-literals.csv"));
    expect(csv.grids["calc-logical-literals"].slice(1).map((row) => row[1])).toEqual([1, 2, 3]);
  });

  it("calc-logical-in-array: TRUE and FALSE inside an array constant are logical values (the whole run stopped with \"Value of the formula cell is not computed\" before)", async () => {
    const { grids } = await calcJson(corpus("calc-logical-in-array.csv"));
    const results = grids["calc-logical-in-array"].slice(1).map((row) => row[1]);
    // Censored maximum likelihood (ASTM C1239 sec. 7 equations) solved by bisection in Python for failures 412.5 and
    // 455 with 398.1 censored: m = 26.0285, characteristic strength 444.80436937613933.
    expect(results[0]).toBeCloseTo(444.80436937613933, 9);
    expect(results[1]).toBe(results[0]);
    expect(results.slice(2)).toEqual([true, "TRUE"]);
  });
});

describe("formulas that evaluate to errors", () => {
  const file = corpus("xlsx-formula-errors.xlsx");

  it("xlsx-formula-errors: without --strict, exit 0 and the summary line counts the error cells", async () => {
    const io = capture();
    expect(await main(["calc", file], io)).toBe(0);
    expect(io.stdout).toMatch(/\n6 formulas evaluated, 5 errors\n$/);
  });

  it("xlsx-formula-errors: --strict exits 3 (not the usage code 2) and lists each cell with code and message (a batch could not tell a broken sheet)", async () => {
    const io = capture();
    expect(await main(["calc", file, "--strict"], io)).toBe(EXIT_FORMULA_ERRORS);
    expect(EXIT_FORMULA_ERRORS).toBe(3);
    const lines = io.stderr.trim().split("\n");
    expect(lines).toEqual([
      expect.stringMatching(/^Data!B2: #REF!: circular reference: the formula depends on its own result \(engine: #CYCLE!\)$/),
      expect.stringMatching(/^Data!C2: #REF!: circular reference/),
      expect.stringMatching(/^Data!B3: #VALUE!: the formula cannot be read: ";" where a closing parenthesis \) or a comma was expected \(arguments are separated by commas\) \(engine: #ERROR!\)$/),
      "Data!B4: #DIV/0!",
      expect.stringMatching(/^Data!B5: #(NUM!|VALUE!): stress must be zero or positive/),
      "brittle: --strict: 5 of 6 formulas evaluate to errors",
    ]);
  });

  it("xlsx-formula-errors: --json --strict keeps stdout the documented grid, errors as standard code text", async () => {
    const { code, grids, stderr } = await calcJson(file, "--strict");
    expect(code).toBe(EXIT_FORMULA_ERRORS);
    expect(grids.Data[1].slice(1)).toEqual(["#REF!", "#REF!"]);
    expect(grids.Data[2][1]).toBe("#VALUE!");
    expect(grids.Data[3][1]).toBe("#DIV/0!");
    expect(stderr).toMatch(/Data!B3: #VALUE!: the formula cannot be read/);
  });

  it("xlsx-formula-errors: a written copy holds only error values a spreadsheet knows (#CYCLE!, #ERROR! were written)", async () => {
    const out = join(dir, "errors-copy.xlsx");
    const io = capture();
    expect(await main(["calc", file, "--out", out], io)).toBe(0);
    // The unreadable formula (semicolons) is not a formula a spreadsheet would run either: it is written as text.
    expect(io.stderr).toMatch(/written as text, not as a formula: Data!B3: characters outside plain arithmetic/);
    const sheet = await (await JSZip.loadAsync(readFileSync(out))).file("xl/worksheets/sheet1.xml")!.async("string");
    const written = [...sheet.matchAll(/<c [^>]*t="e"[^>]*>.*?<v>([^<]*)<\/v>/g)].map((m) => m[1]);
    expect(written).toHaveLength(4);
    expect(written.filter((v) => v === "#REF!")).toHaveLength(2);
    expect(written).toContain("#DIV/0!");
    // The standard values of the file format: ECMA-376 Part 1, 18.17.2.6.
    for (const v of written) expect(STANDARD_ERRORS).toContain(v);
    expect(sheet).not.toMatch(/Infinity|NaN|#CYCLE!|#ERROR!/);
  });

  it("calc-formula-too-deep: a formula that exhausts the engine's stack is that cell's error; every other cell is evaluated (the whole run stopped with \"Maximum call stack size exceeded\")", async () => {
    const file = corpus("calc-formula-too-deep.csv");
    const io = capture();
    expect(await main(["calc", file], io)).toBe(0);
    expect(io.stdout).toMatch(/\n5 formulas evaluated, 3 errors\n$/);
    const { code, grids, stderr } = await calcJson(file, "--strict");
    expect(code).toBe(EXIT_FORMULA_ERRORS);
    const results = grids["calc-formula-too-deep"].slice(1).map((row) => row[1]);
    // Plain arithmetic: 500 ones sum to 500; MEANSTRENGTH(10, 400) = 400 Gamma(1.1) (jstat gammafn).
    expect(results.slice(0, 4)).toEqual(["#VALUE!", "#VALUE!", "#VALUE!", 500]);
    expect(relativeError(results[4], 400 * jStat.gammafn(1.1))).toBeLessThan(1e-12);
    const lines = stderr.trim().split("\n").filter((l) => !l.startsWith("brittle: read "));
    const tooDeep = /: #VALUE!: the formula is too long or too deeply nested for the formula engine: split it over several cells/;
    expect(lines[0]).toMatch(/^'calc-formula-too-deep'!B2/);
    expect(lines[0]).toMatch(tooDeep);
    expect(lines[1]).toBe("'calc-formula-too-deep'!B3: #VALUE!"); // =B2*2 passes the error on, as a spreadsheet does
    expect(lines[2]).toMatch(/^'calc-formula-too-deep'!B4/);
    expect(lines[2]).toMatch(tooDeep);
    expect(lines.at(-1)).toBe("brittle: --strict: 3 of 5 formulas evaluate to errors");
    // A written copy is made too, the refused cells holding #VALUE! (ECMA-376 Part 1, 18.17.2.6).
    const out = join(dir, "too-deep.xlsx");
    expect(await main(["calc", file, "--out", out], capture())).toBe(0);
    const ws = (await readBack(out)).worksheets[0];
    expect(ws.getCell("B2").result).toEqual({ error: "#VALUE!" });
    expect(ws.getCell("B5").result).toBe(500);
  });

  it("a cell whose value the engine throws on reading is that cell's #VALUE!, so the other cells are still read", () => {
    // The throw the engine gave for TRUE inside an array constant before normaliseFormula rewrote it.
    const engine = { getCellValue: () => { throw new Error("Value of the formula cell is not computed."); } };
    expect(readCell(engine as never, { sheet: 0, row: 0, col: 0 }, "={TRUE}")).toEqual({
      value: "#VALUE!",
      error: "#VALUE!",
      message: "the formula engine could not evaluate this cell (Value of the formula cell is not computed.)",
    });
  });

  it("calc-unreadable-formulas: each unreadable or unsupported formula says what is wrong in a spreadsheet's terms, not the parser's", async () => {
    const { code, grids, stderr } = await calcJson(corpus("calc-unreadable-formulas.csv"), "--strict");
    expect(code).toBe(EXIT_FORMULA_ERRORS);
    const message: Record<string, string> = {};
    for (const line of stderr.trim().split("\n")) {
      const m = /^'calc-unreadable-formulas'!B(\d+): (.*)$/.exec(line);
      if (m) message[m[1]] = m[2];
    }
    // The parser's wording: token names, arrows, offsets (e.g. "Expecting token of type --> RParen <-- but found --> '' <--").
    for (const text of Object.values(message)) expect(text).not.toMatch(/Token|-->|<--|->|offset|Parsing error|not recognized|Wrong number/);
    expect(message[2]).toBe("#VALUE!: the formula cannot be read: a closing parenthesis ) is missing at the end (engine: #ERROR!)");
    expect(message[3]).toMatch(/a closing parenthesis \) has no opening one/);
    expect(message[4]).toMatch(/a text in quotes is not closed \(the quote at character 8\)/);
    expect(message[5]).toMatch(/two operators in a row such as ==/);
    expect(message[6]).toMatch(/the formula is empty/);
    expect(message[7]).toMatch(/arguments are separated by commas/);
    expect(message[8]).toMatch(/refers to another workbook, which brittle calc does not open/);
    expect(message[9]).toMatch(/table references such as Table1\[Column\] are not supported/);
    expect(message[10]).toMatch(/R1C1-style references are not supported/);
    expect(message[11]).toMatch(/implicit intersection operator @ is not supported/);
    expect(message[12]).toMatch(/spilled range \(A1#\) is not supported/);
    expect(message[13]).toMatch(/LAMBDA called in place is not supported/);
    expect(message[14]).toMatch(/#NULL! is not an error value the formula engine knows/);
    expect(message[15]).toMatch(/^#NAME\?: unknown function LET/);
    expect(message[16]).toMatch(/^#NAME\?: BRITTLE\.NOSUCH is not one of the add-in's functions/);
    expect(message[17]).toMatch(/^#NAME\?: NoSuchName is neither a function, a cell reference nor a defined name/);
    expect(message[18]).toBe("#REF!: the formula refers to a sheet that is not in this workbook");
    expect(message[19]).toMatch(/^#REF!: it refers to another workbook/);
    expect(message[20]).toBe("#N/A: BRITTLE.MEANSTRENGTH takes 2 arguments (modulus, charStrength); this call gives 1");
    expect(message[21]).toBe("#N/A: BRITTLE.MODULUS takes 1 to 3 arguments (strengths, [censored], [method]); this call gives 0");
    expect(message[23]).toMatch(/^#NAME\?: a reference to a spilled range \(A1#\) is not supported/);
    expect(message[24]).toMatch(/^#NAME\?: the implicit intersection operator @ is not supported/);
    expect(message[25]).toMatch(/^#NAME\?: Survival is neither .* \(or it stands inside an array constant \{ \}, which holds only numbers, text, TRUE, FALSE and error values\)$/);
    expect(message[26]).toMatch(/^#VALUE!: the formula cannot be read: a link to another program \(DDE/);
    expect(message[27]).toBe('#VALUE!: the formula cannot be read: "\u{1F600}" at character 4 is not understood there (engine: #ERROR!)');
    expect(Object.keys(message)).toHaveLength(25);
    // The one formula that works is still evaluated: 400 Gamma(1.1) (jstat gammafn).
    expect(relativeError(grids["calc-unreadable-formulas"][21][1], 400 * jStat.gammafn(1.1))).toBeLessThan(1e-12);
  });

  it("calc-reference-beyond-sheet: a reference past the last row or column is #NAME? with its reason (it read as a blank cell: 0 in a sum, and --strict passed)", async () => {
    const { code, grids, stderr } = await calcJson(corpus("calc-reference-beyond-sheet.csv"), "--strict");
    expect(code).toBe(EXIT_FORMULA_ERRORS);
    // A sheet has 1,048,576 rows and 16,384 columns (A to XFD), a spreadsheet's own limits (from memory; workbook-limits.ts).
    expect(grids["calc-reference-beyond-sheet"].slice(1).map((row) => row[1])).toEqual(["#NAME?", "#NAME?", "#NAME?", 1, "A1048577", "#NAME?"]);
    expect(stderr).toMatch(/^'calc-reference-beyond-sheet'!B2: #NAME\?: A1048577 is beyond the sheet, whose last row is 1,048,576 and last column XFD/m);
    expect(stderr).toMatch(/^'calc-reference-beyond-sheet'!B4: #NAME\?: XFE1 is beyond the sheet/m);
    expect(stderr).toMatch(/brittle: --strict: 4 of 6 formulas evaluate to errors/);
  });

  it("calc-nonfinite: a value beyond double precision is never written as Infinity", async () => {
    const out = join(dir, "nonfinite.xlsx");
    const io = capture();
    const code = await main(["calc", corpus("calc-nonfinite.csv"), "--out", out], io);
    // Either the reader refuses 1e999 in one line, or the copy holds #NUM! where the value cannot be represented.
    if (code !== 0) {
      expect(code).toBe(1);
      expect(io.stderr.trim().split("\n")).toHaveLength(1);
      expect(existsSync(out)).toBe(false);
      return;
    }
    const sheet = await (await JSZip.loadAsync(readFileSync(out))).file("xl/worksheets/sheet1.xml")!.async("string");
    expect(sheet).not.toMatch(/Infinity|NaN/);
    expect(sheet).toMatch(/<c r="A2"[^>]*t="e"[^>]*><v>#NUM!<\/v>/);
    expect(sheet).toMatch(/<c r="B2"[^>]*t="e"[^>]*><f>A2\*2<\/f><v>#NUM!<\/v>/);
  });
});

describe("only safe formulas become formulas in a written workbook", () => {
  it("calc-csv-injection: links, web calls and DDE from a CSV are written as text; add-in and safe formulas stay live", async () => {
    const out = join(dir, "injection.xlsx");
    const io = capture();
    expect(await main(["calc", corpus("calc-csv-injection.csv"), "--out", out], io)).toBe(0);
    const ws = (await readBack(out)).worksheets[0];
    const cell = (a: string) => ws.getCell(a);
    expect(cell("B2").formula).toBe("BRITTLE.MEANSTRENGTH(10,400)");
    // Mean of Weibull(m = 10, scale 400) = 400 Gamma(1 + 1/10) (jstat gammafn).
    expect(relativeError(cell("B2").result as number, 400 * jStat.gammafn(1.1))).toBeLessThan(1e-12);
    expect(cell("B9").formula).toBe("SUM(1,2)");
    // Everything else that could run in a spreadsheet is text with the CSV-injection apostrophe (OWASP: CSV injection).
    expect(cell("B3").value).toBe(`'=HYPERLINK("http://example.invalid/x","open")`);
    expect(cell("B4").value).toBe(`'=WEBSERVICE("http://example.invalid/x")`);
    expect(cell("B5").value).toBe("'=cmd|' /C calc'!A0");
    expect(cell("B6").value).toBe("'+cmd|' /C calc'!A0");
    expect(cell("B7").value).toBe("'-2+3+cmd|' /C calc'!A0");
    expect(cell("B8").value).toBe("'@SUM(1+1)*cmd|' /C calc'!A0");
    for (const a of ["B3", "B4", "B5", "B6", "B7", "B8"]) expect(cell(a).type).toBe(ExcelJS.ValueType.String);
    expect(io.stderr).toMatch(/written as text, not as a formula: calc-csv-injection!B3: it calls HYPERLINK/);
  });

  it("xlsx-unsafe-formulas: the same for formulas saved in a workbook, and a link to another workbook is dropped", async () => {
    const out = join(dir, "unsafe-copy.xlsx");
    const io = capture();
    expect(await main(["calc", corpus("xlsx-unsafe-formulas.xlsx"), "--out", out], io)).toBe(0);
    expect(io.stderr).toMatch(/not carried over into .*: 1 link to another workbook/);
    const ws = (await readBack(out)).getWorksheet("Data")!;
    expect(ws.getCell("B1").formula).toBe("BRITTLE.MODULUS(A1:A10)");
    expect(ws.getCell("B2").formula).toBe("SUM(A1:A10)/COUNT(A1:A10)");
    for (const a of ["B3", "B4", "B5", "B6", "B7"]) expect(ws.getCell(a).type, a).toBe(ExcelJS.ValueType.String);
    expect(ws.getCell("B6").value).toBe("'=[1]Sheet1!A1*2");
    expect(ws.getCell("C1").value).toBe('=HYPERLINK("http://example.invalid")'); // text in the input stays the same text
    // The engine still reads saved built-ins: _xlfn.STDEV.S is the sample standard deviation (jstat stdev, flag true).
    const { grids } = await calcJson(corpus("xlsx-unsafe-formulas.xlsx"));
    expect(relativeError(grids.Data[6][1], jStat.stdev(strengths, true))).toBeLessThan(1e-12);
    expect(grids.Data[0][2]).toBe('=HYPERLINK("http://example.invalid")');
  });

  it("the safe list: add-in names only when registered, built-ins only when listed, no links of any kind", () => {
    const addIn = new Set(["MODULUS", "FIT"]);
    const safe = (f: string) => judgeFormula(f, addIn).safe;
    expect(SAFE_BUILTINS).toEqual([...SAFE_BUILTINS].sort());
    expect(safe('=BRITTLE.MODULUS(A1:A9,,"MLE")*2+_xldudf_BRITTLE_FIT(A1:A9)')).toBe(true);
    expect(safe("=ROUND(SUM(A1:A3)/COUNT(A1:A3),2)")).toBe(true);
    expect(safe("='Lot ''A'''!A1+Strengths")).toBe(true);
    expect(safe('=IF(A1>0,"=cmd|x",-1)')).toBe(true); // the text inside a string literal is only text
    expect(safe("=BRITTLE.NOSUCH(A1)")).toBe(false);
    expect(safe("=INDIRECT(A1)")).toBe(false);
    expect(safe("='C:\\x\\[book.xlsx]Sheet1'!A1")).toBe(false);
    expect(safe("=SUM({1,2})")).toBe(false);
    expect(safe('=SUM(A1:A3"')).toBe(false);
  });
});

describe("writing never harms the input or leaves a broken output", () => {
  const input = join(dir, "input.csv");
  writeFileSync(input, 'x,"=BRITTLE.MEANSTRENGTH(10,400)"\n');
  const before = readFileSync(input);

  it("calc-out-links: --out through a symbolic link or a hard link to the input is refused even with --force", async () => {
    const soft = join(dir, "soft-link.xlsx");
    const hard = join(dir, "hard-link.xlsx");
    symlinkSync(input, soft);
    linkSync(input, hard);
    for (const out of [soft, hard]) {
      const io = capture();
      expect(await main(["calc", input, "--out", out, "--force"], io)).toBe(2);
      expect(io.stderr).toMatch(/never writes over its input/);
    }
    expect(readFileSync(input)).toEqual(before);
  });

  it("a write that fails part way leaves the previous output and no temporary file (a killed run left an empty .xlsx)", async () => {
    const out = join(dir, "kept.xlsx");
    writeFileSync(out, "previous contents");
    const failing = new Proxy(new Uint8Array(8), { get: () => { throw new Error("disk full"); } });
    await expect(writeAtomically(out, failing)).rejects.toThrow();
    expect(readFileSync(out, "utf8")).toBe("previous contents");
    expect(readdirSync(dir).filter((f) => f.endsWith(".tmp"))).toEqual([]);
    await writeAtomically(out, new TextEncoder().encode("new contents"));
    expect(readFileSync(out, "utf8")).toBe("new contents");
    expect(readdirSync(dir).filter((f) => f.endsWith(".tmp"))).toEqual([]);
  });
});
