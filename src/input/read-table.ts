/**
 * A whole delimited text in memory (a CSV sheet, a pasted block) read into
 * records under one dialect, with every field count checked. Numbers are
 * read where they are used, under the dialect's decimal mark, by
 * `fieldNumber`, so a token that stays ambiguous is refused at its place.
 */
import { InputError } from "../errors";
import {
  type Dialect,
  type DialectChoice,
  type TextRecord,
  detectDelimiterOfText,
  settleDecimalMark,
  evenFieldCounts,
  fieldCountMessage,
  splitRecords,
} from "./delimited-text";
import { type DecimalMark, isSpreadsheetError, plainNumberValue, quoteText, readNumber } from "./number-text";

export interface DelimitedTable {
  dialect: Dialect;
  /** One record per line (a quoted line end joins lines); blank lines have no fields. */
  records: TextRecord[];
}

/**
 * Reads a text. `comments`: lines starting with '#' are no data (element
 * tables); the caller reports the lines it skips.
 * @example readDelimited("s;v\n445,3;2\n").dialect // { delimiter: ";", decimalMark: "comma", basis: ... }
 */
export function readDelimited(text: string, choice: DialectChoice & { comments?: boolean } = {}): DelimitedTable {
  const delimiter = detectDelimiterOfText(text, choice.comments ?? false, choice);
  const all = splitRecords(text, delimiter.delimiter);
  const records = choice.comments ? all.map((r) => (isComment(r) ? { ...r, fields: [], comment: true } : r)) : all;
  const dialect = settleDecimalMark(records, delimiter, choice);
  const { problem } = evenFieldCounts(records);
  if (problem) {
    const first = records.find((r) => r.fields.length > 0)!;
    throw new InputError("input", fieldCountMessage(problem, dialect, first.line));
  }
  return { dialect, records };
}

/** A '#' comment line; a spreadsheet error value ("#N/A", "#DIV/0!") also begins with '#' but is a value, read (and refused) as one. */
export function isComment(r: TextRecord): boolean {
  return r.fields.length > 0 && !r.fields[0].quoted && r.fields[0].text.startsWith("#") && !isSpreadsheetError(r.fields[0].text);
}

/**
 * The number in a field, under the file's decimal mark; throws an InputError
 * naming the line and field when the text is number-shaped but cannot be
 * read safely. Returns null for text that is not a number at all.
 * @example fieldNumber("1,250", "comma", 3, 2) // 1.25;  fieldNumber("1,250", null, 3, 2) throws "line 3, field 2: ..."
 */
export function fieldNumber(text: string, mark: DecimalMark | null, line: number, field: number): number | null {
  const plain = plainNumberValue(text, mark);
  if (plain !== undefined) return plain;
  const r = readNumber(text, mark);
  if (r.ok) return r.value;
  if (r.reason === "is not a number") return null;
  throw new InputError("input", `line ${line}, field ${field}: ${quoteText(text)} ${r.reason}`);
}
