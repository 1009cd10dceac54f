/**
 * The one policy for what comes out of a cell and what goes back into one.
 * Every adapter reads its arguments through these readers, and every adapter
 * a host sees is wrapped by `guard`, so:
 *
 * - The spreadsheet host shows a custom message only with #VALUE! and #N/A,
 *   so every error a user can act on uses one of those two:
 *   - a bad input (wrong type, outside the domain, too few specimens,
 *     mismatched ranges, a negative value) -> #VALUE! with its message;
 *   - a result that does not apply to these inputs (the fit quality of a
 *     censored sample, the effective size of a part with no tensile stress)
 *     -> #N/A with its message;
 *   - #NUM! only for a result beyond double precision (an overflow, or a
 *     nonzero result that underflows) and for a solve that did not converge:
 *     there is nothing to change in the inputs, and the pane's "explain the
 *     selected cell" shows the message the host drops.
 * - In a range of values, empty cells, empty strings and zeros are "no
 *   specimen" (desktop hosts pass empty cells as 0, web hosts as null);
 *   text or TRUE/FALSE -> #VALUE! naming the position.
 * - A second range that pairs with the first (censoring flags, element
 *   sizes) must have the same rows and columns, else #VALUE!.
 * - Nothing throws out of a guarded adapter, and a number going back to a
 *   cell is never NaN or Infinity; no message prints them either.
 *
 * The core throws `InputError` with a kind; `CODE_OF_KIND` is the only place
 * that turns a kind into a cell code.
 */
import { InputError, type FailureKind } from "../src/errors";
import { classifyNumber, explainNotANumber, normalizeNumberText, quoteText } from "../src/input/number-text";

export type ErrorCode = "#VALUE!" | "#NUM!" | "#N/A";

/** The cell code for each kind of failure the core reports. */
export const CODE_OF_KIND: Record<FailureKind, ErrorCode> = {
  input: "#VALUE!",
  notApplicable: "#N/A",
  notRepresentable: "#NUM!",
  notConverged: "#NUM!",
};

export class CellError extends Error {
  readonly code: ErrorCode;
  constructor(code: ErrorCode, message: string) {
    super(message);
    this.name = "CellError";
    this.code = code;
  }
}

/** What a guarded adapter returns instead of throwing. */
export interface CellFailure {
  readonly cellError: ErrorCode;
  readonly message: string;
}

export function isCellFailure(x: unknown): x is CellFailure {
  return typeof x === "object" && x !== null && "cellError" in x;
}

export type CellValue = number | string | boolean | null | undefined;
export type Range = CellValue[][];

function isBlank(v: unknown): boolean {
  return v === null || v === undefined || v === 0 || (typeof v === "string" && v.trim() === "");
}

/**
 * What a cell that is no number holds, and what to change, for the end of a
 * message: a unit, a footnote mark, an error value pasted as text, a number
 * stored as text (read by no function, as in a spreadsheet's own SUM).
 * @example notANumber("0.41 GPa") // ': "0.41 GPa" carries a unit ("GPa"): type the number alone, ...'
 */
export function notANumber(v: unknown): string {
  if (typeof v === "boolean") return `: it holds the logical value ${v ? "TRUE" : "FALSE"}`;
  if (typeof v !== "string") return "";
  const why = explainNotANumber(v);
  if (why) return `: ${quoteText(v.trim())} ${why}`;
  if (classifyNumber(v.trim()).kind !== "not-a-number") {
    const retype = normalizeNumberText(v.trim()) !== v.trim() ? ", typed with the digits 0-9, a point and -" : "";
    return `: it holds ${quoteText(v.trim())} as text; enter it as a number${retype} (numbers stored as text are not read)`;
  }
  return `: it holds the text ${quoteText(v.trim())}`;
}

function describePosition(name: string, row: number, col: number, cols: number): string {
  return cols > 1 ? `${name}, row ${row + 1} column ${col + 1}` : `${name}, row ${row + 1}`;
}

/** A range argument as a 2-D array; a host may pass a single value for a one-cell range. */
export function asRange(value: unknown, name: string): Range {
  if (Array.isArray(value)) {
    if (value.length === 0 || !value.every(Array.isArray)) throw new CellError("#VALUE!", `${name} must be a range of cells`);
    return value as Range;
  }
  return [[value as CellValue]];
}

export interface RangeNumbers {
  values: number[];
  /** Flat index (row-major) in the range of each value kept. */
  indices: number[];
  rows: number;
  cols: number;
  /** Cells skipped as "no specimen" (empty, empty text, zero): counted here so nothing downstream recounts. */
  blanks: number;
}

/**
 * The numbers in a range under the blank rule: blanks and zeros skipped;
 * text, booleans and negatives rejected with the cell's position.
 */
export function readPositiveNumbers(value: unknown, name: string): RangeNumbers {
  const range = asRange(value, name);
  const rows = range.length;
  const cols = range[0].length;
  const values: number[] = [];
  const indices: number[] = [];
  let blanks = 0;
  for (let r = 0; r < rows; r++) {
    if (range[r].length !== cols) throw new CellError("#VALUE!", `${name} must be a rectangular range`);
    for (let c = 0; c < cols; c++) {
      const v = range[r][c];
      if (isBlank(v)) {
        blanks++;
        continue;
      }
      if (typeof v !== "number") throw new CellError("#VALUE!", `${describePosition(name, r, c, cols)} is not a number${notANumber(v)}`);
      if (!Number.isFinite(v)) throw new CellError("#VALUE!", `${describePosition(name, r, c, cols)} is too large to represent`);
      if (v < 0) throw new CellError("#VALUE!", `${describePosition(name, r, c, cols)} is negative`);
      values.push(v);
      indices.push(r * cols + c);
    }
  }
  return { values, indices, rows, cols, blanks };
}

/** A range that pairs with another (flags, labels, sizes) must have its rows and columns, else #VALUE!. */
export function requireSameShape(name: string, shape: { rows: number; cols: number }, likeName: string, like: { rows: number; cols: number }): void {
  if (shape.rows !== like.rows || shape.cols !== like.cols) {
    throw new CellError(
      "#VALUE!",
      `${name} (${shape.rows} x ${shape.cols}) must have the same rows and columns as ${likeName} (${like.rows} x ${like.cols})`,
    );
  }
}

function pairedRange(value: unknown, name: string, like: RangeNumbers, likeName: string): Range {
  const range = asRange(value, name);
  requireSameShape(name, { rows: range.length, cols: range[0].length }, likeName, like);
  return range;
}

/** Censoring flags: TRUE, 1, "C" or "CENSORED" mark a censored specimen; FALSE, 0, blank, "F" a failure. */
export function readFlags(value: unknown, name: string, like: RangeNumbers, likeName: string): boolean[] {
  const range = pairedRange(value, name, like, likeName);
  return like.indices.map((index) => {
    const r = Math.floor(index / like.cols);
    const c = index % like.cols;
    const v = range[r][c];
    if (v === true || v === 1) return true;
    if (v === false || isBlank(v)) return false;
    if (typeof v === "string") {
      const word = v.trim().toUpperCase();
      if (word === "TRUE" || word === "C" || word === "CENSORED") return true;
      if (word === "FALSE" || word === "F" || word === "FAILURE") return false;
    }
    throw new CellError("#VALUE!", `${describePosition(name, r, c, like.cols)} must be TRUE/1 (censored) or FALSE/0/blank (failed)`);
  });
}

/** Text labels (e.g. fracture origins) beside each value read from `like`; a number is taken as its text. */
export function readLabels(value: unknown, name: string, like: RangeNumbers, likeName: string): string[] {
  const range = pairedRange(value, name, like, likeName);
  return like.indices.map((index) => {
    const r = Math.floor(index / like.cols);
    const c = index % like.cols;
    const v = range[r][c];
    if (typeof v === "number") return String(v);
    if (typeof v !== "string" || v.trim() === "") {
      throw new CellError("#VALUE!", `${describePosition(name, r, c, like.cols)} needs a label beside the value in ${likeName}`);
    }
    return v;
  });
}

/**
 * Two ranges of the same shape read as pairs (stress rates with strengths,
 * stresses with durations): a position blank or zero on both sides is no
 * pair; blank on one side only is #VALUE!, except a blank first value where
 * `firstMayBeZero` (e.g. an unloaded block in a load history).
 */
export function readPairs(
  first: unknown,
  firstName: string,
  second: unknown,
  secondName: string,
  firstMayBeZero = false,
): { x: number[]; y: number[] } {
  const a = readPositiveNumbers(first, firstName);
  const b = readPositiveNumbers(second, secondName);
  requireSameShape(secondName, b, firstName, a);
  const byIndexA = new Map(a.indices.map((index, k) => [index, a.values[k]]));
  const byIndexB = new Map(b.indices.map((index, k) => [index, b.values[k]]));
  const x: number[] = [];
  const y: number[] = [];
  for (const index of [...new Set([...a.indices, ...b.indices])].sort((p, q) => p - q)) {
    const r = Math.floor(index / a.cols);
    const c = index % a.cols;
    const va = byIndexA.get(index);
    const vb = byIndexB.get(index);
    if (vb === undefined) throw new CellError("#VALUE!", `${describePosition(secondName, r, c, a.cols)} is blank or zero beside a value in ${firstName}`);
    if (va === undefined && !firstMayBeZero) {
      throw new CellError("#VALUE!", `${describePosition(firstName, r, c, a.cols)} is blank or zero beside a value in ${secondName}`);
    }
    x.push(va ?? 0);
    y.push(vb);
  }
  return { x, y };
}

export interface CellSample {
  strengths: number[];
  censored?: boolean[];
}

/** A strength column and its optional censoring column, under the blank rule. */
export function readSample(strengths: unknown, censored: unknown): CellSample {
  const numbers = readPositiveNumbers(strengths, "strengths");
  if (numbers.values.length < 2) {
    throw new CellError("#VALUE!", `strengths: a fit needs at least two specimens (found ${numbers.values.length})`);
  }
  if (censored === null || censored === undefined) return { strengths: numbers.values };
  return { strengths: numbers.values, censored: readFlags(censored, "censored", numbers, "strengths") };
}

/** What a strengths range and its optional flags hold under the blank rule, as the fitting functions read them. */
export interface SampleCounts {
  cells: number;
  /** Specimens read: failures plus censored. */
  specimens: number;
  failures: number;
  censored: number;
  /** Empty cells, empty text and zeros skipped. */
  blanks: number;
}

/**
 * The counts behind readSample, for "explain the selected cell": the same
 * readers, so the pane says exactly what a function read. Throws CellError
 * on what the readers refuse (text, a negative, mismatched ranges).
 */
export function readSampleCounts(strengths: unknown, censored: unknown): SampleCounts {
  const numbers = readPositiveNumbers(strengths, "strengths");
  const flags = censored === null || censored === undefined ? [] : readFlags(censored, "censored", numbers, "strengths");
  const censoredCount = flags.filter(Boolean).length;
  return {
    cells: numbers.rows * numbers.cols,
    specimens: numbers.values.length,
    failures: numbers.values.length - censoredCount,
    censored: censoredCount,
    blanks: numbers.blanks,
  };
}

/** A required number; hosts coerce typed parameters, so only blanks and odd types arrive here. */
export function readNumber(value: unknown, name: string): number {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new CellError("#VALUE!", `${name} is too large to represent`);
    return value;
  }
  if (value === null || value === undefined || value === "") throw new CellError("#VALUE!", `${name} is required`);
  throw new CellError("#VALUE!", `${name} must be a number${notANumber(value)}`);
}

/** An optional number: a missing or blank argument gives the default. */
export function readOptionalNumber(value: unknown, name: string, fallback: number): number {
  return value === null || value === undefined || value === "" ? fallback : readNumber(value, name);
}

/** An optional TRUE/FALSE: a missing or blank argument gives the default; 1/0 and the words TRUE/FALSE also count. */
export function readOptionalBoolean(value: unknown, name: string, fallback: boolean): boolean {
  if (value === null || value === undefined || value === "") return fallback;
  if (value === true || value === 1) return true;
  if (value === false || value === 0) return false;
  if (typeof value === "string") {
    const word = value.trim().toUpperCase();
    if (word === "TRUE") return true;
    if (word === "FALSE") return false;
  }
  throw new CellError("#VALUE!", `${name} must be TRUE or FALSE`);
}

/** An optional keyword, matched case-insensitively against the allowed words. */
export function readChoice<T extends string>(value: unknown, name: string, allowed: readonly T[], fallback: T): T {
  if (value === null || value === undefined || value === "") return fallback;
  if (typeof value !== "string") throw new CellError("#VALUE!", `${name} must be one of ${allowed.map((a) => `"${a}"`).join(", ")}`);
  const word = value.trim().toUpperCase();
  const match = allowed.find((a) => a.toUpperCase() === word);
  if (!match) throw new CellError("#VALUE!", `${name} "${value}" is not one of ${allowed.map((a) => `"${a}"`).join(", ")}`);
  return match;
}

/** Turn any error into a CellFailure; nothing escapes to the host. */
export function toFailure(error: unknown): CellFailure {
  if (error instanceof CellError) return { cellError: error.code, message: error.message };
  if (error instanceof InputError) return { cellError: CODE_OF_KIND[error.kind], message: error.message };
  const text = error instanceof Error ? error.message : String(error);
  return { cellError: "#VALUE!", message: `internal error: ${text}` };
}

/** One cell of a spilled result: a value, or an error in that cell alone (e.g. one specimen outside a formula's limits). */
export type SpillCell = CellValue | CellFailure;

export type CellResult = number | string | boolean | SpillCell[][] | CellFailure;

/** Check a result before it reaches a cell: no NaN, no Infinity, anywhere in a spill. */
export function checkResult(result: unknown): CellResult {
  if (typeof result === "number") {
    return Number.isFinite(result) ? result : { cellError: "#NUM!", message: "the result is too large to represent in double precision" };
  }
  if (typeof result === "string" || typeof result === "boolean") return result;
  if (Array.isArray(result)) {
    for (const row of result) {
      for (const v of row as unknown[]) {
        if (typeof v === "number" && !Number.isFinite(v)) {
          return { cellError: "#NUM!", message: "a result is too large to represent in double precision" };
        }
      }
    }
    return result as SpillCell[][];
  }
  if (isCellFailure(result)) return result;
  return { cellError: "#VALUE!", message: "internal error: the function produced no value" };
}

/** Wrap an adapter so it returns a CellFailure instead of throwing. */
export function guard<A extends unknown[]>(adapter: (...args: A) => unknown): (...args: A) => CellResult {
  return (...args: A) => {
    try {
      return checkResult(adapter(...args));
    } catch (error) {
      return toFailure(error);
    }
  };
}

/**
 * An argument given either as one value for every row or as a column with one
 * value per row (loads, dimensions of each specimen). Cells are returned as they
 * are, for the adapter to read row by row, so that a bad cell fails its own row
 * of a spilled result and not the others.
 */
export interface PerRowArgument {
  readonly name: string;
  /** One entry per row; a single entry when one value serves every row. */
  readonly cells: readonly CellValue[];
}

export function readPerRow(value: unknown, name: string): PerRowArgument {
  const range = asRange(value, name);
  if (range.length > 1 && range[0].length > 1) throw new CellError("#VALUE!", `${name} must be one value or one column`);
  // A single row of several cells is taken as a column typed across.
  const cells = range.length === 1 ? range[0] : range.map((row) => row[0]);
  return { name, cells };
}

/** The rows a set of per-row arguments describes: the length of their columns, which must agree. */
export function perRowCount(args: readonly PerRowArgument[]): number {
  let rows = 1;
  for (const a of args) {
    if (a.cells.length === 1) continue;
    if (rows !== 1 && a.cells.length !== rows) {
      const first = args.find((b) => b.cells.length === rows)!;
      throw new CellError("#VALUE!", `${a.name} has ${a.cells.length} rows but ${first.name} has ${rows}: give one value or a column of the same length`);
    }
    rows = a.cells.length;
  }
  return rows;
}

/** The number an argument holds for a row; blank is null (no specimen in that row). */
export function perRowNumber(arg: PerRowArgument, row: number): number | null {
  const v = arg.cells.length === 1 ? arg.cells[0] : arg.cells[row];
  if (v === null || v === undefined || (typeof v === "string" && v.trim() === "")) return null;
  if (typeof v !== "number") throw new CellError("#VALUE!", `${arg.name}, row ${row + 1} is not a number${notANumber(v)}`);
  if (!Number.isFinite(v)) throw new CellError("#VALUE!", `${arg.name}, row ${row + 1} is not a finite number`);
  return v;
}
