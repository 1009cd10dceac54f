/**
 * Competing (concurrent) flaw populations: every body carries flaws of each
 * population, and it breaks from whichever fails first (ASTM C1239 section 7;
 * ISO 20501 method B).
 *
 * Fitting one population: the specimens that broke from it are its failures;
 * every other specimen is right-censored at its strength (it survived that
 * stress as far as this population is concerned). `populationSample` builds
 * that sample from a column of fracture-origin labels; the fit itself is the
 * censored maximum likelihood of maximum-likelihood.ts.
 *
 * Combining populations: hazards add,
 *
 *   Pf(s) = 1 - exp(-sum_j k_j (s / th_j)^m_j),
 *
 * each with its own size ratio (a volume ratio for volume flaws, an area
 * ratio for surface flaws). The design stress at survival S solves
 * sum_j k_j (s/th_j)^m_j = -ln S (Brent's method on ln s).
 */
import { ensure, ensureConverged, ensurePositiveResult, ensurePositive, ensureProbability, InputError, notRepresentable } from "../errors";
import { findRoot } from "../numeric/roots";
import { cumulativeHazard, type WeibullParameters } from "./distribution";
import type { StrengthSample } from "./sample";

export interface Population extends WeibullParameters {
  /** Effective size of the part over that of the specimens, for this population's flaws; default 1. */
  sizeRatio?: number;
}

function normaliseLabel(label: string): string {
  return label.trim().toUpperCase();
}

/**
 * The sample for fitting `population`: specimens whose origin label matches
 * (case and surrounding spaces ignored) are failures, all others censored.
 */
export function populationSample({
  strengths,
  origins,
  population,
}: {
  strengths: readonly number[];
  origins: readonly string[];
  population: string;
}): StrengthSample {
  if (origins.length !== strengths.length) {
    throw new InputError("input", `the origin labels (${origins.length}) do not match the strengths (${strengths.length})`);
  }
  const wanted = normaliseLabel(population);
  if (!wanted) throw new InputError("input", "name the flaw population to fit (its origin label)");
  origins.forEach((o, i) => {
    if (!normaliseLabel(o)) throw new InputError("input", `specimen ${i + 1} has no fracture-origin label`);
  });
  const censored = origins.map((o) => normaliseLabel(o) !== wanted);
  ensure(
    censored.some((c) => !c),
    () => `no specimen has the origin label "${population}" (labels present: ${[...new Set(origins.map(normaliseLabel))].join(", ")})`,
  );
  return { strengths, censored };
}

function totalHazard(stress: number, populations: readonly Population[]): number {
  let h = 0;
  for (const p of populations) h += cumulativeHazard({ stress, shape: p.shape, scale: p.scale, sizeRatio: p.sizeRatio ?? 1 });
  return h;
}

function checkPopulations(populations: readonly Population[]): void {
  ensure(populations.length >= 1, "give at least one flaw population");
  for (const p of populations) {
    ensurePositive(p.shape, "modulus");
    ensurePositive(p.scale, "characteristic strength");
    ensurePositive(p.sizeRatio ?? 1, "size ratio");
  }
}

/** Failure probability at `stress` with all populations acting: -expm1(-sum of hazards). */
export function competingFailureProbability({ stress, populations }: { stress: number; populations: readonly Population[] }): number {
  checkPopulations(populations);
  ensure(Number.isFinite(stress) && stress >= 0, () => `stress must be zero or positive (got ${stress})`);
  const pf = -Math.expm1(-totalHazard(stress, populations));
  // Positive at any positive stress: 0 there is an underflow, an error rather than a probability.
  if (pf === 0 && stress > 0) throw notRepresentable("failure probability", "small");
  return pf;
}

/** Stress a body survives with probability `survival` with all populations acting. */
export function competingDesignStress({ survival, populations }: { survival: number; populations: readonly Population[] }): number {
  checkPopulations(populations);
  ensureProbability(survival, "survival probability");
  const target = -Math.log(survival);
  // Stress at which one population alone reaches `hazard`: th exp((ln H - ln k)/m), in logs.
  const alone = (hazard: number) =>
    Math.min(...populations.map((p) => p.scale * Math.exp((Math.log(hazard) - Math.log(p.sizeRatio ?? 1)) / p.shape)));
  // Each population alone reaching the whole hazard bounds the root above; each reaching 1/J of it
  // bounds it below. Either end can be the root itself (identical populations put it at the lower
  // end, a population with a negligible share of the risk at the upper end), and then the residual
  // there is rounding noise of either sign: the bracket is widened a little in ln s (the residual
  // grows at least as fast as the smallest modulus times the widening) until the signs differ.
  const hi = alone(target);
  const lo = alone(target / populations.length);
  ensurePositiveResult(hi, "design stress");
  ensurePositiveResult(lo, "design stress");
  if (hi === lo) return hi;
  const logTarget = Math.log(target);
  const residual = (u: number) => Math.log(totalHazard(Math.exp(u), populations)) - logTarget;
  let uLo = Math.log(lo);
  let uHi = Math.log(hi);
  let widen = 64 * Number.EPSILON * Math.max(1, Math.abs(uLo), Math.abs(uHi));
  for (let i = 0; i < 60 && !(residual(uLo) < 0 && residual(uHi) > 0); i++) {
    if (!(residual(uLo) < 0)) uLo -= widen;
    if (!(residual(uHi) > 0)) uHi += widen;
    widen *= 2;
  }
  const result = findRoot(residual, uLo, uHi);
  ensureConverged(result.converged, "the design stress solve did not converge");
  return Math.exp(result.root);
}
