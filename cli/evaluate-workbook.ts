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
import { MAX_COLUMNS, MAX_ROWS } from "./workbook-limits";
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
        const cell: ShownCell = why ? { value: why.error, error: why.error, message: why.message } : readCell(engine, { sheet, row: r, col: c }, isFormula ? contents : undefined);
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

/** A formula not given to the engine, by sheet, row and column: the error it shows, and why in words. */
type Refused = Map<string, { error: StandardError; message: string }>;
const refusedKey = (sheet: string, row: number, col: number) => `${sheet}\u0000${row}\u0000${col}`;

/**
 * The engine with the workbook and its defined names. Building evaluates every formula, and a throw inside
 * the engine (the stack exhausted by a formula chaining two thousand +, a reference or a name inside an
 * array constant: "Value of the formula cell is not computed") stopped the whole run. Then the formulas that
 * make it throw are found by halving (the workbook built with only some of its formulas), refused, each with
 * its reason, and the workbook is built again without them. Only the failing path pays for this.
 */
function buildGuarded(workbook: LoadedWorkbook, metadata: FunctionMetadata[]): { engine: HyperFormula; refusedNames: string[]; refused: Refused } {
  const refused: Refused = new Map();
  for (const [name, rows] of Object.entries(workbook.sheets)) {
    rows.forEach((row, r) =>
      row.forEach((contents, c) => {
        const beyond = typeof contents === "string" && contents.startsWith("=") ? referenceBeyondSheet(contents) : undefined;
        if (beyond) refused.set(refusedKey(name, r, c), { error: "#NAME?", message: beyond });
      }),
    );
  }
  const first = attempt(() => buildWithNames(workbook, withoutRefused(workbook, refused), metadata));
  if (!(first instanceof Error)) return { ...first, refused };
  // Halving: the workbook with only some of its formulas (the others blank) is built; a half that throws is halved
  // again down to one formula. A few offenders among many formulas cost about two builds of the whole workbook.
  const cells: FormulaCell[] = [];
  for (const [sheet, rows] of Object.entries(workbook.sheets)) {
    rows.forEach((row, r) =>
      row.forEach((contents, c) => {
        if (typeof contents === "string" && contents.startsWith("=") && !refused.has(refusedKey(sheet, r, c))) cells.push({ sheet, r, c, contents });
      }),
    );
  }
  const search = (subset: FormulaCell[], error: Error): void => {
    if (subset.length === 1) {
      const { sheet, r, c, contents } = subset[0];
      refused.set(refusedKey(sheet, r, c), { error: "#VALUE!", message: refusal(contents, error) });
      return;
    }
    const middle = Math.ceil(subset.length / 2);
    for (const part of [subset.slice(0, middle), subset.slice(middle)]) {
      const result = attempt(() => buildWithNames(workbook, withFormulas(workbook, refused, part), metadata));
      if (result instanceof Error) search(part, result);
    }
  };
  const before = refused.size;
  search(cells, first);
  const stopped = `the formula engine stopped before evaluating any formula (${firstLine(first)})`;
  if (refused.size === before) throw new WorkbookError(stopped);
  const second = attempt(() => buildWithNames(workbook, withoutRefused(workbook, refused), metadata));
  if (second instanceof Error) throw new WorkbookError(stopped);
  return { ...second, refused };
}

interface FormulaCell {
  sheet: string;
  r: number;
  c: number;
  contents: string;
}

/** The sheets with their values, refused formulas as their errors, and of the other formulas only those given. */
function withFormulas(workbook: LoadedWorkbook, refused: Refused, keep: FormulaCell[]): Record<string, Contents[][]> {
  const kept = new Set(keep.map((f) => refusedKey(f.sheet, f.r, f.c)));
  const sheets = withoutRefused(workbook, refused);
  return Object.fromEntries(
    Object.entries(sheets).map(([name, rows]) => [
      name,
      rows.map((row, r) =>
        row.length === 0
          ? row
          : row.map((v, c) => (typeof v === "string" && v.startsWith("=") && !refused.has(refusedKey(name, r, c)) && !kept.has(refusedKey(name, r, c)) ? null : v)),
      ),
    ]),
  );
}

/** The sheets with each refused formula replaced by its error value, which formulas reading the cell pass on. */
function withoutRefused(workbook: LoadedWorkbook, refused: Refused): Record<string, Contents[][]> {
  if (refused.size === 0) return workbook.sheets;
  return Object.fromEntries(
    Object.entries(workbook.sheets).map(([name, rows]) => [
      name,
      rows.map((row, r) => (row.length === 0 ? row : row.map((v, c) => (refused.has(refusedKey(name, r, c)) ? `=${refused.get(refusedKey(name, r, c))!.error}` : v)))),
    ]),
  );
}

/**
 * A reference past the sheet's last row or column, named in a message; undefined when there is none. The
 * engine checks a relative reference's distance from its own cell against the sheet's size, not where it
 * lands, so =A1048577 in B2 was a blank cell (0 in a sum) instead of an error; a spreadsheet has no such cell.
 */
export function referenceBeyondSheet(formula: string): string | undefined {
  // Only a reference with seven digits, or three letters before a digit, can reach past the sheet: most formulas skip the scan.
  if (!/\d{7}|[A-Za-z]{3}\$?\d/.test(formula)) return undefined;
  const code = formula.replace(/"(?:[^"]|"")*"/g, '""').replace(/'(?:[^']|'')*'/g, "''");
  for (const m of code.matchAll(/(?<![A-Za-z0-9_.$])\$?([A-Za-z]{1,3})\$?(\d{1,7})(?![A-Za-z0-9_.(])/g)) {
    const column = [...m[1].toUpperCase()].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
    if (Number(m[2]) > MAX_ROWS || column > MAX_COLUMNS) {
      return `${m[0]} is beyond the sheet, whose last row is ${MAX_ROWS.toLocaleString("en-US")} and last column XFD (nor can a defined name look like a cell)`;
    }
  }
  return undefined;
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
