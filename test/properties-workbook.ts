// Lays many generated calls out in one workbook, evaluates it in the embedded
// engine (one engine build for the whole batch: that keeps tens of thousands
// of cases inside CI's time), and checks what a user would see against the
// cell policy of DESIGN.md ("One policy for cells").
import { DetailedCellError, type HyperFormula } from "hyperformula";
import { isCellFailure, type CellResult } from "../functions/cells";
import { createEngine, normaliseFormula } from "../cli/engine";
import { columnName } from "../cli/evaluate-workbook";
import type { FunctionMetadata } from "../functions/metadata";
import { spillShapes } from "../functions/spill-shapes";

/** A cell as typed: a string starting with "=" is a formula. */
export type Cell = number | string | boolean | null;

export type Arg =
  | { kind: "omit" } // an optional argument left out (trailing), or ",," before a given one
  | { kind: "empty" } // an explicit empty argument: =F(1,,3)
  | { kind: "literal"; text: string } // typed into the formula: 2.5, "MLE", TRUE()
  | { kind: "cell"; value: Cell } // a reference to one cell holding this value
  | { kind: "range"; cells: Cell[][] }; // a reference to a block of cells

export interface Call {
  id: string;
  args: Arg[];
}

/** Error formulas placed in input cells, and the error each shows. */
export const INPUT_ERRORS: Record<string, string> = { "=1/0": "#DIV/0!", "=NA()": "#N/A", "=SQRT(-1)": "#NUM!" };

/** The errors the cell policy allows a BRITTLE function to show (input errors pass through as well). */
export const POLICY_ERRORS = new Set(["#VALUE!", "#NUM!", "#N/A"]);

export type Shown = number | string | boolean | null;

export interface Outcome {
  call: Call;
  formula: string;
  /** The top-left value; an error shows as its code. */
  value: Shown;
  error?: { code: string; message: string };
  /** Every cell of the declared spill area (1 x 1 for a scalar function). */
  cells: Shown[][];
}

export interface Evaluated {
  outcomes: Outcome[];
  /** Non-finite numbers anywhere in the formula sheet, as "address: value". */
  nonFinite: string[];
  /** Set when building or reading the engine threw: the whole batch failed. */
  crash?: string;
}

function argumentText(arg: Arg, place: () => string): string {
  switch (arg.kind) {
    case "omit":
    case "empty":
      return "";
    case "literal":
      return arg.text;
    case "cell":
    case "range":
      return place();
  }
}

function spillArea(call: Call): { rows: number; cols: number } {
  const shape = spillShapes[call.id];
  if (!shape) return { rows: 1, cols: 1 };
  const { rows, cols } = shape;
  const header = shape.headerRows ?? 0;
  if (typeof rows === "number") return { rows: rows + header, cols };
  const k = "cellsOf" in rows ? rows.cellsOf : rows.rowsOf;
  const arg = call.args[k];
  if (!arg || arg.kind !== "range") return { rows: 1 + header, cols };
  const height = arg.cells.length;
  const width = arg.cells[0]?.length ?? 1;
  return { rows: ("cellsOf" in rows ? height * width : height) + header, cols };
}

/** The formula text for a call whose range and cell arguments sit where `place` puts them. */
export function formulaFor(call: Call, place: (arg: Arg) => string): string {
  let last = call.args.length - 1;
  while (last >= 0 && call.args[last].kind === "omit") last--;
  const parts = call.args.slice(0, last + 1).map((a) => argumentText(a, () => place(a)));
  return `=BRITTLE.${call.id}(${parts.join(", ")})`;
}

/** Data sheet: every call's cells and ranges side by side; Calls sheet: one formula per call along row 1. */
export function layout(calls: Call[]): { sheets: Record<string, Cell[][]>; formulas: string[]; anchors: { col: number; rows: number; cols: number }[] } {
  const data: Cell[][] = [];
  let dataCol = 0;
  const put = (r: number, c: number, v: Cell) => {
    while (data.length <= r) data.push([]);
    data[r][c] = v;
  };
  const formulas: string[] = [];
  const anchors: { col: number; rows: number; cols: number }[] = [];
  const callRow: Cell[] = [];
  let callCol = 0;
  for (const call of calls) {
    const formula = formulaFor(call, (arg) => {
      if (arg.kind === "cell") {
        put(0, dataCol, arg.value);
        return `Data!$${columnName(dataCol++)}$1`;
      }
      if (arg.kind === "range") {
        const rows = arg.cells.length;
        const cols = arg.cells[0].length;
        arg.cells.forEach((row, r) => row.forEach((v, c) => put(r, dataCol + c, v)));
        const text = `Data!${columnName(dataCol)}1:${columnName(dataCol + cols - 1)}${rows}`;
        dataCol += cols;
        return text;
      }
      return "";
    });
    const area = spillArea(call);
    formulas.push(formula);
    anchors.push({ col: callCol, ...area });
    callRow[callCol] = formula;
    callCol += area.cols;
  }
  const width = Math.max(dataCol, 1);
  const dataRows = data.length ? data : [[]];
  const squared = dataRows.map((row) => Array.from({ length: width }, (_, c) => (row[c] === undefined ? null : row[c])));
  const calls1 = Array.from({ length: Math.max(callCol, 1) }, (_, c) => (callRow[c] === undefined ? null : callRow[c]));
  return { sheets: { Data: squared, Calls: [calls1] }, formulas, anchors };
}

function shown(v: unknown): Shown {
  if (v instanceof DetailedCellError) return v.value;
  if (v === undefined) return null;
  return v as Shown;
}

let shared: HyperFormula | null = null;

/**
 * A fresh engine costs about 50 ms to build, replacing two sheets' contents
 * about 1 ms: batches after the first reuse the engine, as a user editing a
 * workbook does. `fresh` builds a new one, exactly as `brittle calc` does.
 */
function engineWith(sheets: Record<string, Cell[][]>, metadata: FunctionMetadata[], fresh: boolean): HyperFormula {
  if (fresh || !shared) {
    shared?.destroy();
    shared = null;
    shared = createEngine(sheets, metadata);
    return shared;
  }
  const engine = shared;
  const normalised = (rows: Cell[][]) => rows.map((row) => row.map((v) => (typeof v === "string" && v.startsWith("=") ? normaliseFormula(v) : v)));
  engine.batch(() => {
    engine.setSheetContent(engine.getSheetId("Data")!, normalised(sheets.Data) as never);
    engine.setSheetContent(engine.getSheetId("Calls")!, normalised(sheets.Calls) as never);
  });
  return engine;
}

export function evaluateCalls(calls: Call[], metadata: FunctionMetadata[], options: { fresh?: boolean } = {}): Evaluated {
  const { sheets, formulas, anchors } = layout(calls);
  try {
    const engine = engineWith(sheets, metadata, options.fresh ?? false);
    const sheet = engine.getSheetId("Calls")!;
    const nonFinite: string[] = [];
    engine.getSheetValues(sheet).forEach((row, r) =>
      row.forEach((v, c) => {
        if (typeof v === "number" && !Number.isFinite(v)) nonFinite.push(`Calls!${columnName(c)}${r + 1}: ${v}`);
      }),
    );
    const outcomes = calls.map((call, i): Outcome => {
      const { col, rows, cols } = anchors[i];
      const top = engine.getCellValue({ sheet, row: 0, col });
      const cells: Shown[][] = [];
      for (let r = 0; r < rows; r++) {
        const line: Shown[] = [];
        for (let c = 0; c < cols; c++) line.push(shown(engine.getCellValue({ sheet, row: r, col: col + c })));
        cells.push(line);
      }
      return {
        call,
        formula: formulas[i],
        value: shown(top),
        ...(top instanceof DetailedCellError ? { error: { code: top.value, message: top.message ?? "" } } : {}),
        cells,
      };
    });
    return { outcomes, nonFinite };
  } catch (error) {
    // A throw may leave the engine half-evaluated: the next batch builds a new one.
    shared = null;
    return { outcomes: [], nonFinite: [], crash: `the engine threw: ${error instanceof Error ? error.stack : String(error)}` };
  }
}

/** The input errors a call references (they may pass through to its result). */
function inputErrors(call: Call): Set<string> {
  const codes = new Set<string>();
  const see = (v: Cell) => {
    if (typeof v === "string" && v in INPUT_ERRORS) codes.add(INPUT_ERRORS[v]);
  };
  for (const a of call.args) {
    if (a.kind === "cell") see(a.value);
    if (a.kind === "range") a.cells.forEach((row) => row.forEach(see));
  }
  return codes;
}

/** What a #NUM! of ours may say: the result is beyond double precision, or a solve did not converge. */
export const NUM_MESSAGE = /too (large|small) to represent|double precision|did not converge/;

/** HyperFormula's own message when a function hands it NaN or Infinity: it shows #NUM! instead. */
export const ENGINE_NON_FINITE = "NaN or infinite value encountered.";

/** Whether a call passes an infinite number in (a cell typed 1e999): then the engine's own #NUM! is expected. */
function hasInfiniteInput(call: Call): boolean {
  const infinite = (v: unknown) => (typeof v === "number" && !Number.isFinite(v)) || (typeof v === "string" && /^\s*[-+]?1e999\s*$/i.test(v.replace(/"/g, "")));
  return call.args.some(
    (a) => (a.kind === "cell" && infinite(a.value)) || (a.kind === "literal" && infinite(a.text)) || (a.kind === "range" && a.cells.some((row) => row.some(infinite))),
  );
}

/**
 * The safety half of the policy, for any input whatever: the engine does not
 * crash, no cell shows NaN or Infinity, errors are only the policy's own or
 * ones passed through from the inputs, each of ours carries a message, no
 * adapter threw (the engine reports that as "internal error"), and a function
 * documented to return a number returns a number when it returns anything.
 */
export function safetyViolations(evaluated: Evaluated, metadata: FunctionMetadata[]): string[] {
  if (evaluated.crash) return [evaluated.crash];
  const byId = new Map(metadata.map((f) => [f.id, f]));
  const problems = evaluated.nonFinite.map((s) => `non-finite number in a cell: ${s}`);
  for (const o of evaluated.outcomes) {
    const where = `${o.formula}  with inputs ${describeInputs(o.call)}`;
    if (o.error) {
      const passedThrough = inputErrors(o.call).has(o.error.code);
      if (!POLICY_ERRORS.has(o.error.code) && !passedThrough) problems.push(`${o.error.code} (${o.error.message}) is not a policy error: ${where}`);
      if (/internal error/i.test(o.error.message)) problems.push(`an adapter threw: ${o.error.message}: ${where}`);
      if (o.error.message === ENGINE_NON_FINITE && !passedThrough && !hasInfiniteInput(o.call)) problems.push(`the function returned NaN or Infinity (the engine shows #NUM!): ${where}`);
      if (!passedThrough && o.error.code !== "#N/A" && !o.error.message.trim()) problems.push(`${o.error.code} without a message: ${where}`);
      // The host drops #NUM!'s message, so the policy keeps #NUM! for results beyond double precision and
      // solves that did not converge: nothing the user could correct in the inputs.
      if (o.error.code === "#NUM!" && !passedThrough && o.error.message !== ENGINE_NON_FINITE && !NUM_MESSAGE.test(o.error.message)) {
        problems.push(`#NUM! for something other than a result beyond double precision (${o.error.message}): ${where}`);
      }
      continue;
    }
    const fn = byId.get(o.call.id)!;
    if (fn.result.dimensionality !== "matrix" && fn.result.type === "number" && typeof o.value !== "number") {
      problems.push(`expected a number, got ${JSON.stringify(o.value)}: ${where}`);
    }
    for (const row of o.cells) {
      for (const v of row) {
        if (typeof v === "number" && !Number.isFinite(v)) problems.push(`non-finite ${v} in the result: ${where}`);
      }
    }
  }
  return problems;
}

/** The same safety properties for a guarded adapter called directly, as the spreadsheet host calls it. */
export function hostViolations(result: CellResult | unknown, fn: FunctionMetadata): string[] {
  const problems: string[] = [];
  const finite = (v: unknown) => typeof v !== "number" || Number.isFinite(v);
  if (isCellFailure(result)) {
    if (!POLICY_ERRORS.has(result.cellError)) problems.push(`error ${result.cellError} is not a policy error`);
    if (typeof result.message !== "string" || !result.message.trim()) problems.push(`${result.cellError} without a message`);
    if (/internal error/i.test(result.message)) problems.push(`an adapter threw: ${result.message}`);
  } else if (Array.isArray(result)) {
    if (fn.result.dimensionality !== "matrix") problems.push("a scalar function returned an array");
    if (!result.every(Array.isArray)) problems.push("an array result is not a list of rows");
    else {
      const cells = result.flat();
      if (!cells.every((v) => isCellFailure(v) || ((v === null || ["number", "string", "boolean"].includes(typeof v)) && finite(v)))) {
        problems.push(`an array result holds NaN, Infinity or a non-cell value: ${JSON.stringify(result)}`);
      }
      // An error in one cell of a spill (one specimen outside a formula's limits) follows the policy too.
      for (const v of cells) {
        if (!isCellFailure(v)) continue;
        if (!POLICY_ERRORS.has(v.cellError)) problems.push(`error ${v.cellError} inside a spill is not a policy error`);
        if (typeof v.message !== "string" || !v.message.trim()) problems.push(`${v.cellError} inside a spill without a message`);
        if (/internal error/i.test(v.message)) problems.push(`an adapter threw inside a spill: ${v.message}`);
      }
    }
  } else if (typeof result === "number") {
    if (!Number.isFinite(result)) problems.push(`returned ${result}`);
  } else if (typeof result !== "string" && typeof result !== "boolean") {
    problems.push(`returned a non-cell value ${String(result)}`);
  }
  if (!isCellFailure(result) && fn.result.dimensionality !== "matrix" && fn.result.type === "number" && typeof result !== "number") {
    problems.push(`expected a number, got ${JSON.stringify(result)}`);
  }
  return problems;
}

/** The inputs of a call, short enough to read in a failure report. */
export function describeInputs(call: Call): string {
  return call.args
    .map((a) => {
      if (a.kind === "cell") return `[${JSON.stringify(a.value)}]`;
      if (a.kind === "range") return `range ${a.cells.length}x${a.cells[0].length} ${JSON.stringify(a.cells.length * a.cells[0].length > 12 ? [...a.cells.slice(0, 4), "..."] : a.cells)}`;
      if (a.kind === "literal") return a.text;
      return a.kind;
    })
    .join(" | ");
}
