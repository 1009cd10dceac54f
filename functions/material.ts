/**
 * Cell adapters for one material across specimen geometries (MATERIALFIT) and
 * for test planning (SPECIMENSNEEDED, BOUNDRATIOTABLE). Each reads its cells
 * through cells.ts and calls the core in src/design; the JSDoc here is the
 * source of functions.json (custom-functions-metadata).
 *
 * Only adapters are exported: the registry registers every export.
 */
import { InputError } from "../src/errors";
import { fitMaterial, type MaterialFitResult } from "../src/design/material-fit";
import { materialFitCaution } from "../src/design/material-fit-caution";
import { MATERIAL_SIMULATION, simulateMaterialFit, type MaterialSimulation } from "../src/design/material-fit-simulation";
import { parseConfiguration, sizeLaw, type SizeLaw } from "../src/design/specimen-geometry";
import { boundRatio, PLANNING_SIZES, specimensNeeded } from "../src/design/specimens-needed";
import { CRITERIA } from "../src/size/criteria";
import {
  CellError,
  asRange,
  readChoice,
  readFlags,
  readNumber,
  readOptionalNumber,
  readPositiveNumbers,
  requireSameShape,
  type CellValue,
} from "./cells";
import { declareSpills } from "./spill-shapes";

/** Most configurations one MATERIALFIT table has room for (the engine reserves the rows in advance). */
const MAX_CONFIGURATIONS = 6;
const ROWS_PER_CONFIGURATION = 5;
const MATERIALFIT_ROWS = 6 + ROWS_PER_CONFIGURATION * MAX_CONFIGURATIONS + 9;

declareSpills({
  MATERIALFIT: { rows: MATERIALFIT_ROWS, cols: 2 },
  BOUNDRATIOTABLE: { rows: PLANNING_SIZES.length + 1, cols: 2 },
});

function percent(confidence: number): string {
  return `${Number((confidence * 100).toPrecision(4))} %`;
}

interface Grouped {
  label: string;
  key: string;
  strengths: number[];
  censored: boolean[];
}

function groupByConfiguration(strengths: unknown, configurations: unknown, censored: unknown): Grouped[] {
  const numbers = readPositiveNumbers(strengths, "strengths");
  const configs = asRange(configurations, "configurations");
  requireSameShape("configurations", { rows: configs.length, cols: configs[0].length }, "strengths", numbers);
  const flags = censored === null || censored === undefined ? null : readFlags(censored, "censored", numbers, "strengths");
  const groups = new Map<string, Grouped>();
  numbers.indices.forEach((index, k) => {
    const r = Math.floor(index / numbers.cols);
    const c = index % numbers.cols;
    const text = configs[r][c];
    if (typeof text !== "string" || text.trim() === "") {
      const where = numbers.cols > 1 ? `row ${r + 1} column ${c + 1}` : `row ${r + 1}`;
      throw new CellError("#VALUE!", `configurations, ${where}: a specimen's configuration must be text such as "C1161-B-4PT" or "BAR 40/20 4x3"`);
    }
    // Specimens described the same way by a preset name and by dimensions share one group.
    const key = JSON.stringify(parseConfiguration(text));
    let group = groups.get(key);
    if (!group) {
      group = { label: text.trim(), key, strengths: [], censored: [] };
      groups.set(key, group);
    }
    group.strengths.push(numbers.values[k]);
    group.censored.push(flags ? flags[k] : false);
  });
  return [...groups.values()];
}

/**
 * The simulated bounds and p-values, or why there are none. They need complete samples, and enough simulated data
 * sets that can be fitted: the point fit stays useful when they do not exist, so the table shows it with the reason.
 */
function simulatedBounds(fit: MaterialFitResult, laws: SizeLaw[], confidence: number): { sim: MaterialSimulation | null; notSimulated: string } {
  if (fit.censored) return { sim: null, notSimulated: "n/a (censored specimens: simulation needs complete samples)" };
  try {
    return { sim: simulateMaterialFit({ fit, laws, confidence, seed: MATERIAL_SIMULATION.seed }), notSimulated: "" };
  } catch (error) {
    if (error instanceof InputError && error.kind === "notApplicable") return { sim: null, notSimulated: `n/a (${error.message})` };
    throw error;
  }
}

const NO_OWN_FIT = "n/a (failures all equal in a configuration: no finite modulus of its own)";

function fitTable(fit: MaterialFitResult, sim: MaterialSimulation | null, notSimulated: string, confidence: number, sizeUnit: string): CellValue[][] {
  const level = `(${percent(confidence)}, two-sided, simulated)`;
  const rows: CellValue[][] = [
    ["modulus m (maximum likelihood, no unbiasing)", fit.shape],
    ["material scale sigma_0 (stress x size^(1/m))", fit.materialScale],
    ["size basis", sizeUnit],
    ["configurations", fit.groups.length],
    ["specimens", fit.groups.reduce((s, g) => s + g.specimens, 0)],
    ["failures (population fitted)", fit.groups.reduce((s, g) => s + g.failures, 0)],
  ];
  for (const g of fit.groups) {
    rows.push(
      [`${g.label}: specimens`, g.specimens],
      [`${g.label}: effective size at m`, g.effectiveSize],
      [`${g.label}: characteristic strength, material fit`, g.impliedScale],
      [`${g.label}: characteristic strength, own fit`, g.ownScale ?? NO_OWN_FIT],
      [`${g.label}: modulus, own fit`, g.ownShape ?? NO_OWN_FIT],
    );
  }
  rows.push(
    [`modulus, lower bound ${level}`, sim ? sim.shapeBounds.lower : notSimulated],
    [`modulus, upper bound ${level}`, sim ? sim.shapeBounds.upper : notSimulated],
    [`material scale, lower bound ${level}`, sim ? sim.scaleBounds.lower : notSimulated],
    [`material scale, upper bound ${level}`, sim ? sim.scaleBounds.upper : notSimulated],
    ["p-value: one modulus (common m vs separate fits)", sim ? (sim.oneModulusP ?? NO_OWN_FIT) : notSimulated],
    ["p-value: the size effect holds (tied by effective size vs free)", sim ? sim.sizeEffectP : notSimulated],
    ["checks", sim ? materialFitCaution(sim) : notSimulated],
    [
      "bounds and p-values from",
      sim
        ? `parametric simulation at the fitted values, ${sim.replications} data sets, seed ${sim.seed} (approximate)`
        : notSimulated,
    ],
    ["converged", fit.converged],
  );
  while (rows.length < MATERIALFIT_ROWS) rows.push(["", ""]);
  return rows;
}

/**
 * One Weibull modulus and one material scale from specimens of several geometries (bars, rods, disks): joint maximum
 * likelihood in which each configuration's characteristic strength is sigma_0 V_E(m)^(-1/m), its effective size
 * recomputed at every trial modulus; with each configuration's own fit, bounds and two p-values by seeded simulation.
 * Example: =BRITTLE.MATERIALFIT(B2:B41, C2:C41, "VOLUME", , "PIA", 0.22) spills 45 rows of labels and values.
 * @customfunction
 * @cancelable
 * @param strengths Fracture strengths, one per specimen (MPa or any stress unit). Blanks and zeros are skipped.
 * @param configurations Each specimen's configuration label, same shape as strengths: a preset name as SPECIMEN accepts it ("C1161-B-4PT", "C1499-20/10") or its dimensions in mm: BAR 40/20 4x3 (bar: outer/inner span, width x depth), ROD 40/20 5 (rod: spans, diameter), RING 10/20 25x1 (ring-on-ring: load/support ring, disk diameter x thickness), PISTON 1.4/10 14x1.2 (piston-on-three-balls).
 * @param [flaws] "VOLUME" (default) for volume-distributed flaws, "SURFACE" for surface flaws.
 * @param [censored] Optional flags, same shape as strengths: TRUE or 1 where the specimen broke from another flaw population (the fit then shows no simulated bounds or p-values).
 * @param [criterion] Multiaxial criterion for disk configurations: "PIA" (default), "NSA" or "MAXPRINCIPAL".
 * @param [poisson] Poisson's ratio, between -1 and 0.5: required when a configuration is a disk.
 * @param [confidence] Two-sided confidence of the simulated bounds, from 0.5 to 0.99; default 0.90.
 * @returns 45 x 2 table of labels and values (blank rows at the end when fewer than 6 configurations).
 */
export function MATERIALFIT(
  strengths: any[][],
  configurations: any[][],
  flaws?: string,
  censored?: any[][],
  criterion?: string,
  poisson?: number,
  confidence?: number,
): any[][] {
  const grouped = groupByConfiguration(strengths, configurations, censored);
  if (grouped.length < 2) {
    throw new CellError("#N/A", "every specimen has one configuration: a pooled fit needs two or more (for one, use FIT and MATERIALSCALE)");
  }
  if (grouped.length > MAX_CONFIGURATIONS) {
    throw new CellError("#VALUE!", `configurations: at most ${MAX_CONFIGURATIONS} different configurations fit in one table (found ${grouped.length})`);
  }
  const which = readChoice(flaws, "flaws", ["VOLUME", "SURFACE"] as const, "VOLUME");
  const flawKind = which === "SURFACE" ? "surface" : "volume";
  const nu = poisson === null || poisson === undefined || (poisson as unknown) === "" ? undefined : readNumber(poisson, "poisson");
  const crit = readChoice(criterion, "criterion", CRITERIA, "PIA");
  const level = readOptionalNumber(confidence, "confidence", 0.9);
  if (!(level >= 0.5 && level <= 0.99)) throw new CellError("#VALUE!", `confidence must lie from 0.5 to 0.99 (got ${level})`);
  const laws: SizeLaw[] = grouped.map((g) =>
    sizeLaw({ geometry: JSON.parse(g.key), flaws: flawKind, poisson: nu, criterion: crit }),
  );
  const fit = fitMaterial({
    groups: grouped.map((g, k) => ({ label: g.label, law: laws[k], strengths: g.strengths, censored: g.censored })),
  });
  if (!fit.converged) {
    throw new CellError("#N/A", "the pooled likelihood has no maximum inside the moduli searched: these specimens do not fit one material model");
  }
  const { sim, notSimulated } = simulatedBounds(fit, laws, level);
  const unit = flawKind === "surface" ? "effective area (mm^2 for presets and dimensions in mm)" : "effective volume (mm^3 for presets and dimensions in mm)";
  return fitTable(fit, sim, notSimulated, level, unit);
}

function planningInputs(modulus: unknown, survival: unknown, sizeRatio: unknown, confidence: unknown) {
  return {
    shape: readNumber(modulus, "modulus"),
    survival: readNumber(survival, "survival"),
    sizeRatio: readOptionalNumber(sizeRatio, "sizeRatio", 1),
    confidence: readOptionalNumber(confidence, "confidence", 0.95),
  };
}

/**
 * Test planning: the smallest number of specimens (complete sample) for which the lower confidence bound on the design
 * stress is at least targetRatio times its point estimate, if the fitted modulus comes out as the one assumed
 * (planned ratio exp(-u_C/m), u_C the quantile of the design-stress pivot). Example: =BRITTLE.SPECIMENSNEEDED(0.8, 10, 0.999)
 * is about 35.
 * @customfunction
 * @param targetRatio Required ratio of the design-stress lower bound to its point estimate, strictly between 0 and 1 (e.g. 0.8).
 * @param modulus Weibull modulus m expected for the material (dimensionless, > 0), from a datasheet or earlier tests.
 * @param survival Required survival probability of the part, strictly between 0 and 1 (e.g. 0.999).
 * @param [sizeRatio] Part's effective size over the specimen's (> 0); default 1.
 * @param [confidence] One-sided confidence of the lower bound, from 0.5 to 0.995; default 0.95 (as DESIGNSTRESSBOUND).
 * @returns Number of specimens (whole number, at least 2).
 */
export function SPECIMENSNEEDED(targetRatio: number, modulus: number, survival: number, sizeRatio?: number, confidence?: number): number {
  const inputs = planningInputs(modulus, survival, sizeRatio, confidence);
  const result = specimensNeeded({ ...inputs, targetRatio: readNumber(targetRatio, "targetRatio") });
  if (result.specimens === null) {
    throw new CellError(
      "#N/A",
      `even 10000 specimens give a planned ratio of only ${result.ratio.toPrecision(4)}: lower the target, the confidence or the survival`,
    );
  }
  return result.specimens;
}

/**
 * Planning table for charts: the planned ratio of the design-stress lower bound to its point estimate, exp(-u_C/m),
 * against the number of specimens (2 to 30, then 35 ... 1000), for an assumed modulus; a header row, then one row per
 * sample size. Example: =BRITTLE.BOUNDRATIOTABLE(10, 0.999) spills 46 rows of specimens and ratio.
 * @customfunction
 * @param modulus Weibull modulus m expected for the material (dimensionless, > 0).
 * @param survival Required survival probability of the part, strictly between 0 and 1.
 * @param [sizeRatio] Part's effective size over the specimen's (> 0); default 1.
 * @param [confidence] One-sided confidence of the lower bound, from 0.5 to 0.995; default 0.95.
 * @returns 46 x 2: header, then specimens and planned ratio (dimensionless, 0 to 1).
 */
export function BOUNDRATIOTABLE(modulus: number, survival: number, sizeRatio?: number, confidence?: number): any[][] {
  const inputs = planningInputs(modulus, survival, sizeRatio, confidence);
  const rows: CellValue[][] = [["specimens", "planned ratio bound/estimate"]];
  for (const n of PLANNING_SIZES) rows.push([n, boundRatio({ ...inputs, specimens: n })]);
  return rows;
}
