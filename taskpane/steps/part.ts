/**
 * Step 3, the part: its effective size in the specimen's unit. Typed for now;
 * an element-table range (stresses and element sizes from a finite-element
 * model) plugs in here when the part functions land.
 */
import { byId, radioValue, requiredNumber } from "../app/dom";
import type { SizeInput } from "../app/inputs";
import { MISSING } from "../app/optional-core";

export const PART_FIELDS = ["part-size"];

export function setupPart(): void {
  byId("part-pending").textContent = `Planned here: ${MISSING.elementTable}.`;
}

export function readPart(): SizeInput {
  const word = radioValue("flaws") === "surface" ? "area" : "volume";
  return { effectiveSize: requiredNumber("part-size", `part's effective ${word}`, { positive: true }), how: "typed" };
}
