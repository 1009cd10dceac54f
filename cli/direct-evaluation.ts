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
 *   argument given (an empty one, as in A2:AD2,,"LSQ", counts as given and
 *   reaches the adapter as null: the engine's plugin passes null for it),
 *   at most as many as the function takes;
 *   a range argument is a same-sheet reference (A2:AD2, $A$2, B7) in order,
 *   a number argument a plain decimal literal (-12.5) or one cell holding a
 *   number, a text argument a quoted literal without quotes inside; anything
 *   else (a sum, a nested call, a name, another sheet, a boolean argument)
 *   goes to the engine;
 * - cells a formula reads: blank, a finite number other than -0, TRUE/FALSE,
 *   text the engine keeps as written, or another formula of the subset that
 *   evaluated to a finite number (no cycles);
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
  | { kind: "text"; value: string }
  /** Nothing between two commas: the adapter gets null, as from the engine (engine.ts). */
  | { kind: "empty" };

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

/** Thrown inside the direct path the moment a cell falls outside the subset; the caller then uses the engine. */
class OutsideSubset extends Error {}

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
  const functions = { byId: new Map(metadata.map((f) => [f.id, f])), adapters, spills };
  const grids: Record<string, Shown[][]> = {};
  const formulas: FormulaResult[] = [];
  try {
    for (const [sheetName, rows] of Object.entries(workbook.sheets)) {
      const sheet = new SheetEvaluation(rows, functions);
      const grid = new ShownGrid();
      for (let r = 0; r < rows.length; r++) {
        const row = rows[r];
        for (let c = 0; c < row.length; c++) {
          const contents = row[c];
          if (typeof contents === "string" && contents.startsWith("=")) {
            const cell = sheet.formulaAt(r, c, contents);
            grid.put(r, c, cell.value);
            formulas.push({ sheet: sheetName, address: columnName(c) + (r + 1), formula: contents, ...cell });
          } else grid.put(r, c, plainValue(contents));
        }
      }
      grids[sheetName] = grid.rows;
    }
  } catch (error) {
    if (error instanceof OutsideSubset) return undefined;
    throw error;
  }
  return { grids, formulas, refusedNames: [] };
}

/** A non-formula cell as the engine shows it; outside the subset when the engine might read it differently. */
function plainValue(v: Contents | undefined): Shown {
  if (v === null || v === undefined) return null;
  if (typeof v === "number") {
    if (Number.isFinite(v) && !Object.is(v, -0)) return v;
    throw new OutsideSubset();
  }
  if (typeof v === "boolean") return v;
  if (isTextKeptAsWritten(v)) return v;
  throw new OutsideSubset();
}

export function isTextKeptAsWritten(text: string): boolean {
  if (text === "" || text.startsWith("=") || text.startsWith("'") || text.startsWith("#")) return false;
  const lower = text.toLowerCase();
  if (lower === "true" || lower === "false") return false;
  // A number needs a digit, a date or time a digit or a separator ("- pm" passes the engine's first check).
  return LETTER_NO_NUMBER_READS.test(text) || !NUMBER_OR_DATE_CHARACTER.test(text);
}

interface Functions {
  byId: Map<string, FunctionMetadata>;
  adapters: Record<string, Adapter>;
  spills: ReadonlySet<string>;
}

/**
 * One sheet's formulas, each evaluated once, when first shown or first read
 * by another formula. A formula read by another must have evaluated to a
 * finite number (what the engine then passes on unchanged); an error, text or
 * a circular reference leaves the subset, since the engine's handling of those
 * (passing the error on, reading text as a number) is its own.
 */
class SheetEvaluation {
  private readonly done = new Map<number, ShownCell>();
  private readonly inProgress = new Set<number>();

  constructor(
    private readonly rows: Contents[][],
    private readonly functions: Functions,
  ) {}

  formulaAt(r: number, c: number, formula: string): ShownCell {
    const key = r * MAX_COLUMNS + c;
    const known = this.done.get(key);
    if (known) return known;
    if (this.inProgress.has(key)) throw new OutsideSubset(); // circular: the engine reports it
    this.inProgress.add(key);
    const cell = this.evaluate(formula);
    this.inProgress.delete(key);
    this.done.set(key, cell);
    return cell;
  }

  /** A cell as a formula reads it: a plain value, or a formula's finite number. */
  private read(r: number, c: number): Shown {
    const v = this.rows[r]?.[c];
    if (typeof v === "string" && v.startsWith("=")) {
      const cell = this.formulaAt(r, c, v);
      if (cell.error !== undefined || typeof cell.value !== "number") throw new OutsideSubset();
      return cell.value;
    }
    return plainValue(v);
  }

  private evaluate(formula: string): ShownCell {
    // The engine reads the formula after normaliseFormula; the subset is one it leaves unchanged.
    if (normaliseFormula(formula) !== formula) throw new OutsideSubset();
    const call = parseCall(formula);
    if (!call) throw new OutsideSubset();
    const { byId, adapters, spills } = this.functions;
    const fn = byId.get(call.name);
    const adapter = adapters[call.name];
    if (!fn || !adapter || spills.has(call.name)) throw new OutsideSubset();
    const params = fn.parameters;
    if (call.args.length > params.length) throw new OutsideSubset();
    if (params.slice(call.args.length).some((p) => !p.optional)) throw new OutsideSubset();
    // A missing optional argument reaches the adapter as null, as from the engine.
    const values = params.map((param, k) => (call.args[k] === undefined ? null : this.argumentValue(call.args[k], param)));
    let result: CellResult;
    try {
      result = adapter(...values);
    } catch {
      throw new OutsideSubset();
    }
    return shownResult(result);
  }

  private argumentValue(arg: Argument, param: FunctionMetadata["parameters"][number]): unknown {
    if (arg.kind === "empty") return null;
    if (param.dimensionality === "matrix" && arg.kind === "range") return this.rangeValues(arg);
    if (param.dimensionality !== "matrix" && param.type === "number") {
      if (arg.kind === "number") return arg.value;
      // One cell holding a number (or a formula's number): the engine passes that number.
      if (arg.kind === "range" && arg.top === arg.bottom && arg.left === arg.right) {
        const v = this.read(arg.top, arg.left);
        if (typeof v === "number") return v;
      }
    }
    if (param.dimensionality !== "matrix" && param.type === "string" && arg.kind === "text") return arg.value;
    throw new OutsideSubset();
  }

  /** The rectangle's cells, row by row, blanks as null: what the engine hands the adapter. */
  private rangeValues(range: Extract<Argument, { kind: "range" }>): unknown[][] {
    const out: unknown[][] = [];
    for (let r = range.top; r <= range.bottom; r++) {
      const values: unknown[] = [];
      for (let c = range.left; c <= range.right; c++) values.push(this.read(r, c));
      out.push(values);
    }
    return out;
  }
}

function shownResult(result: CellResult): ShownCell {
  if (isCellFailure(result)) {
    if (!ENGINE_ERROR_CODES.has(result.cellError)) throw new OutsideSubset();
    const { value, message } = standardError(result.cellError, result.message);
    return { value, error: value, ...(message ? { message } : {}) };
  }
  if (typeof result === "number" && Number.isFinite(result)) return { value: result === 0 ? 0 : result };
  if (typeof result === "string" || typeof result === "boolean") return { value: result };
  throw new OutsideSubset();
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
  if (text === "") return { kind: "empty" };
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
