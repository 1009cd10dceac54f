/**
 * The same guarded adapters registered in HyperFormula, an embedded formula
 * engine, so workbooks evaluate with no spreadsheet application. Argument
 * kinds come from functions.json (one description of every function), and
 * spill sizes from spill-shapes.ts.
 *
 * A throw inside a HyperFormula plugin aborts the whole evaluation, so every
 * path here returns a value or a CellError; the adapters are guarded too.
 */
import {
  ArraySize,
  CellError,
  EmptyValue,
  ErrorType,
  FunctionArgumentType,
  DenseSparseChooseBasedOnThreshold,
  FunctionPlugin,
  HyperFormula,
  SimpleRangeValue,
  type FunctionArgument,
  type ImplementedFunctions,
} from "hyperformula";
import { isCellFailure, type CellResult } from "../functions/cells";
import type { FunctionMetadata } from "../functions/metadata";
import { guarded } from "../functions/registry";
import { spillShapes, type SpillShape } from "../functions/spill-shapes";
import { NAMESPACE, normaliseFormula } from "./formula-text";
import { MAX_COLUMNS, MAX_ROWS } from "./workbook-limits";

export { NAMESPACE, normaliseFormula };

export const LICENSE_KEY = "gpl-v3";

const ERROR_TYPES = { "#VALUE!": ErrorType.VALUE, "#NUM!": ErrorType.NUM, "#N/A": ErrorType.NA } as const;

function toEngineValue(result: CellResult): unknown {
  if (isCellFailure(result)) return new CellError(ERROR_TYPES[result.cellError], result.message);
  if (Array.isArray(result)) {
    return SimpleRangeValue.onlyValues(
      result.map((row) =>
        row.map((v) =>
          v === null || v === undefined ? EmptyValue : isCellFailure(v) ? new CellError(ERROR_TYPES[v.cellError], v.message) : v,
        ),
      ) as never,
    );
  }
  return result;
}

/** A HyperFormula range or scalar as the plain values a host would pass; the first error cell wins. */
function fromEngineValue(value: unknown): unknown {
  if (value instanceof SimpleRangeValue) {
    const rows: unknown[][] = [];
    for (const row of value.data) {
      const out: unknown[] = [];
      for (const v of row) {
        if (v instanceof CellError) throw v;
        out.push(plainScalar(v));
      }
      rows.push(out);
    }
    return rows;
  }
  if (value instanceof CellError) throw value;
  return plainScalar(value);
}

function plainScalar(v: unknown): unknown {
  if (v === EmptyValue || v === undefined) return null;
  // Dates, percentages and currencies arrive as number objects carrying a format.
  if (typeof v === "object" && v !== null && "val" in v) return (v as { val: unknown }).val;
  return v;
}

function argumentFor(p: FunctionMetadata["parameters"][number]): FunctionArgument {
  const argumentType =
    p.dimensionality === "matrix"
      ? FunctionArgumentType.RANGE
      : p.type === "number"
        ? FunctionArgumentType.NUMBER
        : p.type === "string"
          ? FunctionArgumentType.STRING
          : p.type === "boolean"
            ? FunctionArgumentType.BOOLEAN
            : FunctionArgumentType.SCALAR;
  return p.optional ? { argumentType, optionalArg: true } : { argumentType };
}

/** Builds the plugin class for the functions described in the metadata. */
export function createPlugin(metadata: FunctionMetadata[]) {
  const implemented: ImplementedFunctions = {};
  class BrittlePlugin extends FunctionPlugin {}
  const proto = BrittlePlugin.prototype as unknown as Record<string, unknown>;

  for (const fn of metadata) {
    const engineName = `${NAMESPACE}.${fn.id}`;
    const adapter = guarded[fn.id];
    const method = `call_${fn.id}`;
    const spill: SpillShape | undefined = spillShapes[fn.id];
    implemented[engineName] = {
      method,
      parameters: fn.parameters.map(argumentFor),
      vectorizationForbidden: true,
      ...(spill ? { sizeOfResultArrayMethod: `size_${fn.id}` } : {}),
    };
    const required = fn.parameters.filter((p) => !p.optional).length;
    const counts = required === fn.parameters.length ? `${required}` : `${required} to ${fn.parameters.length}`;
    const names = fn.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ");
    proto[method] = function (this: FunctionPlugin, ast: any, state: any) {
      // The engine's own message ("Wrong number of arguments.") names neither the function nor what it takes.
      const given: number = ast.args.length;
      if (given < required || given > fn.parameters.length) {
        return new CellError(ErrorType.NA, `${engineName} takes ${counts} ${counts === "1" ? "argument" : "arguments"} (${names}); this call gives ${given}`);
      }
      return this.runFunction(ast.args, state, this.metadata(engineName), ((...args: unknown[]) => {
        try {
          // An empty argument (",,") means "not given", as a spreadsheet host passes null.
          const plain = args.map((a, k) => (ast.args[k]?.type === "EMPTY" ? null : fromEngineValue(a)));
          return toEngineValue(adapter(...plain));
        } catch (error) {
          if (error instanceof CellError) return error;
          return new CellError(ErrorType.VALUE, `internal error: ${String(error)}`);
        }
      }) as never);
    };
    if (spill) {
      proto[`size_${fn.id}`] = function (this: any, ast: any, state: any) {
        return spillSize(spill, (k) => (ast.args[k] ? this.arraySizeForAst(ast.args[k], state) : undefined));
      };
    }
  }
  (BrittlePlugin as unknown as { implementedFunctions: ImplementedFunctions }).implementedFunctions = implemented;
  return BrittlePlugin;
}

function spillSize(shape: SpillShape, sizeOf: (k: number) => ArraySize | undefined): ArraySize {
  const { rows, cols } = shape;
  const header = shape.headerRows ?? 0;
  if (typeof rows === "number") return new ArraySize(cols, rows + header);
  const k = "cellsOf" in rows ? rows.cellsOf : rows.rowsOf;
  const size = sizeOf(k);
  // A range argument's size carries isRef, for which isScalar() is true: use its dimensions, not that flag.
  if (!size) return new ArraySize(cols, 1 + header);
  return new ArraySize(cols, ("cellsOf" in rows ? size.width * size.height : size.height) + header);
}

let registered = false;

/** Registers the plugin once per process: HyperFormula's function registry is global. */
export function registerFunctions(metadata: FunctionMetadata[]): void {
  if (registered) return;
  const plugin = createPlugin(metadata);
  const names = Object.keys((plugin as unknown as { implementedFunctions: object }).implementedFunctions);
  HyperFormula.registerFunctionPlugin(plugin as never, { enGB: Object.fromEntries(names.map((n) => [n, n])) });
  registered = true;
}

/**
 * A spreadsheet reads bare TRUE and FALSE as logical constants; the engine
 * knows only the functions TRUE() and FALSE(), so the bare words are named
 * expressions that call them (=IF(TRUE,1,2) is 1, as in any spreadsheet).
 */
export const LOGICAL_CONSTANTS = [
  { name: "TRUE", expression: "=TRUE()" },
  { name: "FALSE", expression: "=FALSE()" },
];

/** A workbook-level defined name, as the engine takes it: "=Sheet1!$A$1:$A$30". */
export interface NamedRange {
  name: string;
  expression: string;
  /** The engine's id of the one sheet the name belongs to; none for a workbook-wide name. */
  scope?: number;
}

/**
 * Below this share of filled cells in the rectangle a sheet spans, the engine
 * keeps the sheet in a sparse map instead of a dense grid: a sheet holding A1
 * and XFD1048576 would otherwise allocate 17 billion slots and abort.
 */
const DENSE_FILL_THRESHOLD = 0.25;

/** Day 0 of the 1904 date system (ECMA-376 Part 1, 18.17.4.1), as the engine's option takes it. */
const NULL_DATE_1904 = { year: 1904, month: 1, day: 1 };

/**
 * options.date1904: the workbook counts dates from 1904-01-01, so DATE, YEAR and the like must too
 * (with the engine's default day 0, 1899-12-30, DATE(2024,3,1) gave a number 1462 days too large).
 */
export function createEngine(sheets: Record<string, unknown[][]>, metadata: FunctionMetadata[], options: { date1904?: boolean } = {}): HyperFormula {
  registerFunctions(metadata);
  const normalised = Object.fromEntries(
    Object.entries(sheets).map(([name, rows]) => [
      name,
      // map() keeps the holes of a sparse row, so a far-away cell costs no more than a near one.
      rows.map((row) => (row.length === 0 ? row : row.map((v) => (typeof v === "string" && v.startsWith("=") ? normaliseFormula(v) : v)))),
    ]),
  );
  return HyperFormula.buildFromSheets(
    normalised as never,
    {
      licenseKey: LICENSE_KEY,
      // A spreadsheet's own limits; the engine's defaults (40 000 rows) would refuse a full column.
      maxRows: MAX_ROWS,
      maxColumns: MAX_COLUMNS,
      chooseAddressMappingPolicy: new DenseSparseChooseBasedOnThreshold(DENSE_FILL_THRESHOLD),
      useArrayArithmetic: false,
      smartRounding: false,
      precisionRounding: 0,
      ...(options.date1904 ? { nullDate: NULL_DATE_1904 } : {}),
    },
    LOGICAL_CONSTANTS,
  );
}

/**
 * Adds a workbook's defined names (=Strengths in a formula), re-evaluating
 * once. Returns the names the engine refused (an invalid name, one that
 * clashes with TRUE/FALSE or a cell address), so the caller can say so:
 * formulas using them show #NAME?.
 */
export function addNamedRanges(engine: HyperFormula, names: NamedRange[]): string[] {
  const refused: string[] = [];
  if (names.length === 0) return refused;
  engine.suspendEvaluation();
  try {
    for (const { name, expression, scope } of names) {
      const formula = normaliseFormula(expression.startsWith("=") ? expression : `=${expression}`);
      try {
        if (engine.isItPossibleToAddNamedExpression(name, formula, scope)) engine.addNamedExpression(name, formula, scope);
        else refused.push(name);
      } catch {
        refused.push(name);
      }
    }
  } finally {
    engine.resumeEvaluation();
  }
  return refused;
}
