/**
 * Cell adapters for honest uncertainty: confidence bounds, the fit table, fit
 * quality, probability-plot points, the design-stress bound, datasheet
 * conversions, competing flaw populations and the lot check. Each reads its
 * cells through cells.ts and calls the core in src/weibull; the JSDoc here is
 * the source of functions.json (custom-functions-metadata).
 *
 * Only adapters are exported: the registry registers every export.
 */
import { fitQuality } from "../src/weibull/anderson-darling";
import { parameterBounds, type BoundSides } from "../src/weibull/confidence-bounds";
import { competingDesignStress, competingFailureProbability, populationSample } from "../src/weibull/competing-populations";
import { datasheetBounds } from "../src/weibull/datasheet-bounds";
import { designStressBound } from "../src/weibull/design-stress-bound";
import { summarizeFit, type FitSummary } from "../src/weibull/fit-summary";
import { compareLots } from "../src/weibull/lot-comparison";
import { modulusFromCoefficientOfVariation } from "../src/weibull/modulus-from-cv";
import { plottingPositions } from "../src/weibull/plotting-positions";
import { BILINEAR_MIN_FAILURES } from "../src/weibull/bilinear-check";
import { LOW_OUTLIER_MIN_FAILURES } from "../src/weibull/low-outlier-check";
import {
  CellError,
  readNumber,
  readOptionalBoolean,
  readOptionalNumber,
  readLabels,
  readPositiveNumbers,
  readSample,
  type CellValue,
} from "./cells";
import { readEstimator, readMethod } from "./fit-method";
import { declareSpills } from "./spill-shapes";

const FIT_ROWS = 21;

declareSpills({
  FIT: { rows: FIT_ROWS, cols: 2 },
  ORIGINFIT: { rows: FIT_ROWS, cols: 2 },
  MODULUSBOUNDS: { rows: 2, cols: 2 },
  CHARSTRENGTHBOUNDS: { rows: 2, cols: 2 },
  DATASHEETBOUNDS: { rows: 6, cols: 2 },
  FITQUALITY: { rows: 2, cols: 2 },
  PLOTPOINTS: { rows: { cellsOf: 0 }, cols: 3, headerRows: 1 },
  LOTCHECK: { rows: 3, cols: 2 },
});

function readSides(value: unknown): BoundSides {
  const sides = readOptionalNumber(value, "sides", 2);
  if (sides !== 1 && sides !== 2) throw new CellError("#VALUE!", `sides must be 1 (one-sided bounds) or 2 (two-sided) (got ${sides})`);
  return sides;
}

function percent(confidence: number): string {
  return `${Number((confidence * 100).toPrecision(4))} %`;
}

/** "(90 %, two-sided)": every confidence a table shows carries its sidedness. */
function levelText(confidence: number, sides: BoundSides): string {
  return `(${percent(confidence)}, ${sides === 2 ? "two" : "one"}-sided)`;
}

function fitTable(summary: FitSummary, methodName: string): CellValue[][] {
  const level = `(${percent(summary.confidence)}, two-sided)`;
  const q = summary.quality;
  const b = summary.checks.bilinear;
  const o = summary.checks.lowOutlier;
  const rows: CellValue[][] = [
    ["specimens", summary.specimens],
    ["failures (population fitted)", summary.failures],
    ["method", methodName],
    ["unbiasing factor", summary.unbiasingUnavailable ? "none at 2 failures (E[m_hat/m] is infinite)" : summary.unbiasingFactor],
    [summary.unbiasingUnavailable ? "modulus m (raw ML, not unbiased: no unbiasing factor exists at 2 failures)" : "modulus m", summary.shape],
    [`modulus, lower bound ${level}`, summary.shapeBounds.lower],
    [`modulus, upper bound ${level}`, summary.shapeBounds.upper],
    ["characteristic strength", summary.scale],
    [`characteristic strength, lower bound ${level}`, summary.scaleBounds.lower],
    [`characteristic strength, upper bound ${level}`, summary.scaleBounds.upper],
    ["mean strength", summary.mean],
    ["median strength", summary.median],
    ["standard deviation of strength", summary.standardDeviation],
    ["Anderson-Darling A*", q ? q.aStar : "n/a (censored sample)"],
    ["observed significance level (OSL)", q ? q.osl : "n/a (censored sample)"],
    ["plot bend check (different moduli), p", b ? b.pValue : summary.checks.skipped ?? `n/a (fewer than ${BILINEAR_MIN_FAILURES} failures)`],
    ["mixture check (same modulus), p", "pValue" in summary.mixture ? summary.mixture.pValue : summary.mixture.skipped],
    ["low value check, p", o ? o.pValue : summary.checks.skipped ?? `n/a (fewer than ${LOW_OUTLIER_MIN_FAILURES} failures)`],
    ["verdict", summary.verdict],
    [
      "bounds from",
      summary.boundsSource === "table"
        ? "maximum likelihood, pivotal table (complete sample)"
        : `maximum likelihood, bootstrap of the competing flaw populations (${summary.boundsReplications} draws; approximate)`,
    ],
    ["converged", summary.converged],
  ];
  return rows;
}

function fitFromCells(sample: { strengths: number[]; censored?: boolean[] }, confidence: unknown, method: unknown): CellValue[][] {
  const { name, method: how, estimator } = readMethod(method);
  const summary = summarizeFit({
    ...sample,
    confidence: readOptionalNumber(confidence, "confidence", 0.9),
    method: how,
    estimator,
  });
  return fitTable(summary, name);
}

/**
 * Labelled two-column fit table for a supplier datasheet: counts, modulus and characteristic strength with
 * two-sided confidence bounds (ASTM C1239 pivotal method on the raw maximum-likelihood fit), mean, median, standard
 * deviation, Anderson-Darling A* and OSL, three single-population checks (plot bend: two populations of different
 * moduli; mixture: two of the same modulus; low value), a verdict in plain words, and whether the fit converged.
 * With two failures the default "MLE" modulus row gives the raw ML modulus and says why (no unbiasing factor exists
 * there: E[m_hat/m] is infinite; the factor is tabulated for N = 3 to 500).
 * Example: =BRITTLE.FIT(B2:B31) spills 21 rows of labels and values.
 * @customfunction
 * @cancelable
 * @param strengths Fracture strengths, one per specimen (MPa or any stress unit). Blanks and zeros are skipped.
 * @param [censored] Optional flags, same shape as strengths: TRUE or 1 where the specimen did not fail from the population being fitted.
 * @param [confidence] Two-sided confidence for the bounds, strictly between 0 and 1 (at most 0.99); default 0.90.
 * @param [method] Point estimate: "MLE" (default, unbiased maximum likelihood), "MLE-RAW", "LSQ", "LSQ-MEANRANK" or "LSQ-MEDIANRANK". Bounds always come from maximum likelihood.
 * @returns 21 x 2 table of labels and values.
 */
export function FIT(strengths: any[][], censored?: any[][], confidence?: number, method?: string): any[][] {
  return fitFromCells(readSample(strengths, censored), confidence, method);
}

/**
 * Fit one flaw population of a sample with mixed fracture origins: specimens whose origin label equals origin are
 * failures, all others are censored at their strength (ASTM C1239 / ISO 20501 competing populations). Returns the
 * same 21-row table as FIT. Example: =BRITTLE.ORIGINFIT(B2:B31, C2:C31, "surface") spills the fit of the surface-flaw
 * population.
 * @customfunction
 * @cancelable
 * @param strengths Fracture strengths, one per specimen (MPa or any stress unit). Blanks and zeros are skipped.
 * @param origins Fracture-origin label of each specimen (text such as "surface", "pore", "inclusion"), same shape as strengths.
 * @param origin The label of the population to fit (case and surrounding spaces ignored).
 * @param [confidence] Two-sided confidence for the bounds, strictly between 0 and 1 (at most 0.99); default 0.90.
 * @param [method] "MLE" (default), "MLE-RAW", "LSQ", "LSQ-MEANRANK" or "LSQ-MEDIANRANK".
 * @returns 21 x 2 table of labels and values.
 */
export function ORIGINFIT(strengths: any[][], origins: any[][], origin: string, confidence?: number, method?: string): any[][] {
  const numbers = readPositiveNumbers(strengths, "strengths");
  if (numbers.values.length < 2) {
    throw new CellError("#VALUE!", `strengths: a fit needs at least two specimens (found ${numbers.values.length})`);
  }
  const labels = readLabels(origins, "origins", numbers, "strengths");
  if (typeof origin !== "string" && typeof origin !== "number") throw new CellError("#VALUE!", "origin must be a label (text)");
  const sample = populationSample({ strengths: numbers.values, origins: labels, population: String(origin) });
  return fitFromCells({ strengths: numbers.values, censored: sample.censored as boolean[] }, confidence, method);
}

function boundsFromCells(strengths: unknown, censored: unknown, confidence: unknown, sides: unknown) {
  return parameterBounds({
    ...readSample(strengths, censored),
    confidence: readOptionalNumber(confidence, "confidence", 0.9),
    sides: readSides(sides),
  });
}

/**
 * Confidence bounds on the Weibull modulus by the pivotal method of ASTM C1239 / ISO 20501: m_hat/q, with q the
 * simulated quantiles of m_hat/m and m_hat the raw maximum-likelihood modulus. Censored samples take the quantiles
 * from a bootstrap of competing flaw populations (approximate). Example: =BRITTLE.MODULUSBOUNDS(B2:B31)
 * spills the labelled lower and upper 90 % two-sided bounds.
 * @customfunction
 * @cancelable
 * @param strengths Fracture strengths, one per specimen (MPa or any stress unit). Blanks and zeros are skipped.
 * @param [censored] Optional flags, same shape as strengths: TRUE or 1 where the specimen did not fail from the population being fitted.
 * @param [confidence] Confidence, strictly between 0 and 1 (two-sided: at most 0.99; one-sided: 0.005 to 0.995); default 0.90.
 * @param [sides] 2 (default): a two-sided interval; 1: each value is a one-sided bound at the confidence.
 * @returns 2 x 2 table of labels and values: lower bound, upper bound (dimensionless).
 */
export function MODULUSBOUNDS(strengths: any[][], censored?: any[][], confidence?: number, sides?: number): any[][] {
  const b = boundsFromCells(strengths, censored, confidence, sides);
  const level = levelText(b.confidence, b.sides);
  return [
    [`modulus, lower bound ${level}`, b.shape.lower],
    [`modulus, upper bound ${level}`, b.shape.upper],
  ];
}

/**
 * Confidence bounds on the characteristic strength by the pivotal method of ASTM C1239 / ISO 20501:
 * th_hat exp(-t/m_hat), with t the simulated quantiles of m_hat ln(th_hat/th) and raw maximum-likelihood estimates;
 * censored samples as for MODULUSBOUNDS. Example: =BRITTLE.CHARSTRENGTHBOUNDS(B2:B31, , 0.95) spills the labelled
 * lower and upper 95 % two-sided bounds.
 * @customfunction
 * @cancelable
 * @param strengths Fracture strengths, one per specimen (MPa or any stress unit). Blanks and zeros are skipped.
 * @param [censored] Optional flags, same shape as strengths: TRUE or 1 where the specimen did not fail from the population being fitted.
 * @param [confidence] Confidence, strictly between 0 and 1 (two-sided: at most 0.99; one-sided: 0.005 to 0.995); default 0.90.
 * @param [sides] 2 (default): a two-sided interval; 1: each value is a one-sided bound at the confidence.
 * @returns 2 x 2 table of labels and values: lower bound, upper bound, in the units of the strengths.
 */
export function CHARSTRENGTHBOUNDS(strengths: any[][], censored?: any[][], confidence?: number, sides?: number): any[][] {
  const b = boundsFromCells(strengths, censored, confidence, sides);
  const level = levelText(b.confidence, b.sides);
  return [
    [`characteristic strength, lower bound ${level}`, b.scale.lower],
    [`characteristic strength, upper bound ${level}`, b.scale.upper],
  ];
}

/**
 * Confidence bounds from datasheet values (a complete sample): the modulus and characteristic strength intervals,
 * and with a survival probability the design stress and its lower bound, from the pivotal quantities of ASTM C1239 /
 * Thoman, Bain & Antle, which depend on the number of specimens only. The design-stress bound is one-sided at the
 * confidence of the intervals' lower ends ((1 + confidence)/2: 95 % for 90 % two-sided). Identical to the bounds from
 * the data given the data's own maximum-likelihood values. Example: =BRITTLE.DATASHEETBOUNDS(10.2, 412, 30, TRUE(),
 * 0.9, 0.999) spills six labelled rows; the last, the 95 % one-sided lower bound on the design stress, is 172.1.
 * @customfunction
 * @param modulus Weibull modulus m as the datasheet gives it (dimensionless, > 0).
 * @param charStrength Characteristic strength, maximum likelihood (stress unit, > 0).
 * @param specimens Number of specimens tested, all failed (whole number, >= 2).
 * @param [unbiased] TRUE (default) when the modulus carries the unbiasing factor, as ASTM C1239 datasheets report it (divided out here: the bounds rest on the raw maximum-likelihood modulus); FALSE for a raw ML modulus.
 * @param [confidence] Two-sided confidence of the intervals, strictly between 0 and 1 (at most 0.99); default 0.90.
 * @param [survival] Survival probability for the design stress rows, strictly between 0 and 1; the rows stay blank without it.
 * @param [sizeRatio] Effective size of the part divided by that of the specimens (> 0); default 1.
 * @returns 6 x 2 table of labels and values: modulus lower and upper bounds, characteristic strength lower and upper bounds, design stress and its lower bound.
 */
export function DATASHEETBOUNDS(
  modulus: number,
  charStrength: number,
  specimens: number,
  unbiased?: boolean,
  confidence?: number,
  survival?: number,
  sizeRatio?: number,
): any[][] {
  const given = survival !== null && survival !== undefined && (survival as unknown) !== "";
  const b = datasheetBounds({
    shape: readNumber(modulus, "modulus"),
    scale: readNumber(charStrength, "charStrength"),
    specimens: readNumber(specimens, "specimens"),
    unbiased: readOptionalBoolean(unbiased, "unbiased", true),
    confidence: readOptionalNumber(confidence, "confidence", 0.9),
    survival: given ? readNumber(survival, "survival") : undefined,
    sizeRatio: readOptionalNumber(sizeRatio, "sizeRatio", 1),
  });
  const level = levelText(b.confidence, b.sides);
  const d = b.designStress;
  return [
    [`modulus, lower bound ${level}`, b.shape.lower],
    [`modulus, upper bound ${level}`, b.shape.upper],
    [`characteristic strength, lower bound ${level}`, b.scale.lower],
    [`characteristic strength, upper bound ${level}`, b.scale.upper],
    d ? ["design stress (maximum-likelihood estimate)", d.estimate] : ["", ""],
    d ? [`design stress, lower bound ${levelText(d.confidence, 1)}`, d.lower] : ["", ""],
  ];
}

/**
 * Goodness of fit to a Weibull distribution: the modified Anderson-Darling statistic A* = A2 (1 + 0.2/sqrt(N)) with
 * both parameters estimated by maximum likelihood (critical values 0.637, 0.757, 1.038 at 10, 5, 1 %; Lawless 1982),
 * and its observed significance level OSL = 1/(1 + exp(-0.10 + 1.24 ln A* + 4.48 A*)) (CMH-17-1G). OSL <= 0.05
 * rejects the Weibull model. Complete samples only. Example: =BRITTLE.FITQUALITY(B2:B31) spills A* and the OSL,
 * labelled.
 * @customfunction
 * @param strengths Fracture strengths, one per specimen (MPa or any stress unit). Blanks and zeros are skipped.
 * @param [censored] Optional flags; a sample with censored specimens returns #N/A (the test needs a complete sample).
 * @returns 2 x 2 table of labels and values: A*, observed significance level.
 */
export function FITQUALITY(strengths: any[][], censored?: any[][]): any[][] {
  const sample = readSample(strengths, censored);
  if (sample.censored?.some(Boolean)) {
    throw new CellError("#N/A", "the Anderson-Darling test needs a complete sample: this one has censored specimens");
  }
  const q = fitQuality(sample);
  return [
    ["Anderson-Darling A*", q.aStar],
    ["observed significance level (OSL)", q.osl],
  ];
}

/**
 * Weibull probability-plot coordinates of the failures, in increasing strength: X = ln(strength) and
 * Y = ln(ln(1/(1 - P))). P by (i - 0.5)/N ("HAZEN", default), i/(N + 1) ("MEANRANK") or (i - 0.3)/(N + 0.4)
 * ("MEDIANRANK"); censored samples use Johnson's adjusted ranks. A fitted line is Y = m (X - ln charStrength).
 * The third column is P itself, a fraction, for a chart of strength against a percent axis. Censored specimens and
 * blank cells leave blank rows at the end. Example: =BRITTLE.PLOTPOINTS(B2:B31) spills a header row and 30 rows of
 * X, Y and P.
 * @customfunction
 * @param strengths Fracture strengths, one per specimen (MPa or any stress unit). Blanks and zeros are skipped.
 * @param [censored] Optional flags, same shape as strengths: TRUE or 1 where the specimen did not fail from the population being fitted.
 * @param [estimator] "HAZEN" (default), "MEANRANK" or "MEDIANRANK".
 * @returns (n + 1) x 3 column table with a header row: ln(strength), ln(ln(1/(1 - P))), failure probability P (fraction).
 */
export function PLOTPOINTS(strengths: any[][], censored?: any[][], estimator?: string): any[][] {
  const numbers = readPositiveNumbers(strengths, "strengths");
  const sample = readSample(strengths, censored);
  const which = readEstimator(estimator);
  const points = plottingPositions(sample, which);
  const rows: CellValue[][] = [["ln(strength)", "ln(ln(1/(1-P)))", "failure probability P"]];
  for (const p of points) rows.push([p.x, p.y, p.failureProbability]);
  // The engine reserves a header and one row per cell of the range; fill the rest with blanks.
  while (rows.length < 1 + numbers.rows * numbers.cols) rows.push(["", "", ""]);
  return rows;
}

/**
 * Lower confidence bound on the design stress: the stress that a part sizeRatio times the specimens' effective size
 * survives with probability survival, bounded below with the stated confidence, by the pivotal quantity
 * u = m_hat ln(x_hat/x) for a Weibull quantile (raw maximum-likelihood fit; Thoman, Bain & Antle 1969). This is the
 * number to design on, not the point estimate. Example: =BRITTLE.DESIGNSTRESSBOUND(0.9999, B2:B31, , 0.95, 25)
 * returns a stress in the units of B2:B31.
 * @customfunction
 * @cancelable
 * @param survival Required survival probability, strictly between 0 and 1 (e.g. 0.9999).
 * @param strengths Fracture strengths of the tested specimens (MPa or any stress unit). Blanks and zeros are skipped.
 * @param [censored] Optional flags, same shape as strengths: TRUE or 1 where the specimen did not fail from the population being fitted.
 * @param [confidence] One-sided confidence of the lower bound, strictly between 0 and 1 (0.005 to 0.995); default 0.95 (the lower end of a 90 % two-sided interval).
 * @param [sizeRatio] Effective size of the part divided by that of the specimens (> 0); default 1.
 * @returns Lower confidence bound on the allowable peak stress, in the units of the strengths.
 */
export function DESIGNSTRESSBOUND(survival: number, strengths: any[][], censored?: any[][], confidence?: number, sizeRatio?: number): number {
  return designStressBound({
    survival: readNumber(survival, "survival"),
    ...readSample(strengths, censored),
    confidence: readOptionalNumber(confidence, "confidence", 0.95),
    sizeRatio: readOptionalNumber(sizeRatio, "sizeRatio", 1),
  }).lower;
}

/**
 * Weibull modulus implied by a datasheet's mean strength and standard deviation: solves
 * Gamma(1 + 2/m) / Gamma(1 + 1/m)^2 - 1 = (stdev/mean)^2 exactly. A method-of-moments value, not the
 * maximum-likelihood modulus of the original tests. Example: =BRITTLE.MODULUSFROMCV(380, 45.8) is about 9.981.
 * @customfunction
 * @param mean Mean strength (stress unit, > 0).
 * @param stdev Standard deviation of strength (same unit, > 0).
 * @returns Weibull modulus m (dimensionless).
 */
export function MODULUSFROMCV(mean: number, stdev: number): number {
  return modulusFromCoefficientOfVariation({ mean: readNumber(mean, "mean"), standardDeviation: readNumber(stdev, "stdev") }).shape;
}

function twoPopulations(mA: number, thA: number, mB: number, thB: number, kA?: number, kB?: number) {
  return [
    { shape: readNumber(mA, "modulusA"), scale: readNumber(thA, "charStrengthA"), sizeRatio: readOptionalNumber(kA, "sizeRatioA", 1) },
    { shape: readNumber(mB, "modulusB"), scale: readNumber(thB, "charStrengthB"), sizeRatio: readOptionalNumber(kB, "sizeRatioB", 1) },
  ];
}

/**
 * Failure probability with two competing flaw populations acting together (e.g. surface and volume flaws):
 * 1 - exp(-kA (stress/charStrengthA)^modulusA - kB (stress/charStrengthB)^modulusB).
 * Example: =BRITTLE.COMPETINGFAILPROB(300, 10, 400, 5, 900) is about 0.05864.
 * @customfunction
 * @param stress Applied peak stress (same unit as the characteristic strengths).
 * @param modulusA Weibull modulus of population A (> 0).
 * @param charStrengthA Characteristic strength of population A in the tested specimens (> 0).
 * @param modulusB Weibull modulus of population B (> 0).
 * @param charStrengthB Characteristic strength of population B in the tested specimens (> 0).
 * @param [sizeRatioA] Part-to-specimen effective size ratio for population A's flaws (volume or area); default 1.
 * @param [sizeRatioB] Part-to-specimen effective size ratio for population B's flaws; default 1.
 * @returns Failure probability, between 0 and 1.
 */
export function COMPETINGFAILPROB(
  stress: number,
  modulusA: number,
  charStrengthA: number,
  modulusB: number,
  charStrengthB: number,
  sizeRatioA?: number,
  sizeRatioB?: number,
): number {
  return competingFailureProbability({
    stress: readNumber(stress, "stress"),
    populations: twoPopulations(modulusA, charStrengthA, modulusB, charStrengthB, sizeRatioA, sizeRatioB),
  });
}

/**
 * Design stress with two competing flaw populations: the stress at which the part survives with the stated
 * probability when both populations act, solving kA (s/charStrengthA)^modulusA + kB (s/charStrengthB)^modulusB = -ln(survival).
 * Example: =BRITTLE.COMPETINGDESIGNSTRESS(0.999, 10, 400, 5, 900) is about 189.9.
 * @customfunction
 * @param survival Required survival probability, strictly between 0 and 1.
 * @param modulusA Weibull modulus of population A (> 0).
 * @param charStrengthA Characteristic strength of population A in the tested specimens (> 0).
 * @param modulusB Weibull modulus of population B (> 0).
 * @param charStrengthB Characteristic strength of population B in the tested specimens (> 0).
 * @param [sizeRatioA] Part-to-specimen effective size ratio for population A's flaws (volume or area); default 1.
 * @param [sizeRatioB] Part-to-specimen effective size ratio for population B's flaws; default 1.
 * @returns Allowable peak stress, in the units of the characteristic strengths.
 */
export function COMPETINGDESIGNSTRESS(
  survival: number,
  modulusA: number,
  charStrengthA: number,
  modulusB: number,
  charStrengthB: number,
  sizeRatioA?: number,
  sizeRatioB?: number,
): number {
  return competingDesignStress({
    survival: readNumber(survival, "survival"),
    populations: twoPopulations(modulusA, charStrengthA, modulusB, charStrengthB, sizeRatioA, sizeRatioB),
  });
}

/**
 * Lot check: does a production lot share the qualification baseline's Weibull modulus and characteristic strength?
 * Likelihood-ratio test with a p-value calibrated by seeded simulation (the chi-square approximation is poor for
 * small lots). Example: =BRITTLE.LOTCHECK(B2:B11, C2:C31) spills the statistic, the p-value and a verdict, labelled.
 * @customfunction
 * @cancelable
 * @param lotStrengths Fracture strengths of specimens from the production lot (complete sample).
 * @param baselineStrengths Fracture strengths of the qualification baseline (complete sample).
 * @param [confidence] Confidence of the test, strictly between 0 and 1; a difference is reported when p <= 1 - confidence. Default 0.95.
 * @returns 3 x 2 table of labels and values: likelihood-ratio statistic, p-value, verdict.
 */
export function LOTCHECK(lotStrengths: any[][], baselineStrengths: any[][], confidence?: number): any[][] {
  const lot = readPositiveNumbers(lotStrengths, "lotStrengths").values;
  const baseline = readPositiveNumbers(baselineStrengths, "baselineStrengths").values;
  for (const [name, values] of [["lotStrengths", lot], ["baselineStrengths", baseline]] as const) {
    if (values.length < 2) throw new CellError("#VALUE!", `${name}: the check needs at least two specimens (found ${values.length})`);
  }
  const result = compareLots({ lot, baseline, confidence: readOptionalNumber(confidence, "confidence", 0.95) });
  return [
    ["likelihood-ratio statistic", result.statistic],
    ["p-value (simulated)", result.pValue],
    ["verdict", result.verdict],
  ];
}
