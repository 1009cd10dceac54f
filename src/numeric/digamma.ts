/**
 * Digamma function psi(x) = d/dx ln Gamma(x) for x > 0.
 *
 * The recurrence psi(x) = psi(x + 1) - 1/x lifts x above 10, where the
 * asymptotic series psi(x) ~ ln x - 1/(2x) - sum B_2k / (2k x^2k) (Abramowitz &
 * Stegun 6.3.18) with seven terms is accurate to about 1e-16 relative.
 * Used for d/dm of the rod's effective size, which holds Gamma((m+1)/2).
 *
 * @example digamma(1) // -0.5772156649015329 (minus Euler's constant)
 */
export function digamma(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return NaN;
  let shift = 0;
  while (x < 10) {
    shift -= 1 / x;
    x += 1;
  }
  const inv2 = 1 / (x * x);
  // B2/2, B4/4, ... B14/14 (Bernoulli numbers).
  const series =
    inv2 *
    (1 / 12 -
      inv2 *
        (1 / 120 -
          inv2 * (1 / 252 - inv2 * (1 / 240 - inv2 * (1 / 132 - inv2 * (691 / 32760 - inv2 * (1 / 12)))))));
  return shift + Math.log(x) - 0.5 / x - series;
}
