/**
 * Crack-growth parameter fits (ASTM C1368 constant stress rate, ASTM C1576
 * static fatigue) and the Student t quantile behind their bounds.
 *
 * References: test/fixtures/crack_growth.json, written by
 * test/fixtures/generate_crack_growth.py (numpy.polyfit, scipy.stats.linregress
 * and scipy.stats.t.ppf; versions recorded in the JSON). The specimen data are
 * invented, drawn with a fixed seed.
 */
import { describe, expect, it } from "vitest";
import { fitStaticFatigue, fitStressRate } from "../src/design/crack-growth-fit";
import { studentQuantile, studentUpperTail } from "../src/numeric/student-t";
import fixture from "./fixtures/crack_growth.json";
import { expectInputError, relativeError } from "./helpers";


describe("Student t quantile", () => {
  it.each(fixture.tQuantiles)("t_$p with $df degrees of freedom matches scipy", ({ df, p, t }) => {
    // source: scipy.stats.t.ppf, test/fixtures/generate_crack_growth.py
    const result = studentQuantile(p, df);
    expect(result.converged).toBe(true);
    expect(relativeError(result.value, t)).toBeLessThan(1e-11);
  });

  it("inverts its own upper tail", () => {
    for (const df of [3, 7, 40]) {
      const t = studentQuantile(0.975, df).value;
      expect(Math.abs(studentUpperTail(t, df) - 0.025)).toBeLessThan(1e-14);
    }
  });

  it("rejects probabilities outside [0.5, 1) and non-positive degrees of freedom", () => {
    expectInputError(() => studentQuantile(1, 5), "input");
    expectInputError(() => studentQuantile(0.4, 5), "input");
    expectInputError(() => studentQuantile(0.9, 0), "input");
  });
});

describe("constant stress-rate fit (ASTM C1368)", () => {
  for (const data of fixture.rateFits) {
    for (const ref of data.fits) {
      it(`${data.name} at ${ref.confidence} matches numpy.polyfit and linregress`, () => {
        // source: numpy.polyfit / scipy.stats.linregress on log10 data, generate_crack_growth.py
        const fit = fitStressRate({
          stressRates: data.stressRates,
          strengths: data.strengths,
          confidence: ref.confidence,
        });
        expect(relativeError(fit.line.slope, ref.slope)).toBeLessThan(1e-11);
        expect(relativeError(fit.line.intercept, ref.intercept)).toBeLessThan(1e-12);
        expect(relativeError(fit.line.slopeStandardError, ref.slopeStdErr)).toBeLessThan(1e-10);
        expect(relativeError(fit.line.rSquared, ref.rSquared)).toBeLessThan(1e-10);
        expect(relativeError(fit.n, ref.n)).toBeLessThan(1e-11);
        expect(relativeError(fit.D, ref.D)).toBeLessThan(1e-11);
        expect(relativeError(fit.nLower, ref.nLower)).toBeLessThan(1e-10);
        if (ref.nUpper === null) expect(fit.nUpper).toBeNull();
        else expect(relativeError(fit.nUpper as number, ref.nUpper)).toBeLessThan(1e-10);
        expect(Math.abs(fit.decades - ref.decades)).toBeLessThan(1e-12);
        expect(fit.narrowSpan).toBe(ref.decades < 3);
        expect(fit.converged).toBe(true);
      });
    }
  }

  it("flags fewer than four rates and fewer than three decades", () => {
    const [wide, narrow] = fixture.rateFits;
    const a = fitStressRate({ stressRates: wide.stressRates, strengths: wide.strengths });
    expect(a.distinctRates).toBe(5);
    expect(a.fewRates).toBe(false);
    expect(a.narrowSpan).toBe(false);
    const b = fitStressRate({ stressRates: narrow.stressRates, strengths: narrow.strengths });
    expect(b.distinctRates).toBe(3);
    expect(b.fewRates).toBe(true);
    expect(b.narrowSpan).toBe(true);
  });

  it("recovers n exactly from noise-free data on the power law", () => {
    // s_f = D sdot^(1/(n+1)) with n = 24, D = 300: from the relation itself (ASTM C1368 model).
    const rates = [0.01, 0.1, 1, 10, 100];
    const strengths = rates.map((r) => 300 * Math.pow(r, 1 / 25));
    const fit = fitStressRate({ stressRates: rates, strengths });
    expect(relativeError(fit.n, 24)).toBeLessThan(1e-12);
    expect(relativeError(fit.D, 300)).toBeLessThan(1e-13);
    expect(relativeError(fit.nLower, 24)).toBeLessThan(1e-9);
    expect(relativeError(fit.nUpper as number, 24)).toBeLessThan(1e-9);
  });

  it("rejects bad data", () => {
    expectInputError(() => fitStressRate({ stressRates: [1, 10], strengths: [100, 110, 120] }), "input");
    expectInputError(() => fitStressRate({ stressRates: [1, 10], strengths: [100, 110] }), "input");
    expectInputError(() => fitStressRate({ stressRates: [1, 0, 100], strengths: [100, 110, 120] }), "input");
    expectInputError(() => fitStressRate({ stressRates: [1, -10, 100], strengths: [100, 110, 120] }), "input");
    expectInputError(() => fitStressRate({ stressRates: [1, 10, 100], strengths: [100, NaN, 120] }), "input");
    expectInputError(() => fitStressRate({ stressRates: [5, 5, 5], strengths: [100, 110, 120] }), "input");
    // Strength falling with rate: no slow crack growth to fit.
    expectInputError(() => fitStressRate({ stressRates: [1, 10, 100], strengths: [120, 110, 100] }), "input");
    expectInputError(
      () => fitStressRate({ stressRates: [1, 10, 100], strengths: [100, 110, 120], confidence: 1 }),
      "input",
    );
  });
});

describe("static fatigue fit (ASTM C1576)", () => {
  for (const data of fixture.staticFits) {
    for (const ref of data.fits) {
      it(`${data.name} at ${ref.confidence} matches numpy.polyfit and linregress`, () => {
        // source: numpy.polyfit / scipy.stats.linregress on log10 data, generate_crack_growth.py
        const fit = fitStaticFatigue({
          stresses: data.stresses,
          lifetimes: data.lifetimes,
          confidence: ref.confidence,
        });
        expect(relativeError(fit.n, ref.n)).toBeLessThan(1e-11);
        expect(relativeError(fit.log10D, ref.log10D)).toBeLessThan(1e-11);
        expect(relativeError(fit.line.slopeStandardError, ref.slopeStdErr)).toBeLessThan(1e-10);
        expect(relativeError(fit.nLower, ref.nLower)).toBeLessThan(1e-10);
        expect(relativeError(fit.nUpper, ref.nUpper)).toBeLessThan(1e-10);
        expect(Math.abs(fit.timeDecades - ref.timeDecades)).toBeLessThan(1e-12);
        expect(fit.converged).toBe(true);
      });
    }
  }

  it("rejects lifetimes that do not fall with stress, and non-positive times", () => {
    expectInputError(() => fitStaticFatigue({ stresses: [50, 60, 70], lifetimes: [10, 100, 1000] }), "input");
    expectInputError(() => fitStaticFatigue({ stresses: [50, 60, 70], lifetimes: [1000, 0, 10] }), "input");
    expectInputError(() => fitStaticFatigue({ stresses: [50, 60], lifetimes: [1000, 100, 10] }), "input");
  });
});
