/**
 * Setting the form's controls from a saved check, firing the same change
 * events a person's click would, so every dependent part of the form (which
 * fields show, fixed units, labels) follows. A value the form does not offer
 * is refused at the field rather than silently replaced.
 */
import { byId, FieldError } from "../app/dom";

export function setRadio(name: string, value: string): void {
  const radio = document.querySelector<HTMLInputElement>(`input[type=radio][name="${name}"][value="${value}"]`);
  if (!radio) throw new FieldError(name, `The check file's ${name} "${value}" is not one the form offers.`);
  if (!radio.checked) {
    radio.checked = true;
    radio.dispatchEvent(new Event("change", { bubbles: true }));
  }
}

export function setSelect(id: string, value: string): void {
  const select = byId<HTMLSelectElement>(id);
  if (![...select.options].some((o) => o.value === value)) {
    throw new FieldError(id, `The check file's value "${value}" is not one this field offers (${[...select.options].map((o) => o.value).join(", ")}).`);
  }
  select.value = value;
  select.dispatchEvent(new Event("change", { bubbles: true }));
}

export function setCheckbox(id: string, checked: boolean): void {
  const box = byId<HTMLInputElement>(id);
  if (box.checked !== checked) {
    box.checked = checked;
    box.dispatchEvent(new Event("change", { bubbles: true }));
  }
}
