/**
 * The form's inputs as the core's check description: the confidence is the
 * one-sided level of the lower bound, and the form's one time unit serves
 * both the lifetime and B (stress unit squared times that unit). The core
 * validates the result and names any field it cannot use.
 */
import type { CheckDescription, TimeUnit } from "../../src/design/check-description";
import { bUnitText } from "../../src/design/check-units";
import type { FormInput } from "./inputs";

export function toCheckDescription(form: FormInput): CheckDescription {
  const description: CheckDescription = {
    material: form.material,
    stressUnit: form.stressUnit,
    confidence: { level: form.confidence, sides: "one-sided" },
    flaws: form.flaws,
    sizeUnit: form.sizeUnit,
    criterion: form.criterion,
    specimen: form.specimen,
    part: form.part,
    requirement: form.requirement,
    appliedStress: form.appliedStress,
    lotSize: form.lotSize,
    lifetime: form.lifetime
      ? {
          lifetime: form.lifetime.lifetime,
          timeUnit: form.lifetime.timeUnit.trim() as TimeUnit,
          n: form.lifetime.n,
          B: form.lifetime.B,
          bUnit: bUnitText(form.stressUnit.trim(), form.lifetime.timeUnit.trim() as TimeUnit),
        }
      : null,
    proof: form.proof,
  };
  if (form.confirmLowSurvival !== undefined) description.confirmLowSurvival = form.confirmLowSurvival;
  return description;
}
