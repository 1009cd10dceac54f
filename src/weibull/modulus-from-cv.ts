/**
 * The Weibull modulus implied by a datasheet's mean and standard deviation.
 *
 * For a two-parameter Weibull law the coefficient of variation depends on m
 * only:
 *
 *   CV^2 = Gamma(1 + 2/m) / Gamma(1 + 1/m)^2 - 1
 *
 * We solve it exactly in the form D(m) = ln(1 + CV^2) with
 * D(m) = lnGamma(1 + 2/m) - 2 lnGamma(1 + 1/m), which decreases strictly in m
 * (Brent's method on ln D(m) = ln ln(1 + CV^2), well scaled for tiny CV). For 1/m <= 0.1, where D is small and a difference
 * of two log-gammas near 0 would lose digits, D comes from the series
 * lnGamma(1 + x) = -gamma x + sum_{k>=2} (-1)^k zeta(k) x^k / k, whose linear
 * terms cancel exactly:
 *
 *   D = sum_{k>=2} (-1)^k zeta(k) (2^k - 2) x^k / k,   x = 1/m.
 *
 * A datasheet's standard deviation is usually the sample value (N - 1); the
 * relation above is the distribution's, so the result is a method-of-moments
 * estimate, not the maximum-likelihood modulus of the underlying tests.
 */
import { ensure, ensureConverged, ensurePositive } from "../errors";
import { logGamma } from "../numeric/gamma";
import { findRoot } from "../numeric/roots";

// zeta(2..8) in closed form or to 17 digits; zeta(k) for k >= 9 by direct summation below.
const ZETA_LOW = [
  0,
  0,
  Math.PI ** 2 / 6,
  1.2020569031595942854,
  Math.PI ** 4 / 90,
  1.0369277551433699263,
  Math.PI ** 6 / 945,
  1.0083492773819228268,
  Math.PI ** 8 / 9450,
];
const SERIES_TERMS = 40;
const ZETA: number[] = [];
for (let k = 0; k <= SERIES_TERMS; k++) {
  if (k < ZETA_LOW.length) {
    ZETA.push(ZETA_LOW[k]);
  } else {
    // The tail beyond j = 60 is below 60^(1-k)/(k-1) < 1e-15 for k >= 9; sum small terms first.
    let s = 0;
    for (let j = 60; j >= 1; j--) s += j ** -k;
    ZETA.push(s);
  }
}

const SERIES_LIMIT = 0.1;

/** D(m) = lnGamma(1 + 2/m) - 2 lnGamma(1 + 1/m) = ln(1 + CV^2). */
export function logOnePlusSquaredCv(shape: number): number {
  const x = 1 / shape;
  if (x <= SERIES_LIMIT) {
    // Terms fall like (2x)^k <= 0.2^k: 40 terms reach far below rounding; add the smallest first.
    let sum = 0;
    for (let k = SERIES_TERMS; k >= 2; k--) {
      sum += ((k % 2 === 0 ? 1 : -1) * ZETA[k] * (2 ** k - 2) * x ** k) / k;
    }
    return sum;
  }
  return logGamma(1 + 2 * x) - 2 * logGamma(1 + x);
}

export interface ModulusFromCv {
  shape: number;
  converged: boolean;
  iterations: number;
}

// Moduli the solve brackets: CV from about 4e32 down to about 1.3e-7.
const LOWEST_SHAPE = 0.02;
const HIGHEST_SHAPE = 1e7;

export function modulusFromCoefficientOfVariation({
  mean,
  standardDeviation,
}: {
  mean: number;
  standardDeviation: number;
}): ModulusFromCv {
  ensurePositive(mean, "mean strength");
  ensurePositive(standardDeviation, "standard deviation");
  const cv = standardDeviation / mean;
  const target = Math.log1p(cv * cv);
  ensure(
    target > 0 && target < logOnePlusSquaredCv(LOWEST_SHAPE),
    () => `the coefficient of variation ${cv} is too large: no Weibull modulus above ${LOWEST_SHAPE} gives it`,
  );
  ensure(
    target > logOnePlusSquaredCv(HIGHEST_SHAPE),
    () => `the coefficient of variation ${cv} is too small: the modulus would exceed ${HIGHEST_SHAPE}`,
  );
  // The log form keeps the equation well scaled when CV is tiny.
  const f = (m: number) => Math.log(logOnePlusSquaredCv(m)) - Math.log(target);
  // Start from the large-m relation CV ~ pi / (sqrt(6) m); widen to the full range if that misses.
  const guess = Math.PI / Math.sqrt(6) / cv;
  let lo = Math.max(LOWEST_SHAPE, guess / 8);
  let hi = Math.min(HIGHEST_SHAPE, guess * 8);
  if (!(f(lo) > 0 && f(hi) < 0)) {
    lo = LOWEST_SHAPE;
    hi = HIGHEST_SHAPE;
  }
  const result = findRoot(f, lo, hi, { relativeTolerance: 1e-15 });
  ensureConverged(result.converged, "the modulus solve did not converge");
  return { shape: result.root, converged: result.converged, iterations: result.iterations };
}
