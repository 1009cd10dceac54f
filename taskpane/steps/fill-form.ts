/**
 * Reopening a saved check: every step filled from the description. The
 * form's state is kept first and put back if any field refuses a value, so
 * a bad file never leaves the form half-replaced: nothing typed is lost.
 */
import type { CheckDescription } from "../../src/design/check-description";
import { byId } from "../app/dom";
import { fillMaterial } from "./material";
import { fillPart } from "./part";
import { fillRequirement } from "./requirement";
import { fillSpecimen } from "./specimen";

type Control = HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement;

interface Snapshot {
  controls: { control: Control; value: string; checked: boolean; disabled: boolean; options: Node[] | null }[];
}

function controls(): Control[] {
  return [...byId("check-form").querySelectorAll<Control>("input, select, textarea"), byId<HTMLInputElement>("check-title")];
}

export function snapshotForm(): Snapshot {
  return {
    controls: controls().map((control) => ({
      control,
      value: control.value,
      checked: control instanceof HTMLInputElement ? control.checked : false,
      disabled: control.disabled,
      // The size-unit list changes with the flaw kind: keep its options too.
      options: control instanceof HTMLSelectElement ? [...control.options].map((o) => o.cloneNode(true)) : null,
    })),
  };
}

export function restoreForm(snapshot: Snapshot): void {
  for (const { control, value, checked, disabled, options } of snapshot.controls) {
    if (options && control instanceof HTMLSelectElement) control.replaceChildren(...options);
    if (control instanceof HTMLInputElement && (control.type === "radio" || control.type === "checkbox")) control.checked = checked;
    else control.value = value;
    control.disabled = disabled;
  }
  // Show the sections that belong to the restored choices.
  for (const control of snapshot.controls.map((c) => c.control)) {
    if (control instanceof HTMLInputElement && (control.type === "radio" || control.type === "checkbox") && control.checked) {
      control.dispatchEvent(new Event("change", { bubbles: true }));
    }
  }
  for (const id of ["use-lifetime", "use-proof"]) byId<HTMLInputElement>(id).dispatchEvent(new Event("change", { bubbles: true }));
}

/** Fill the whole form; on any refusal put the form back as it was and rethrow. */
export function fillForm(d: CheckDescription): void {
  const before = snapshotForm();
  try {
    byId<HTMLInputElement>("check-title").value = d.title ?? "";
    fillMaterial(d.material, d.stressUnit, d.confidence);
    fillSpecimen(d.flaws, d.sizeUnit, d.criterion, d.specimen);
    fillPart(d.part);
    fillRequirement(d);
  } catch (error) {
    restoreForm(before);
    throw error;
  }
}
