// The pooled material fit (src/design/material-fit.ts) against the 40-digit maximisation of the
// pooled likelihood in test/fixtures/generate_material_fit.py (mpmath 1.3.0; its input strengths are
// invented, drawn by that script's seeded simulation), and its simulated p-values and bounds against
// the same script's independent Monte Carlo (numpy PCG64, scipy brentq).
import { describe, expect, it } from "vitest";
import { fitMaterial } from "../src/design/material-fit";
import { simulateMaterialFit } from "../src/design/material-fit-simulation";
import { materialFitCaution } from "../src/design/material-fit-caution";
import { parseConfiguration, sizeLaw, type FlawKind } from "../src/design/specimen-geometry";
import { InputError } from "../src/errors";
import { fixture, relativeError } from "./helpers";

const ref = fixture("material_fit.json");

function groupsOf(c: any) {
  return c.groups.map((g: any) => ({
    label: g.configuration,
    law: sizeLaw({ geometry: parseConfiguration(g.configuration), flaws: c.flaws as FlawKind, poisson: c.poisson ?? undefined }),
    strengths: g.strengths,
    censored: g.censored,
  }));
}

describe("MATERIALFIT core against mpmath's 40-digit pooled maximum likelihood (material_fit.json)", () => {
  for (const c of ref.cases) {
    it(c.name, () => {
      const groups = groupsOf(c);
      const fit = fitMaterial({ groups });
      const r = c.reference;
      expect(fit.converged).toBe(true);
      // Bars and rods are closed forms; the disk's size law is a Chebyshev interpolant of
      // quadratures (about 1e-13 in ln V): all agree to 1e-12 relative (measured: 1.5e-14 at worst).
      const tol = 1e-12;
      expect(relativeError(fit.shape, r.shapeFloat)).toBeLessThan(tol);
      expect(relativeError(fit.materialScale, r.materialScaleFloat)).toBeLessThan(tol);
      expect(relativeError(fit.commonShape, r.commonShape)).toBeLessThan(1e-12);
      fit.groups.forEach((g, k) => {
        expect(relativeError(g.impliedScale, r.impliedScale[k])).toBeLessThan(tol);
        expect(relativeError(g.effectiveSize, r.effectiveSize[k])).toBeLessThan(tol);
        expect(relativeError(g.ownShape!, r.own[k].shape)).toBeLessThan(1e-12);
        expect(relativeError(g.ownScale!, r.own[k].scale)).toBeLessThan(1e-12);
      });
      expect(relativeError(fit.logLikelihood.pooled, r.logLikelihood.pooled)).toBeLessThan(1e-12);
      expect(relativeError(fit.logLikelihood.commonModulus, r.logLikelihood.commonModulus)).toBeLessThan(1e-12);
      // The statistics are differences of log-likelihoods near -100: compare absolutely (measured: 1e-12 at worst).
      expect(Math.abs(fit.oneModulusStatistic! - r.oneModulusStatistic)).toBeLessThan(5e-12);
      expect(Math.abs(fit.sizeEffectStatistic - r.sizeEffectStatistic)).toBeLessThan(5e-12);
    });
  }

  it("a censored specimen counts in the sums but not as a failure (competing population)", () => {
    const c = ref.cases.find((x: any) => x.groups.some((g: any) => g.censored.includes(true)));
    const fit = fitMaterial({ groups: groupsOf(c) });
    expect(fit.censored).toBe(true);
    expect(fit.groups[0].failures).toBeLessThan(fit.groups[0].specimens);
    // The simulation needs a model of the competing population, which the fit does not have.
    expect(() => simulateMaterialFit({ fit, laws: groupsOf(c).map((g: any) => g.law) })).toThrow(/complete samples/);
  });
});

describe("MATERIALFIT p-values and bounds against the generator's independent Monte Carlo", () => {
  for (const c of ref.cases.filter((x: any) => x.monteCarlo)) {
    it(c.name, () => {
      const groups = groupsOf(c);
      const fit = fitMaterial({ groups });
      const sim = simulateMaterialFit({ fit, laws: groups.map((g: any) => g.law) });
      const mc = c.monteCarlo;
      expect(sim.replications).toBe(2000);
      // Two independent binomial estimates of one probability: 4 standard errors of their difference.
      for (const [ts, py] of [
        [sim.oneModulusP, mc.oneModulusP],
        [sim.sizeEffectP, mc.sizeEffectP],
      ]) {
        const p = Math.max(py, 1 / mc.replications);
        const se = Math.sqrt(p * (1 - p) * (1 / sim.replications + 1 / mc.replications));
        expect(Math.abs(ts - py)).toBeLessThan(4 * se + 1e-3);
      }
      // Bounds from the 5 % and 95 % quantiles of two simulations of 2000-3000 draws: about 2 % apart at most.
      expect(relativeError(sim.shapeBounds.lower, mc.shapeBounds[0])).toBeLessThan(0.03);
      expect(relativeError(sim.shapeBounds.upper, mc.shapeBounds[1])).toBeLessThan(0.03);
      expect(relativeError(sim.scaleBounds.lower, mc.scaleBounds[0])).toBeLessThan(0.02);
      expect(relativeError(sim.scaleBounds.upper, mc.scaleBounds[1])).toBeLessThan(0.02);
      expect(sim.shapeBounds.lower).toBeLessThan(fit.shape);
      expect(sim.shapeBounds.upper).toBeGreaterThan(fit.shape);
    }, 60_000);
  }

  it("the size-effect check rejects data whose two sizes share one characteristic strength", () => {
    const c = ref.cases.find((x: any) => x.truth.charStrength);
    const groups = groupsOf(c);
    const sim = simulateMaterialFit({ fit: fitMaterial({ groups }), laws: groups.map((g: any) => g.law) });
    expect(sim.sizeEffectP).toBeLessThan(0.01);
    // ... and the table's checks row says so, with its basis.
    expect(materialFitCaution(sim)).toMatch(/^CAUTION: the size effect fails \(p = [0-9.e-]+ < 0.05\)/);
  }, 60_000);

  it("gives the same numbers on every run (seeded)", () => {
    const c = ref.cases[0];
    const groups = groupsOf(c);
    const fit = fitMaterial({ groups });
    const laws = groups.map((g: any) => g.law);
    const a = simulateMaterialFit({ fit, laws, replications: 300 });
    const b = simulateMaterialFit({ fit, laws, replications: 300 });
    expect(a).toEqual(b);
  }, 60_000);
});

describe("configurations: presets and the dimension syntax", () => {
  it("a preset and its description by dimensions give one geometry", () => {
    expect(parseConfiguration("C1161-B-4PT")).toEqual(parseConfiguration("BAR 40/20 4x3"));
    expect(parseConfiguration("bar 40 / 20  4 x 3")).toEqual(parseConfiguration("BAR 40/20 4x3"));
    expect(parseConfiguration("C1499-20/10")).toEqual(parseConfiguration("RING 10/20 25x1"));
    expect(parseConfiguration("ISO6872-P3B")).toEqual(parseConfiguration("PISTON 1.4/10 14x1.2"));
  });

  it("a decimal comma is a decimal point (common practice in continental locales)", () => {
    expect(parseConfiguration("BAR 40/20 4,5x3")).toEqual({ kind: "bar", outerSpan: 40, innerSpan: 20, width: 4.5, depth: 3 });
  });

  it("rejects malformed descriptions with the syntax in the message", () => {
    for (const text of ["BAR 40 20 4x3", "BAR 40/20 4", "ROD 40/20", "RING 10/20 25x1x2", "BEAM 40/20 4x3", "BAR 40/20 fourx3", ""]) {
      let error: unknown;
      try {
        parseConfiguration(text);
      } catch (e) {
        error = e;
      }
      expect(error, text).toBeInstanceOf(InputError);
      expect((error as InputError).kind).toBe("input");
    }
  });

  it("a disk needs Poisson's ratio, and its thickness for volume flaws", () => {
    expect(() => sizeLaw({ geometry: parseConfiguration("RING 10/20 25x1"), flaws: "volume" })).toThrow(/Poisson/);
    expect(() => sizeLaw({ geometry: parseConfiguration("RING 10/20 25"), flaws: "volume", poisson: 0.25 })).toThrow(/thickness/);
    expect(() => sizeLaw({ geometry: parseConfiguration("RING 10/20 25"), flaws: "surface", poisson: 0.25 })).not.toThrow();
  });
});

describe("bad input to the pooled fit", () => {
  const law = sizeLaw({ geometry: parseConfiguration("C1161-B-4PT"), flaws: "volume" });
  const law2 = sizeLaw({ geometry: parseConfiguration("C1161-A-4PT"), flaws: "volume" });
  it("one configuration, one failure in a group, equal strengths everywhere", () => {
    expect(() => fitMaterial({ groups: [{ label: "B", law, strengths: [1, 2, 3] }] })).toThrow(/two configurations/);
    expect(() =>
      fitMaterial({ groups: [{ label: "B", law, strengths: [1, 2, 3] }, { label: "A", law: law2, strengths: [4] }] }),
    ).toThrow(/two failures/);
    expect(() =>
      fitMaterial({ groups: [{ label: "B", law, strengths: [3, 3, 3] }, { label: "A", law: law2, strengths: [4, 4] }] }),
    ).toThrow(/all failure strengths within each configuration are equal/);
  });

  it("one configuration with tied failures (rounding) has no own fit and no one-modulus check; the pooled fit stands", () => {
    const fit = fitMaterial({ groups: [{ label: "B", law, strengths: [310, 352, 287, 330] }, { label: "A", law: law2, strengths: [400, 400] }] });
    expect(fit.converged).toBe(true);
    expect(fit.groups[1].ownShape).toBeNull();
    expect(fit.groups[1].ownScale).toBeNull();
    expect(fit.oneModulusStatistic).toBeNull();
    expect(fit.shape).toBeGreaterThan(0);
    const sim = simulateMaterialFit({ fit, laws: [law, law2], replications: 200 });
    expect(sim.oneModulusP).toBeNull();
    expect(sim.sizeEffectP).toBeGreaterThan(0);
    expect(materialFitCaution(sim)).toMatch(/one modulus not checked/);
  }, 60_000);
});

describe("the checks row in words", () => {
  it("names each failed check with its p-value and the 5 % level (common practice), and says when none failed", () => {
    expect(materialFitCaution({ oneModulusP: 0.01, sizeEffectP: 0.5 })).toMatch(/^CAUTION: one modulus fails \(p = 0.01 < 0.05\)/);
    expect(materialFitCaution({ oneModulusP: 0.01, sizeEffectP: 0.02 })).toMatch(/one modulus fails .*; the size effect fails \(p = 0.02 < 0.05\)/);
    expect(materialFitCaution({ oneModulusP: 0.05, sizeEffectP: 0.3 })).toMatch(/^no evidence against one modulus \(p = 0.05\); no evidence against the size effect \(p = 0.3\) at the 0.05 level/);
  });
});
