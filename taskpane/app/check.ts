/**
 * The design check: from the form's inputs to every number the result step
 * shows, each with the method and assumptions that produced it. All
 * mathematics is the core's; this file only chains the calls and records
 * what each answer rests on.
 */
import { expectedFailures, failuresUpperBound } from "../../src/design/lot-failures";
import {
  designStress,
  failureProbability,
  meanStrength,
  strengthAtFailureProbability,
} from "../../src/weibull/distribution";
import { estimateWeibull } from "../../src/weibull/estimate";
import { plottingPositions, type PlotPoint } from "../../src/weibull/plotting-positions";
import type { StrengthSample } from "../../src/weibull/sample";
import { METHOD_LABELS, type DesignCheckInput } from "./inputs";
import { MISSING, optionalCore, type FitQuality, type PopulationChecks } from "./optional-core";
import { resolveSizes } from "./sizes";
import { timeCheck, type TimeCheck } from "./time-check";

export interface FittedParameters {
  shape: number;
  scale: number;
  mean: number;
  /** Where the parameters came from, in words. */
  basis: string;
  specimens?: number;
  failures?: number;
  converged: boolean;
}

export interface ResultLine {
  value: number;
  basis: string;
}

export interface DesignCheckResult {
  input: DesignCheckInput;
  sample: StrengthSample | null;
  parameters: FittedParameters;
  specimenSize: ResultLine;
  partSize: ResultLine;
  sizeRatio: ResultLine;
  /** The applied peak stress used: as typed, or the element table's peak. */
  appliedStress: ResultLine;
  /** Failure probability the requirement allows for one part. */
  targetFailureProbability: ResultLine;
  allowablePoint: ResultLine;
  /** Null when the build has no confidence bounds or the parameters were typed. */
  allowableLower: ResultLine | null;
  allowableLowerMissing?: string;
  failureProbabilityAtApplied: ResultLine;
  expectedFailures: ResultLine;
  failuresUpperBound: ResultLine;
  /** Allowable stress (on the verdict's basis) divided by the applied stress. */
  margin: ResultLine;
  verdict: { pass: boolean; onLowerBound: boolean; text: string };
  /** Lifetime and proof-test lines, where those inputs were given. */
  time: TimeCheck;
  fitQuality: FitQuality | null;
  fitQualityMissing?: string;
  /** One-population checks, where the build has them. */
  populationChecks: PopulationChecks | null;
  /** Failure probabilities of the plotted failures (specimen size). */
  points: PlotPoint[];
  censoredStrengths: number[];
  /**
   * How many decades the design point lies below the lowest plotted failure,
   * compared at specimen size; null when there are no data.
   */
  extrapolationDecades: number | null;
}

export function runDesignCheck(input: DesignCheckInput): DesignCheckResult {
  const { material } = input;
  const sample: StrengthSample | null =
    material.kind === "data" ? { strengths: material.strengths, censored: material.censored } : null;
  const parameters = fitParameters(input, sample);
  const { shape, scale } = parameters;

  const sizes = resolveSizes(input, shape);
  const sizeRatio = sizes.part.value / sizes.specimen.value;
  const sizeWord = input.flaws === "volume" ? "effective volume" : "effective area";
  const sizeBasis =
    `part ${sizeWord} / specimen ${sizeWord}; ` +
    `assumes one ${input.flaws} flaw population, the same surface finish and environment in both (ASTM C1683)`;
  const appliedStress = input.appliedStress ?? sizes.tablePeak;
  if (appliedStress === null) throw new Error("give the applied peak stress");
  const appliedBasis = input.appliedStress === null ? "peak tensile stress of the element table" : "as typed in the form";

  const target = targetProbability(input);
  const allowable =
    input.requirement.kind === "survival"
      ? designStress({ survival: input.requirement.survival, shape, scale, sizeRatio })
      : strengthAtFailureProbability({ failureProbability: target.value, shape, scale, sizeRatio });
  const weibullBasis = `two-parameter Weibull, ${parameters.basis}, size ratio ${fmt(sizeRatio)}`;

  const lower = lowerBound(input, sample, target.value, sizeRatio);
  const pfApplied = failureProbability({ stress: appliedStress, shape, scale, sizeRatio });
  const expected = expectedFailures({ failureProbability: pfApplied, lotSize: input.lotSize });
  const upper = failuresUpperBound({ failureProbability: pfApplied, lotSize: input.lotSize, confidence: input.confidence });

  const onLowerBound = lower.line !== null;
  const shortTerm = lower.line ? lower.line.value : allowable;
  const survival = input.requirement.kind === "survival" ? input.requirement.survival : 1 - target.value;
  const time = timeCheck(input, parameters, sizeRatio, survival, appliedStress);
  // Over a lifetime the lower of the two allowables governs, unless a proof test guarantees the life.
  const lifeGoverns = time.lifetimeAllowable !== null && !time.proofCoversLifetime && time.lifetimeAllowable.value < shortTerm;
  const governing = lifeGoverns ? time.lifetimeAllowable!.value : shortTerm;
  const margin = governing / appliedStress;
  const pass = appliedStress <= governing;

  const points = sample ? plottingPositions(sample) : [];
  const censoredStrengths = sample ? sample.strengths.filter((_, i) => sample.censored?.[i]) : [];

  let fitQuality: FitQuality | null = null;
  let fitQualityMissing: string | undefined;
  if (sample && censoredStrengths.length > 0) fitQualityMissing = "the goodness-of-fit test applies to complete samples only";
  else if (sample && optionalCore.fitQuality) fitQuality = optionalCore.fitQuality(sample);
  else if (sample) fitQualityMissing = MISSING.fitQuality;

  return {
    input,
    sample,
    parameters,
    specimenSize: { value: sizes.specimen.value, basis: sizes.specimen.how },
    partSize: { value: sizes.part.value, basis: sizes.part.how },
    sizeRatio: { value: sizeRatio, basis: sizeBasis },
    appliedStress: { value: appliedStress, basis: appliedBasis },
    targetFailureProbability: target,
    allowablePoint: { value: allowable, basis: `point estimate: ${weibullBasis}` },
    allowableLower: lower.line,
    allowableLowerMissing: lower.missing,
    failureProbabilityAtApplied: {
      value: pfApplied,
      basis: `point estimate at ${fmt(appliedStress)} ${input.stressUnit}: ${weibullBasis}`,
    },
    expectedFailures: {
      value: expected,
      basis: `lot of ${input.lotSize} parts x failure probability at the applied stress (point estimate)`,
    },
    failuresUpperBound: {
      value: upper,
      basis:
        `count not exceeded with ${pct(input.confidence)} probability (binomial lot of ${input.lotSize}); ` +
        "covers lot-to-lot chance only, not the uncertainty of the fit",
    },
    margin: {
      value: margin,
      basis: lifeGoverns
        ? "lifetime allowable stress (point estimate) / applied stress"
        : `${onLowerBound ? "lower-bound" : "point-estimate"} allowable stress / applied stress` +
          (time.proofCoversLifetime ? "; the proof test guarantees the lifetime" : ""),
    },
    verdict: verdictLine(input, appliedStress, pass, onLowerBound, governing, margin, lifeGoverns, time.proofCoversLifetime),
    time,
    fitQuality,
    fitQualityMissing,
    populationChecks: sample && optionalCore.populationChecks ? optionalCore.populationChecks(sample) : null,
    points,
    censoredStrengths,
    extrapolationDecades: extrapolation(points, target.value, sizeRatio),
  };
}

function fitParameters(input: DesignCheckInput, sample: StrengthSample | null): FittedParameters {
  const { material } = input;
  if (material.kind === "typed") {
    const shape = material.shape;
    const scale = material.scale;
    return {
      shape,
      scale,
      mean: meanStrength({ shape, scale }),
      basis: "modulus and characteristic strength as typed (no data: not re-estimated)",
      specimens: material.specimens,
      converged: true,
    };
  }
  const fit = estimateWeibull(sample as StrengthSample, material.method);
  const censoredCount = fit.specimens - fit.failures;
  const counts =
    censoredCount > 0
      ? `${fit.failures} failures and ${censoredCount} censored of ${fit.specimens} specimens`
      : `${fit.specimens} specimens`;
  const unbiased = fit.unbiasingFactor !== 1 ? `, unbiasing factor ${fmt(fit.unbiasingFactor)}` : "";
  return {
    shape: fit.shape,
    scale: fit.scale,
    mean: meanStrength({ shape: fit.shape, scale: fit.scale }),
    basis: `${METHOD_LABELS[material.method]}; ${counts}${unbiased}`,
    specimens: fit.specimens,
    failures: fit.failures,
    converged: fit.converged,
  };
}

function targetProbability(input: DesignCheckInput): ResultLine {
  const r = input.requirement;
  if (r.kind === "survival") {
    return { value: 1 - r.survival, basis: `required survival ${r.survival} per part` };
  }
  return {
    value: r.allowedFailures / input.lotSize,
    basis: `${r.allowedFailures} expected failure(s) allowed in a lot of ${input.lotSize}`,
  };
}

function lowerBound(
  input: DesignCheckInput,
  sample: StrengthSample | null,
  targetPf: number,
  sizeRatio: number,
): { line: ResultLine | null; missing?: string } {
  if (!sample) {
    return { line: null, missing: "the lower confidence bound needs the test results; typed parameters carry no uncertainty" };
  }
  const bound = optionalCore.designStressLowerBound;
  if (!bound) return { line: null, missing: MISSING.bounds };
  const survival = input.requirement.kind === "survival" ? input.requirement.survival : 1 - targetPf;
  const value = bound({ sample, survival, confidence: input.confidence, sizeRatio });
  return {
    line: {
      value,
      basis:
        `one-sided ${pct(input.confidence)} lower confidence bound on the same design stress: pivotal quantity for a Weibull ` +
        `quantile on the raw maximum-likelihood fit (ASTM C1239 / ISO 20501), whatever the point estimate's method` +
        (sample.censored?.some(Boolean) ? "; censored: simulated for this censoring pattern" : ""),
    },
  };
}

function verdictLine(
  input: DesignCheckInput,
  appliedStress: number,
  pass: boolean,
  onLowerBound: boolean,
  governing: number,
  margin: number,
  lifeGoverns: boolean,
  proofCovers: boolean,
): DesignCheckResult["verdict"] {
  const unit = input.stressUnit;
  const applied = `${fmt(appliedStress)} ${unit}`;
  const allow = `${fmt(governing)} ${unit}`;
  const life = input.lifetime ? ` over ${fmt(input.lifetime.lifetime)} ${input.lifetime.timeUnit}` : "";
  const basis = lifeGoverns
    ? `the allowable stress${life} (slow crack growth, point estimate: not a design verdict on its own)`
    : (onLowerBound
        ? `the ${pct(input.confidence)} lower-bound allowable stress`
        : "the point-estimate allowable stress (no confidence bound: not a design verdict on its own)") +
      (proofCovers ? `, with the proof test guaranteeing the life${life}` : "");
  const text = pass
    ? `PASS: the applied stress ${applied} is at or below ${basis}, ${allow}; margin ${fmt(margin)}.`
    : `FAIL: the applied stress ${applied} exceeds ${basis}, ${allow}; margin ${fmt(margin)}.`;
  return { pass, onLowerBound: onLowerBound && !lifeGoverns, text };
}

/**
 * Compare at specimen size: the design point's hazard divided by the size
 * ratio is the specimen's, so its specimen-size failure probability sits on
 * the fitted line, and the gap to the lowest plotted failure is what the
 * straight line is trusted to bridge.
 */
function extrapolation(points: PlotPoint[], targetPf: number, sizeRatio: number): number | null {
  if (points.length === 0) return null;
  const lowest = points[0].failureProbability;
  const specimenPf = -Math.expm1(Math.log1p(-targetPf) / sizeRatio);
  return Math.log10(lowest / specimenPf);
}

/** Four significant figures for the words of a basis line. */
export function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

export function pct(p: number): string {
  return `${Number((p * 100).toPrecision(4))} %`;
}
