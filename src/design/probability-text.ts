/**
 * Probabilities and numbers as a design check writes them in words.
 *
 * A probability strictly between 0 and 1 never reads as "0 %" or "100 %":
 * a survival of 0.9999 shown as "100 %" hides the very digits a reviewer must
 * see. Near 1 the percentage carries enough decimals to show the first digit
 * of 1 - p; below 0.001 it switches to a power of ten ("1.0e-4"); beyond what
 * a percentage can show (1 - p < 1e-6) it writes "1 - 1.0e-9".
 */

/**
 * @example formatProbability(0.9999) // "99.99 %"
 * @example formatProbability(1e-4)   // "1.0e-4"
 * @example formatProbability(0.0123) // "1.23 %"
 */
export function formatProbability(p: number, extraFigures = 0): string {
  if (!Number.isFinite(p)) return "not a number";
  if (p <= 0) return "0";
  if (p >= 1) return "1";
  if (p < 1e-3) return exponential(p, 1 + extraFigures);
  if (p < 0.5) return `${trimmed(p * 100, 3 + extraFigures)} %`;
  const q = 1 - p;
  if (q < 1e-6) return `1 - ${exponential(q, 1 + extraFigures)}`;
  // Decimals of the percentage that show the first significant digit of 1 - p; where rounding
  // would still reach 100, one more decimal until it does not.
  let decimals = Math.max(1, Math.ceil(-Math.log10(q * 100))) + extraFigures;
  let text = (p * 100).toFixed(decimals);
  while (Number(text) >= 100 && decimals < 12) text = (p * 100).toFixed(++decimals);
  return `${stripZeros(text)} %`;
}

/**
 * `p` written with the figures that tell it apart from `other` when they differ (at most 15 more
 * than formatProbability's): a failure probability a few per cent above the allowed one must not
 * read "1.0e-4" beside an allowed "1.0e-4" and a FAIL. Compared by the value the text stands for,
 * so "1.0e-3" and "0.1 %" count as the same.
 *
 * @example formatProbability(1.04e-4)               // "1.0e-4"
 * @example formatProbabilityApart(1.04e-4, 1e-4)    // "1.04e-4"
 */
export function formatProbabilityApart(p: number, other: number): string {
  let extra = 0;
  while (extra < 15 && p !== other && shownValue(formatProbability(p, extra)) === shownValue(formatProbability(other, extra))) extra++;
  return formatProbability(p, extra);
}

/** The probability a text of formatProbability stands for. */
function shownValue(text: string): number {
  if (text.startsWith("1 - ")) return 1 - Number(text.slice(4));
  if (text.endsWith(" %")) return Number(text.slice(0, -2)) / 100;
  return Number(text);
}

/** "1 in 10,000" for a small probability; null when p is 0.5 or more, or 0. */
export function oneIn(p: number): string | null {
  if (!(p > 0 && p < 0.5)) return null;
  const n = 1 / p;
  return `1 in ${n < 1e12 ? Math.round(n).toLocaleString("en-US") : n.toExponential(1)}`;
}

/** A confidence level in words: "95 %", "99.5 %". */
export function formatLevel(level: number): string {
  return `${trimmed(level * 100, 4)} %`;
}

/** Four significant figures for the words of a basis line; powers of ten outside 1e-3 .. 1e7. */
export function formatNumber(x: number, digits = 4): string {
  if (!Number.isFinite(x)) return "not a number";
  if (x === 0) return "0";
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e7) return String(Number(x.toPrecision(digits)));
  return exponential(x, digits - 1);
}

/**
 * Significant figures enough to write `x` and `other` as different numbers when they differ
 * (at least `digits`, at most 17, which tells any two doubles apart). Rounding keeps order, so
 * two numbers written apart keep their order too: an applied stress above the allowable never
 * reads as equal to it, and a reserve factor below 1 never reads as 1 beside a FAIL.
 *
 * @example formatNumber(0.9996, digitsApart(0.9996, 1, 3)) // "0.9996", where 3 figures give "1"
 */
export function digitsApart(x: number, other: number, digits = 4): number {
  let d = digits;
  while (d < 17 && x !== other && Number(formatNumber(x, d)) === Number(formatNumber(other, d))) d++;
  return d;
}

/**
 * A reserve factor (allowable / applied) to three figures, more where three would round one
 * below 1 (a FAIL) up to "1".
 *
 * @example formatReserveFactor(0.9996) // "0.9996"
 */
export function formatReserveFactor(reserveFactor: number): string {
  return formatNumber(reserveFactor, reserveFactor < 1 ? digitsApart(reserveFactor, 1, 3) : 3);
}

function exponential(x: number, decimals = 1): string {
  return x.toExponential(decimals).replace("e+", "e");
}

function trimmed(x: number, digits: number): string {
  return String(Number(x.toPrecision(digits)));
}

function stripZeros(fixed: string): string {
  return fixed.includes(".") ? fixed.replace(/0+$/, "").replace(/\.$/, "") : fixed;
}
