/**
 * Step 4, the requirement: a survival probability per part or a number of
 * expected failures per lot, the applied peak stress and the lot size.
 * Lifetime under sustained load and proof testing plug in here when the
 * slow-crack-growth functions land.
 */
import { byId, FieldError, radioValue, readNumberField, requiredNumber } from "../app/dom";
import type { RequirementInput } from "../app/inputs";
import { MISSING } from "../app/optional-core";

export const REQUIREMENT_FIELDS = ["survival", "allowed-failures", "applied-stress", "lot-size"];

export function setupRequirement(onChange: () => void): void {
  byId("requirement-pending").textContent = `Planned here: ${MISSING.lifetime}.`;
  for (const radio of document.querySelectorAll<HTMLInputElement>('input[name="target"]')) {
    radio.addEventListener("change", () => {
      const lot = radioValue("target") === "lot";
      byId("target-survival").hidden = lot;
      byId("target-lot").hidden = !lot;
      onChange();
    });
  }
}

export function readRequirement(): { requirement: RequirementInput; appliedStress: number | null; lotSize: number } {
  const lotSize = requiredNumber("lot-size", "number of parts per lot", { positive: true, integer: true });
  if (lotSize > 1e9) throw new FieldError("lot-size", "The lot size must be at most 1e9 parts.");
  let requirement: RequirementInput;
  if (radioValue("target") === "lot") {
    const allowedFailures = requiredNumber("allowed-failures", "number of failures allowed per lot", { positive: true });
    if (allowedFailures >= lotSize) throw new FieldError("allowed-failures", "The failures allowed must be fewer than the parts per lot.");
    requirement = { kind: "lot", allowedFailures };
  } else {
    requirement = { kind: "survival", survival: requiredNumber("survival", "required survival probability", { probability: true }) };
  }
  // With an element table the applied stress may stay empty: the table's peak is then used.
  const fromTable = radioValue("part-source") === "table";
  const appliedStress = fromTable
    ? (readNumberField("applied-stress", "applied peak stress", { positive: true, optional: true }) ?? null)
    : requiredNumber("applied-stress", "applied peak stress", { positive: true });
  return { requirement, appliedStress, lotSize };
}
