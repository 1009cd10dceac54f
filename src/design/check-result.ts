/**
 * What a design check answers: the verdict, what it rests on, and every
 * number behind it with the method and assumptions that produced it. Plain
 * data: the pane, the printout, the report sheet and `brittle check --json`
 * present it and compute nothing of their own.
 */
import type { PlotPoint } from "../weibull/plotting-positions";
import type { StrengthSample } from "../weibull/sample";
import type { CheckDescription } from "./check-description";

/** A number with the words that say where it came from. */
export interface ResultLine {
  value: number;
  basis: string;
}

/** A quantity on the verdict's basis (the lower bound, or the point estimate when no bound exists) with the point estimate beside it. */
export interface BoundedLine {
  /** The value the verdict uses. */
  value: number;
  /** The point estimate, shown beside; never used for the verdict when a bound exists. */
  pointEstimate: number;
  basis: string;
}

/**
 * The one confidence convention: the verdict rests on a one-sided lower
 * bound; the plot's band is the two-sided interval whose lower edge is that
 * same bound.
 */
export interface ConfidenceConvention {
  /** Level of the one-sided lower bound, e.g. 0.95. */
  oneSided: number;
  /** Level of the two-sided band paired with it, 2 oneSided - 1, e.g. 0.90. */
  twoSided: number;
  /** "95 % one-sided lower bound". */
  boundLabel: string;
  /** "90 % two-sided band". */
  bandLabel: string;
  /** "the lower edge of the 90 % two-sided band is the 95 % one-sided lower bound". */
  pairing: string;
}

export interface FittedParameters {
  shape: number;
  scale: number;
  mean: number;
  /** Where the parameters came from, in words. */
  basis: string;
  specimens?: number;
  failures?: number;
  converged: boolean;
}

export type GoverningCheck = "inert" | "lifetime";

export interface Governing {
  check: GoverningCheck;
  /** What the allowable is, as a noun phrase: "inert allowable stress at the required survival", "allowable stress over 1e9 s of sustained load (slow crack growth)". */
  name: string;
  /** The allowable stress of the governing check, on the verdict's basis. */
  allowable: number;
  basis: string;
}

export interface ProofCredit {
  /** True when the proof test raised the allowable stress the verdict uses. */
  credited: boolean;
  /** How the proof test was (or was not) credited, in words. */
  text: string;
  /** Fraction of parts the proof test breaks: the upper bound on the verdict's basis, the point estimate beside. */
  breaks: BoundedLine;
  /**
   * Failure probability of proof-test survivors at the applied stress,
   * loaded fast or inert (point estimate; zero at or below the proof stress).
   */
  survivorsFailureProbability: ResultLine;
  /** Minimum life guaranteed at the applied stress (with a lifetime), in the lifetime's unit; null when none. */
  minimumLife: ResultLine | null;
}

export interface CensoringComparison {
  /** True when the censored specimens include one of the weakest (see check-censoring.ts). */
  weakestCensored: boolean;
  /** Ranks (1 = weakest) of the censored specimens. */
  censoredRanks: number[];
  text: string;
  /** The same check with every specimen counted as a failure. */
  uncensored: { shape: number; allowable: number; pass: boolean; onBound: boolean };
}

export type CautionLevel = "note" | "warning";

export interface Caution {
  id: string;
  level: CautionLevel;
  text: string;
}

export interface BasisLine {
  /** What the line is about: "verdict", "method", "bound", "confidence", "size ratio", "flaw population", ... */
  topic: string;
  text: string;
}

export interface DesignCheckResult {
  input: CheckDescription;
  sample: StrengthSample | null;
  parameters: FittedParameters;
  confidence: ConfidenceConvention;
  specimenSize: ResultLine;
  partSize: ResultLine;
  sizeRatio: ResultLine;
  /** The applied peak stress used: as typed, or the element table's peak. */
  appliedStress: ResultLine;
  /** Failure probability the requirement allows for one part. */
  targetFailureProbability: ResultLine;
  /** Inert allowable stress, point estimate. */
  allowablePoint: ResultLine;
  /** Inert allowable stress, one-sided lower bound; null when the inputs carry no uncertainty (typed values without a specimen count). */
  allowableLower: ResultLine | null;
  allowableLowerMissing?: string;
  /** Inert failure probability at the applied stress: point estimate. */
  failureProbabilityAtApplied: ResultLine;
  /** Its one-sided upper bound (the dual of the lower-bound allowable); null without a bound. */
  failureProbabilityUpper: ResultLine | null;
  /** Expected failures per lot, on the verdict's basis (the upper-bound failure probability when there is one). */
  expectedFailures: BoundedLine;
  /** Binomial count per lot not exceeded at the confidence, on the verdict's basis. */
  failuresUpperBound: BoundedLine;
  /** Lifetime allowable stress (slow crack growth), on the verdict's basis; null without a lifetime. */
  lifetimeAllowable: BoundedLine | null;
  proof: ProofCredit | null;
  governing: Governing;
  /** The highest applied stress that passes: the governing allowable. */
  highestPassingStress: ResultLine;
  /** Governing allowable / applied stress. */
  reserveFactor: ResultLine;
  /** Reserve factor - 1. */
  marginOfSafety: ResultLine;
  verdict: {
    pass: boolean;
    /** True when the verdict rests on a lower confidence bound. */
    onLowerBound: boolean;
    /** One sentence: PASS or FAIL, the governing check, the numbers, the basis. */
    text: string;
  };
  /** Every line the verdict rests on, in reading order. */
  basis: BasisLine[];
  cautions: Caution[];
  censoring: CensoringComparison | null;
  fitQuality: { statistic: number; significance: number } | null;
  fitQualityMissing?: string;
  /** One-population checks (data only). */
  populationChecks: { bend: { pValue: number; knotStrength: number } | null; lowOutlier: { pValue: number; strength: number } | null } | null;
  /** Failure probabilities of the plotted failures (specimen size). */
  points: PlotPoint[];
  censoredStrengths: number[];
  /** Decades of probability between the design point and the lowest plotted failure, at specimen size; null without data. */
  extrapolationDecades: number | null;
}
