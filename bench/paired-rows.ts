/**
 * The rows of `npm run bench` that race a fair peer: each row gives both sides the same data,
 * the same warm-up and alternating turns (bench/measure.ts `alternate`), then checks that both
 * computed the same result. In-process rows race the python peers in one warm python process
 * (bench/peers.py serve); command-line rows race whole processes, start-up included.
 */
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { partRiskSum } from "../src/size/part";
import { fitMaximumLikelihood } from "../src/weibull/maximum-likelihood";
import { elementTable, strengthSheet, weibullSample, writeElementCsv, writeFloat64 } from "./datasets";
import { alternate, batch, roundRatios, type Contender, type Outcome, type Turn } from "./measure";
import { timeProcess, type PythonPeers } from "./processes";
import { agreement, type AccuracyRow, type Agreement, type PairedRow } from "./report";

export interface BenchContext {
  /** Temporary directory for the data files; removed after the run. */
  work: string;
  /** null: python3 with numpy, scipy, pyarrow and mpmath is missing, the project runs alone. */
  peers: PythonPeers | null;
  rounds: { short: number; long: number };
  warmUps: number;
  quick: boolean;
  log: (message: string) => void;
}

/** The modulus and characteristic strength, the two figures every fit row compares. */
interface Fit {
  shape: number;
  scale: number;
}

// Same equation, same start, same stopping rule: the two sides differ only by rounding.
const SAME_EQUATION = 1e-9;
// scipy's optimiser stops on its own tolerance, far from the root's last digits.
const GENERIC_OPTIMISER = 1e-4;
// Sums of the same terms in another order (or with compensation on one side only).
const SAME_SUM = 1e-12;

/**
 * The goals of the speed work as ratios (peer time / our time), by row id and peer: at least 10x
 * a numpy Newton solve at n <= 100 and 1x from 10^3 to 10^6, 1000x scipy's generic fit, 4x numpy
 * on the PIA sum, 2x pyarrow + numpy end to end, start-up at most 4x node's, the 1000-line sheet
 * at least as fast as the numpy script.
 */
const GOALS: Record<string, number> = {
  "fit-30 numpy Newton": 10,
  "fit-30 scipy weibull_min.fit": 1000,
  "fit-1000 numpy Newton": 1,
  "fit-1e6 numpy Newton": 1,
  "pia numpy": 4,
  "part pyarrow CSV + numpy": 2,
  "calc-start node -e 0": 0.25,
  "calc-sheet numpy script": 1,
};

const NODE = process.execPath;
const BRITTLE = ["bin/brittle.js"];

function contender<T>(name: string, turn: () => Promise<Turn<T>> | Turn<T>): Contender<T> {
  return { name, turn: async () => turn() };
}

/** Runs the contenders (ours first) and turns the outcomes into a row with a ratio and an agreement per peer. */
async function race<T>(
  ctx: BenchContext,
  row: Omit<PairedRow, "ours" | "peers" | "rounds" | "warmUps">,
  rounds: number,
  contenders: Contender<T>[],
  agree: (ours: T, peer: T, peer_name: string) => Agreement,
): Promise<PairedRow> {
  ctx.log(`${row.path}: ${rounds} rounds of ${contenders.map((c) => c.name).join(" / ")}`);
  const [ours, ...peers] = await alternate(contenders, rounds, ctx.warmUps);
  return {
    ...row,
    rounds,
    warmUps: ctx.warmUps,
    ours: strip(ours),
    peers: peers.map((p) => ({
      peer: p.name,
      goal: GOALS[`${row.id} ${p.name}`],
      timing: strip(p),
      ratio: p.seconds / ours.seconds,
      roundRatios: roundRatios(p.times, ours.times),
      agreement: agree(ours.result, p.result, p.name),
    })),
  };
}

function strip<T>({ seconds, fastest, slowest, times }: Outcome<T>) {
  return { seconds, fastest, slowest, times };
}

/** ML fit rows: ours in process against a numpy Newton solve of the same equation (and scipy's generic fit at n = 30). */
export async function fitRows(ctx: BenchContext, accuracy: AccuracyRow[], sizes: readonly number[]): Promise<PairedRow[]> {
  const rows: PairedRow[] = [];
  for (const n of sizes) {
    const sample = weibullSample(n, n);
    const strengths = Array.from(sample);
    const file = writeFloat64(ctx.work, `fit-${n}.f64`, sample);
    // Enough calls per turn that a turn lasts milliseconds; the same count on both sides.
    const calls = n <= 100 ? 2000 : n <= 10_000 ? 100 : 1;
    const ours = () => {
      const t = batch(calls, () => fitMaximumLikelihood({ strengths }));
      return { seconds: t.seconds, result: { shape: t.result.shape, scale: t.result.scale } };
    };
    const contenders: Contender<Fit>[] = [contender("brittle", ours)];
    const callsPerTurn: Record<string, number> = { brittle: calls };
    const peers = ctx.peers;
    if (peers) {
      contenders.push(contender("numpy Newton", () => peers.ask<Turn<Fit> & Fit>({ task: "fit", file, peer: "newton", batch: calls }).then(asTurn)));
      callsPerTurn["numpy Newton"] = calls;
      if (n === 30) {
        // About 6 ms a call: a few calls per turn keep the row short.
        contenders.push(contender("scipy weibull_min.fit", () => peers.ask<Turn<Fit> & Fit>({ task: "fit", file, peer: "scipy", batch: 5 }).then(asTurn)));
        callsPerTurn["scipy weibull_min.fit"] = 5;
      }
    }
    const row = await race(
      ctx,
      { id: `fit-${n < 1e6 ? n : n.toExponential().replace("+", "")}`, path: `ML fit, n = ${n.toLocaleString("en-US")}`, callsPerTurn, how: "fitMaximumLikelihood in process; peers in one python process" },
      n > 100_000 ? ctx.rounds.long : ctx.rounds.short,
      contenders,
      (a, b, name) => agreement([[a.shape, b.shape], [a.scale, b.scale]], name.startsWith("scipy") ? GENERIC_OPTIMISER : SAME_EQUATION, "m and s_theta"),
    );
    rows.push(row);
    const exact = peers && (await accuracyAgainst40Digits(ctx, peers, sample, file, fitMaximumLikelihood({ strengths }), row));
    if (exact) accuracy.push(exact);
  }
  return rows;
}

function asTurn(reply: { seconds: number; shape: number; scale: number }): Turn<Fit> {
  return { seconds: reply.seconds, result: { shape: reply.shape, scale: reply.scale } };
}

/**
 * The 40-digit solution depends only on the numbers, so it is kept in bench/results/ (git-ignored) under a hash of
 * them: at n = 10^6 mpmath takes minutes, paid once per machine. BENCH_QUICK=1 solves only up to n = 1000.
 */
const DIGITS40_CACHE = join("bench", "results", "digits40.json");

async function accuracyAgainst40Digits(ctx: BenchContext, peers: PythonPeers, sample: Float64Array, file: string, ours: Fit, row: PairedRow): Promise<AccuracyRow | null> {
  const n = sample.length;
  const key = createHash("sha256").update(new Uint8Array(sample.buffer, sample.byteOffset, sample.byteLength)).digest("hex");
  const cache = (existsSync(DIGITS40_CACHE) ? JSON.parse(readFileSync(DIGITS40_CACHE, "utf8")) : {}) as Record<string, Digits40>;
  let exact: Digits40 | undefined = cache[key];
  if (!exact) {
    if (ctx.quick && n > 1000) return null;
    if (n > 1000) ctx.log(`40-digit solution at n = ${n.toLocaleString("en-US")} (minutes, once: kept in ${DIGITS40_CACHE})`);
    const solved = await peers.ask<Omit<Digits40, "date">>({ task: "mpmath", file, startShape: ours.shape });
    exact = { ...solved, date: new Date().toISOString() };
    mkdirSync(dirname(DIGITS40_CACHE), { recursive: true });
    writeFileSync(DIGITS40_CACHE, JSON.stringify({ ...cache, [key]: exact }, null, 2) + "\n");
  }
  const m = Number(exact.shape);
  const s = Number(exact.scale);
  const errors: AccuracyRow["errors"] = { brittle: { shape: Math.abs(ours.shape - m) / m, scale: Math.abs(ours.scale - s) / s } };
  for (const p of row.peers) {
    const fit = await peers.ask<Fit>({ task: "fit", file, peer: p.peer.startsWith("scipy") ? "scipy" : "newton", batch: 1 });
    errors[p.peer] = { shape: Math.abs(fit.shape - m) / m, scale: Math.abs(fit.scale - s) / s };
  }
  return { n, errors, digits40: exact };
}

interface Digits40 {
  shape: string;
  scale: string;
  /** How long mpmath took, and when. */
  seconds: number;
  date: string;
}

/** The PIA element sum over 2^20 elements x 3 principal stresses at m = 10, in process, against numpy. */
export async function piaRow(ctx: BenchContext): Promise<PairedRow> {
  const { principal, sizes } = elementTable(2 ** 20, 7);
  const shape = 10;
  const contenders: Contender<number>[] = [
    contender("brittle", () => batch(1, () => partRiskSum({ principal, stride: 3, sizes, shape, criterion: "PIA" }).effectiveSize)),
  ];
  const peers = ctx.peers;
  if (peers) {
    const request = { task: "pia", principal: writeFloat64(ctx.work, "principal.f64", principal), sizes: writeFloat64(ctx.work, "sizes.f64", sizes), shape, batch: 1 };
    contenders.push(contender("numpy", () => peers.ask<{ seconds: number; effectiveSize: number }>(request).then((r) => ({ seconds: r.seconds, result: r.effectiveSize }))));
  }
  return race(
    ctx,
    { id: "pia", path: "PIA sum, 2^20 x 3, m = 10", callsPerTurn: { brittle: 1, numpy: 1 }, how: "partRiskSum in process; numpy in one python process" },
    ctx.rounds.short,
    contenders,
    (a, b) => agreement([[a, b]], SAME_SUM, "effective size"),
  );
}

const PART_ROWS = 2_000_000;

/** `brittle part` on 2e6 rows of full doubles, as a process, against pyarrow's CSV reader + numpy, as a process. */
export async function partRow(ctx: BenchContext): Promise<PairedRow> {
  const { principal, sizes } = elementTable(PART_ROWS, 11);
  const file = join(ctx.work, "elements-2e6.csv");
  const bytes = writeElementCsv(file, principal, sizes);
  const shape = "10";
  interface Part {
    effectiveSize: number;
    peak: number;
    rows: number;
  }
  const read = (t: Turn<string>): Turn<Part> => {
    const parsed = JSON.parse(t.result) as Part;
    return { seconds: t.seconds, result: { effectiveSize: parsed.effectiveSize, peak: parsed.peak, rows: parsed.rows } };
  };
  const contenders: Contender<Part>[] = [contender("brittle", () => timeProcess(NODE, [...BRITTLE, "part", file, "--modulus", shape, "--json", "--quiet"]).then(read))];
  if (ctx.peers) contenders.push(contender("pyarrow CSV + numpy", () => timeProcess("python3", ["bench/peer_part.py", file, shape]).then(read)));
  return race(
    ctx,
    {
      id: "part",
      path: `brittle part, 2e6 rows (${(bytes / 1e6).toFixed(0)} MB), full doubles`,
      callsPerTurn: { brittle: 1, "pyarrow CSV + numpy": 1 },
      how: "whole processes, start-up included: node bin/brittle.js part FILE --modulus 10 --json --quiet; python3 bench/peer_part.py FILE 10",
    },
    ctx.rounds.long,
    contenders,
    (a, b) => {
      const result = agreement([[a.effectiveSize, b.effectiveSize], [a.peak, b.peak]], SAME_SUM, "effective size and peak stress");
      return a.rows === b.rows ? result : { ...result, ok: false, compared: `${result.compared}; rows read ${a.rows} against ${b.rows}` };
    },
  );
}

/** The modulus of every line of `brittle calc --json` output for a strength sheet (sheet name from the file name). */
function calcValues(stdout: string): unknown[][] {
  const sheets = JSON.parse(stdout) as Record<string, unknown[][]>;
  return Object.values(sheets)[0].slice(1);
}

/** `brittle calc` on a one-formula CSV against `node -e 0`: what start-up costs above the bare runtime. */
export async function calcStartRow(ctx: BenchContext): Promise<PairedRow> {
  const set = Float64Array.from(weibullSample(30, 3030), (x) => Number(x.toFixed(1)));
  const file = join(ctx.work, "one-formula.csv");
  writeFileSync(file, strengthSheet([set], ["modulus"]));
  // The peer computes nothing, so the agreement is with a numpy Newton solve of the same strengths.
  let reference: Fit | null = null;
  if (ctx.peers) reference = await ctx.peers.ask<Fit>({ task: "fit", file: writeFloat64(ctx.work, "one-formula.f64", set), peer: "newton", batch: 1 });
  const contenders: Contender<number>[] = [
    contender("brittle", () => timeProcess(NODE, [...BRITTLE, "calc", file, "--json"]).then((t) => ({ seconds: t.seconds, result: Number(calcValues(t.result)[0][30]) }))),
    contender("node -e 0", () => timeProcess(NODE, ["-e", "0"]).then((t) => ({ seconds: t.seconds, result: NaN }))),
  ];
  return race(
    ctx,
    { id: "calc-start", path: "brittle calc, one formula", callsPerTurn: { brittle: 1, "node -e 0": 1 }, how: "whole processes: node bin/brittle.js calc FILE --json; node -e 0" },
    ctx.rounds.short,
    contenders,
    (ours) => (reference ? agreement([[ours, reference.shape]], SAME_EQUATION, "m against numpy Newton") : { ok: null, compared: "no python peer" }),
  );
}

const SHEET_LINES = 1000;
const SHEET_SPECIMENS = 30;

/** `brittle calc` on 1000 lines x 30 strengths with two formulas a line, against a numpy script doing the 1000 fits. */
export async function calcSheetRow(ctx: BenchContext): Promise<PairedRow> {
  const sets = Array.from({ length: SHEET_LINES }, (_, i) => weibullSample(SHEET_SPECIMENS, 5000 + i));
  const file = join(ctx.work, "strength-sheet.csv");
  writeFileSync(file, strengthSheet(sets, ["modulus", "charstrength"]));
  const contenders: Contender<number[][]>[] = [
    contender("brittle", () =>
      timeProcess(NODE, [...BRITTLE, "calc", file, "--json"]).then((t) => ({
        seconds: t.seconds,
        result: calcValues(t.result).map((line) => [Number(line[SHEET_SPECIMENS]), Number(line[SHEET_SPECIMENS + 1])]),
      })),
    ),
  ];
  if (ctx.peers) {
    contenders.push(contender("numpy script", () => timeProcess("python3", ["bench/peer_rows.py", file, String(SHEET_SPECIMENS)]).then((t) => ({ seconds: t.seconds, result: JSON.parse(t.result) as number[][] }))));
  }
  return race(
    ctx,
    {
      id: "calc-sheet",
      path: `brittle calc, ${SHEET_LINES} x ${SHEET_SPECIMENS} (${2 * SHEET_LINES} fits)`,
      callsPerTurn: { brittle: 1, "numpy script": 1 },
      how: "whole processes: node bin/brittle.js calc FILE --json; python3 bench/peer_rows.py FILE 30",
    },
    ctx.rounds.long,
    contenders,
    (a, b) => {
      if (a.length !== b.length) return { ok: false, compared: `lines: ${a.length} against ${b.length}` };
      return agreement(a.flatMap((line, i) => [[line[0], b[i][0]] as const, [line[1], b[i][1]] as const]), SAME_EQUATION, "m and s_theta of every line");
    },
  );
}
