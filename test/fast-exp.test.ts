// The table-driven exponential used by the maximum-likelihood fit (src/numeric/exp.ts).
import { describe, expect, it } from "vitest";
import { fastExp } from "../src/numeric/exp";
import { EXP_STEP_HI, EXP_STEP_LO, EXP_TABLE, EXP_TABLE_SIZE } from "../src/numeric/exp-table";
import { SeededRandom } from "../src/numeric/random";
import { fixture } from "./helpers";

interface Reference {
  t: number[];
  expNearest: number[];
  roundingError: number[];
}
// e^t at 60 digits, mpmath 1.3.0 (test/fixtures/generate_fast_exp.py).
const reference = fixture<Reference>("fast_exp.json");

/** Relative error of `value` against the exact e^t, given the nearest double and that double's own relative error. */
function errorAgainstExact(value: number, nearest: number, roundingError: number): number {
  return (value - nearest) / nearest + roundingError;
}

describe("fastExp against e^t at 60 digits (mpmath, test/fixtures/fast_exp.json)", () => {
  it("covers the fast range [-708, 0] and the fallback below it", () => {
    expect(reference.t.length).toBeGreaterThan(2000);
    expect(Math.min(...reference.t)).toBeLessThan(-708);
    expect(reference.t.filter((t) => t >= -708 && t <= 0).length).toBeGreaterThan(2000);
  });

  // Below -708 both functions are Math.exp, whose subnormal results carry fewer digits (tested below).
  const fast = reference.t.map((t, i) => i).filter((i) => reference.t[i] >= -708);

  it("is within 2e-16 relative of the exact value at every reference point in [-708, 0] (about one unit in the last place)", () => {
    let worst = 0;
    for (const i of fast) {
      const error = Math.abs(errorAgainstExact(fastExp(reference.t[i]), reference.expNearest[i], reference.roundingError[i]));
      worst = Math.max(worst, error);
    }
    expect(worst).toBeLessThan(2e-16); // measured worst 1.86e-16 (Math.exp: 1.19e-16)
    // A wrong constant or table entry shows at 1e-15 and beyond; the bound is not vacuous.
    expect(worst).toBeGreaterThan(1e-17);
  });

  it("is as accurate as Math.exp on the same points (mpmath reference)", () => {
    let worstFast = 0;
    let worstNative = 0;
    for (const i of fast) {
      const { expNearest: nearest, roundingError: rounding } = reference;
      worstFast = Math.max(worstFast, Math.abs(errorAgainstExact(fastExp(reference.t[i]), nearest[i], rounding[i])));
      worstNative = Math.max(worstNative, Math.abs(errorAgainstExact(Math.exp(reference.t[i]), nearest[i], rounding[i])));
    }
    // Math.exp per ECMAScript is implementation-approximated; in V8 it is within one unit in the last place.
    expect(worstFast).toBeLessThan(2 * Math.max(worstNative, 1.2e-16));
  });
});

describe("fastExp against Math.exp (ECMAScript; V8's implementation, within 1 ulp of exact)", () => {
  it("agrees to 4e-16 relative at 200,000 seeded points across [-708, 0]", () => {
    const random = new SeededRandom(4711);
    let worst = 0;
    for (let i = 0; i < 200_000; i++) {
      // Dense near 0 (the weights of the strongest specimens) and across the whole range.
      const t = i % 2 ? -708 * random.uniform() : -Math.exp(30 * random.uniform() - 25);
      worst = Math.max(worst, Math.abs(fastExp(t) / Math.exp(t) - 1));
    }
    expect(worst).toBeLessThan(4e-16);
  });
});

describe("fastExp: special values (IEEE 754 and ECMAScript Math.exp)", () => {
  it("e^0 = 1 exactly, for +0 and -0", () => {
    expect(fastExp(0)).toBe(1);
    expect(fastExp(-0)).toBe(1);
  });

  it("NaN gives NaN; -Infinity gives 0; +Infinity gives +Infinity", () => {
    expect(fastExp(NaN)).toBeNaN();
    expect(fastExp(-Infinity)).toBe(0);
    expect(fastExp(Infinity)).toBe(Infinity);
  });

  it("outside [-708, 0] it is Math.exp itself: subnormal results, underflow to 0, positive arguments", () => {
    for (const t of [-708.0000001, -709, -745, -745.1, -745.2, -746, -1e6, 1e-300, 0.5, 1, 709, 709.8, 710]) {
      expect(fastExp(t)).toBe(Math.exp(t));
    }
  });

  it("the smallest subnormal argument rounds e^t to 1 (mpmath: e^-5e-324 = 1 - 5e-324)", () => {
    expect(fastExp(-5e-324)).toBe(1);
  });
});

describe("the generated constants (tools/generate_exp_table.py, mpmath at 60 digits)", () => {
  it("64 table entries, 2^(j/64), increasing from 1 to below 2", () => {
    expect(EXP_TABLE_SIZE).toBe(64);
    expect(EXP_TABLE.length).toBe(64);
    expect(EXP_TABLE[0]).toBe(1);
    // 2^(32/64) = sqrt 2: ECMAScript Math.SQRT2 is the double nearest sqrt 2.
    expect(EXP_TABLE[32]).toBe(Math.SQRT2);
    for (let j = 1; j < 64; j++) expect(EXP_TABLE[j]).toBeGreaterThan(EXP_TABLE[j - 1]);
    expect(EXP_TABLE[63]).toBeLessThan(2);
  });

  it("ln2/64 = HI + LO, HI with 32 significant bits (ECMAScript Math.LN2 is the double nearest ln 2)", () => {
    expect(Math.abs((EXP_STEP_HI + EXP_STEP_LO) * 64 - Math.LN2)).toBeLessThan(1e-16);
    // 32 significant bits: HI * 2^(31 - exponent) is a whole number.
    const exponent = Math.floor(Math.log2(EXP_STEP_HI));
    expect(Number.isInteger(EXP_STEP_HI * 2 ** (31 - exponent))).toBe(true);
    expect(Math.abs(EXP_STEP_LO)).toBeLessThan(EXP_STEP_HI * 2 ** -30);
  });
});
