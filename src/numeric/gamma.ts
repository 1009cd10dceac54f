/**
 * Gamma function and its logarithm.
 *
 * Lanczos approximation with g = 607/128 and 15 coefficients (Godfrey's set,
 * as used by Boost and many numerical libraries): relative error near 1e-15
 * away from the zeros of ln Gamma. Near those zeros (x = 1 and 2) the Taylor
 * series of ln Gamma(1 + z) in zeta values keeps full relative accuracy, and
 * below 1e-8 (subnormals included) ln Gamma(x) = -ln x - Euler's gamma x.
 * Arguments below 0.5 use the reflection formula.
 *
 * logGamma follows the special values of C99 lgamma (ISO/IEC 9899 Annex F):
 * ln|Gamma(x)|; +0 at 1 and 2; +Infinity at 0, at negative integers and at
 * +-Infinity; NaN for NaN. Results too large for a double are +Infinity.
 */
const G = 607 / 128;
const COEFFICIENTS = [
  0.99999999999999709182, 57.156235665862923517, -59.597960355475491248, 14.136097974741747174,
  -0.49191381609762019978, 0.33994649984811888699e-4, 0.46523628927048575665e-4,
  -0.98374475304879564677e-4, 0.15808870322491248884e-3, -0.21026444172410488319e-3,
  0.21743961811521264320e-3, -0.16431810653676389022e-3, 0.84418223983852743293e-4,
  -0.26190838401581408670e-4, 0.36899182659531622704e-5,
];
const HALF_LOG_TWO_PI = 0.91893853320467274178;

const EULER = 0.5772156649015329;

/** zeta(2), zeta(3), ... zeta(70), from mpmath 1.3.0 at 40 digits (rounded to doubles). */
const ZETA = [
  1.6449340668482264, 1.2020569031595942, 1.0823232337111381, 1.03692775514337, 1.0173430619844492,
  1.008349277381923, 1.0040773561979444, 1.0020083928260821, 1.000994575127818, 1.0004941886041194,
  1.000246086553308, 1.0001227133475785, 1.0000612481350588, 1.000030588236307, 1.0000152822594086,
  1.0000076371976379, 1.000003817293265, 1.0000019082127165, 1.0000009539620338, 1.0000004769329869,
  1.0000002384505027, 1.000000119219926, 1.000000059608189, 1.0000000298035034, 1.0000000149015549,
  1.0000000074507118, 1.000000003725334, 1.0000000018626598, 1.0000000009313275, 1.0000000004656628,
  1.000000000232831, 1.0000000001164155, 1.0000000000582077, 1.0000000000291038, 1.000000000014552,
  1.000000000007276, 1.000000000003638, 1.000000000001819, 1.0000000000009095, 1.0000000000004547,
  1.0000000000002274, 1.0000000000001137, 1.0000000000000568, 1.0000000000000284, 1.0000000000000142,
  1.000000000000007, 1.0000000000000036, 1.0000000000000018, 1.0000000000000009, 1.0000000000000004,
  1.0000000000000002, 1.0000000000000002, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0,
  1.0, 1.0,
];

/**
 * sum_{k>=2} zeta(k) (-z)^k / k times (2^k - 2) when `twoMinusTwo`, else
 * plain: the tail of ln Gamma(1 + z) = -Euler z + sum zeta(k) (-z)^k / k,
 * for |z| <= 0.5 (at most 69 terms: 0.5^k / k falls below 1e-18 by k = 55).
 */
function zetaTail(z: number, twoMinusTwo: boolean): number {
  let sum = 0;
  let power = -z; // (-z)^(k-1), made (-z)^k at the top of each step
  let twoPower = 2;
  for (let i = 0; i < ZETA.length; i++) {
    const k = i + 2;
    power *= -z;
    twoPower *= 2;
    const term = (ZETA[i] * (twoMinusTwo ? twoPower - 2 : 1) * power) / k;
    sum += term;
    if (Math.abs(term) <= 1e-18 * Math.abs(sum)) break;
  }
  return sum;
}

/** ln Gamma(1 + z) for |z| <= 0.5, with full relative accuracy near z = 0. */
function logGammaOnePlusSmall(z: number): number {
  return -EULER * z + zetaTail(z, false);
}

/**
 * ln Gamma(1 + 2x) - 2 ln Gamma(1 + x), whose exponential minus 1 is the
 * squared coefficient of variation of a Weibull strength at modulus 1/x. The
 * Euler terms cancel exactly in the series, so small x (large moduli) keeps
 * full relative accuracy where the difference of two logGamma values would
 * lose digits (4.8e-7 relative at x = 1/41000).
 */
export function logGammaRatioTwoOne(x: number): number {
  if (x <= 0.1) return zetaTail(x, true);
  return logGamma(1 + 2 * x) - 2 * logGamma(1 + x);
}

/** sin(pi x) with x reduced exactly (x mod 2), so large arguments keep their digits. */
function sinPi(x: number): number {
  const r = x % 2;
  return Math.sin(Math.PI * r);
}

/** ln |Gamma(x)|, with the C99 lgamma special values (see the header). */
export function logGamma(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x === Infinity || x === -Infinity) return Infinity;
  if (x <= 0 && Number.isInteger(x)) return Infinity; // poles (and -0, +0)
  if (x === 1 || x === 2) return 0;
  if (Math.abs(x) < 1e-8) return -Math.log(Math.abs(x)) - EULER * x; // the next term, zeta(2) x^2 / 2, is below 1e-16
  if (x < 0.5) {
    // Reflection: ln|Gamma(x)| = ln(pi / |sin(pi x)|) - ln Gamma(1 - x), the sine reduced exactly.
    return Math.log(Math.PI) - Math.log(Math.abs(sinPi(x))) - logGamma(1 - x);
  }
  // From 0.5 to 2.5 ln Gamma has its zeros (1 and 2) and its minimum (-0.1215 at 1.4616): the Lanczos sum's
  // absolute error of about 5e-16 would be up to 6e-15 relative there, the series keeps 2e-16.
  if (x < 1.5) return logGammaOnePlusSmall(x - 1);
  if (x <= 2.5) return logGammaOnePlusSmall(x - 2) + Math.log1p(x - 2);
  const z = x - 1;
  let series = COEFFICIENTS[0];
  for (let i = 1; i < COEFFICIENTS.length; i++) series += COEFFICIENTS[i] / (z + i);
  const t = z + G + 0.5;
  return HALF_LOG_TWO_PI + (z + 0.5) * Math.log(t) - t + Math.log(series);
}

/** Gamma(x) for x > 0; overflows to Infinity above x ~ 171.6 like any double. */
export function gamma(x: number): number {
  if (!(x > 0)) return NaN;
  if (x < 0.5) return Math.PI / (Math.sin(Math.PI * x) * gamma(1 - x));
  if (x > 171.7) return Infinity;
  const z = x - 1;
  let series = COEFFICIENTS[0];
  for (let i = 1; i < COEFFICIENTS.length; i++) series += COEFFICIENTS[i] / (z + i);
  const t = z + G + 0.5;
  // t^(z+1/2) overflows above x ~ 143 although Gamma(x) does not until 171.6: split the power.
  const half = Math.pow(t, 0.5 * (z + 0.5));
  return Math.sqrt(2 * Math.PI) * half * (half * Math.exp(-t)) * series;
}
