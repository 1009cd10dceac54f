// Whole-number modulus fast path of the element power kernel (src/size/power-kernel.ts):
// square-and-multiply against a double-double reference computed here, and against the
// table path it replaces for whole-number m.
import { describe, expect, it } from "vitest";
import { MAX_MULTIPLY_SHAPE, ScaledPower, newTotal, totalValue } from "../src/size/power-kernel";

// Double-double arithmetic (Dekker 1971, "A floating-point technique for extending the
// available precision"; Knuth TAOCP vol. 2 sec. 4.2.2 for two-sum): about 106-bit products,
// enough to judge a double result to far below 1e-14.
const SPLIT = 134217729; // 2^27 + 1
function twoProduct(a: number, b: number): [number, number] {
  const p = a * b;
  const ca = SPLIT * a, ah = ca - (ca - a), al = a - ah;
  const cb = SPLIT * b, bh = cb - (cb - b), bl = b - bh;
  return [p, ah * bh - p + ah * bl + al * bh + al * bl];
}
function twoSum(a: number, b: number): [number, number] {
  const s = a + b;
  const v = s - a;
  return [s, a - (s - v) + (b - v)];
}
type DD = [number, number];
function ddMul(x: DD, y: DD): DD {
  const [p, e] = twoProduct(x[0], y[0]);
  return twoSum(p, e + x[0] * y[1] + x[1] * y[0]);
}
function ddAdd(x: DD, y: DD): DD {
  const [s, e] = twoSum(x[0], y[0]);
  return twoSum(s, e + x[1] + y[1]);
}
/** x / ref as a double-double: the quotient plus its exact remainder / ref. */
function ddQuotient(x: number, ref: number): DD {
  const q = x / ref;
  const [p, e] = twoProduct(q, ref);
  return twoSum(q, (x - p - e) / ref);
}
/** (x/ref)^m by m - 1 plain double-double multiplications: no shared code with the kernel. */
function referencePower(x: number, ref: number, m: number): DD {
  const r = ddQuotient(x, ref);
  let out: DD = r;
  for (let k = 1; k < m; k++) out = ddMul(out, r);
  return out;
}
const relativeError = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

function lcg(seed: number): () => number {
  return () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
}

describe("power kernel, whole-number modulus (repeated multiplication)", () => {
  it("each power agrees with a double-double reference to 1e-14 for m = 1 ... 40", () => {
    const rnd = lcg(11);
    const ref = 517.3;
    for (let m = 1; m <= MAX_MULTIPLY_SHAPE; m++) {
      const k = new ScaledPower(m, ref);
      let worst = 0;
      for (let i = 0; i < 400; i++) {
        const x = ref * Math.exp(-rnd() * 8);
        const exact = referencePower(x, ref, m);
        if (exact[0] > 1e-290) worst = Math.max(worst, relativeError(k.of(x), exact[0] + exact[1]));
      }
      // Bound (2m + log2 m + 1) 2^-53 from the kernel's comment (error analysis of
      // square-and-multiply, common practice); 1e-14 is the promise.
      expect(worst, `m = ${m}`).toBeLessThan(Math.min(1e-14, (2 * m + Math.log2(m) + 1) * 2 ** -53));
      expect(k.of(ref)).toBe(1);
    }
  });

  it("PIA sums over 3 principal stresses match a compensated double-double sum and the table path to 1e-14", () => {
    const rnd = lcg(29);
    const rows = 5000;
    const ref = 800;
    const values = new Float64Array(rows * 3);
    const sizes = new Float64Array(rows);
    for (let i = 0; i < rows; i++) {
      sizes[i] = 0.01 + rnd();
      // One compressive principal stress in four: the PIA sum skips it.
      for (let j = 0; j < 3; j++) values[3 * i + j] = (rnd() < 0.25 ? -1 : 1) * ref * rnd();
    }
    values[0] = ref; // the peak itself
    for (const m of [1, 2, 5, 10, 17, 30, 40]) {
      let exact: DD = [0, 0];
      for (let i = 0; i < rows; i++) {
        let intensity: DD = [0, 0];
        for (let j = 0; j < 3; j++) {
          const x = values[3 * i + j];
          if (x > 0) intensity = ddAdd(intensity, referencePower(x, ref, m));
        }
        exact = ddAdd(exact, ddMul(intensity, [sizes[i], 0]));
      }
      const fast = newTotal();
      new ScaledPower(m, ref).sumRows(values, 3, sizes, 0, rows, "PIA", fast);
      const tables = newTotal();
      new ScaledPower(m, ref, { multiply: false }).sumRows(values, 3, sizes, 0, rows, "PIA", tables);
      expect(relativeError(totalValue(fast), exact[0] + exact[1]), `m = ${m}`).toBeLessThan(1e-14);
      expect(relativeError(totalValue(fast), totalValue(tables)), `m = ${m}`).toBeLessThan(1e-14);
    }
  });

  it("batches and hot-spot visits are the same as one call on the table path", () => {
    const rnd = lcg(3);
    const rows = 1000;
    const values = new Float64Array(rows);
    const sizes = new Float64Array(rows).fill(1);
    for (let i = 0; i < rows; i++) values[i] = 100 * rnd();
    const visits = (kernel: ScaledPower) => {
      const seen: number[] = [];
      const total = newTotal();
      for (let start = 0; start < rows; start += 128) {
        kernel.sumRows(values, 1, sizes, start, Math.min(rows, start + 128), "PIA", total, (row) => seen.push(row), () => 0.5);
      }
      return { seen, value: totalValue(total) };
    };
    const fast = visits(new ScaledPower(12, 100));
    const tables = visits(new ScaledPower(12, 100, { multiply: false }));
    expect(fast.seen).toEqual(tables.seen);
    expect(fast.seen.length).toBeGreaterThan(0);
    expect(relativeError(fast.value, tables.value)).toBeLessThan(1e-14);
  });

  it("rows of three principal stresses (their own loop): the same visits and sum as the table path", () => {
    const rnd = lcg(5);
    const rows = 1000;
    const values = new Float64Array(rows * 3);
    const sizes = new Float64Array(rows);
    for (let i = 0; i < rows * 3; i++) values[i] = 100 * (rnd() - 0.3); // about a third compressive
    for (let i = 0; i < rows; i++) sizes[i] = 0.5 + rnd();
    values.fill(-5, 30, 33); // a row wholly in compression: term 0, never visited
    const visits = (kernel: ScaledPower) => {
      const seen: number[] = [];
      const total = newTotal();
      for (let start = 0; start < rows; start += 100) {
        kernel.sumRows(values, 3, sizes, start, Math.min(rows, start + 100), "PIA", total, (row) => seen.push(row), () => 0);
      }
      return { seen, value: totalValue(total) };
    };
    const fast = visits(new ScaledPower(7, 70));
    const tables = visits(new ScaledPower(7, 70, { multiply: false }));
    expect(fast.seen).toEqual(tables.seen);
    expect(fast.seen).not.toContain(10);
    expect(relativeError(fast.value, tables.value)).toBeLessThan(1e-14);
  });

  it("non-integer and large moduli keep the table path (results unchanged by the option)", () => {
    for (const m of [10.5, MAX_MULTIPLY_SHAPE + 1, 200]) {
      expect(new ScaledPower(m, 3).of(2.2)).toBe(new ScaledPower(m, 3, { multiply: false }).of(2.2));
    }
    // A whole-number modulus does take the other path (this guards the option itself).
    const x = 2.2;
    let differs = false;
    for (let m = 2; m <= 40 && !differs; m++) {
      const r = 3 + m * 1e-3;
      differs = new ScaledPower(m, r).of(x) !== new ScaledPower(m, r, { multiply: false }).of(x);
    }
    expect(differs).toBe(true);
  });

  it("rows of three clip compression without a branch, bit for bit as x > 0 ? x / ref : 0 would", () => {
    // The loop computes (x + |x|) / (2 ref). IEEE 754 doubling is exact, so for x > 0 the quotient
    // and its rounding are those of x / ref; -0, negatives and subnormals are the edge cases.
    const values = new Float64Array([
      -0, 0, 5e-324, // signed zero and the smallest subnormal
      -3, 2.5e-310, 99.75, // negative, subnormal, ordinary
      1e-20, -1e-300, 70, // tiny, tiny negative, the reference itself
      33.3, 33.3, -33.3,
    ]);
    const sizes = new Float64Array([1, 0.5, 2, 1e-3]);
    const ref = 70;
    for (const m of [1, 2, 7, 10, 40]) {
      const kernel = new ScaledPower(m, ref);
      const fast = newTotal();
      kernel.sumRows(values, 3, sizes, 0, 4, "PIA", fast);
      // The same sum written the plain way: one value at a time through of(), which divides x / ref.
      let sum = 0;
      let comp = 0;
      for (let row = 0; row < 4; row++) {
        const term = (kernel.of(values[3 * row]) + kernel.of(values[3 * row + 1]) + kernel.of(values[3 * row + 2])) * sizes[row];
        const [t, e] = twoSum(sum, term);
        comp += e;
        sum = t;
      }
      expect(fast.sum, `m = ${m}`).toBe(sum);
      expect(fast.compensation, `m = ${m}`).toBe(comp);
    }
  });

  it("a reference above 2^1022 (twice it would overflow) leaves the multiplication path and stays right", () => {
    const ref = 1.5e308;
    const values = new Float64Array([ref, 0.5 * ref, -ref]);
    const total = newTotal();
    new ScaledPower(4, ref).sumRows(values, 3, new Float64Array([2]), 0, 1, "PIA", total);
    // On the multiplication path 2 * ref would be Infinity and every term 0.
    expect(relativeError(totalValue(total), 2 * (1 + 0.0625))).toBeLessThan(1e-15);
  });
});
