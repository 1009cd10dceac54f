/**
 * Confidence bounds on the Weibull modulus and characteristic strength by the
 * pivotal-quantity method (ASTM C1239 section 8; ISO 20501; Thoman, Bain &
 * Antle 1969). With raw maximum-likelihood estimates m_hat, th_hat,
 *
 *   q = m_hat / m   and   t = m_hat ln(th_hat / th)
 *
 * have distributions free of the true m and th, so
 *
 *   two-sided at confidence C (a = (1 - C)/2):
 *     m_L = m_hat / q_(1-a)             m_U = m_hat / q_a
 *     th_L = th_hat exp(-t_(1-a)/m_hat)  th_U = th_hat exp(-t_a/m_hat)
 *   one-sided at C: the same with a = 1 - C (lower bound at C, upper bound at C).
 *
 * The bounds use the raw ML modulus, not the unbiased one, whatever method
 * gave the point estimate. Complete samples take q and t quantiles from the
 * seeded table (pivotal-table.ts): exact, as q and t are exactly pivotal.
 * Censored samples (competing flaw populations) take them from a parametric
 * bootstrap of the competing-population experiment at the fitted values
 * (censored-bootstrap.ts, the draws that also give its unbiasing factor):
 * q_b = m_b/m_hat and t_b = m_b ln(th_b/th_hat) stand in for q and t. There q
 * and t are only approximately pivotal (their law depends on the censoring
 * population), so censored bounds are approximate (their coverage is
 * measured: test/fixtures/censored_coverage.json); the bootstrap is seeded
 * by the data, so a recalculation never changes the result.
 */
import { ensure, ensureConverged, ensurePositiveResult, ensureProbability } from "../errors";
import { bootstrapCensored } from "./censored-bootstrap";
import { fitMaximumLikelihood, type MaximumLikelihoodFit } from "./maximum-likelihood";
import { pivotalTable } from "./pivotal-table";
import { sortedQuantile } from "./pivotal-simulation";
import type { StrengthSample } from "./sample";
import { censoredReplications } from "./unbiasing";

/** Probabilities the complete-sample table covers; censored simulations use the same range. */
export const PIVOTAL_PROBABILITIES = { lowest: 0.005, highest: 0.995 };

/** Fewest bootstrap draws beyond a quantile before it is used for a bound. */
export const MIN_TAIL_DRAWS = 20;

export type BoundSides = 1 | 2;

export interface Interval {
  lower: number;
  upper: number;
}

export interface PivotalPairs {
  /** q (or q_b) of each replication, in draw order. */
  shapeRatio: Float64Array;
  /** t (or t_b), paired with shapeRatio. */
  scaleLogError: Float64Array;
}

export interface PivotalSource {
  kind: "table" | "bootstrap";
  /** Replications behind the quantiles (bootstrap only). */
  replications?: number;
  /** Quantile of q = m_hat/m at probability p. */
  shapeQuantile(p: number): number;
  /** Quantile of t = m_hat ln(th_hat/th) at probability p. */
  scaleQuantile(p: number): number;
  /** The bootstrap pairs (bootstrap only), for quantities that need the joint law. */
  pairs?: PivotalPairs;
}

export interface ParameterBounds {
  /** The raw maximum-likelihood fit the bounds are built on. */
  fit: MaximumLikelihoodFit;
  shape: Interval;
  scale: Interval;
  confidence: number;
  sides: BoundSides;
  source: PivotalSource;
}

export function isCensored(sample: StrengthSample): boolean {
  return sample.censored?.some(Boolean) ?? false;
}

/** Sorted copies of each (cached) set of bootstrap draws, made once. */
const sortedDraws = new WeakMap<object, { q: Float64Array; t: Float64Array }>();

/**
 * Where the q and t quantiles of this sample come from: the table for a
 * complete sample, the competing-population bootstrap (at the ML fit `fit`)
 * for a censored one.
 */
export function pivotalSource(sample: StrengthSample, fit?: MaximumLikelihoodFit): PivotalSource {
  const n = sample.strengths.length;
  if (!isCensored(sample)) return tablePivotalSource(n);
  const censored = sample.censored ?? [];
  const draws = bootstrapCensored({
    strengths: sample.strengths,
    censored,
    fit: fit ?? fitMaximumLikelihood(sample),
    replications: censoredReplications(n),
  });
  let sorted = sortedDraws.get(draws);
  if (!sorted) {
    sorted = { q: draws.shapeRatio.slice().sort(), t: draws.scaleLogError.slice().sort() };
    sortedDraws.set(draws, sorted);
  }
  const { q, t } = sorted;
  const inTail = (p: number) => {
    ensure(
      Math.min(p, 1 - p) * q.length >= MIN_TAIL_DRAWS,
      () => `the bootstrap of this censored sample has ${q.length} draws, too few beyond the ${p} quantile for a bound at this confidence: lower the confidence`,
    );
    return p;
  };
  return {
    kind: "bootstrap",
    replications: q.length,
    shapeQuantile: (p) => sortedQuantile(q, inTail(p)),
    scaleQuantile: (p) => sortedQuantile(t, inTail(p)),
    pairs: { shapeRatio: draws.shapeRatio, scaleLogError: draws.scaleLogError },
  };
}

/** The q and t quantiles of a complete sample of n specimens, from the seeded table. */
export function tablePivotalSource(n: number): PivotalSource {
  const table = pivotalTable();
  return {
    kind: "table",
    shapeQuantile: (p) => table.shapeQuantile(n, p),
    scaleQuantile: (p) => table.scaleQuantile(n, p),
  };
}

/**
 * The bounds themselves, from raw ML estimates and the pivotal quantiles:
 * the one piece of arithmetic shared by bounds from data and bounds from
 * datasheet values, so both give the same numbers for the same estimates.
 */
export function boundsFromPivots(
  fit: { shape: number; scale: number },
  source: PivotalSource,
  confidence: number,
  sides: BoundSides,
): { shape: Interval; scale: Interval } {
  const { forLower, forUpper } = tailProbabilities(confidence, sides);
  const m = fit.shape;
  const shape = { lower: m / source.shapeQuantile(forLower), upper: m / source.shapeQuantile(forUpper) };
  const scale = {
    lower: fit.scale * Math.exp(-source.scaleQuantile(forLower) / m),
    upper: fit.scale * Math.exp(-source.scaleQuantile(forUpper) / m),
  };
  for (const v of [shape.lower, shape.upper, scale.lower, scale.upper]) {
    ensurePositiveResult(v, "confidence bound");
  }
  return { shape, scale };
}

/**
 * Probabilities of the pivotal quantiles a bound at `confidence` uses: the
 * lower bound takes the quantile at `forLower`, the upper at `forUpper`.
 */
export function tailProbabilities(confidence: number, sides: BoundSides): { forLower: number; forUpper: number } {
  ensureProbability(confidence, "confidence");
  ensure(sides === 1 || sides === 2, () => `sides must be 1 or 2 (got ${sides})`);
  const a = sides === 2 ? (1 - confidence) / 2 : 1 - confidence;
  const { lowest, highest } = PIVOTAL_PROBABILITIES;
  // 1e-12 absorbs the rounding of (1 - C)/2 at the table's end points.
  const inside = (p: number) => p >= lowest - 1e-12 && p <= highest + 1e-12;
  ensure(
    inside(a) && inside(1 - a),
    () => sides === 2
      ? `a two-sided bound needs a confidence of at most 0.99 (got ${confidence}): the pivotal quantiles are simulated from probability ${lowest} to ${highest}`
      : `a one-sided bound needs a confidence from 0.005 to 0.995 (got ${confidence}): the pivotal quantiles are simulated from probability ${lowest} to ${highest}`,
  );
  const clamp = (p: number) => Math.min(Math.max(p, lowest), highest);
  return { forLower: clamp(1 - a), forUpper: clamp(a) };
}

/**
 * Bounds on m and sigma_theta at `confidence` (default 0.90 two-sided, the
 * ASTM C1239 practice). With sides = 1 the lower and upper values are each a
 * one-sided bound at `confidence`.
 */
export function parameterBounds({
  strengths,
  censored,
  confidence = 0.9,
  sides = 2,
}: StrengthSample & { confidence?: number; sides?: BoundSides }): ParameterBounds {
  tailProbabilities(confidence, sides); // refuse a bad confidence before any fitting or simulation
  const sample = { strengths, censored };
  const fit = fitMaximumLikelihood(sample);
  ensureConverged(fit.converged, "the maximum-likelihood fit did not converge");
  const source = pivotalSource(sample, fit);
  const { shape, scale } = boundsFromPivots(fit, source, confidence, sides);
  return { fit, shape, scale, confidence, sides, source };
}
