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
 */
import { ensure, ensurePositiveResult, InputError } from "../errors";
import { CompensatedSum } from "../numeric/sum";
import { checkSample, type StrengthSample } from "./sample";
import type { WeibullParameters } from "./distribution";

export interface MaximumLikelihoodFit extends WeibullParameters {
  /** Specimens in the sample (failures plus censored). */
  specimens: number;
  failures: number;
  converged: boolean;
  iterations: number;
  /** |g(m)| at the returned modulus, in units of 1/m. */
  residual: number;
}

const MAX_ITERATIONS = 200;

export function fitMaximumLikelihood(sample: StrengthSample): MaximumLikelihoodFit {
  const { strengths, censored, failures } = checkSample(sample);
  const n = strengths.length;
  let max = 0;
  for (let i = 0; i < n; i++) max = Math.max(max, strengths[i]);

  const logX = new Float64Array(n);
  const meanLogFailures = new CompensatedSum();
  for (let i = 0; i < n; i++) {
    logX[i] = Math.log(strengths[i] / max);
    if (!censored[i]) meanLogFailures.add(logX[i]);
  }
  const failureLogMean = meanLogFailures.value / failures;
  // g(infinity) = -failureLogMean: when every failure sits at the maximum, no finite m fits.
  ensure(failureLogMean < 0, "all failure strengths are equal to the largest strength: the modulus is unbounded");

  // One pass per iterate: three Neumaier sums kept in locals (the same operations, in the
  // same order, as three CompensatedSum objects, so the results are unchanged).
  const moments = (m: number) => {
    let t0 = 0, c0 = 0, t1 = 0, c1 = 0, t2 = 0, c2 = 0;
    for (let i = 0; i < n; i++) {
      const l = logX[i];
      const w = Math.exp(m * l);
      const wl = w * l;
      const wll = wl * l;
      let t = t0 + w;
      if (Math.abs(t0) >= Math.abs(w)) c0 += t0 - t + w;
      else c0 += w - t + t0;
      t0 = t;
      t = t1 + wl;
      if (Math.abs(t1) >= Math.abs(wl)) c1 += t1 - t + wl;
      else c1 += wl - t + t1;
      t1 = t;
      t = t2 + wll;
      if (Math.abs(t2) >= Math.abs(wll)) c2 += t2 - t + wll;
      else c2 += wll - t + t2;
      t2 = t;
    }
    const s0 = t0 + c0;
    const mean = (t1 + c1) / s0;
    return { sum: s0, mean, variance: Math.max((t2 + c2) / s0 - mean * mean, 0) };
  };

  // Safeguarded Newton: keep a bracket [lo, hi] with g(lo) < 0 < g(hi).
  let lo = 0;
  let hi = Infinity;
  let m = startingModulus(logX, censored, failures);
  let converged = false;
  let iterations = 0;
  let residual = Infinity;
  for (iterations = 1; iterations <= MAX_ITERATIONS; iterations++) {
    const { mean, variance } = moments(m);
    const value = mean - failureLogMean - 1 / m;
    residual = Math.abs(value) * m;
    if (value === 0) {
      converged = true;
      break;
    }
    if (value < 0) lo = Math.max(lo, m);
    else hi = Math.min(hi, m);
    const slope = variance + 1 / (m * m);
    const newton = m - value / slope;
    // Newton converges quadratically: a step below 1e-11 m lands within rounding of the root.
    // (Waiting for a step of a few ulp instead leaves the iteration dithering in the rounding
    // noise of g, and a step that rounds onto the bracket's end would be taken for an escape.)
    if (Math.abs(newton - m) <= 1e-11 * m) {
      m = newton;
      converged = true;
      break;
    }
    m = newton > lo && newton < hi ? newton : Number.isFinite(hi) ? 0.5 * (lo + hi) : 2 * Math.max(m, lo);
    if (Number.isFinite(hi) && hi - lo <= 2 * Number.EPSILON * hi) {
      m = 0.5 * (lo + hi);
      converged = true;
      break;
    }
  }
  if (!Number.isFinite(m) || m <= 0) throw new InputError("input", "the likelihood equation has no finite solution for these data");
  // One pass at the returned modulus gives both the residual and the sum for the scale.
  const final = moments(m);
  residual = Math.abs(final.mean - failureLogMean - 1 / m) * m;
  const sum = final.sum;
  const scale = max * Math.exp(Math.log(sum / failures) / m);
  ensurePositiveResult(scale, "characteristic strength");
  return { shape: m, scale, specimens: n, failures, converged, iterations: Math.min(iterations, MAX_ITERATIONS), residual };
}

/**
 * Moment estimate from the spread of ln s among the failures: ln s follows a
 * Gumbel law with standard deviation pi / (m sqrt 6), so m0 = 1.2825 / sd.
 */
function startingModulus(logX: Float64Array, censored: Uint8Array, failures: number): number {
  let mean = 0;
  for (let i = 0; i < logX.length; i++) if (!censored[i]) mean += logX[i];
  mean /= failures;
  let ss = 0;
  for (let i = 0; i < logX.length; i++) if (!censored[i]) ss += (logX[i] - mean) ** 2;
  const sd = Math.sqrt(ss / Math.max(failures - 1, 1));
  const m0 = Math.PI / Math.sqrt(6) / sd;
  return Number.isFinite(m0) && m0 > 0 ? Math.min(Math.max(m0, 1e-3), 1e6) : 1;
}
