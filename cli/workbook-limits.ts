/**
 * How much a workbook may hold for `brittle calc`, checked before the engine
 * builds anything, so an oversized file ends with one line and exit code 1
 * instead of an out-of-memory abort. The engine keeps roughly 1 kB per filled
 * cell (values, formulas, the dependency graph), so two million cells stay
 * within about 2 GB, and a full column of strengths (1,048,576 rows) fits.
 */
import { WorkbookError } from "./workbook-errors";
import type { Contents, LoadedWorkbook } from "./workbook-io";

/** A spreadsheet's sheet size, which the engine is configured to accept. */
export const MAX_ROWS = 1048576;
export const MAX_COLUMNS = 16384;

/** Cells holding something (a value, text or a formula) over all sheets; empty and formatted-only cells do not count. */
export const MAX_CONTENT_CELLS = 2_000_000;

/** The one array every empty row of a sparse sheet shares; frozen, so nothing can fill it by mistake. */
export const EMPTY_ROW: Contents[] = Object.freeze([]) as unknown as Contents[];

export function checkCellCount(cells: number, maxCells: number, path: string): void {
  if (cells > maxCells) {
    throw new WorkbookError(`${path} holds more than ${maxCells.toLocaleString("en-US")} filled cells; brittle calc evaluates at most ${maxCells.toLocaleString("en-US")}`);
  }
}

/**
 * Refuses a workbook beyond a spreadsheet's sheet size or the cell limit.
 * Walks only the cells that exist (forEach skips the holes of sparse rows).
 */
export function checkWorkbookSize(workbook: LoadedWorkbook, path: string, maxCells = MAX_CONTENT_CELLS): void {
  let cells = 0;
  for (const [name, rows] of Object.entries(workbook.sheets)) {
    if (rows.length > MAX_ROWS) {
      throw new WorkbookError(`${path}: sheet ${name} has ${rows.length.toLocaleString("en-US")} rows; a sheet holds at most ${MAX_ROWS.toLocaleString("en-US")}`);
    }
    rows.forEach((row, r) => {
      if (row.length > MAX_COLUMNS) {
        throw new WorkbookError(`${path}: row ${r + 1} of sheet ${name} has ${row.length.toLocaleString("en-US")} fields; a sheet holds at most ${MAX_COLUMNS.toLocaleString("en-US")} columns`);
      }
      row.forEach((v) => {
        if (v !== null && v !== undefined && v !== "") cells++;
      });
    });
    checkCellCount(cells, maxCells, path);
  }
}
