/**
 * Confidence bounds from datasheet values: a Weibull modulus, a characteristic
 * strength and the number of specimens of a complete sample, when the
 * strengths themselves are not at hand.
 *
 * The pivotal quantities q = m_hat/m and t = m_hat ln(th_hat/th) of a
 * complete sample depend on its size only (Thoman, Bain & Antle 1969; ASTM
 * C1239 section 8), so the raw maximum-likelihood estimates and N are all the
 * bounds need. A datasheet that follows ASTM C1239 reports the unbiased
 * modulus UF(N) m_hat; dividing by the tabulated UF(N) recovers m_hat
 * (`unbiased`, default true). The arithmetic is the one the bounds from data
 * use (confidence-bounds.ts, design-stress-bound.ts), so the data's own ML
 * values give exactly the bounds computed from the data.
 *
 * One confidence for everything: the parameter intervals are two-sided at C
 * (or one-sided with sides = 1), and the design-stress lower bound is the
 * one-sided bound at the confidence of the intervals' lower ends, (1 + C)/2
 * two-sided, so it meets the lower end of a two-sided band at the same C.
 *
 * @example
 * // A datasheet: m = 10.2 (unbiased), characteristic strength 412 MPa, 30 bars.
 * datasheetBounds({ shape: 10.2, scale: 412, specimens: 30, survival: 0.999 })
 * // -> { shape: { lower, upper }, scale: { lower, upper }, designStress: { estimate, lower, confidence: 0.95 }, ... }
 */
import { ensure, ensurePositive, ensureProbability } from "../errors";
import { boundsFromPivots, tablePivotalSource, tailProbabilities, type BoundSides, type Interval } from "./confidence-bounds";
import { boundFromPivot } from "./design-stress-bound";
import { pivotalTable } from "./pivotal-table";
import { quantilePivotQuantile } from "./quantile-pivot-table";

export interface DatasheetBoundsInput {
  /** Weibull modulus as the datasheet gives it. */
  shape: number;
  /** Characteristic strength (maximum likelihood) as the datasheet gives it. */
  scale: number;
  /** Number of specimens tested, all failed (a complete sample). */
  specimens: number;
  /** Whether `shape` carries the unbiasing factor (ASTM C1239 practice); default true. */
  unbiased?: boolean;
  /** Confidence of the parameter intervals; default 0.90. */
  confidence?: number;
  /** 2 (default): two-sided intervals; 1: each end a one-sided bound at `confidence`. */
  sides?: BoundSides;
  /** Survival probability for a design stress and its lower bound; none when absent. */
  survival?: number;
  /** Effective size of the part over that of the specimens; default 1. */
  sizeRatio?: number;
}

export interface DatasheetBounds {
  /** The raw maximum-likelihood modulus the bounds rest on (shape / UF(N) when `unbiased`). */
  rawShape: number;
  /** The unbiasing factor divided out (1 when the modulus was typed raw). */
  unbiasingFactor: number;
  shape: Interval;
  scale: Interval;
  confidence: number;
  sides: BoundSides;
  /** Present when a survival probability was given. */
  designStress?: {
    /** Point estimate from the raw ML values: the bound's centre. */
    estimate: number;
    lower: number;
    /** One-sided confidence of `lower`. */
    confidence: number;
  };
}

export function datasheetBounds({
  shape,
  scale,
  specimens,
  unbiased = true,
  confidence = 0.9,
  sides = 2,
  survival,
  sizeRatio = 1,
}: DatasheetBoundsInput): DatasheetBounds {
  ensurePositive(shape, "modulus");
  ensurePositive(scale, "characteristic strength");
  ensure(
    Number.isInteger(specimens) && specimens >= 2,
    () => `the number of specimens must be a whole number of at least 2 (got ${specimens})`,
  );
  ensure(
    !unbiased || specimens >= 3,
    "an unbiased modulus cannot come from 2 specimens (no unbiasing factor exists there): type the raw maximum-likelihood modulus and set unbiased to FALSE",
  );
  const { forLower } = tailProbabilities(confidence, sides);
  if (survival !== undefined) ensureProbability(survival, "survival probability");
  ensurePositive(sizeRatio, "size ratio");

  const unbiasingFactor = unbiased ? pivotalTable().unbiasingFactor(specimens) : 1;
  const fit = { shape: shape / unbiasingFactor, scale };
  const { shape: shapeBounds, scale: scaleBounds } = boundsFromPivots(fit, tablePivotalSource(specimens), confidence, sides);
  const result: DatasheetBounds = { rawShape: fit.shape, unbiasingFactor, shape: shapeBounds, scale: scaleBounds, confidence, sides };
  if (survival !== undefined) {
    // -ln S is exact for S near 1 (no 1 - S subtraction).
    const w = Math.log(-Math.log(survival)) - Math.log(sizeRatio);
    const uC = quantilePivotQuantile({ specimens, logHazard: w, probability: forLower });
    result.designStress = { ...boundFromPivot(fit, w, uC), confidence: forLower };
  }
  return result;
}
