/**
 * `brittle part`: failure probability, effective size and hot spots of a part
 * from an element table too large for a sheet, streamed in one pass.
 *
 *   brittle part FILE --modulus M [--scale S0] [--criterion PIA|NSA|MAXPRINCIPAL]
 *                [--stress COLS] [--size COL] [--id COL|none]
 *                [--header auto|yes|no] [--delimiter auto|,|;|tab|space]
 *                [--decimal-comma|--decimal-point] [--integration-points]
 *                [--top N] [--json] [--quiet]
 *
 * FILE is a delimited text table (or "-" for standard input), one element per
 * line. Columns are found from the header names or, without a header, from
 * the number of fields (src/size/part-columns.ts); --stress, --size and --id
 * choose them by header name or 1-based position (--stress takes 1, 3 or 6
 * comma-separated columns). Encoding, delimiter and decimal mark are
 * detected (src/input); --decimal-comma or --decimal-point settles a table
 * the detection refuses as ambiguous. Progress and the list of skipped lines
 * go to stderr; results to stdout.
 * Exit status: 0 done, 1 bad data (the message names the line), 2 bad usage.
 */
import { closeSync, openSync, statSync } from "node:fs";
import { InputError } from "../src/errors";
import { CRITERIA, type Criterion } from "../src/size/criteria";
import type { ColumnChoice } from "../src/size/part-columns";
import { type PartStreamOptions, type PartStreamResult, PartTableReader } from "../src/size/part-stream";
import { parallelAvailable, readPartFileInParallel } from "./part-parallel";
import { readFileRange } from "./read-file-range";

export interface PartCommandIo {
  out: (text: string) => void;
  err: (text: string) => void;
  /** Whether stderr is a terminal (progress overwrites one line); defaults to process.stderr.isTTY. */
  errIsTTY?: boolean;
}

export const PART_USAGE = `usage: brittle part FILE --modulus M [--scale S0] [--criterion PIA|NSA|MAXPRINCIPAL]
                   [--stress COLS] [--size COL] [--id COL|none] [--header auto|yes|no]
                   [--delimiter auto|,|;|tab|space] [--decimal-comma|--decimal-point]
                   [--integration-points] [--top N] [--json] [--quiet]
FILE: a table of element stresses and sizes, one element per line ("-" reads standard input).
  --modulus M      Weibull modulus (required)
  --scale S0       material scale parameter for the size unit of the table: prints the failure probability
  --criterion C    multiaxial criterion, default PIA
  --stress COLS    stress columns by header name or 1-based position: 1 (max principal), 3 (principal)
                   or 6 (sxx,syy,szz,sxy,syz,szx), comma-separated; components named in the header go
                   by their names (S13 is szx), and SXX,SYY,SXY (plane stress) or SXX,SYY,SZZ,SXY
                   (axisymmetric: SZZ the hoop stress) name a 2-D tensor
  --size COL       element volume or area column;  --id COL  element id column, or "none"
  --integration-points  each row is an integration point (or node) and its size that point's own
                   share of the element: rows with the same element id are expected (otherwise
                   refused: an element volume repeated on each row would count it several times)
  --header H       auto (default: a first line with no number in it is a header), yes, no
  --delimiter D    auto (default), a character, "tab" or "space" (runs of blanks)
  --decimal-comma  the decimal mark is a comma (--decimal-point: a point); default: from the numbers,
                   and a number that could be read two ways ("1,250") is refused
  --top N          hot spots to list, default 10;  --json  machine-readable output;  --quiet  no progress
A file of 32 MiB or more is read on two threads on a machine with two processors or more (BRITTLE_THREADS=1: one).`;

class UsageError extends Error {}

interface PartArgs {
  file: string;
  options: PartStreamOptions;
  json: boolean;
  quiet: boolean;
}

function columnList(text: string): (string | number)[] {
  return text.split(",").map((s) => s.trim()).filter((s) => s !== "");
}

/** Parses the arguments after "part". */
export function parsePartArgs(args: string[]): PartArgs {
  let file: string | undefined;
  let modulus: number | undefined;
  let scale: number | undefined;
  let criterion: Criterion = "PIA";
  const columns: ColumnChoice = {};
  let header: "auto" | "yes" | "no" = "auto";
  let delimiter: string | undefined;
  let decimalMark: "comma" | "point" | undefined;
  let top = 10;
  let json = false;
  let quiet = false;
  let integrationPoints = false;
  const value = (i: number, name: string): string => {
    const v = args[i + 1];
    if (v === undefined || (v.startsWith("--") && v.length > 2)) throw new UsageError(`${name} needs a value`);
    return v;
  };
  const positive = (text: string, name: string): number => {
    const x = Number(text);
    if (!(Number.isFinite(x) && x > 0)) throw new UsageError(`${name} must be a positive number (got ${text})`);
    return x;
  };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    switch (a) {
      case "--modulus":
      case "-m":
        modulus = positive(value(i, a), "--modulus");
        i++;
        break;
      case "--scale":
        scale = positive(value(i, a), "--scale");
        i++;
        break;
      case "--criterion": {
        const c = value(i, a).toUpperCase();
        if (!(CRITERIA as readonly string[]).includes(c)) throw new UsageError(`--criterion must be one of ${CRITERIA.join(", ")}`);
        criterion = c as Criterion;
        i++;
        break;
      }
      case "--stress":
        columns.stress = columnList(value(i, a));
        i++;
        break;
      case "--size":
        columns.size = value(i, a);
        i++;
        break;
      case "--id": {
        const v = value(i, a);
        columns.id = v.toLowerCase() === "none" ? null : v;
        i++;
        break;
      }
      case "--header": {
        const v = value(i, a).toLowerCase();
        if (v !== "auto" && v !== "yes" && v !== "no") throw new UsageError("--header must be auto, yes or no");
        header = v;
        i++;
        break;
      }
      case "--delimiter":
        delimiter = value(i, a);
        i++;
        break;
      case "--decimal-comma":
      case "--decimal-point": {
        const mark = a === "--decimal-comma" ? "comma" : "point";
        if (decimalMark && decimalMark !== mark) throw new UsageError("give --decimal-comma or --decimal-point, not both");
        decimalMark = mark;
        break;
      }
      case "--top": {
        const n = Number(value(i, a));
        if (!(Number.isInteger(n) && n >= 0 && n <= 10000)) throw new UsageError("--top must be a whole number from 0 to 10000");
        top = n;
        i++;
        break;
      }
      case "--json":
        json = true;
        break;
      case "--integration-points":
        integrationPoints = true;
        break;
      case "--quiet":
      case "-q":
        quiet = true;
        break;
      default:
        if (a.startsWith("--")) throw new UsageError(`unknown option ${a}`);
        if (file !== undefined) throw new UsageError(`one table at a time (got ${file} and ${a})`);
        file = a;
    }
  }
  if (file === undefined) throw new UsageError("part needs a FILE");
  if (modulus === undefined) throw new UsageError("part needs --modulus (the Weibull modulus m)");
  return {
    file,
    options: { shape: modulus, materialScale: scale, criterion, columns, header, delimiter, decimalMark, top, integrationPoints },
    json,
    quiet,
  };
}

/**
 * Streams a file (or standard input) through the reader. The core of the
 * command, exported so a benchmark can time file reading plus parsing. A
 * large file is read on two threads where a second processor is available and
 * it is safe (cli/part-parallel.ts; BRITTLE_THREADS=1 asks for one), otherwise in one pass.
 */
export async function streamPartFile(
  file: string,
  options: PartStreamOptions,
  onProgress?: (rows: number, bytes: number, totalBytes: number | null) => void,
): Promise<PartFileResult> {
  const total = file === "-" ? null : statSync(file).size;
  if (parallelAvailable(file, total)) {
    const joined = await readPartFileInParallel(file, total as number, options, onProgress);
    if (joined !== null) return { ...joined, threads: 2 };
  }
  return { ...(await streamInOnePass(file, total, options, onProgress)), threads: 1 };
}

/** The table, and how many threads read it (two may differ from one in the last digit of the effective size). */
export type PartFileResult = PartStreamResult & { threads: 1 | 2 };

async function streamInOnePass(
  file: string,
  total: number | null,
  options: PartStreamOptions,
  onProgress?: (rows: number, bytes: number, totalBytes: number | null) => void,
): Promise<PartStreamResult> {
  const reader = new PartTableReader(options);
  if (file !== "-") {
    const fd = openSync(file, "r");
    try {
      readFileRange(fd, 0, total as number, reader, (bytes) => onProgress?.(reader.rows, bytes, total));
    } finally {
      closeSync(fd);
    }
    return reader.finish();
  }
  const source = process.stdin;
  let bytes = 0;
  for await (const chunk of source as AsyncIterable<Uint8Array>) {
    reader.push(chunk);
    bytes += chunk.length;
    onProgress?.(reader.rows, bytes, total);
  }
  return reader.finish();
}

/** Numbers for the report; the reader lets nothing non-finite through, and this never prints one either. */
function fmt(x: number): string {
  if (!Number.isFinite(x)) return "(too large to represent)";
  if (x === 0) return "0";
  const a = Math.abs(x);
  return a < 1e-3 || a >= 1e7 ? x.toExponential(4) : x.toPrecision(6).replace(/\.?0+$/, "");
}

function percent(x: number): string {
  if (!Number.isFinite(x)) return "(too large to represent)";
  return `${(100 * x).toFixed(x >= 0.001 ? 2 : 4)} %`;
}

/** The human-readable report. */
export function formatPartReport(file: string, r: PartFileResult): string {
  const kinds = { 1: "maximum principal", 3: "principal", 6: "tensor, principal stresses computed" } as const;
  const tensor = r.columns.tensor;
  const kind =
    tensor === "plane stress"
      ? "2-D tensor, plane stress: szz = syz = szx = 0; principal stresses computed"
      : tensor === "axisymmetric or plane strain"
        ? `2-D tensor, axisymmetric or plane strain: ${r.columns.labels.stress[2]} the hoop or out-of-plane stress, syz = szx = 0; principal stresses computed`
        : r.columns.kind === 3 && r.columns.stress[2] < 0
          ? "principal, two columns: the third principal stress is 0, as in plane stress"
          : kinds[r.columns.kind];
  const shownStress = r.columns.labels.stress.filter((_, k) => r.columns.stress[k] >= 0);
  const stressUnit = r.columns.units.stress;
  const sizeUnit = r.columns.units.size;
  const lines: string[] = [];
  const row = (label: string, text: string) => lines.push(`${label.padEnd(16)}${text}`);
  const header = r.skipped.find((s) => s.reason === "header");
  const others = r.skippedLines - (header ? 1 : 0);
  // A listing's page headers and summary lines are skipped too: not only blanks and comments then.
  const listing = r.skipped.some((s) => s.reason === "repeated header" || s.reason === "page title" || s.reason === "text after the last element");
  row(
    "element table",
    `${file}: ${r.rows} element${r.rows === 1 ? "" : "s"}` +
      (header ? `, header on line ${header.from}` : ", no header") +
      (others > 0 ? `; ${others} ${listing ? "other" : "blank or comment"} line${others === 1 ? "" : "s"} skipped (listed on stderr)` : ""),
  );
  const mark = r.decimalMark === null ? "no decimal mark needed (whole numbers)" : `decimal ${r.decimalMark} (${r.decimalBasis})`;
  row("read as", `${r.encoding}, delimiter "${r.delimiter}", ${mark}${r.threads === 2 ? "; on two threads" : ""}`);
  row(
    "columns",
    `stresses ${shownStress.join(", ")} (${kind}); size ${r.columns.labels.size}` +
      (r.columns.labels.id ? `; id ${r.columns.labels.id}` : "; no id column (elements named by line)"),
  );
  row(
    "units",
    (stressUnit === null && sizeUnit === null
      ? "none written in the header"
      : `stresses ${stressUnit ?? "(not written)"}, sizes ${sizeUnit ?? "(not written)"}, from the header`) +
      ": a material scale and the strengths must be in the table's units",
  );
  if (r.zeroSizes > 0) {
    row("zero sizes", `${r.zeroSizes} element${r.zeroSizes === 1 ? " has size 0 and adds" : "s have size 0 and add"} nothing (sizes printed with too few digits?)`);
  }
  if (r.integrationPoints) row("rows", "integration points (or nodes), each with its own share of the element's size (--integration-points)");
  row("criterion", `${r.criterion}, Weibull modulus ${fmt(r.shape)}`);
  if (r.peak === 0) {
    row("peak stress", "no element is in tension: failure probability 0, effective size undefined");
    return lines.join("\n") + "\n";
  }
  const where = r.peakId !== null ? `element ${r.peakId} (line ${r.peakLine})` : `line ${r.peakLine}`;
  row("peak stress", `${fmt(r.peak)}${stressUnit ? ` ${stressUnit}` : ""} at ${where}`);
  row(
    "effective size",
    `${fmt(r.effectiveSize)} ${sizeUnit ?? `(unit of the size column ${r.columns.labels.size})`}, referenced to uniaxial tension at the peak stress`,
  );
  if (r.failureProbability !== null) {
    row("failure prob.", `${fmt(r.failureProbability)} with material scale sigma_0 (risk of rupture ${fmt(r.risk as number)})`);
  }
  if (r.hotSpots.length > 0) {
    lines.push(`hot spots       the ${r.hotSpots.length} elements with the largest shares of the risk:`);
    lines.push(`  ${"rank".padStart(4)}  ${"element".padStart(12)}  ${"line".padStart(10)}  ${"share".padStart(10)}  ${"cumulative".padStart(10)}  principal stresses; size`);
    let cumulative = 0;
    r.hotSpots.forEach((h, k) => {
      cumulative += h.share;
      lines.push(
        `  ${String(k + 1).padStart(4)}  ${(h.id ?? "-").padStart(12)}  ${String(h.line).padStart(10)}  ${percent(h.share).padStart(10)}  ` +
          `${percent(cumulative).padStart(10)}  ${h.principal.map(fmt).join(", ")}; ${fmt(h.size)}`,
      );
    });
  }
  lines.push("caution         mesh-dependent: refine until the effective size settles; see the README's cautions on size scaling.");
  return lines.join("\n") + "\n";
}

/**
 * The lines that held no element, other than the header (which the report
 * names: its column names are used), as one line for stderr:
 * "skipped lines 4-6 (blank), line 9 (comment)".
 */
export function formatSkipped(r: PartStreamResult): string {
  const runs = r.skipped.filter((s) => s.reason !== "header").sort((a, b) => a.from - b.from);
  const headers = r.skipped.filter((s) => s.reason === "header").length;
  if (r.skippedLines - headers === 0) return "";
  const text = runs.map((s) => (s.from === s.to ? `line ${s.from}` : `lines ${s.from}-${s.to}`) + ` (${s.reason})`);
  const listed = runs.reduce((n, s) => n + s.to - s.from + 1, 0);
  const more = r.skippedLines - headers > listed ? `, and ${r.skippedLines - headers - listed} more` : "";
  return `brittle part: skipped ${text.join(", ")}${more}\n`;
}

/** Runs `brittle part ARGS`; returns the exit status. */
export async function runPartCommand(args: string[], io: PartCommandIo): Promise<number> {
  let parsed: PartArgs;
  try {
    if (args.includes("--help") || args.includes("-h")) {
      io.out(PART_USAGE + "\n");
      return 0;
    }
    parsed = parsePartArgs(args);
  } catch (error) {
    io.err(`brittle part: ${(error as Error).message}\n${PART_USAGE}\n`);
    return 2;
  }
  const tty = io.errIsTTY ?? Boolean(process.stderr.isTTY);
  const started = Date.now();
  let lastReport = started;
  let reported = false;
  const progress = (rows: number, bytes: number, total: number | null) => {
    const now = Date.now();
    if (parsed.quiet || now - lastReport < (tty ? 500 : 10000)) return;
    lastReport = now;
    reported = true;
    const rate = rows / Math.max(1e-3, (now - started) / 1000);
    const share = total ? `  ${((100 * bytes) / total).toFixed(0)} %` : "";
    const text = `brittle part: ${(rows / 1e6).toFixed(1)} M rows${share}  (${(rate / 1e6).toFixed(2)} M rows/s)`;
    io.err(tty ? `\r${text}  ` : `${text}\n`);
  };
  try {
    const result = await streamPartFile(parsed.file, parsed.options, progress);
    if (reported && tty) io.err("\n");
    io.err(formatSkipped(result));
    if (parsed.json) io.out(JSON.stringify(result) + "\n");
    else io.out(formatPartReport(parsed.file, result));
    return 0;
  } catch (error) {
    if (reported && tty) io.err("\n");
    const text = error instanceof InputError ? error.message : error instanceof Error ? error.message.split("\n")[0] : String(error);
    io.err(`brittle part: ${text}\n`);
    return 1;
  }
}
