/**
 * A "lower" confidence bound above the point estimate: at a low confidence
 * (50-70 % one-sided) on a small sample, whose point estimate carries the
 * unbiasing factor, the bound the verdict rests on is the less cautious
 * number, so a stress the point estimate fails can pass on the bound. The
 * verdict keeps resting on the bound (the project's rule), and a warning
 * says so in every output form.
 *
 * Reference: the point estimate of typed parameters is the Weibull quantile
 * s = sigma_theta (-ln S / k)^(1/m) (ASTM C1239 sec. 3; docs/methods.md
 * section 1), written out below. All values are invented.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { checkJson, checkText } from "../cli/check-command";
import type { CheckDescription } from "../src/design/check-description";
import { parseCheckFile } from "../src/design/check-file";
import { runDesignCheck } from "../src/design/design-check";
import { input } from "./taskpane-inputs";

function typedCheck(level: number, appliedStress: number): CheckDescription {
  return input({
    material: { kind: "typed", shape: 10, scale: 400, specimens: 3, unbiased: true },
    confidence: { level, sides: "one-sided" },
    specimen: { kind: "typed", effectiveSize: 10 },
    part: { kind: "typed", effectiveSize: 10 },
    appliedStress,
  });
}

// Weibull quantile at S = 0.9999, m = 10, sigma_theta = 400 MPa, k = 1 (ASTM C1239 sec. 3).
const POINT = 400 * (-Math.log(0.9999)) ** (1 / 10);

describe("a lower bound above the point estimate", () => {
  it("at 50 % one-sided on 3 specimens: the verdict rests on the bound and a warning says it is the less cautious number", () => {
    const probe = runDesignCheck(typedCheck(0.5, 100));
    expect(probe.allowablePoint.value).toBeCloseTo(POINT, 10);
    const bound = probe.allowableLower!.value;
    expect(bound).toBeGreaterThan(POINT); // the case under test

    // Between the two: the point estimate would fail it, the bound passes it.
    const r = runDesignCheck(typedCheck(0.5, (POINT + bound) / 2));
    expect(r.verdict.pass).toBe(true);
    expect(r.verdict.onLowerBound).toBe(true);
    expect(r.verdict.text).toMatch(/\(50 % one-sided lower bound; point estimate \S+ MPa shown beside, not used; /);
    const caution = r.cautions.find((c) => c.id === "bound-above-estimate");
    expect(caution?.level).toBe("warning");
    expect(caution!.text).toMatch(/^The 50 % one-sided lower bound on the inert allowable stress, \S+ MPa, lies above its point estimate, \S+ MPa/);
    expect(checkText(r)).toContain(`Warning: ${caution!.text}`);
    expect((checkJson(r) as { cautions: { id: string }[] }).cautions.map((c) => c.id)).toContain("bound-above-estimate");
  });

  it("the hostile file: applied 180 MPa, above the point estimate and below the 50 % bound, passes with the warning", () => {
    const r = runDesignCheck(parseCheckFile(readFileSync("test/fixtures/hostile/check-bound-above-estimate.check.json", "utf8")));
    expect(POINT).toBeLessThan(180);
    expect(r.allowablePoint.value).toBeCloseTo(POINT, 10);
    expect(r.allowableLower!.value).toBeGreaterThan(180);
    expect(r.verdict.pass).toBe(true);
    expect(r.cautions.find((c) => c.id === "bound-above-estimate")?.level).toBe("warning");
  });

  it("at 95 % one-sided the bound lies below the point estimate and no such warning is given", () => {
    const r = runDesignCheck(typedCheck(0.95, 100));
    expect(r.allowableLower!.value).toBeLessThan(POINT);
    expect(r.cautions.map((c) => c.id)).not.toContain("bound-above-estimate");
  });
});

describe("a low confidence level", () => {
  // 90-95 % one-sided is the usual level for a design allowable (common practice); below 90 % a warning says so.
  const level = (oneSided: number, specimens = 30) =>
    runDesignCheck(
      input({
        material: { kind: "typed", shape: 10, scale: 400, specimens, unbiased: true },
        confidence: { level: oneSided, sides: "one-sided" },
        specimen: { kind: "typed", effectiveSize: 10 },
        part: { kind: "typed", effectiveSize: 10 },
        appliedStress: 100,
      }),
    );

  it("at 80 % one-sided on 30 specimens (a bound below the estimate) warns that one sample in five falls below it", () => {
    const r = level(0.8);
    expect(r.allowableLower!.value).toBeLessThan(r.allowablePoint.value);
    const c = r.cautions.find((x) => x.id === "low-confidence");
    expect(c?.level).toBe("warning");
    expect(c!.text).toMatch(/^The verdict rests on the 80 % one-sided lower bound: the true allowable lies below a bound at this level in 20 % of samples/);
    expect(c!.text).not.toMatch(/no width/);
    expect(checkText(r)).toContain(`Warning: ${c!.text}`);
  });

  it("at 50 % one-sided it adds that the plot's band has no width (2 x 0.5 - 1 = 0 two-sided)", () => {
    const r = level(0.5);
    expect(r.confidence.twoSided).toBe(0);
    expect(r.cautions.find((x) => x.id === "low-confidence")!.text).toMatch(/\(the plot's two-sided band has no width\)/);
  });

  it("at 90 % and 95 % one-sided, and with no bound at all, there is no such warning", () => {
    for (const oneSided of [0.9, 0.95]) expect(level(oneSided).cautions.map((x) => x.id)).not.toContain("low-confidence");
    const unbounded = runDesignCheck(
      input({ material: { kind: "typed", shape: 10, scale: 400 }, confidence: { level: 0.5, sides: "one-sided" }, appliedStress: 100 }),
    );
    expect(unbounded.allowableLower).toBeNull();
    expect(unbounded.cautions.map((x) => x.id)).not.toContain("low-confidence");
  });
});
