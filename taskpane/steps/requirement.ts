/**
 * Step 4, the requirement: a survival probability per part or a number of
 * expected failures per lot, the applied peak stress and the lot size; and,
 * optionally, a lifetime under that stress (slow crack growth, in s, h or
 * years, with B in the stress unit squared times that time unit) and a
 * proof test of every part.
 *
 * A survival below 0.9 (a failure probability above 0.1), or an allowed failure probability above 0.1, is far
 * more often a failure probability typed where the survival was meant than
 * a real target: the form asks for confirmation before it checks against it.
 * A confirmation holds for the target it was given for: typing another value
 * (0.0001 after a confirmed 0.8) asks again.
 */
import type { CheckDescription, LifetimeDescription, RequirementDescription, TimeUnit } from "../../src/design/check-description";
import { HIGH_FAILURE_PROBABILITY, LOW_SURVIVAL } from "../../src/design/check-description";
import { bUnitText, convertTime, parseBUnit } from "../../src/design/check-units";
import { byId, FieldError, fieldNumber, radioValue, readNumberField, requiredNumber } from "../app/dom";
import { setCheckbox, setRadio, setSelect } from "./fill";

export const REQUIREMENT_FIELDS = ["survival", "allowed-failures", "applied-stress", "lot-size", "lifetime", "time-unit", "scg-n", "scg-b", "proof-stress"];

/** The low target the box was ticked for (its guard text names the value and the lot), or null. */
let confirmedFor: string | null = null;

export function setupRequirement(onChange: () => void): void {
  byId<HTMLInputElement>("confirm-low-survival").addEventListener("change", (e) => {
    confirmedFor = (e.target as HTMLInputElement).checked ? impliedFailureProbability().text : null;
  });
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
  const showBUnit = () => {
    const stress = byId<HTMLInputElement>("stress-unit").value.trim() || "stress";
    byId("b-unit").textContent = bUnitText(stress, byId<HTMLSelectElement>("time-unit").value as TimeUnit).replace("^2", "²");
  };
  byId("stress-unit").addEventListener("input", showBUnit);
  byId("time-unit").addEventListener("change", showBUnit);
  showBUnit();
}

/**
 * The failure probability per part the target implies, when the typed
 * values give one; null while a field is incomplete (its own error shows).
 */
function impliedFailureProbability(): { low: boolean; text: string } {
  const lot = radioValue("target") === "lot";
  // Read as the fields themselves are read (a survival typed as "50 %" is 0.5 here too); NaN where a field is refused.
  const value = typedValue(lot ? "allowed-failures" : "survival", !lot);
  const lotSize = typedValue("lot-size", false);
  if (!lot) {
    if (!(value > 0 && value < LOW_SURVIVAL)) return { low: false, text: "" };
    return {
      low: true,
      text:
        `A required survival of ${value} means ${Number(((1 - value) * 100).toPrecision(6))} % of parts may fail. If ${value} is the ` +
        `allowed failure probability, type the survival ${Number((1 - value).toPrecision(12))} instead.`,
    };
  }
  const pf = value / lotSize;
  if (!(pf > HIGH_FAILURE_PROBABILITY && pf < 1)) return { low: false, text: "" };
  return {
    low: true,
    text: `${value} failures allowed in a lot of ${lotSize} is ${Number((pf * 100).toPrecision(4))} % of parts: far above the usual design targets.`,
  };
}

function typedValue(id: string, probability: boolean): number {
  try {
    return fieldNumber(id, byId<HTMLInputElement>(id).value, id, { probability, optional: true }) ?? Number.NaN;
  } catch {
    return Number.NaN;
  }
}

export function readRequirement(): {
  requirement: RequirementDescription;
  confirmLowSurvival: boolean;
  appliedStress: number | null;
  lotSize: number;
  lifetime: LifetimeDescription | null;
  proof: { proofStress: number } | null;
} {
  const guard = impliedFailureProbability();
  const box = byId<HTMLInputElement>("confirm-low-survival");
  if (box.checked && guard.low && guard.text !== confirmedFor) box.checked = false;
  byId("low-survival").hidden = !guard.low;
  byId("low-survival-text").textContent = guard.text;
  const lotSize = requiredNumber("lot-size", "number of parts per lot", { positive: true, integer: true });
  if (lotSize > 1e9) throw new FieldError("lot-size", "The lot size must be at most 1e9 parts.");
  let requirement: RequirementDescription;
  const lot = radioValue("target") === "lot";
  if (lot) {
    const allowedFailures = requiredNumber("allowed-failures", "number of failures allowed per lot", { positive: true });
    if (allowedFailures >= lotSize) throw new FieldError("allowed-failures", "The failures allowed must be fewer than the parts per lot.");
    requirement = { kind: "lot", allowedFailures };
  } else {
    requirement = { kind: "survival", survival: requiredNumber("survival", "required survival probability", { probability: true }) };
  }
  const confirmLowSurvival = guard.low && box.checked;
  if (guard.low && !confirmLowSurvival) {
    throw new FieldError(lot ? "allowed-failures" : "survival", `${guard.text} Confirm below to check against this target.`);
  }
  // With an element table the applied stress may stay empty: the table's peak is then used.
  const fromTable = radioValue("part-source") === "table";
  const appliedStress = fromTable
    ? (readNumberField("applied-stress", "applied peak stress", { positive: true, optional: true }) ?? null)
    : requiredNumber("applied-stress", "applied peak stress", { positive: true });
  let lifetime: LifetimeDescription | null = null;
  if (byId<HTMLInputElement>("use-lifetime").checked) {
    const life = requiredNumber("lifetime", "required life", { positive: true });
    const timeUnit = byId<HTMLSelectElement>("time-unit").value as TimeUnit;
    const n = requiredNumber("scg-n", "crack-growth exponent n");
    if (!(n > 2)) throw new FieldError("scg-n", "The crack-growth exponent n must be greater than 2.");
    const B = requiredNumber("scg-b", "crack-growth parameter B", { positive: true });
    const stressUnit = byId<HTMLInputElement>("stress-unit").value.trim();
    lifetime = { lifetime: life, timeUnit, n, B, bUnit: bUnitText(stressUnit, timeUnit) };
  }
  const proof = byId<HTMLInputElement>("use-proof").checked
    ? { proofStress: requiredNumber("proof-stress", "proof stress", { positive: true }) }
    : null;
  return { requirement, confirmLowSurvival, appliedStress, lotSize, lifetime, proof };
}

/** Put a saved check's requirement into the form (reopening a check file). */
export function fillRequirement(
  d: Pick<CheckDescription, "requirement" | "confirmLowSurvival" | "appliedStress" | "lotSize" | "lifetime" | "proof">,
): void {
  setRadio("target", d.requirement.kind);
  if (d.requirement.kind === "survival") byId<HTMLInputElement>("survival").value = String(d.requirement.survival);
  else byId<HTMLInputElement>("allowed-failures").value = String(d.requirement.allowedFailures);
  byId<HTMLInputElement>("confirm-low-survival").checked = d.confirmLowSurvival === true;
  byId<HTMLInputElement>("applied-stress").value = d.appliedStress === null ? "" : String(d.appliedStress);
  byId<HTMLInputElement>("lot-size").value = String(d.lotSize);
  setCheckbox("use-lifetime", d.lifetime !== null);
  if (d.lifetime) {
    byId<HTMLInputElement>("lifetime").value = String(d.lifetime.lifetime);
    setSelect("time-unit", d.lifetime.timeUnit);
    byId<HTMLInputElement>("scg-n").value = String(d.lifetime.n);
    // The form has one time unit for the life and for B: B quoted per another time unit is converted to the life's.
    const bTime = parseBUnit(d.lifetime.bUnit)?.time ?? d.lifetime.timeUnit;
    byId<HTMLInputElement>("scg-b").value = String(convertTime(d.lifetime.B, bTime, d.lifetime.timeUnit));
  }
  setCheckbox("use-proof", d.proof !== null);
  byId<HTMLInputElement>("proof-stress").value = d.proof ? String(d.proof.proofStress) : "";
  // A saved check's confirmation holds for the target it was saved with.
  confirmedFor = d.confirmLowSurvival === true ? impliedFailureProbability().text : null;
}
