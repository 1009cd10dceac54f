/**
 * Student's t quantile, for the confidence interval on the slope of the
 * crack-growth regressions (ASTM C1368 and C1576 fits have N - 2 degrees of
 * freedom, often only 10 to 30, where the normal quantile is too narrow).
 *
 * The upper tail is Q(t) = I_x(nu/2, 1/2) / 2 with x = nu / (nu + t^2), the
 * regularized incomplete beta function evaluated by its continued fraction
 * (modified Lentz). The quantile is found by Brent's method on the tail.
 * Checked against scipy.stats.t.ppf (test/fixtures/generate_crack_growth.py).
 */
import { ensure } from "../errors";
import { logGamma } from "./gamma";
import { bracketIncreasing, findRoot } from "./roots";

/** Upper-tail probability P(T > t) for t >= 0 with `df` degrees of freedom. */
export function studentUpperTail(t: number, df: number): number {
  ensure(Number.isFinite(df) && df > 0, () => `degrees of freedom must be positive (got ${df})`);
  ensure(Number.isFinite(t) && t >= 0, () => `t must be zero or positive (got ${t})`);
  const x = df / (df + t * t);
  return 0.5 * regularizedBeta(x, df / 2, 0.5);
}

/** The quantile t_p of Student's t with `df` degrees of freedom, for 0.5 <= p < 1. */
export function studentQuantile(p: number, df: number): { value: number; converged: boolean } {
  ensure(Number.isFinite(p) && p >= 0.5 && p < 1, () => `probability must lie in [0.5, 1) (got ${p})`);
  ensure(Number.isFinite(df) && df > 0, () => `degrees of freedom must be positive (got ${df})`);
  if (p === 0.5) return { value: 0, converged: true };
  const tail = 1 - p;
  // Closed forms where they exist: exact and free.
  if (df === 1) return { value: Math.tan(Math.PI * (p - 0.5)), converged: true };
  if (df === 2) return { value: (2 * p - 1) / Math.sqrt(2 * p * (1 - p)), converged: true };
  // g rises with t: it is negative while the tail beyond t is still larger than wanted.
  const g = (t: number) => tail - studentUpperTail(t, df);
  const bracket = bracketIncreasing(g, 1);
  if (!bracket) return { value: 0, converged: false };
  const result = findRoot(g, bracket[0], bracket[1], { relativeTolerance: 1e-14 });
  return { value: result.root, converged: result.converged };
}

/** Regularized incomplete beta I_x(a, b) for 0 <= x <= 1, a, b > 0. */
function regularizedBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const logFront = a * Math.log(x) + b * Math.log1p(-x) - logBeta(a, b);
  // The continued fraction converges quickly below the mean of the beta
  // distribution; above it, use the symmetry I_x(a, b) = 1 - I_{1-x}(b, a).
  if (x < (a + 1) / (a + b + 2)) return (Math.exp(logFront) * betaContinuedFraction(x, a, b)) / a;
  return 1 - (Math.exp(logFront) * betaContinuedFraction(1 - x, b, a)) / b;
}

function logBeta(a: number, b: number): number {
  return logGamma(a) + logGamma(b) - logGamma(a + b);
}

/** Continued fraction for I_x(a, b), modified Lentz evaluation. */
function betaContinuedFraction(x: number, a: number, b: number): number {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 1000; m++) {
    const m2 = 2 * m;
    // Even step.
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    // Odd step.
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return h;
}
