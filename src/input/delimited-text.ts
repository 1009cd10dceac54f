/**
 * Delimited text (CSV and its relatives) read one way for every input: the
 * sheets of `brittle calc`, the element tables of `brittle part` (whose byte
 * reader asks this module for the dialect of its first lines) and the
 * strengths and element tables pasted into the task pane.
 *
 * Fields: RFC 4180 quoting (a quoted field may hold delimiters, doubled
 * quotes and line ends); lines end in LF, CRLF or a lone CR. Blanks around a
 * field (spaces, tabs that are not the delimiter, no-break spaces) are not
 * part of it.
 *
 * Delimiter (unless stated): among tab, semicolon and comma, the one that
 * splits every sampled line into the same number (> 1) of fields, preferring
 * tab, then semicolon, then comma (a tab or semicolon is chosen on purpose;
 * commas also occur in text and decimals). Where none is consistent: the one
 * found most often on the first line; where the first line has none: runs of
 * blanks if the caller allows them and they split every line alike, else one
 * column.
 *
 * Decimal mark (unless stated): a point in a comma-delimited file; otherwise
 * the one the numbers show (`445,3` a comma, `445.3` a point); both in one
 * file is refused; neither leaves it open (whole numbers read either way, an
 * ambiguous `1,250` is then refused where it is used: number-text.ts).
 *
 * Refused with the place: a comma-delimited file without a header line in
 * which no number has a decimal point and two whole numbers stand side by
 * side (`445,3`: split decimal commas, or two columns?), unless a delimiter
 * or decimal mark is stated; a quoted field that never closes.
 */
import { InputError } from "../errors";
import { type DecimalMark, classifyNumber, closeUpTimesTen, isSpreadsheetError } from "./number-text";

export type Delimiter = "," | ";" | "\t" | "space";

export interface Field {
  text: string;
  quoted: boolean;
}

export interface TextRecord {
  /** 1-based line where the record starts. */
  line: number;
  fields: Field[];
  /** A '#' comment line (element tables), held with no fields. */
  comment?: boolean;
}

export interface DialectChoice {
  /** Stated delimiter, or undefined/"auto" to detect. */
  delimiter?: Delimiter | "auto";
  /** Stated decimal mark, or undefined/"auto" to detect. */
  decimalMark?: DecimalMark | "auto";
  /** Whether runs of blanks may separate fields (element tables, pasted values). */
  allowWhitespace?: boolean;
}

export interface Dialect {
  delimiter: Delimiter;
  /** null: no number in the sample settles it. */
  decimalMark: DecimalMark | null;
  /** How each was settled, for the report ("detected", "stated", "comma-delimited file"). */
  basis: { delimiter: string; decimalMark: string };
}

/**
 * Splits text into records. Blank lines are records with no fields.
 * @example splitRecords('a;"b;c"\n', ";") // [{ line: 1, fields: [{ text: "a", quoted: false }, { text: "b;c", quoted: true }] }]
 */
export function splitRecords(text: string, delimiter: Delimiter): TextRecord[] {
  if (delimiter === "space") return splitWhitespace(text);
  const records: TextRecord[] = [];
  const d = delimiter;
  let line = 1;
  let fields: Field[] = [];
  let start = 1;
  let field = "";
  let quoted = false;
  let inQuotes = false;
  let quoteLine = 0;
  let any = false;
  const endField = () => {
    fields.push({ text: quoted ? field : field.trim(), quoted });
    field = "";
    quoted = false;
  };
  const endRecord = () => {
    if (any || fields.length > 0) endField();
    // A line of nothing but delimiters and blanks holds no data (spreadsheets export empty rows so).
    records.push({ line: start, fields: fields.every((f) => !f.quoted && f.text === "") ? [] : fields });
    fields = [];
    any = false;
    start = line;
  };
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (inQuotes) {
      if (ch === '"') {
        if (text[i + 1] === '"') {
          field += '"';
          i++;
        } else inQuotes = false;
      } else {
        if (ch === "\n" || (ch === "\r" && text[i + 1] !== "\n")) line++;
        field += ch;
      }
      continue;
    }
    if (ch === '"' && field.trim() === "" && !quoted) {
      inQuotes = true;
      quoted = true;
      quoteLine = line;
      field = "";
      any = true;
    } else if (ch === d) {
      any = true;
      endField();
    } else if (ch === "\n" || ch === "\r") {
      if (ch === "\r" && text[i + 1] === "\n") i++;
      line++;
      endRecord();
    } else if (quoted) {
      // Text after a closing quote: keep it, as spreadsheets do, but it is no longer a clean quoted field.
      if (ch.trim() !== "") {
        field = `${field}${ch}`;
        quoted = false;
      }
    } else {
      // The run of plain characters up to the next delimiter, line end or quote, appended at once: the same
      // text as one character at a time, without building a string per character.
      let j = i + 1;
      while (j < text.length) {
        const c = text[j];
        if (c === d || c === "\n" || c === "\r" || c === '"') break;
        j++;
      }
      field += text.slice(i, j);
      any = true;
      i = j - 1;
    }
  }
  if (inQuotes) throw new InputError("input", `line ${quoteLine}: a quoted field is not closed`);
  if (any || fields.length > 0) endRecord();
  return records;
}

function splitWhitespace(text: string): TextRecord[] {
  const lines = text.split(/\r\n|\n|\r/);
  if (lines.length > 1 && lines[lines.length - 1] === "") lines.pop(); // the final line end closes a line, opens none
  return lines.map((l, k) => {
    const t = l.trim();
    return { line: k + 1, fields: t === "" ? [] : splitBlanks(closeUpTimesTen(t)).map((s) => ({ text: s, quoted: false })) };
  });
}

/**
 * A line split at runs of blanks. A single no-break, narrow no-break or figure
 * space between a digit and a group of exactly three digits is no blank but a
 * thousands separator ("1 250", as French and other locales write 1250): it
 * stays in its field, which the number rules then refuse; splitting there read
 * 1250 as two fields, 1 and 250.
 * @example splitBlanks("1\u00a0250 2") // ["1\u00a0250", "2"]
 */
export function splitBlanks(line: string): string[] {
  return line.split(/[ \t]+|[\u00a0\u202f\u2007]+(?!\d{3}(?!\d))|(?<!\d)[\u00a0\u202f\u2007]+/).filter((s) => s !== "");
}

/**
 * Physical lines of a sample that carry content (no blank lines, no '#' comments when asked).
 * @example contentLines("# c\n\n1;2\n", true) // [{ line: 3, text: "1;2" }]
 */
export function contentLines(text: string, comments: boolean, limit = 200): { line: number; text: string }[] {
  const out: { line: number; text: string }[] = [];
  const lines = text.split(/\r\n|\n|\r/);
  for (let k = 0; k < lines.length && out.length < limit; k++) {
    const t = lines[k].trim();
    if (/^[\s,;"]*$/.test(t) || (comments && t.startsWith("#") && !isSpreadsheetError(t.split(/[\t;, ]/)[0]))) continue;
    out.push({ line: k + 1, text: lines[k] });
  }
  return out;
}

function countFields(line: string, d: string): number {
  let n = 1;
  let inQuotes = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (ch === '"') inQuotes = !inQuotes;
    else if (ch === d && !inQuotes) n++;
  }
  return n;
}

const CANDIDATES: Delimiter[] = ["\t", ";", ","];

function delimiterName(d: Delimiter): string {
  return d === "\t" ? "tab" : d === "space" ? "runs of blanks" : d === ";" ? "semicolon" : "comma";
}

/**
 * Settles the delimiter and decimal mark from sample lines (the content
 * lines of the first part of the input, in order).
 * @example detectDialect([{ line: 1, text: "s;v" }, { line: 2, text: "445,3;2" }]) // delimiter ";", decimalMark "comma"
 */
export function detectDialect(sample: { line: number; text: string }[], choice: DialectChoice = {}): Dialect {
  const delimiter = detectDelimiter(sample, choice);
  const records = sample.flatMap((l) => {
    try {
      return splitRecords(l.text, delimiter.delimiter).map((r) => ({ ...r, line: l.line }));
    } catch {
      return []; // a quoted field spanning lines: the full reader reports it if it never closes
    }
  });
  return settleDecimalMark(records, delimiter, choice);
}

/**
 * The delimiter, and how it was settled.
 * @example detectDelimiter([{ line: 1, text: "a\tb, c" }]).delimiter // "\t"
 */
export function detectDelimiter(sample: { line: number; text: string }[], choice: DialectChoice = {}): { delimiter: Delimiter; basis: string } {
  const evidence: DelimiterEvidence = { lines: sample.length, first: [0, 0, 0], same: [true, true, true] };
  CANDIDATES.forEach((d, k) => {
    const counts = sample.map((l) => countFields(l.text, d));
    evidence.first[k] = counts.length > 0 ? counts[0] : 0;
    evidence.same[k] = counts.every((c) => c === counts[0]);
  });
  return chooseDelimiter(evidence, choice);
}

/** What the content lines say about each candidate delimiter (tab, semicolon, comma, in CANDIDATES order). */
interface DelimiterEvidence {
  /** Content lines seen. */
  lines: number;
  /** Fields on the first content line under each candidate. */
  first: number[];
  /** Whether every content line has that many. */
  same: boolean[];
}

function chooseDelimiter(evidence: DelimiterEvidence, choice: DialectChoice): { delimiter: Delimiter; basis: string } {
  const statedMark = choice.decimalMark && choice.decimalMark !== "auto" ? choice.decimalMark : null;
  if (choice.delimiter && choice.delimiter !== "auto") return { delimiter: choice.delimiter, basis: "stated" };
  // A stated decimal comma rules the comma out as a delimiter.
  const candidates = CANDIDATES.filter((d) => !(d === "," && statedMark === "comma"));
  const at = (d: Delimiter) => CANDIDATES.indexOf(d);
  const consistent = candidates.find((d) => evidence.lines > 0 && evidence.first[at(d)] > 1 && evidence.same[at(d)]);
  if (consistent !== undefined) return { delimiter: consistent, basis: "detected: splits every line alike" };
  const first = candidates.map((d) => (evidence.lines > 0 ? evidence.first[at(d)] - 1 : 0));
  const most = Math.max(0, ...first);
  if (most > 0) return { delimiter: candidates[first.indexOf(most)], basis: "detected: most frequent on the first line" };
  if (choice.allowWhitespace) return { delimiter: "space", basis: "detected: runs of blanks" };
  // One column: a delimiter that cannot be a decimal mark here; comma by convention.
  return { delimiter: statedMark === "comma" ? ";" : ",", basis: "no delimiter found: one column" };
}

/**
 * The delimiter of a whole text, from every content line (as contentLines
 * picks them, without a limit) counted as countFields counts, in one pass
 * that keeps no line: the same choice as detectDelimiter(contentLines(text,
 * comments, Infinity)) at a fraction of the cost on a large sheet.
 * @example detectDelimiterOfText("s;v\n445,3;2\n", false).delimiter // ";"
 */
export function detectDelimiterOfText(text: string, comments: boolean, choice: DialectChoice = {}): { delimiter: Delimiter; basis: string } {
  const evidence: DelimiterEvidence = { lines: 0, first: [0, 0, 0], same: [true, true, true] };
  const n = text.length;
  let i = 0;
  for (;;) {
    // One physical line: fields under tab, semicolon and comma (a quote toggles quoting for all three).
    let tabs = 1;
    let semicolons = 1;
    let commas = 1;
    let inQuotes = false;
    let content = false; // anything but blanks, commas, semicolons and quotes
    let firstNonBlank = -1;
    for (; i < n; i++) {
      const c = text.charCodeAt(i);
      if (c === 10 || c === 13) break;
      if (c === 34) inQuotes = !inQuotes;
      else if (!inQuotes) {
        if (c === 9) tabs++;
        else if (c === 59) semicolons++;
        else if (c === 44) commas++;
      }
      const blank = isBlank(c);
      if (!blank && firstNonBlank < 0) firstNonBlank = c;
      if (!content && !blank && c !== 44 && c !== 59 && c !== 34) content = true;
    }
    if (content && !(comments && firstNonBlank === 35)) {
      const counts = [tabs, semicolons, commas];
      for (let k = 0; k < 3; k++) {
        if (evidence.lines === 0) evidence.first[k] = counts[k];
        else if (counts[k] !== evidence.first[k]) evidence.same[k] = false;
      }
      evidence.lines++;
    }
    if (i >= n) break;
    i += text.charCodeAt(i) === 13 && text.charCodeAt(i + 1) === 10 ? 2 : 1;
  }
  return chooseDelimiter(evidence, choice);
}

const BLANK = /\s/;

/** A character String.prototype.trim removes and /\s/ matches (ECMAScript WhiteSpace and LineTerminator). */
function isBlank(c: number): boolean {
  if (c < 128) return c === 32 || (c >= 9 && c <= 13);
  return BLANK.test(String.fromCharCode(c));
}

/**
 * The decimal mark from the records (all of a text, or a sample), under the delimiter.
 * @example settleDecimalMark(splitRecords("445.3;1\n", ";"), { delimiter: ";", basis: "stated" }).decimalMark // "point"
 */
export function settleDecimalMark(records: TextRecord[], delimiter: { delimiter: Delimiter; basis: string }, choice: DialectChoice = {}): Dialect {
  const statedMark = choice.decimalMark && choice.decimalMark !== "auto" ? choice.decimalMark : null;
  const d = delimiter.delimiter;
  if (statedMark) return { delimiter: d, decimalMark: statedMark, basis: { delimiter: delimiter.basis, decimalMark: "stated" } };
  if (d === ",") {
    if (delimiter.basis !== "stated") refuseSplitDecimals(records);
    return { delimiter: d, decimalMark: "point", basis: { delimiter: delimiter.basis, decimalMark: "comma-delimited file" } };
  }
  const proof: Partial<Record<DecimalMark, { line: number; text: string }>> = {};
  for (const r of records) {
    for (const f of r.fields) {
      const shape = classifyNumber(f.text);
      if (shape.kind === "decimal" && !proof[shape.mark]) proof[shape.mark] = { line: r.line, text: f.text };
    }
  }
  if (proof.point && proof.comma) {
    throw new InputError(
      "input",
      `mixed decimal marks: line ${proof.point.line} has "${proof.point.text}", line ${proof.comma.line} has "${proof.comma.text}"; ` +
        `use one mark, or state it (--decimal-comma or --decimal-point; in the form, the decimal-comma switch)`,
    );
  }
  const mark: DecimalMark | null = proof.point ? "point" : proof.comma ? "comma" : null;
  const at = proof.point ?? proof.comma;
  return {
    delimiter: d,
    decimalMark: mark,
    basis: { delimiter: delimiter.basis, decimalMark: at ? `detected: "${at.text}" on line ${at.line}` : "not settled: whole numbers only" },
  };
}

/**
 * A comma file with no header, no decimal point and two whole numbers side
 * by side may be split decimal commas. (With a header line of text, split
 * decimals give rows wider than the header, which the field count catches.)
 */
function refuseSplitDecimals(records: TextRecord[]): void {
  const first = records.find((r) => r.fields.length > 0);
  if (!first || !first.fields.some((f) => classifyNumber(f.text).kind !== "not-a-number")) return;
  let suspect: { line: number; text: string } | null = null;
  for (const r of records) {
    for (const f of r.fields) {
      const shape = classifyNumber(f.text);
      if ((shape.kind === "decimal" || shape.kind === "ambiguous") && !f.quoted) return;
    }
    if (suspect === null && r.fields.length > 1 && r.fields.every((f) => !f.quoted)) {
      // Read with commas as decimal marks, would the line still be numbers (separated by blanks, if at all)?
      const text = r.fields.map((f) => f.text).join(",");
      const tokens = text.split(/[ \t\u00a0]+/);
      const asDecimalComma = tokens.every((t) => {
        const shape = classifyNumber(t);
        return shape.kind === "integer" || (shape.kind === "decimal" && shape.mark === "comma") || (shape.kind === "ambiguous" && shape.separator === "comma");
      });
      if (asDecimalComma) suspect = { line: r.line, text };
    }
  }
  if (suspect) {
    throw new InputError(
      "input",
      `line ${suspect.line}: "${suspect.text}" may hold numbers with decimal commas split apart by the comma delimiter ` +
        `(no number in the file has a decimal point, and there is no header line); use semicolons or tabs between fields, or state the meaning: ` +
        `--decimal-comma (commas are decimal marks) or --decimal-point (commas separate fields)`,
    );
  }
}

export interface FieldCountProblem {
  line: number;
  found: number;
  expected: number;
}

/**
 * Every record with content must have as many fields as the first one.
 * Trailing empty fields beyond that count (spreadsheet exports pad rows to
 * the widest) are dropped; nothing else is.
 * @example evenFieldCounts(splitRecords("a,b\n1\n", ",")).problem // { line: 2, found: 1, expected: 2 }
 */
export function evenFieldCounts(records: TextRecord[]): { records: TextRecord[]; problem: FieldCountProblem | null } {
  const first = records.find((r) => r.fields.length > 0);
  if (!first) return { records, problem: null };
  const expected = first.fields.length;
  for (const r of records) {
    if (r.fields.length === 0) continue;
    if (r.fields.length > expected && r.fields.slice(expected).every((f) => f.text === "" && !f.quoted)) {
      r.fields = r.fields.slice(0, expected);
    }
    if (r.fields.length !== expected) return { records, problem: { line: r.line, found: r.fields.length, expected } };
  }
  return { records, problem: null };
}

/**
 * The one-line message for a field-count problem, with the split-decimal hint when it fits.
 * @example fieldCountMessage({ line: 2, found: 1, expected: 2 }, dialect, 1) // "line 2 has 1 field, but line 1 has 2 (delimiter: comma)"
 */
export function fieldCountMessage(p: FieldCountProblem, dialect: Dialect, firstLine: number): string {
  const hint =
    dialect.delimiter === "," && p.found > p.expected
      ? " (a shifted column? or decimal commas splitting numbers in two: then use semicolons or tabs between fields; a one-column file also reads with --decimal-comma)"
      : "";
  return `line ${p.line} has ${p.found} field${p.found === 1 ? "" : "s"}, but line ${firstLine} has ${p.expected} (delimiter: ${delimiterName(dialect.delimiter)})${hint}`;
}

export { delimiterName };
