// Maximum-likelihood fits against a 40-digit solution of the likelihood
// equations (mpmath 1.3.0, mp.dps = 40) and against scipy 1.17.1
// weibull_min.fit(data, floc=0); both from test/fixtures/generate_weibull_fits.py
// (seed recorded in weibull_fits.json).
import { describe, expect, it } from "vitest";
import { fitMaximumLikelihood } from "../src/weibull/maximum-likelihood";
import { fixture, relativeError } from "./helpers";

interface Dataset {
  id: string;
  kind: string;
  strengths: number[];
  censored: boolean[];
  ml: { shapeFloat: number; scaleFloat: number };
  scipy?: { shape: number; scale: number };
}
const { datasets } = fixture<{ datasets: Dataset[] }>("weibull_fits.json");

describe("maximum likelihood against the 40-digit mpmath solution", () => {
  it("covers complete, tied, wide-spread and censored samples", () => {
    const kinds = new Set(datasets.map((d) => d.kind));
    expect(datasets.length).toBeGreaterThanOrEqual(20);
    expect(datasets.some((d) => d.censored.some(Boolean))).toBe(true);
    expect(kinds.size).toBeGreaterThan(1);
  });

  for (const d of datasets) {
    it(`${d.id}: shape and scale to 1e-12 relative, converged`, () => {
      const fit = fitMaximumLikelihood({ strengths: d.strengths, censored: d.censored });
      expect(fit.converged).toBe(true);
      expect(relativeError(fit.shape, d.ml.shapeFloat)).toBeLessThan(1e-12);
      expect(relativeError(fit.scale, d.ml.scaleFloat)).toBeLessThan(1e-12);
      expect(fit.failures).toBe(d.censored.filter((c) => !c).length);
    });
  }
});

describe("maximum likelihood against scipy.stats.weibull_min.fit (floc=0; CensoredData for censored samples)", () => {
  // scipy's general-purpose optimiser stops within about 2e-6 of the exact root on these data
  // (its differences from the mpmath solution are stored in the fixture), so this is a loose,
  // independent check of the equations rather than of the digits.
  for (const d of datasets.filter((x) => x.scipy)) {
    it(`${d.id} agrees with scipy to 1e-5`, () => {
      const fit = fitMaximumLikelihood({ strengths: d.strengths, censored: d.censored });
      expect(relativeError(fit.shape, d.scipy!.shape)).toBeLessThan(1e-5);
      expect(relativeError(fit.scale, d.scipy!.scale)).toBeLessThan(1e-5);
    });
  }
});

describe("hostile input: strengths spanning more decades than a ratio of doubles holds", () => {
  // 1e-300 / 1e300 underflows to 0, and ln 0 once turned into "all failure strengths are equal to the
  // largest strength". The likelihood equations still have a finite solution: 40-digit mpmath
  // solutions from test/fixtures/generate_wide_span.py (hostile/fit-wide-span.json).
  const wide = fixture<{ datasets: Dataset[] }>("hostile/fit-wide-span.json").datasets;
  for (const d of wide) {
    it(`${d.id}: shape and scale to 1e-12 relative, converged`, () => {
      const fit = fitMaximumLikelihood({ strengths: d.strengths, censored: d.censored });
      expect(fit.converged).toBe(true);
      expect(relativeError(fit.shape, d.ml.shapeFloat)).toBeLessThan(1e-12);
      expect(relativeError(fit.scale, d.ml.scaleFloat)).toBeLessThan(1e-12);
    });
  }
});

describe("maximum likelihood: properties of the estimator", () => {
  const d = datasets.find((x) => x.kind === "complete" && x.strengths.length >= 20)!;
  it("is scale-equivariant: multiplying strengths by k multiplies the scale by k (derived from the likelihood)", () => {
    const base = fitMaximumLikelihood({ strengths: d.strengths });
    for (const k of [1e-200, 1e-3, 7.5, 1e250]) {
      const scaled = fitMaximumLikelihood({ strengths: d.strengths.map((s) => s * k) });
      expect(relativeError(scaled.shape, base.shape)).toBeLessThan(1e-13);
      expect(relativeError(scaled.scale, base.scale * k)).toBeLessThan(1e-13);
    }
  });

  it("does not depend on the order of the data", () => {
    const reversed = [...d.strengths].reverse();
    const a = fitMaximumLikelihood({ strengths: d.strengths });
    const b = fitMaximumLikelihood({ strengths: reversed });
    expect(relativeError(a.shape, b.shape)).toBeLessThan(1e-14);
  });

  it("rejects samples with no finite estimate", () => {
    expect(() => fitMaximumLikelihood({ strengths: [300, 300, 300] })).toThrow(/unbounded/);
    expect(() => fitMaximumLikelihood({ strengths: [300] })).toThrow(/two failures/);
    expect(() => fitMaximumLikelihood({ strengths: [300, 310, 320], censored: [true, true, false] })).toThrow(/two failures/);
    expect(() => fitMaximumLikelihood({ strengths: [300, -1] })).toThrow(/positive/);
    expect(() => fitMaximumLikelihood({ strengths: [300, 310], censored: [false] })).toThrow(/do not match/);
  });

  it("fits a million specimens and reports convergence", () => {
    const n = 1_000_000;
    const strengths = Array.from({ length: n }, (_, i) => 400 * Math.pow(-Math.log1p(-(i + 0.5) / n), 1 / 12));
    const fit = fitMaximumLikelihood({ strengths });
    expect(fit.converged).toBe(true);
    // Strengths at the Hazen quantiles of Weibull(12, 400): the estimate sits close to the generating values.
    expect(relativeError(fit.shape, 12)).toBeLessThan(2e-3);
    expect(relativeError(fit.scale, 400)).toBeLessThan(1e-4);
  });
});
