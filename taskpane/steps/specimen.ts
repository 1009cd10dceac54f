/**
 * Step 2, test specimen: where fractures start (volume or surface) and the
 * specimen's effective size. Typed for now; standard configurations and bar
 * dimensions plug in here when the effective-size functions land.
 */
import { byId, FieldError, radioValue, requiredNumber } from "../app/dom";
import type { FlawKind, SizeInput } from "../app/inputs";
import { MISSING } from "../app/optional-core";

export const SPECIMEN_FIELDS = ["specimen-size", "size-unit"];

export function setupSpecimen(onChange: () => void): void {
  byId("specimen-pending").textContent = `Planned here: ${MISSING.specimenPresets}.`;
  for (const radio of document.querySelectorAll<HTMLInputElement>('input[name="flaws"]')) {
    radio.addEventListener("change", () => {
      const surface = radioValue("flaws") === "surface";
      for (const word of document.querySelectorAll(".size-word")) word.textContent = surface ? "area" : "volume";
      const unit = byId<HTMLInputElement>("size-unit");
      if (surface && unit.value === "mm³") unit.value = "mm²";
      if (!surface && unit.value === "mm²") unit.value = "mm³";
      onChange();
    });
  }
}

export function readSpecimen(): { flaws: FlawKind; sizeUnit: string; specimen: SizeInput } {
  const flaws = radioValue("flaws") === "surface" ? "surface" : "volume";
  const effectiveSize = requiredNumber("specimen-size", `specimen's effective ${flaws === "surface" ? "area" : "volume"}`, { positive: true });
  const sizeUnit = byId<HTMLInputElement>("size-unit").value.trim();
  if (sizeUnit === "") throw new FieldError("size-unit", "Enter the size unit (for example mm³).");
  return { flaws, sizeUnit, specimen: { effectiveSize, how: "typed" } };
}
