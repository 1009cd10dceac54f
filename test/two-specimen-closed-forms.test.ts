// Closed forms for a sample of two, checked against the solver and the shipped pivotal table
// (docs/methods.md sections 2 and 3).
//
// Derived (docs/methods.md section 2, two specimens s1 < s2, d = ln(s2/s1)): with x = s/s2 the
// likelihood equation reads (d/2) tanh(m d/2) = 1/m, so m_hat = u*/d where u* solves
// u tanh(u/2) = 2, and sigma_theta_hat = ((s1^m + s2^m)/2)^(1/m). u* = 2.3993572805154675 is also
// stored by tools/simulate_pivotal_tables.py (mpmath/scipy) in pivotal-quantiles.json checks.n2ClosedForm.
// For the pivot q = m_hat/m at m = 1 the log-strengths are standard smallest-extreme-value, their
// difference is logistic, P(|D| > x) = 2/(1 + e^x), hence q_p = u*/ln(2/p - 1) exactly.
import { describe, expect, it } from "vitest";
import table from "../src/weibull/tables/pivotal-quantiles.json";
import { estimateCharacteristicStrength } from "../src/weibull/estimate";
import { fitMaximumLikelihood } from "../src/weibull/maximum-likelihood";
import { pivotalTable } from "../src/weibull/pivotal-table";
import { relativeError } from "./helpers";

/** Root of u tanh(u/2) = 2 by bisection (the left side increases on u > 0). */
function uStar(): number {
  let lo = 1;
  let hi = 4;
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    if (mid * Math.tanh(mid / 2) < 2) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

describe("two specimens: the maximum-likelihood fit in closed form", () => {
  const u = uStar();

  it("u* solves u tanh(u/2) = 2 and matches the value the table generator stored (mpmath)", () => {
    const stored = (table as any).checks.n2ClosedForm.uStar as number;
    expect(relativeError(u, stored)).toBeLessThan(1e-15);
  });

  for (const [s1, s2] of [
    [300, 350],
    [1e-3, 1.7e-3],
    [412.5, 412.6],
    [2e6, 9e7],
  ]) {
    it(`m_hat = u*/ln(s2/s1) and th_hat = ((s1^m + s2^m)/2)^(1/m) for (${s1}, ${s2})`, () => {
      const m = u / Math.log(s2 / s1);
      const theta = s2 * Math.pow((Math.pow(s1 / s2, m) + 1) / 2, 1 / m);
      const fit = fitMaximumLikelihood({ strengths: [s2, s1] });
      expect(fit.converged).toBe(true);
      expect(relativeError(fit.shape, m)).toBeLessThan(1e-12);
      expect(relativeError(fit.scale, theta)).toBeLessThan(1e-12);
    });
  }

  it("gives the @example of maximum-likelihood.ts and estimate.ts: [300, 350] has scale about 336.6", () => {
    // Closed form above at 30 digits (mpmath): m = 15.5650126435004655547..., scale = 336.629572479760014172...
    // (the nearest doubles below).
    expect(relativeError(fitMaximumLikelihood({ strengths: [300, 350] }).shape, 15.565012643500465)).toBeLessThan(1e-12);
    expect(relativeError(estimateCharacteristicStrength({ strengths: [300, 350] }), 336.62957247976)).toBeLessThan(1e-12);
  });
});

describe("two specimens: the shipped quantiles of q = m_hat/m against q_p = u*/ln(2/p - 1)", () => {
  const u = uStar();
  const { probabilities, rows } = table as unknown as {
    probabilities: number[];
    rows: { n: number; q: number[]; qSE: number[] }[];
  };
  const row = rows.find((r) => r.n === 2)!;

  it("every tabulated probability lies within 3 Monte Carlo standard errors of the exact quantile", () => {
    probabilities.forEach((p, j) => {
      const exact = u / Math.log(2 / p - 1);
      // The table stores 6 significant digits: allow that rounding on top of 3 standard errors.
      const allowed = 3 * row.qSE[j] + 5e-6 * exact;
      expect(Math.abs(row.q[j] - exact), `p = ${p}`).toBeLessThan(allowed);
      expect(Math.abs(pivotalTable().shapeQuantile(2, p) - row.q[j]), `p = ${p}`).toBeLessThan(1e-12 * exact);
    });
  });
});
