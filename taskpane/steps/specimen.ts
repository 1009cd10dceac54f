/**
 * Step 2, test specimen: where fractures start (volume or surface) and the
 * specimen's effective size, typed, from a standard configuration, or from a
 * bar's flexure dimensions. The last two depend on the modulus, so the check
 * evaluates them with the fitted one. Configurations and bar dimensions are
 * in millimetres, so while they define the size the size unit is fixed to
 * mm³ (or mm²): a unit relabelled under them would misstate every size.
 */
import { SPECIMENS } from "../../src/size/presets";
import type { Criterion, FlawKind, SpecimenDescription } from "../../src/design/check-description";
import { byId, el, FieldError, radioValue, readNumberField, requiredNumber } from "../app/dom";
import { setRadio, setSelect } from "./fill";

export const SPECIMEN_FIELDS = ["specimen-size", "size-unit", "specimen-config", "poisson", "outer-span", "inner-span", "bar-width", "bar-depth"];

const MODES = ["typed", "preset", "bar"] as const;
const LENGTHS = ["mm", "cm", "m", "in"] as const;
const SUPERSCRIPT = { 2: "²", 3: "³" } as const;

/** Offer the units of the flaw kind's power; keep the length chosen. */
function offerSizeUnits(power: 2 | 3, fixedToMillimetres: boolean): void {
  const select = byId<HTMLSelectElement>("size-unit");
  const length = fixedToMillimetres ? "mm" : (select.value.match(/^(mm|cm|m|in)/)?.[1] ?? "mm");
  select.replaceChildren(...LENGTHS.map((l) => el("option", { text: `${l}${SUPERSCRIPT[power]}`, attrs: { value: `${l}^${power}` } })));
  select.value = `${length}^${power}`;
  select.disabled = fixedToMillimetres;
}

export function setupSpecimen(onChange: () => void): void {
  const select = byId<HTMLSelectElement>("specimen-config");
  select.replaceChildren(...SPECIMENS.map((s) => el("option", { text: `${s.name}: ${s.description}`, attrs: { value: s.name } })));
  const showMode = () => {
    const mode = radioValue("specimen-source");
    for (const m of MODES) byId(`specimen-${m}`).hidden = m !== mode;
    const preset = SPECIMENS.find((s) => s.name === select.value);
    byId("poisson-row").hidden = !preset || preset.kind === "bar-flexure";
    const surface = radioValue("flaws") === "surface";
    for (const word of document.querySelectorAll(".size-word")) word.textContent = surface ? "area" : "volume";
    offerSizeUnits(surface ? 2 : 3, mode !== "typed");
  };
  for (const radio of document.querySelectorAll<HTMLInputElement>('input[name="specimen-source"], input[name="flaws"]')) {
    radio.addEventListener("change", () => {
      showMode();
      onChange();
    });
  }
  select.addEventListener("change", () => {
    showMode();
    onChange();
  });
  showMode();
}

export function readSpecimen(): { flaws: FlawKind; sizeUnit: string; criterion: Criterion; specimen: SpecimenDescription } {
  const flaws = radioValue("flaws") === "surface" ? "surface" : "volume";
  const criterion = byId<HTMLSelectElement>("criterion").value as Criterion;
  const sizeUnit = byId<HTMLSelectElement>("size-unit").value;
  const mode = radioValue("specimen-source");
  let specimen: SpecimenDescription;
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

/** Put a saved check's specimen into the form (reopening a check file). */
export function fillSpecimen(flaws: FlawKind, sizeUnit: string, criterion: Criterion, specimen: SpecimenDescription): void {
  setRadio("flaws", flaws);
  setRadio("specimen-source", specimen.kind);
  setSelect("criterion", criterion);
  if (specimen.kind === "typed") {
    byId<HTMLInputElement>("specimen-size").value = String(specimen.effectiveSize);
  } else if (specimen.kind === "preset") {
    setSelect("specimen-config", specimen.configuration);
    byId<HTMLInputElement>("poisson").value = specimen.poisson === undefined ? "" : String(specimen.poisson);
  } else {
    byId<HTMLInputElement>("outer-span").value = String(specimen.outerSpan);
    byId<HTMLInputElement>("inner-span").value = String(specimen.innerSpan);
    byId<HTMLInputElement>("bar-width").value = String(specimen.width);
    byId<HTMLInputElement>("bar-depth").value = String(specimen.depth);
  }
  const unit = sizeUnit.replace(/\s/g, "").replace("²", "^2").replace("³", "^3").replace(/^(mm|cm|m|in)([23])$/, "$1^$2");
  if (specimen.kind === "typed") setSelect("size-unit", unit);
  else if (!unit.startsWith("mm^")) {
    // The form fixes millimetres under a configuration or bar dimensions: the part's sizes in another unit would be misread.
    throw new FieldError("size-unit", `The check file gives sizes in ${sizeUnit} with a ${specimen.kind === "bar" ? "bar" : "standard configuration"}; the form takes those in mm only. Convert the part's sizes to mm first.`);
  }
}
