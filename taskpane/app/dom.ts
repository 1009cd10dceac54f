/**
 * The few DOM helpers the form uses. Text only ever reaches the page through
 * textContent and attributes: nothing the user pastes is parsed as HTML.
 */
import { quoteText, readTypedNumber, trimInvisible } from "../../src/input/number-text";

export function byId<T extends HTMLElement = HTMLElement>(id: string): T {
  const node = document.getElementById(id);
  if (!node) throw new Error(`the page has no element #${id}`);
  return node as T;
}

export function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  options: { className?: string; text?: string; attrs?: Record<string, string> } = {},
  children: Node[] = [],
): HTMLElementTagNameMap[K] {
  const node = document.createElement(tag);
  if (options.className) node.className = options.className;
  if (options.text !== undefined) node.textContent = options.text;
  for (const [name, value] of Object.entries(options.attrs ?? {})) node.setAttribute(name, value);
  for (const child of children) node.appendChild(child);
  return node;
}

/** A field the user must correct, with the id of the input to point at. */
export class FieldError extends Error {
  constructor(readonly fieldId: string, message: string) {
    super(message);
    this.name = "FieldError";
  }
}

/** The selected value of a radio group. */
export function radioValue(name: string): string {
  const checked = document.querySelector<HTMLInputElement>(`input[type=radio][name="${name}"]:checked`);
  return checked ? checked.value : "";
}

export interface FieldRule {
  positive?: boolean;
  integer?: boolean;
  probability?: boolean;
  optional?: boolean;
}

/**
 * The value of a field's text, read as every input is (src/input/number-text.ts):
 * a point is the decimal mark, "1.250" (1250 or 1.25?) is refused, and so are
 * units, footnote marks and words, each with what to change; a probability may
 * be typed as a percentage ("99.99 %"). Undefined for an empty optional field.
 * No page needed, so the same reading serves the low-survival guard and the tests.
 */
export function fieldNumber(id: string, text: string, name: string, rule: FieldRule = {}): number | undefined {
  const t = trimInvisible(text);
  if (t === "") {
    if (rule.optional) return undefined;
    throw new FieldError(id, `Enter the ${name}.`);
  }
  const r = readTypedNumber(t, { decimalMark: "point-only", percent: rule.probability });
  if (!r.ok) throw new FieldError(id, `The ${name} ${quoteText(t)} ${r.reason}.`);
  const value = r.value;
  if (rule.probability && !(value > 0 && value < 1)) throw new FieldError(id, `The ${name} must lie strictly between 0 and 1.`);
  if (rule.positive && !(value > 0)) throw new FieldError(id, `The ${name} must be greater than zero.`);
  if (rule.integer && !Number.isInteger(value)) throw new FieldError(id, `The ${name} must be a whole number.`);
  return value;
}

/**
 * A number typed in a text field. Plain text inputs (not type=number) keep
 * what the user typed visible and let us say exactly what is wrong with it.
 */
export function readNumberField(id: string, name: string, rule: FieldRule = {}): number | undefined {
  return fieldNumber(id, byId<HTMLInputElement>(id).value, name, rule);
}

export function requiredNumber(id: string, name: string, rule: FieldRule = {}): number {
  return readNumberField(id, name, { ...rule, optional: false }) as number;
}

/** Show or clear a step's error, marking the offending field for assistive technology. */
export function showStepError(errorId: string, error: { fieldId?: string; message: string } | null, fieldIds: string[]): void {
  const box = byId(errorId);
  box.textContent = error ? error.message : "";
  for (const id of fieldIds) {
    const field = document.getElementById(id);
    if (!field) continue;
    if (error && error.fieldId === id) {
      field.setAttribute("aria-invalid", "true");
      field.setAttribute("aria-errormessage", errorId);
    } else {
      field.removeAttribute("aria-invalid");
      field.removeAttribute("aria-errormessage");
    }
  }
}
