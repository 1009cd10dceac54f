/**
 * Step 2, test specimen: where fractures start (volume or surface) and the
 * specimen's effective size, typed, from a standard configuration, or from a
 * bar's flexure dimensions. The last two depend on the modulus, so the check
 * evaluates them with the fitted one (app/sizes.ts).
 */
import { SPECIMENS } from "../../src/size/presets";
import { byId, el, FieldError, radioValue, readNumberField, requiredNumber } from "../app/dom";
import type { Criterion, FlawKind, SpecimenInput } from "../app/inputs";

export const SPECIMEN_FIELDS = ["specimen-size", "size-unit", "specimen-config", "poisson", "outer-span", "inner-span", "bar-width", "bar-depth"];

const MODES = ["typed", "preset", "bar"] as const;

export function setupSpecimen(onChange: () => void): void {
  const select = byId<HTMLSelectElement>("specimen-config");
  select.replaceChildren(...SPECIMENS.map((s) => el("option", { text: `${s.name}: ${s.description}`, attrs: { value: s.name } })));
  const showMode = () => {
    const mode = radioValue("specimen-source");
    for (const m of MODES) byId(`specimen-${m}`).hidden = m !== mode;
    const preset = SPECIMENS.find((s) => s.name === select.value);
    byId("poisson-row").hidden = !preset || preset.kind === "bar-flexure";
    // Presets and bar dimensions are in millimetres.
    if (mode !== "typed") byId<HTMLInputElement>("size-unit").value = radioValue("flaws") === "surface" ? "mm²" : "mm³";
  };
  for (const radio of document.querySelectorAll<HTMLInputElement>('input[name="specimen-source"]')) {
    radio.addEventListener("change", () => {
      showMode();
      onChange();
    });
  }
  select.addEventListener("change", () => {
    showMode();
    onChange();
  });
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
  showMode();
}

export function readSpecimen(): { flaws: FlawKind; sizeUnit: string; criterion: Criterion; specimen: SpecimenInput } {
  const flaws = radioValue("flaws") === "surface" ? "surface" : "volume";
  const criterion = byId<HTMLSelectElement>("criterion").value as Criterion;
  const sizeUnit = byId<HTMLInputElement>("size-unit").value.trim();
  if (sizeUnit === "") throw new FieldError("size-unit", "Enter the size unit (for example mm³).");
  const mode = radioValue("specimen-source");
  let specimen: SpecimenInput;
  if (mode === "preset") {
    const configuration = byId<HTMLSelectElement>("specimen-config").value;
    const preset = SPECIMENS.find((s) => s.name === configuration);
    const disk = preset !== undefined && preset.kind !== "bar-flexure";
    const poisson = disk ? requiredNumber("poisson", "Poisson's ratio") : undefined;
    if (poisson !== undefined && !(poisson > -1 && poisson < 0.5)) throw new FieldError("poisson", "Poisson's ratio must lie between -1 and 0.5.");
    specimen = { kind: "preset", configuration, poisson };
  } else if (mode === "bar") {
    const outerSpan = requiredNumber("outer-span", "outer span", { positive: true });
    const innerSpan = readNumberField("inner-span", "inner span") ?? 0;
    if (innerSpan < 0 || innerSpan >= outerSpan) throw new FieldError("inner-span", "The inner span must be 0 (three-point) or shorter than the outer span.");
    const width = requiredNumber("bar-width", "bar width", { positive: true });
    const depth = requiredNumber("bar-depth", "bar depth", { positive: true });
    specimen = { kind: "bar", outerSpan, innerSpan, width, depth };
  } else {
    const word = flaws === "surface" ? "area" : "volume";
    specimen = { kind: "typed", effectiveSize: requiredNumber("specimen-size", `specimen's effective ${word}`, { positive: true }) };
  }
  return { flaws, sizeUnit, criterion, specimen };
}
