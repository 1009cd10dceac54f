/**
 * Effective sizes of the specimen and the part, from the core's closed forms
 * (src/size). Typed sizes and element tables are in the check's size unit; a
 * standard configuration or a bar's dimensions are in millimetres, so their
 * size (mm^3 or mm^2) is converted into the check's unit, never relabelled:
 * the ratio part / specimen is then the same whatever unit was chosen.
 */
import { InputError } from "../errors";
import { barFlexureArea, barFlexureVolume } from "../size/flexure";
import { NO_SIZE_IN_TENSION, partRisk } from "../size/part";
import { findSpecimen, specimenEffectiveSize } from "../size/presets";
import type { CheckDescription } from "./check-description";
import { parseSizeUnit, type SizeUnit } from "./check-units";
import { formatNumber } from "./probability-text";

export interface ResolvedSize {
  /** In the check's size unit. */
  value: number;
  how: string;
}

export interface ResolvedSizes {
  unit: SizeUnit;
  specimen: ResolvedSize;
  part: ResolvedSize;
  /** The element table's peak tensile stress, when the part came from one. */
  tablePeak: number | null;
}

/** @example resolveSizes(description, 10.5).specimen.value // the specimen's effective size in description.sizeUnit */
export function resolveSizes(input: CheckDescription, shape: number): ResolvedSizes {
  const unit = parseSizeUnit(input.sizeUnit);
  if (!unit) throw new InputError("input", `sizeUnit: "${input.sizeUnit}" is not a size unit (use mm^3, cm^3, m^3, in^3, or ^2 for areas)`);
  const flaws = input.flaws;
  const m = formatNumber(shape);
  const fromMm = (mmValue: number) => mmValue / unit.inMillimetres;
  const converted = unit.length === "mm" ? "" : `, converted from mm^${unit.power} to ${unit.text}`;
  const s = input.specimen;
  let specimen: ResolvedSize;
  if (s.kind === "typed") {
    specimen = { value: s.effectiveSize, how: `typed, in ${unit.text}` };
  } else if (s.kind === "preset") {
    const preset = findSpecimen(s.configuration);
    specimen = {
      value: fromMm(specimenEffectiveSize({ configuration: s.configuration, shape, flaws, poisson: s.poisson, criterion: input.criterion })),
      how: `${preset.description}, at m = ${m}${preset.kind === "bar-flexure" ? "" : `, ${input.criterion}, Poisson's ratio ${s.poisson}`}${converted}`,
    };
  } else {
    const spec = { shape, outerSpan: s.outerSpan, innerSpan: s.innerSpan, width: s.width, depth: s.depth };
    specimen = {
      value: fromMm(flaws === "surface" ? barFlexureArea(spec) : barFlexureVolume(spec)),
      how:
        `${s.innerSpan > 0 ? "four" : "three"}-point bar ${s.width} x ${s.depth} mm on ${s.outerSpan}` +
        `${s.innerSpan > 0 ? `/${s.innerSpan}` : ""} mm spans, at m = ${m}${converted}`,
    };
  }

  const p = input.part;
  if (p.kind === "typed") return { unit, specimen, part: { value: p.effectiveSize, how: `typed, in ${unit.text}` }, tablePeak: null };
  const risk = partRisk({
    stresses: Float64Array.from(p.stresses.flat()),
    columns: p.columns,
    sizes: Float64Array.from(p.sizes),
    shape,
    criterion: input.criterion,
  });
  if (!(risk.peak > 0)) throw new InputError("notApplicable", "part.stresses: no element of the part's table carries tensile stress");
  if (!(risk.effectiveSize > 0)) throw new InputError("input", `part.sizes: ${NO_SIZE_IN_TENSION}`);
  const columns = p.columns === 1 ? "maximum principal stress" : p.columns === 3 ? "principal stresses" : "stress tensors";
  return {
    unit,
    specimen,
    part: {
      value: risk.effectiveSize,
      how: `element table of ${p.sizes.length} rows (${columns}), ${input.criterion}, at m = ${m}, sizes in ${unit.text}`,
    },
    tablePeak: risk.peak,
  };
}
