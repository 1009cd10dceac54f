// Two failures: the unbiased ML modulus does not exist (E[m_hat/m] is infinite
// at N = 2), but the ML characteristic strength and the raw ML modulus do.
// References: the 40-digit mpmath ML solutions in weibull_fits.json
// (test/fixtures/generate_weibull_fits.py), complete n = 2 sets and the
// censored set with two failures.
import { describe, expect, it } from "vitest";
import { isCellFailure } from "../functions/cells";
import { guarded } from "../functions/registry";
import { fixture, relativeError } from "./helpers";

const sets = fixture("weibull_fits.json").datasets.filter(
  (d: any) => d.strengths.length - (d.censored ?? []).filter(Boolean).length === 2,
);
const column = (xs: readonly unknown[]) => xs.map((x) => [x]);

describe("two failures", () => {
  it("the fixture has complete and censored two-failure sets", () => {
    expect(sets.filter((d: any) => !d.censored?.some(Boolean)).length).toBeGreaterThanOrEqual(5);
    expect(sets.filter((d: any) => d.censored?.some(Boolean)).length).toBeGreaterThanOrEqual(1);
  });

  for (const d of sets) {
    const flags = d.censored ? column(d.censored) : null;
    it(`${d.id}: CHARSTRENGTH (default "MLE") is the ML characteristic strength`, () => {
      const r = guarded.CHARSTRENGTH(column(d.strengths), flags);
      expect(typeof r).toBe("number");
      expect(relativeError(r as number, d.ml.scaleFloat)).toBeLessThan(1e-12);
    });

    it(`${d.id}: FIT gives the raw ML modulus and says why it is not unbiased`, () => {
      const t = guarded.FIT(column(d.strengths), flags) as unknown[][];
      expect(Array.isArray(t)).toBe(true);
      const modulusRow = t.find((row) => String(row[0]).startsWith("modulus m"))!;
      expect(modulusRow[0]).toMatch(/not unbiased: no unbiasing factor exists at 2 failures/);
      expect(relativeError(modulusRow[1] as number, d.ml.shapeFloat)).toBeLessThan(1e-12);
      expect(t.find((row) => row[0] === "unbiasing factor")![1]).toMatch(/infinite/);
      expect(relativeError(t.find((row) => row[0] === "characteristic strength")![1] as number, d.ml.scaleFloat)).toBeLessThan(1e-12);
    });

    it(`${d.id}: MODULUS with the default method does not apply (#N/A, pointing to "MLE-RAW")`, () => {
      const r = guarded.MODULUS(column(d.strengths), flags);
      expect(isCellFailure(r) && r.cellError).toBe("#N/A");
      expect(isCellFailure(r) && r.message).toMatch(/MLE-RAW/);
      expect(relativeError(guarded.MODULUS(column(d.strengths), flags, "MLE-RAW") as number, d.ml.shapeFloat)).toBeLessThan(1e-12);
    });
  }
});
