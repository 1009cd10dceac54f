/**
 * Least-squares fit of a straight line to the Weibull probability plot:
 * Y = ln ln(1/(1-P)) regressed on X = ln s, so m is the slope and
 * sigma_theta = exp(-intercept / m). (Regressing X on Y gives other numbers;
 * this is the Y-on-X form.) The standards prescribe maximum likelihood; this
 * is here for comparison with older datasheets and hand calculations.
 */
import { ensure } from "../errors";
import type { WeibullParameters } from "./distribution";
import { plottingPositions, type PlottingEstimator } from "./plotting-positions";
import type { StrengthSample } from "./sample";

export interface RegressionFit extends WeibullParameters {
  specimens: number;
  failures: number;
  estimator: PlottingEstimator;
  /** Coefficient of determination of the straight line on the Weibull plot. */
  rSquared: number;
}

export function fitProbabilityPlot(sample: StrengthSample, estimator: PlottingEstimator = "HAZEN"): RegressionFit {
  const points = plottingPositions(sample, estimator);
  const n = points.length;
  let mx = 0;
  let my = 0;
  for (const p of points) {
    mx += p.x;
    my += p.y;
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (const p of points) {
    sxx += (p.x - mx) ** 2;
    sxy += (p.x - mx) * (p.y - my);
    syy += (p.y - my) ** 2;
  }
  ensure(sxx > 0, "all failure strengths are equal: the probability plot has no slope");
  const shape = sxy / sxx;
  ensure(shape > 0, "the probability plot slopes downward: no positive modulus fits these data");
  const scale = Math.exp(mx - my / shape);
  return {
    shape,
    scale,
    specimens: sample.strengths.length,
    failures: n,
    estimator,
    rSquared: (sxy * sxy) / (sxx * syy),
  };
}
