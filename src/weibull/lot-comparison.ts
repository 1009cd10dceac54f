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
import { patternSeed, solveShapeFromLogs } from "./pivotal-simulation";
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

/** Maximised log-likelihood of a complete sample from its logs: n ln m - n m ln th + (m - 1) sum y - n. */
function maxLogLikelihood(y: Float64Array, from: number, to: number, z: Float64Array): number {
  const n = to - from;
  let max = -Infinity;
  let sum = 0;
  for (let i = from; i < to; i++) {
    max = Math.max(max, y[i]);
    sum += y[i];
  }
  const zs = z.subarray(0, n);
  for (let i = 0; i < n; i++) zs[i] = y[from + i] - max;
  const fit = solveShapeFromLogs(zs, null, n);
  if (!fit.converged) return NaN;
  const m = fit.shape;
  const logScale = max + Math.log(fit.weightSum / n) / m;
  return n * Math.log(m) - n * m * logScale + (m - 1) * sum - n;
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
    // One replication as a plain function: V8 optimizes a long loop inside a generator poorly.
    const replicate = (): void => {
      for (let i = 0; i < n; i++) y[i] = Math.log(random.exponential());
      const lr = 2 * (maxLogLikelihood(y, 0, n1, z) + maxLogLikelihood(y, n1, n, z) - maxLogLikelihood(y, 0, n, z));
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
