/**
 * The design check rests on the core's own bound, fit quality and
 * one-population checks, and the plot draws the core's band: a renamed or
 * missing core function fails here (nothing is optional). The reference is
 * the core, called directly (the bounds and tests are checked against the
 * standards' tables and scipy simulations in their own suites).
 */
import { describe, expect, it } from "vitest";
import { runDesignCheck } from "../src/design/design-check";
import { plotData } from "../taskpane/plot/plot-data";
import { fitQuality } from "../src/weibull/anderson-darling";
import { designStressBound } from "../src/weibull/design-stress-bound";
import { singlePopulationChecks } from "../src/weibull/single-population-checks";
import { relativeError } from "./helpers";
import { input, STRENGTHS } from "./taskpane-inputs";

const base = input({ material: { kind: "data", strengths: STRENGTHS, method: "MLE" }, appliedStress: 150, confidence: { level: 0.95, sides: "one-sided" } });

describe("the check forwards to the core", () => {
  it("designs on the core's 95 % one-sided lower bound", () => {
    const r = runDesignCheck(base);
    const want = designStressBound({ strengths: STRENGTHS, survival: 0.9999, confidence: 0.95, sizeRatio: 64 }).lower;
    expect(r.allowableLower!.value).toBe(want);
    expect(r.allowableLower!.value).toBeLessThan(r.allowablePoint.value);
    expect(r.verdict.onLowerBound).toBe(true);
    expect(r.reserveFactor.value).toBe(want / 150);
    expect(r.confidence.boundLabel).toBe("95 % one-sided lower bound");
  });

  it("draws the 90 % two-sided band whose lower edge is that bound, meeting the lower-bound marker", () => {
    const r = runDesignCheck(base);
    const d = plotData(r);
    expect(d.bandLabel).toMatch(/^90 % two-sided band, part size: the lower edge of the 90 % two-sided band is the 95 % one-sided lower bound$/);
    const atTarget = d.band!.find((b) => b.probability === r.targetFailureProbability.value)!;
    expect(relativeError(atTarget.lower, d.designLower!.stress)).toBeLessThan(1e-9);
    // Elsewhere the edges are the core's one-sided bounds at 0.95 and 0.05, at the part's size.
    const mid = d.band![Math.floor(d.band!.length / 2)];
    const at = (c: number) => designStressBound({ strengths: STRENGTHS, survival: 1 - mid.probability, confidence: c, sizeRatio: 64 }).lower;
    expect(mid.lower).toBe(at(0.95));
    expect(relativeError(mid.upper, at(0.05))).toBeLessThan(1e-15);
    expect(mid.lower).toBeLessThan(mid.upper);
  });

  it("reports the core's A* and observed significance, and the one-population checks", () => {
    const r = runDesignCheck(base);
    const q = fitQuality({ strengths: STRENGTHS });
    expect(r.fitQuality).toEqual({ statistic: q.aStar, significance: q.osl });
    const c = singlePopulationChecks({ strengths: STRENGTHS });
    expect(r.populationChecks!.bend?.pValue).toBe(c.bilinear?.pValue);
    expect(r.populationChecks!.lowOutlier?.pValue).toBe(c.lowOutlier?.pValue);
    const ids = r.cautions.map((x) => x.id);
    expect(ids.includes("fit")).toBe(q.osl < 0.05);
    expect(ids).not.toContain("bound");
  });

  it("gives the bound for a censored sample from the core's simulation of its pattern, and no band", () => {
    const censored = STRENGTHS.map((_, i) => i === 2 || i === 7);
    const r = runDesignCheck({ ...base, material: { kind: "data", strengths: STRENGTHS, censored, method: "MLE" } });
    const want = designStressBound({ strengths: STRENGTHS, censored, survival: 0.9999, confidence: 0.95, sizeRatio: 64 }).lower;
    expect(r.allowableLower!.value).toBe(want);
    expect(r.fitQuality).toBeNull();
    expect(plotData(r).band).toBeNull();
    expect(plotData(r).bandMissing).toMatch(/complete samples only/);
  });
});
