/**
 * Brent's method on a bracket [lo, hi] where f changes sign: it never leaves
 * the bracket, and falls back to bisection when interpolation stalls, so it
 * converges for any continuous f. Returns the diagnostics with the root.
 */
export interface RootResult {
  root: number;
  converged: boolean;
  iterations: number;
}

export function findRoot(
  f: (x: number) => number,
  lo: number,
  hi: number,
  { relativeTolerance = 4 * Number.EPSILON, maxIterations = 200 } = {},
): RootResult {
  let a = lo;
  let b = hi;
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return { root: a, converged: true, iterations: 0 };
  if (fb === 0) return { root: b, converged: true, iterations: 0 };
  if (!(fa * fb < 0)) return { root: NaN, converged: false, iterations: 0 };
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let i = 1; i <= maxIterations; i++) {
    if (fb * fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b; b = c; c = a;
      fa = fb; fb = fc; fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * relativeTolerance * Math.abs(b) + Number.MIN_VALUE;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return { root: b, converged: true, iterations: i };
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = f(b);
  }
  return { root: b, converged: false, iterations: maxIterations };
}

/**
 * Expands [lo, hi] geometrically (for a positive variable) until f changes
 * sign, assuming f increases with x. Returns null when no bracket is found.
 */
export function bracketIncreasing(
  f: (x: number) => number,
  start: number,
  { factor = 2, maxSteps = 200 } = {},
): [number, number] | null {
  let lo = start;
  let hi = start;
  let flo = f(lo);
  let fhi = flo;
  for (let i = 0; i < maxSteps && !(flo <= 0 && fhi >= 0); i++) {
    if (flo > 0) {
      hi = lo;
      fhi = flo;
      lo /= factor;
      flo = f(lo);
    } else {
      lo = hi;
      flo = fhi;
      hi *= factor;
      fhi = f(hi);
    }
  }
  return flo <= 0 && fhi >= 0 ? [lo, hi] : null;
}
