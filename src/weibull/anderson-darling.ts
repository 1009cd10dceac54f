/**
 * Goodness of fit of a Weibull distribution with both parameters estimated:
 * the Anderson-Darling statistic, its small-sample modification, and the
 * observed significance level.
 *
 *   A2 = -N - (1/N) sum_i (2i - 1) [ln U_(i) + ln(1 - U_(N+1-i))],  U = F(s; m_hat, th_hat)
 *   A* = A2 (1 + 0.2 / sqrt(N))
 *
 * Critical values of A* for this case (Lawless 1982, p. 455, after Stephens):
 * 0.637 at the 10 % level, 0.757 at 5 %, 1.038 at 1 %. They assume the raw
 * maximum-likelihood estimates, so those are used here, never the unbiased
 * modulus. The observed significance level (the probability of an A* this
 * large from a true Weibull sample) follows the CMH-17-1G handbook (Vol. 1,
 * ch. 8):
 *
 *   OSL = 1 / (1 + exp(-0.10 + 1.24 ln A* + 4.48 A*))
 *
 * The test is defined for complete samples only.
 *
 * ln U and ln(1 - U) are formed from z = (s/th)^m directly: ln(1 - U) = -z and
 * ln U = ln(-expm1(-z)), so neither tail loses digits.
 */
import { ensureApplicable, ensureConverged } from "../errors";
import { CompensatedSum } from "../numeric/sum";
import { fitMaximumLikelihood } from "./maximum-likelihood";
import { checkSample, type StrengthSample } from "./sample";

/** Lawless (1982) critical values of A* (both Weibull parameters estimated by ML). */
export const ANDERSON_DARLING_CRITICAL = { "0.10": 0.637, "0.05": 0.757, "0.01": 1.038 } as const;

export interface FitQuality {
  a2: number;
  /** A2 (1 + 0.2/sqrt(N)) */
  aStar: number;
  /** Observed significance level (CMH-17-1G). */
  osl: number;
  specimens: number;
}

/** A2 of complete `strengths` against a Weibull distribution with the given parameters. */
export function andersonDarlingStatistic({
  strengths,
  shape,
  scale,
}: {
  strengths: readonly number[];
  shape: number;
  scale: number;
}): number {
  const n = strengths.length;
  const sorted = Float64Array.from(strengths).sort();
  // ln z_i = m ln(s_i/th): through logarithms so large moduli cannot overflow.
  const logZ = sorted.map((s) => shape * Math.log(s / scale));
  const sum = new CompensatedSum();
  for (let i = 0; i < n; i++) {
    const zLow = Math.exp(logZ[i]);
    const logU = zLow === 0 ? logZ[i] : Math.log(-Math.expm1(-zLow));
    const logOneMinusU = -Math.exp(logZ[n - 1 - i]);
    sum.add((2 * i + 1) * (logU + logOneMinusU));
  }
  return -n - sum.value / n;
}

export function modifiedAndersonDarling(a2: number, specimens: number): number {
  return a2 * (1 + 0.2 / Math.sqrt(specimens));
}

/** CMH-17-1G observed significance level of A*. */
export function observedSignificance(aStar: number): number {
  if (!(aStar > 0)) return 1;
  return 1 / (1 + Math.exp(-0.1 + 1.24 * Math.log(aStar) + 4.48 * aStar));
}

/** A2, A* and OSL of a complete sample against its own raw ML fit. */
export function fitQuality(sample: StrengthSample): FitQuality {
  const { censored } = checkSample(sample);
  ensureApplicable(!censored.some((c) => c === 1), "the Anderson-Darling test is defined for complete samples only (this sample has censored specimens)");
  const fit = fitMaximumLikelihood(sample);
  ensureConverged(fit.converged, "the maximum-likelihood fit did not converge");
  const a2 = andersonDarlingStatistic({ strengths: sample.strengths, shape: fit.shape, scale: fit.scale });
  const aStar = modifiedAndersonDarling(a2, sample.strengths.length);
  return { a2, aStar, osl: observedSignificance(aStar), specimens: sample.strengths.length };
}
