/**
 * Reading and writing workbooks for headless evaluation: .xlsx through
 * exceljs and .csv. A workbook becomes a set of sheets of plain cell contents
 * (numbers, text, booleans, null, and formulas as "=..." text), which is what
 * the formula engine takes; writing keeps each formula and stores its
 * computed value beside it.
 */
import { readFile } from "node:fs/promises";
import type ExcelJS from "exceljs";
import { WorkbookError } from "./workbook-errors";
import type { DefinedName, DroppedParts } from "./xlsx-parts";

export { WorkbookError };

export type Contents = number | string | boolean | null;

export interface LoadedWorkbook {
  kind: "xlsx" | "csv";
  sheets: Record<string, Contents[][]>;
  /** The exceljs workbook an .xlsx came from, kept so --out preserves its formatting. */
  source?: ExcelJS.Workbook;
  /** Parts of an .xlsx removed before reading (charts, images, comments...): not in a written copy. */
  dropped?: DroppedParts;
  /** An .xlsx's defined names, read from the file itself. */
  names?: DefinedName[];
  /** An .xlsx's sheet names in file order (chart sheets included), to place sheet-scoped names. */
  sheetOrder?: string[];
}

export async function loadWorkbook(path: string): Promise<LoadedWorkbook> {
  const lower = path.toLowerCase();
  if (lower.endsWith(".csv")) return { kind: "csv", sheets: { [sheetNameFor(path)]: parseCsv(await readText(path)) } };
  if (lower.endsWith(".xlsx")) return (await import("./xlsx-read")).loadXlsx(path);
  throw new WorkbookError(`${path}: unsupported file type (use .xlsx or .csv)`);
}

async function readText(path: string): Promise<string> {
  try {
    return await readFile(path, "utf8");
  } catch (error) {
    throw new WorkbookError(`cannot read ${path}: ${(error as NodeJS.ErrnoException).code ?? String(error)}`);
  }
}

function sheetNameFor(path: string): string {
  const base = path.replace(/^.*[\\/]/, "").replace(/\.[^.]*$/, "");
  return base.replace(/[^A-Za-z0-9 _-]/g, "_").slice(0, 31) || "Sheet1";
}

/** RFC 4180 CSV: quoted fields, doubled quotes, CRLF or LF. Numbers and TRUE/FALSE become values. */
export function parseCsv(text: string): Contents[][] {
  const rows: Contents[][] = [];
  let row: Contents[] = [];
  let field = "";
  let quoted = false;
  let wasQuoted = false;
  const endField = () => {
    row.push(wasQuoted ? field : csvValue(field));
    field = "";
    wasQuoted = false;
  };
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  for (let i = 0; i < body.length; i++) {
    const ch = body[i];
    if (quoted) {
      if (ch === '"' && body[i + 1] === '"') {
        field += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"' && field === "") {
      quoted = true;
      wasQuoted = true;
    } else if (ch === ",") endField();
    else if (ch === "\n" || ch === "\r") {
      if (ch === "\r" && body[i + 1] === "\n") i++;
      endField();
      rows.push(row);
      row = [];
    } else field += ch;
  }
  if (quoted) throw new WorkbookError("malformed CSV: a quoted field is not closed");
  if (field !== "" || row.length > 0) {
    endField();
    rows.push(row);
  }
  return rows.map((r) => (r.every((v) => v === null) ? [] : r));
}

function csvValue(text: string): Contents {
  const t = text.trim();
  if (t === "") return null;
  if (t.startsWith("=")) return t;
  if (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) return Number(t);
  if (/^true$/i.test(t)) return true;
  if (/^false$/i.test(t)) return false;
  return text;
}
