/**
 * Two checks that a sample holds one flaw population:
 *
 * - a bend in the probability plot (bilinear-check.ts: weighted segmented
 *   regression), which detects two populations of different moduli, not
 *   two of the same modulus (mixture-check.ts, run by fit-summary.ts);
 * - an outlying lowest strength (low-outlier-check.ts: Grubbs-type statistic
 *   on ln s).
 *
 * Each p-value is (1 + #{simulated >= observed}) / (1 + replications), the
 * usual Monte Carlo p-value, against samples drawn from one Weibull
 * population:
 *
 * - complete samples: both statistics are free of m and sigma_theta, so the
 *   reference samples are drawn at m = sigma_theta = 1 and depend on N only
 *   (exact, seeded by N);
 * - censored samples (competing flaw populations): the reference samples come
 *   from the parametric bootstrap conditional on the censoring values, at the
 *   ML fit, as for the censored unbiasing factor and bounds
 *   (censored-bootstrap.ts): each specimen draws a strength from the fitted
 *   distribution and stays censored at its recorded value if the draw exceeds
 *   it. Approximate, and seeded by the data.
 *
 * Plot positions are (i - 0.5)/N, with Johnson's adjusted ranks for censored
 * samples, as on the plot the user sees. A recalculation never changes a cell.
 */
import { SeededRandom } from "../numeric/random";
import { replicationsPerSlice, simulate } from "../numeric/replication-slices";
import { bilinearStatistic, BILINEAR_MIN_FAILURES, plotWeights } from "./bilinear-check";
import { lowOutlierStatistic, LOW_OUTLIER_MIN_FAILURES } from "./low-outlier-check";
import { fitMaximumLikelihood } from "./maximum-likelihood";
import { patternSeed } from "./pivotal-simulation";
import { SIMULATION_MAX_SPECIMENS } from "./simulation-limits";
import { plottingPositions, rankToProbability, type PlotPoint } from "./plotting-positions";
import { checkSample, type StrengthSample } from "./sample";

/** Monte Carlo p-values to about +-0.0035 at p = 0.05 (one standard error, reported with each p-value). */
export const CHECK_REPLICATIONS = 4000;
const SALT = 0x5eed0c4e;

export interface BilinearCheck {
  pValue: number;
  /** Binomial standard error of pValue from the finite simulation. */
  pValueStandardError: number;
  statistic: number;
  /** Failure strength at the knot of the best two-segment fit. */
  knotStrength: number;
  lowerModulus: number;
  upperModulus: number;
}

export interface LowOutlierCheck {
  pValue: number;
  /** Binomial standard error of pValue from the finite simulation. */
  pValueStandardError: number;
  statistic: number;
  /** The lowest failure strength. */
  strength: number;
}

export interface PopulationChecks {
  /** null when the sample has fewer than BILINEAR_MIN_FAILURES failures. */
  bilinear: BilinearCheck | null;
  /** null when the sample has fewer than LOW_OUTLIER_MIN_FAILURES failures. */
  lowOutlier: LowOutlierCheck | null;
  /** Reference samples behind the p-values. */
  replications: number;
  reference: "exact" | "bootstrap";
  /** Why the checks were not run, when they were not (a sample beyond the simulation limit). */
  skipped?: string;
}

export interface NullDistribution {
  /** Simulated plot-bend statistics, ascending (samples with too few failures left out). */
  bilinear: Float64Array;
  /** Simulated low-value statistics, ascending. */
  lowOutlier: Float64Array;
}

const cache = new Map<string, NullDistribution>();
const CACHE_ENTRIES = 8;

function remember(key: string, value: NullDistribution): NullDistribution {
  cache.set(key, value);
  if (cache.size > CACHE_ENTRIES) cache.delete(cache.keys().next().value as string);
  return value;
}

interface Statistics {
  bilinear?: ReturnType<typeof bilinearStatistic>;
  lowOutlier?: number;
}

function statisticsOf(points: readonly PlotPoint[]): Statistics {
  return statisticsOfArrays(
    Float64Array.from(points, (p) => p.x),
    Float64Array.from(points, (p) => p.y),
    Float64Array.from(points, (p) => p.failureProbability),
  );
}

function statisticsOfArrays(x: Float64Array, y: Float64Array, p: Float64Array): Statistics {
  const r = x.length;
  const out: Statistics = {};
  if (r < LOW_OUTLIER_MIN_FAILURES) return out;
  out.lowOutlier = lowOutlierStatistic(x);
  if (r >= BILINEAR_MIN_FAILURES) out.bilinear = bilinearStatistic(x, y, plotWeights(p));
  return out;
}

export function singlePopulationChecks(sample: StrengthSample): PopulationChecks {
  const { censored, failures } = checkSample(sample);
  const anyCensored = censored.some((c) => c === 1);
  if (sample.strengths.length > SIMULATION_MAX_SPECIMENS) {
    const skipped = `n/a (simulated only up to ${SIMULATION_MAX_SPECIMENS} specimens)`;
    return { bilinear: null, lowOutlier: null, replications: 0, reference: anyCensored ? "bootstrap" : "exact", skipped };
  }
  const points = plottingPositions(sample);
  const observed = statisticsOf(points);
  if (observed.lowOutlier === undefined) return { bilinear: null, lowOutlier: null, replications: 0, reference: anyCensored ? "bootstrap" : "exact" };
  const reference = anyCensored ? bootstrapCheckStatistics(sample) : simulateCheckStatistics(sample.strengths.length);
  let bilinear: BilinearCheck | null = null;
  if (observed.bilinear && failures >= BILINEAR_MIN_FAILURES) {
    const b = observed.bilinear;
    const pValue = upperTailP(reference.bilinear, b.statistic);
    bilinear = {
      pValue,
      pValueStandardError: monteCarloError(pValue, reference.bilinear.length),
      statistic: b.statistic,
      knotStrength: points[Math.max(b.knot, 0)].strength,
      lowerModulus: b.lowerModulus,
      upperModulus: b.upperModulus,
    };
  }
  const lowP = upperTailP(reference.lowOutlier, observed.lowOutlier);
  const lowOutlier = {
    pValue: lowP,
    pValueStandardError: monteCarloError(lowP, reference.lowOutlier.length),
    statistic: observed.lowOutlier,
    strength: points[0].strength,
  };
  return { bilinear, lowOutlier, replications: reference.lowOutlier.length, reference: anyCensored ? "bootstrap" : "exact" };
}

/** Binomial standard error of a Monte Carlo p-value from `replications` draws. */
function monteCarloError(p: number, replications: number): number {
  return Math.sqrt((p * (1 - p)) / replications);
}

/** Monte Carlo p-value of `observed` against ascending simulated values. */
function upperTailP(sorted: Float64Array, observed: number): number {
  // First index whose value is >= observed (binary search).
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid] < observed) lo = mid + 1;
    else hi = mid;
  }
  return (1 + sorted.length - lo) / (1 + sorted.length);
}

/**
 * Both statistics for CHECK_REPLICATIONS complete single-population samples
 * of `n` specimens (m = sigma_theta = 1), each sorted ascending.
 */
export function simulateCheckStatistics(n: number): NullDistribution {
  const key = `complete|${n}`;
  const hit = cache.get(key);
  if (hit) return hit;
  // Complete samples: the positions depend on n only; read them off a stand-in sample 1..n.
  const positions = plottingPositions({ strengths: Array.from({ length: n }, (_, i) => i + 1) });
  const y = Float64Array.from(positions, (p) => p.y);
  const w = plotWeights(positions.map((p) => p.failureProbability));
  const perSlice = replicationsPerSlice((3 * n) / 4);
  const statistics = simulate("single-population checks", key, function* () {
    const random = new SeededRandom((patternSeed(n, []) ^ SALT) >>> 0);
    const draw = new Float64Array(n);
    const bilinear = new Float64Array(n >= BILINEAR_MIN_FAILURES ? CHECK_REPLICATIONS : 0);
    const lowOutlier = new Float64Array(CHECK_REPLICATIONS);
    // One replication as a plain function: V8 optimizes a long loop inside a generator poorly.
    const replicate = (rep: number): void => {
      for (let i = 0; i < n; i++) draw[i] = random.exponential();
      draw.sort();
      for (let i = 0; i < n; i++) draw[i] = Math.log(draw[i]);
      if (bilinear.length) bilinear[rep] = bilinearStatistic(draw, y, w).statistic;
      lowOutlier[rep] = lowOutlierStatistic(draw);
    };
    for (let rep = 0; rep < CHECK_REPLICATIONS; rep++) {
      if (rep % perSlice === perSlice - 1) yield;
      replicate(rep);
    }
    return { bilinear: bilinear.sort(), lowOutlier: lowOutlier.sort() };
  });
  return remember(key, statistics);
}

/** Both statistics over the conditional parametric bootstrap of a censored sample (see the header). */
export function bootstrapCheckStatistics(sample: StrengthSample): NullDistribution {
  const { strengths, censored } = checkSample(sample);
  const key = `censored|${Array.from(strengths).join(",")}|${censored.join("")}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const fit = fitMaximumLikelihood(sample);
  const n = strengths.length;
  const inverseShape = 1 / fit.shape;
  const perSlice = replicationsPerSlice(3 * n);
  const statistics = simulate("single-population checks of a censored sample", key, function* () {
    const random = new SeededRandom((dataSeed(strengths, censored) ^ SALT) >>> 0);
    const drawn = new Float64Array(n);
    const flags = new Uint8Array(n);
    const order = new Uint32Array(n);
    const bilinear: number[] = [];
    const lowOutlier: number[] = [];
    // One replication as a plain function: V8 optimizes a long loop inside a generator poorly.
    const replicate = (): void => {
      let failures = 0;
      for (let i = 0; i < n; i++) {
        const a = fit.scale * Math.pow(random.exponential(), inverseShape);
        const survives = censored[i] === 1 && a > strengths[i];
        drawn[i] = survives ? strengths[i] : a;
        flags[i] = survives ? 1 : 0;
        if (!survives) failures++;
      }
      if (failures < LOW_OUTLIER_MIN_FAILURES) return;
      const { x, y, p } = failurePositions(drawn, flags, failures, order);
      const s = statisticsOfArrays(x, y, p);
      if (s.lowOutlier !== undefined) lowOutlier.push(s.lowOutlier);
      if (s.bilinear) bilinear.push(s.bilinear.statistic);
    };
    for (let rep = 0; rep < CHECK_REPLICATIONS; rep++) {
      if (rep % perSlice === perSlice - 1) yield;
      replicate();
    }
    return { bilinear: Float64Array.from(bilinear).sort(), lowOutlier: Float64Array.from(lowOutlier).sort() };
  });
  return remember(key, statistics);
}

/**
 * Plot coordinates of the failures by Johnson's adjusted ranks and (i - 0.5)/N
 * positions, as plotting-positions.ts computes them (same ordering: by
 * strength, a failure before a censored specimen at the same strength), on
 * typed arrays for the bootstrap loop. `order` is scratch space of length N.
 */
export function failurePositions(
  values: Float64Array,
  flags: Uint8Array,
  failures: number,
  order: Uint32Array = new Uint32Array(values.length),
): { x: Float64Array; y: Float64Array; p: Float64Array } {
  const n = values.length;
  for (let i = 0; i < n; i++) order[i] = i;
  order.sort((i, j) => values[i] - values[j] || flags[i] - flags[j]);
  const x = new Float64Array(failures);
  const y = new Float64Array(failures);
  const p = new Float64Array(failures);
  let rank = 0;
  let k = 0;
  for (let pos = 0; pos < n; pos++) {
    const i = order[pos];
    if (flags[i]) continue;
    rank += (n + 1 - rank) / (1 + n - pos);
    p[k] = rankToProbability(rank, n, "HAZEN");
    x[k] = Math.log(values[i]);
    y[k] = Math.log(-Math.log1p(-p[k]));
    k++;
  }
  return { x, y, p };
}

/** FNV-1a over the bits of the strengths and the flags: a stable seed for the same data. */
function dataSeed(strengths: Float64Array, censored: Uint8Array): number {
  const bytes = new Uint8Array(strengths.buffer, strengths.byteOffset, strengths.byteLength);
  let h = 0x811c9dc5;
  for (const b of bytes) h = Math.imul(h ^ b, 0x01000193) >>> 0;
  for (const c of censored) h = Math.imul(h ^ c, 0x01000193) >>> 0;
  return h;
}
