/**
 * Effective sizes of the specimen and the part, from the core's closed forms
 * (src/size): typed values pass through; a standard configuration or a bar's
 * dimensions and an element table depend on the modulus, so they are
 * evaluated with the fitted one. Each comes back with the words the result
 * shows about where it came from.
 */
import { barFlexureArea, barFlexureVolume } from "../../src/size/flexure";
import { partRisk } from "../../src/size/part";
import { findSpecimen, specimenEffectiveSize } from "../../src/size/presets";
import { ensureApplicable } from "../../src/errors";
import type { DesignCheckInput } from "./inputs";

export interface ResolvedSize {
  value: number;
  how: string;
}

export interface ResolvedSizes {
  specimen: ResolvedSize;
  part: ResolvedSize;
  /** The element table's peak tensile stress, when the part came from one. */
  tablePeak: number | null;
}

export function resolveSizes(input: DesignCheckInput, shape: number): ResolvedSizes {
  const flaws = input.flaws;
  const m = Number(shape.toPrecision(4));
  const s = input.specimen;
  let specimen: ResolvedSize;
  if (s.kind === "typed") {
    specimen = { value: s.effectiveSize, how: "typed in the form" };
  } else if (s.kind === "preset") {
    const preset = findSpecimen(s.configuration);
    specimen = {
      value: specimenEffectiveSize({ configuration: s.configuration, shape, flaws, poisson: s.poisson, criterion: input.criterion }),
      how: `${preset.description}, at m = ${m}${preset.kind === "bar-flexure" ? "" : `, ${input.criterion}, Poisson's ratio ${s.poisson}`}`,
    };
  } else {
    const spec = { shape, outerSpan: s.outerSpan, innerSpan: s.innerSpan, width: s.width, depth: s.depth };
    specimen = {
      value: flaws === "surface" ? barFlexureArea(spec) : barFlexureVolume(spec),
      how: `${s.innerSpan > 0 ? "four" : "three"}-point bar ${s.width} x ${s.depth} mm on ${s.outerSpan}${s.innerSpan > 0 ? `/${s.innerSpan}` : ""} mm spans, at m = ${m}`,
    };
  }

  const p = input.part;
  if (p.kind === "typed") return { specimen, part: { value: p.effectiveSize, how: "typed in the form" }, tablePeak: null };
  const risk = partRisk({
    stresses: Float64Array.from(p.stresses.flat()),
    columns: p.columns,
    sizes: Float64Array.from(p.sizes),
    shape,
    criterion: input.criterion,
  });
  ensureApplicable(risk.peak > 0, "no element of the part's table carries tensile stress");
  return {
    specimen,
    part: {
      value: risk.effectiveSize,
      how: `element table of ${p.sizes.length} rows (${p.columns === 1 ? "maximum principal stress" : p.columns === 3 ? "principal stresses" : "stress tensors"}), ${input.criterion}, at m = ${m}`,
    },
    tablePeak: risk.peak,
  };
}
