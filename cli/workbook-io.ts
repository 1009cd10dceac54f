/**
 * Reading and writing workbooks for headless evaluation: .xlsx through
 * exceljs and .csv. A workbook becomes a set of sheets of plain cell contents
 * (numbers, text, booleans, null, and formulas as "=..." text), which is what
 * the formula engine takes; writing keeps each formula and stores its
 * computed value beside it.
 */
import { readFile } from "node:fs/promises";
import { InputError } from "../src/errors";
import type { Dialect, DialectChoice } from "../src/input/delimited-text";
import { type TextEncodingName, decodeText } from "../src/input/encoding";
import { fieldNumber, readDelimited } from "../src/input/read-table";
import { loadExcelJs, type ExcelJS } from "./exceljs-loader";

export type Contents = number | string | boolean | null;

export interface LoadedWorkbook {
  kind: "xlsx" | "csv";
  sheets: Record<string, Contents[][]>;
  /** The exceljs workbook an .xlsx came from, kept so --out preserves its formatting. */
  source?: ExcelJS.Workbook;
  /** How a .csv was read (encoding, delimiter, decimal mark), for the user to see. */
  readAs?: string;
}

export class WorkbookError extends Error {}

/** `csv`: how to read a .csv when detection is not wanted (--decimal-comma, --decimal-point). */
export async function loadWorkbook(path: string, csv: DialectChoice = {}): Promise<LoadedWorkbook> {
  const lower = path.toLowerCase();
  if (lower.endsWith(".csv")) {
    try {
      const { rows, dialect, encoding } = readCsvBytes(await readBytes(path), csv);
      return { kind: "csv", sheets: { [sheetNameFor(path)]: rows }, readAs: describeReading(encoding, dialect) };
    } catch (error) {
      if (error instanceof InputError) throw new WorkbookError(`${path}: ${error.message}`);
      throw error;
    }
  }
  if (lower.endsWith(".xlsx")) return loadXlsx(path);
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
  const delimiter = { ",": "comma", ";": "semicolon", "\t": "tab", space: "blanks" }[d.delimiter];
  const mark = d.decimalMark === null ? "decimal mark not needed (whole numbers only)" : `decimal ${d.decimalMark} (${d.basis.decimalMark})`;
  return `${encoding}, ${delimiter}-delimited, ${mark}`;
}

function sheetNameFor(path: string): string {
  const base = path.replace(/^.*[\\/]/, "").replace(/\.[^.]*$/, "");
  return base.replace(/[^A-Za-z0-9 _-]/g, "_").slice(0, 31) || "Sheet1";
}

async function loadXlsx(path: string): Promise<LoadedWorkbook> {
  const workbook = new (await loadExcelJs()).Workbook();
  try {
    await workbook.xlsx.load((await readFile(path)) as never);
  } catch (error) {
    const reason = (error as NodeJS.ErrnoException).code ?? (error as Error).message ?? String(error);
    throw new WorkbookError(`cannot read ${path} as an .xlsx workbook: ${String(reason).split("\n")[0]}`);
  }
  const sheets: Record<string, Contents[][]> = {};
  workbook.eachSheet((ws) => {
    const grid: Contents[][] = [];
    const arrays: { top: number; left: number; bottom: number; right: number }[] = [];
    ws.eachRow({ includeEmpty: false }, (row, r) => {
      row.eachCell({ includeEmpty: false }, (cell, c) => {
        while (grid.length < r) grid.push([]);
        const line = grid[r - 1];
        while (line.length < c) line.push(null);
        line[c - 1] = cellContents(cell);
        const v = cell.value as { shareType?: string; ref?: string } | null;
        if (v && typeof v === "object" && v.shareType === "array" && v.ref) arrays.push(decodeRange(v.ref));
      });
    });
    // The other cells of an array formula hold its cached results: the formula refills them.
    for (const a of arrays) {
      for (let r = a.top; r <= a.bottom; r++) {
        for (let c = a.left; c <= a.right; c++) {
          if ((r !== a.top || c !== a.left) && grid[r - 1] && c - 1 < grid[r - 1].length) grid[r - 1][c - 1] = null;
        }
      }
    }
    sheets[ws.name] = grid;
  });
  if (Object.keys(sheets).length === 0) throw new WorkbookError(`${path} has no worksheets`);
  return { kind: "xlsx", sheets, source: workbook };
}

function cellContents(cell: ExcelJS.Cell): Contents {
  const v = cell.value as unknown;
  if (v === null || v === undefined) return null;
  if (typeof v === "number" || typeof v === "boolean") return v;
  // Text that merely starts with "=" stays text: the engine reads a leading apostrophe as "this is text".
  if (typeof v === "string") return v.startsWith("=") ? `'${v}` : v;
  if (v instanceof Date) return excelSerial(v);
  if (typeof v === "object") {
    const o = v as Record<string, unknown>;
    if ("formula" in o || "sharedFormula" in o) return `=${cell.formula}`;
    if ("richText" in o) return (o.richText as { text: string }[]).map((t) => t.text).join("");
    if ("text" in o) return String(o.text);
    if ("error" in o) return String(o.error);
  }
  return String(v);
}

function decodeRange(ref: string): { top: number; left: number; bottom: number; right: number } {
  const [a, b = a] = ref.replace(/\$/g, "").split(":");
  const cell = (x: string) => {
    const m = /^([A-Z]+)(\d+)$/i.exec(x)!;
    const col = [...m[1].toUpperCase()].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
    return { row: Number(m[2]), col };
  };
  const p = cell(a);
  const q = cell(b);
  return { top: Math.min(p.row, q.row), left: Math.min(p.col, q.col), bottom: Math.max(p.row, q.row), right: Math.max(p.col, q.col) };
}

function excelSerial(d: Date): number {
  return d.getTime() / 86400000 + 25569;
}

/**
 * A CSV sheet from its bytes: encoding, delimiter and decimal mark as
 * src/input settles them; one row per record, as a spreadsheet opens it
 * (a blank line is an empty row; a quoted line end stays inside its row).
 */
export function readCsvBytes(bytes: Uint8Array, choice: DialectChoice = {}): { rows: Contents[][]; dialect: Dialect; encoding: TextEncodingName } {
  const { text, encoding } = decodeText(bytes);
  const { rows, dialect } = readCsvText(text, choice);
  return { rows, dialect, encoding };
}

/** CSV text (RFC 4180 quoting; see src/input/delimited-text.ts). Numbers and TRUE/FALSE become values. */
export function parseCsv(text: string, choice: DialectChoice = {}): Contents[][] {
  return readCsvText(text, choice).rows;
}

function readCsvText(text: string, choice: DialectChoice): { rows: Contents[][]; dialect: Dialect } {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const { dialect, records } = readDelimited(body, choice);
  const rows: Contents[][] = [];
  for (const record of records) {
    rows.push(record.fields.map((f, k) => (f.quoted ? f.text : csvValue(f.text, dialect, record.line, k + 1))));
  }
  return { rows, dialect };
}

function csvValue(t: string, dialect: Dialect, line: number, field: number): Contents {
  if (t === "") return null;
  if (t.startsWith("=")) return t;
  if (/^true$/i.test(t)) return true;
  if (/^false$/i.test(t)) return false;
  return fieldNumber(t, dialect.decimalMark, line, field) ?? t;
}
