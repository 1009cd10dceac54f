/**
 * What the design-check form collects, as plain data: the steps read the page
 * into these shapes, and everything downstream (the check, the cautions, the
 * plot, the report sheet, the exports) works from them alone, never from the
 * page.
 */
import type { EstimationMethod } from "../../src/weibull/estimate";

/** Where measured strengths came from; a range keeps its address so the report sheet can point at it live. */
export type DataSource =
  | { kind: "pasted" }
  | { kind: "range"; strengthsAddress: string; flagsAddress?: string };

export type MaterialInput =
  | {
      kind: "data";
      strengths: number[];
      /** censored[i] true: specimen i did not fail from the population being fitted. */
      censored?: boolean[];
      method: EstimationMethod;
      source: DataSource;
    }
  | {
      kind: "typed";
      shape: number;
      scale: number;
      /** How many specimens the typed parameters came from, when known. */
      specimens?: number;
    };

export type FlawKind = "volume" | "surface";

export type Criterion = "PIA" | "NSA" | "MAXPRINCIPAL";

/** The specimen's effective size: typed, a standard configuration, or a bar's flexure dimensions (mm). */
export type SpecimenInput =
  | { kind: "typed"; effectiveSize: number }
  | { kind: "preset"; configuration: string; poisson?: number }
  | { kind: "bar"; outerSpan: number; innerSpan: number; width: number; depth: number };

/** Where an element table came from; a range keeps its addresses for the report sheet. */
export type TableSource = { kind: "pasted" } | { kind: "range"; stressesAddress: string; sizesAddress: string };

/** The part's effective size: typed, or from a table of element stresses and sizes. */
export type PartInput =
  | { kind: "typed"; effectiveSize: number }
  | {
      kind: "table";
      /** One row per element: 1, 3 or 6 stress values. */
      stresses: number[][];
      columns: 1 | 3 | 6;
      sizes: number[];
      source: TableSource;
    };

export type RequirementInput =
  | { kind: "survival"; survival: number }
  | { kind: "lot"; allowedFailures: number };

export interface DesignCheckInput {
  material: MaterialInput;
  /** Free text such as "MPa", shown next to every stress. */
  stressUnit: string;
  /** Confidence level of the lower bound, e.g. 0.9. */
  confidence: number;
  flaws: FlawKind;
  /** Free text such as "mm³" or "mm²". */
  sizeUnit: string;
  /** Multiaxial criterion for disk specimens and element tables. */
  criterion: Criterion;
  specimen: SpecimenInput;
  part: PartInput;
  requirement: RequirementInput;
  /** Peak stress the part carries in service; with an element table, null takes the table's peak. */
  appliedStress: number | null;
  /** Parts in a production lot. */
  lotSize: number;
  /** Sustained constant stress over a lifetime, with the crack-growth parameters (optional). */
  lifetime: LifetimeInput | null;
  /** A proof test of every part (optional). */
  proof: { proofStress: number } | null;
}

export interface LifetimeInput {
  /** Required life at the applied stress, in the time unit of B. */
  lifetime: number;
  timeUnit: string;
  /** Slow-crack-growth exponent, > 2. */
  n: number;
  /** Slow-crack-growth parameter B, stress² x time. */
  B: number;
}

export const METHOD_LABELS: Record<EstimationMethod, string> = {
  MLE: "maximum likelihood with the unbiased modulus (ASTM C1239, ISO 20501)",
  "MLE-RAW": "maximum likelihood (modulus as solved, not unbiased)",
  LSQ: "least squares on the probability plot, (i - 0.5)/N positions",
};
