/**
 * The confidence band a probability plot draws around a check's Weibull
 * line, on the one convention (confidence-convention.ts): the two-sided band
 * at 2C - 1 whose lower edge is the one-sided lower bound at C, the very
 * bound the verdict uses. Drawn at the part's size and evaluated at the
 * allowed failure probability too, the lower edge passes exactly through the
 * lower-bound allowable.
 */
import type { DesignCheckResult } from "./check-result";
import { strengthModel } from "./check-strength";

export interface BandPoint {
  probability: number;
  /** One-sided lower bound at C: the band's lower edge. */
  lower: number;
  /** One-sided upper bound at C (the lower bound at 1 - C): the band's upper edge. */
  upper: number;
}

/** Why a result has no band, or null when it has one. */
export function bandMissing(result: DesignCheckResult): string | null {
  if (!result.allowableLower) return "no confidence band: the inputs carry no uncertainty (typed values without the number of specimens)";
  // A censored sample's bound simulates its censoring pattern on every call: one bound is quick, a band of fifty is not.
  if (result.censoredStrengths.length > 0) return "no confidence band: drawn for complete samples only";
  return null;
}

/**
 * The band at the failure probabilities given (for a body `sizeRatio` times
 * the specimen), or null when the result has none (see bandMissing).
 *
 * @example confidenceBand(result, [1e-4, 0.01, 0.5], result.sizeRatio.value)
 */
export function confidenceBand(result: DesignCheckResult, probabilities: readonly number[], sizeRatio: number): BandPoint[] | null {
  if (bandMissing(result) !== null) return null;
  const c = result.confidence.oneSided;
  const lowerModel = strengthModel(result.input.material, c).lowerBound!;
  const upperModel = strengthModel(result.input.material, 1 - c).lowerBound!;
  return probabilities.map((p) => {
    const survival = 1 - p;
    return { probability: p, lower: lowerModel(survival, sizeRatio), upper: upperModel(survival, sizeRatio) };
  });
}
