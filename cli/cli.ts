/**
 * `brittle`: the add-in's functions with no spreadsheet application.
 *
 *   brittle calc FILE [--out FILE.xlsx] [--force] [--json] [--strict]
 *   brittle part FILE --modulus M [options]
 *   brittle check FILE.check.json [--json]
 *   brittle demo
 *
 * calc evaluates every formula of an .xlsx or .csv workbook in the embedded
 * engine and prints the results and a summary line that counts error cells
 * (or, with --json, the computed grid of every sheet as
 * {"<sheet>": [[row values...], ...]}, errors as "#NUM!" text, and the error
 * cells with their messages on stderr). --out writes a copy with each formula
 * and its computed value, atomically; the input file is never written (not
 * through a symbolic or hard link either), and an existing output only with
 * --force. --strict exits with EXIT_FORMULA_ERRORS when any formula evaluates
 * to an error, listing the cells on stderr.
 * check reruns a saved design check (exit 0 PASS, 1 FAIL, 2 bad input, 3 PASS on the point estimate alone).
 */
import { existsSync } from "node:fs";
import { mkdir } from "node:fs/promises";
import { dirname, resolve } from "node:path";
import type { DirectEvaluation } from "./direct-evaluation";
import type { Evaluation, FormulaResult } from "./evaluate-workbook";
import type { FunctionMetadata } from "../functions/metadata";
import type { LoadedWorkbook } from "./workbook-io";

/** calc's exit codes: 1 a file that cannot be read or written, 2 a usage error, 3 --strict and a formula evaluated to an error. */
export const EXIT_FORMULA_ERRORS = 3;
// The workbook engine, exceljs and the function catalogue are imported where they are needed, so `brittle part`
// starts without them. Compiled (lib/), the catalogue is the built functions.json; from source, the metadata
// generator (see scripts/build.mjs).

const USAGE = `usage: brittle calc FILE [--out FILE.xlsx] [--force] [--json] [--strict] [--decimal-comma | --decimal-point]
       brittle part FILE --modulus M [options]   (brittle part --help lists them)
       brittle check FILE.check.json [--json]
       brittle demo
calc: FILE is an .xlsx workbook or a .csv sheet whose cells may hold BRITTLE.* formulas. A .csv's
  encoding, delimiter and decimal mark are detected; --decimal-comma or --decimal-point states the
  mark when the file leaves it ambiguous (docs/files-and-formats.md). --strict: exit code 3 when any
  formula evaluates to an error (the cells are listed on stderr).
part: FILE is a table of element stresses and sizes (effective size, failure probability, risk shares).
check: reruns a saved design check and prints the verdict with its basis: exit 0 PASS, 1 FAIL, 2 bad input,
  3 PASS on the point estimate alone (no confidence bound: provisional).
demo: evaluates the invented supplier datasheet shipped with the package.`;

export interface Io {
  out: (text: string) => void;
  err: (text: string) => void;
}

const processIo: Io = {
  out: (t) => process.stdout.write(t),
  err: (t) => process.stderr.write(t),
};

class UsageError extends Error {}

interface CalcOptions {
  file: string;
  out?: string;
  json: boolean;
  force: boolean;
  strict: boolean;
  decimalMark?: "comma" | "point";
}

function parseCalc(args: string[]): CalcOptions {
  const options: Partial<CalcOptions> = { json: false, force: false, strict: false };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === "--json") options.json = true;
    else if (a === "--strict") options.strict = true;
    else if (a === "--force") options.force = true;
    else if (a === "--decimal-comma" || a === "--decimal-point") {
      const mark = a === "--decimal-comma" ? "comma" : "point";
      if (options.decimalMark && options.decimalMark !== mark) throw new UsageError("give --decimal-comma or --decimal-point, not both");
      options.decimalMark = mark;
    }
    else if (a === "--out") {
      if (!args[i + 1] || args[i + 1].startsWith("--")) throw new UsageError("--out needs a file name");
      options.out = args[++i];
    } else if (a.startsWith("--")) throw new UsageError(`unknown option ${a}`);
    else if (options.file) throw new UsageError(`one input file at a time (got ${options.file} and ${a})`);
    else options.file = a;
  }
  if (!options.file) throw new UsageError("calc needs a FILE");
  return options as CalcOptions;
}

export async function calc(options: CalcOptions, io: Io): Promise<FormulaResult[]> {
  if (options.out) {
    const { isSameFile } = await import("./atomic-write");
    if (await isSameFile(options.file, options.out)) throw new UsageError("--out must differ from the input: brittle never writes over its input");
    if (!options.out.toLowerCase().endsWith(".xlsx")) throw new UsageError("--out writes an .xlsx file: give it a name ending in .xlsx");
    if (existsSync(options.out) && !options.force) throw new UsageError(`${options.out} exists: choose another name or add --force`);
  }
  const { loadWorkbook } = await import("./workbook-io");
  const { checkWorkbookSize } = await import("./workbook-limits");
  const { checkRangeBudget } = await import("./range-budget");
  const { generateMetadata } = await import("../functions/metadata");
  const workbook = await loadWorkbook(options.file, { decimalMark: options.decimalMark });
  if (workbook.readAs) io.err(`brittle: read ${options.file} as ${workbook.readAs}\n`);
  checkWorkbookSize(workbook, options.file);
  checkRangeBudget(workbook, options.file);
  const { functions } = await generateMetadata();
  // A .csv of plain BRITTLE.* calls is evaluated without the engine (same results; see direct-evaluation.ts);
  // anything else, and any written copy, goes through the engine.
  const direct = options.out ? undefined : await evaluateWithoutEngine(workbook, functions);
  const evaluation = direct ?? (await import("./evaluate-workbook")).evaluateWorkbook(workbook, functions);
  const errors = evaluation.formulas.filter((f) => f.error !== undefined);
  if (options.json) io.out(JSON.stringify(evaluation.grids) + "\n");
  else io.out(formatResults(evaluation.formulas) + summaryLine(evaluation.formulas.length, errors.length));
  // With --json, stdout holds the grid alone: the messages of error cells go to stderr; --strict lists them either way.
  if (errors.length > 0 && (options.json || options.strict)) io.err(errorListing(errors));
  for (const name of evaluation.refusedNames) io.err(`brittle: note: the defined name ${name} is not evaluated (invalid here, or its range is too large); formulas using it show #NAME?\n`);
  if (options.out) {
    const { writeEvaluated } = await import("./write-workbook");
    const { describeDropped } = await import("./xlsx-parts");
    await mkdir(dirname(resolve(options.out)), { recursive: true });
    const report = await writeEvaluated(workbook, evaluation as Evaluation, options.out);
    for (const line of report.asText) io.err(`brittle: note: written as text, not as a formula: ${line}\n`);
    for (const line of report.namesLeftOut) io.err(`brittle: note: defined name left out of the copy: ${line}\n`);
    const dropped = workbook.dropped ? describeDropped(workbook.dropped) : "";
    if (dropped) io.err(`brittle: note: not carried over into ${options.out}: ${dropped} (cell values, formulas, styles and defined names are)\n`);
    if (!options.json) io.out(`wrote ${options.out}\n`);
  }
  if (options.strict && errors.length > 0) throw new FormulaErrors(errors.length, evaluation.formulas.length);
  return evaluation.formulas;
}

async function evaluateWithoutEngine(workbook: LoadedWorkbook, functions: FunctionMetadata[]): Promise<DirectEvaluation | undefined> {
  if (workbook.kind !== "csv") return undefined;
  const { evaluateDirectly } = await import("./direct-evaluation");
  const { guarded } = await import("../functions/registry"); // fills spillShapes as its families load
  const { spillShapes } = await import("../functions/spill-shapes");
  return evaluateDirectly(workbook, functions, guarded, new Set(Object.keys(spillShapes)));
}

/** --strict and some formula evaluated to an error: the cells are listed already. */
class FormulaErrors extends Error {
  constructor(errors: number, formulas: number) {
    super(`--strict: ${errors} of ${formulas} formulas evaluate to errors`);
  }
}

export function summaryLine(formulas: number, errors: number): string {
  if (formulas === 0) return "";
  return `${formulas} ${formulas === 1 ? "formula" : "formulas"} evaluated, ${errors} ${errors === 1 ? "error" : "errors"}\n`;
}

/** One line per error cell: Sheet!A1: #VALUE!: message. */
export function errorListing(errors: FormulaResult[]): string {
  return errors.map((f) => `${quoteSheet(f.sheet)}!${f.address}: ${f.error}${f.message ? `: ${f.message}` : ""}\n`).join("");
}

/** A sheet name as a reference writes it: quoted when it holds anything but letters, digits and underscores. */
function quoteSheet(name: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(name) ? name : `'${name.replace(/'/g, "''")}'`;
}

export function formatResults(formulas: FormulaResult[]): string {
  if (formulas.length === 0) return "no formulas found\n";
  const width = Math.min(60, Math.max(...formulas.map((f) => f.formula.length)));
  return (
    formulas
      .map((f) => {
        const where = `${f.sheet}!${f.address}`.padEnd(16);
        const formula = f.formula.length > width ? f.formula.slice(0, width - 3) + "..." : f.formula.padEnd(width);
        const value = typeof f.value === "number" ? formatNumber(f.value) : String(f.value ?? "");
        return `${where} ${formula}  ${value}${f.message ? `  (${f.message})` : ""}`;
      })
      .join("\n") + "\n"
  );
}

export function formatNumber(x: number): string {
  if (Number.isInteger(x) && Math.abs(x) < 1e15) return String(x);
  const a = Math.abs(x);
  return a !== 0 && (a < 1e-3 || a >= 1e7) ? x.toExponential(5) : x.toPrecision(6);
}

export async function main(argv: string[], io: Io = processIo): Promise<number> {
  const [command, ...rest] = argv;
  try {
    if (command === "calc") {
      await calc(parseCalc(rest), io);
      return 0;
    }
    if (command === "demo") {
      const { runDemo } = await import("../examples/demo");
      await runDemo(io);
      return 0;
    }
    if (command === "check") {
      const { runCheckCommand } = await import("./check-command");
      return await runCheckCommand(rest, io);
    }
    if (command === "part") {
      const { runPartCommand } = await import("./part-command");
      return await runPartCommand(rest, io);
    }
    if (command === "--help" || command === "-h" || command === "help") {
      io.out(USAGE + "\n");
      return 0;
    }
    throw new UsageError(command ? `unknown command ${command}` : "no command given");
  } catch (error) {
    if (error instanceof UsageError) {
      io.err(`brittle: ${error.message}\n${USAGE}\n`);
      return 2;
    }
    if (error instanceof FormulaErrors) {
      io.err(`brittle: ${error.message}\n`);
      return EXIT_FORMULA_ERRORS;
    }
    const message = error instanceof Error ? error.message : String(error);
    io.err(`brittle: ${message.split("\n")[0]}\n`);
    return 1;
  }
}
