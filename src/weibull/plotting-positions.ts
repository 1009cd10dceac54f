/**
 * Probability-plot coordinates: failure-probability estimates P_i for the
 * ordered failures, and their Weibull-plot axes X = ln s, Y = ln ln(1/(1-P)).
 *
 * Estimators for the i-th of N ordered strengths (Wu, Zhou & Li 2006,
 * J Mater Sci 41:5630, compare them):
 *   "HAZEN"   (i - 0.5) / N           default, as ASTM C1239 plots
 *   "MEAN"    i / (N + 1)             mean rank
 *   "MEDIAN"  (i - 0.3) / (N + 0.4)   Bernard's approximation to the median rank
 *
 * Censored samples use Johnson's adjusted ranks (Johnson 1964, "The
 * Statistical Treatment of Fatigue Experiments"): each failure's rank steps up
 * by (N + 1 - previous rank) / (1 + specimens at or above it), so a censored
 * specimen shifts the ranks of the failures above it instead of being dropped.
 */
import { InputError } from "../errors";
import { checkSample, type StrengthSample } from "./sample";

export type PlottingEstimator = "HAZEN" | "MEAN" | "MEDIAN";

export const PLOTTING_ESTIMATORS: readonly PlottingEstimator[] = ["HAZEN", "MEAN", "MEDIAN"];

export interface PlotPoint {
  strength: number;
  failureProbability: number;
  /** ln(strength) */
  x: number;
  /** ln(ln(1 / (1 - P))) */
  y: number;
}

export function rankToProbability(rank: number, specimens: number, estimator: PlottingEstimator): number {
  switch (estimator) {
    case "HAZEN":
      return (rank - 0.5) / specimens;
    case "MEAN":
      return rank / (specimens + 1);
    case "MEDIAN":
      return (rank - 0.3) / (specimens + 0.4);
    default:
      throw new InputError("input", `unknown plotting-position estimator "${estimator as string}"`);
  }
}

/** Plot points of the failures, in increasing strength (censored specimens carry no point). */
export function plottingPositions(sample: StrengthSample, estimator: PlottingEstimator = "HAZEN"): PlotPoint[] {
  const { strengths, censored } = checkSample(sample);
  const n = strengths.length;
  const order = Array.from({ length: n }, (_, i) => i).sort(
    (a, b) => strengths[a] - strengths[b] || censored[a] - censored[b],
  );
  const points: PlotPoint[] = [];
  let rank = 0;
  for (let k = 0; k < n; k++) {
    const i = order[k];
    if (censored[i]) continue;
    const reverseRank = n - k;
    rank += (n + 1 - rank) / (1 + reverseRank);
    const p = rankToProbability(rank, n, estimator);
    points.push({ strength: strengths[i], failureProbability: p, x: Math.log(strengths[i]), y: Math.log(-Math.log1p(-p)) });
  }
  return points;
}
