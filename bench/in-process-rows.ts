/**
 * Paired rows of `npm run bench` run inside this process: the ML fit and the PIA element sum,
 * against the python peers in one warm python process (bench/peers.py serve), and the fit's
 * accuracy against a 40-digit solution.
 */
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { partRiskSum } from "../src/size/part";
import { fitMaximumLikelihood } from "../src/weibull/maximum-likelihood";
import { elementTable, weibullSample, writeFloat64 } from "./datasets";
import { batch, lasting, type Contender, type Turn } from "./measure";
import type { PythonPeers } from "./processes";
import { GENERIC_OPTIMISER, race, SAME_EQUATION, SAME_SUM, type BenchContext, type Fit } from "./race";
import { agreement, type AccuracyRow, type PairedRow } from "./report";

/**
 * Length of one turn of the in-process rows, on every side: long against the scheduler's time slice, so a
 * turn sees the machine's average load, short enough for 15 rounds in seconds.
 */
const TURN = 0.1;

/** ML fit rows: ours in process against a numpy Newton solve of the same equation (and scipy's generic fit at n = 30). */
export async function fitRows(ctx: BenchContext, accuracy: AccuracyRow[], sizes: readonly number[]): Promise<PairedRow[]> {
  const rows: PairedRow[] = [];
  for (const n of sizes) {
    const sample = weibullSample(n, n);
    const strengths = Array.from(sample);
    const file = writeFloat64(ctx.work, `fit-${n}.f64`, sample);
    // The same first turn on every side (the warm-up), then turns of about TURN seconds.
    const first = n <= 100 ? 200 : n <= 10_000 ? 20 : 1;
    const contenders: Contender<Fit>[] = [
      lasting("brittle", TURN, first, async (calls) => {
        const t = batch(calls, () => fitMaximumLikelihood({ strengths }));
        return { seconds: t.seconds, result: { shape: t.result.shape, scale: t.result.scale } };
      }),
    ];
    const peers = ctx.peers;
    if (peers) {
      contenders.push(lasting("numpy Newton", TURN, first, (calls) => peers.ask<Turn<Fit> & Fit>({ task: "fit", file, peer: "newton", batch: calls }).then(asTurn)));
      // About 6 ms a call: the second column at n = 30 only, where the issue sets its goal.
      if (n === 30) contenders.push(lasting("scipy weibull_min.fit", TURN, 5, (calls) => peers.ask<Turn<Fit> & Fit>({ task: "fit", file, peer: "scipy", batch: calls }).then(asTurn)));
    }
    const row = await race(
      ctx,
      { id: `fit-${n < 1e6 ? n : n.toExponential().replace("+", "")}`, path: `ML fit, n = ${n.toLocaleString("en-US")}`, how: "fitMaximumLikelihood in process; peers in one python process" },
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
  // Turns of about TURN seconds on both sides, like the fit rows (one call, 15-80 ms, is a short turn on a shared machine).
  const contenders: Contender<number>[] = [
    lasting("brittle", TURN, 1, async (calls) => batch(calls, () => partRiskSum({ principal, stride: 3, sizes, shape, criterion: "PIA" }).effectiveSize)),
  ];
  const peers = ctx.peers;
  if (peers) {
    const request = { task: "pia", principal: writeFloat64(ctx.work, "principal.f64", principal), sizes: writeFloat64(ctx.work, "sizes.f64", sizes), shape };
    contenders.push(
      lasting("numpy", TURN, 1, (calls) =>
        peers.ask<{ seconds: number; effectiveSize: number }>({ ...request, batch: calls }).then((r) => ({ seconds: r.seconds, result: r.effectiveSize })),
      ),
    );
  }
  return race(
    ctx,
    { id: "pia", path: "PIA sum, 2^20 x 3, m = 10", how: "partRiskSum in process; numpy in one python process" },
    ctx.rounds.short,
    contenders,
    (a, b) => agreement([[a, b]], SAME_SUM, "effective size"),
  );
}
