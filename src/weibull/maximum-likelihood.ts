/**
 * Maximum-likelihood estimate of the Weibull modulus and characteristic
 * strength, for complete and right-censored samples (ASTM C1239 section 7;
 * ISO 20501 methods A and B).
 *
 * With r failures among N specimens the modulus m solves
 *
 *   g(m) = sum_all(x^m ln x) / sum_all(x^m) - (1/r) sum_failures(ln x) - 1/m = 0
 *
 * and sigma_theta = (sum_all s^m / r)^(1/m). g increases monotonically with m
 * (g'(m) is a weighted variance of ln x plus 1/m^2), so the root is unique.
 *
 * Strengths are divided by their maximum first: every x lies in (0, 1], the
 * largest term of sum x^m is exactly 1, and nothing overflows or underflows
 * whatever the units or the modulus.
 *
 * The solve is Halley's method (third order) inside a bracket, from a moment
 * estimate: one pass over the data per iterate gives g and its first three
 * derivatives (the weighted cumulants of ln x). Near the root Halley's step is
 * refined by one Newton step on the cubic Taylor model of g, so the error after
 * a step d is of order (d/m)^4; the solve ends on a step so small that this is
 * below rounding, typically after two or three passes.
 *
 * @example
 * fitMaximumLikelihood({ strengths: [300, 350] }).scale // about 336.6
 */
import { ensurePositiveResult, InputError } from "../errors";
import { fastExp } from "../numeric/exp";
import { CompensatedSum } from "../numeric/sum";
import { summarizeSample, type StrengthSample } from "./sample";
import type { WeibullParameters } from "./distribution";

export interface MaximumLikelihoodFit extends WeibullParameters {
  /** Specimens in the sample (failures plus censored). */
  specimens: number;
  failures: number;
  converged: boolean;
  /** Passes over the data (each evaluates g and its derivatives at one modulus). */
  iterations: number;
  /**
   * |g| times m at the last modulus where g was evaluated, in units of 1/m. After
   * convergence the returned modulus is one more step from there, smaller than
   * 3e-5 m (a refined step, whose error after it is of the order of its fourth
   * power) or 1e-11 m, so its own residual is smaller still.
   */
  residual: number;
}

const MAX_ITERATIONS = 200;

/**
 * Working space for ln(s / s_max), reused by every call and grown to the largest sample fitted so
 * far (8 bytes a specimen: 8 MB after a fit of a million). A new typed array per fit costs about a
 * tenth of a fit at n = 30 to 100, and at a million its fresh pages cost about 8 % of the fit
 * (measured). The fit calls nothing that could re-enter it, and nothing in it outlives the call.
 */
let logSpace = new Float64Array(4096);

/** The smallest normal double, 2^-1022. */
const SMALLEST_NORMAL = 2.2250738585072014e-308;

/** A step below this fraction of m ends the solve: Halley's error after it is of order its cube. */
const STEP_TOLERANCE = 1e-11;
/**
 * A refined step (see above) below this fraction of m ends it too: the error left after the step is
 * of order the fourth power of its relative size (about 1e-18), below the rounding of the result, so
 * one more pass would only confirm it.
 */
const LAST_QUARTIC_STEP = 3e-5;

export function fitMaximumLikelihood(sample: StrengthSample): MaximumLikelihoodFit {
  const { failures, largest: max } = summarizeSample(sample);
  const { strengths, censored } = sample;
  const n = strengths.length;
  if (n > logSpace.length) logSpace = new Float64Array(n);
  const logX = logSpace.subarray(0, n);
  const failureLogMean = logRatios(strengths, censored, max, logX) / failures;
  // g(infinity) = -failureLogMean: when every failure sits at the maximum, no finite m fits.
  if (!(failureLogMean < 0)) {
    throw new InputError("input", "all failure strengths are equal to the largest strength: the modulus is unbounded");
  }

  const sums = new Float64Array(5);
  // Safeguarded Halley: keep a bracket [lo, hi] with g(lo) < 0 < g(hi).
  let lo = 0;
  let hi = Infinity;
  let m = startingModulus(logX, censored, failures, failureLogMean);
  let converged = false;
  let iterations = 0;
  let residual = Infinity;
  // ln sum_all x^m at the returned modulus (NaN until known).
  let logSum = NaN;
  for (iterations = 1; iterations <= MAX_ITERATIONS; iterations++) {
    powerSums(logX, m, sums);
    const mean = sums[1] / sums[0];
    const second = sums[2] / sums[0];
    const variance = Math.max(second - mean * mean, 0);
    const value = mean - failureLogMean - 1 / m;
    residual = Math.abs(value) * m;
    if (value < 0) lo = Math.max(lo, m);
    else if (value > 0) hi = Math.min(hi, m);
    const slope = variance + 1 / (m * m);
    const newtonStep = -value / slope;
    // Halley's correction uses g'' = third central moment - 2/m^3; far from the root, where the
    // correction would more than halve or double the Newton step, the Newton step is taken as it is.
    const third = sums[3] / sums[0] - mean * (3 * second - 2 * mean * mean);
    const curvature = third - 2 / (m * m * m);
    const ratio = (value * curvature) / (2 * slope * slope);
    const halley = Math.abs(ratio) <= 0.5;
    let step = halley ? newtonStep / (1 - ratio) : newtonStep;
    // Near the root, one Newton step on the cubic Taylor model of g (its third derivative from the
    // fourth cumulant) from Halley's step: an error of order (d/m)^4 after the step instead of (d/m)^3.
    const fourthCumulant =
      sums[4] / sums[0] - 4 * mean * (sums[3] / sums[0]) + 6 * mean * mean * second - 3 * mean * mean * mean * mean - 3 * variance * variance;
    let refined = false;
    if (halley) {
      const g3 = fourthCumulant + 6 / (m * m * m * m);
      const model = value + step * (slope + step * (0.5 * curvature + (step / 6) * g3));
      const modelSlope = slope + step * (curvature + 0.5 * step * g3);
      const correction = model / modelSlope;
      // Near the root the correction is of order d^4 / m^3, far below d; a larger one means the model
      // does not hold yet, and Halley's step is taken as it is.
      if (Math.abs(correction) <= 0.01 * Math.abs(step)) {
        step -= correction;
        refined = true;
      }
    }
    if (Math.abs(step) <= STEP_TOLERANCE * m || (refined && Math.abs(step) <= LAST_QUARTIC_STEP * m)) {
      // Converged: a step this small lands within rounding of the root (the error after it is of
      // order (d/m)^4, below 1e-18 here). The sum at m + step follows from the cumulants of ln x at m
      // without another pass: ln S0(m + d) = ln S0(m) + d k1 + d^2 k2 / 2 + d^3 k3 / 6 + d^4 k4 / 24 + O(d^5).
      logSum = Math.log(sums[0]) + step * (mean + step * (0.5 * variance + step * (third / 6 + (step / 24) * fourthCumulant)));
      m += step;
      converged = true;
      break;
    }
    const next = m + step;
    m = next > lo && next < hi ? next : Number.isFinite(hi) ? 0.5 * (lo + hi) : 2 * Math.max(m, lo);
    if (Number.isFinite(hi) && hi - lo <= 2 * Number.EPSILON * hi) {
      m = 0.5 * (lo + hi);
      converged = true;
      break;
    }
  }
  if (!Number.isFinite(m) || m <= 0) throw new InputError("input", "the likelihood equation has no finite solution for these data");
  if (Number.isNaN(logSum)) {
    // Ended on the bracket or the iteration limit, at a modulus not yet evaluated: one more pass.
    powerSums(logX, m, sums);
    residual = Math.abs(sums[1] / sums[0] - failureLogMean - 1 / m) * m;
    logSum = Math.log(sums[0]);
  }
  const scale = max * Math.exp((logSum - Math.log(failures)) / m);
  ensurePositiveResult(scale, "characteristic strength");
  return { shape: m, scale, specimens: n, failures, converged, iterations: Math.min(iterations, MAX_ITERATIONS), residual };
}

/**
 * ln(s / max) of every strength into logX, and the compensated sum of those
 * logarithms over the failures. (Every loop over the specimens is a small
 * function of its own: the engine compiles each within a few calls.)
 */
function logRatios(strengths: readonly number[], censored: readonly boolean[] | undefined, max: number, logX: Float64Array): number {
  const failureLogs = new CompensatedSum();
  for (let i = 0; i < strengths.length; i++) {
    const x = strengths[i] / max;
    // Strengths more than about 300 decades apart: the ratio is subnormal or 0 (1e-300 / 1e300), and
    // the difference of the logarithms keeps what the ratio has lost.
    const l = x >= SMALLEST_NORMAL ? Math.log(x) : Math.log(strengths[i]) - Math.log(max);
    logX[i] = l;
    if (!censored?.[i]) failureLogs.add(l);
  }
  return failureLogs.value;
}

/**
 * Sums over every specimen of w = x^m times 1, ln x, (ln x)^2, (ln x)^3 and
 * (ln x)^4, with x = s / s_max, into out[0..4]. The first two decide the root
 * and the characteristic strength, so they carry the exact rounding error of
 * every addition (compensated summation); the others only shape the step (and
 * the small terms of the sum's expansion), and plain sums serve.
 *
 * Every w lies in (0, 1], so the sum of w starts from 1 and takes 1 off at the
 * end (exact: the total is at least 1): every partial sum is then at least as
 * large as the next term, and Dekker's three-operation error term is exact,
 * as Neumaier's branch or Knuth's six operations would be in general. The
 * terms w ln x have no such bound, so their sum uses Knuth's two-sum.
 */
function powerSums(logX: Float64Array, m: number, out: Float64Array): void {
  let s0 = 1;
  let c0 = 0;
  let s1 = 0;
  let c1 = 0;
  let s2 = 0;
  let s3 = 0;
  let s4 = 0;
  for (let i = 0; i < logX.length; i++) {
    const l = logX[i];
    const w = fastExp(m * l);
    const wl = w * l;
    const wll = wl * l;
    let t = s0 + w;
    c0 += s0 - t + w;
    s0 = t;
    t = s1 + wl;
    const part = t - s1;
    c1 += s1 - (t - part) + (wl - part);
    s1 = t;
    s2 += wll;
    const wlll = wll * l;
    s3 += wlll;
    s4 += wlll * l;
  }
  out[0] = s0 - 1 + c0;
  out[1] = s1 + c1;
  out[2] = s2;
  out[3] = s3;
  out[4] = s4;
}

/**
 * Moment estimate from the spread of ln s among the failures: ln s follows a
 * Gumbel law with standard deviation pi / (m sqrt 6), so m0 = 1.2825 / sd.
 */
function startingModulus(logX: Float64Array, censored: readonly boolean[] | undefined, failures: number, mean: number): number {
  let ss = 0;
  for (let i = 0; i < logX.length; i++) {
    if (censored?.[i]) continue;
    const d = logX[i] - mean;
    ss += d * d;
  }
  const sd = Math.sqrt(ss / Math.max(failures - 1, 1));
  const m0 = Math.PI / Math.sqrt(6) / sd;
  return Number.isFinite(m0) && m0 > 0 ? Math.min(Math.max(m0, 1e-3), 1e6) : 1;
}
