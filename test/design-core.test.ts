// Probability-plot regression, plotting positions, lot bounds and size
// scaling against outside references: scipy 1.17.1 linregress and binom.ppf
// through test/fixtures/generate_regression_and_lots.py, and published
// relations (ASTM C1683 size scaling, Johnson 1964 adjusted ranks).
import { describe, expect, it } from "vitest";
import { expectedFailures, failuresUpperBound } from "../src/design/lot-failures";
import { materialScale, scaleStrengthToSize } from "../src/design/size-scaling";
import { designStress, failureProbability } from "../src/weibull/distribution";
import { plottingPositions, type PlottingEstimator } from "../src/weibull/plotting-positions";
import { fitProbabilityPlot } from "../src/weibull/regression";
import { fixture, relativeError } from "./helpers";

const ref = fixture("regression_and_lots.json");

describe("least squares on the Weibull plot (scipy.stats.linregress)", () => {
  ref.regression.forEach((sample: any, k: number) => {
    for (const estimator of ["HAZEN", "MEAN", "MEDIAN"] as PlottingEstimator[]) {
      it(`sample ${k + 1} (n = ${sample.strengths.length}), ${estimator}`, () => {
        const fit = fitProbabilityPlot({ strengths: sample.strengths }, estimator);
        const want = sample.fits[estimator];
        expect(relativeError(fit.shape, want.shape)).toBeLessThan(1e-11);
        expect(relativeError(fit.scale, want.scale)).toBeLessThan(1e-11);
        expect(relativeError(fit.rSquared, want.rSquared)).toBeLessThan(1e-10);
      });
    }
  });
});

describe("plotting positions", () => {
  it("complete sample: (i - 0.5)/N in increasing strength (ASTM C1239 plotting convention)", () => {
    const points = plottingPositions({ strengths: [330, 300, 310, 320] });
    expect(points.map((p) => p.strength)).toEqual([300, 310, 320, 330]);
    expect(points.map((p) => p.failureProbability)).toEqual([0.125, 0.375, 0.625, 0.875]);
  });

  it("censored sample: Johnson's adjusted ranks (worked by hand from the published recursion)", () => {
    // N = 5; the 2nd-weakest is censored. Ranks: 1; then (5+1-1)/(1+3) = 1.25 -> 2.25; then
    // (6-2.25)/(1+2) = 1.25 -> 3.5; then (6-3.5)/(1+1) = 1.25 -> 4.75.
    const points = plottingPositions(
      { strengths: [300, 305, 310, 320, 330], censored: [false, true, false, false, false] },
      "MEAN",
    );
    expect(points.map((p) => p.strength)).toEqual([300, 310, 320, 330]);
    const ranks = points.map((p) => p.failureProbability * 6);
    [1, 2.25, 3.5, 4.75].forEach((r, i) => expect(ranks[i]).toBeCloseTo(r, 12));
  });
});

describe("lot failures (scipy.stats.binom.ppf)", () => {
  for (const lot of ref.lots) {
    it(`p = ${lot.failureProbability}, N = ${lot.lotSize}, confidence ${lot.confidence}`, () => {
      expect(failuresUpperBound(lot)).toBe(lot.upperBound);
    });
  }
  it("expected count is N p", () => {
    expect(expectedFailures({ failureProbability: 1e-4, lotSize: 25000 })).toBeCloseTo(2.5, 14);
  });
  it("rejects fractional or huge lots and probabilities outside [0, 1)", () => {
    expect(() => expectedFailures({ failureProbability: 0.1, lotSize: 10.5 })).toThrow(/whole number/);
    expect(() => expectedFailures({ failureProbability: 0.1, lotSize: 2e9 })).toThrow(/whole number/);
    expect(() => expectedFailures({ failureProbability: 1, lotSize: 10 })).toThrow(/failure probability/);
    expect(() => failuresUpperBound({ failureProbability: 0.1, lotSize: 10, confidence: 1 })).toThrow(/confidence/);
  });
});

describe("size scaling (ASTM C1683: th2/th1 = (V1/V2)^(1/m))", () => {
  it("matches the failure-probability form: the same Pf at the scaled stress for a part k times larger", () => {
    // Pf(s2; k) = Pf(s1; 1) when s2 = s1 (1/k)^(1/m): the weakest-link relation itself.
    const s1 = 280;
    const s2 = scaleStrengthToSize({ strength: s1, shape: 9, fromSize: 2, toSize: 50 });
    expect(relativeError(failureProbability({ stress: s2, shape: 9, scale: 400, sizeRatio: 25 }), failureProbability({ stress: s1, shape: 9, scale: 400 }))).toBeLessThan(1e-13);
  });
  it("round-trips and agrees with the design-stress size ratio", () => {
    const there = scaleStrengthToSize({ strength: 350, shape: 12, fromSize: 1.5, toSize: 900 });
    expect(relativeError(scaleStrengthToSize({ strength: there, shape: 12, fromSize: 900, toSize: 1.5 }), 350)).toBeLessThan(1e-15);
    const small = designStress({ survival: 0.999, shape: 12, scale: 400 });
    const big = designStress({ survival: 0.999, shape: 12, scale: 400, sizeRatio: 600 });
    expect(relativeError(scaleStrengthToSize({ strength: small, shape: 12, fromSize: 1.5, toSize: 900 }), big)).toBeLessThan(1e-14);
  });
  it("material scale: sigma_0 = th V^(1/m), the characteristic strength of a unit size", () => {
    const s0 = materialScale({ scale: 400, shape: 10, effectiveSize: 1.5 });
    expect(relativeError(s0, 400 * Math.pow(1.5, 0.1))).toBeLessThan(1e-15);
    expect(relativeError(scaleStrengthToSize({ strength: 400, shape: 10, fromSize: 1.5, toSize: 1 }), s0)).toBeLessThan(1e-15);
  });
});
