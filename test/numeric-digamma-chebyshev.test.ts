// Special functions the pooled fit needs: digamma (the rods' size law in m) and Chebyshev
// interpolation (the disks' size law). Edges of the domain in the style of stdlib-js.
import { describe, expect, it } from "vitest";
import { chebyshevInterpolant } from "../src/numeric/chebyshev";
import { digamma } from "../src/numeric/digamma";
import { relativeError } from "./helpers";

const EULER = 0.5772156649015329; // Euler-Mascheroni constant (from memory; 0.57721 56649 01532 86...)

describe("digamma", () => {
  it("equals the closed forms at integers and half-integers (source: Abramowitz & Stegun 6.3.2-6.3.4)", () => {
    expect(relativeError(digamma(1), -EULER)).toBeLessThan(2e-15);
    expect(relativeError(digamma(0.5), -EULER - 2 * Math.LN2)).toBeLessThan(2e-15);
    // psi(n) = -gamma + sum_{k<n} 1/k; psi(n + 1/2) = -gamma - 2 ln 2 + sum_{k=1..n} 2/(2k - 1)
    for (const n of [2, 3, 7, 12, 40, 300]) {
      let h = 0;
      for (let k = 1; k < n; k++) h += 1 / k;
      expect(relativeError(digamma(n), -EULER + h)).toBeLessThan(4e-15);
      let o = 0;
      for (let k = 1; k <= n; k++) o += 2 / (2 * k - 1);
      expect(relativeError(digamma(n + 0.5), -EULER - 2 * Math.LN2 + o)).toBeLessThan(4e-15);
    }
  });

  it("follows the recurrence psi(x + 1) = psi(x) + 1/x across the switch to the series at 10 (A&S 6.3.5)", () => {
    for (const x of [0.013, 0.77, 3.3, 8.9, 9.5, 9.999, 10.0001, 55.5]) {
      expect(Math.abs(digamma(x + 1) - digamma(x) - 1 / x)).toBeLessThan(4e-15 * Math.max(1, Math.abs(1 / x)));
    }
  });

  it("is NaN outside x > 0 and for NaN and infinities (no silent number)", () => {
    for (const x of [0, -1, -0.5, NaN, Infinity, -Infinity]) expect(digamma(x)).toBeNaN();
  });

  it("is about ln x - 1/(2x) for a huge x, and about -1/x for a subnormal x", () => {
    expect(relativeError(digamma(1e300), Math.log(1e300))).toBeLessThan(1e-15);
    expect(relativeError(digamma(1e-300), -1e300)).toBeLessThan(1e-15);
  });
});

describe("chebyshevInterpolant", () => {
  it("reproduces exp and its derivative on [0, 3] to rounding with 30 nodes", () => {
    const f = chebyshevInterpolant({ f: Math.exp, lower: 0, upper: 3, nodes: 30 });
    for (let x = 0; x <= 3; x += 0.137) {
      expect(relativeError(f.value(x), Math.exp(x))).toBeLessThan(3e-14); // measured 1.3e-14: the O(n) sums of the coefficients
      expect(relativeError(f.derivative(x), Math.exp(x))).toBeLessThan(1e-11); // measured 5.8e-12: differentiation amplifies rounding near the ends
    }
  });

  it("is exact for a polynomial of lower degree than its nodes (common practice)", () => {
    const p = (x: number) => 3 * x ** 3 - x + 2;
    const f = chebyshevInterpolant({ f: p, lower: -2, upper: 5, nodes: 6 });
    expect(relativeError(f.value(4.2), p(4.2))).toBeLessThan(1e-13);
    expect(relativeError(f.derivative(-1.3), 9 * 1.3 ** 2 - 1)).toBeLessThan(1e-12);
  });
});
