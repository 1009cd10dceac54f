/**
 * What the probability plot draws, in stress and probability units (the
 * plot's scales do the Weibull transform): the plotted failures, censored
 * specimens, the fitted line at specimen size, the same line moved to the
 * part's size, the confidence band where the build has bounds, and the
 * design point. Every coordinate comes from the core.
 */
import { strengthAtFailureProbability } from "../../src/weibull/distribution";
import type { DesignCheckResult } from "../app/check";
import { optionalCore } from "../app/optional-core";

export interface StressProbability {
  stress: number;
  probability: number;
}

export interface BandPoint {
  probability: number;
  lower: number;
  upper: number;
}

export interface PlotData {
  failures: StressProbability[];
  censored: number[];
  specimenLine: StressProbability[];
  partLine: StressProbability[] | null;
  band: BandPoint[] | null;
  /** Why there is no band, for the legend. */
  bandMissing: string;
  design: StressProbability;
  /** The lower-bound allowable stress at the same probability, where the build has bounds. */
  designLower: StressProbability | null;
  applied: number;
  probabilityRange: [number, number];
  stressRange: [number, number];
  confidence: number;
}

const LINE_STEPS = 48;
const BAND_STEPS = 24;

export function plotData(result: DesignCheckResult): PlotData {
  const { shape, scale } = result.parameters;
  const k = result.sizeRatio.value;
  const target = result.targetFailureProbability.value;
  const design = { stress: result.allowablePoint.value, probability: target };

  const lowestData = result.points.length ? result.points[0].failureProbability : 0.5;
  const pMin = clampProbability(Math.min(target, lowestData, 0.01) / 3);
  const pMax = 0.999;
  const grid = logitGrid(pMin, pMax, LINE_STEPS);

  const specimenLine = grid.map((p) => ({ probability: p, stress: strengthAtFailureProbability({ failureProbability: p, shape, scale }) }));
  const partLine =
    Math.abs(Math.log(k)) > 1e-12
      ? grid.map((p) => ({ probability: p, stress: strengthAtFailureProbability({ failureProbability: p, shape, scale, sizeRatio: k }) }))
      : null;

  const band = confidenceBand(result, pMin, pMax);
  const failures = result.points.map((p) => ({ stress: p.strength, probability: p.failureProbability }));

  const stresses = [
    ...failures.map((f) => f.stress),
    ...result.censoredStrengths,
    design.stress,
    ...(result.allowableLower ? [result.allowableLower.value] : []),
    result.appliedStress.value,
    ...(band ? band.flatMap((b) => [b.lower, b.upper]) : []),
  ];
  const within = (s: StressProbability) => s.probability >= pMin && s.probability <= pMax;
  for (const s of specimenLine.filter(within)) stresses.push(s.stress);
  if (partLine) for (const s of partLine.filter(within)) stresses.push(s.stress);

  return {
    failures,
    censored: [...result.censoredStrengths],
    specimenLine,
    partLine,
    band,
    bandMissing: !result.sample
      ? "confidence band: none for typed parameters"
      : result.censoredStrengths.length > 0
        ? "confidence band: drawn for complete samples only"
        : "confidence band: not in this build",
    design,
    designLower: result.allowableLower ? { stress: result.allowableLower.value, probability: target } : null,
    applied: result.appliedStress.value,
    probabilityRange: [pMin, pMax],
    stressRange: [Math.min(...stresses) / 1.1, Math.max(...stresses) * 1.1],
    confidence: result.input.confidence,
  };
}

/**
 * Two-sided band at the form's confidence c: the one-sided lower bound at
 * (1 + c)/2 and at (1 - c)/2, which for a pivotal quantity is the upper bound
 * at (1 + c)/2.
 */
function confidenceBand(result: DesignCheckResult, pMin: number, pMax: number): BandPoint[] | null {
  const bound = optionalCore.designStressLowerBound;
  const sample = result.sample;
  // A censored sample's bound simulates its pattern on every call: one bound is quick, a band of fifty is not.
  if (!bound || !sample || result.censoredStrengths.length > 0) return null;
  const c = result.input.confidence;
  return logitGrid(pMin, pMax, BAND_STEPS).map((p) => ({
    probability: p,
    lower: bound({ sample, survival: 1 - p, confidence: (1 + c) / 2, sizeRatio: 1 }),
    upper: bound({ sample, survival: 1 - p, confidence: (1 - c) / 2, sizeRatio: 1 }),
  }));
}

/** Probabilities evenly spaced on the Weibull axis, ln(-ln(1 - p)). */
export function logitGrid(pMin: number, pMax: number, steps: number): number[] {
  const a = weibullY(pMin);
  const b = weibullY(pMax);
  return Array.from({ length: steps + 1 }, (_, i) => probabilityAtY(a + ((b - a) * i) / steps));
}

export function weibullY(p: number): number {
  return Math.log(-Math.log1p(-p));
}

export function probabilityAtY(y: number): number {
  return -Math.expm1(-Math.exp(y));
}

function clampProbability(p: number): number {
  return Math.max(p, 1e-12);
}
