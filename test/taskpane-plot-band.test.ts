/**
 * The plot's confidence band, through taskpane/plot/plot-data.ts: the 90 %
 * two-sided band whose lower edge is the 95 % one-sided lower bound, drawn
 * at the part's size, must pass through the lower-bound marker (the
 * allowable stress the verdict uses) at the allowed failure probability.
 * Reference for the edges: the design-stress bound of the core
 * (src/weibull/design-stress-bound.ts, tested against its pivotal tables and
 * simulations in its own suite), called directly at one-sided 0.95 and 0.05;
 * the pairing 2C - 1 is the definition of a two-sided interval from two
 * one-sided bounds (common practice).
 */
import { describe, expect, it } from "vitest";
import { runDesignCheck } from "../src/design/design-check";
import { designStressBound } from "../src/weibull/design-stress-bound";
import { plotData } from "../taskpane/plot/plot-data";
import { relativeError } from "./helpers";
import { input, STRENGTHS } from "./taskpane-inputs";

describe("the plot's band and the lower-bound marker", () => {
  const r = runDesignCheck(input({ confidence: { level: 0.95, sides: "one-sided" } }));
  const d = plotData(r);
  const target = r.targetFailureProbability.value;

  it("meets the marker: the band's lower edge at the allowed failure probability is the lower-bound allowable", () => {
    expect(d.band).not.toBeNull();
    expect(d.designLower).toEqual({ stress: r.allowableLower!.value, probability: target });
    const at = d.band!.find((b) => b.probability === target);
    expect(at, "the band's grid holds the allowed failure probability").toBeDefined();
    expect(relativeError(at!.lower, d.designLower!.stress)).toBeLessThan(1e-12);
    expect(at!.upper).toBeGreaterThan(r.allowablePoint.value);
  });

  it("is the 90 % two-sided band at the part's size, its edges the 95 % one-sided bounds", () => {
    expect(d.bandLabel).toMatch(/90 % two-sided/);
    expect(d.bandLabel).toMatch(/95 % one-sided lower bound/);
    expect(d.bandSizeRatio).toBe(r.sizeRatio.value);
    for (const b of d.band!.filter((_, i) => i % 6 === 0)) {
      const survival = 1 - b.probability;
      const args = { strengths: STRENGTHS, survival, sizeRatio: r.sizeRatio.value };
      expect(relativeError(b.lower, designStressBound({ ...args, confidence: 0.95 }).lower)).toBeLessThan(1e-12);
      expect(relativeError(b.upper, designStressBound({ ...args, confidence: 0.05 }).lower)).toBeLessThan(1e-12);
    }
  });

  it("draws no band where the inputs carry no uncertainty, and says why", () => {
    const typed = plotData(runDesignCheck(input({ material: { kind: "typed", shape: 12, scale: 430 } })));
    expect(typed.band).toBeNull();
    expect(typed.designLower).toBeNull();
    expect(typed.bandMissing).toMatch(/no confidence band/);
  });
});
