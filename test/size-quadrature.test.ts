// Quadrature rules (src/numeric/quadrature.ts) against exact integrals of
// polynomials and elementary functions (closed forms by hand, no reference library needed).
import { describe, expect, it } from "vitest";
import { gaussLegendre, integrateAdaptive, integrateGauss } from "../src/numeric/quadrature";
import { relativeError } from "./helpers";

describe("Gauss-Legendre", () => {
  it("integrates x^k exactly over [-1, 1] up to degree 2n - 1", () => {
    for (const n of [1, 2, 3, 7, 16, 40]) {
      const { nodes, weights } = gaussLegendre(n);
      for (let k = 0; k <= 2 * n - 1; k++) {
        let sum = 0;
        for (let i = 0; i < n; i++) sum += weights[i] * nodes[i] ** k;
        const exact = k % 2 === 1 ? 0 : 2 / (k + 1); // closed form of int_-1^1 x^k dx
        expect(Math.abs(sum - exact)).toBeLessThan(4e-15);
      }
    }
  });

  it("is not exact at degree 2n (the rule is Gauss, not something weaker that happens to pass)", () => {
    const n = 5;
    const { nodes, weights } = gaussLegendre(n);
    let sum = 0;
    for (let i = 0; i < n; i++) sum += weights[i] * nodes[i] ** (2 * n);
    expect(Math.abs(sum - 2 / (2 * n + 1))).toBeGreaterThan(1e-6);
  });

  it("maps to any interval", () => {
    // int_0^pi sin x dx = 2
    expect(relativeError(integrateGauss(Math.sin, 0, Math.PI, 20), 2)).toBeLessThan(1e-14);
  });
});

describe("adaptive Gauss-Kronrod", () => {
  it("the 15-point Kronrod rule is exact for degree 22 and its 7-point Gauss rule for degree 13", () => {
    // One interval, no subdivision: the estimate |K - G| is 0 only if both rules are exact.
    for (let k = 0; k <= 13; k++) {
      const r = integrateAdaptive((x) => x ** k, 0, 1, { maxIntervals: 1 });
      expect(Math.abs(r.value - 1 / (k + 1))).toBeLessThan(1e-15);
      expect(r.errorEstimate).toBeLessThan(1e-15);
    }
    for (let k = 14; k <= 22; k++) {
      const r = integrateAdaptive((x) => x ** k, 0, 1, { maxIntervals: 1 });
      expect(Math.abs(r.value - 1 / (k + 1))).toBeLessThan(2e-16 * k);
      expect(r.errorEstimate).toBeGreaterThan(1e-12);
    }
  });

  it("converges on endpoint singularities and kinks, and says so", () => {
    const root = integrateAdaptive(Math.sqrt, 0, 1, { relativeTolerance: 1e-12 });
    expect(root.converged).toBe(true);
    expect(relativeError(root.value, 2 / 3)).toBeLessThan(1e-11);
    const kink = integrateAdaptive((x) => Math.abs(x - 0.3) ** 2.5, 0, 1, { relativeTolerance: 1e-12, breakpoints: [0.3] });
    // int_0^1 |x - 0.3|^2.5 dx = (0.3^3.5 + 0.7^3.5)/3.5
    expect(relativeError(kink.value, (0.3 ** 3.5 + 0.7 ** 3.5) / 3.5)).toBeLessThan(1e-12);
  });

  it("reports non-convergence when it runs out of intervals", () => {
    const r = integrateAdaptive((x) => Math.sin(1 / x), 1e-6, 1, { maxIntervals: 5, relativeTolerance: 1e-14 });
    expect(r.converged).toBe(false);
    expect(Number.isFinite(r.value)).toBe(true);
  });

  it("handles reversed and empty intervals", () => {
    expect(integrateAdaptive(Math.cos, Math.PI / 2, 0).value).toBeCloseTo(-1, 14);
    expect(integrateAdaptive(Math.cos, 1, 1).value).toBe(0);
  });
});
