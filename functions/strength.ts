/**
 * Cell adapters for fitting strength data and designing with the fit.
 * Each reads its cells through cells.ts and calls one core function; the
 * JSDoc here is the source of functions.json (custom-functions-metadata).
 */
import { expectedFailures, failuresUpperBound } from "../src/design/lot-failures";
import { materialScale, scaleStrengthToSize } from "../src/design/size-scaling";
import {
  designStress,
  failureProbability,
  meanStrength,
  scaleFromMean,
  scaleFromMedian,
} from "../src/weibull/distribution";
import { estimateCharacteristicStrength, estimateWeibull } from "../src/weibull/estimate";
import { readNumber, readOptionalNumber, readSample } from "./cells";
import { readMethod } from "./fit-method";

function fitCells(strengths: unknown, censored: unknown, method: unknown) {
  const sample = readSample(strengths, censored);
  const { method: how, estimator } = readMethod(method);
  return estimateWeibull(sample, how, estimator);
}

/**
 * Weibull modulus m of a set of fracture strengths. Default: maximum likelihood with the unbiasing factor of
 * ASTM C1239 / ISO 20501 practice, defined as UF(N) = 1/E[m_hat/m] (docs/methods.md section 2), tabulated for N = 3 to
 * 500 and fitted beyond (censored samples: from a seeded bootstrap of competing flaw populations); with two failures no
 * factor exists (#N/A: use "MLE-RAW"). Blank cells and zeros are skipped.
 * Example: =BRITTLE.MODULUS(B2:B31) gives the modulus of the bend strengths in B2:B31.
 * @customfunction
 * @cancelable
 * @param strengths Fracture strengths, one per specimen (MPa or any stress unit). Blanks and zeros are skipped.
 * @param [censored] Optional flags, same shape as strengths: TRUE or 1 where the specimen did not fail from the population being fitted (censored), FALSE, 0 or blank where it did.
 * @param [method] "MLE" (default, unbiased maximum likelihood), "MLE-RAW" (maximum likelihood without unbiasing), "LSQ" (least squares on the probability plot, (i-0.5)/N positions), "LSQ-MEANRANK" (i/(N+1)) or "LSQ-MEDIANRANK" ((i-0.3)/(N+0.4)).
 * @returns Weibull modulus m (dimensionless).
 */
export function MODULUS(strengths: any[][], censored?: any[][], method?: string): number {
  return fitCells(strengths, censored, method).shape;
}

/**
 * Characteristic strength (Weibull scale parameter) of a set of fracture strengths: the stress at which 63.2 % of
 * specimens of the tested size fail. With "MLE" or "MLE-RAW" it is the maximum-likelihood value (unbiasing applies
 * to the modulus only, so two failures suffice). Example: =BRITTLE.CHARSTRENGTH(B2:B31) returns a stress in the units of B2:B31.
 * @customfunction
 * @param strengths Fracture strengths, one per specimen (MPa or any stress unit). Blanks and zeros are skipped.
 * @param [censored] Optional flags, same shape as strengths: TRUE or 1 where the specimen did not fail from the population being fitted.
 * @param [method] "MLE" (default), "MLE-RAW", "LSQ", "LSQ-MEANRANK" or "LSQ-MEDIANRANK".
 * @returns Characteristic strength, in the units of the strengths.
 */
export function CHARSTRENGTH(strengths: any[][], censored?: any[][], method?: string): number {
  const { method: how, estimator } = readMethod(method);
  return estimateCharacteristicStrength(readSample(strengths, censored), how, estimator);
}

/**
 * Probability that a body fails at or below a stress: 1 - exp(-k (stress/charStrength)^modulus), accurate down to
 * 1e-300. Example: =BRITTLE.FAILPROB(200, 10, 400) is about 0.000976.
 * @customfunction
 * @param stress Applied peak stress (same unit as charStrength).
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param charStrength Characteristic strength of the tested specimens (stress unit, > 0).
 * @param [sizeRatio] Effective size of the part divided by that of the specimens (dimensionless, > 0); default 1.
 * @returns Failure probability, between 0 and 1.
 */
export function FAILPROB(stress: number, modulus: number, charStrength: number, sizeRatio?: number): number {
  return failureProbability({
    stress: readNumber(stress, "stress"),
    shape: readNumber(modulus, "modulus"),
    scale: readNumber(charStrength, "charStrength"),
    sizeRatio: readOptionalNumber(sizeRatio, "sizeRatio", 1),
  });
}

/**
 * Design stress: the peak stress at which a body survives with the stated probability, for a part whose effective
 * size is sizeRatio times the specimens'. Example: =BRITTLE.DESIGNSTRESS(0.9999, 10, 400, 25) is about 115.4.
 * @customfunction
 * @param survival Required survival probability, strictly between 0 and 1 (e.g. 0.9999).
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param charStrength Characteristic strength of the tested specimens (stress unit, > 0).
 * @param [sizeRatio] Effective size of the part divided by that of the specimens (dimensionless, > 0); default 1.
 * @returns Allowable peak stress, in the units of charStrength.
 */
export function DESIGNSTRESS(survival: number, modulus: number, charStrength: number, sizeRatio?: number): number {
  return designStress({
    survival: readNumber(survival, "survival"),
    shape: readNumber(modulus, "modulus"),
    scale: readNumber(charStrength, "charStrength"),
    sizeRatio: readOptionalNumber(sizeRatio, "sizeRatio", 1),
  });
}

/**
 * Scale a strength (characteristic, mean or any quantile) from one effective size to another with the weakest-link
 * size effect: strength * (fromSize/toSize)^(1/modulus). Example: =BRITTLE.SIZESCALE(400, 10, 1.5, 150) is about 252.4.
 * @customfunction
 * @param strength Strength at the first size (stress unit, > 0).
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param fromSize Effective volume or area of the tested body (any unit, > 0).
 * @param toSize Effective volume or area of the other body (same unit as fromSize, > 0).
 * @returns Strength at the other size, in the units of strength.
 */
export function SIZESCALE(strength: number, modulus: number, fromSize: number, toSize: number): number {
  return scaleStrengthToSize({
    strength: readNumber(strength, "strength"),
    shape: readNumber(modulus, "modulus"),
    fromSize: readNumber(fromSize, "fromSize"),
    toSize: readNumber(toSize, "toSize"),
  });
}

/**
 * Characteristic strength implied by a mean strength: mean / Gamma(1 + 1/modulus). Datasheets usually quote the
 * mean. Example: =BRITTLE.CHARFROMMEAN(380, 10) is about 399.4.
 * @customfunction
 * @param mean Mean (average) strength (stress unit, > 0).
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @returns Characteristic strength, in the units of mean.
 */
export function CHARFROMMEAN(mean: number, modulus: number): number {
  return scaleFromMean({ mean: readNumber(mean, "mean"), shape: readNumber(modulus, "modulus") });
}

/**
 * Characteristic strength implied by a median strength: median / (ln 2)^(1/modulus).
 * Example: =BRITTLE.CHARFROMMEDIAN(385, 10) is about 399.4.
 * @customfunction
 * @param median Median strength (stress unit, > 0).
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @returns Characteristic strength, in the units of median.
 */
export function CHARFROMMEDIAN(median: number, modulus: number): number {
  return scaleFromMedian({ median: readNumber(median, "median"), shape: readNumber(modulus, "modulus") });
}

/**
 * Mean strength of a Weibull distribution: charStrength * Gamma(1 + 1/modulus).
 * Example: =BRITTLE.MEANSTRENGTH(10, 400) is about 380.5.
 * @customfunction
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param charStrength Characteristic strength (stress unit, > 0).
 * @returns Mean strength, in the units of charStrength.
 */
export function MEANSTRENGTH(modulus: number, charStrength: number): number {
  return meanStrength({ shape: readNumber(modulus, "modulus"), scale: readNumber(charStrength, "charStrength") });
}

/**
 * Material scale parameter sigma_0 = charStrength * effSize^(1/modulus): the characteristic strength of a unit
 * effective volume or area (ASTM C1683). Example: =BRITTLE.MATERIALSCALE(400, 10, 1.5) is about 416.6
 * (MPa mm^(3/m) when effSize is in mm^3).
 * @customfunction
 * @param charStrength Characteristic strength of the tested specimens (stress unit, > 0).
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param effSize Effective volume or area of the tested specimens (e.g. mm^3 or mm^2, > 0).
 * @returns Material scale parameter, in stress x size^(1/m).
 */
export function MATERIALSCALE(charStrength: number, modulus: number, effSize: number): number {
  return materialScale({
    scale: readNumber(charStrength, "charStrength"),
    shape: readNumber(modulus, "modulus"),
    effectiveSize: readNumber(effSize, "effSize"),
  });
}

/**
 * Failures to expect in a production lot: lotSize * failProb; with a confidence, the count not exceeded with that
 * probability (upper binomial bound). Example: =BRITTLE.LOTFAILURES(0.0001, 10000, 0.95) is 3.
 * @customfunction
 * @param failProb Failure probability of one part, from 0 up to (not including) 1.
 * @param lotSize Number of parts in the lot (whole number, 1 to 1e9).
 * @param [confidence] Optional confidence for the upper bound, strictly between 0 and 1 (e.g. 0.95).
 * @returns Expected number of failures, or the upper bound on the count at the confidence.
 */
export function LOTFAILURES(failProb: number, lotSize: number, confidence?: number): number {
  const args = { failureProbability: readNumber(failProb, "failProb"), lotSize: readNumber(lotSize, "lotSize") };
  if (confidence === null || confidence === undefined) return expectedFailures(args);
  return failuresUpperBound({ ...args, confidence: readNumber(confidence, "confidence") });
}
