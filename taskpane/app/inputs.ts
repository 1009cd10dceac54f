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

/** An effective size and a short phrase saying where it came from ("typed", "ASTM C1161 B, four-point"...). */
export interface SizeInput {
  effectiveSize: number;
  how: string;
}

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
  specimen: SizeInput;
  part: SizeInput;
  requirement: RequirementInput;
  /** Peak stress the part carries in service. */
  appliedStress: number;
  /** Parts in a production lot. */
  lotSize: number;
}

export const METHOD_LABELS: Record<EstimationMethod, string> = {
  MLE: "maximum likelihood with the unbiased modulus (ASTM C1239, ISO 20501)",
  "MLE-RAW": "maximum likelihood (modulus as solved, not unbiased)",
  LSQ: "least squares on the probability plot, (i - 0.5)/N positions",
};
