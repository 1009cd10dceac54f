/**
 * The plug-in point for parts of the core that arrive with later work:
 * confidence bounds and fit quality (issue 3), effective sizes of specimens
 * and parts (issue 4), lifetime and proof testing (issue 5). Each entry is
 * filled in here, in one place, when its core module lands; until then the
 * form takes the typed path and says in the result that the piece is missing.
 *
 * Nothing here computes anything: each entry only forwards to the core.
 */
import type { StrengthSample } from "../../src/weibull/sample";

export interface FitQuality {
  /** Modified Anderson-Darling statistic A*. */
  statistic: number;
  /** Observed significance level of A*. */
  significance: number;
}

export interface OptionalCore {
  /**
   * One-sided lower confidence bound on the stress at which a body of
   * relative size `sizeRatio` survives with probability `survival`.
   */
  designStressLowerBound?: (args: {
    sample: StrengthSample;
    survival: number;
    confidence: number;
    sizeRatio: number;
  }) => number;
  fitQuality?: (sample: StrengthSample) => FitQuality;
  /** Tests that one flaw population explains the sample: a bend in the plot, an outlying lowest strength. */
  populationChecks?: (sample: StrengthSample) => PopulationChecks;
}

export interface PopulationChecks {
  /** Null when the sample is too small for the test. */
  bend: { pValue: number; knotStrength: number } | null;
  lowOutlier: { pValue: number; strength: number } | null;
}

export const optionalCore: OptionalCore = {};

/** Why a piece is missing, in words the result can show. */
export const MISSING = {
  bounds: "confidence bounds are not in this build yet, so no lower-bound allowable is given",
  fitQuality: "the Anderson-Darling test is not in this build yet",
} as const;
