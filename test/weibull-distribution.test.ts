// Distribution functions against 40-digit mpmath values
// (test/fixtures/generate_distribution.py, mpmath 1.3.0) in the tails, and
// against jstat 1.9.6 in the range where jstat's 1 - exp() is accurate.
import { describe, expect, it } from "vitest";
import jStat from "jstat";
import {
  designStress,
  failureProbability,
  meanStrength,
  medianStrength,
  scaleFromMean,
  scaleFromMedian,
  strengthAtFailureProbability,
  strengthStandardDeviation,
  survivalProbability,
} from "../src/weibull/distribution";
import { gamma, logGamma } from "../src/numeric/gamma";
import { fixture, relativeError } from "./helpers";

const ref = fixture("weibull_distribution.json");

describe("failure probability and survival (mpmath, 40 digits)", () => {
  const f = ref.failureProbability;
  it("matches Pf from 1e-200 to 1 - 1e-12 to 1e-13 relative", () => {
    let checked = 0;
    for (let i = 0; i < f.stress.length; i++) {
      const args = { stress: f.stress[i], shape: f.shape[i], scale: f.scale[i], sizeRatio: f.sizeRatio[i] };
      expect(relativeError(failureProbability(args), f.pf[i])).toBeLessThan(1e-13);
      // exp(-H) amplifies the rounding of H by H itself (condition number H, up to ~690 here).
      const hazard = -Math.log(f.survival[i]);
      expect(relativeError(survivalProbability(args), f.survival[i])).toBeLessThan(1e-13 * Math.max(1, hazard));
      checked++;
    }
    expect(checked).toBeGreaterThan(40);
  });

  it("keeps digits where 1 - exp(-x) loses them: Pf = 1e-15 exactly to 1e-13", () => {
    const i = f.pf.findIndex((p: number) => p === 1e-15);
    const args = { stress: f.stress[i], shape: f.shape[i], scale: f.scale[i], sizeRatio: f.sizeRatio[i] };
    const naive = 1 - Math.exp(-Math.pow(args.stress / args.scale, args.shape) * args.sizeRatio);
    expect(relativeError(failureProbability(args), 1e-15)).toBeLessThan(1e-13);
    expect(relativeError(naive, 1e-15)).toBeGreaterThan(1e-4); // why expm1 matters
  });
});

describe("quantiles (mpmath, 40 digits)", () => {
  it("strength at a failure probability, 1e-15 to 0.999999", () => {
    const q = ref.quantileFromPf;
    for (let i = 0; i < q.pf.length; i++) {
      const s = strengthAtFailureProbability({ failureProbability: q.pf[i], shape: q.shape[i], scale: q.scale[i], sizeRatio: q.sizeRatio[i] });
      expect(relativeError(s, q.stress[i])).toBeLessThan(1e-13);
    }
  });

  it("design stress at a survival probability, 1e-12 to 0.999999999999999", () => {
    const q = ref.quantileFromSurvival;
    for (let i = 0; i < q.survival.length; i++) {
      const s = designStress({ survival: q.survival[i], shape: q.shape[i], scale: q.scale[i], sizeRatio: q.sizeRatio[i] });
      expect(relativeError(s, q.stress[i])).toBeLessThan(1e-13);
    }
  });

  it("round-trips: Pf(quantile(p)) = p", () => {
    for (const p of [1e-12, 1e-9, 1e-4, 0.5, 0.99]) {
      const s = strengthAtFailureProbability({ failureProbability: p, shape: 11, scale: 410 });
      expect(relativeError(failureProbability({ stress: s, shape: 11, scale: 410 }), p)).toBeLessThan(1e-14);
    }
  });
});

describe("mean, median and conversions (mpmath, 40 digits)", () => {
  const mm = ref.meanMedian;
  it("mean and median for moduli 0.5 to 100", () => {
    for (let i = 0; i < mm.shape.length; i++) {
      const p = { shape: mm.shape[i], scale: mm.scale[i] };
      expect(relativeError(meanStrength(p), mm.mean[i])).toBeLessThan(1e-13);
      expect(relativeError(medianStrength(p), mm.median[i])).toBeLessThan(1e-14);
      expect(relativeError(scaleFromMean({ mean: mm.mean[i], shape: mm.shape[i] }), mm.scale[i])).toBeLessThan(1e-13);
      expect(relativeError(scaleFromMedian({ median: mm.median[i], shape: mm.shape[i] }), mm.scale[i])).toBeLessThan(1e-14);
    }
  });
});

describe("gamma function (mpmath, 40 digits)", () => {
  const g = ref.gamma;
  it("Gamma and ln Gamma from 1e-8 to 170", () => {
    for (let i = 0; i < g.x.length; i++) {
      expect(relativeError(gamma(g.x[i]), g.gamma[i])).toBeLessThan(2e-14);
      // ln Gamma passes through zero at 1 and 2 (fixture note): absolute there.
      const tol = Math.abs(g.lnGamma[i]) < 0.5 ? 2e-15 : 1e-14 * Math.abs(g.lnGamma[i]);
      expect(Math.abs(logGamma(g.x[i]) - g.lnGamma[i])).toBeLessThan(Math.max(tol, 2e-16));
    }
  });
});

describe("cross-check with jstat 1.9.6 where its 1 - exp() is accurate (Pf > 1e-6)", () => {
  // jStat.weibull(scale, shape): note jstat's argument order is scale first.
  for (const [shape, scale] of [[3.5, 350], [10, 400], [22, 1.2e3]]) {
    it(`m = ${shape}, th = ${scale}`, () => {
      for (const p of [1e-5, 0.01, 0.3, 0.632, 0.9, 0.999]) {
        const s = strengthAtFailureProbability({ failureProbability: p, shape, scale });
        expect(relativeError(s, jStat.weibull.inv(p, scale, shape))).toBeLessThan(1e-10);
        expect(relativeError(failureProbability({ stress: s, shape, scale }), jStat.weibull.cdf(s, scale, shape))).toBeLessThan(1e-9);
      }
      expect(relativeError(meanStrength({ shape, scale }), jStat.weibull.mean(scale, shape))).toBeLessThan(1e-9);
      expect(relativeError(medianStrength({ shape, scale }), jStat.weibull.median(scale, shape))).toBeLessThan(1e-12);
      expect(relativeError(strengthStandardDeviation({ shape, scale }), Math.sqrt(jStat.weibull.variance(scale, shape)))).toBeLessThan(1e-7);
    });
  }
});

describe("domain errors", () => {
  it("rejects non-positive parameters and probabilities outside (0, 1)", () => {
    expect(() => failureProbability({ stress: 100, shape: 0, scale: 400 })).toThrow(/modulus/);
    expect(() => failureProbability({ stress: 100, shape: 10, scale: -4 })).toThrow(/characteristic/);
    expect(() => failureProbability({ stress: -1, shape: 10, scale: 400 })).toThrow(/stress/);
    expect(() => failureProbability({ stress: 1, shape: 10, scale: 400, sizeRatio: 0 })).toThrow(/size ratio/);
    expect(() => designStress({ survival: 1, shape: 10, scale: 400 })).toThrow(/survival/);
    expect(() => designStress({ survival: 0, shape: 10, scale: 400 })).toThrow(/survival/);
    expect(() => strengthAtFailureProbability({ failureProbability: 1.2, shape: 10, scale: 400 })).toThrow(/failure probability/);
  });
});
