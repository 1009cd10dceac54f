/**
 * One entry point for the three ways a datasheet estimates the Weibull
 * parameters, so every caller names its method the same way:
 *
 *   "MLE"      maximum likelihood, modulus multiplied by the unbiasing factor
 *              (ASTM C1239 / ISO 20501 practice; the default)
 *   "MLE-RAW"  maximum likelihood as solved, no unbiasing
 *   "LSQ"      least squares on the probability plot (Y on X), with the
 *              "HAZEN" (i-0.5)/N positions unless another estimator is named
 *
 * The unbiasing factor applies to the modulus only: the characteristic
 * strength is always the ML value solved together with the raw modulus.
 */
import { InputError } from "../errors";
import type { WeibullParameters } from "./distribution";
import { fitMaximumLikelihood } from "./maximum-likelihood";
import type { PlottingEstimator } from "./plotting-positions";
import { fitProbabilityPlot } from "./regression";
import type { StrengthSample } from "./sample";
import { censoredUnbiasingFactor, unbiasingFactor } from "./unbiasing";

export type EstimationMethod = "MLE" | "MLE-RAW" | "LSQ";
export const ESTIMATION_METHODS: readonly EstimationMethod[] = ["MLE", "MLE-RAW", "LSQ"];

export interface WeibullEstimate extends WeibullParameters {
  method: EstimationMethod;
  specimens: number;
  failures: number;
  /** Whether the solve converged (always true for least squares, which is closed form). */
  converged: boolean;
  /** The factor applied to the ML modulus (1 for MLE-RAW and LSQ). */
  unbiasingFactor: number;
  /** The modulus before unbiasing (equal to shape for MLE-RAW and LSQ). */
  rawShape: number;
}

export function estimateWeibull(
  sample: StrengthSample,
  method: EstimationMethod = "MLE",
  estimator: PlottingEstimator = "HAZEN",
): WeibullEstimate {
  if (method === "LSQ") {
    const fit = fitProbabilityPlot(sample, estimator);
    return { ...pick(fit), method, converged: true, unbiasingFactor: 1, rawShape: fit.shape };
  }
  if (method !== "MLE" && method !== "MLE-RAW") {
    throw new InputError("input", `unknown method "${method as string}": use "MLE", "MLE-RAW" or "LSQ"`);
  }
  const fit = fitMaximumLikelihood(sample);
  let factor = 1;
  if (method === "MLE") {
    const censored = sample.censored?.some(Boolean) ?? false;
    factor = censored
      ? censoredUnbiasingFactor(sample.strengths, sample.censored ?? [])
      : unbiasingFactor(fit.specimens);
  }
  return {
    shape: fit.shape * factor,
    scale: fit.scale,
    method,
    specimens: fit.specimens,
    failures: fit.failures,
    converged: fit.converged,
    unbiasingFactor: factor,
    rawShape: fit.shape,
  };
}

function pick(fit: WeibullParameters & { specimens: number; failures: number }) {
  return { shape: fit.shape, scale: fit.scale, specimens: fit.specimens, failures: fit.failures };
}

/**
 * The characteristic strength by `method`. The unbiasing factor applies to
 * the modulus only, so "MLE" gives the ML characteristic strength, which
 * exists from two failures on (where the unbiased modulus does not).
 *
 * @example
 * estimateCharacteristicStrength({ strengths: [300, 350] }) // the ML value, about 336.6
 */
export function estimateCharacteristicStrength(
  sample: StrengthSample,
  method: EstimationMethod = "MLE",
  estimator: PlottingEstimator = "HAZEN",
): number {
  return estimateWeibull(sample, method === "MLE" ? "MLE-RAW" : method, estimator).scale;
}
