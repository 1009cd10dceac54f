/**
 * What a design check is asked: every input as plain, JSON-able data, so the
 * same object comes from the task pane's form, from a saved `*.check.json`
 * file, or from a test, and the verdict can be rerun from it alone.
 *
 * Units travel with the numbers that need them: effective sizes in
 * `sizeUnit` (a length unit squared or cubed, matching the flaw kind), the
 * lifetime in `timeUnit`, the crack-growth parameter B in `bUnit` (the stress
 * unit squared times a time unit). Stresses are in `stressUnit`, free text,
 * because no stress is ever converted: every stress of one check shares it.
 */
import type { EstimationMethod } from "../weibull/estimate";

/** Version of the description (and of the check file that stores it). */
export const CHECK_FORMAT = "brittle-design-check";
export const CHECK_FORMAT_VERSION = 1;

/** Where measured strengths came from; a range keeps its address so a report can point at it. */
export type DataSource = { kind: "pasted" } | { kind: "file" } | { kind: "range"; strengthsAddress: string; flagsAddress?: string };

export type MaterialDescription =
  | {
      kind: "data";
      strengths: number[];
      /** censored[i] true: specimen i did not fail from the population being fitted. */
      censored?: boolean[];
      method: EstimationMethod;
      source?: DataSource;
    }
  | {
      /** Datasheet values: the Weibull modulus and characteristic strength, at specimen size. */
      kind: "typed";
      shape: number;
      scale: number;
      /**
       * Number of specimens behind the typed values (a complete sample). With
       * it the check gives lower confidence bounds; without it, point
       * estimates only.
       */
      specimens?: number;
      /**
       * True (the default, as ASTM C1239 datasheets report it): the typed
       * modulus carries the unbiasing factor for `specimens`.
       */
      unbiased?: boolean;
    };

export type FlawKind = "volume" | "surface";
export type Criterion = "PIA" | "NSA" | "MAXPRINCIPAL";

/** The specimen's effective size: typed (in sizeUnit), a standard configuration, or a bar's flexure dimensions (mm). */
export type SpecimenDescription =
  | { kind: "typed"; effectiveSize: number }
  | { kind: "preset"; configuration: string; poisson?: number }
  | { kind: "bar"; outerSpan: number; innerSpan: number; width: number; depth: number };

/** Where an element table came from; a range keeps its addresses for a report. */
export type TableSource = { kind: "pasted" } | { kind: "file" } | { kind: "range"; stressesAddress: string; sizesAddress: string };

/** The part's effective size: typed (in sizeUnit), or from a table of element stresses and sizes (sizes in sizeUnit). */
export type PartDescription =
  | { kind: "typed"; effectiveSize: number }
  | {
      kind: "table";
      /** One row per element: 1, 3 or 6 stress values. */
      stresses: number[][];
      columns: 1 | 3 | 6;
      sizes: number[];
      source?: TableSource;
    };

export type RequirementDescription =
  | { kind: "survival"; survival: number }
  | { kind: "lot"; allowedFailures: number };

/**
 * The confidence of the lower bound the verdict rests on. "one-sided": the
 * lower bound at `level` (0.95: the 95 % one-sided lower bound). "two-sided":
 * the lower end of a two-sided interval at `level`, which is the one-sided
 * bound at (1 + level)/2 (90 % two-sided gives the 95 % one-sided bound).
 */
export interface ConfidenceDescription {
  level: number;
  sides: "one-sided" | "two-sided";
}

export type TimeUnit = "s" | "h" | "years";

export interface LifetimeDescription {
  /** Required life at the applied stress, in timeUnit. */
  lifetime: number;
  timeUnit: TimeUnit;
  /** Slow-crack-growth exponent, > 2. */
  n: number;
  /** Slow-crack-growth parameter B, in bUnit. */
  B: number;
  /** Unit of B: the stress unit squared times a time unit, written "MPa^2 s" (also "MPa² h", "MPa^2 years"). */
  bUnit: string;
}

export interface CheckDescription {
  /** Free text naming the check (part, drawing), shown in reports. */
  title?: string;
  material: MaterialDescription;
  /** Free text such as "MPa", shown next to every stress; all stresses share it. */
  stressUnit: string;
  /** Default: 0.95 one-sided. */
  confidence: ConfidenceDescription;
  flaws: FlawKind;
  /** Unit of every typed effective size and of the element table's sizes: mm^3, cm^3, m^3, in^3 (volume) or mm^2, cm^2, m^2, in^2 (surface). */
  sizeUnit: string;
  /** Multiaxial criterion for disk specimens and element tables. */
  criterion: Criterion;
  specimen: SpecimenDescription;
  part: PartDescription;
  requirement: RequirementDescription;
  /**
   * A required survival below 0.5 (or an allowed failure probability above
   * 0.1) is refused unless this is true: such a value is more often a failure
   * probability typed where the survival was meant.
   */
  confirmLowSurvival?: boolean;
  /** Peak stress the part carries in service; with an element table, null takes the table's peak. */
  appliedStress: number | null;
  /** Parts in a production lot. */
  lotSize: number;
  /** Sustained constant stress over a lifetime, with the crack-growth parameters (optional). */
  lifetime: LifetimeDescription | null;
  /** A proof test of every part (optional). */
  proof: { proofStress: number } | null;
}

/** The confidence every surface uses unless told otherwise: the number to design on. */
export const DEFAULT_CONFIDENCE: ConfidenceDescription = { level: 0.95, sides: "one-sided" };

/**
 * A required survival per part below this needs confirmLowSurvival: a failure probability above
 * 0.1, the same limit as the lot form's (a survival of 0.6 was accepted unasked while 0.2 allowed
 * failures a part was refused).
 */
export const LOW_SURVIVAL = 0.9;
/** An allowed failure probability per part above this needs confirmLowSurvival. */
export const HIGH_FAILURE_PROBABILITY = 0.1;

export const METHOD_LABELS: Record<EstimationMethod, string> = {
  MLE: "maximum likelihood with the unbiased modulus (ASTM C1239, ISO 20501)",
  "MLE-RAW": "maximum likelihood (modulus as solved, not unbiased)",
  LSQ: "least squares on the probability plot, (i - 0.5)/N positions",
};
