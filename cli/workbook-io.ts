/**
 * Reading and writing workbooks for headless evaluation: .xlsx through
 * exceljs and .csv. A workbook becomes a set of sheets of plain cell contents
 * (numbers, text, booleans, null, and formulas as "=..." text), which is what
 * the formula engine takes; writing keeps each formula and stores its
 * computed value beside it.
 */
import { readFile } from "node:fs/promises";
import { InputError } from "../src/errors";
import type { Delimiter, Dialect, DialectChoice } from "../src/input/delimited-text";
import { type TextEncodingName, decodeText } from "../src/input/encoding";
import { looksNumeric } from "../src/input/number-text";
import { fieldNumber, readDelimited } from "../src/input/read-table";
import { type SeparatorHint, separatorHint } from "../src/input/separator-hint";
import type { ExcelJS } from "./exceljs-loader";
import { WorkbookError } from "./workbook-errors";
import type { DefinedName, DroppedParts } from "./xlsx-parts";

export { WorkbookError };

export type Contents = number | string | boolean | null;

export interface LoadedWorkbook {
  kind: "xlsx" | "csv";
  sheets: Record<string, Contents[][]>;
  /** The exceljs workbook an .xlsx came from, kept so --out preserves its formatting. */
  source?: ExcelJS.Workbook;
  /** How a .csv was read (encoding, delimiter, decimal mark), for the user to see. */
  readAs?: string;
  /** Parts of an .xlsx removed before reading (charts, images, comments...): not in a written copy. */
  dropped?: DroppedParts;
  /** An .xlsx's defined names, read from the file itself. */
  names?: DefinedName[];
  /** An .xlsx's sheet names in file order (chart sheets included), to place sheet-scoped names. */
  sheetOrder?: string[];
  /** An .xlsx in the 1904 date system: the engine's date functions must count from 1904-01-01 too. */
  date1904?: boolean;
}

/** `csv`: how to read a .csv when detection is not wanted (--decimal-comma, --decimal-point). */
export async function loadWorkbook(path: string, csv: DialectChoice = {}): Promise<LoadedWorkbook> {
  const lower = path.toLowerCase();
  if (lower.endsWith(".csv")) {
    try {
      const { rows, dialect, encoding, endOfFileMark } = readCsvBytes(await readBytes(path), csv);
      const readAs = describeReading(encoding, dialect) + (endOfFileMark ? "; the end-of-file mark (Ctrl-Z) after the last line is no row" : "");
      return { kind: "csv", sheets: { [sheetNameFor(path)]: rows }, readAs };
    } catch (error) {
      if (error instanceof InputError) throw new WorkbookError(`${path}: ${error.message}`);
      throw error;
    }
  }
  if (lower.endsWith(".xlsx")) return (await import("./xlsx-read")).loadXlsx(path);
  throw new WorkbookError(`${path}: unsupported file type (use .xlsx or .csv)`);
}

async function readBytes(path: string): Promise<Uint8Array> {
  try {
    return await readFile(path);
  } catch (error) {
    throw new WorkbookError(`cannot read ${path}: ${(error as NodeJS.ErrnoException).code ?? String(error)}`);
  }
}

function describeReading(encoding: TextEncodingName, d: Dialect): string {
  const named = { ",": "comma", ";": "semicolon", "\t": "tab", space: "blanks" }[d.delimiter];
  const delimiter = d.basis.delimiter.startsWith("stated on line 1") ? `${named}-delimited (${d.basis.delimiter})` : `${named}-delimited`;
  const mark = d.decimalMark === null ? "decimal mark not needed (whole numbers only)" : `decimal ${d.decimalMark} (${d.basis.decimalMark})`;
  return `${encoding}, ${delimiter}, ${mark}`;
}

function sheetNameFor(path: string): string {
  const base = path.replace(/^.*[\\/]/, "").replace(/\.[^.]*$/, "");
  return base.replace(/[^A-Za-z0-9 _-]/g, "_").slice(0, 31) || "Sheet1";
}

/**
 * A CSV sheet from its bytes: encoding, delimiter and decimal mark as
 * src/input settles them; one row per record, as a spreadsheet opens it
 * (a blank line is an empty row; a quoted line end stays inside its row).
 */
export function readCsvBytes(
  bytes: Uint8Array,
  choice: DialectChoice = {},
): { rows: Contents[][]; dialect: Dialect; encoding: TextEncodingName; endOfFileMark: boolean } {
  const { text, encoding } = decodeText(bytes);
  return { ...readCsvText(text, choice), encoding };
}

/** CSV text (RFC 4180 quoting; see src/input/delimited-text.ts). Numbers and TRUE/FALSE become values. */
export function parseCsv(text: string, choice: DialectChoice = {}): Contents[][] {
  return readCsvText(text, choice).rows;
}

function readCsvText(text: string, choice: DialectChoice): { rows: Contents[][]; dialect: Dialect; endOfFileMark: boolean } {
  const withMark = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  // A Ctrl-Z after the last line is the end-of-file mark of older DOS and Windows programs, not a row.
  const endOfFileMark = withMark.endsWith("\x1a");
  const full = endOfFileMark ? withMark.slice(0, -1) : withMark;
  // A first line "sep=;" states the delimiter and is no row, as a spreadsheet opens the file. It is
  // blanked rather than cut, so messages keep naming the lines of the file.
  const hint = separatorHint(full);
  const body = hint ? full.slice(full.search(/[\r\n]|$/)) : full;
  const { dialect, records } = readDelimited(body, hint ? { ...choice, delimiter: hintedDelimiter(hint) } : choice);
  if (hint) {
    records.shift();
    dialect.basis.delimiter = `stated on line 1 by "${hint.text}", which is no row`;
  }
  const rows: Contents[][] = [];
  for (const record of records) {
    rows.push(record.fields.map((f, k) => (f.quoted ? quotedValue(f.text, dialect, record.line, k + 1) : csvValue(f.text, dialect, record.line, k + 1))));
  }
  return { rows, dialect, endOfFileMark };
}

function hintedDelimiter(hint: SeparatorHint): Delimiter {
  const d = hint.delimiter;
  if (d === "," || d === ";" || d === "\t") return d;
  throw new InputError("input", `line 1 ("${hint.text}") names "${d}" as the delimiter; a .csv sheet may be delimited by commas, semicolons or tabs`);
}

/**
 * A quoted field. Quotes only protect delimiters and line ends: a spreadsheet reads a quoted number
 * as a number, and so did the formula engine here, but with its own rules ("1.250" became 1.25, while
 * "373,763" in a decimal-comma file stayed text and SUM counted it as nothing). So a number-shaped
 * field is read under the file's rules, as if unquoted; anything else stays text.
 */
function quotedValue(text: string, dialect: Dialect, line: number, field: number): Contents {
  const t = text.trim();
  if (t === "" || !looksNumeric(t)) return text;
  return fieldNumber(t, dialect.decimalMark, line, field) ?? text;
}

function csvValue(t: string, dialect: Dialect, line: number, field: number): Contents {
  if (t === "") return null;
  if (t.startsWith("=")) return t;
  if (t.length === 4 && /^true$/i.test(t)) return true;
  if (t.length === 5 && /^false$/i.test(t)) return false;
  return fieldNumber(t, dialect.decimalMark, line, field) ?? t;
}
