/**
 * Step 4, the requirement: a survival probability per part or a number of
 * expected failures per lot, the applied peak stress and the lot size; and,
 * optionally, a lifetime under that stress (slow crack growth) and a proof
 * test of every part.
 */
import { byId, FieldError, radioValue, readNumberField, requiredNumber } from "../app/dom";
import type { LifetimeInput, RequirementInput } from "../app/inputs";

export const REQUIREMENT_FIELDS = ["survival", "allowed-failures", "applied-stress", "lot-size", "lifetime", "time-unit", "scg-n", "scg-b", "proof-stress"];

export function setupRequirement(onChange: () => void): void {
  for (const [box, fields] of [["use-lifetime", "lifetime-fields"], ["use-proof", "proof-fields"]]) {
    byId<HTMLInputElement>(box).addEventListener("change", () => {
      byId(fields).hidden = !byId<HTMLInputElement>(box).checked;
      onChange();
    });
  }
  for (const radio of document.querySelectorAll<HTMLInputElement>('input[name="target"]')) {
    radio.addEventListener("change", () => {
      const lot = radioValue("target") === "lot";
      byId("target-survival").hidden = lot;
      byId("target-lot").hidden = !lot;
      onChange();
    });
  }
}

export function readRequirement(): {
  requirement: RequirementInput;
  appliedStress: number | null;
  lotSize: number;
  lifetime: LifetimeInput | null;
  proof: { proofStress: number } | null;
} {
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
  let lifetime: LifetimeInput | null = null;
  if (byId<HTMLInputElement>("use-lifetime").checked) {
    const life = requiredNumber("lifetime", "required life", { positive: true });
    const timeUnit = byId<HTMLInputElement>("time-unit").value.trim();
    if (timeUnit === "") throw new FieldError("time-unit", "Enter the time unit of B (for example s).");
    const n = requiredNumber("scg-n", "crack-growth exponent n");
    if (!(n > 2)) throw new FieldError("scg-n", "The crack-growth exponent n must be greater than 2.");
    const B = requiredNumber("scg-b", "crack-growth parameter B", { positive: true });
    lifetime = { lifetime: life, timeUnit, n, B };
  }
  const proof = byId<HTMLInputElement>("use-proof").checked
    ? { proofStress: requiredNumber("proof-stress", "proof stress", { positive: true }) }
    : null;
  return { requirement, appliedStress, lotSize, lifetime, proof };
}
