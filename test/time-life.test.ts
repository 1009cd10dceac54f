/**
 * Lifetime relations of slow crack growth against a direct numerical
 * integration of the crack-growth law da/dt = A (K/K_IC)^n, K = Y s sqrt(a).
 *
 * References: test/fixtures/crack_growth.json from
 * test/fixtures/generate_crack_growth.py (scipy solve_ivp DOP853 on the ODE,
 * scipy quad on the separable integral, scipy.stats.weibull_min quantiles;
 * versions recorded in the JSON). The material constants are invented.
 */
import { describe, expect, it } from "vitest";
import { InputError } from "../src/errors";
import {
  crackGrowthB,
  crackGrowthBFromStaticFit,
  crackGrowthBFromStressRateFit,
  inertStrengthToSurvive,
  lifetimeStress,
  timeToFailure,
  timeToFailureFromInertStrength,
} from "../src/design/crack-growth-life";
import { lifeDesignStress, lifeDesignStressFromRateTests, loadHistoryStress } from "../src/design/lifetime-design";
import { designStress } from "../src/weibull/distribution";
import fixture from "./fixtures/crack_growth.json";
import { relativeError, expectInputError } from "./helpers";

const bOf = (c: { n: number; A: number; K: number; Y: number }) =>
  crackGrowthB({ n: c.n, velocityCoefficient: c.A, toughness: c.K, geometryFactor: c.Y });

describe("B = 2 K_IC^2 / (A Y^2 (n-2)) and the exact static life", () => {
  for (const c of fixture.lifetimes) {
    for (const point of c.static) {
      it(`${c.name}, a_i ${c.initialCrack}, s ${point.stress.toFixed(2)}`, () => {
        const t = timeToFailureFromInertStrength({ stress: point.stress, inertStrength: c.inertStrength, n: c.n, B: bOf(c) });
        // source: scipy quad of int da / v(a), generate_crack_growth.py
        expect(relativeError(t, point.timeQuad)).toBeLessThan(1e-10);
        // source: scipy solve_ivp of the crack-growth ODE (only where doubles can resolve it)
        if (point.timeOde !== null) expect(relativeError(t, point.timeOde)).toBeLessThan(1e-9);
      });
    }
  }

  it("is zero once the stress reaches the inert strength", () => {
    expect(timeToFailureFromInertStrength({ stress: 100, inertStrength: 100, n: 20, B: 1 })).toBe(0);
    expect(timeToFailureFromInertStrength({ stress: 150, inertStrength: 100, n: 20, B: 1 })).toBe(0);
  });
});

describe("constant stress-rate relation", () => {
  for (const c of fixture.lifetimes) {
    for (const r of c.rates) {
      it(`${c.name} at ${r.stressRate.toPrecision(3)}: s_f^(n+1) = B (n+1) sdot (s_i^(n-2) - s_f^(n-2))`, () => {
        // The exact relation derived in crack-growth-life.ts, against the ODE's failure stress.
        // source: scipy solve_ivp (two-phase) of the ODE under s = sdot t, generate_crack_growth.py
        const B = bOf(c);
        const { n } = c;
        const lhs = (n + 1) * Math.log(r.strength);
        const rhs =
          Math.log(B * (n + 1) * r.stressRate) +
          (n - 2) * Math.log(c.inertStrength) +
          Math.log(-Math.expm1((n - 2) * Math.log(r.strength / c.inertStrength)));
        expect(Math.abs(lhs - rhs)).toBeLessThan(1e-9);
      });
    }
  }
});

describe("TIMETOFAILURE and LIFETIMESTRESS (rate-based, no B) against the integrated law", () => {
  for (const c of fixture.lifetimes) {
    for (const r of c.rates) {
      for (const point of c.static) {
        it(`${c.name}, rate ${r.stressRate.toPrecision(3)}, stress ${point.stress.toFixed(2)}`, () => {
          // Same flaw: strength r.strength at r.stressRate; integrated life point.timeQuad at point.stress.
          const t = timeToFailure({ stress: point.stress, strength: r.strength, stressRate: r.stressRate, n: c.n });
          // The closed form drops (s/s_i)^(n-2) terms. Derived: t_approx / t_exact =
          // (1 - x_f) / (1 - x_s), x = (s/s_i)^(n-2). Check that structure sharply, then the
          // plain agreement where both x are small.
          const xf = Math.pow(r.strength / c.inertStrength, c.n - 2);
          const xs = Math.pow(point.stress / c.inertStrength, c.n - 2);
          expect(relativeError(t / point.timeQuad, (1 - xf) / (1 - xs))).toBeLessThan(1e-8);
          if (xf + xs < 1e-6) expect(relativeError(t, point.timeQuad)).toBeLessThan(2e-6);
          // LIFETIMESTRESS inverts TIMETOFAILURE exactly ...
          const s = lifetimeStress({ strength: r.strength, stressRate: r.stressRate, n: c.n, lifetime: t });
          expect(relativeError(s, point.stress)).toBeLessThan(1e-12);
          // ... and against the integrated life it is off by the same factor to the power 1/n.
          const sOde = lifetimeStress({ strength: r.strength, stressRate: r.stressRate, n: c.n, lifetime: point.timeQuad });
          expect(relativeError(sOde / point.stress, Math.pow((1 - xf) / (1 - xs), 1 / c.n))).toBeLessThan(1e-9);
        });
      }
    }
  }

  it("a constant-rate test lasts n+1 times the static life at the same failure stress", () => {
    // docs/methods.md section 7, ratio derived; the closed forms below are the core's own.
    const n = 18;
    const strength = 250;
    const rate = 3;
    const staticLife = timeToFailure({ stress: strength, strength, stressRate: rate, n });
    expect(relativeError(strength / rate / staticLife, n + 1)).toBeLessThan(1e-13);
  });

  it("rejects n <= 2 and non-positive rates, stresses and times", () => {
    expectInputError(() => timeToFailure({ stress: 100, strength: 200, stressRate: 1, n: 2 }));
    expectInputError(() => timeToFailure({ stress: 100, strength: 200, stressRate: 0, n: 20 }));
    expectInputError(() => timeToFailure({ stress: -1, strength: 200, stressRate: 1, n: 20 }));
    expectInputError(() => lifetimeStress({ strength: 200, stressRate: 1, n: 20, lifetime: 0 }));
    expectInputError(() => lifetimeStress({ strength: 200, stressRate: -1, n: 20, lifetime: 10 }));
    expectInputError(() => lifetimeStress({ strength: 200, stressRate: 1, n: 1.5, lifetime: 10 }));
    expectInputError(() => crackGrowthB({ n: 2, velocityCoefficient: 1, toughness: 1, geometryFactor: 1 }));
    expectInputError(() => crackGrowthB({ n: 20, velocityCoefficient: 0, toughness: 1, geometryFactor: 1 }));
  });

  it("throws instead of returning Infinity when a life overflows doubles", () => {
    expectInputError(() => timeToFailure({ stress: 1e-3, strength: 500, stressRate: 1, n: 200 }), "notRepresentable");
    expectInputError(() => timeToFailureFromInertStrength({ stress: 1e-3, inertStrength: 500, n: 200, B: 1 }), "notRepresentable");
  });
});

describe("B from fitted D and the inert strength", () => {
  for (const c of fixture.lifetimes) {
    for (const r of c.rates) {
      it(`${c.name}, rate ${r.stressRate.toPrecision(3)}`, () => {
        // One specimen fixes D = s_f / sdot^(1/(n+1)); B from D is then B (1 - x_f), x_f = (s_f/s_i)^(n-2).
        const B = bOf(c);
        const D = r.strength / Math.pow(r.stressRate, 1 / (c.n + 1));
        const fromD = crackGrowthBFromStressRateFit({ D, n: c.n, inertStrength: c.inertStrength });
        const xf = Math.pow(r.strength / c.inertStrength, c.n - 2);
        expect(relativeError(fromD, B * (1 - xf))).toBeLessThan(1e-9);
      });
    }
    for (const point of c.static) {
      it(`${c.name}, static at ${point.stress.toFixed(2)}`, () => {
        // t_f = D_s s^-n fixes log10 D_s; B from it is B (1 - x_s).
        const B = bOf(c);
        const log10D = Math.log10(point.timeQuad) + c.n * Math.log10(point.stress);
        const fromD = crackGrowthBFromStaticFit({ log10D, n: c.n, inertStrength: c.inertStrength });
        const xs = Math.pow(point.stress / c.inertStrength, c.n - 2);
        expect(relativeError(fromD, B * (1 - xs))).toBeLessThan(1e-9);
      });
    }
  }
});

describe("equivalent constant stress of a load history", () => {
  for (const h of fixture.histories) {
    it(`${h.name}: s_eq^n T grows cracks as the history did`, () => {
      // source: scipy solve_ivp through each block, final crack -> remaining strength S.
      // Derived: B (s_i^(n-2) - S^(n-2)) = integral s^n dt = s_eq^n T.
      const B = bOf(h);
      const { stress, totalDuration } = loadHistoryStress({ stresses: h.stresses, durations: h.durations, n: h.n });
      const growth =
        Math.log(B) +
        (h.n - 2) * Math.log(h.inertStrength) +
        Math.log(-Math.expm1((h.n - 2) * Math.log(h.remainingStrength / h.inertStrength)));
      const implied = Math.exp((growth - Math.log(totalDuration)) / h.n);
      expect(relativeError(stress, implied)).toBeLessThan(1e-9);
    });
  }

  it("quotes the stress for another reference duration and ignores unloaded blocks", () => {
    const base = loadHistoryStress({ stresses: [100, 50], durations: [10, 1000], n: 20 });
    const shifted = loadHistoryStress({ stresses: [100, 50], durations: [10, 1000], n: 20, referenceDuration: 1010 * 8 });
    expect(relativeError(shifted.stress, base.stress * Math.pow(8, -1 / 20))).toBeLessThan(1e-13);
    // One block alone is its own equivalent.
    expect(loadHistoryStress({ stresses: [73], durations: [5], n: 30 }).stress).toBeCloseTo(73, 12);
    expect(loadHistoryStress({ stresses: [0, 0], durations: [5, 5], n: 30 }).stress).toBe(0);
  });

  it("scales by the peak so n = 300 at 1e5 stress units does not overflow", () => {
    const r = loadHistoryStress({ stresses: [1e5, 5e4], durations: [1, 1], n: 300 });
    expect(Number.isFinite(r.stress)).toBe(true);
    expect(relativeError(r.stress, 1e5 * Math.pow((1 + Math.pow(0.5, 300)) / 2, 1 / 300))).toBeLessThan(1e-14);
  });

  it("rejects negative stresses or durations, mismatched tables and n <= 2", () => {
    expectInputError(() => loadHistoryStress({ stresses: [10, -5], durations: [1, 1], n: 20 }));
    expectInputError(() => loadHistoryStress({ stresses: [10, 5], durations: [1, -1], n: 20 }));
    expectInputError(() => loadHistoryStress({ stresses: [10, 5], durations: [0, 0], n: 20 }));
    expectInputError(() => loadHistoryStress({ stresses: [10, 5], durations: [1, 1], n: 2 }));
    expect(() => loadHistoryStress({ stresses: [10, 5], durations: [1], n: 20 })).toThrow(InputError);
  });
});

describe("strength-probability-time design", () => {
  for (const c of fixture.lifeDesign) {
    it(`${c.name}: Pf ${c.failureProbability}, m ${c.shape}, k ${c.sizeRatio}, t ${c.lifetime}`, () => {
      const result = lifeDesignStress({
        survival: 1 - c.failureProbability,
        lifetime: c.lifetime,
        shape: c.shape,
        scale: c.scale,
        sizeRatio: c.sizeRatio,
        n: c.n,
        B: bOf(c),
      });
      expect(result.converged).toBe(true);
      // source: scipy.stats.weibull_min.ppf at the part's scale th k^(-1/m)
      expect(relativeError(result.inertStrength, c.inertDesignStrength)).toBeLessThan(1e-9);
      // source: scipy brentq on the quad-integrated life equal to the lifetime
      expect(relativeError(result.stress, c.allowableStress)).toBeLessThan(1e-9);
    });
  }

  it("reduces to (B s_i^(n-2) / t)^(1/n) for long lives (docs/methods.md section 7)", () => {
    const B = 2;
    const n = 20;
    const lifetime = 3e8;
    const r = lifeDesignStress({ survival: 0.9999, lifetime, shape: 10, scale: 300, n, B });
    const approx = Math.exp((Math.log(B) + (n - 2) * Math.log(r.inertStrength) - Math.log(lifetime)) / n);
    expect(relativeError(r.stress, approx)).toBeLessThan(1e-12);
  });

  it("the rate-test route equals DESIGNSTRESS carried by LIFETIMESTRESS", () => {
    const s = lifeDesignStressFromRateTests({ survival: 0.999, lifetime: 1e6, shape: 9, scale: 350, sizeRatio: 4, stressRate: 10, n: 25 });
    const strength = designStress({ survival: 0.999, shape: 9, scale: 350, sizeRatio: 4 });
    expect(s).toBe(lifetimeStress({ strength, stressRate: 10, n: 25, lifetime: 1e6 }));
  });

  it("rejects bad input", () => {
    const ok = { survival: 0.99, lifetime: 10, shape: 10, scale: 300, n: 20, B: 1 };
    expectInputError(() => lifeDesignStress({ ...ok, n: 2 }));
    expectInputError(() => lifeDesignStress({ ...ok, lifetime: 0 }));
    expectInputError(() => lifeDesignStress({ ...ok, B: -1 }));
    expectInputError(() => lifeDesignStress({ ...ok, survival: 1 }));
    expectInputError(() => lifeDesignStress({ ...ok, sizeRatio: 0 }));
  });
});

describe("inert strength needed to survive a stress for a time", () => {
  it("inverts the exact static life", () => {
    for (const [s, t, n, B] of [
      [100, 1e-6, 20, 3],
      [100, 3e8, 20, 3],
      [50, 1, 6, 0.1],
      [400, 1e9, 90, 50],
    ]) {
      const si = inertStrengthToSurvive({ stress: s, duration: t, n, B });
      expect(relativeError(timeToFailureFromInertStrength({ stress: s, inertStrength: si, n, B }), t)).toBeLessThan(1e-9);
    }
  });
});
