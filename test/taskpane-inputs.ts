// A design-check description shared by the design-check and task-pane tests; the data are invented (no real material).
import type { CheckDescription } from "../src/design/check-description";

// 15 strengths in MPa.
export const STRENGTHS = [412.5, 398.1, 455.0, 430.2, 377.9, 441.7, 405.3, 468.4, 421.0, 389.6, 436.8, 447.2, 415.9, 401.4, 459.3];

export function input(overrides: Partial<CheckDescription> = {}): CheckDescription {
  return {
    material: { kind: "data", strengths: STRENGTHS, method: "MLE-RAW", source: { kind: "pasted" } },
    stressUnit: "MPa",
    confidence: { level: 0.9, sides: "one-sided" },
    flaws: "volume",
    sizeUnit: "mm^3",
    criterion: "PIA",
    specimen: { kind: "typed", effectiveSize: 12.5 },
    part: { kind: "typed", effectiveSize: 800 },
    requirement: { kind: "survival", survival: 0.9999 },
    appliedStress: 180,
    lotSize: 5000,
    lifetime: null,
    proof: null,
    ...overrides,
  };
}
