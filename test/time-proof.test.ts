/**
 * Proof testing: fraction broken, the truncated strength distribution of the
 * survivors, the guaranteed minimum life and the proof stress for a life.
 *
 * References: test/fixtures/crack_growth.json from
 * test/fixtures/generate_crack_growth.py (scipy solve_ivp and quad of the
 * crack-growth law from the crack that just survives the proof load; mpmath at
 * 50 digits for the conditional probability of failure given survival;
 * scipy.stats.weibull_min for the fraction broken). Constants are invented.
 */
import { describe, expect, it } from "vitest";
import { crackGrowthB } from "../src/design/crack-growth-life";
import {
  postProofFailureProbability,
  proofBreakFraction,
  proofMinimumLife,
  proofStressForLife,
} from "../src/design/proof-test";
import fixture from "./fixtures/crack_growth.json";
import { relativeError, expectInputError } from "./helpers";

const bOf = (c: { n: number; A: number; K: number; Y: number }) =>
  crackGrowthB({ n: c.n, velocityCoefficient: c.A, toughness: c.K, geometryFactor: c.Y });

interface ProofCase {
  name: string;
  A: number;
  K: number;
  Y: number;
  n: number;
  serviceStress: number;
  proofStress?: number;
  minimumLifeQuad?: number;
  minimumLifeOde?: number | null;
  requiredLife?: number;
  proofStressForLife?: number;
}
const cases = fixture.proof as ProofCase[];

describe("minimum life after a proof test", () => {
  for (const c of cases.filter((p) => p.minimumLifeQuad !== undefined)) {
    it(`${c.name}: proof ${c.proofStress}, service ${c.serviceStress}`, () => {
      const t = proofMinimumLife({ proofStress: c.proofStress!, serviceStress: c.serviceStress, n: c.n, B: bOf(c) });
      // source: scipy quad / solve_ivp from the crack that just survives the proof stress
      expect(relativeError(t, c.minimumLifeQuad!)).toBeLessThan(1e-10);
      if (c.minimumLifeOde != null) expect(relativeError(t, c.minimumLifeOde)).toBeLessThan(1e-9);
    });
  }

  it("falls to zero as the service stress reaches the proof stress", () => {
    expect(proofMinimumLife({ proofStress: 200, serviceStress: 200, n: 20, B: 1 })).toBe(0);
    const service = 200 * (1 - 1e-10);
    const eps = (200 - service) / 200; // exact: the double actually passed
    const near = proofMinimumLife({ proofStress: 200, serviceStress: service, n: 20, B: 1 });
    // Derived: t = B s_a^-2 ((1 - eps)^-(n-2) - 1) ~ B s_a^-2 (n-2) eps, relative error (n-1) eps / 2 ~ 1e-9.
    expect(relativeError(near, (18 * eps) / (service * service))).toBeLessThan(2e-9);
  });

  it("approaches B s_p^(n-2) s_a^-n (Evans & Wiederhorn form, docs/methods.md section 7) at low service stress", () => {
    const t = proofMinimumLife({ proofStress: 300, serviceStress: 60, n: 30, B: 4 });
    const approx = Math.exp(Math.log(4) + 28 * Math.log(300) - 30 * Math.log(60));
    expect(relativeError(t, approx)).toBeLessThan(1e-15 + Math.pow(0.2, 28));
  });

  it("rejects a service stress above the proof stress, n <= 2 and non-positive inputs", () => {
    expectInputError(() => proofMinimumLife({ proofStress: 200, serviceStress: 201, n: 20, B: 1 }));
    expectInputError(() => proofMinimumLife({ proofStress: 200, serviceStress: 100, n: 2, B: 1 }));
    expectInputError(() => proofMinimumLife({ proofStress: 200, serviceStress: 100, n: 20, B: 0 }));
    expectInputError(() => proofMinimumLife({ proofStress: 0, serviceStress: 0, n: 20, B: 1 }));
    expectInputError(() => proofMinimumLife({ proofStress: 200, serviceStress: -5, n: 20, B: 1 }));
  });
});

describe("proof stress for a required minimum life", () => {
  for (const c of cases.filter((p) => p.requiredLife !== undefined)) {
    it(`${c.name}: service ${c.serviceStress}, life ${c.requiredLife}`, () => {
      const sp = proofStressForLife({ serviceStress: c.serviceStress, minimumLife: c.requiredLife!, n: c.n, B: bOf(c) });
      // source: scipy brentq on the quad-integrated life, generate_crack_growth.py
      expect(relativeError(sp, c.proofStressForLife!)).toBeLessThan(1e-10);
      // and it inverts the minimum life
      const t = proofMinimumLife({ proofStress: sp, serviceStress: c.serviceStress, n: c.n, B: bOf(c) });
      expect(relativeError(t, c.requiredLife!)).toBeLessThan(1e-9);
    });
  }

  it("rejects zero or negative lives and n <= 2", () => {
    expectInputError(() => proofStressForLife({ serviceStress: 100, minimumLife: 0, n: 20, B: 1 }));
    expectInputError(() => proofStressForLife({ serviceStress: 100, minimumLife: -1, n: 20, B: 1 }));
    expectInputError(() => proofStressForLife({ serviceStress: 100, minimumLife: 10, n: 1, B: 1 }));
  });
});

describe("failure probability of proof-test survivors", () => {
  for (const c of fixture.postProof) {
    it(`m ${c.shape}, k ${c.sizeRatio}, s/s_p ${(c.stress / c.proofStress).toPrecision(10)}`, () => {
      const pf = postProofFailureProbability({
        stress: c.stress,
        proofStress: c.proofStress,
        shape: c.shape,
        scale: c.scale,
        sizeRatio: c.sizeRatio,
      });
      // source: mpmath (50 digits) of (F(s) - F(s_p)) / (1 - F(s_p)), generate_crack_growth.py
      if (c.failureProbability === 0) expect(pf).toBe(0);
      else expect(relativeError(pf, c.failureProbability)).toBeLessThan(1e-12);
      const broken = proofBreakFraction({ proofStress: c.proofStress, shape: c.shape, scale: c.scale, sizeRatio: c.sizeRatio });
      // source: mpmath -expm1(-k (s_p/th)^m) and scipy.stats.weibull_min.cdf
      expect(relativeError(broken, c.proofBreaks)).toBeLessThan(1e-13);
      expect(relativeError(broken, c.proofBreaksScipy)).toBeLessThan(1e-12);
    });
  }

  it("is exactly zero at and below the proof stress", () => {
    const w = { proofStress: 300, shape: 10, scale: 400 };
    expect(postProofFailureProbability({ ...w, stress: 300 })).toBe(0);
    expect(postProofFailureProbability({ ...w, stress: 0 })).toBe(0);
    expect(postProofFailureProbability({ ...w, stress: 1e6 })).toBe(1);
  });

  it("rejects bad input", () => {
    const w = { stress: 100, proofStress: 300, shape: 10, scale: 400 };
    expectInputError(() => postProofFailureProbability({ ...w, stress: -1 }));
    expectInputError(() => postProofFailureProbability({ ...w, proofStress: 0 }));
    expectInputError(() => postProofFailureProbability({ ...w, shape: 0 }));
    expectInputError(() => postProofFailureProbability({ ...w, scale: -1 }));
    expectInputError(() => postProofFailureProbability({ ...w, sizeRatio: 0 }));
    expectInputError(() => proofBreakFraction({ proofStress: 0, shape: 10, scale: 400 }));
  });
});
