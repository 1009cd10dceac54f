/**
 * `npm run bench`: speed and accuracy figures, side by side with the tools an
 * engineer would otherwise use (scipy.stats.weibull_min.fit with the location
 * fixed at 0, a numpy element sum) in the same run, and the accuracy of both
 * fits against a 40-digit mpmath solution. Medians of several runs; nothing
 * here is asserted. BENCH_QUICK=1 skips the 40-digit solve at a million
 * specimens (about a minute) and the full-column workbook (about 2 GB).
 * BENCH_ONLY=fit,pia runs only the sections whose names contain one of those
 * words; BENCH_ROUNDS=N times every short task N times, long ones at most 3 (after
 * one warm-up, on both sides).
 * Each run also writes a JSON record to bench/results/ (git-ignored).
 */
import { spawnSync } from "node:child_process";
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { cpus, tmpdir } from "node:os";
import { join } from "node:path";
import { HyperFormula } from "hyperformula";
import { createEngine, LICENSE_KEY, registerFunctions } from "../cli/engine";
import { evaluateWorkbook } from "../cli/evaluate-workbook";
import { generateMetadata } from "../functions/metadata";
import { guarded } from "../functions/registry";
import { loadWorkbook } from "../cli/workbook-io";
import { runDemo, DEMO_INPUT } from "../examples/demo";
import { partRiskSum } from "../src/size/part";
import { readPartTable } from "../src/size/part-stream";
import { parameterBounds } from "../src/weibull/confidence-bounds";
import { fitMaximumLikelihood } from "../src/weibull/maximum-likelihood";
import { elementCsv, elementTable, weibullSample, writeFloat64 } from "./datasets";
import { formatSeconds, median } from "./measure";

const QUICK = process.env.BENCH_QUICK === "1";
const SIZES = [30, 1000, 1_000_000];
const ROUNDS = Number(process.env.BENCH_ROUNDS) > 0 ? Math.floor(Number(process.env.BENCH_ROUNDS)) : 0;
// Tasks of a second or more (n = 10^6, scipy's generic fit there) run at most 3 times.
const RUNS = ROUNDS ? { small: ROUNDS, large: Math.min(ROUNDS, 3) } : { small: 7, large: 3 };
const ONLY = (process.env.BENCH_ONLY ?? "").split(",").map((w) => w.trim()).filter(Boolean);
const ELEMENTS = 2 ** 20;
const FULL_COLUMN = 1_048_576;

interface Row {
  task: string;
  ours: string;
  /** Fastest-slowest of our runs. */
  spread?: string;
  peer?: string;
  ratio?: string;
  note?: string;
}
const rows: Row[] = [];
const notes: string[] = [];

/** Machine-readable figures for the JSON record (seconds; ratio = peer / ours). */
const record: { task: string; seconds: number; fastest: number; slowest: number; peers: Record<string, { seconds: number; fastest?: number; slowest?: number; ratio: number }> }[] = [];

function spreadOf(t: { fastest: number; slowest: number }): string {
  return `${formatSeconds(t.fastest)}-${formatSeconds(t.slowest)}`;
}

async function section(name: string, body: () => Promise<void>): Promise<void> {
  if (ONLY.length && name !== "python peers" && !ONLY.some((w) => name.includes(w))) return;
  process.stderr.write(`bench: ${name}...\n`);
  try {
    await body();
  } catch (error) {
    rows.push({ task: name, ours: "error", note: error instanceof Error ? error.message.split("\n")[0] : String(error) });
  }
}

const work = mkdtempSync(join(tmpdir(), "brittle-bench-"));
const samples = new Map(SIZES.map((n) => [n, weibullSample(n, n)]));
const ourFits = new Map<number, { seconds: number; fastest: number; slowest: number; shape: number; scale: number; converged: boolean }>();

await section("maximum-likelihood fit", async () => {
  for (const n of SIZES) {
    const strengths = Array.from(samples.get(n)!);
    const t = await median(n < 100_000 ? RUNS.small : RUNS.large, () => fitMaximumLikelihood({ strengths }));
    ourFits.set(n, { seconds: t.seconds, fastest: t.fastest, slowest: t.slowest, shape: t.result.shape, scale: t.result.scale, converged: t.result.converged });
    rows.push({ task: `ML fit, n = ${n.toLocaleString("en-US")}`, ours: formatSeconds(t.seconds), spread: spreadOf(t), note: `${t.result.iterations} iterations, converged ${t.result.converged}` });
  }
  const column = Array.from(samples.get(1000)!, (x) => [x]);
  const cell = await median(RUNS.small, () => guarded.MODULUS(column, null, "MLE-RAW"));
  rows.push({ task: "MODULUS cell (guarded adapter), n = 1,000", ours: formatSeconds(cell.seconds), note: "range reading + fit" });
});

await section("confidence bounds", async () => {
  for (const n of SIZES) {
    const strengths = Array.from(samples.get(n)!);
    const t = await median(n < 100_000 ? RUNS.small : RUNS.large, () => parameterBounds({ strengths, confidence: 0.9 }));
    rows.push({ task: `bounds on m and s_theta (90 %), n = ${n.toLocaleString("en-US")}`, ours: formatSeconds(t.seconds), note: `pivotal ${t.result.source.kind}` });
  }
  // Simulations keep their results for the same data: every run gets a new sample, as a new data set would.
  let seed = 100;
  const fresh = () => Array.from(weibullSample(30, seed++));
  const censoredFlags = Array.from({ length: 30 }, (_, i) => i % 5 === 0);
  const c = await median(5, () => parameterBounds({ strengths: fresh(), censored: censoredFlags, confidence: 0.9 }));
  rows.push({ task: "bounds, n = 30 with 6 censored", ours: formatSeconds(c.seconds), note: `pivotal ${c.result.source.kind}${c.result.source.replications ? `, ${c.result.source.replications} replications` : ""}` });
  // The single-population checks simulate once per sample size and censoring pattern, then reuse it.
  const first = await median(1, () => guarded.FIT(Array.from(weibullSample(31, 31), (x) => [x])), false);
  rows.push({ task: "FIT table cell, first call at n = 31", ours: formatSeconds(first.seconds), note: "bounds, A*, simulated single-population checks" });
  const fit = await median(5, () => guarded.FIT(fresh().map((x) => [x])));
  rows.push({ task: "FIT table cell, n = 30, new data each run", ours: formatSeconds(fit.seconds), note: "simulation reused for the same n" });
  const cm = await median(5, () => guarded.MODULUS(fresh().map((x) => [x]), censoredFlags.map((f) => [f])));
  rows.push({ task: "MODULUS cell, n = 30 with 6 censored (default MLE)", ours: formatSeconds(cm.seconds), note: "simulated unbiasing factor" });
});

const { principal, sizes } = elementTable(ELEMENTS, 7);
let ourPia: { seconds: number; fastest: number; slowest: number; effectiveSize: number } | null = null;
await section("element sums (pia)", async () => {
  const t = await median(ROUNDS ? RUNS.large : 5, () => partRiskSum({ principal, stride: 3, sizes, shape: 10, criterion: "PIA" }));
  ourPia = { seconds: t.seconds, fastest: t.fastest, slowest: t.slowest, effectiveSize: t.result.effectiveSize };
  rows.push({ task: `PIA element sum, 2^20 elements x 3 principal`, ours: formatSeconds(t.seconds), spread: spreadOf(t), note: `${((ELEMENTS / t.seconds) / 1e6).toFixed(1)} M elements/s` });
});

const csvChunks = elementCsv(principal, sizes);
const csvBytes = csvChunks.reduce((a, c) => a + c.length, 0);
let ourStream: { seconds: number; effectiveSize: number } | null = null;
await section("element-table streaming", async () => {
  const t = await median(3, () => readPartTable(csvChunks, { shape: 10 }));
  ourStream = { seconds: t.seconds, effectiveSize: t.result.effectiveSize };
  const rate = (s: number) => `${(ELEMENTS / s / 1e6).toFixed(1)} M rows/s`;
  rows.push({ task: `stream a 2^20-row element CSV (${(csvBytes / 1e6).toFixed(0)} MB, full doubles)`, ours: formatSeconds(t.seconds), note: `${rate(t.seconds)}, ${(csvBytes / 1e6 / t.seconds).toFixed(0)} MB/s, parse + PIA sum` });
  // The same table as post-processors write it: 7 significant digits, exponent form.
  const typical = elementCsv(principal, sizes, 7);
  const typicalBytes = typical.reduce((a, c) => a + c.length, 0);
  const u = await median(3, () => readPartTable(typical, { shape: 10 }));
  rows.push({ task: `stream the same table, 7 significant digits (${(typicalBytes / 1e6).toFixed(0)} MB)`, ours: formatSeconds(u.seconds), note: `${rate(u.seconds)}, ${(typicalBytes / 1e6 / u.seconds).toFixed(0)} MB/s, parse + PIA sum` });
});

await section("demo workbook", async () => {
  const quiet = { out: () => {}, err: () => {} };
  const demo = await median(3, () => runDemo(quiet));
  rows.push({ task: "demo workbook end to end (load, metadata, write)", ours: formatSeconds(demo.seconds), note: DEMO_INPUT });
  const { functions } = await generateMetadata();
  const workbook = await loadWorkbook(DEMO_INPUT);
  const evaluate = await median(5, () => evaluateWorkbook(structuredClone(workbook), functions));
  rows.push({ task: "demo workbook, evaluation only", ours: formatSeconds(evaluate.seconds), note: `${evaluate.result.formulas.length} formulas` });
});

await section("full column", async () => {
  if (QUICK) {
    notes.push("full column skipped (BENCH_QUICK=1)");
    return;
  }
  const { functions } = await generateMetadata();
  const data: unknown[][] = Array.from({ length: FULL_COLUMN }, (_, i) => [200 + ((i * 7919) % 2003) / 10]);
  data[0].push('=BRITTLE.MODULUS(A:A, , "MLE-RAW")');
  let start = performance.now();
  try {
    const engine = createEngine({ Column: data }, functions);
    const value = engine.getCellValue({ sheet: 0, row: 0, col: 1 });
    rows.push({ task: "1,048,576 rows through MODULUS (engine, 1 run)", ours: formatSeconds((performance.now() - start) / 1000), note: `m = ${String(value)}` });
    return;
  } catch (error) {
    rows.push({ task: "1,048,576 rows through MODULUS via createEngine", ours: "error", note: `${(error as Error).message} (engine.ts sets no maxRows)` });
  }
  // What the engine does once its sheet limit is raised: the same registration and options plus maxRows.
  registerFunctions(functions);
  start = performance.now();
  const engine = HyperFormula.buildFromSheets({ Column: data } as never, { licenseKey: LICENSE_KEY, useArrayArithmetic: false, smartRounding: false, precisionRounding: 0, maxRows: FULL_COLUMN } as never);
  const value = engine.getCellValue({ sheet: 0, row: 0, col: 1 });
  const seconds = (performance.now() - start) / 1000;
  const heap = process.memoryUsage().rss / 1e9;
  rows.push({ task: "1,048,576 rows, MODULUS, engine + maxRows (1 run)", ours: formatSeconds(seconds), note: `m = ${typeof value === "number" ? value.toPrecision(10) : String(value)}; RSS ${heap.toFixed(1)} GB` });
  engine.destroy();
});

// ---------------------------------------------------------------------------
// Peers, in the same run, on the same numbers

interface PeerTiming {
  seconds: number;
  fastest: number;
  slowest: number;
}
interface PeerFit extends PeerTiming {
  n: number;
  /** numpy Newton on the same ML equation: the fair peer. */
  newton?: PeerTiming & { shape: number; scale: number };
  shape: number;
  scale: number;
  mpmathShape?: string;
  mpmathScale?: string;
  mpmathSeconds?: number;
}
interface Peers {
  versions: Record<string, string>;
  fits: PeerFit[];
  pia?: PeerTiming & { effectiveSize: number; peak: number };
  csv?: { seconds: number; effectiveSize: number };
}

let peers: Peers | null = null;
await section("python peers", async () => {
  const probe = spawnSync("python3", ["-c", "import scipy, numpy, mpmath"], { encoding: "utf8" });
  if (probe.error || probe.status !== 0) {
    notes.push(`python peers skipped: python3 with scipy, numpy and mpmath is not available (${probe.error?.message ?? probe.stderr.trim().split("\n").pop()})`);
    return;
  }
  const spec = {
    fits: SIZES.map((n) => ({ n, file: writeFloat64(work, `fit-${n}.f64`, samples.get(n)!), startShape: ourFits.get(n)?.shape ?? 10 })),
    // Only the peers of the sections that ran (BENCH_ONLY).
    pia: ourPia ? { principal: writeFloat64(work, "principal.f64", principal), sizes: writeFloat64(work, "sizes.f64", sizes), shape: 10 } : undefined,
    csv: ourStream ? { file: "elements.csv", shape: 10 } : undefined,
    runs: RUNS,
    mpmathMaxN: QUICK ? 1000 : 1_000_000,
  };
  if (ourStream) writeFileSync(join(work, "elements.csv"), Buffer.concat(csvChunks));
  writeFileSync(join(work, "spec.json"), JSON.stringify(spec));
  process.stderr.write("bench: python3 bench/peers.py (scipy, numpy; mpmath at 40 digits takes about a minute at n = 10^6)...\n");
  const run = spawnSync("python3", ["bench/peers.py", work], { encoding: "utf8", maxBuffer: 1 << 26 });
  if (run.status !== 0) throw new Error(`bench/peers.py failed: ${run.stderr.trim().split("\n").pop()}`);
  peers = JSON.parse(run.stdout) as Peers;
});

rmSync(work, { recursive: true, force: true });

// ---------------------------------------------------------------------------
// Report

const p = peers as Peers | null;
if (p) {
  for (const fit of p.fits) {
    const ours = ourFits.get(fit.n);
    const row = rows.find((r) => r.task === `ML fit, n = ${fit.n.toLocaleString("en-US")}`);
    if (row && ours) {
      const peersOfRow: Record<string, { seconds: number; fastest: number; slowest: number; ratio: number }> = {};
      if (fit.newton) {
        const ratio = fit.newton.seconds / ours.seconds;
        row.peer = `${formatSeconds(fit.newton.seconds)} numpy Newton (${spreadOf(fit.newton)})`;
        row.ratio = `${ratio.toFixed(2)}x`;
        row.note += `; m agrees with numpy to ${relative(ours.shape, fit.newton.shape).toExponential(1)}`;
        peersOfRow["numpy Newton"] = { ...pick(fit.newton), ratio };
      }
      const scipyRatio = fit.seconds / ours.seconds;
      row.note += `; scipy weibull_min.fit ${formatSeconds(fit.seconds)} (${spreadOf(fit)}), ratio ${scipyRatio.toFixed(1)}x, m agrees to ${relative(ours.shape, fit.shape).toExponential(1)}`;
      peersOfRow["scipy weibull_min.fit"] = { ...pick(fit), ratio: scipyRatio };
      record.push({ task: row.task, ...pick(ours), peers: peersOfRow });
    }
  }
  const piaRow = rows.find((r) => r.task.startsWith("PIA element sum"));
  const pia = ourPia as { seconds: number; fastest: number; slowest: number; effectiveSize: number } | null;
  if (p.pia && piaRow && pia) {
    piaRow.peer = `${formatSeconds(p.pia.seconds)} numpy (${spreadOf(p.pia)})`;
    piaRow.ratio = `${(p.pia.seconds / pia.seconds).toFixed(1)}x`;
    record.push({ task: piaRow.task, ...pick(pia), peers: { numpy: { ...pick(p.pia), ratio: p.pia.seconds / pia.seconds } } });
    piaRow.note += `; effective size agrees to ${relative(pia.effectiveSize, p.pia.effectiveSize).toExponential(1)}`;
  }
  const streamRow = rows.find((r) => r.task.startsWith("stream a 2^20-row"));
  const stream = ourStream as { seconds: number; effectiveSize: number } | null;
  if (p.csv && streamRow && stream) {
    streamRow.peer = `${formatSeconds(p.csv.seconds)} numpy.loadtxt (1 run)`;
    streamRow.ratio = `${(p.csv.seconds / stream.seconds).toFixed(1)}x`;
    streamRow.note += `; agrees to ${relative(stream.effectiveSize, p.csv.effectiveSize).toExponential(1)}`;
  }
}

function pick(t: { seconds: number; fastest: number; slowest: number }) {
  return { seconds: t.seconds, fastest: t.fastest, slowest: t.slowest };
}

function relative(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

const widths = [50, 10, 20, 42, 7];
const line = (cells: string[]) => cells.map((c, i) => (i < widths.length ? c.padEnd(widths[i]) : c)).join("  ");
const out: string[] = [];
out.push(`Speed (median of ${ROUNDS ? `${RUNS.small} (long tasks ${RUNS.large})` : "several"} runs after one warm-up on both sides, spread = fastest-slowest; ratio = peer time / our time, > 1 means we are faster)`);
out.push(line(["task", "ours", "spread", "peer (spread)", "ratio", "notes"]));
out.push(line(["-".repeat(widths[0]), "-".repeat(widths[1]), "-".repeat(widths[2]), "-".repeat(widths[3]), "-".repeat(widths[4]), "-----"]));
for (const r of rows) out.push(line([r.task, r.ours, r.spread ?? "", r.peer ?? "", r.ratio ?? "", r.note ?? ""]));

if (p) {
  out.push("");
  out.push("Accuracy of the ML fit against a 40-digit mpmath solution of the likelihood equations (relative error)");
  const accuracy = (cells: string[]) => cells.map((c, i) => (i < 5 ? c.padEnd(14) : c)).join("  ");
  out.push(accuracy(["n", "ours: m", "scipy: m", "ours: s_theta", "scipy: s_theta", "notes"]));
  for (const fit of p.fits) {
    const ours = ourFits.get(fit.n);
    if (!fit.mpmathShape || !ours) {
      out.push(accuracy([`${fit.n.toLocaleString("en-US")}`, "", "", "", "", "no 40-digit solution (BENCH_QUICK=1)"]));
      continue;
    }
    const m = Number(fit.mpmathShape);
    const s = Number(fit.mpmathScale);
    const err = (a: number, b: number) => relative(a, b).toExponential(1);
    out.push(accuracy([`${fit.n.toLocaleString("en-US")}`, err(ours.shape, m), err(fit.shape, m), err(ours.scale, s), err(fit.scale, s), `m = ${fit.mpmathShape.slice(0, 24)}, mpmath ${fit.mpmathSeconds?.toFixed(1)} s`]));
  }
  out.push("");
  out.push(`Peers: python ${p.versions.python}, numpy ${p.versions.numpy}, scipy ${p.versions.scipy}, mpmath ${p.versions.mpmath} (backend ${p.versions.mpmathBackend}); node ${process.versions.node}.`);
}
for (const n of notes) out.push(n);
out.push("Data: seeded and invented (modulus 10, characteristic strength 400; an invented element table). Figures depend on the machine.");
process.stdout.write(out.join("\n") + "\n");

// The JSON record: when, where, how many rounds, and every figure above with its peers.
const stamp = new Date().toISOString();
const results = join("bench", "results");
mkdirSync(results, { recursive: true });
const recordFile = join(results, `bench-${stamp.replace(/[:.]/g, "-")}.json`);
writeFileSync(
  recordFile,
  JSON.stringify(
    {
      date: stamp,
      machine: { cpus: cpus().length, model: cpus()[0]?.model ?? "unknown", platform: process.platform, arch: process.arch, node: process.versions.node },
      peerVersions: p?.versions ?? null,
      rounds: RUNS,
      only: ONLY,
      quick: QUICK,
      figures: record,
      table: rows,
      notes,
    },
    null,
    2,
  ) + "\n",
);
process.stderr.write(`bench: record written to ${recordFile}\n`);
