/**
 * Does a production lot come from the same strength distribution as the
 * qualification baseline? Likelihood-ratio test of equal Weibull modulus and
 * characteristic strength (Lawless 1982, ch. 4, tests for comparing Weibull
 * samples):
 *
 *   LR = 2 [l(m1, th1; lot) + l(m2, th2; baseline) - l(m0, th0; both pooled)]
 *
 * each l the maximised log-likelihood of a complete sample. For large samples
 * LR follows chi-square with 2 degrees of freedom (p = exp(-LR/2)); lots are
 * small, so the p-value reported is calibrated by a seeded simulation under
 * the null hypothesis instead: LR is free of the common m and th, so samples
 * of the two sizes are drawn at m = th = 1. Seeded by the two sizes, so the
 * same data always give the same p-value. The chi-square value is kept for
 * comparison.
 *
 * One simulated reference per pair of sizes serves every user with those
 * sizes, so its Monte Carlo error is shared by all of them rather than
 * averaging out: it is drawn from LOT_REPLICATIONS = 40,000 samples (a
 * p-value near 0.01 is then good to about +-0.0005), cached per size pair,
 * and its binomial standard error sqrt(p (1 - p) / R) is reported with it.
 */
import { ensureConverged, ensureProbability } from "../errors";
import { SeededRandom } from "../numeric/random";
import { replicationsPerSlice, simulate } from "../numeric/replication-slices";
import { fitMaximumLikelihood } from "./maximum-likelihood";
import { patternSeed } from "./pivotal-simulation";
import { requireSimulationSize } from "./simulation-limits";
import { checkSample } from "./sample";
import { pValueText, roundForText } from "./verdict-text";

export const LOT_REPLICATIONS = 40000;
const SALT = 0x10c7c4ec;

export interface LotComparison {
  statistic: number;
  /** Monte Carlo p-value (the one the verdict uses). */
  pValue: number;
  /** Binomial standard error of pValue from the finite simulation, sqrt(p (1 - p) / replications). */
  pValueStandardError: number;
  /** Large-sample chi-square(2) p-value, exp(-LR/2), for comparison. */
  chiSquarePValue: number;
  differs: boolean;
  lot: { shape: number; scale: number; specimens: number };
  baseline: { shape: number; scale: number; specimens: number };
  verdict: string;
  replications: number;
}

/**
 * Stop once a step is below this share of m. Halley's error after a step s is of order s^3 (Newton's,
 * in pivotal-simulation.ts, s^2 with its 1e-4), so the root is good to about 1e-8 here too.
 */
const STEP_TOLERANCE = 2e-3;
const MAX_ITERATIONS = 100;

/**
 * ML modulus of a complete sample from z_i = y_i - max y (all <= 0): the root of
 * g(m) = sum(z w)/sum(w) - mean(z) - 1/m, w = e^(m z), by Halley's method inside a bracket, started at
 * `start` (or the moment estimate). Why not the shared Newton solve: each iteration costs one
 * exponential per specimen, the whole cost of the check, and Halley's step (the third weighted
 * cumulant comes free with the sums) converges cubically, so the same stopping rule is met one
 * iteration sooner in most samples; the root agrees with the Newton one to its 1e-8 accuracy, and the
 * maximised log-likelihood, stationary there, far closer. Returns m, or NaN without a root.
 */
function completeShape(z: Float64Array, n: number, mean: number, start: number, fit: { weightSum: number }): number {
  if (!(mean < 0)) return NaN;
  // g(m) <= -mean - 1/m, so g < 0 below 1/(-mean): a valid lower end.
  let lo = 1 / -mean;
  let hi = Infinity;
  let m = start;
  if (!(m > lo)) {
    let ss = 0;
    for (let i = 0; i < n; i++) ss += (z[i] - mean) ** 2;
    m = Math.max(Math.PI / Math.sqrt(6) / Math.sqrt(ss / Math.max(n - 1, 1)), lo);
    if (!Number.isFinite(m)) m = 2 * lo;
  }
  for (let it = 0; it < MAX_ITERATIONS; it++) {
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let i = 0; i < n; i++) {
      const w = Math.exp(m * z[i]);
      const wz = w * z[i];
      s0 += w;
      s1 += wz;
      s2 += wz * z[i];
      s3 += wz * z[i] * z[i];
    }
    const a = s1 / s0;
    const variance = Math.max(s2 / s0 - a * a, 0);
    const g = a - mean - 1 / m;
    if (g < 0) lo = Math.max(lo, m);
    else hi = Math.min(hi, m);
    const slope = variance + 1 / (m * m);
    const skew = s3 / s0 - 3 * a * variance - a * a * a;
    const bend = skew - 2 / (m * m * m);
    const denominator = 2 * slope * slope - g * bend;
    // Halley where its denominator keeps the Newton direction, else Newton.
    const step = denominator > slope * slope ? (-2 * g * slope) / denominator : -g / slope;
    let next = m + step;
    if (Math.abs(step) <= STEP_TOLERANCE * m || g === 0) {
      // sum(w) carried to the new root by its Taylor series (d ln s0/dm = a, then the variance and third cumulant).
      fit.weightSum = s0 * Math.exp(step * (a + step * (0.5 * variance + (step / 6) * skew)));
      return next;
    }
    if (!(next > lo && next < hi)) next = Number.isFinite(hi) ? 0.5 * (lo + hi) : 2 * m;
    m = next;
  }
  return NaN;
}

/**
 * Maximised log-likelihood of a complete sample from its logs: n ln m - n m ln th + (m - 1) sum y - n.
 * `start` a first guess at m (NaN: none); the fitted m is left in fit.shape.
 */
function maxLogLikelihood(y: Float64Array, from: number, to: number, z: Float64Array, start: number, fit: LotFit): number {
  const n = to - from;
  let max = -Infinity;
  let sum = 0;
  for (let i = from; i < to; i++) {
    max = Math.max(max, y[i]);
    sum += y[i];
  }
  let zSum = 0;
  for (let i = 0; i < n; i++) {
    z[i] = y[from + i] - max;
    zSum += z[i];
  }
  const m = completeShape(z, n, zSum / n, start, fit);
  fit.shape = m;
  if (!(m > 0)) return NaN;
  const logScale = max + Math.log(fit.weightSum / n) / m;
  return n * Math.log(m) - n * m * logScale + (m - 1) * sum - n;
}

interface LotFit {
  shape: number;
  weightSum: number;
}

function observedLogLikelihood(strengths: readonly number[], shift: number): number {
  const fit = fitMaximumLikelihood({ strengths });
  ensureConverged(fit.converged, "the maximum-likelihood fit did not converge");
  const n = strengths.length;
  let sum = 0;
  for (const s of strengths) sum += Math.log(s) - shift;
  const logScale = Math.log(fit.scale) - shift;
  return n * Math.log(fit.shape) - n * fit.shape * logScale + (fit.shape - 1) * sum - n;
}

const cache = new Map<string, Float64Array>();

function nullStatistics(n1: number, n2: number): Float64Array {
  const key = `${n1}|${n2}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const n = n1 + n2;
  const perSlice = replicationsPerSlice(n);
  const sorted = simulate("lot check", key, function* () {
    const random = new SeededRandom((patternSeed(n1, [n2]) ^ SALT) >>> 0);
    const y = new Float64Array(n);
    const z = new Float64Array(n);
    const out = new Float64Array(LOT_REPLICATIONS);
    let kept = 0;
    const fit: LotFit = { shape: NaN, weightSum: NaN };
    // One replication as a plain function: V8 optimizes a long loop inside a generator poorly.
    const replicate = (): void => {
      for (let i = 0; i < n; i++) y[i] = Math.log(random.exponential());
      const lLot = maxLogLikelihood(y, 0, n1, z, NaN, fit);
      const m1 = fit.shape;
      const lBase = maxLogLikelihood(y, n1, n, z, NaN, fit);
      // The pooled modulus lies near the specimen-weighted mean of the two: a closer start.
      const pooledStart = (n1 * m1 + n2 * fit.shape) / n;
      const lr = 2 * (lLot + lBase - maxLogLikelihood(y, 0, n, z, pooledStart, fit));
      if (Number.isFinite(lr)) out[kept++] = Math.max(lr, 0);
    };
    for (let rep = 0; rep < LOT_REPLICATIONS; rep++) {
      if (rep % perSlice === perSlice - 1) yield;
      replicate();
    }
    return out.slice(0, kept).sort();
  });
  cache.set(key, sorted);
  if (cache.size > 8) cache.delete(cache.keys().next().value as string);
  return sorted;
}

/**
 * Monte Carlo p-value of a likelihood-ratio `statistic` for a lot of `lotSpecimens` against a baseline of
 * `baselineSpecimens`: (1 + #{simulated >= statistic}) / (1 + R), with its binomial standard error.
 */
export function lotPValue({
  lotSpecimens,
  baselineSpecimens,
  statistic,
}: {
  lotSpecimens: number;
  baselineSpecimens: number;
  statistic: number;
}): { pValue: number; pValueStandardError: number; replications: number } {
  const reference = nullStatistics(lotSpecimens, baselineSpecimens);
  let lo = 0;
  let hi = reference.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (reference[mid] < statistic) lo = mid + 1;
    else hi = mid;
  }
  const pValue = (1 + reference.length - lo) / (1 + reference.length);
  return { pValue, pValueStandardError: Math.sqrt((pValue * (1 - pValue)) / reference.length), replications: reference.length };
}

export function compareLots({
  lot,
  baseline,
  confidence = 0.95,
}: {
  lot: readonly number[];
  baseline: readonly number[];
  confidence?: number;
}): LotComparison {
  ensureProbability(confidence, "confidence");
  checkSample({ strengths: lot });
  checkSample({ strengths: baseline });
  requireSimulationSize(lot.length + baseline.length, "the lot check");
  const pooled = [...lot, ...baseline];
  // Logs measured from the pooled maximum: the statistic is unchanged, the sums stay small.
  // A loop, not Math.max(...pooled): spreading a long column overflows the call stack.
  let largest = 0;
  for (const s of pooled) if (s > largest) largest = s;
  const shift = Math.log(largest);
  const statistic = Math.max(
    2 * (observedLogLikelihood(lot, shift) + observedLogLikelihood(baseline, shift) - observedLogLikelihood(pooled, shift)),
    0,
  );
  const { pValue, pValueStandardError, replications } = lotPValue({ lotSpecimens: lot.length, baselineSpecimens: baseline.length, statistic });
  const lotFit = fitMaximumLikelihood({ strengths: lot });
  const baseFit = fitMaximumLikelihood({ strengths: baseline });
  const differs = pValue <= 1 - confidence;
  const estimates =
    `characteristic strength ${roundForText(lotFit.scale)} vs ${roundForText(baseFit.scale)}, ` +
    `modulus ${roundForText(lotFit.shape)} vs ${roundForText(baseFit.shape)} (maximum likelihood, lot vs baseline)`;
  const p = `${pValueText(pValue, pValueStandardError)} by simulation`;
  const verdict = differs ? `The lot differs from the baseline (${p}): ${estimates}.` : `Consistent with the baseline (${p}): ${estimates}.`;
  return {
    statistic,
    pValue,
    pValueStandardError,
    chiSquarePValue: Math.exp(-statistic / 2),
    differs,
    lot: { shape: lotFit.shape, scale: lotFit.scale, specimens: lot.length },
    baseline: { shape: baseFit.shape, scale: baseFit.scale, specimens: baseline.length },
    verdict,
    replications,
  };
}
