/**
 * The engine's cost of a formula grows with the cells its ranges span, filled
 * or not: =SUM(A1:C1048576) on a sheet of two rows takes over a minute and
 * more than a gigabyte, and a range over the whole sheet never finishes. A
 * range over full columns (A:C) costs next to nothing, so a range that runs
 * from row 1 to the last row is read as that column range (normaliseFormula);
 * the other ranges of a workbook may span at most MAX_RANGE_CELLS cells in
 * all, counting each distinct range once (the engine shares them).
 */
import { normaliseFormula } from "./formula-text";
import { WorkbookError } from "./workbook-errors";
import { MAX_COLUMNS } from "./workbook-limits";
import type { LoadedWorkbook } from "./workbook-io";

/** About a minute and under 2 GB in the engine (measured: 31 s and 0.85 GB for one million cells). */
export const MAX_RANGE_CELLS = 2_000_000;

export interface RangeUse {
  /** The range as written, for the message. */
  text: string;
  cells: number;
}

/**
 * The explicit ranges of a formula (A1:B20, Sheet!$A$1:$A$99, 3:7) with the
 * number of cells each spans; text in string literals is skipped, and column
 * ranges (A:C) are not listed.
 */
export function rangesOf(formula: string): RangeUse[] {
  const out: RangeUse[] = [];
  const code = formula.replace(/"(?:[^"]|"")*"/g, '""');
  for (const m of code.matchAll(/(?<![A-Za-z0-9_.$])\$?([A-Za-z]{1,3})\$?(\d{1,7}):\$?([A-Za-z]{1,3})\$?(\d{1,7})(?![A-Za-z0-9_(])/g)) {
    const rows = Math.abs(Number(m[4]) - Number(m[2])) + 1;
    const cols = Math.abs(columnNumber(m[3]) - columnNumber(m[1])) + 1;
    out.push({ text: m[0], cells: rows * cols });
  }
  // A row range needs a digit, a colon and a digit (3:7, 3:$7); most formulas have none, and skip the scan.
  if (!ROW_RANGE_HINT.test(code)) return out;
  for (const m of code.matchAll(/(?<![A-Za-z0-9_.$:])\$?(\d{1,7}):\$?(\d{1,7})(?![A-Za-z0-9_.:(])/g)) {
    out.push({ text: m[0], cells: (Math.abs(Number(m[2]) - Number(m[1])) + 1) * MAX_COLUMNS });
  }
  return out;
}

const ROW_RANGE_HINT = /[0-9]:\$?[0-9]/;

function columnNumber(letters: string): number {
  return [...letters.toUpperCase()].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
}

/** Refuses, in one line naming the cell, a workbook whose formulas' ranges exceed the budget. */
export function checkRangeBudget(workbook: LoadedWorkbook, path: string, budget = MAX_RANGE_CELLS): void {
  const seen = new Set<string>();
  let total = 0;
  for (const [sheet, rows] of Object.entries(workbook.sheets)) {
    rows.forEach((row, r) =>
      row.forEach((contents, c) => {
        if (typeof contents !== "string" || !contents.startsWith("=")) return;
        for (const range of rangesOf(normaliseFormula(contents))) {
          const key = `${sheet}|${range.text.replace(/\$/g, "").toUpperCase()}`;
          if (seen.has(key)) continue;
          seen.add(key);
          total += range.cells;
          if (total > budget) {
            const where = `${sheet}!${columnLetters(c)}${r + 1}`;
            const what = range.cells > budget ? `the range ${range.text} spans ${range.cells.toLocaleString("en-US")} cells` : `its ranges bring the workbook to ${total.toLocaleString("en-US")} referenced cells`;
            throw new WorkbookError(`${path}: ${where}: ${what}; brittle calc evaluates at most ${budget.toLocaleString("en-US")} (whole columns such as A:A count nothing)`);
          }
        }
      }),
    );
  }
}

/** True when a defined name's own ranges fit the budget (a name over the whole sheet does not). */
export function fitsRangeBudget(formula: string, budget = MAX_RANGE_CELLS): boolean {
  return rangesOf(normaliseFormula(`=${formula}`)).reduce((n, r) => n + r.cells, 0) <= budget;
}

function columnLetters(index: number): string {
  let name = "";
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) name = String.fromCharCode(65 + ((n - 1) % 26)) + name;
  return name;
}
