// Results beyond double precision are errors (#NUM! with a message), never a 0
// or an Infinity in a cell. Each true value below is far outside the double
// range; the exponent is worked by hand from the function's formula (common
// practice: log10 of a product is the sum of log10s).
import { describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { guarded } from "../functions/registry";

function expectBeyond(r: CellResult, which: "small" | "large", name: RegExp): void {
  expect(isCellFailure(r), JSON.stringify(r)).toBe(true);
  if (!isCellFailure(r)) return;
  expect(r.cellError).toBe("#NUM!");
  expect(r.message).toMatch(new RegExp(`too ${which} to represent`));
  expect(r.message).toMatch(name);
  expect(r.message).not.toMatch(/NaN|Infinity/);
}

describe("underflow to zero is an error", () => {
  it("SCGBFROMFIT(35.39, 103.98, 3906.5, \"STATIC\"): B = 10^35.39 / 3906.5^101.98 = 10^-330.9, not 0", () => {
    // log10 B = 35.39 - 101.98 log10(3906.5) = 35.39 - 366.29 = -330.9 (true value 1.3e-331).
    expectBeyond(guarded.SCGBFROMFIT(35.39, 103.98, 3906.5, "STATIC"), "small", /B parameter/);
    // The same law one decade of strength lower is representable: 35.39 - 101.98 * 2.59 = -228.9.
    expect(guarded.SCGBFROMFIT(35.39, 103.98, 390.65, "STATIC")).toBeGreaterThan(0);
  });

  it("failure probabilities at a positive stress: (1/400)^200 = 10^-520 (FAILPROB, PROOFBREAKS, COMPETINGFAILPROB, PARTFAILPROB)", () => {
    expectBeyond(guarded.FAILPROB(1, 200, 400), "small", /failure probability/);
    expectBeyond(guarded.PROOFBREAKS(1, 200, 400), "small", /failure probability/);
    expectBeyond(guarded.COMPETINGFAILPROB(1, 200, 400, 300, 500), "small", /failure probability/);
    expectBeyond(guarded.PARTFAILPROB([[1]], [[1]], 200, 400), "small", /failure probability/);
    // Just above the proof stress: 10^-520 times 1 - (1/1.0000001)^200 = 2e-5.
    expectBeyond(guarded.POSTPROOFFAILPROB(1.0000001, 1, 200, 400), "small", /failure probability/);
    // A zero stress, or no tension, is a true zero.
    expect(guarded.FAILPROB(0, 200, 400)).toBe(0);
    expect(guarded.PARTFAILPROB([[-5]], [[1]], 200, 400)).toBe(0);
    expect(guarded.POSTPROOFFAILPROB(1, 1, 200, 400)).toBe(0);
  });

  it("times, stresses and scale parameters", () => {
    // t = s_f^(n+1) / ((n+1) rate s^n) = 1 / (41 * 1e400): 10^-401.6.
    expectBeyond(guarded.TIMETOFAILURE(1e10, 1, 1, 40), "small", /time to failure/);
    // 1e-300 * (1 / 1e10)^(1/0.01) = 10^-1300.
    expectBeyond(guarded.SIZESCALE(1e-300, 0.01, 1, 1e10), "small", /scaled strength/);
    // 1e-300 * (1e-10)^(1/0.01) = 10^-1300.
    expectBeyond(guarded.MATERIALSCALE(1e-300, 0.01, 1e-10), "small", /material scale/);
    // s = 1e-300 (1e-300 / (3.5 * 1e300 * 1e300))^(1/2.5) = 10^-300 * 10^-360.2.
    expectBeyond(guarded.LIFETIMESTRESS(1e-300, 1e300, 2.5, 1e300), "small", /lifetime stress/);
    // B = 2 K^2 / (A Y^2 (n - 2)) = 2e-600 / 1e300: 10^-899.7.
    expectBeyond(guarded.SCGBFROMVELOCITY(3, 1e300, 1e-300, 1), "small", /B parameter/);
  });
});

describe("overflow is an error", () => {
  it("B, a life and a design stress beyond 1.8e308", () => {
    // B = 2 (1e300)^2 / (1e-300 * 1 * 1) = 2e900.
    expectBeyond(guarded.SCGBFROMVELOCITY(3, 1e-300, 1e300, 1), "large", /B parameter/);
    // t = 1e300^201 / (201 * 1e-300 * 1^200): 10^60600.
    expectBeyond(guarded.TIMETOFAILURE(1, 1e300, 1e-300, 200), "large", /time to failure/);
    expectBeyond(guarded.DESIGNSTRESS(1e-300, 0.01, 1e300), "large", /stress/);
  });
});
