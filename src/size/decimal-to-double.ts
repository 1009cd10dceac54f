/**
 * The double nearest to a decimal number M x 10^q (ties to even), as Number()
 * gives it, for the digits the element-table reader has gathered from the
 * bytes. M comes as up to three small whole numbers (so that no call passes
 * or returns a boxed double in the hot loop): `first` its first up to 8
 * significant digits, `second` the next up to 8, `third` the next up to 3,
 * and `count` the number of significant digits (at most 19).
 *
 * Where it is exact, and how:
 * - M < 2^53 and |q| <= 22 (every number of up to 15 digits, and 16-digit
 *   ones below 9007199254740992, in the usual exponent range): M and 10^|q|
 *   are exact doubles, so one multiplication or division rounds once, to
 *   nearest (Clinger 1990, "How to read floating point numbers accurately",
 *   the fast path); the same for q up to 37 while M x 10^(q-22) stays an
 *   integer below 2^53. A whole number M of up to 19 digits (q = 0) is
 *   rounded once from its exact double-double form.
 * - Otherwise, for |q| <= 250 (results between about 1e-250 and 1e269, far
 *   from subnormals and overflow): M exactly as a double-double (Knuth's
 *   TwoSum, error-free), times 10^q as a double-double (within 2^-105
 *   relative; exact for q >= 0 up to 44) with Dekker's TwoProduct, gives zh + zl within
 *   2^-102 |x| of the true x. zh, the double nearest zh + zl, is then the
 *   double nearest x unless x lies within 2^-100 |x| of the midpoint between
 *   zh and a neighbour (or zh is a power of two, where the neighbours' spacing
 *   changes). Those cases are rare (about 2^-47 of random 17-digit inputs, plus
 *   decimals built to sit on a midpoint) and return NaN: the caller then reads
 *   the text with Number().
 * - Anything else (|q| > 250, more than 19 significant digits) is not handled
 *   here either: the callers send it to Number() as well.
 * Number() is the reference: ECMAScript 2024, section 7.1.4.1.1
 * (StringToNumber) and 6.1.6.1.13 (Number::toString) round correctly to
 * nearest-even for decimals of up to 20 significant digits.
 */

const POW10 = [
  1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19,
  1e20, 1e21, 1e22,
];
const TWO53 = 9007199254740992;
/** Dekker's splitting constant 2^27 + 1. */
const SPLIT = 134217729;
/** Exponents with a double-double power of ten. */
export const MAX_DECIMAL_EXPONENT = 250;
const TWO_M100 = 2 ** -100;

const scratch = new Float64Array(1);
const scratchBits = new Uint32Array(scratch.buffer);
const HIGH = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;

/**
 * 10^q as th + tl for q in [-250, 250], th also split in two 26-bit halves (Dekker) so the hot
 * path need not split it again. Filled on first use (BigInt arithmetic, some milliseconds: not at
 * start-up); constant arrays, so the hot path loads from them without a check of what they are.
 */
const POWERS = 2 * 250 + 1;
const tenHigh = new Float64Array(POWERS);
const tenLow = new Float64Array(POWERS);
const tenHighTop = new Float64Array(POWERS);
const tenHighBottom = new Float64Array(POWERS);
let powersBuilt = false;
/** Half a unit in the last place of a double with biased exponent E: 2^(E - 1076), E = 1..2046. */
const HALF_ULP = new Float64Array(2048);
for (let e = 54; e < 2047; e++) HALF_ULP[e] = 2 ** (e - 1076);

function buildPowers(): void {
  for (let q = -MAX_DECIMAL_EXPONENT; q <= MAX_DECIMAL_EXPONENT; q++) {
    const k = q + MAX_DECIMAL_EXPONENT;
    if (q >= 0) {
      const exact = 10n ** BigInt(q);
      const h = Number(exact); // BigInt to Number rounds to nearest (ECMAScript 21.1.1.1)
      tenHigh[k] = h;
      tenLow[k] = Number(exact - BigInt(h));
    } else {
      // h = mantissa x 2^-s exactly; 10^q - h = (2^s - mantissa 10^-q) / (10^-q 2^s), to about one ulp of itself.
      const h = Number(`1e${q}`);
      scratch[0] = h;
      const top = scratchBits[HIGH];
      const mantissa = BigInt(((top & 0xfffff) | 0x100000) * 4294967296 + scratchBits[1 - HIGH]);
      const s = 1075 - ((top >>> 20) & 0x7ff);
      const numerator = (1n << BigInt(s)) - mantissa * 10n ** BigInt(-q);
      const denominator = 10n ** BigInt(-q) << BigInt(s);
      // The quotient times 2^(s + 120) (about 2^119 at most, as h is near 2^(52 - s)), truncated, then one
      // rounding to double and an exact power-of-two scaling: within an ulp of the low part.
      const scaled = (numerator << BigInt(s + 120)) / denominator;
      tenHigh[k] = h;
      tenLow[k] = Number(scaled) * 2 ** -(s + 120);
    }
    const a = SPLIT * tenHigh[k];
    tenHighTop[k] = a - (a - tenHigh[k]);
    tenHighBottom[k] = tenHigh[k] - tenHighTop[k];
  }
  powersBuilt = true;
}

/**
 * Writes the double nearest M x 10^scale (M from the digit groups, see above)
 * to out[at] and returns true, or returns false where this method cannot
 * decide (read the text with Number() then). The sign is the caller's.
 */
export function decimalInto(
  first: number,
  second: number,
  third: number,
  count: number,
  scale: number,
  out: Float64Array,
  at: number,
): boolean {
  // M = a + b + c, each an exact double: first x 10^k with k <= 11 has an odd part below
  // 2^27 x 5^11 < 2^53; second x 10^(<= 3) < 10^11; third < 10^3.
  const tailDigits = count > 16 ? count - 16 : 0;
  const a = count <= 8 ? first : first * POW10[count - 8];
  const b = count <= 16 ? second : second * POW10[tailDigits];
  const c = third;
  const m = a + b + c;
  if (m < TWO53) {
    // Every partial sum is an exact integer below 2^53 (and m >= 2^53 whenever M >= 2^53: rounding is monotonic).
    if (m === 0 || scale === 0) {
      out[at] = m;
      return true;
    }
    if (scale > 0 && scale <= 22) {
      out[at] = m * POW10[scale];
      return true;
    }
    if (scale < 0 && scale >= -22) {
      out[at] = m / POW10[-scale];
      return true;
    }
    if (scale > 22 && scale <= 37) {
      // 1e23 and the like: m x 10^(scale - 22) is still an exact integer below 2^53 (then one rounding).
      const t = m * POW10[scale - 22];
      if (t < TWO53) {
        out[at] = t * 1e22;
        return true;
      }
    }
  }
  if (scale > MAX_DECIMAL_EXPONENT || scale < -MAX_DECIMAL_EXPONENT) return false;
  // M exactly as mh + ml by two of Knuth's TwoSum (below 2^53 the errors are 0 and mh = M).
  const s = a + b;
  const sv = s - a;
  const se = a - (s - sv) + (b - sv);
  const t = s + c;
  const tv = t - s;
  const te = s - (t - tv) + (c - tv);
  const low = se + te; // two integers below 2^12: exact
  const mh = t + low;
  const ml = low - (mh - t);
  if (scale === 0) {
    // A whole number: mh is M rounded once, to nearest even (exact ties included).
    out[at] = mh;
    return true;
  }
  if (!powersBuilt) buildPowers();
  const k = scale + MAX_DECIMAL_EXPONENT;
  const th = tenHigh[k];
  const tl = tenLow[k];
  const thh = tenHighTop[k];
  const thl = tenHighBottom[k];
  // (mh + ml)(th + tl) without the ml tl term (below 2^-106 relative); Dekker's TwoProduct for mh th.
  const p = mh * th;
  const ma = SPLIT * mh;
  const mhh = ma - (ma - mh);
  const mhl = mh - mhh;
  const e = mhh * thh - p + mhh * thl + mhl * thh + mhl * thl + (mh * tl + ml * th);
  const zh = p + e;
  const zl = e - (zh - p);
  scratch[0] = zh;
  const top = scratchBits[HIGH];
  // A power of two: the spacing below differs from above; leave it to Number().
  if ((top & 0xfffff) === 0 && scratchBits[1 - HIGH] === 0) return false;
  const halfUlp = HALF_ULP[top >>> 20];
  // Decided when zh + zl is clearly inside zh's rounding interval (|zl| <= halfUlp always, zh being rounded).
  if (halfUlp - Math.abs(zl) > zh * TWO_M100) {
    out[at] = zh;
    return true;
  }
  return false;
}
