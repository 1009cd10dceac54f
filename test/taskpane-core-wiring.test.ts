/**
 * The form's plug-ins for confidence bounds, fit quality and the
 * one-population checks forward to the core unchanged (the core's bounds and
 * tests are checked against the standards' tables and scipy simulations in
 * their own suites; here the reference is the core, called directly).
 */
import { describe, expect, it } from "vitest";
import { runDesignCheck } from "../taskpane/app/check";
import { cautionsFor } from "../taskpane/app/cautions";
import { optionalCore } from "../taskpane/app/optional-core";
import { plotData } from "../taskpane/plot/plot-data";
import { fitQuality } from "../src/weibull/anderson-darling";
import { designStressBound } from "../src/weibull/design-stress-bound";
import { singlePopulationChecks } from "../src/weibull/single-population-checks";

// Invented data (no real material): 15 strengths in MPa.
const STRENGTHS = [412.5, 398.1, 455.0, 430.2, 377.9, 441.7, 405.3, 468.4, 421.0, 389.6, 436.8, 447.2, 415.9, 401.4, 459.3];

const base = {
  material: { kind: "data" as const, strengths: STRENGTHS, method: "MLE" as const, source: { kind: "pasted" as const } },
  stressUnit: "MPa",
  confidence: 0.9,
  flaws: "volume" as const,
  sizeUnit: "mm³",
  criterion: "PIA" as const,
  specimen: { kind: "typed" as const, effectiveSize: 12.5 },
  part: { kind: "typed" as const, effectiveSize: 800 },
  requirement: { kind: "survival" as const, survival: 0.9999 },
  appliedStress: 150,
  lotSize: 5000,
  lifetime: null,
  proof: null,
};

describe("the build's plug-ins forward to the core", () => {
  it("has all three", () => {
    expect(optionalCore.designStressLowerBound).toBeTypeOf("function");
    expect(optionalCore.fitQuality).toBeTypeOf("function");
    expect(optionalCore.populationChecks).toBeTypeOf("function");
  });

  it("designs on the core's lower bound and draws the band from it", () => {
    const r = runDesignCheck(base);
    const want = designStressBound({ strengths: STRENGTHS, survival: 0.9999, confidence: 0.9, sizeRatio: 64 }).lower;
    expect(r.allowableLower!.value).toBe(want);
    expect(r.allowableLower!.value).toBeLessThan(r.allowablePoint.value);
    expect(r.verdict.onLowerBound).toBe(true);
    expect(r.margin.value).toBe(want / 150);
    const band = plotData(r).band!;
    const mid = band[Math.floor(band.length / 2)];
    expect(mid.lower).toBe(designStressBound({ strengths: STRENGTHS, survival: 1 - mid.probability, confidence: 0.95, sizeRatio: 1 }).lower);
    expect(mid.lower).toBeLessThan(mid.upper);
  });

  it("reports the core's A* and observed significance, and the one-population checks", () => {
    const r = runDesignCheck(base);
    const q = fitQuality({ strengths: STRENGTHS });
    expect(r.fitQuality).toEqual({ statistic: q.aStar, significance: q.osl });
    const c = singlePopulationChecks({ strengths: STRENGTHS });
    expect(r.populationChecks!.bend?.pValue).toBe(c.bilinear?.pValue);
    expect(r.populationChecks!.lowOutlier?.pValue).toBe(c.lowOutlier?.pValue);
    const ids = cautionsFor(r).map((x) => x.id);
    expect(ids.includes("fit")).toBe(q.osl < 0.05);
    expect(ids).not.toContain("bound");
  });

  it("gives the bound for a censored sample from the core's simulation of its pattern", () => {
    const censored = STRENGTHS.map((_, i) => i === 2 || i === 7);
    const r = runDesignCheck({ ...base, material: { ...base.material, censored } });
    const want = designStressBound({ strengths: STRENGTHS, censored, survival: 0.9999, confidence: 0.9, sizeRatio: 64 }).lower;
    expect(r.allowableLower!.value).toBe(want);
    expect(r.fitQuality).toBeNull();
    expect(plotData(r).band).toBeNull();
  });
});
