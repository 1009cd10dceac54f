/**
 * (x / reference)^m for millions of stresses, fast and to about 1e-15.
 *
 * Math.pow costs 50-100 ns in V8, too slow for the risk sum over a
 * million-element table. We split x = 2^e f (f in [1, 2)) straight from its
 * IEEE-754 bits and use
 *   (x/ref)^m = T[e] * F[i] * (1 + d)^m,
 * with T[e] = (2^e/ref)^m for every binary exponent, F[i] = f_i^m on a grid
 * of 2^j mantissa steps (f_i = 1 + i 2^-j), and d = (f - f_i)/f_i < 2^-j.
 * (1 + d)^m is its binomial series to degree 7; j is chosen so the first term
 * left out, |binom(m, 8)| 2^(-8j), stays below 1e-17 (for large m that is
 * about (m 2^-j)^8 / 8!; for small non-integer m the coefficients decay slowly,
 * so d itself must be small). The tables cost a few
 * thousand Math.pow calls, once per (modulus, reference). Relative error is
 * a few ulp times max(1, m) (the tables' own rounding), checked against
 * Math.pow in test/size-part.test.ts.
 *
 * Moduli above MAX_TABLE_SHAPE, big-endian platforms and subnormal inputs
 * fall back to Math.pow.
 *
 * A whole-number modulus up to MAX_MULTIPLY_SHAPE skips the tables: r = x/ref
 * raised by square-and-multiply costs at most 2 log2(m) multiplications, several
 * times faster than the table lookup (three stresses of a row share one loop). Its relative error is below
 * (2m + log2 m + 1) 2^-53: m from the rounding of r, less than m more from the
 * squarings (a rounding in r^(2^j) is raised to the power m / 2^j at most), one
 * per multiplication into the result. Up to the cap that is below 1e-14; above
 * it the tables are more accurate.
 */
import { ensurePositive } from "../errors";

const DEGREE = 7;
const MAX_BITS = 14;
/** Above this modulus the mantissa table would need more than 2^14 entries: Math.pow instead. */
export const MAX_TABLE_SHAPE = 400;
/** Largest whole-number modulus raised by repeated multiplication (error bound above < 1e-14). */
export const MAX_MULTIPLY_SHAPE = 40;
/** Largest reference stress on the multiplication path (twice it must stay finite). */
const MAX_MULTIPLY_REFERENCE = 2 ** 1022;

const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
const TWO32 = 4294967296;
const TWO_M52 = 2 ** -52;
const scratch = new Float64Array(1);
const scratchBits = new Uint32Array(scratch.buffer);

/** Running Neumaier sum that survives across calls (batches of a stream). */
export interface CompensatedTotal {
  sum: number;
  compensation: number;
}

export function newTotal(): CompensatedTotal {
  return { sum: 0, compensation: 0 };
}

export function totalValue(t: CompensatedTotal): number {
  return t.sum + t.compensation;
}

/**
 * The exact rounding error of t = a + b (so a + b = t + error exactly), by
 * Knuth's branch-free TwoSum (TAOCP vol. 2, 4.2.2). Every running sum of the
 * element loops adds it to its compensation (Neumaier's scheme; the same exact
 * error as comparing |a| and |b| first, without that unpredictable branch).
 * V8 inlines it: measured no slower than writing it out in the PIA loop.
 */
export function additionError(a: number, b: number, t: number): number {
  const v = t - a;
  return a - (t - v) + (b - v);
}

export type RowVisitor = (row: number, term: number) => void;

export class ScaledPower {
  readonly shape: number;
  readonly reference: number;
  private readonly useTables: boolean;
  /** Whole-number modulus raised by square-and-multiply instead of the tables. */
  private readonly multiply: boolean;
  private readonly shift: number;
  private readonly mask: number;
  private readonly lowMask: number;
  private readonly mantissa: Float64Array;
  private readonly inverse: Float64Array;
  private readonly exponent: Float64Array;
  private readonly c: Float64Array;

  /** options.multiply false keeps the tables for a whole-number modulus too (to compare the two paths). */
  constructor(shape: number, reference: number, options: { multiply?: boolean } = {}) {
    ensurePositive(shape, "modulus");
    ensurePositive(reference, "reference stress");
    this.shape = shape;
    this.reference = reference;
    // The reference bound keeps 2 * reference finite (see multiplyRowsOfThree).
    this.multiply =
      options.multiply !== false && Number.isInteger(shape) && shape <= MAX_MULTIPLY_SHAPE && reference <= MAX_MULTIPLY_REFERENCE;
    this.useTables = !this.multiply && LITTLE_ENDIAN && shape <= MAX_TABLE_SHAPE;
    let first = 1; // |binom(m, DEGREE + 1)|
    for (let k = 1; k <= DEGREE + 1; k++) first *= Math.abs(shape - k + 1) / k;
    let bits = 4;
    while (bits < MAX_BITS && first * 2 ** (-(DEGREE + 1) * bits) > 1e-17) bits++;
    this.shift = 20 - bits;
    this.mask = (1 << bits) - 1;
    this.lowMask = (1 << this.shift) - 1;
    const steps = this.useTables ? 1 << bits : 0;
    this.mantissa = new Float64Array(steps);
    this.inverse = new Float64Array(steps);
    for (let i = 0; i < steps; i++) {
      const f = 1 + i / steps;
      this.mantissa[i] = Math.pow(f, shape);
      this.inverse[i] = 1 / f;
    }
    this.exponent = new Float64Array(2048);
    if (this.useTables) {
      for (let e = 1; e < 2047; e++) {
        const base = Math.pow(2, e - 1023) / reference;
        // Exponents above the reference's never occur for x <= reference.
        this.exponent[e] = base < 2 ? Math.pow(base, shape) : 0;
      }
    }
    this.c = new Float64Array(DEGREE + 1);
    this.c[0] = 1;
    for (let k = 1; k <= DEGREE; k++) this.c[k] = (this.c[k - 1] * (shape - k + 1)) / k;
  }

  /** (x/reference)^m for x <= reference; 0 for x <= 0. */
  of(x: number): number {
    if (!(x > 0)) return 0;
    if (this.multiply) return integerPower(x / this.reference, this.shape);
    if (!this.useTables) return Math.pow(x / this.reference, this.shape);
    scratch[0] = x;
    const hi = scratchBits[1];
    if (hi < 0x00100000) return Math.pow(x / this.reference, this.shape);
    const i = (hi >>> this.shift) & this.mask;
    const d = ((hi & this.lowMask) * TWO32 + scratchBits[0]) * TWO_M52 * this.inverse[i];
    const c = this.c;
    const series = c[0] + d * (c[1] + d * (c[2] + d * (c[3] + d * (c[4] + d * (c[5] + d * (c[6] + d * c[7]))))));
    return this.exponent[hi >>> 20] * this.mantissa[i] * series;
  }

  /**
   * Adds sum over rows [start, end) of sizes[row] * I(row) to `total`, where
   * I = sum of (s/ref)^m over the row's `stride` tensile values ("PIA"), or
   * the power of the row's largest value ("MAX"). Calls `visit` for every
   * row whose term exceeds `threshold()` (hot-spot tracking); pass null for none.
   * Values and sizes must already be checked finite, sizes >= 0, values <= ref.
   */
  sumRows(
    values: Float64Array,
    stride: number,
    sizes: Float64Array,
    start: number,
    end: number,
    mode: "PIA" | "MAX",
    total: CompensatedTotal,
    visit: RowVisitor | null = null,
    threshold: () => number = () => Infinity,
  ): void {
    if (this.multiply && mode === "PIA") {
      if (stride === 3) multiplyRowsOfThree(values, sizes, start, end, this.shape, this.reference, total, visit, threshold);
      else multiplyRows(values, stride, sizes, start, end, this.shape, this.reference, total, visit, threshold);
      return;
    }
    let sum = total.sum;
    let comp = total.compensation;
    let limit = visit ? threshold() : Infinity;
    if (!this.useTables || mode === "MAX" || (stride !== 1 && stride !== 3)) {
      for (let row = start; row < end; row++) {
        const base = row * stride;
        let intensity = 0;
        if (mode === "MAX") {
          let top = values[base];
          for (let k = 1; k < stride; k++) if (values[base + k] > top) top = values[base + k];
          intensity = this.of(top);
        } else {
          for (let k = 0; k < stride; k++) intensity += this.of(values[base + k]);
        }
        if (intensity > 0) {
          const term = intensity * sizes[row];
          const t = sum + term;
          comp += additionError(sum, term, t);
          sum = t;
          if (term > limit && visit) {
            visit(row, term);
            limit = threshold();
          }
        }
      }
      total.sum = sum;
      total.compensation = comp;
      return;
    }
    // The hot loop: every table and coefficient in a local.
    const bits = new Uint32Array(values.buffer, values.byteOffset, values.length * 2);
    const shift = this.shift;
    const mask = this.mask;
    const lowMask = this.lowMask;
    const mantissa = this.mantissa;
    const inverse = this.inverse;
    const exponent = this.exponent;
    const c = this.c;
    const c0 = c[0], c1 = c[1], c2 = c[2], c3 = c[3], c4 = c[4], c5 = c[5], c6 = c[6], c7 = c[7];
    for (let row = start; row < end; row++) {
      let intensity = 0;
      const word = 2 * row * stride;
      for (let k = 0; k < stride; k++) {
        const w = word + 2 * k;
        const hi = bits[w + 1];
        // Sign bit set: negative or -0; below 0x00100000: zero or subnormal.
        if (hi >= 0x80000000) continue;
        if (hi < 0x00100000) {
          if ((hi | bits[w]) !== 0) intensity += Math.pow(values[row * stride + k] / this.reference, this.shape);
          continue;
        }
        const i = (hi >>> shift) & mask;
        const d = ((hi & lowMask) * TWO32 + bits[w]) * TWO_M52 * inverse[i];
        intensity +=
          exponent[hi >>> 20] * mantissa[i] * (c0 + d * (c1 + d * (c2 + d * (c3 + d * (c4 + d * (c5 + d * (c6 + d * c7)))))));
      }
      if (intensity > 0) {
        const term = intensity * sizes[row];
        const t = sum + term;
        comp += additionError(sum, term, t);
        sum = t;
        if (term > limit && visit) {
          visit(row, term);
          limit = threshold();
        }
      }
    }
    total.sum = sum;
    total.compensation = comp;
  }
}

/**
 * PIA sum over rows of three principal stresses, whole-number m: the three
 * powers share one square-and-multiply loop (three independent multiplication
 * chains the processor overlaps, one loop control), and a compressive stress
 * becomes 0 before the loop instead of branching around it (0^m = 0, so the
 * row's intensity and every rounding are the same as summing the tensile
 * powers alone).
 */
function multiplyRowsOfThree(
  values: Float64Array,
  sizes: Float64Array,
  start: number,
  end: number,
  m: number,
  ref: number,
  total: CompensatedTotal,
  visit: RowVisitor | null,
  threshold: () => number,
): void {
  let sum = total.sum;
  let comp = total.compensation;
  let limit = visit ? threshold() : Infinity;
  const twoRef = 2 * ref;
  for (let row = start; row < end; row++) {
    const base = row * 3;
    const x = values[base];
    const y = values[base + 1];
    const z = values[base + 2];
    // (x + |x|) / 2ref is x / ref for x > 0, bit for bit (doubling is exact, so
    // the quotient and its rounding are the same), and 0 for x <= 0: a tensile
    // clip without a branch, which mispredicts on mixed-sign columns.
    let a = (x + Math.abs(x)) / twoRef;
    let b = (y + Math.abs(y)) / twoRef;
    let c = (z + Math.abs(z)) / twoRef;
    // m's bits low to high: square through the trailing zero bits, start the
    // products at the first set bit (no multiplication by 1), then square and
    // multiply in. Measured 2x faster than one loop testing every bit.
    let e = m;
    while ((e & 1) === 0) {
      a *= a;
      b *= b;
      c *= c;
      e >>>= 1;
    }
    let pa = a;
    let pb = b;
    let pc = c;
    e >>>= 1;
    while (e !== 0) {
      a *= a;
      b *= b;
      c *= c;
      if (e & 1) {
        pa *= a;
        pb *= b;
        pc *= c;
      }
      e >>>= 1;
    }
    const term = (pa + pb + pc) * sizes[row];
    const t = sum + term;
    comp += additionError(sum, term, t);
    sum = t;
    if (term > limit && visit) {
      visit(row, term);
      limit = threshold();
    }
  }
  total.sum = sum;
  total.compensation = comp;
}

/** PIA sum over rows of any stride, whole-number m (one stress column, mostly). */
function multiplyRows(
  values: Float64Array,
  stride: number,
  sizes: Float64Array,
  start: number,
  end: number,
  m: number,
  ref: number,
  total: CompensatedTotal,
  visit: RowVisitor | null,
  threshold: () => number,
): void {
  let sum = total.sum;
  let comp = total.compensation;
  let limit = visit ? threshold() : Infinity;
  for (let row = start; row < end; row++) {
    let intensity = 0;
    const base = row * stride;
    for (let k = 0; k < stride; k++) {
      const x = values[base + k];
      if (x > 0) intensity += integerPower(x / ref, m);
    }
    const term = intensity * sizes[row];
    const t = sum + term;
    comp += additionError(sum, term, t);
    sum = t;
    if (term > limit && visit) {
      visit(row, term);
      limit = threshold();
    }
  }
  total.sum = sum;
  total.compensation = comp;
}

/** r^m for a whole number m >= 1 by square-and-multiply (m's bits, low to high; as in multiplyRowsOfThree). */
function integerPower(r: number, m: number): number {
  let power = r;
  let e = m;
  while ((e & 1) === 0) {
    power *= power;
    e >>>= 1;
  }
  let result = power;
  e >>>= 1;
  while (e !== 0) {
    power *= power;
    if (e & 1) result *= power;
    e >>>= 1;
  }
  return result;
}
