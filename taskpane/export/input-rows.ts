/** The inputs as labelled rows, for the CSV export and the printable page. */
import { METHOD_LABELS, type DesignCheckInput } from "../app/inputs";

export interface InputRow {
  label: string;
  value: string | number;
  unit: string;
}

export function inputRows(input: DesignCheckInput): InputRow[] {
  const rows: InputRow[] = [];
  const m = input.material;
  if (m.kind === "data") {
    const censored = m.censored?.filter(Boolean).length ?? 0;
    rows.push({ label: "Test results", value: `${m.strengths.length} specimens${censored ? `, ${censored} censored` : ""}`, unit: "" });
    rows.push({ label: "Estimation method", value: METHOD_LABELS[m.method], unit: "" });
  } else {
    rows.push({ label: "Weibull modulus (typed)", value: m.shape, unit: "" });
    rows.push({ label: "Characteristic strength (typed)", value: m.scale, unit: input.stressUnit });
    if (m.specimens) rows.push({ label: "Specimens behind the typed values", value: m.specimens, unit: "" });
  }
  rows.push({ label: "Confidence level", value: input.confidence, unit: "" });
  rows.push({ label: "Fracture origins", value: input.flaws, unit: "" });
  rows.push({ label: "Specimen effective size", value: input.specimen.effectiveSize, unit: input.sizeUnit });
  rows.push({ label: "Part effective size", value: input.part.effectiveSize, unit: input.sizeUnit });
  if (input.requirement.kind === "survival") rows.push({ label: "Required survival per part", value: input.requirement.survival, unit: "" });
  else rows.push({ label: "Expected failures allowed per lot", value: input.requirement.allowedFailures, unit: "" });
  rows.push({ label: "Applied peak stress", value: input.appliedStress, unit: input.stressUnit });
  rows.push({ label: "Parts per lot", value: input.lotSize, unit: "" });
  return rows;
}
