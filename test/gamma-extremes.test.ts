// ln Gamma at the extremes and the Weibull standard deviation at very large
// moduli, in the style of the numerical libraries' special-case tests:
// reference values from mpmath at 80 digits (gamma_extremes.json, written by
// test/fixtures/generate_gamma_extremes.py), special values from C99 lgamma
// (ISO/IEC 9899 Annex F, F.9.5.3: +0 at 1 and 2, +Infinity at 0, negative
// integers and +-Infinity; from memory of the standard's table).
import { describe, expect, it } from "vitest";
import { guarded } from "../functions/registry";
import { logGamma, logGammaRatioTwoOne } from "../src/numeric/gamma";
import { strengthStandardDeviation } from "../src/weibull/distribution";
import { fixture, relativeError } from "./helpers";

const ref = fixture("gamma_extremes.json");

describe("logGamma special values (C99 lgamma)", () => {
  it("NaN gives NaN; +-Infinity, 0, -0 and negative integers give +Infinity; 1 and 2 give +0", () => {
    expect(logGamma(NaN)).toBeNaN();
    expect(logGamma(Infinity)).toBe(Infinity);
    expect(logGamma(-Infinity)).toBe(Infinity);
    expect(logGamma(0)).toBe(Infinity);
    expect(logGamma(-0)).toBe(Infinity);
    for (const n of [-1, -2, -3, -170, -1e15, -Number.MAX_VALUE]) expect(logGamma(n), String(n)).toBe(Infinity);
    expect(Object.is(logGamma(1), 0)).toBe(true);
    expect(Object.is(logGamma(2), 0)).toBe(true);
  });

  it("the largest double overflows ln Gamma to +Infinity (x ln x > 1.8e308), never NaN", () => {
    expect(logGamma(Number.MAX_VALUE)).toBe(Infinity);
    expect(Number.isFinite(logGamma(1e305))).toBe(true);
  });
});

describe("logGamma against mpmath (80 digits)", () => {
  const { x, expected } = ref.logGamma;
  for (let i = 0; i < x.length; i++) {
    // Negative arguments go through the reflection formula, which cancels a few digits.
    const tolerance = x[i] < 0 ? 2e-14 : 2e-15;
    it(`ln Gamma(${x[i]}) = ${expected[i]} to ${tolerance} relative`, () => {
      expect(relativeError(logGamma(x[i]), expected[i])).toBeLessThan(tolerance);
    });
  }
});

describe("standard deviation of strength at very large moduli", () => {
  const { modulus, expected } = ref.stdFactor;
  for (let i = 0; i < modulus.length; i++) {
    it(`m = ${modulus[i]}: sqrt(Gamma(1 + 2/m) - Gamma(1 + 1/m)^2) = ${expected[i]} to 1e-14 relative`, () => {
      expect(relativeError(strengthStandardDeviation({ shape: modulus[i], scale: 1 }), expected[i])).toBeLessThan(1e-14);
    });
  }

  it("the series and the direct difference agree where both are accurate (x = 0.1, the switch-over)", () => {
    const direct = logGamma(1.2) - 2 * logGamma(1.1);
    expect(relativeError(logGammaRatioTwoOne(0.1), direct)).toBeLessThan(1e-14);
    expect(relativeError(logGammaRatioTwoOne(0.1000001), logGamma(1.2000002) - 2 * logGamma(1.1000001))).toBeLessThan(1e-14);
  });

  it("FIT's standard deviation row uses the same accurate factor at a modulus in the tens of thousands", () => {
    // Six strengths within 1e-4 relative of each other give an ML modulus in the tens of thousands, where the
    // difference of two ln Gamma values lost 4.8e-7 relative; the mpmath rows above pin the core function.
    const s = [[400], [400.01], [400.02], [400.005], [400.015], [399.995]];
    const t = guarded.FIT(s, null, null, "MLE-RAW") as unknown[][];
    const value = (label: string) => t.find((row) => row[0] === label)![1] as number;
    const m = value("modulus m");
    expect(m).toBeGreaterThan(10000);
    expect(value("standard deviation of strength")).toBe(strengthStandardDeviation({ shape: m, scale: value("characteristic strength") }));
  });
});
