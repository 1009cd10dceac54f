/**
 * What the probability plot draws, in stress and probability units (the
 * plot's scales do the Weibull transform): the plotted failures, censored
 * specimens, the fitted line at specimen size, the same line moved to the
 * part's size, the confidence band (the core's: the two-sided band whose
 * lower edge is the one-sided lower bound the verdict uses, drawn at the
 * part's size so it meets the lower-bound marker), and the design point.
 * Every coordinate comes from the core.
 */
import { strengthAtFailureProbability } from "../../src/weibull/distribution";
import type { DesignCheckResult } from "../../src/design/check-result";
import { bandMissing, confidenceBand as coreBand } from "../../src/design/check-band";

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
  /** "90 % two-sided band; its lower edge is the 95 % one-sided lower bound". */
  bandLabel: string;
  /** Size ratio the band is drawn at (the part's, so its lower edge meets the lower-bound marker). */
  bandSizeRatio: number;
  design: StressProbability;
  /** The lower-bound allowable stress at the same probability, where the build has bounds. */
  designLower: StressProbability | null;
  applied: number;
  probabilityRange: [number, number];
  stressRange: [number, number];
  /** One-sided level of the lower bound. */
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
    bandMissing: bandMissing(result) ?? "",
    bandLabel: `${result.confidence.bandLabel}, part size: ${result.confidence.pairing}`,
    bandSizeRatio: k,
    design,
    designLower: result.allowableLower ? { stress: result.allowableLower.value, probability: target } : null,
    applied: result.appliedStress.value,
    probabilityRange: [pMin, pMax],
    stressRange: [Math.min(...stresses) / 1.1, Math.max(...stresses) * 1.1],
    confidence: result.confidence.oneSided,
  };
}

/**
 * The core's band at the part's size, on a grid that includes the allowed
 * failure probability, so the lower edge passes through the lower-bound
 * allowable marker.
 */
function confidenceBand(result: DesignCheckResult, pMin: number, pMax: number): BandPoint[] | null {
  const target = result.targetFailureProbability.value;
  const grid = [...logitGrid(pMin, pMax, BAND_STEPS), target].sort((a, b) => a - b);
  return coreBand(result, grid, result.sizeRatio.value);
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
