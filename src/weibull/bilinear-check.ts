/**
 * Does the Weibull probability plot bend? A sample from two flaw populations
 * of different moduli plots as two straight segments of different slopes
 * instead of one line. That is what this check detects. Two populations of
 * the same modulus and different characteristic strengths plot as an S-shaped
 * band whose ends keep the common slope, and this check is nearly blind to
 * them: see mixture-check.ts for that case.
 *
 * Statistic: segmented ("broken-stick") weighted least squares on the plot.
 * With X = ln s of the failures (ascending) and Y their plotting positions
 * ln ln(1/(1-P)), fit X on Y once as a straight line and once as two segments
 * joined at a knot, X = a + b Y + c <Y - y_k>, the knot at a plotted point
 * with at least three points on each side (counting the knot). The statistic
 * is the largest relative drop in the weighted residual sum of squares,
 *
 *   B = max_k (RSS_line - RSS_k) / RSS_k.
 *
 * X is regressed on Y because the Y positions are fixed by the ranks while
 * the strengths are random. The weakest points of a Weibull plot scatter far
 * more than the rest (the variance of the i-th log order statistic is about
 * P / (N (1-P) ln(1-P)^2), some N times larger at the bottom than in the
 * middle), so unweighted, a knot near the bottom absorbs that scatter and the
 * test sees little else: in a trial (n = 30, 300 samples) against a mixture
 * of two populations with different moduli, its power was 0.19 unweighted
 * and 0.95 with the weights w = (1-P) ln(1-P)^2 / P used here. Against a
 * same-modulus mixture (m 10, th 300 and 450, 50/50, n = 40) it flags about
 * as often as under one population (measured in
 * tools/simulate_population_checks.ts).
 *
 * B is unchanged by X -> alpha + beta X (beta > 0) and the weights depend on
 * the ranks only, so under one Weibull population its distribution depends
 * only on the number of specimens and the censoring pattern:
 * single-population-checks.ts calibrates it by seeded simulation. No standard
 * prescribes this test; it is a screening aid that points to fractography
 * (ASTM C1322).
 */

export interface BilinearStatistic {
  statistic: number;
  /** Index (in the failures, ascending) of the best knot. */
  knot: number;
  /** Slopes of the two segments as moduli (1/slope of X on Y): below and above the knot. */
  lowerModulus: number;
  upperModulus: number;
}

/** Fewest failures for the check: three knots with three points on each side. */
export const BILINEAR_MIN_FAILURES = 8;

/** Inverse-variance weights of the plotted points from their failure probabilities. */
export function plotWeights(failureProbabilities: ArrayLike<number>): Float64Array {
  return Float64Array.from(failureProbabilities as ArrayLike<number>, (p) => {
    const l = Math.log1p(-p);
    return ((1 - p) * l * l) / p;
  });
}

export function bilinearStatistic(x: ArrayLike<number>, y: ArrayLike<number>, w: ArrayLike<number>): BilinearStatistic {
  const r = x.length;
  let sw = 0;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < r; i++) {
    sw += w[i];
    mx += w[i] * x[i];
    my += w[i] * y[i];
  }
  mx /= sw;
  my /= sw;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < r; i++) {
    const dx = x[i] - mx;
    const dy = y[i] - my;
    sxx += w[i] * dx * dx;
    sxy += w[i] * dx * dy;
    syy += w[i] * dy * dy;
  }
  const rssLine = Math.max(sxx - (sxy * sxy) / syy, 0);

  // Weighted suffix sums over j > k, built from the top down: sum w, w Y, w Y^2,
  // w dX, w dX Y, w dY, w dY Y (dX, dY centred on the weighted means).
  let a0 = 0;
  let a1 = 0;
  let a2 = 0;
  let b0 = 0;
  let b1 = 0;
  let c0 = 0;
  let c1 = 0;
  let best: BilinearStatistic = { statistic: 0, knot: -1, lowerModulus: NaN, upperModulus: NaN };
  for (let k = r - 1; k >= 2; k--) {
    if (k <= r - 3) {
      const yk = y[k];
      const sumH = a1 - yk * a0;
      const shh = a2 - 2 * yk * a1 + yk * yk * a0 - (sumH * sumH) / sw;
      const syh = c1 - yk * c0;
      const sxh = b1 - yk * b0;
      const det = syy * shh - syh * syh;
      if (det > 1e-14 * syy * shh) {
        const b = (shh * sxy - syh * sxh) / det;
        const c = (syy * sxh - syh * sxy) / det;
        const rss = Math.max(sxx - b * sxy - c * sxh, 0);
        const statistic = (rssLine - rss) / Math.max(rss, 1e-300);
        if (statistic > best.statistic) best = { statistic, knot: k, lowerModulus: 1 / b, upperModulus: 1 / (b + c) };
      }
    }
    const dx = x[k] - mx;
    const dy = y[k] - my;
    const wk = w[k];
    a0 += wk;
    a1 += wk * y[k];
    a2 += wk * y[k] * y[k];
    b0 += wk * dx;
    b1 += wk * dx * y[k];
    c0 += wk * dy;
    c1 += wk * dy * y[k];
  }
  return best;
}
