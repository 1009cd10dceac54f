/**
 * Evaluate a loaded workbook in the embedded engine and collect what a user
 * would see: every cell's value, errors as the standard code text ("#NUM!")
 * with the engine's message beside them. Only cells that hold something are
 * visited (and the cells their array results fill), never the rectangle a
 * sheet spans.
 */
import { CellType, DetailedCellError, type HyperFormula, type SimpleCellAddress } from "hyperformula";
import { addNamedRanges, createEngine, type NamedRange } from "./engine";
import { NOT_REPRESENTABLE, standardError, type StandardError } from "./error-values";
import { fitsRangeBudget } from "./range-budget";
import { columnName, ShownGrid, type Shown } from "./shown-grid";
import type { FunctionMetadata } from "../functions/metadata";
import { WorkbookError } from "./workbook-errors";
import type { Contents, LoadedWorkbook } from "./workbook-io";

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
  const { engine, refusedNames, refused } = buildGuarded(workbook, metadata);
  const grids: Record<string, Shown[][]> = {};
  const formulas: FormulaResult[] = [];
  for (const name of Object.keys(workbook.sheets)) {
    const sheet = engine.getSheetId(name)!;
    const grid = new ShownGrid();
    const put = (r: number, c: number, v: Shown) => grid.put(r, c, v);
    workbook.sheets[name].forEach((row, r) =>
      row.forEach((contents, c) => {
        const isFormula = typeof contents === "string" && contents.startsWith("=");
        const why = isFormula ? refused.get(refusedKey(name, r, c)) : undefined;
        const cell: ShownCell = why ? { value: "#VALUE!", error: "#VALUE!", message: why } : readCell(engine, { sheet, row: r, col: c }, isFormula ? contents : undefined);
        put(r, c, cell.value);
        if (isFormula) {
          formulas.push({ sheet: name, address: columnName(c) + (r + 1), formula: contents, ...cell });
          const extent = spillExtent(engine, sheet, r, c);
          for (let i = 0; i < extent.rows; i++) {
            for (let j = i === 0 ? 1 : 0; j < extent.cols; j++) put(r + i, c + j, readCell(engine, { sheet, row: r + i, col: c + j }).value);
          }
        }
      }),
    );
    grids[name] = grid.rows;
  }
  return { engine, grids, formulas, addInNames: new Set(metadata.map((f) => f.id)), refusedNames };
}

/** A formula the engine could not take, by sheet, row and column: why, in words. */
type Refused = Map<string, string>;
const refusedKey = (sheet: string, row: number, col: number) => `${sheet}\u0000${row}\u0000${col}`;

/** What the engine gets in place of a formula it cannot take: an error, which formulas reading the cell pass on. */
const REFUSED_FORMULA = "=#VALUE!";

/**
 * The engine with the workbook and its defined names. Building evaluates every formula, and a throw inside
 * the engine (the stack exhausted by a formula chaining two thousand +, a reference or a name inside an
 * array constant: "Value of the formula cell is not computed") stopped the whole run. Then each formula is
 * built alone (its sheet's other cells empty, the names defined): those that throw alone are refused, each
 * with its reason, and the workbook is built again without them. Only the failing path pays for this.
 */
function buildGuarded(workbook: LoadedWorkbook, metadata: FunctionMetadata[]): { engine: HyperFormula; refusedNames: string[]; refused: Refused } {
  const refused: Refused = new Map();
  const first = attempt(() => buildWithNames(workbook, workbook.sheets, metadata));
  if (!(first instanceof Error)) return { ...first, refused };
  const names = Object.keys(workbook.sheets);
  for (const [name, rows] of Object.entries(workbook.sheets)) {
    rows.forEach((row, r) =>
      row.forEach((contents, c) => {
        if (typeof contents !== "string" || !contents.startsWith("=")) return;
        const alone: Record<string, Contents[][]> = Object.fromEntries(names.map((n) => [n, []]));
        // Every row up to the formula's must be an array (the engine refuses a hole among rows; within a row it takes one).
        for (let k = 0; k <= r; k++) alone[name].push([]);
        alone[name][r][c] = contents;
        const result = attempt(() => buildWithNames(workbook, alone, metadata));
        if (result instanceof Error) refused.set(refusedKey(name, r, c), refusal(contents, result));
      }),
    );
  }
  const stopped = `the formula engine stopped before evaluating any formula (${firstLine(first)})`;
  if (refused.size === 0) throw new WorkbookError(stopped);
  const without = Object.fromEntries(
    Object.entries(workbook.sheets).map(([name, rows]) => [
      name,
      rows.map((row, r) => (row.length === 0 ? row : row.map((v, c) => (refused.has(refusedKey(name, r, c)) ? REFUSED_FORMULA : v)))),
    ]),
  );
  const second = attempt(() => buildWithNames(workbook, without, metadata));
  if (second instanceof Error) throw new WorkbookError(stopped);
  return { ...second, refused };
}

function buildWithNames(workbook: LoadedWorkbook, sheets: Record<string, Contents[][]>, metadata: FunctionMetadata[]): { engine: HyperFormula; refusedNames: string[] } {
  const engine = createEngine(sheets, metadata, { date1904: workbook.date1904 === true });
  const { names, tooLarge } = namedRanges(workbook, engine);
  return { engine, refusedNames: [...tooLarge, ...addNamedRanges(engine, names)] };
}

function attempt<T>(run: () => T): T | Error {
  try {
    return run();
  } catch (error) {
    return error instanceof Error ? error : new Error(String(error));
  }
}

/** Why the engine could not take a formula, in a spreadsheet user's terms. */
function refusal(formula: string, error: Error): string {
  if (error instanceof RangeError && /call stack/i.test(error.message)) {
    return "the formula is too long or too deeply nested for the formula engine: split it over several cells (or SUM a range instead of chaining + over many cells)";
  }
  if (formula.includes("{")) {
    return `an array constant { } may hold only numbers, text, TRUE, FALSE and error values, not references, names or calculations (the formula engine stopped on it: ${firstLine(error)})`;
  }
  return `the formula engine stopped on this formula (${firstLine(error)})`;
}

/**
 * One cell's value as shown, read from the engine. A read that throws (the engine once threw "Value of the
 * formula cell is not computed" for TRUE inside an array constant, and the whole run stopped) is that cell's
 * error, so every other cell is still read. formula: the cell's own formula, to word its errors.
 */
export function readCell(engine: HyperFormula, address: SimpleCellAddress, formula?: string): ShownCell {
  let v: unknown;
  try {
    v = engine.getCellValue(address);
  } catch (error) {
    return { value: "#VALUE!", error: "#VALUE!", message: `the formula engine could not evaluate this cell (${firstLine(error)})` };
  }
  return shownCell(v, formula);
}

function firstLine(error: unknown): string {
  return (error instanceof Error ? error.message : String(error)).split("\n")[0].trim();
}

/** What the engine returned, as a spreadsheet would show it. */
export function shownCell(v: unknown, formula?: string): ShownCell {
  if (v instanceof DetailedCellError) {
    const { value, message } = standardError(v.value, v.message, formula);
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
  const typeAt = (r: number, c: number) => {
    try {
      return engine.getCellType({ sheet, row: r, col: c });
    } catch {
      return undefined; // a cell the engine cannot describe spills nothing; its own read reports the error
    }
  };
  if (typeAt(row, col) !== CellType.ARRAYFORMULA) return { rows: 1, cols: 1 };
  const inSpill = (r: number, c: number) => typeAt(r, c) === CellType.ARRAY;
  let cols = 1;
  while (inSpill(row, col + cols)) cols++;
  let rows = 1;
  while (inSpill(row + rows, col)) rows++;
  return { rows, cols };
}
