/**
 * The plug-in point for the core's uncertainty pieces: the lower confidence
 * bound on the design stress, goodness of fit, and the one-population
 * checks. The form works without any of them (tests take them out to check
 * that path) and says in the result what is missing; here each is wired to
 * the core.
 *
 * Nothing here computes anything: each entry only forwards to the core.
 */
import { fitQuality } from "../../src/weibull/anderson-darling";
import { designStressBound } from "../../src/weibull/design-stress-bound";
import { singlePopulationChecks } from "../../src/weibull/single-population-checks";
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

export const optionalCore: OptionalCore = {
  designStressLowerBound: ({ sample, survival, confidence, sizeRatio }) =>
    designStressBound({ strengths: sample.strengths, censored: sample.censored, survival, confidence, sizeRatio }).lower,
  fitQuality: (sample) => {
    const q = fitQuality(sample);
    return { statistic: q.aStar, significance: q.osl };
  },
  populationChecks: (sample) => {
    const c = singlePopulationChecks(sample);
    return {
      bend: c.bilinear ? { pValue: c.bilinear.pValue, knotStrength: c.bilinear.knotStrength } : null,
      lowOutlier: c.lowOutlier ? { pValue: c.lowOutlier.pValue, strength: c.lowOutlier.strength } : null,
    };
  },
};

/** Why a piece is missing, in words the result can show. */
export const MISSING = {
  bounds: "confidence bounds are not in this build yet, so no lower-bound allowable is given",
  fitQuality: "the Anderson-Darling test is not in this build yet",
} as const;
