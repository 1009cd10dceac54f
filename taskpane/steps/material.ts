/**
 * Step 1, material data: test results (pasted, typed, or taken from the
 * selected range) with an estimation method, or Weibull parameters typed from
 * a datasheet or an earlier fit; plus the stress unit and confidence level.
 */
import type { EstimationMethod } from "../../src/weibull/estimate";
import { DEMO_DESCRIPTION, DEMO_TEXT } from "../app/demo-data";
import { byId, FieldError, radioValue, readNumberField, requiredNumber } from "../app/dom";
import { setRadio, setSelect } from "./fill";
import type { ConfidenceDescription, DataSource, MaterialDescription } from "../../src/design/check-description";
import { parsePasted, PasteError } from "../app/parse-pasted";

export const MATERIAL_FIELDS = ["strengths", "typed-modulus", "typed-scale", "typed-specimens", "stress-unit"];

/** The range the text box was last filled from; editing the text by hand drops it. */
let fromRange: { text: string; source: DataSource & { kind: "range" } } | null = null;

export function setupMaterial(onChange: () => void): void {
  for (const radio of document.querySelectorAll<HTMLInputElement>('input[name="material-source"]')) {
    radio.addEventListener("change", () => {
      const typed = radioValue("material-source") === "typed";
      byId("material-data").hidden = typed;
      byId("material-typed").hidden = !typed;
      onChange();
    });
  }
  byId("decimal-comma").addEventListener("change", onChange);
  byId("load-demo").addEventListener("click", () => {
    fillStrengths(DEMO_TEXT, null);
    byId("selection-info").textContent = DEMO_DESCRIPTION;
    onChange();
  });
}

/** Put strengths into the text box; with a range, remember it so the report sheet can refer to it. */
/** Put a saved check's material into the form (reopening a check file). */
export function fillMaterial(material: MaterialDescription, stressUnit: string, confidence: ConfidenceDescription): void {
  setRadio("material-source", material.kind);
  byId<HTMLInputElement>("stress-unit").value = stressUnit;
  // A two-sided level in a file is the one-sided bound at (1 + level)/2, the same bound the form shows.
  const oneSided = confidence.sides === "two-sided" ? (1 + confidence.level) / 2 : confidence.level;
  setSelect("confidence", String(Number(oneSided.toPrecision(6))));
  if (material.kind === "typed") {
    byId<HTMLInputElement>("typed-modulus").value = String(material.shape);
    byId<HTMLInputElement>("typed-scale").value = String(material.scale);
    byId<HTMLInputElement>("typed-specimens").value = material.specimens === undefined ? "" : String(material.specimens);
    byId<HTMLInputElement>("typed-unbiased").checked = material.unbiased !== false;
  } else {
    const lines = material.strengths.map((s, i) => (material.censored?.[i] ? `${s}\tc` : String(s)));
    fillStrengths(lines.join("\n"), null);
    setSelect("method", material.method);
  }
}

export function fillStrengths(text: string, source: (DataSource & { kind: "range" }) | null): void {
  byId<HTMLTextAreaElement>("strengths").value = text;
  fromRange = source ? { text, source } : null;
}

export function readMaterial(): { material: MaterialDescription; stressUnit: string; confidence: ConfidenceDescription } {
  const stressUnit = byId<HTMLInputElement>("stress-unit").value.trim();
  if (stressUnit === "") throw new FieldError("stress-unit", "Enter the stress unit (for example MPa).");
  // The form offers one-sided levels only; the select's words name the two-sided band each one pairs with.
  const confidence: ConfidenceDescription = { level: Number(byId<HTMLSelectElement>("confidence").value), sides: "one-sided" };

  if (radioValue("material-source") === "typed") {
    const shape = requiredNumber("typed-modulus", "Weibull modulus", { positive: true });
    const scale = requiredNumber("typed-scale", "characteristic strength", { positive: true });
    const specimens = readNumberField("typed-specimens", "number of specimens", { positive: true, integer: true, optional: true });
    if (specimens !== undefined && specimens < 2) throw new FieldError("typed-specimens", "Datasheet bounds need at least 2 specimens.");
    const unbiased = byId<HTMLInputElement>("typed-unbiased").checked;
    return { material: { kind: "typed", shape, scale, specimens, unbiased }, stressUnit, confidence };
  }

  const text = byId<HTMLTextAreaElement>("strengths").value;
  let parsed;
  const note = byId("strengths-note");
  note.textContent = "";
  try {
    parsed = parsePasted(text, { decimalComma: byId<HTMLInputElement>("decimal-comma").checked });
    // Nothing is dropped unseen: the skipped lines and the decimal mark used show under the field.
    note.textContent = parsed.notes.join(" ");
  } catch (error) {
    if (error instanceof PasteError) throw new FieldError("strengths", error.message);
    throw error;
  }
  const method = byId<HTMLSelectElement>("method").value as EstimationMethod;
  const source: DataSource = fromRange && fromRange.text === text ? fromRange.source : { kind: "pasted" };
  return {
    material: { kind: "data", strengths: parsed.strengths, censored: parsed.censored, method, source },
    stressUnit,
    confidence,
  };
}
