/**
 * The strength model a design check rests on: the Weibull parameters (fitted
 * to the data, or typed from a datasheet) and, where the inputs carry their
 * uncertainty, the one-sided lower confidence bound on any design stress and
 * its dual, the upper bound on the failure probability at a given stress.
 *
 * The dual: the upper bound at confidence C on the failure probability at
 * stress s is the probability p at which the lower bound on the allowable
 * stress equals s (Lawless 1982 sec. 4.1: a bound on a quantile inverts to a
 * bound on the distribution function). So "s is at or below the lower-bound
 * allowable at the target" and "the upper-bound failure probability at s is
 * at or below the target" are one statement, and the lot counts built on the
 * bound agree with the verdict.
 */
import { InputError } from "../errors";
import { findRoot } from "../numeric/roots";
import { designStressBound } from "../weibull/design-stress-bound";
import { meanStrength } from "../weibull/distribution";
import { estimateWeibull } from "../weibull/estimate";
import type { StrengthSample } from "../weibull/sample";
import { datasheetDesignStressLower, rawModulus } from "./check-datasheet-bound";
import { METHOD_LABELS, type MaterialDescription } from "./check-description";
import type { FittedParameters } from "./check-result";
import { formatNumber } from "./probability-text";

export interface StrengthModel {
  parameters: FittedParameters;
  sample: StrengthSample | null;
  /**
   * Lower bound at the one-sided confidence on the stress a body `sizeRatio`
   * times the specimen survives with probability `survival`; null when the
   * inputs carry no uncertainty.
   */
  lowerBound: ((survival: number, sizeRatio: number) => number) | null;
  /** How the bound is computed, in words. */
  boundMethod: string;
  /** Why there is no bound. */
  boundMissing?: string;
}

export function strengthModel(material: MaterialDescription, confidence: number): StrengthModel {
  if (material.kind === "typed") return datasheetModel(material, confidence);
  const sample: StrengthSample = { strengths: material.strengths, censored: material.censored };
  const fit = estimateWeibull(sample, material.method);
  const censoredCount = fit.specimens - fit.failures;
  const counts =
    censoredCount > 0
      ? `${fit.failures} failures and ${censoredCount} censored of ${fit.specimens} specimens`
      : `${fit.specimens} specimens`;
  const unbiased = fit.unbiasingFactor !== 1 ? `, unbiasing factor ${formatNumber(fit.unbiasingFactor)}` : "";
  const censored = censoredCount > 0;
  return {
    parameters: {
      shape: fit.shape,
      scale: fit.scale,
      mean: meanStrength({ shape: fit.shape, scale: fit.scale }),
      basis: `${METHOD_LABELS[material.method]}; ${counts}${unbiased}`,
      specimens: fit.specimens,
      failures: fit.failures,
      converged: fit.converged,
    },
    sample,
    lowerBound: (survival, sizeRatio) =>
      designStressBound({ strengths: sample.strengths, censored: sample.censored, survival, confidence, sizeRatio }).lower,
    boundMethod:
      "pivotal quantity for a Weibull quantile on the raw maximum-likelihood fit (ASTM C1239 sec. 8, ISO 20501), whatever the point estimate's method" +
      (censored ? "; censored sample: quantiles from a seeded bootstrap of this censoring pattern (approximate)" : ""),
  };
}

function datasheetModel(material: MaterialDescription & { kind: "typed" }, confidence: number): StrengthModel {
  const { shape, scale, specimens } = material;
  const unbiased = material.unbiased ?? true;
  const parameters: FittedParameters = {
    shape,
    scale,
    mean: meanStrength({ shape, scale }),
    basis:
      "modulus and characteristic strength as typed (datasheet values, not re-estimated)" +
      (specimens ? `; ${specimens} specimens, complete sample${unbiased ? ", modulus reported unbiased" : ", modulus as solved"}` : ""),
    specimens,
    converged: true,
  };
  if (!specimens) {
    return {
      parameters,
      sample: null,
      lowerBound: null,
      boundMethod: "",
      boundMissing: "typed values without the number of specimens carry no uncertainty, so no lower confidence bound exists",
    };
  }
  const values = { shape, scale, specimens, unbiased };
  const raw = rawModulus(values);
  return {
    parameters,
    sample: null,
    lowerBound: (survival, sizeRatio) => datasheetDesignStressLower({ ...values, survival, confidence, sizeRatio }),
    boundMethod:
      `pivotal quantity for a Weibull quantile from the datasheet values, as for a complete sample of ${specimens} ` +
      `(ASTM C1239 sec. 8), on the raw maximum-likelihood modulus ${formatNumber(raw)}`,
  };
}

/** Where the search for the upper-bound failure probability stops: ln(-ln S) from -36 (Pf about 2e-16) to 3.5 (Pf 1 - 5e-15). */
const LOG_HAZARD_RANGE: [number, number] = [-36, 3.5];

/**
 * Upper bound on the failure probability at `stress` for a body `sizeRatio`
 * times the specimen: the p at which the lower-bound allowable equals the
 * stress. Below the search range it returns the range's end, an upper bound
 * still (about 2e-16).
 *
 * @example failureProbabilityUpper(model, 150, 64) // p with model.lowerBound(1 - p, 64) = 150
 */
export function failureProbabilityUpper(
  lowerBound: (survival: number, sizeRatio: number) => number,
  stress: number,
  sizeRatio: number,
): number {
  // y = ln(-ln S); S = exp(-e^y), Pf = -expm1(-e^y).
  const f = (y: number) => Math.log(lowerBound(Math.exp(-Math.exp(y)), sizeRatio)) - Math.log(stress);
  const [lo, hi] = LOG_HAZARD_RANGE;
  const pf = (y: number) => -Math.expm1(-Math.exp(y));
  if (f(lo) >= 0) return pf(lo);
  if (f(hi) <= 0) return pf(hi);
  const root = findRoot(f, lo, hi, { relativeTolerance: 1e-12 });
  if (!root.converged) throw new InputError("notConverged", "the upper bound on the failure probability did not converge");
  return pf(root.root);
}
