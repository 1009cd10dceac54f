/**
 * Evaluate a loaded workbook in the embedded engine and collect what a user
 * would see: every cell's value, errors as the standard code text ("#NUM!")
 * with the engine's message beside them. Only cells that hold something are
 * visited (and the cells their array results fill), never the rectangle a
 * sheet spans.
 */
import { CellType, DetailedCellError, type HyperFormula } from "hyperformula";
import { addNamedRanges, createEngine, type NamedRange } from "./engine";
import { NOT_REPRESENTABLE, standardError, type StandardError } from "./error-values";
import { fitsRangeBudget } from "./range-budget";
import { columnName, ShownGrid, type Shown } from "./shown-grid";
import type { FunctionMetadata } from "../functions/metadata";
import type { LoadedWorkbook } from "./workbook-io";

export type { Shown };
export { columnName };

export interface FormulaResult extends ShownCell {
  sheet: string;
  address: string;
  formula: string;
}

export interface Evaluation {
  engine: HyperFormula;
  grids: Record<string, Shown[][]>;
  formulas: FormulaResult[];
  /** The add-in's function names (FIT, MODULUS...), which the safe-formula check needs when writing. */
  addInNames: ReadonlySet<string>;
  /** Defined names the engine could not take (formulas using them show #NAME?). */
  refusedNames: string[];
}

/** A cell as shown: its value, or an error's standard code (as value and as error) and message. */
export interface ShownCell {
  value: Shown;
  /** Set when the cell is an error, so text that merely looks like "#N/A" is never taken for one. */
  error?: StandardError;
  message?: string;
}

export function evaluateWorkbook(workbook: LoadedWorkbook, metadata: FunctionMetadata[]): Evaluation {
  const engine = createEngine(workbook.sheets, metadata, { date1904: workbook.date1904 === true });
  const { names, tooLarge } = namedRanges(workbook, engine);
  const refusedNames = [...tooLarge, ...addNamedRanges(engine, names)];
  const grids: Record<string, Shown[][]> = {};
  const formulas: FormulaResult[] = [];
  for (const name of Object.keys(workbook.sheets)) {
    const sheet = engine.getSheetId(name)!;
    const grid = new ShownGrid();
    const put = (r: number, c: number, v: Shown) => grid.put(r, c, v);
    workbook.sheets[name].forEach((row, r) =>
      row.forEach((contents, c) => {
        const cell = shownCell(engine.getCellValue({ sheet, row: r, col: c }));
        put(r, c, cell.value);
        if (typeof contents === "string" && contents.startsWith("=")) {
          formulas.push({ sheet: name, address: columnName(c) + (r + 1), formula: contents, ...cell });
          const extent = spillExtent(engine, sheet, r, c);
          for (let i = 0; i < extent.rows; i++) {
            for (let j = i === 0 ? 1 : 0; j < extent.cols; j++) put(r + i, c + j, shownCell(engine.getCellValue({ sheet, row: r + i, col: c + j })).value);
          }
        }
      }),
    );
    grids[name] = grid.rows;
  }
  return { engine, grids, formulas, addInNames: new Set(metadata.map((f) => f.id)), refusedNames };
}

/** What the engine returned, as a spreadsheet would show it. */
export function shownCell(v: unknown): ShownCell {
  if (v instanceof DetailedCellError) {
    const { value, message } = standardError(v.value, v.message);
    return { value, error: value, ...(message ? { message } : {}) };
  }
  if (typeof v === "number" && !Number.isFinite(v)) return { value: "#NUM!", error: "#NUM!", message: NOT_REPRESENTABLE };
  if (v === undefined) return { value: null };
  return { value: v as Shown };
}

/**
 * The workbook's defined names the engine can take: workbook-wide and
 * sheet-scoped ones, not the file's own (_xlnm.Print_Area and such) nor
 * those that point into another file.
 */
function namedRanges(workbook: LoadedWorkbook, engine: HyperFormula): { names: NamedRange[]; tooLarge: string[] } {
  const out: NamedRange[] = [];
  const tooLarge: string[] = [];
  for (const n of workbook.names ?? []) {
    if (/^_xlnm\./i.test(n.name) || n.formula.includes("[")) continue;
    // A name over a whole sheet would cost the engine minutes; formulas using it show #NAME?.
    if (!fitsRangeBudget(n.formula)) {
      tooLarge.push(n.name);
      continue;
    }
    const sheetName = n.localSheet === undefined ? undefined : workbook.sheetOrder?.[n.localSheet];
    const scope = sheetName === undefined ? undefined : engine.getSheetId(sheetName);
    if (n.localSheet !== undefined && scope === undefined) continue;
    out.push({ name: n.name, expression: n.formula, ...(scope === undefined ? {} : { scope }) });
  }
  return { names: out, tooLarge };
}

/** The rows and columns an array formula fills (1 x 1 for any other cell). */
export function spillExtent(engine: HyperFormula, sheet: number, row: number, col: number): { rows: number; cols: number } {
  if (engine.getCellType({ sheet, row, col }) !== CellType.ARRAYFORMULA) return { rows: 1, cols: 1 };
  const inSpill = (r: number, c: number) => engine.getCellType({ sheet, row: r, col: c }) === CellType.ARRAY;
  let cols = 1;
  while (inSpill(row, col + cols)) cols++;
  let rows = 1;
  while (inSpill(row + rows, col)) rows++;
  return { rows, cols };
}
