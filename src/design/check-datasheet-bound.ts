/**
 * The design check's lower bound from datasheet values alone (the modulus,
 * the characteristic strength and the number of specimens of a complete
 * sample): the core's datasheetBounds (src/weibull/datasheet-bounds.ts, the
 * function behind DATASHEETBOUNDS), asked for the one-sided bound on the
 * design stress at the check's confidence. The data's own maximum-likelihood
 * values give the same bound as the data (test/design-check.test.ts).
 */
import { datasheetBounds } from "../weibull/datasheet-bounds";

export interface DatasheetValues {
  /** Weibull modulus as the datasheet gives it. */
  shape: number;
  /** Characteristic strength (maximum likelihood), specimen size. */
  scale: number;
  /** Specimens of the complete sample behind the values. */
  specimens: number;
  /** True: the modulus carries the unbiasing factor UF(specimens). */
  unbiased: boolean;
}

/** The raw maximum-likelihood modulus the pivotal bounds are built on (shape / UF(N) when unbiased). */
export function rawModulus(values: DatasheetValues): number {
  return datasheetBounds({ ...values, confidence: 0.9, sides: 2 }).rawShape;
}

/**
 * One-sided lower bound at `confidence` on the stress a body `sizeRatio`
 * times the specimen survives with probability `survival`.
 *
 * @example datasheetDesignStressLower({ shape: 10, scale: 400, specimens: 30, unbiased: false, survival: 0.999, confidence: 0.95, sizeRatio: 1 })
 */
export function datasheetDesignStressLower(
  values: DatasheetValues & { survival: number; confidence: number; sizeRatio: number },
): number {
  return datasheetBounds({ ...values, sides: 1 }).designStress!.lower;
}
