/**
 * "One material across specimen geometries?": a panel beside the design
 * check. Strengths are pasted with the configuration each specimen was tested
 * in (a preset such as C1161-B-4PT, or dimensions such as BAR 40/20 4x3); the
 * core fits one modulus and material scale to all of them
 * (src/design/material-fit.ts), simulates the two checks, and words the
 * result (material-fit-caution.ts). A failed size-effect check is shown as a
 * caution: the specimens may not share one flaw population, or the size
 * scaling the design check relies on is not to be trusted for the part. This
 * file only gathers, asks the core and presents.
 */
import { fitMaterial } from "../../src/design/material-fit";
import { CHECK_LEVEL, materialFitCaution } from "../../src/design/material-fit-caution";
import { MATERIAL_SIMULATION, simulateMaterialFit } from "../../src/design/material-fit-simulation";
import { parseConfiguration, sizeLaw } from "../../src/design/specimen-geometry";
import { InputError } from "../../src/errors";
import { fieldNumber, readDelimited } from "../../src/input/read-table";
import { byId, el } from "../app/dom";

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
      if (byKey.size === 0 && record === table.records.find((r) => r.fields.length > 0)) continue; // the header line
      throw new InputError("input", `line ${record.line}: "${record.fields[0].text}" is not a strength`);
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

function update(): void {
  const text = byId<HTMLTextAreaElement>("mfit-text").value;
  const out = byId("mfit-answer");
  const checks = byId("mfit-checks");
  byId("mfit-error").textContent = "";
  if (text.trim() === "") {
    out.textContent = "";
    checks.textContent = "";
    byId("mfit-rows").replaceChildren();
    return;
  }
  try {
    const poissonText = byId<HTMLInputElement>("mfit-poisson").value.trim().replace(",", ".");
    const answer = materialFitAnswer({
      text,
      flaws: byId<HTMLSelectElement>("mfit-flaws").value === "surface" ? "surface" : "volume",
      poisson: poissonText === "" ? undefined : Number(poissonText),
      decimalComma: byId<HTMLInputElement>("decimal-comma").checked,
    });
    out.textContent = answer.headline;
    byId("mfit-rows").replaceChildren(...answer.rows.map((r) => el("tr", {}, [el("th", { text: r.label, attrs: { scope: "row" } }), el("td", { text: r.value })])));
    checks.textContent = answer.checks;
    checks.className = answer.caution ? "caution warning" : "help";
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    out.textContent = "";
    checks.textContent = "";
    byId("mfit-rows").replaceChildren();
    byId("mfit-error").textContent = error.message.charAt(0).toUpperCase() + error.message.slice(1) + ".";
  }
}

/** Wires the panel; the fit runs when the user asks (it simulates for a second or so). */
export function setupMaterialFitPanel(): void {
  byId("mfit-run").addEventListener("click", update);
}
