/**
 * The size of every array a function spills, known before it runs: the
 * embedded engine must reserve the cells at parse time. `rows` is a fixed
 * count, or `{ cellsOf: k }` for as many rows as argument k's range has
 * cells (blank cells give blank rows at the end), or `{ rowsOf: k }` for as
 * many as its rows. `headerRows` adds rows above those (a column table's
 * header). Scalar functions are absent.
 */
export type SpillRows = number | { cellsOf: number } | { rowsOf: number };

export interface SpillShape {
  rows: SpillRows;
  cols: number;
  /** Header rows above the data rows (column tables); default 0. */
  headerRows?: number;
}

export const spillShapes: Record<string, SpillShape> = {};

/** Families add their spilling functions here at import time. */
export function declareSpills(shapes: Record<string, SpillShape>): void {
  Object.assign(spillShapes, shapes);
}
