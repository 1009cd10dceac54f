/**
 * Lower confidence bound on the design stress from datasheet values alone:
 * the modulus, the characteristic strength and the number of specimens of a
 * complete sample. The pivotal quantity u = m_hat ln(x_hat / x) of a Weibull
 * quantile depends on the sample size and w only (design-stress-bound.ts), so
 * the raw maximum-likelihood values and N give the same bound the data would:
 *
 *   x_L = th_hat exp((w - u_C(N, w)) / m_raw),   w = ln(-ln S) - ln k,
 *
 * with m_raw = m / UF(N) when the datasheet reports the unbiased modulus (as
 * ASTM C1239 datasheets do).
 *
 * Interface note: the cell function DATASHEETBOUNDS gets its own core
 * function (src/weibull/datasheet-bounds.ts) from the numbers work; once it is
 * on main this file forwards to it, keeping this signature.
 */
import { quantilePivotQuantile } from "../weibull/quantile-pivot-table";
import { unbiasingFactor } from "../weibull/unbiasing";

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

/** The raw maximum-likelihood modulus the pivotal bounds are built on. */
export function rawModulus({ shape, specimens, unbiased }: DatasheetValues): number {
  return unbiased ? shape / unbiasingFactor(specimens) : shape;
}

/**
 * @example datasheetDesignStressLower({ shape: 10, scale: 400, specimens: 30, unbiased: false, survival: 0.999, confidence: 0.95, sizeRatio: 1 })
 */
export function datasheetDesignStressLower(
  values: DatasheetValues & { survival: number; confidence: number; sizeRatio: number },
): number {
  const m = rawModulus(values);
  const w = Math.log(-Math.log(values.survival)) - Math.log(values.sizeRatio);
  const uC = quantilePivotQuantile({ specimens: values.specimens, logHazard: w, probability: values.confidence });
  return values.scale * Math.exp((w - uC) / m);
}
