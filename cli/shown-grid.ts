/**
 * The grid `brittle calc --json` prints for one sheet, filled cell by cell:
 * rows up to the last filled one, each row up to its last filled cell, blanks
 * as null. Shared by the engine's evaluation and the direct one, so both
 * print the same shape. No engine import here: the direct path must not load it.
 */
import { EMPTY_ROW } from "./workbook-limits";

export type Shown = number | string | boolean | null;

export class ShownGrid {
  readonly rows: Shown[][] = [];

  put(r: number, c: number, v: Shown): void {
    if (v === null) return;
    const grid = this.rows;
    while (grid.length <= r) grid.push(EMPTY_ROW as Shown[]);
    if (grid[r] === EMPTY_ROW) grid[r] = [];
    const row = grid[r];
    while (row.length < c) row.push(null);
    row[c] = v;
  }
}

/** A column's letters from its zero-based index: 0 is A, 26 is AA. */
export function columnName(index: number): string {
  let name = "";
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) name = String.fromCharCode(65 + ((n - 1) % 26)) + name;
  return name;
}
