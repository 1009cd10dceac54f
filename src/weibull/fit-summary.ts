/**
 * Everything a datasheet states about one fitted flaw population, with a
 * plain-words verdict a reviewer can read:
 *
 * - counts of specimens and failures; the point estimates by the chosen
 *   method (estimate.ts);
 * - confidence bounds on both parameters by the ML pivotal method
 *   (confidence-bounds.ts), whatever the method of the point estimate;
 * - mean, median and standard deviation of strength implied by the point
 *   estimates;
 * - the modified Anderson-Darling A* and its OSL (complete samples only);
 * - the two single-population checks: plot bend and low outlier.
 *
 * With two failures the default unbiased ML modulus does not exist (E[m_hat/m]
 * is infinite at N = 2), so the summary gives the raw ML modulus and says so
 * (`unbiasingUnavailable`) rather than no fit at all: the characteristic
 * strength and the bounds never used the unbiasing factor.
 *
 * A finding is flagged at the 5 % level (OSL <= 0.05, the CMH-17-1G practice
 * for rejecting a distribution; the same level for the two checks).
 */
import { fitQuality, type FitQuality } from "./anderson-darling";
import { isCensored, parameterBounds, type Interval, type PivotalSource } from "./confidence-bounds";
import { meanStrength, medianStrength, strengthStandardDeviation } from "./distribution";
import { estimateWeibull, type EstimationMethod } from "./estimate";
import type { PlottingEstimator } from "./plotting-positions";
import type { StrengthSample } from "./sample";
import { singlePopulationChecks, type PopulationChecks } from "./single-population-checks";
import { pValueText, roundForText } from "./verdict-text";

export const FLAG_LEVEL = 0.05;

export interface FitSummary {
  specimens: number;
  failures: number;
  method: EstimationMethod;
  estimator: PlottingEstimator;
  unbiasingFactor: number;
  /** True when "MLE" was asked for with two failures: `shape` is then the raw ML modulus. */
  unbiasingUnavailable: boolean;
  shape: number;
  scale: number;
  shapeBounds: Interval;
  scaleBounds: Interval;
  confidence: number;
  boundsSource: PivotalSource["kind"];
  boundsReplications?: number;
  mean: number;
  median: number;
  standardDeviation: number;
  /** null for a censored sample (the A* test is defined for complete samples). */
  quality: FitQuality | null;
  checks: PopulationChecks;
  converged: boolean;
  verdict: string;
}

export function summarizeFit({
  strengths,
  censored,
  confidence = 0.9,
  method = "MLE",
  estimator = "HAZEN",
}: StrengthSample & { confidence?: number; method?: EstimationMethod; estimator?: PlottingEstimator }): FitSummary {
  const sample = { strengths, censored };
  const failures = strengths.length - (censored?.filter(Boolean).length ?? 0);
  const unbiasingUnavailable = method === "MLE" && failures === 2;
  const estimate = estimateWeibull(sample, unbiasingUnavailable ? "MLE-RAW" : method, estimator);
  const bounds = parameterBounds({ ...sample, confidence, sides: 2 });
  const params = { shape: estimate.shape, scale: estimate.scale };
  const quality = isCensored(sample) ? null : fitQuality(sample);
  const checks = singlePopulationChecks(sample);
  const converged = estimate.converged && bounds.fit.converged;
  return {
    specimens: estimate.specimens,
    failures: estimate.failures,
    method,
    estimator,
    unbiasingFactor: estimate.unbiasingFactor,
    unbiasingUnavailable,
    shape: estimate.shape,
    scale: estimate.scale,
    shapeBounds: bounds.shape,
    scaleBounds: bounds.scale,
    confidence,
    boundsSource: bounds.source.kind,
    boundsReplications: bounds.source.replications,
    mean: meanStrength(params),
    median: medianStrength(params),
    standardDeviation: strengthStandardDeviation(params),
    quality,
    checks,
    converged,
    verdict: verdictText(quality, checks, converged),
  };
}

export function verdictText(quality: FitQuality | null, checks: PopulationChecks, converged: boolean): string {
  const findings: string[] = [];
  if (!converged) findings.push("The fit did not converge: treat every number here as unreliable.");
  if (quality && quality.osl <= FLAG_LEVEL) {
    findings.push(
      `Poor fit to one Weibull distribution (A* = ${roundForText(quality.aStar)}, OSL = ${roundForText(quality.osl)} <= ${FLAG_LEVEL}).`,
    );
  }
  const b = checks.bilinear;
  if (b && b.pValue <= FLAG_LEVEL) {
    findings.push(
      `The probability plot bends near ${roundForText(b.knotStrength)} (${pValueText(b.pValue)}; slopes about ` +
        `m = ${roundForText(b.lowerModulus)} below, ${roundForText(b.upperModulus)} above): look for two flaw populations ` +
        "by fractography (ASTM C1322) and fit each with the others censored.",
    );
  }
  const o = checks.lowOutlier;
  if (o && o.pValue <= FLAG_LEVEL) {
    findings.push(
      `The lowest strength, ${roundForText(o.strength)}, is unusually low for this distribution (${pValueText(o.pValue)}): ` +
        "find its fracture origin; do not drop it without a physical reason.",
    );
  }
  if (findings.length > 0) return findings.join(" ");
  const passed: string[] = [];
  if (quality) passed.push(`OSL = ${roundForText(quality.osl)}`);
  if (b) passed.push(`plot bend ${pValueText(b.pValue)}`);
  if (o) passed.push(`low value ${pValueText(o.pValue)}`);
  const untested = checks.skipped
    ? " The single-population checks are simulated and were not run for a sample this large."
    : !b || !o
      ? " Too few failures for some single-population checks."
      : "";
  const censoredNote = quality ? "" : " (A* is not defined for censored samples.)";
  return `Consistent with one Weibull flaw population${passed.length ? ` (${passed.join("; ")})` : ""}.${censoredNote}${untested}`;
}
