/**
 * What the design-check form collects, as plain data: the steps read the page
 * into these shapes, and description.ts turns them into the core's check
 * description (src/design/check-description.ts), which everything downstream
 * (the check, the cautions, the plot, the report sheet, the exports) works
 * from, never from the page.
 */
import type {
  Criterion,
  FlawKind,
  MaterialDescription,
  PartDescription,
  RequirementDescription,
  SpecimenDescription,
} from "../../src/design/check-description";

export type { CheckDescription, Criterion, DataSource, FlawKind, TableSource } from "../../src/design/check-description";
export { METHOD_LABELS } from "../../src/design/check-description";

export type MaterialInput = MaterialDescription;
export type SpecimenInput = SpecimenDescription;
export type PartInput = PartDescription;
export type RequirementInput = RequirementDescription;

/** The form's lifetime fields: one time unit for the lifetime and for B. */
export interface LifetimeInput {
  lifetime: number;
  /** "s", "h" or "years". */
  timeUnit: string;
  /** Slow-crack-growth exponent, > 2. */
  n: number;
  /** Slow-crack-growth parameter B, stress² x time unit. */
  B: number;
}

/** Everything the form's steps read, before it becomes a check description. */
export interface FormInput {
  material: MaterialInput;
  stressUnit: string;
  /** Level of the one-sided lower bound, e.g. 0.95. */
  confidence: number;
  flaws: FlawKind;
  sizeUnit: string;
  criterion: Criterion;
  specimen: SpecimenInput;
  part: PartInput;
  requirement: RequirementInput;
  /** True once the user confirmed a survival below 0.5 (or an allowed failure probability above 0.1). */
  confirmLowSurvival?: boolean;
  appliedStress: number | null;
  lotSize: number;
  lifetime: LifetimeInput | null;
  proof: { proofStress: number } | null;
}

/** Kept for the steps and tests written before the core took the check: the form's shape. */
export type DesignCheckInput = FormInput;
