/**
 * The answer of the task pane's "one material across specimen geometries"
 * panel, as text: the pasted strengths grouped by configuration, the pooled
 * fit (material-fit.ts), its simulated bounds and checks
 * (material-fit-simulation.ts) and their wording (material-fit-caution.ts).
 * Pure and without a page, so it runs the same on the page, on a worker
 * thread (functions/material-fit-run.ts) and in the tests.
 */
import { fitMaterial } from "./material-fit";
import { CHECK_LEVEL, materialFitCaution } from "./material-fit-caution";
import { MATERIAL_SIMULATION, simulateMaterialFit } from "./material-fit-simulation";
import { parseConfiguration, sizeLaw } from "./specimen-geometry";
import { InputError } from "../errors";
import { explainNotANumber, quoteText } from "../input/number-text";
import { fieldNumber, readDelimited } from "../input/read-table";

export interface MaterialFitRequest {
  /** One specimen per line: strength, then its configuration; a header line is allowed. */
  text: string;
  flaws: "volume" | "surface";
  /** Poisson's ratio, needed for disks. */
  poisson?: number;
  decimalComma: boolean;
}

export interface MaterialFitAnswer {
  headline: string;
  rows: { label: string; value: string }[];
  /** The checks in words; `caution` when either failed. */
  checks: string;
  caution: boolean;
}

/** Groups the pasted lines by configuration (the same geometry written two ways is one group). */
function groups(request: MaterialFitRequest): { label: string; key: string; strengths: number[] }[] {
  const table = readDelimited(request.text, { allowWhitespace: false, ...(request.decimalComma ? { decimalMark: "comma" } : {}) });
  const byKey = new Map<string, { label: string; key: string; strengths: number[] }>();
  for (const record of table.records) {
    if (record.fields.length === 0) continue;
    if (record.fields.length < 2) throw new InputError("input", `line ${record.line}: give a strength and its configuration`);
    const strength = fieldNumber(record.fields[0].text, table.dialect.decimalMark, record.line, 1);
    if (strength === null) {
      const text = record.fields[0].text;
      const why = explainNotANumber(text);
      // The header line: the first line, beginning with a letter. "412 MPa", "#N/A" or "n/a" there is a specimen's line, refused below.
      if (why === null && /^\p{L}/u.test(text) && byKey.size === 0 && record === table.records.find((r) => r.fields.length > 0)) continue;
      throw new InputError("input", `line ${record.line}: ${quoteText(text)} ${why ?? "is not a strength"}`);
    }
    if (!(strength > 0)) throw new InputError("input", `line ${record.line}: a strength must be positive`);
    const label = record.fields[1].text.trim();
    const key = JSON.stringify(parseConfiguration(label));
    if (!byKey.has(key)) byKey.set(key, { label, key, strengths: [] });
    byKey.get(key)!.strengths.push(strength);
  }
  return [...byKey.values()];
}

/** Everything the panel shows for one request (pure: tested without a browser). */
export function materialFitAnswer(request: MaterialFitRequest): MaterialFitAnswer {
  const grouped = groups(request);
  if (grouped.length < 2) throw new InputError("input", "paste specimens of at least two configurations (bars and disks, say)");
  const laws = grouped.map((g) => sizeLaw({ geometry: JSON.parse(g.key), flaws: request.flaws, poisson: request.poisson, criterion: "PIA" }));
  const fit = fitMaterial({ groups: grouped.map((g, k) => ({ label: g.label, law: laws[k], strengths: g.strengths })) });
  if (!fit.converged) throw new InputError("notConverged", "the pooled likelihood has no maximum inside the moduli searched");
  const unit = request.flaws === "surface" ? "mm^2" : "mm^3";
  const f = (x: number) => String(Number(x.toPrecision(4)));
  let sim;
  try {
    sim = simulateMaterialFit({ fit, laws, seed: MATERIAL_SIMULATION.seed });
  } catch (error) {
    // The fit exists even where simulated bounds do not (e.g. a modulus near the end of the covered range).
    if (!(error instanceof InputError && error.kind === "notApplicable")) throw error;
    const reason = `not available: ${error.message}`;
    return {
      headline: `${fit.groups.reduce((s, g) => s + g.specimens, 0)} specimens in ${fit.groups.length} configurations; no simulated bounds or checks.`,
      rows: [
        { label: "Weibull modulus (pooled, maximum likelihood)", value: `${f(fit.shape)} (bounds ${reason})` },
        { label: `Material scale (MPa ${unit}^(1/m))`, value: f(fit.materialScale) },
      ],
      checks: `CAUTION: the one-modulus and size-effect checks were not run (${error.message}).`,
      caution: true,
    };
  }
  const rows = [
    { label: "Weibull modulus (pooled, maximum likelihood)", value: `${f(fit.shape)} (90 % two-sided, simulated: ${f(sim.shapeBounds.lower)} to ${f(sim.shapeBounds.upper)})` },
    { label: `Material scale (MPa ${unit}^(1/m))`, value: `${f(fit.materialScale)} (90 % two-sided, simulated: ${f(sim.scaleBounds.lower)} to ${f(sim.scaleBounds.upper)})` },
    ...fit.groups.map((g) => ({
      label: `${g.label}: ${g.specimens} specimens`,
      value: `characteristic strength ${f(g.impliedScale)} from the material fit, ${g.ownScale === null ? "no own fit" : f(g.ownScale)} from its own fit`,
    })),
    { label: "One modulus, p", value: sim.oneModulusP === null ? "not checked" : f(sim.oneModulusP) },
    { label: "The size effect holds, p", value: f(sim.sizeEffectP) },
  ];
  const checks = materialFitCaution(sim);
  return {
    headline: `${fit.groups.reduce((s, g) => s + g.specimens, 0)} specimens in ${fit.groups.length} configurations; checks at the ${CHECK_LEVEL} level by ${sim.replications} seeded simulations.`,
    rows,
    checks,
    caution: checks.startsWith("CAUTION"),
  };
}

