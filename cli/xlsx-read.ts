/**
 * Reading an .xlsx workbook into plain cell contents for the engine, in
 * memory and time proportional to the cells that hold something: a sheet's
 * rows are sparse arrays (a value in XFD1048576 costs one slot, not the 17
 * billion of the rectangle), and rows with nothing share one empty array.
 */
import { readFile } from "node:fs/promises";
import { isTextKeptAsWritten } from "./direct-evaluation";
import { loadExcelJs, type ExcelJS } from "./exceljs-loader";
import { checkCellCount, EMPTY_ROW, MAX_CONTENT_CELLS } from "./workbook-limits";
import { WorkbookError } from "./workbook-errors";
import { readablePackage } from "./xlsx-parts";
import { EPOCH_1904 } from "./xlsx-iso-dates";
import type { Contents, LoadedWorkbook } from "./workbook-io";

export interface XlsxOptions {
  /** At most this many cells holding something, over all sheets. */
  maxCells?: number;
}

export async function loadXlsx(path: string, options: XlsxOptions = {}): Promise<LoadedWorkbook> {
  const maxCells = options.maxCells ?? MAX_CONTENT_CELLS;
  let bytes: Uint8Array;
  try {
    bytes = await readFile(path);
  } catch (error) {
    throw new WorkbookError(`cannot read ${path}: ${(error as NodeJS.ErrnoException).code ?? String(error)}`);
  }
  const pkg = await readablePackage(bytes, path);
  const excel = await loadExcelJs();
  const workbook = new excel.Workbook();
  try {
    await workbook.xlsx.load(pkg.bytes as never);
  } catch (error) {
    const reason = (error as NodeJS.ErrnoException).code ?? (error as Error).message ?? String(error);
    throw new WorkbookError(`cannot read ${path} as an .xlsx workbook: ${String(reason).split("\n")[0]}`);
  }
  const sheets: Record<string, Contents[][]> = {};
  const epoch = pkg.dateEpoch;
  let cells = 0;
  workbook.eachSheet((ws) => {
    const grid: Contents[][] = [];
    const arrays: { top: number; left: number; bottom: number; right: number }[] = [];
    ws.eachRow({ includeEmpty: false }, (row, r) => {
      let line: Contents[] | undefined;
      row.eachCell({ includeEmpty: false }, (cell, c) => {
        // The other cells of a merged range repeat its first cell's value in the reader, but hold nothing:
        // read as values they would count one specimen several times.
        if (cell.type === excel.ValueType.Merge) return;
        const contents = cellContents(cell, epoch);
        if (contents === null) return;
        if (++cells > maxCells) checkCellCount(cells, maxCells, path);
        if (!line) {
          while (grid.length < r - 1) grid.push(EMPTY_ROW);
          line = grid[r - 1] = [];
        }
        line[c - 1] = contents; // a hole before it, not a run of nulls
        const v = cell.value as { shareType?: string; ref?: string } | null;
        const range = v && typeof v === "object" && v.shareType === "array" && v.ref ? decodeRange(v.ref) : undefined;
        if (range) arrays.push(range);
      });
    });
    // The other cells of an array formula hold its cached results: the formula refills them.
    for (const a of arrays) {
      for (let r = a.top; r <= a.bottom && r <= grid.length; r++) {
        const line = grid[r - 1];
        if (line === EMPTY_ROW) continue;
        for (let c = a.left; c <= a.right && c <= line.length; c++) {
          if ((r !== a.top || c !== a.left) && line[c - 1] !== undefined) {
            delete line[c - 1];
            cells--;
          }
        }
      }
    }
    sheets[ws.name] = grid;
  });
  if (Object.keys(sheets).length === 0) throw new WorkbookError(`${path} has no worksheets`);
  return { kind: "xlsx", sheets, source: workbook, dropped: pkg.dropped, names: pkg.names, sheetOrder: pkg.sheetOrder, date1904: epoch === EPOCH_1904 };
}

function cellContents(cell: ExcelJS.Cell, epoch: number): Contents {
  const v = cell.value as unknown;
  if (v === null || v === undefined) return null;
  if (typeof v === "number" || typeof v === "boolean") return v;
  if (typeof v === "string") return textCell(v);
  if (v instanceof Date) return excelSerial(v, epoch);
  if (typeof v === "object") {
    const o = v as Record<string, unknown>;
    if ("formula" in o || "sharedFormula" in o) {
      const formula = cell.formula;
      // A shared formula whose first cell is missing has no text: its cached result is all there is.
      return formula ? `=${formula}` : plainResult(o.result, epoch);
    }
    if ("richText" in o) return textCell((o.richText as { text: string }[]).map((t) => t.text).join(""));
    if ("text" in o) return textCell(String(o.text));
    if ("error" in o) return String(o.error);
  }
  return String(v);
}

/**
 * A text cell stays text. The engine reads text that looks like a value as that value ("373.763",
 * "50%", "TRUE", "=A1"); a spreadsheet does not: a number stored as text is text, which SUM skips and
 * the add-in's functions refuse. Before, such cells were fitted as strengths. A leading apostrophe
 * tells the engine "this is text" and is not part of the value.
 */
function textCell(text: string): string {
  return text === "" || isTextKeptAsWritten(text) ? text : `'${text}`;
}

function plainResult(result: unknown, epoch: number): Contents {
  if (typeof result === "number" || typeof result === "boolean") return result;
  if (typeof result === "string") return textCell(result);
  if (result instanceof Date) return excelSerial(result, epoch);
  if (result && typeof result === "object" && "error" in result) return String((result as { error: unknown }).error);
  return null;
}

function decodeRange(ref: string): { top: number; left: number; bottom: number; right: number } | undefined {
  const [a, b = a] = ref.replace(/\$/g, "").split(":");
  const cell = (x: string) => {
    const m = /^([A-Z]{1,3})(\d{1,7})$/i.exec(x);
    if (!m) return undefined;
    const col = [...m[1].toUpperCase()].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
    return { row: Number(m[2]), col };
  };
  const p = cell(a);
  const q = cell(b);
  if (!p || !q) return undefined;
  return { top: Math.min(p.row, q.row), left: Math.min(p.col, q.col), bottom: Math.max(p.row, q.row), right: Math.max(p.col, q.col) };
}

/** The serial number of a date in the workbook's date system (its epoch: xlsx-iso-dates.ts). */
function excelSerial(d: Date, epoch: number): number {
  return d.getTime() / 86400000 + epoch;
}
