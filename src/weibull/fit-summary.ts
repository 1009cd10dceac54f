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
 * - three single-population checks, each aimed at one departure: a bend in
 *   the probability plot (two populations of different moduli), a
 *   same-modulus mixture likelihood ratio (two populations of one modulus
 *   and different characteristic strengths; complete samples) and a low
 *   outlier.
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
import { mixtureCheck, MIXTURE_MIN_SPECIMENS, type MixtureCheck } from "./mixture-check";
import { SIMULATION_MAX_SPECIMENS } from "./simulation-limits";
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
  /** Same-modulus mixture check; null with a reason when it does not apply. */
  mixture: MixtureCheck | { skipped: string };
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
  const mixture = mixtureFor(sample);
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
    mixture,
    converged,
    verdict: verdictText(quality, checks, converged, mixture),
  };
}

function mixtureFor(sample: StrengthSample): MixtureCheck | { skipped: string } {
  const n = sample.strengths.length;
  if (isCensored(sample)) return { skipped: "n/a (censored sample)" };
  if (n < MIXTURE_MIN_SPECIMENS) return { skipped: `n/a (fewer than ${MIXTURE_MIN_SPECIMENS} specimens)` };
  if (n > SIMULATION_MAX_SPECIMENS) return { skipped: `n/a (simulated only up to ${SIMULATION_MAX_SPECIMENS} specimens)` };
  return mixtureCheck(sample.strengths);
}

export function verdictText(
  quality: FitQuality | null,
  checks: PopulationChecks,
  converged: boolean,
  mixture: MixtureCheck | { skipped: string } = { skipped: "not run" },
): string {
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
      `The probability plot bends near ${roundForText(b.knotStrength)} (${pValueText(b.pValue, b.pValueStandardError)}; slopes about ` +
        `m = ${roundForText(b.lowerModulus)} below, ${roundForText(b.upperModulus)} above), as two flaw populations of ` +
        "different moduli would make it: look for them by fractography (ASTM C1322) and fit each with the others censored.",
    );
  }
  const x = "pValue" in mixture ? mixture : null;
  if (x && x.pValue <= FLAG_LEVEL) {
    findings.push(
      `Two populations of the same modulus fit better than one (mixture check, ${pValueText(x.pValue, x.pValueStandardError)}; ` +
        `about ${Math.round(100 * x.weakerShare)} % at characteristic strength ${roundForText(x.weakerScale)}, the rest at ` +
        `${roundForText(x.strongerScale)}, m about ${roundForText(x.shape)}): look for two kinds of fracture origin by ` +
        "fractography (ASTM C1322) and fit each with the others censored.",
    );
  }
  const o = checks.lowOutlier;
  if (o && o.pValue <= FLAG_LEVEL) {
    findings.push(
      `The lowest strength, ${roundForText(o.strength)}, is unusually low for this distribution (${pValueText(o.pValue, o.pValueStandardError)}): ` +
        "find its fracture origin; do not drop it without a physical reason.",
    );
  }
  if (findings.length > 0) return findings.join(" ");
  const passed: string[] = [];
  if (quality) passed.push(`OSL = ${roundForText(quality.osl)}`);
  if (b) passed.push(`plot bend ${pValueText(b.pValue, b.pValueStandardError)}`);
  if (x) passed.push(`mixture ${pValueText(x.pValue, x.pValueStandardError)}`);
  if (o) passed.push(`low value ${pValueText(o.pValue, o.pValueStandardError)}`);
  const untested = checks.skipped
    ? " The single-population checks are simulated and were not run for a sample this large."
    : !b || !o
      ? " Too few failures for some single-population checks."
      : "";
  const censoredNote = quality ? "" : " (A* is not defined for censored samples.)";
  return `Consistent with one Weibull flaw population${passed.length ? ` (${passed.join("; ")})` : ""}.${censoredNote}${untested}`;
}
