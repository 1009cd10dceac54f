/**
 * The two-parameter Weibull distribution of fracture strength.
 *
 *   Pf(s) = 1 - exp(-k (s / sigma_theta)^m)
 *
 * m is the Weibull modulus (shape), sigma_theta the characteristic strength
 * (scale) of the tested specimen, and k the ratio of the part's effective size
 * to the specimen's (1 for the tested size). Design work lives at
 * Pf = 1e-4 .. 1e-9, where `1 - exp(-x)` keeps only a few digits, so every
 * probability here goes through expm1/log1p.
 */
import { ensure, ensurePositiveResult, ensurePositive, ensureProbability, notRepresentable } from "../errors";
import { gamma, logGamma, logGammaRatioTwoOne } from "../numeric/gamma";

export interface WeibullParameters {
  /** Weibull modulus m (dimensionless). */
  shape: number;
  /** Characteristic strength sigma_theta: the stress at which Pf = 1 - 1/e (63.2 %). */
  scale: number;
}

interface AtStress extends WeibullParameters {
  stress: number;
  /** Effective size of the part divided by that of the tested specimen; default 1. */
  sizeRatio?: number;
}

function checkParameters({ shape, scale }: WeibullParameters, sizeRatio: number): void {
  ensurePositive(shape, "modulus");
  ensurePositive(scale, "characteristic strength");
  ensurePositive(sizeRatio, "size ratio");
}

/** The cumulative hazard k (s/sigma_theta)^m, i.e. -ln(survival). */
export function cumulativeHazard({ stress, shape, scale, sizeRatio = 1 }: AtStress): number {
  checkParameters({ shape, scale }, sizeRatio);
  ensure(Number.isFinite(stress) && stress >= 0, () => `stress must be zero or positive (got ${stress})`);
  if (stress === 0) return 0;
  const hazard = sizeRatio * Math.pow(stress / scale, shape);
  if (hazard > 0 && Number.isFinite(hazard)) return hazard;
  // (s/th)^m overflowed or underflowed before k could bring it back: go through logarithms.
  return Math.exp(Math.log(sizeRatio) + shape * Math.log(stress / scale));
}

/**
 * Probability of failure at or below `stress`: -expm1(-H), exact to rounding
 * at tiny Pf. Positive at any positive stress, so a 0 there is an underflow
 * (below about 5e-324) and an error, not a probability.
 */
export function failureProbability(args: AtStress): number {
  const pf = -Math.expm1(-cumulativeHazard(args));
  if (pf === 0 && args.stress > 0) throw notRepresentable("failure probability", "small");
  return pf;
}

/** Probability of survival at `stress`. */
export function survivalProbability(args: AtStress): number {
  return Math.exp(-cumulativeHazard(args));
}

/** Stress at which the failure probability reaches `failureProbability` (the quantile). */
export function strengthAtFailureProbability({
  failureProbability,
  shape,
  scale,
  sizeRatio = 1,
}: WeibullParameters & { failureProbability: number; sizeRatio?: number }): number {
  checkParameters({ shape, scale }, sizeRatio);
  ensureProbability(failureProbability, "failure probability");
  return strengthAtHazard(-Math.log1p(-failureProbability), shape, scale, sizeRatio);
}

/**
 * Design stress: the stress a part of relative size `sizeRatio` survives with
 * probability `survival`. Uses -ln(S) directly, which is exact for S near 1
 * (no 1 - S subtraction).
 */
export function designStress({
  survival,
  shape,
  scale,
  sizeRatio = 1,
}: WeibullParameters & { survival: number; sizeRatio?: number }): number {
  checkParameters({ shape, scale }, sizeRatio);
  ensureProbability(survival, "survival probability");
  return strengthAtHazard(-Math.log(survival), shape, scale, sizeRatio);
}

function strengthAtHazard(hazard: number, shape: number, scale: number, sizeRatio: number): number {
  const stress = scale * Math.exp((Math.log(hazard) - Math.log(sizeRatio)) / shape);
  ensurePositiveResult(stress, "stress");
  return stress;
}

/** Mean strength sigma_theta Gamma(1 + 1/m): what a datasheet calls the "average". */
export function meanStrength({ shape, scale }: WeibullParameters): number {
  checkParameters({ shape, scale }, 1);
  return finite(scale * gammaOnePlusInverse(shape), "mean strength");
}

/** Median strength sigma_theta (ln 2)^(1/m). */
export function medianStrength({ shape, scale }: WeibullParameters): number {
  checkParameters({ shape, scale }, 1);
  return finite(scale * Math.exp(Math.log(Math.LN2) / shape), "median strength");
}

/** Characteristic strength that gives the stated mean strength. */
export function scaleFromMean({ mean, shape }: { mean: number; shape: number }): number {
  ensurePositive(mean, "mean strength");
  ensurePositive(shape, "modulus");
  return finite(mean / gammaOnePlusInverse(shape), "characteristic strength");
}

/** Characteristic strength that gives the stated median strength. */
export function scaleFromMedian({ median, shape }: { median: number; shape: number }): number {
  ensurePositive(median, "median strength");
  ensurePositive(shape, "modulus");
  return finite(median * Math.exp(-Math.log(Math.LN2) / shape), "characteristic strength");
}

/** Standard deviation of strength: sigma_theta sqrt(Gamma(1 + 2/m) - Gamma(1 + 1/m)^2). */
export function strengthStandardDeviation({ shape, scale }: WeibullParameters): number {
  checkParameters({ shape, scale }, 1);
  const g1 = logGamma(1 + 1 / shape);
  // Gamma(1 + 2/m) - Gamma(1 + 1/m)^2 = Gamma(1 + 1/m)^2 expm1(D), with D = ln Gamma(1 + 2/m) - 2 ln Gamma(1 + 1/m)
  // from a series whose Euler terms cancel exactly: no cancellation at any modulus.
  return finite(scale * Math.exp(g1) * Math.sqrt(Math.expm1(logGammaRatioTwoOne(1 / shape))), "standard deviation");
}

function gammaOnePlusInverse(shape: number): number {
  const x = 1 + 1 / shape;
  return x < 171 ? gamma(x) : Math.exp(logGamma(x));
}

function finite(value: number, name: string): number {
  ensurePositiveResult(value, name);
  return value;
}
