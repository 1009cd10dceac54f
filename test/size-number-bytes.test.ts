// Numbers read straight from bytes (src/size/csv-bytes.ts, decimal-to-double.ts) against Number().
// Reference: ECMA-262, StringToNumber (sec. 7.1.4.1.1) with RoundMVResult: a decimal of 20 or fewer
// significant digits becomes "the Number value for" it, the double nearest to it, ties to even. So
// for up to 19 digits the reader must give exactly Number()'s double, near midpoints included.
// Seeded (Park-Miller), so every run checks the same cases; exact midpoints are built with BigInt.
import { describe, expect, it } from "vitest";
import { fastNumber, fastWholeNumber, parseNumber } from "../src/size/csv-bytes";
import { decimalInto } from "../src/size/decimal-to-double";

const bytes = (s: string) => new TextEncoder().encode(s);

function lcg(seed: number): () => number {
  return () => (seed = (seed * 16807) % 2147483647) / 2147483647;
}

/** decimalInto on a string of significant digits (first digit nonzero, at most 19) and exponent q. */
function direct(digits: string, q: number): number | null {
  const out = new Float64Array(1);
  const first = Number(digits.slice(0, 8) || "0");
  const second = Number(digits.slice(8, 16) || "0");
  const third = Number(digits.slice(16, 19) || "0");
  return decimalInto(first, second, third, digits.length, q, out, 0) ? out[0] : null;
}

/** Both readers on one text: the general one and the fast one (as a comma-delimited field). */
function readBoth(text: string): { general: number; fast: number | null } {
  const b = bytes(text + ",");
  const out = new Float64Array(1);
  const stop = fastNumber(b, 0, b.length, 0x2c, 0x2e, out, 0);
  return { general: parseNumber(b, 0, b.length - 1, -1), fast: stop === b.length - 1 ? out[0] : null };
}

/** The exact midpoint between x > 0 and the next double up, as decimal digits and exponent (BigInt). */
function midpointDigits(x: number): { digits: string; q: number } {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const bits = view.getBigUint64(0);
  const biased = Number(bits >> 52n);
  let mantissa = bits & ((1n << 52n) - 1n);
  if (biased > 0) mantissa |= 1n << 52n;
  const e = (biased > 0 ? biased : 1) - 1075; // x = mantissa 2^e
  const odd = 2n * mantissa + 1n; // midpoint = odd 2^(e-1)
  if (e - 1 >= 0) return { digits: (odd << BigInt(e - 1)).toString(), q: 0 };
  return { digits: (odd * 5n ** BigInt(1 - e)).toString(), q: e - 1 };
}

/**
 * Disagreements with Number(), collected rather than one expect() per case (hundreds of thousands of
 * cases: an expect() each was most of this file's run time); each test then requires none. Same
 * comparison as toBe (Object.is).
 */
function disagreements() {
  const found: string[] = [];
  return {
    same(got: number | null, want: number, text: string) {
      if (!Object.is(got, want)) found.push(`${text}: read ${got}, Number() gives ${want}`);
    },
    /** The first few, with the count, so a failure shows what went wrong. */
    get report(): string[] {
      return found.length ? [`${found.length} disagreements`, ...found.slice(0, 10)] : [];
    },
  };
}

describe("decimal to double, against Number()", () => {
  it("random decimals of 1 to 19 significant digits, exponents -60 to +60: Number()'s double whenever decided", () => {
    const rnd = lcg(2024);
    let undecided = 0;
    const check = disagreements();
    const cases = 200000;
    for (let i = 0; i < cases; i++) {
      const n = 1 + Math.floor(rnd() * 19);
      let digits = String(1 + Math.floor(rnd() * 9));
      for (let k = 1; k < n; k++) digits += Math.floor(rnd() * 10);
      const q = Math.floor(rnd() * 121) - 60;
      const got = direct(digits, q);
      if (got === null) undecided++;
      else check.same(got, Number(`${digits}e${q}`), `${digits}e${q}`);
    }
    expect(check.report).toEqual([]);
    // Undecided (left to Number()): 17 of 200000 when last run, every one a whole number above 2^53
    // exactly midway between two doubles, written with an exponent (such as 159565568039648930e-1).
    expect(undecided).toBeLessThan(cases / 2000);
  });

  it("decimals just below and just above the midpoint between two doubles (17 to 19 digits)", () => {
    const rnd = lcg(77);
    let decided = 0;
    const check = disagreements();
    for (let i = 0; i < 3000; i++) {
      const x = (0.5 + rnd()) * 10 ** (Math.floor(rnd() * 60) - 30);
      const { digits, q } = midpointDigits(x);
      for (const n of [17, 18, 19]) {
        if (digits.length <= n) continue;
        const below = digits.slice(0, n); // truncated: strictly below the midpoint
        const above = (BigInt(below) + 1n).toString(); // strictly above
        for (const d of [below, above]) {
          const e = q + digits.length - n;
          const text = `${d}e${e}`;
          const want = Number(text);
          // 99...9 + 1 may gain a digit: 10...0 with 20 digits is the 19-digit 10...0 times ten.
          const got = d.length > 19 ? direct(d.slice(0, 19), e + 1) : direct(d, e);
          if (got !== null) {
            check.same(got, want, text);
            decided++;
          }
          check.same(readBoth(text).general, want, text);
        }
      }
    }
    expect(check.report).toEqual([]);
    expect(decided).toBeGreaterThan(10000);
  });

  it("exact ties: whole numbers between 2^53 and 2^64 go to the even neighbour", () => {
    const rnd = lcg(5);
    const check = disagreements();
    for (let i = 0; i < 5000; i++) {
      const big = (1n << 53n) + BigInt(Math.floor(rnd() * 2 ** 40)) * (1n << BigInt(Math.floor(rnd() * 11)));
      const text = big.toString();
      check.same(direct(text, 0), Number(text), text);
      check.same(readBoth(text).general, Number(text), text);
    }
    expect(check.report).toEqual([]);
    expect(readBoth("9007199254740993").fast).toBe(9007199254740992); // ties to even (Number("9007199254740993"))
    expect(readBoth("1e23").fast).toBe(1e23);
  });
});

describe("the two byte readers, against Number()", () => {
  it("signs, leading and trailing zeros, exponent forms, 1 to 17 digits: the same double from both readers", () => {
    const rnd = lcg(99);
    const check = disagreements();
    for (let i = 0; i < 15000; i++) {
      const x = (rnd() - 0.3) * 10 ** Math.floor(rnd() * 80 - 40);
      const p = 1 + Math.floor(rnd() * 17);
      const forms = [
        x.toPrecision(p),
        x.toExponential(p - 1),
        x.toExponential(p - 1).toUpperCase(),
        x.toExponential(p - 1).replace("e+", "e"),
        String(x),
        (x >= 0 ? "+" : "") + x.toPrecision(p),
        x.toPrecision(p).replace(/^(-?)/, "$1000"),
      ];
      if (Math.abs(x) < 1e15 && Math.abs(x) > 1e-5) forms.push(x.toFixed(Math.min(20, p + 5)), x.toFixed(Math.min(20, p)) + "000");
      for (const text of forms) {
        const want = Number(text);
        const { general, fast } = readBoth(text);
        check.same(general, want, text);
        if (fast !== null) check.same(fast, want || 0, `${text} (fast reader)`); // the fast reader gives 0 for -0 (see there)
      }
    }
    expect(check.report).toEqual([]);
  });

  it("the fast reader takes every full double as printed (String(x), up to 17 digits) in the usual range", () => {
    const rnd = lcg(3);
    let taken = 0;
    const check = disagreements();
    for (let i = 0; i < 50000; i++) {
      const x = (rnd() - 0.5) * 10 ** Math.floor(rnd() * 40 - 20);
      const { fast } = readBoth(String(x));
      if (fast !== null) {
        check.same(fast, x, String(x));
        taken++;
      }
    }
    // Only exact ties and near-ties may be left to the general reader (none expected in this sample).
    expect(check.report).toEqual([]);
    expect(taken).toBeGreaterThan(49990);
  });

  it("edges: subnormals, the largest double, overflow, more than 19 digits, long zeros", () => {
    for (const text of [
      "4.9e-324",
      "2.4703282292062328e-324",
      "2.2250738585072011e-308",
      "2.2250738585072014e-308",
      "1.7976931348623157e308",
      "1.7976931348623158e308",
      "123456789012345678901234567890",
      "0.1000000000000000000000000000000001",
      "0.000000000000000000000000000000000000001234",
      "1234567890.1234567890",
      "00.12345678901234567890",
      "1" + "0".repeat(30),
      "-0",
      "0e5",
      "+.5",
      "5.",
    ]) {
      const want = Number(text);
      expect(readBoth(text).general, text).toBe(want);
    }
    for (const text of ["1e309", "1.8e308", "-1e400"]) expect(readBoth(text).general, text).toBeNaN(); // not finite: refused
    expect(readBoth("-0").fast).toBe(0); // "-0 reads as 0" (docs/files-and-formats.md), not -0
    expect(readBoth("-0.000").fast).toBe(0);
    // More than 19 significant digits: the fast reader leaves them to the general one.
    expect(readBoth("1.23456789012345678901").fast).toBeNull();
  });

  it("not numbers: both readers refuse, the fast one by leaving the field to the general path", () => {
    for (const text of ["", ".", "-", "+", "e5", "1e", "1e+", "1.2.3", "1,5", "inf", "Infinity", "nan", "NaN", "0x10", "1_000", "--1", "1e1.5", "１２"]) {
      const { general, fast } = readBoth(text);
      expect(general, text).toBeNaN();
      expect(fast, text).toBeNull();
    }
  });

  it("element ids of 1 to 15 digits: the whole-number reader gives Number()'s value, and leaves anything else to fastNumber", () => {
    const rnd = lcg(7);
    const read = (text: string, end = ",") => {
      const b = bytes(text + end);
      const out = new Float64Array(1);
      const stop = fastWholeNumber(b, 0, b.length, 0x2c, out, 0);
      return stop === text.length ? out[0] : null;
    };
    const found = disagreements();
    for (let k = 0; k < 20000; k++) {
      const digits = 1 + Math.floor(rnd() * 15);
      let text = "";
      for (let d = 0; d < digits; d++) text += String(Math.floor(rnd() * 10));
      found.same(read(text), Number(text), text); // leading zeros included ("007" is 7, as Number() reads it)
    }
    expect(found.report).toEqual([]);
    for (const end of ["\n", "\r\n", ""]) expect(read("42", end)).toBe(42);
    // Not whole numbers of at most 15 digits, or not followed by the delimiter: left to fastNumber.
    for (const text of ["", "-1", "+1", "1.0", "1e3", "12a", "1 ", " 1", "1234567890123456"]) expect(read(text), text).toBeNull();
  });
});
