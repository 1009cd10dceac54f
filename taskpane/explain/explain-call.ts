/**
 * "Explain the selected cell": a BRITTLE call re-evaluated through the very
 * adapters the host registered (functions/registry.ts `guarded`), with what
 * each argument read and the full message of any error. Nothing here reads
 * the workbook: the host side (host-explain.ts) reads the cell and every
 * range the formula refers to first, and hands the values over, so this
 * part runs the same in a test, a plain browser or the spreadsheet.
 *
 * The counts of specimens, blanks and censored specimens come from the cell
 * readers (functions/cells.ts), the same code the functions use to read
 * their ranges, so the explanation cannot disagree with the function.
 */
import { isCellFailure, readPositiveNumbers, readSampleCounts, type CellResult, type SampleCounts } from "../../functions/cells";
import { guarded } from "../../functions/registry";
import type { FunctionMetadata, ParameterMetadata } from "../../functions/metadata";
import { referenceKey, type Argument, type BrittleCall, type ParsedFormula } from "./formula-parse";

/** What the host read for one reference or defined name. */
export type ReadReference = { address: string; values: unknown[][] } | { problem: string };

export interface ArgumentReport {
  /** 1-based position in the call. */
  position: number;
  /** The parameter's name from the function's metadata, or "argument N". */
  parameter: string;
  /** The parameter's own description (units, default), where known. */
  description: string;
  written: string;
  /** What the function received, in words: "0.9999", "A2:A16 (15 cells)", "omitted: default applies". */
  read: string;
  /** For a strengths range: specimens, failures, censored and blanks, counted by the cell readers. */
  sample?: SampleCounts;
  /** For any other range of numbers: numbers read and blanks skipped. */
  numbers?: { cells: number; numbers: number; blanks: number };
  /** For a nested BRITTLE call: its own explanation. */
  nested?: CallExplanation;
}

export type Outcome =
  | { kind: "value"; value: number | string | boolean }
  | { kind: "table"; rows: unknown[][] }
  | { kind: "error"; code: string; message: string }
  /** The pane could not re-evaluate the call (an expression argument, an unread reference): why. */
  | { kind: "not-evaluated"; reason: string };

export interface CallExplanation {
  name: string;
  written: string;
  /** The function's one-line description from its metadata, where known. */
  description: string;
  arguments: ArgumentReport[];
  outcome: Outcome;
  /** What the result rests on: the function's description, the defaults that applied, the sidedness of any confidence. */
  basis: string[];
}

export interface Explanation {
  address: string;
  formula: string;
  call: CallExplanation;
  /** What the sheet shows in the cell now, as the host reported it. */
  shown: string;
  notes: string[];
}

type Registry = Record<string, (...args: any[]) => CellResult>;

export function explainFormula(options: {
  address: string;
  parsed: ParsedFormula;
  /** The cell's value as the host reports it (an error shows as its code text). */
  cellValue: unknown;
  references: ReadonlyMap<string, ReadReference>;
  metadata: readonly FunctionMetadata[] | null;
  functions?: Registry;
}): Explanation {
  const { parsed, references, metadata } = options;
  const functions = options.functions ?? guarded;
  const call = explainCall(parsed.call, references, metadata, functions);
  const notes: string[] = [];
  if (parsed.wrapped) {
    notes.push(`The formula is more than BRITTLE.${call.name}: the rest of it is the spreadsheet's own, and this explains the BRITTLE call only.`);
  }
  if (!metadata) notes.push("The function descriptions (functions.json) could not be loaded: arguments are named by position.");
  const shown = showCell(options.cellValue);
  const mismatch = !parsed.wrapped && differs(call.outcome, options.cellValue);
  if (mismatch) notes.push(`The cell shows ${shown}, which differs from the value recomputed here: the sheet may need recalculating, or its inputs changed since.`);
  return { address: options.address, formula: parsed.formula, call, shown, notes };
}

function explainCall(
  call: BrittleCall,
  references: ReadonlyMap<string, ReadReference>,
  metadata: readonly FunctionMetadata[] | null,
  functions: Registry,
): CallExplanation {
  const meta = metadata?.find((f) => f.id === call.name || f.name === call.name) ?? null;
  const fn = functions[call.name] as Registry[string] | undefined;
  const params = meta?.parameters ?? [];
  const count = Math.max(call.args.length, params.length);
  const reports: ArgumentReport[] = [];
  const values: unknown[] = [];
  let stop: string | null = fn ? null : `BRITTLE.${call.name} is not a function of this add-in (check the spelling).`;
  if (call.args.length > params.length && meta) {
    stop ??= `BRITTLE.${call.name} takes at most ${params.length} arguments; the formula gives ${call.args.length}.`;
  }

  for (let i = 0; i < count; i++) {
    const arg: Argument = call.args[i] ?? { kind: "omitted", text: "" };
    const param = params[i];
    const report: ArgumentReport = {
      position: i + 1,
      parameter: param?.name ?? `argument ${i + 1}`,
      description: param?.description ?? "",
      written: arg.text,
      read: "",
    };
    reports.push(report);
    const matrix = param ? param.dimensionality === "matrix" : undefined;
    switch (arg.kind) {
      case "omitted":
        report.read = param?.optional === false ? "missing (required)" : "omitted: the default applies";
        values.push(null);
        break;
      case "constant":
        report.read = typeof arg.value === "string" ? `"${arg.value}"` : String(arg.value);
        values.push(matrix ? [[arg.value]] : arg.value);
        break;
      case "array":
        report.read = `array constant, ${arg.value.length} x ${arg.value[0].length}`;
        values.push(arg.value);
        break;
      case "reference":
      case "name": {
        const got = references.get(referenceKey(arg));
        if (!got || "problem" in got) {
          report.read = got ? got.problem : "not read";
          stop ??= `${report.parameter} (${arg.text}) could not be read: ${report.read}.`;
          values.push(null);
          break;
        }
        const cells = got.values.length * (got.values[0]?.length ?? 0);
        if (matrix === false || (matrix === undefined && cells === 1)) {
          if (cells !== 1) {
            report.read = `${got.address}, ${cells} cells where one value is expected`;
            stop ??= `${report.parameter} refers to ${cells} cells (${got.address}); the function expects one value there.`;
            values.push(null);
            break;
          }
          const v = blankToNull(got.values[0][0]);
          report.read = `${got.address}: ${v === null ? "blank" : typeof v === "string" ? `"${v}"` : String(v)}`;
          values.push(v);
        } else {
          report.read = `${got.address} (${cells} cell${cells === 1 ? "" : "s"})`;
          values.push(got.values);
        }
        break;
      }
      case "call": {
        const nested = explainCall(arg.call, references, metadata, functions);
        report.nested = nested;
        const o = nested.outcome;
        if (o.kind === "value") {
          report.read = `BRITTLE.${nested.name} gives ${String(o.value)}`;
          values.push(matrix ? [[o.value]] : o.value);
        } else if (o.kind === "table") {
          report.read = `BRITTLE.${nested.name} gives a ${o.rows.length} x ${o.rows[0]?.length ?? 0} table`;
          values.push(o.rows);
        } else {
          report.read = o.kind === "error" ? `BRITTLE.${nested.name} gives ${o.code} ${o.message}` : `BRITTLE.${nested.name} was not re-evaluated`;
          stop ??= `${report.parameter} is BRITTLE.${nested.name}(...), which ${o.kind === "error" ? `gives ${o.code}: ${o.message}` : `could not be re-evaluated: ${o.reason}`}`;
          values.push(null);
        }
        break;
      }
      case "expression":
        report.read = "an expression, not evaluated here";
        stop ??=
          `${report.parameter} is the expression ${arg.text}: the pane re-evaluates references, constants and BRITTLE calls ` +
          "only. Put the expression in a cell of its own and refer to that cell to see it explained.";
        values.push(null);
        break;
    }
  }
  countWhatWasRead(reports, values, params);

  const outcome: Outcome = stop !== null || !fn ? { kind: "not-evaluated", reason: stop ?? "" } : toOutcome(fn(...values));
  return {
    name: call.name,
    written: call.text,
    description: meta?.description ?? "",
    arguments: reports,
    outcome,
    basis: basisLines(meta, reports),
  };
}

/**
 * Counts for range arguments: a strengths range (with the censoring flags
 * beside it, where the function has them) through readSampleCounts, any
 * other range through readPositiveNumbers. A range the readers refuse gets
 * no counts here: the function's own message says why.
 */
function countWhatWasRead(reports: ArgumentReport[], values: unknown[], params: readonly ParameterMetadata[]): void {
  const flagsAt = params.findIndex((p) => p.name === "censored");
  reports.forEach((report, i) => {
    const value = values[i];
    if (!Array.isArray(value)) return;
    const name = params[i]?.name ?? "";
    try {
      if (/strengths$/i.test(name)) {
        report.sample = readSampleCounts(value, flagsAt >= 0 && name === "strengths" ? values[flagsAt] : null);
      } else if (name !== "censored" && name !== "origins" && params[i]) {
        const numbers = readPositiveNumbers(value, name);
        report.numbers = { cells: numbers.rows * numbers.cols, numbers: numbers.values.length, blanks: numbers.blanks };
      }
    } catch {
      // Refused by the reader: the function's own result carries the message.
    }
  });
}

function basisLines(meta: FunctionMetadata | null, reports: ArgumentReport[]): string[] {
  if (!meta) return [];
  const lines = [firstSentence(meta.description)];
  for (const r of reports) {
    if (r.read.startsWith("omitted") && r.description) lines.push(`${r.parameter} omitted: ${r.description}`);
  }
  const confidence = reports.find((r) => /confidence/i.test(r.parameter) && !r.read.startsWith("omitted"));
  if (confidence && confidence.description) lines.push(`${confidence.parameter} ${confidence.read}: ${confidence.description}`);
  return lines;
}

/** The description without its worked example (the example is for the function list). */
function firstSentence(description: string): string {
  return description.replace(/\s*Example:.*$/s, "").trim();
}

function toOutcome(result: CellResult): Outcome {
  if (isCellFailure(result)) return { kind: "error", code: result.cellError, message: result.message };
  if (Array.isArray(result)) return { kind: "table", rows: result };
  if (result === null || result === undefined) return { kind: "not-evaluated", reason: "the function returned nothing" };
  return { kind: "value", value: result };
}

function blankToNull(v: unknown): unknown {
  return v === "" || v === undefined ? null : v;
}

function showCell(v: unknown): string {
  if (v === null || v === undefined || v === "") return "a blank";
  return typeof v === "string" ? v : String(v);
}

/** The recomputed value and the cell's own disagree beyond rounding (a spilled table is compared by its first cell). */
function differs(outcome: Outcome, cellValue: unknown): boolean {
  const first = outcome.kind === "value" ? outcome.value : outcome.kind === "table" ? outcome.rows[0]?.[0] : undefined;
  if (outcome.kind === "error") return typeof cellValue === "string" ? !cellValue.startsWith("#") : true;
  if (first === undefined) return false;
  if (typeof first === "number" && typeof cellValue === "number") {
    return Math.abs(first - cellValue) > 1e-12 * Math.max(Math.abs(first), Math.abs(cellValue));
  }
  return first !== cellValue;
}

/**
 * A formula typed into the pane (no spreadsheet): constants and array
 * constants are evaluated; references cannot be read, and the explanation
 * says what to type instead.
 */
export function explainTypedFormula(parsed: ParsedFormula, metadata: readonly FunctionMetadata[] | null): Explanation {
  const references = new Map<string, ReadReference>();
  const walk = (call: BrittleCall) => {
    for (const a of call.args) {
      if (a.kind === "reference" || a.kind === "name") {
        references.set(referenceKey(a), {
          problem: "references are read from the spreadsheet; outside it, type the values as an array constant such as {412,398,455}",
        });
      } else if (a.kind === "call") walk(a.call);
    }
  };
  walk(parsed.call);
  const explanation = explainFormula({ address: "", parsed, cellValue: undefined, references, metadata });
  return { ...explanation, notes: explanation.notes.filter((n) => !n.startsWith("The cell shows")) };
}
