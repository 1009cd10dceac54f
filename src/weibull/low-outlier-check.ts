/**
 * Is the lowest strength an outlier for a Weibull sample?
 *
 * Statistic: Grubbs' form for the smallest value, taken on ln s of the
 * failures,
 *
 *   G = (mean(ln s) - ln s_min) / sd(ln s)     (sd with N - 1)
 *
 * Under a Weibull law ln s has the smallest-extreme-value distribution, which
 * is skewed toward low values, so Grubbs' normal-theory critical values
 * (ASTM E178) would flag sound samples far too often. G is unchanged by
 * ln s -> alpha + beta ln s, so under one Weibull population its distribution
 * depends only on the number of specimens and the censoring pattern; it is
 * calibrated by seeded simulation of that law (single-population-checks.ts).
 */

/** Fewest failures for the check. */
export const LOW_OUTLIER_MIN_FAILURES = 5;

/** G for failure log-strengths in ascending order. */
export function lowOutlierStatistic(x: ArrayLike<number>): number {
  const r = x.length;
  let mean = 0;
  for (let i = 0; i < r; i++) mean += x[i];
  mean /= r;
  let ss = 0;
  for (let i = 0; i < r; i++) ss += (x[i] - mean) ** 2;
  const sd = Math.sqrt(ss / (r - 1));
  return sd > 0 ? (mean - x[0]) / sd : 0;
}
