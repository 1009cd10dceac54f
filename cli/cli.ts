/**
 * `brittle`: the add-in's functions with no spreadsheet application.
 *
 *   brittle calc FILE [--out FILE.xlsx] [--force] [--json]
 *   brittle part FILE --modulus M [options]
 *   brittle check FILE.check.json [--json]
 *   brittle demo
 *
 * calc evaluates every formula of an .xlsx or .csv workbook in the embedded
 * engine and prints the results (or, with --json, the computed grid of every
 * sheet as {"<sheet>": [[row values...], ...]}, errors as "#NUM!" text).
 * --out writes a copy with each formula and its computed value; the input
 * file is never written, and an existing output only with --force.
 * check reruns a saved design check (exit 0 PASS, 1 FAIL, 2 bad input).
 */
import { existsSync } from "node:fs";
import { mkdir } from "node:fs/promises";
import { dirname, resolve } from "node:path";
import type { FormulaResult } from "./evaluate-workbook";
// The workbook engine, exceljs and the function catalogue are imported where they are needed, so `brittle part`
// starts without them. Compiled (lib/), the catalogue is the built functions.json; from source, the metadata
// generator (see scripts/build.mjs).

const USAGE = `usage: brittle calc FILE [--out FILE.xlsx] [--force] [--json] [--decimal-comma | --decimal-point]
       brittle part FILE --modulus M [options]   (brittle part --help lists them)
       brittle check FILE.check.json [--json]
       brittle demo
calc: FILE is an .xlsx workbook or a .csv sheet whose cells may hold BRITTLE.* formulas. A .csv's
  encoding, delimiter and decimal mark are detected; --decimal-comma or --decimal-point states the
  mark when the file leaves it ambiguous (docs/files-and-formats.md).
part: FILE is a table of element stresses and sizes (effective size, failure probability, risk shares).
check: reruns a saved design check and prints the verdict with its basis: exit 0 PASS, 1 FAIL, 2 bad input.
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
  decimalMark?: "comma" | "point";
}

function parseCalc(args: string[]): CalcOptions {
  const options: Partial<CalcOptions> = { json: false, force: false };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === "--json") options.json = true;
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
    if (resolve(options.out) === resolve(options.file)) throw new UsageError("--out must differ from the input: brittle never writes over its input");
    if (!options.out.toLowerCase().endsWith(".xlsx")) throw new UsageError("--out writes an .xlsx file: give it a name ending in .xlsx");
    if (existsSync(options.out) && !options.force) throw new UsageError(`${options.out} exists: choose another name or add --force`);
  }
  const { loadWorkbook } = await import("./workbook-io");
  const { evaluateWorkbook, writeEvaluated } = await import("./evaluate-workbook");
  const { generateMetadata } = await import("../functions/metadata");
  const workbook = await loadWorkbook(options.file, { decimalMark: options.decimalMark });
  if (workbook.readAs) io.err(`brittle: read ${options.file} as ${workbook.readAs}\n`);
  const { functions } = await generateMetadata();
  const evaluation = evaluateWorkbook(workbook, functions);
  if (options.json) io.out(JSON.stringify(evaluation.grids) + "\n");
  else io.out(formatResults(evaluation.formulas));
  if (options.out) {
    await mkdir(dirname(resolve(options.out)), { recursive: true });
    await writeEvaluated(workbook, evaluation, options.out);
    if (!options.json) io.out(`wrote ${options.out}\n`);
  }
  return evaluation.formulas;
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
    const message = error instanceof Error ? error.message : String(error);
    io.err(`brittle: ${message.split("\n")[0]}\n`);
    return 1;
  }
}
