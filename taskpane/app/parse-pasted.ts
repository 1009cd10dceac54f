/**
 * Strengths pasted or typed into the form: one specimen per line, an optional
 * second column of censoring flags, an optional header line. Numbers are read
 * by the same rules as every other input (src/input: decimal marks, refused
 * ambiguities), then go through the same cell policy as a range in the sheet
 * (functions/cells.ts), so a blank, a zero or a negative means here what it
 * means in a cell.
 *
 * Separators: a tab or a semicolon when any line has one (tab first); else,
 * when a line holds a comma, the comma is either the separator of a flag
 * (`430,1`: 430, censored) or a decimal comma (430.1): the reading under
 * which every line is valid is taken, and where both are, the paste is
 * refused until the decimal-comma switch settles it; else runs of blanks.
 *
 * Header: the first non-blank line is a header when it begins with a letter
 * and holds nothing number-like (`Strength (MPa)	flag`); `49S.3` begins with a
 * digit, so it is a mistyped strength and an error, not a header. Every
 * skipped line is named in `notes`.
 *
 * Flags: TRUE, 1, C or CENSORED (any case) mark a censored specimen; FALSE,
 * 0, F or nothing a failure. Anything else is an error at its line.
 */
import { readSample, CellError } from "../../functions/cells";
import {
  type DecimalMark,
  classifyNumber,
  closeUpTimesTen,
  explainNotANumber,
  looksNumeric,
  quoteText,
  readNumber,
  trimInvisible,
} from "../../src/input/number-text";

export interface PastedSample {
  strengths: number[];
  censored?: boolean[];
  /** Lines that held a specimen (blank lines and the header excluded). */
  rows: number;
  header: boolean;
  /** What the form should show under the field: skipped lines, the decimal mark used. */
  notes: string[];
}

export interface PasteOptions {
  /** The form's decimal-comma switch. */
  decimalComma?: boolean;
}

export class PasteError extends Error {}

interface Line {
  line: number;
  text: string;
}

const CENSORED = new Set(["TRUE", "1", "C", "CENSORED"]);
const FAILED = new Set(["FALSE", "0", "F", ""]);
const FLAG_RULE = "must be TRUE, 1, C or CENSORED (censored) or FALSE, 0, F or blank (failed)";

export function parsePasted(text: string, options: PasteOptions = {}): PastedSample {
  // Invisible characters at a line's ends (zero-width spaces, direction marks) are blanks; "4.12 x 10²" is one value.
  const all = text.split(/\r\n|\n|\r/).map((t, k) => ({ line: k + 1, text: closeUpTimesTen(trimInvisible(t)) }));
  const content = all.filter((l) => l.text !== "");
  if (content.length === 0) throw new PasteError("Paste or type the fracture strengths, one per line.");
  const notes: string[] = [];
  const blank = all.filter((l) => l.text === "" && l.line <= content[content.length - 1].line).map((l) => l.line);

  let header: Line | null = null;
  if (isHeader(content[0].text)) header = content.shift()!;
  if (header) notes.push(`Line ${header.line} skipped as a header: "${header.text}".`);
  if (blank.length > 0) notes.push(`Blank line${blank.length === 1 ? "" : "s"} ${blank.join(", ")} skipped.`);
  if (content.length === 0) throw new PasteError(`Line ${header!.line} is a header; paste the strengths below it.`);

  const reading = chooseReading(content, options.decimalComma ? "comma" : null);
  if (reading.mark === "comma") notes.push("Read with decimal commas.");

  // A zero is no specimen, as in a cell range (where desktop hosts pass a blank cell as 0); here it was typed, so say so.
  const zeros = reading.rows.filter((r) => r.strength === 0).map((r) => r.line);
  if (zeros.length > 0) notes.push(`Line${zeros.length === 1 ? "" : "s"} ${zeros.join(", ")} skipped: a zero strength is no specimen.`);

  try {
    const sample = readSample(
      reading.rows.map((r) => [r.strength]),
      reading.anyFlag ? reading.rows.map((r) => [r.censored]) : undefined,
    );
    return { strengths: sample.strengths, censored: sample.censored, rows: content.length, header: header !== null, notes };
  } catch (error) {
    if (error instanceof CellError) throw new PasteError(reword(error.message, reading.rows.map((r) => r.line)));
    throw error;
  }
}

/** Begins with a letter and holds nothing number-like; "n/a" or "NaN" alone is a missing value, not a header. */
function isHeader(text: string): boolean {
  return /^["']?\p{L}/u.test(text) && !text.split(/[\s;,]+/).some((t) => t !== "" && looksNumeric(t)) && explainNotANumber(text) === null;
}

interface Row {
  line: number;
  strength: number;
  censored: boolean;
}

interface Reading {
  rows: Row[];
  anyFlag: boolean;
  mark: DecimalMark | null;
}

type Attempt = { ok: true; reading: Reading } | { ok: false; message: string };

function chooseReading(lines: Line[], stated: DecimalMark | null): Reading {
  const separator = lines.some((l) => l.text.includes("\t")) ? /\s*\t\s*/ : lines.some((l) => l.text.includes(";")) ? /\s*;\s*/ : null;
  if (separator) return settle(attempt(lines, separator, stated));
  if (stated === "comma" || !lines.some((l) => l.text.includes(","))) return settle(attempt(lines, /\s+/, stated));
  // A comma and no other separator: a flag separator or a decimal comma.
  const asSeparator = attempt(lines, /\s*,\s*|\s+/, "point");
  // Commas as decimal marks: the numbers must settle it ("412,5"); "1,250" alone stays ambiguous and is refused.
  const asDecimal = attempt(lines, /\s+/, null);
  // "412," on every line (a spreadsheet's empty second column): both readings give the same sample, so nothing is guessed.
  if (asSeparator.ok && asDecimal.ok && sameSample(asSeparator.reading, asDecimal.reading)) return asSeparator.reading;
  if (asSeparator.ok && asDecimal.ok && stated === null) {
    const example = lines.find((l) => l.text.includes(","))!;
    throw new PasteError(
      `Line ${example.line}: "${example.text}" could be a strength with a decimal comma or a strength and a censoring flag. ` +
        `Turn on "decimal comma" if the comma is a decimal mark, or separate flags with a tab.`,
    );
  }
  if (asSeparator.ok) return asSeparator.reading;
  // Neither reading works: the decimal reading's complaint ("1,250" could be two numbers) says more.
  return settle(asDecimal);
}

function sameSample(a: Reading, b: Reading): boolean {
  return a.rows.every((r, k) => r.strength === b.rows[k].strength && r.censored === b.rows[k].censored);
}

function settle(a: Attempt): Reading {
  if (a.ok) return a.reading;
  throw new PasteError(a.message);
}

/** Reads every line with one separator and decimal mark (null: settled by the numbers, one mark for all). */
function attempt(lines: Line[], separator: RegExp, stated: DecimalMark | null): Attempt {
  let mark = stated;
  if (mark === null) {
    // The whole paste settles the mark first, so "1,250" on line 2 is read by the "445,3" on line 9.
    const proofs = lines.map((l) => ({ l, shape: classifyNumber(l.text.split(separator)[0]) }));
    const point = proofs.find((p) => p.shape.kind === "decimal" && p.shape.mark === "point");
    const comma = proofs.find((p) => p.shape.kind === "decimal" && p.shape.mark === "comma");
    if (point && comma) {
      return { ok: false, message: `Lines ${point.l.line} and ${comma.l.line} use different decimal marks ("${point.l.text}", "${comma.l.text}"): use one.` };
    }
    mark = point ? "point" : comma ? "comma" : null;
  }
  const rows: Row[] = [];
  let anyFlag = false;
  for (const { line, text } of lines) {
    // A value in double quotes (a spreadsheet quotes a cell it copies with a line end or a quote in it) is read without them.
    const cells = text.split(separator).map(unquote);
    if (cells.length > 2) {
      const problem = lineProblem(line, text, mark);
      if (problem) return { ok: false, message: problem };
      if (line === lines[0].line && /^["']?\p{L}/u.test(text)) return { ok: false, message: `Line ${line}: ${quoteText(text)} ${notANumber(text, true)}.` };
      return { ok: false, message: `Line ${line}: expected a strength and at most one flag, found ${cells.length} values.` };
    }
    const r = readNumber(cells[0], mark);
    if (!r.ok) {
      const why = r.reason === "is not a number" ? notANumber(cells[0], line === lines[0].line) : switchWording(r.reason);
      return { ok: false, message: `Line ${line}: ${quoteText(cells[0])} ${why}.` };
    }
    if (r.proves) mark = r.proves;
    let censored = false;
    if (cells.length === 2) {
      anyFlag = true;
      const word = cells[1].trim().toUpperCase();
      if (CENSORED.has(word)) censored = true;
      else if (!FAILED.has(word)) return { ok: false, message: lineProblem(line, text, mark) ?? `Line ${line} (flag) ${FLAG_RULE}; found ${quoteText(cells[1])}.` };
    }
    rows.push({ line, strength: r.value, censored });
  }
  return { ok: true, reading: { rows, anyFlag, mark } };
}

function unquote(cell: string): string {
  const m = /^\s*"(.*)"\s*$/.exec(cell);
  return m && !/(^|[^"])"([^"]|$)/.test(m[1]) ? m[1].replace(/""/g, '"').trim() : cell;
}

function switchWording(reason: string): string {
  return reason.replace(/\(--decimal-comma or --decimal-point; in the form, the decimal-comma switch\)/, "(the decimal-comma switch)");
}

/** Why a value is no number, in the words of the box: the specific reason where there is one. */
function notANumber(text: string, firstLine: boolean): string {
  const why = explainNotANumber(text);
  if (why) return why;
  // A first line that begins with a letter but holds a number is not taken for a header (see isHeader).
  if (firstLine && /^["']?\p{L}/u.test(text)) return "is not a number (a header line must hold no number: remove the number from it, or the line)";
  return "is not a number (use a point as the decimal separator)";
}

/**
 * A line that splits into a strength and something that is no flag, read as a
 * whole: "412 MPa" carries a unit, "1 234" is grouped thousands, "412 (invalid)"
 * has a remark. Null where the whole line says nothing more.
 */
function lineProblem(line: number, text: string, mark: DecimalMark | null): string | null {
  const shape = classifyNumber(text);
  if (shape.kind === "grouped") {
    const r = readNumber(text, mark);
    if (!r.ok) return `Line ${line}: ${quoteText(text)} ${r.reason}.`;
  }
  const why = explainNotANumber(text);
  return why ? `Line ${line}: ${quoteText(text)} ${why}.` : null;
}

/** The cell policy names rows of a range; here they are lines of the box. */
function reword(message: string, lineOfRow: number[]): string {
  const text = message.replace(/^(strengths|censored), row (\d+)/, (_m, what: string, row: string) => {
    const line = lineOfRow[Number(row) - 1] ?? Number(row);
    return `Line ${line}${what === "censored" ? " (flag)" : ""}`;
  });
  return text.charAt(0).toUpperCase() + text.slice(1) + (text.endsWith(".") ? "" : ".");
}
