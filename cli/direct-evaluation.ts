/**
 * The common .csv evaluated without building the formula engine: a sheet of
 * strengths whose formulas are each one BRITTLE.* call over plain ranges and
 * literals. Building the engine (its parser, dependency graph and 32 000
 * cell records for a thousand rows of thirty strengths) costs several times
 * the fits themselves; here each formula calls the same guarded adapter with
 * the same values the engine would pass.
 *
 * "The same values" holds only inside a narrow, checked subset, and anything
 * outside it returns undefined so the caller evaluates with the engine:
 * - formulas: exactly =BRITTLE.NAME(arg,...) with an upper-case name of a
 *   function that returns one value (no spill), no spaces, every required
 *   argument given and none empty, at most as many as the function takes;
 *   a range argument is a same-sheet reference (A2:AD2, $A$2, B7) in order,
 *   a number argument a plain decimal literal (-12.5), a text argument a
 *   quoted literal without quotes inside; anything else (a sum, a nested call,
 *   a name, another sheet, a boolean argument) goes to the engine;
 * - cells a formula reads: blank, a finite number other than -0, TRUE/FALSE,
 *   or text the engine keeps as written; never another formula;
 * - every other cell shown in the grid: the same, so the printed grid matches;
 * - results: a finite number, text, a boolean, or a failure with an error
 *   code the engine has (#VALUE!, #NUM!, #N/A); anything else (an array, a
 *   promise, a throw) goes to the engine.
 *
 * Text the engine keeps as written: it would read "50%", "$5", "1e3",
 * "12/05/2020" or "3 pm" as numbers, "TRUE" as a boolean, "#N/A" as an error
 * and strip a leading apostrophe. Every such reading needs the text to hold
 * only digits, signs, separators and the letters a, e, m and p, so text with
 * any other ASCII letter, or with no digit, separator or blank at all (a
 * header "m"), not starting with ' or #, is kept as written
 * (hyperformula 3.5 CellContentParser and NumberLiteralHelper; the cross-check
 * in test/direct-evaluation.test.ts runs both paths on the same workbooks).
 */
import type { FunctionMetadata } from "../functions/metadata";
import { isCellFailure, type CellResult } from "../functions/cells";
import { standardError } from "./error-values";
import { normaliseFormula } from "./formula-text";
import { columnName, ShownGrid, type Shown } from "./shown-grid";
import { MAX_COLUMNS, MAX_ROWS } from "./workbook-limits";
import type { Contents, LoadedWorkbook } from "./workbook-io";
import type { FormulaResult, ShownCell } from "./evaluate-workbook";

export interface DirectEvaluation {
  grids: Record<string, Shown[][]>;
  formulas: FormulaResult[];
  refusedNames: string[];
}

type Adapter = (...args: unknown[]) => CellResult;

/** One parsed argument: cells of a rectangle, a number or a text literal. */
type Argument =
  | { kind: "range"; top: number; left: number; bottom: number; right: number }
  | { kind: "number"; value: number }
  | { kind: "text"; value: string };

interface Call {
  name: string;
  args: Argument[];
}

const CALL = /^=BRITTLE\.([A-Z][A-Z0-9]*)\((.*)\)$/;
const REFERENCE = /^\$?([A-Z]{1,3})\$?([1-9][0-9]{0,6})(?::\$?([A-Z]{1,3})\$?([1-9][0-9]{0,6}))?$/;
const NUMBER = /^-?[0-9]+(?:\.[0-9]+)?$/;
const TEXT = /^"([^"]*)"$/;
/** An ASCII letter no number, percentage, currency, date or time reading of text can contain. */
const LETTER_NO_NUMBER_READS = /[b-df-lnoq-z]/i;
const NUMBER_OR_DATE_CHARACTER = /[0-9/.:\-\s]/;
const ENGINE_ERROR_CODES = new Set(["#VALUE!", "#NUM!", "#N/A"]);

/**
 * Evaluates a loaded .csv directly, or returns undefined when any cell falls
 * outside the subset above (the engine then evaluates the whole workbook).
 * `adapters` are the guarded adapters the engine registers; `spills` the
 * functions that return arrays.
 */
export function evaluateDirectly(
  workbook: LoadedWorkbook,
  metadata: FunctionMetadata[],
  adapters: Record<string, Adapter>,
  spills: ReadonlySet<string>,
): DirectEvaluation | undefined {
  if (workbook.kind !== "csv" || (workbook.names?.length ?? 0) > 0) return undefined;
  const byId = new Map(metadata.map((f) => [f.id, f]));
  const grids: Record<string, Shown[][]> = {};
  const formulas: FormulaResult[] = [];
  for (const [sheetName, rows] of Object.entries(workbook.sheets)) {
    const grid = new ShownGrid();
    for (let r = 0; r < rows.length; r++) {
      const row = rows[r];
      for (let c = 0; c < row.length; c++) {
        const contents = row[c];
        if (typeof contents === "string" && contents.startsWith("=")) {
          const cell = evaluateFormula(contents, rows, byId, adapters, spills);
          if (cell === undefined) return undefined;
          grid.put(r, c, cell.value);
          formulas.push({ sheet: sheetName, address: columnName(c) + (r + 1), formula: contents, ...cell });
        } else {
          const value = plainValue(contents);
          if (value === undefined) return undefined;
          grid.put(r, c, value);
        }
      }
    }
    grids[sheetName] = grid.rows;
  }
  return { grids, formulas, refusedNames: [] };
}

/** A non-formula cell as the engine shows it, or undefined when the engine might read it differently. */
function plainValue(v: Contents | undefined): Shown | undefined {
  if (v === null || v === undefined) return null;
  if (typeof v === "number") return Number.isFinite(v) && !Object.is(v, -0) ? v : undefined;
  if (typeof v === "boolean") return v;
  return isTextKeptAsWritten(v) ? v : undefined;
}

export function isTextKeptAsWritten(text: string): boolean {
  if (text === "" || text.startsWith("=") || text.startsWith("'") || text.startsWith("#")) return false;
  const lower = text.toLowerCase();
  if (lower === "true" || lower === "false") return false;
  // A number needs a digit, a date or time a digit or a separator ("- pm" passes the engine's first check).
  return LETTER_NO_NUMBER_READS.test(text) || !NUMBER_OR_DATE_CHARACTER.test(text);
}

function evaluateFormula(
  formula: string,
  rows: Contents[][],
  byId: Map<string, FunctionMetadata>,
  adapters: Record<string, Adapter>,
  spills: ReadonlySet<string>,
): ShownCell | undefined {
  // The engine reads the formula after normaliseFormula; the subset is one it leaves unchanged.
  if (normaliseFormula(formula) !== formula) return undefined;
  const call = parseCall(formula);
  if (!call) return undefined;
  const fn = byId.get(call.name);
  const adapter = adapters[call.name];
  if (!fn || !adapter || spills.has(call.name)) return undefined;
  const params = fn.parameters;
  if (call.args.length > params.length) return undefined;
  if (params.slice(call.args.length).some((p) => !p.optional)) return undefined;
  const values: unknown[] = [];
  for (let k = 0; k < params.length; k++) {
    const arg = call.args[k];
    if (arg === undefined) {
      values.push(null); // a missing optional argument reaches the adapter as null, as from the engine
      continue;
    }
    const value = argumentValue(arg, params[k], rows);
    if (value === undefined) return undefined;
    values.push(value);
  }
  let result: CellResult;
  try {
    result = adapter(...values);
  } catch {
    return undefined;
  }
  return shownResult(result);
}

function argumentValue(arg: Argument, param: FunctionMetadata["parameters"][number], rows: Contents[][]): unknown {
  if (param.dimensionality === "matrix") return arg.kind === "range" ? rangeValues(arg, rows) : undefined;
  if (param.type === "number") return arg.kind === "number" ? arg.value : undefined;
  if (param.type === "string") return arg.kind === "text" ? arg.value : undefined;
  return undefined;
}

/** The rectangle's cells, row by row, blanks as null: what the engine hands the adapter. */
function rangeValues(range: Extract<Argument, { kind: "range" }>, rows: Contents[][]): unknown[][] | undefined {
  const out: unknown[][] = [];
  for (let r = range.top; r <= range.bottom; r++) {
    const row = rows[r];
    const values: unknown[] = [];
    for (let c = range.left; c <= range.right; c++) {
      const v = row?.[c];
      if (typeof v === "string" && v.startsWith("=")) return undefined; // a formula's result: the engine orders that
      const plain = plainValue(v);
      if (plain === undefined) return undefined;
      values.push(plain);
    }
    out.push(values);
  }
  return out;
}

function shownResult(result: CellResult): ShownCell | undefined {
  if (isCellFailure(result)) {
    if (!ENGINE_ERROR_CODES.has(result.cellError)) return undefined;
    const { value, message } = standardError(result.cellError, result.message);
    return { value, error: value, ...(message ? { message } : {}) };
  }
  if (typeof result === "number") return Number.isFinite(result) ? { value: result === 0 ? 0 : result } : undefined;
  if (typeof result === "string" || typeof result === "boolean") return { value: result };
  return undefined;
}

/** =BRITTLE.NAME(a,b,...) split into its arguments, or undefined for any other formula. */
export function parseCall(formula: string): Call | undefined {
  const m = CALL.exec(formula);
  if (!m) return undefined;
  const inner = m[2];
  const texts = inner === "" ? [] : splitArguments(inner);
  if (!texts) return undefined;
  const args: Argument[] = [];
  for (const text of texts) {
    const arg = parseArgument(text);
    if (!arg) return undefined;
    args.push(arg);
  }
  return { name: m[1], args };
}

/** Splits at commas outside quoted text; undefined for an unbalanced quote. */
function splitArguments(inner: string): string[] | undefined {
  const parts: string[] = [];
  let start = 0;
  let quoted = false;
  for (let i = 0; i < inner.length; i++) {
    const ch = inner[i];
    if (ch === '"') quoted = !quoted;
    else if (ch === "," && !quoted) {
      parts.push(inner.slice(start, i));
      start = i + 1;
    }
  }
  if (quoted) return undefined;
  parts.push(inner.slice(start));
  return parts;
}

function parseArgument(text: string): Argument | undefined {
  const ref = REFERENCE.exec(text);
  if (ref) {
    const left = columnIndex(ref[1]);
    const top = Number(ref[2]) - 1;
    const right = ref[3] === undefined ? left : columnIndex(ref[3]);
    const bottom = ref[4] === undefined ? top : Number(ref[4]) - 1;
    // In order and inside the sheet (the last row is left to the engine, which reads A1:A1048576 as a column).
    if (right < left || bottom < top || right >= MAX_COLUMNS || bottom >= MAX_ROWS - 1) return undefined;
    return { kind: "range", top, left, bottom, right };
  }
  if (NUMBER.test(text)) {
    const value = Number(text);
    return Number.isFinite(value) && !Object.is(value, -0) ? { kind: "number", value } : undefined;
  }
  const quoted = TEXT.exec(text);
  if (quoted) return { kind: "text", value: quoted[1] };
  return undefined;
}

function columnIndex(letters: string): number {
  let n = 0;
  for (const ch of letters) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n - 1;
}
