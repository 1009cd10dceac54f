/**
 * What the printable report says, as plain data, from the core's result
 * alone: an identification block with the fields a reviewer fills by hand,
 * the verdict with its basis lines, the specimen table, the methods and the
 * publications they come from, the cautions, and the signature lines. The
 * print page (print.ts) and the report sheet lay it out; neither adds a
 * number of its own.
 */
import type { DesignCheckResult } from "../../src/design/check-result";
import { findSpecimen } from "../../src/size/presets";

export interface IdentificationField {
  label: string;
  /** Empty: a line left for the reviewer to fill. */
  value: string;
}

export interface SpecimenRow {
  /** 1 = weakest. */
  rank: number;
  strength: number;
  censored: boolean;
}

export interface ReportContent {
  identification: IdentificationField[];
  verdict: { pass: boolean; onLowerBound: boolean; text: string };
  /** Basis lines, "topic: text", in the core's reading order. */
  basis: { topic: string; text: string }[];
  specimens: SpecimenRow[];
  /** Why there is no specimen table (typed datasheet values), when there is none. */
  specimensMissing: string | null;
  methods: string[];
  cautions: { level: "note" | "warning"; text: string }[];
  signatures: string[];
}

export function reportContent(result: DesignCheckResult, printed: Date): ReportContent {
  const input = result.input;
  const material = input.material;
  const specimens: SpecimenRow[] =
    material.kind === "data"
      ? material.strengths
          .map((strength, i) => ({ strength, censored: Boolean(material.censored?.[i]) }))
          .sort((a, b) => a.strength - b.strength)
          .map((s, i) => ({ rank: i + 1, ...s }))
      : [];
  return {
    identification: [
      { label: "Check", value: input.title ?? "" },
      { label: "Part and drawing", value: "" },
      { label: "Material and supplier", value: "" },
      { label: "Lot or batch", value: "" },
      { label: "Revision", value: "" },
      { label: "Author", value: "" },
      { label: "Checker", value: "" },
      { label: "Date printed", value: printed.toISOString().slice(0, 10) },
    ],
    verdict: { ...result.verdict },
    basis: result.basis.map((b) => ({ topic: b.topic, text: b.text })),
    specimens,
    specimensMissing:
      material.kind === "typed"
        ? `Datasheet values typed (m ${material.shape}, characteristic strength ${material.scale} ${input.stressUnit}` +
          `${material.specimens ? `, ${material.specimens} specimens` : ""}): no specimen strengths to list.`
        : null,
    methods: methodReferences(result),
    cautions: result.cautions.map((c) => ({ level: c.level, text: c.text })),
    signatures: ["Prepared by (name, signature, date)", "Checked by (name, signature, date)", "Approved by (name, signature, date)"],
  };
}

/** The publications behind what this check used, and only those. */
export function methodReferences(result: DesignCheckResult): string[] {
  const input = result.input;
  const refs: string[] = [];
  const m = input.material;
  if (m.kind === "data") {
    refs.push(
      m.method === "LSQ"
        ? "Weibull parameters by least squares on the probability plot, (i - 0.5)/N positions (Wu, Zhou & Li 2006, J Mater Sci 41:5630); the standards prescribe maximum likelihood."
        : "Weibull parameters by maximum likelihood, censored specimens as in ASTM C1239 and ISO 20501 (method B).",
    );
    if (m.method === "MLE") refs.push("Unbiasing factor of the modulus: Thoman, Bain & Antle (1969), Technometrics 11:445; ASTM C1239.");
    if (result.fitQuality) refs.push("Goodness of fit: modified Anderson-Darling statistic (Stephens; Lawless 1982, p. 455).");
  }
  if (result.allowableLower) {
    refs.push(
      "Lower confidence bounds by pivotal quantities of the maximum-likelihood fit (Thoman, Bain & Antle 1969; ASTM C1239), " +
        `${result.confidence.boundLabel}; ${result.confidence.pairing}.`,
    );
  }
  refs.push("Size scaling by the effective volume or area, weakest-link theory (ASTM C1683).");
  if (input.specimen.kind === "preset") {
    const preset = safePreset(input.specimen.configuration);
    if (preset === "bar-flexure") refs.push("Flexure specimen: ASTM C1161 configurations.");
    if (preset === "ring-on-ring") refs.push("Ring-on-ring disk: ASTM C1499.");
    if (preset === "piston-on-balls") refs.push("Piston on three balls: ISO 6872.");
  }
  if (input.specimen.kind === "bar") refs.push("Flexure bar: elastic beam theory, effective size in closed form (ASTM C1683).");
  if (input.part.kind === "table") refs.push(`Part from an element table, multiaxial criterion ${input.criterion} (ASTM C1683).`);
  if (input.lifetime) {
    refs.push(
      "Slow crack growth: power-law crack velocity, strength-probability-time transform; n and B from ASTM C1368 (constant stress rate) or ASTM C1576 (static) tests.",
    );
  }
  if (input.proof) refs.push("Proof testing: truncated Weibull strength of survivors and the minimum life they are guaranteed (Evans & Wiederhorn 1974, Int J Fract 10:379).");
  refs.push("Fracture origins to be confirmed by fractography (ASTM C1322).");
  return refs;
}

function safePreset(configuration: string): string | null {
  try {
    return findSpecimen(configuration).kind;
  } catch {
    return null;
  }
}
