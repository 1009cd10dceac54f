/** The inputs as labelled rows, for the CSV export and the printable page. */
import { METHOD_LABELS, type CheckDescription } from "../../src/design/check-description";
import { confidenceConvention } from "../../src/design/confidence-convention";

export interface InputRow {
  label: string;
  value: string | number;
  unit: string;
}

export function inputRows(input: CheckDescription): InputRow[] {
  const rows: InputRow[] = [];
  if (input.title) rows.push({ label: "Check", value: input.title, unit: "" });
  const m = input.material;
  if (m.kind === "data") {
    const censored = m.censored?.filter(Boolean).length ?? 0;
    rows.push({ label: "Test results", value: `${m.strengths.length} specimens${censored ? `, ${censored} censored` : ""}`, unit: "" });
    rows.push({ label: "Estimation method", value: METHOD_LABELS[m.method], unit: "" });
  } else {
    rows.push({ label: "Weibull modulus (datasheet)", value: m.shape, unit: m.unbiased === false ? "as solved, not unbiased" : "unbiased" });
    rows.push({ label: "Characteristic strength (datasheet)", value: m.scale, unit: input.stressUnit });
    rows.push({ label: "Specimens behind the datasheet values", value: m.specimens ?? "not given: no confidence bounds", unit: "" });
  }
  rows.push({ label: "Confidence level", value: confidenceConvention(input.confidence).boundLabel, unit: "" });
  rows.push({ label: "Fracture origins", value: input.flaws, unit: "" });
  const sp = input.specimen;
  if (sp.kind === "typed") rows.push({ label: "Specimen effective size", value: sp.effectiveSize, unit: input.sizeUnit });
  else if (sp.kind === "preset") rows.push({ label: "Specimen configuration", value: sp.configuration + (sp.poisson !== undefined ? `, Poisson's ratio ${sp.poisson}` : ""), unit: "" });
  else rows.push({ label: "Specimen bar (outer/inner span, width x depth)", value: `${sp.outerSpan}/${sp.innerSpan}, ${sp.width} x ${sp.depth}`, unit: "mm" });
  const pt = input.part;
  if (pt.kind === "typed") rows.push({ label: "Part effective size", value: pt.effectiveSize, unit: input.sizeUnit });
  else rows.push({ label: "Part element table", value: `${pt.sizes.length} rows, ${pt.columns} stress column(s), sizes in ${input.sizeUnit}`, unit: "" });
  rows.push({ label: "Multiaxial criterion", value: input.criterion, unit: "" });
  if (input.requirement.kind === "survival") rows.push({ label: "Required survival per part", value: input.requirement.survival, unit: "" });
  else rows.push({ label: "Expected failures allowed per lot", value: input.requirement.allowedFailures, unit: "" });
  if (input.confirmLowSurvival) rows.push({ label: "Low survival target", value: "confirmed by the user", unit: "" });
  rows.push({ label: "Applied peak stress", value: input.appliedStress ?? "peak of the element table", unit: input.appliedStress === null ? "" : input.stressUnit });
  rows.push({ label: "Parts per lot", value: input.lotSize, unit: "" });
  if (input.lifetime) {
    rows.push({ label: "Required life", value: input.lifetime.lifetime, unit: input.lifetime.timeUnit });
    rows.push({ label: "Crack-growth exponent n", value: input.lifetime.n, unit: "" });
    rows.push({ label: "Crack-growth parameter B", value: input.lifetime.B, unit: input.lifetime.bUnit });
  }
  if (input.proof) rows.push({ label: "Proof stress", value: input.proof.proofStress, unit: input.stressUnit });
  return rows;
}
