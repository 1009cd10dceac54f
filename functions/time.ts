/**
 * Cell adapters for time under load: slow-crack-growth fits, lifetimes,
 * strength-probability-time design, load histories and proof testing.
 * Each reads its cells through cells.ts and calls the core in src/design; the
 * JSDoc here is the source of functions.json (custom-functions-metadata).
 *
 * Only adapters are exported: the registry registers every export.
 */
import { fitStaticFatigue, fitStressRate } from "../src/design/crack-growth-fit";
import {
  crackGrowthB,
  crackGrowthBFromStaticFit,
  crackGrowthBFromStressRateFit,
  lifetimeStress,
  timeToFailure,
} from "../src/design/crack-growth-life";
import { lifeDesignStress, loadHistoryStress } from "../src/design/lifetime-design";
import {
  postProofFailureProbability,
  proofBreakFraction,
  proofMinimumLife,
  proofStressForLife,
} from "../src/design/proof-test";
import { CellError, readChoice, readNumber, readOptionalNumber, readPairs } from "./cells";
import { declareSpills } from "./spill-shapes";

declareSpills({
  SCGFIT: { rows: 2, cols: 2 },
  SCGNBOUNDS: { rows: 4, cols: 2 },
  SCGSTATICFIT: { rows: 2, cols: 2 },
  SCGSTATICNBOUNDS: { rows: 4, cols: 2 },
});

function readConfidence(confidence: unknown): number {
  return readOptionalNumber(confidence, "confidence", 0.95);
}

/** "OK", or what falls short of the test plan the standard asks for. */
function planCheck(decades: number, narrow: boolean, few: boolean, levels: number, what: string): string {
  const notes: string[] = [];
  if (narrow) notes.push(`SPAN ${decades.toFixed(1)} DECADES (<3)`);
  if (few) notes.push(`${levels} ${what} (<4)`);
  return notes.length ? notes.join("; ") : "OK";
}

/**
 * Slow-crack-growth exponent n and parameter D from constant stress-rate strength tests (ASTM C1368): least squares
 * of log10 strength on log10 stress rate, one point per specimen; n = 1/slope - 1 and D = 10^intercept, so that
 * strength = D * rate^(1/(n+1)). Use at least four rates spanning three decades or more (see SCGNBOUNDS for the
 * check). Example: =BRITTLE.SCGFIT(A2:A31, B2:B31) spills n and D, labelled.
 * @customfunction
 * @param stressRates Stress rate of each specimen (stress unit per second, > 0), one per specimen.
 * @param strengths Fracture strength of each specimen (stress unit, > 0), same shape as stressRates.
 * @returns 2 x 2 table of labels and values: n (dimensionless), D (stress unit at unit stress rate).
 */
export function SCGFIT(stressRates: any[][], strengths: any[][]): any[][] {
  const { x, y } = readPairs(stressRates, "stressRates", strengths, "strengths");
  const fit = fitStressRate({ stressRates: x, strengths: y });
  return [
    ["crack-growth exponent n", fit.n],
    ["D (strength at unit stress rate)", fit.D],
  ];
}

/**
 * Confidence bounds on the crack-growth exponent n from constant stress-rate tests, and a check of the test plan.
 * The bounds are the two-sided Student t interval on the regression slope (N - 2 degrees of freedom) mapped through
 * n = 1/slope - 1; "unbounded" when the interval reaches zero slope. The check reads "OK", or names a span under
 * three decades of rate or fewer than four rates (ASTM C1368 test plan).
 * Example: =BRITTLE.SCGNBOUNDS(A2:A31, B2:B31, 0.95) spills lower n, upper n, decades spanned and the check, labelled.
 * @customfunction
 * @param stressRates Stress rate of each specimen (stress unit per second, > 0), one per specimen.
 * @param strengths Fracture strength of each specimen (stress unit, > 0), same shape as stressRates.
 * @param [confidence] Two-sided confidence level, strictly between 0 and 1; default 0.95.
 * @returns 4 x 2 table of labels and values: lower n, upper n (or "unbounded"), decades of stress rate spanned, plan check text.
 */
export function SCGNBOUNDS(stressRates: any[][], strengths: any[][], confidence?: number): any[][] {
  const { x, y } = readPairs(stressRates, "stressRates", strengths, "strengths");
  const fit = fitStressRate({ stressRates: x, strengths: y, confidence: readConfidence(confidence) });
  const check = planCheck(fit.decades, fit.narrowSpan, fit.fewRates, fit.distinctRates, "RATES");
  const level = `(${Number((fit.confidence * 100).toPrecision(4))} %, two-sided)`;
  return [
    [`n, lower bound ${level}`, fit.nLower],
    [`n, upper bound ${level}`, fit.nUpper ?? "unbounded"],
    ["decades of stress rate spanned", fit.decades],
    ["test plan check", check],
  ];
}

/**
 * Slow-crack-growth exponent n from static-fatigue (constant stress) tests (ASTM C1576): least squares of log10 time
 * to failure on log10 stress; n = -slope, and log10 Ds = intercept, so that time to failure = 10^log10Ds *
 * stress^-n. Leave run-outs (specimens that did not break) out. Example: =BRITTLE.SCGSTATICFIT(A2:A21, B2:B21)
 * spills n and log10 Ds.
 * @customfunction
 * @param stresses Constant applied stress of each specimen (stress unit, > 0), one per specimen.
 * @param lifetimes Time to failure of each specimen (any time unit, > 0), same shape as stresses.
 * @returns 2 x 2 table of labels and values: n (dimensionless), log10 Ds (Ds in time unit x stress unit^n).
 */
export function SCGSTATICFIT(stresses: any[][], lifetimes: any[][]): any[][] {
  const { x, y } = readPairs(stresses, "stresses", lifetimes, "lifetimes");
  const fit = fitStaticFatigue({ stresses: x, lifetimes: y });
  return [
    ["crack-growth exponent n", fit.n],
    ["log10 Ds", fit.log10D],
  ];
}

/**
 * Confidence bounds on n from static-fatigue tests, and a check of the test plan: the two-sided Student t interval on
 * the regression slope (N - 2 degrees of freedom). The check reads "OK", or names failure times spanning under three
 * decades or fewer than four stress levels. Example: =BRITTLE.SCGSTATICNBOUNDS(A2:A21, B2:B21) spills lower n,
 * upper n, decades of time spanned and the check, labelled.
 * @customfunction
 * @param stresses Constant applied stress of each specimen (stress unit, > 0), one per specimen.
 * @param lifetimes Time to failure of each specimen (any time unit, > 0), same shape as stresses.
 * @param [confidence] Two-sided confidence level, strictly between 0 and 1; default 0.95.
 * @returns 4 x 2 table of labels and values: lower n, upper n, decades of failure time spanned, plan check text.
 */
export function SCGSTATICNBOUNDS(stresses: any[][], lifetimes: any[][], confidence?: number): any[][] {
  const { x, y } = readPairs(stresses, "stresses", lifetimes, "lifetimes");
  const fit = fitStaticFatigue({ stresses: x, lifetimes: y, confidence: readConfidence(confidence) });
  const check = planCheck(fit.timeDecades, fit.narrowSpan, fit.fewStresses, fit.distinctStresses, "STRESSES");
  const level = `(${Number((fit.confidence * 100).toPrecision(4))} %, two-sided)`;
  return [
    [`n, lower bound ${level}`, fit.nLower],
    [`n, upper bound ${level}`, fit.nUpper],
    ["decades of failure time spanned", fit.timeDecades],
    ["test plan check", check],
  ];
}

/**
 * Constant stress that a part can carry for a lifetime with the same failure probability as a strength measured at
 * a constant stress rate: strength * (strength / ((n+1) * stressRate * lifetime))^(1/n). Feed it a design strength
 * at the test rate (DESIGNSTRESS on a fit of rate tests in the service environment) to get a lifetime design stress.
 * Assumes the crack grows well beyond its initial size (the usual closed form). n must come from tests in the service
 * environment and temperature; extrapolating far beyond the test times is the user's judgement.
 * Example: =BRITTLE.LIFETIMESTRESS(300, 10, 20, 3.15E8) is about 114.8.
 * @customfunction
 * @param strength Strength at the test stress rate (stress unit, > 0).
 * @param stressRate Stress rate of the strength test (stress unit per time unit, > 0).
 * @param n Slow-crack-growth exponent (dimensionless, > 2), from SCGFIT or the literature for the environment.
 * @param lifetime Required life under constant stress (same time unit as stressRate, > 0).
 * @returns Allowable constant stress over the lifetime, in the units of strength.
 */
export function LIFETIMESTRESS(strength: number, stressRate: number, n: number, lifetime: number): number {
  return lifetimeStress({
    strength: readNumber(strength, "strength"),
    stressRate: readNumber(stressRate, "stressRate"),
    n: readNumber(n, "n"),
    lifetime: readNumber(lifetime, "lifetime"),
  });
}

/**
 * Time to failure under a constant stress of a part whose strength at a constant stress rate is known (same failure
 * probability): strength^(n+1) / ((n+1) * stressRate * stress^n). The inverse of LIFETIMESTRESS.
 * Example: =BRITTLE.TIMETOFAILURE(150, 300, 10, 20) is about 1.498E6 (time unit of the rate).
 * @customfunction
 * @param stress Constant applied stress (stress unit, > 0).
 * @param strength Strength at the test stress rate (stress unit, > 0).
 * @param stressRate Stress rate of the strength test (stress unit per time unit, > 0).
 * @param n Slow-crack-growth exponent (dimensionless, > 2).
 * @returns Time to failure, in the time unit of stressRate.
 */
export function TIMETOFAILURE(stress: number, strength: number, stressRate: number, n: number): number {
  return timeToFailure({
    stress: readNumber(stress, "stress"),
    strength: readNumber(strength, "strength"),
    stressRate: readNumber(stressRate, "stressRate"),
    n: readNumber(n, "n"),
  });
}

/**
 * Slow-crack-growth parameter B = 2 toughness^2 / (velocity * geometryFactor^2 * (n - 2)) from crack-velocity
 * constants, for the law crack velocity = velocity * (K / toughness)^n with K = geometryFactor * stress * sqrt(a).
 * Units: toughness in MPa m^0.5 and velocity in m/s give B in MPa^2 s.
 * Example: =BRITTLE.SCGBFROMVELOCITY(20, 0.001, 3.5, 1.99) is about 343.7.
 * @customfunction
 * @param n Slow-crack-growth exponent (dimensionless, > 2).
 * @param velocity Crack velocity at K = toughness, the coefficient of the power law (length per time unit, > 0).
 * @param toughness Fracture toughness K_IC (stress unit x length^0.5, > 0).
 * @param geometryFactor Crack geometry factor Y in K = Y stress sqrt(a) (dimensionless, > 0): 1.12 sqrt(pi), about 1.99, for a long shallow edge crack; about 1.2 to 1.3 for a small semicircular surface crack (from memory).
 * @returns B, in stress unit^2 x time unit.
 */
export function SCGBFROMVELOCITY(n: number, velocity: number, toughness: number, geometryFactor: number): number {
  return crackGrowthB({
    n: readNumber(n, "n"),
    velocityCoefficient: readNumber(velocity, "velocity"),
    toughness: readNumber(toughness, "toughness"),
    geometryFactor: readNumber(geometryFactor, "geometryFactor"),
  });
}

/**
 * Slow-crack-growth parameter B from a fatigue fit and the inert strength at the same failure probability (for
 * example both characteristic strengths). "RATE": B = D^(n+1) / ((n+1) inertStrength^(n-2)) with D from SCGFIT;
 * "STATIC": B = 10^log10Ds / inertStrength^(n-2) with log10 Ds from SCGSTATICFIT.
 * Example: =BRITTLE.SCGBFROMFIT(300, 20, 450) is about 870.0 (stress unit^2 x time unit).
 * @customfunction
 * @param D "RATE": D from SCGFIT (stress unit, > 0); "STATIC": log10 Ds from SCGSTATICFIT.
 * @param n Slow-crack-growth exponent from the same fit (dimensionless, > 2).
 * @param inertStrength Inert strength (tested in vacuum, dry gas or oil, or fast) at the same failure probability (stress unit, > 0).
 * @param [test] "RATE" (default, constant stress-rate fit) or "STATIC" (static-fatigue fit).
 * @returns B, in stress unit^2 x time unit.
 */
export function SCGBFROMFIT(D: number, n: number, inertStrength: number, test?: string): number {
  const kind = readChoice(test, "test", ["RATE", "STATIC"] as const, "RATE");
  const args = { n: readNumber(n, "n"), inertStrength: readNumber(inertStrength, "inertStrength") };
  if (kind === "STATIC") return crackGrowthBFromStaticFit({ ...args, log10D: readNumber(D, "log10 Ds") });
  return crackGrowthBFromStressRateFit({ ...args, D: readNumber(D, "D") });
}

/**
 * Strength-probability-time design: the constant stress a part survives for a lifetime with the stated
 * probability, from the inert-strength Weibull parameters and the crack-growth n and B. Solves
 * B s^(n-2) + lifetime s^n = B si^(n-2), si the inert design strength (DESIGNSTRESS). For Weibull parameters measured
 * at a stress rate in the service environment use LIFETIMESTRESS(DESIGNSTRESS(...), rate, n, lifetime) instead.
 * Power-law crack growth only: not for R-curve materials; n and B must match the service environment.
 * Example: =BRITTLE.LIFEDESIGNSTRESS(0.9999, 3.15E8, 10, 450, 20, 2, 25) is about 31.06.
 * @customfunction
 * @param survival Required survival probability over the lifetime, strictly between 0 and 1 (e.g. 0.9999).
 * @param lifetime Required life under constant stress (time unit of B, > 0).
 * @param modulus Weibull modulus m of the inert strengths (dimensionless, > 0).
 * @param charStrength Characteristic inert strength of the tested specimens (stress unit, > 0).
 * @param n Slow-crack-growth exponent (dimensionless, > 2).
 * @param B Slow-crack-growth parameter (stress unit^2 x time unit, > 0), from SCGBFROMVELOCITY or SCGBFROMFIT.
 * @param [sizeRatio] Effective size of the part divided by that of the specimens (dimensionless, > 0); default 1.
 * @returns Allowable constant stress, in the units of charStrength.
 */
export function LIFEDESIGNSTRESS(
  survival: number,
  lifetime: number,
  modulus: number,
  charStrength: number,
  n: number,
  B: number,
  sizeRatio?: number,
): number {
  const result = lifeDesignStress({
    survival: readNumber(survival, "survival"),
    lifetime: readNumber(lifetime, "lifetime"),
    shape: readNumber(modulus, "modulus"),
    scale: readNumber(charStrength, "charStrength"),
    n: readNumber(n, "n"),
    B: readNumber(B, "B"),
    sizeRatio: readOptionalNumber(sizeRatio, "sizeRatio", 1),
  });
  if (!result.converged) throw new CellError("#NUM!", "the allowable stress did not converge");
  return result.stress;
}

/**
 * Equivalent constant stress of a load history given as blocks of constant stress and their durations: the stress
 * that, held for the reference duration, grows cracks as much as the history, (sum stress^n * duration /
 * reference)^(1/n). Blank or zero stress beside a duration is an unloaded block; enter compressive blocks as 0.
 * Example: =BRITTLE.LOADHISTORYSTRESS(A2:A5, B2:B5, 20) returns a stress in the units of A2:A5.
 * @customfunction
 * @param stresses Peak tensile stress of each block (stress unit, >= 0).
 * @param durations Duration of each block (any time unit, > 0), same shape as stresses.
 * @param n Slow-crack-growth exponent (dimensionless, > 2).
 * @param [duration] Reference duration to quote the equivalent stress for (same time unit, > 0); default the total of the durations.
 * @returns Equivalent constant stress, in the units of stresses.
 */
export function LOADHISTORYSTRESS(stresses: any[][], durations: any[][], n: number, duration?: number): number {
  const { x, y } = readPairs(stresses, "stresses", durations, "durations", true);
  if (x.length === 0) throw new CellError("#VALUE!", "the load history is empty");
  const reference = duration === null || duration === undefined || (duration as unknown) === "" ? undefined : readNumber(duration, "duration");
  return loadHistoryStress({ stresses: x, durations: y, n: readNumber(n, "n"), referenceDuration: reference }).stress;
}

/**
 * Fraction of parts that break in a proof test at the proof stress: 1 - exp(-sizeRatio (proofStress /
 * charStrength)^modulus), with inert-strength Weibull parameters.
 * Example: =BRITTLE.PROOFBREAKS(250, 10, 400) is about 0.009054.
 * @customfunction
 * @param proofStress Peak stress of the proof test (stress unit, > 0).
 * @param modulus Weibull modulus m of the inert strengths (dimensionless, > 0).
 * @param charStrength Characteristic inert strength of the tested specimens (stress unit, > 0).
 * @param [sizeRatio] Effective size of the part divided by that of the specimens (dimensionless, > 0); default 1.
 * @returns Fraction broken, between 0 and 1.
 */
export function PROOFBREAKS(proofStress: number, modulus: number, charStrength: number, sizeRatio?: number): number {
  return proofBreakFraction({
    proofStress: readNumber(proofStress, "proofStress"),
    shape: readNumber(modulus, "modulus"),
    scale: readNumber(charStrength, "charStrength"),
    sizeRatio: readOptionalNumber(sizeRatio, "sizeRatio", 1),
  });
}

/**
 * Failure probability, at an inert stress, of a part that survived the proof test: 1 - exp(-sizeRatio ((stress /
 * charStrength)^modulus - (proofStress / charStrength)^modulus)), and exactly 0 at or below the proof stress. Holds
 * only if the proof load was removed fast or in a dry, inert environment, so no crack grew while unloading.
 * Example: =BRITTLE.POSTPROOFFAILPROB(300, 250, 10, 400) is about 0.04612.
 * @customfunction
 * @param stress Applied peak stress, loaded fast or in an inert environment (stress unit, >= 0).
 * @param proofStress Peak stress of the proof test (stress unit, > 0).
 * @param modulus Weibull modulus m of the inert strengths (dimensionless, > 0).
 * @param charStrength Characteristic inert strength of the tested specimens (stress unit, > 0).
 * @param [sizeRatio] Effective size of the part divided by that of the specimens (dimensionless, > 0); default 1.
 * @returns Failure probability of a survivor, between 0 and 1.
 */
export function POSTPROOFFAILPROB(
  stress: number,
  proofStress: number,
  modulus: number,
  charStrength: number,
  sizeRatio?: number,
): number {
  return postProofFailureProbability({
    stress: readNumber(stress, "stress"),
    proofStress: readNumber(proofStress, "proofStress"),
    shape: readNumber(modulus, "modulus"),
    scale: readNumber(charStrength, "charStrength"),
    sizeRatio: readOptionalNumber(sizeRatio, "sizeRatio", 1),
  });
}

/**
 * Guaranteed minimum life of proof-tested parts under a constant service stress: B serviceStress^-n (proofStress^(n-2)
 * - serviceStress^(n-2)); 0 when the service stress equals the proof stress. Assumes fast unloading or an inert
 * environment in the proof test. With an inert strength in place of the proof stress it is the exact time to
 * failure. Example: =BRITTLE.PROOFMINLIFE(250, 100, 20, 2) is about 2910 (time unit of B).
 * @customfunction
 * @param proofStress Peak stress of the proof test (stress unit, > 0).
 * @param serviceStress Constant service stress (stress unit, > 0, not above proofStress).
 * @param n Slow-crack-growth exponent in the service environment (dimensionless, > 2).
 * @param B Slow-crack-growth parameter (stress unit^2 x time unit, > 0).
 * @returns Minimum time to failure, in the time unit of B.
 */
export function PROOFMINLIFE(proofStress: number, serviceStress: number, n: number, B: number): number {
  return proofMinimumLife({
    proofStress: readNumber(proofStress, "proofStress"),
    serviceStress: readNumber(serviceStress, "serviceStress"),
    n: readNumber(n, "n"),
    B: readNumber(B, "B"),
  });
}

/**
 * Proof stress that guarantees a minimum life under a constant service stress: serviceStress (1 + minLife
 * serviceStress^2 / B)^(1/(n-2)), the inverse of PROOFMINLIFE.
 * Example: =BRITTLE.PROOFSTRESSFORLIFE(100, 3.15E8, 20, 2) is about 476.0.
 * @customfunction
 * @param serviceStress Constant service stress (stress unit, > 0).
 * @param minLife Required minimum life (time unit of B, > 0).
 * @param n Slow-crack-growth exponent in the service environment (dimensionless, > 2).
 * @param B Slow-crack-growth parameter (stress unit^2 x time unit, > 0).
 * @returns Proof stress, in the units of serviceStress.
 */
export function PROOFSTRESSFORLIFE(serviceStress: number, minLife: number, n: number, B: number): number {
  return proofStressForLife({
    serviceStress: readNumber(serviceStress, "serviceStress"),
    minimumLife: readNumber(minLife, "minLife"),
    n: readNumber(n, "n"),
    B: readNumber(B, "B"),
  });
}
