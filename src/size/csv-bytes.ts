/**
 * Reading numbers and fields straight from the bytes of a delimited text
 * file, without building strings: the element-table reader parses tens of
 * millions of rows, and per-line strings would dominate its time.
 *
 * Numbers: optional spaces and quotes, sign, digits, one decimal point
 * (or a comma when the delimiter is not a comma), exponent. The digits are
 * gathered as integers (the first 15 significant ones, then up to 4 more)
 * and turned into the nearest double by decimal-to-double.ts, the same
 * double Number() gives. Where that method cannot decide (more than 19
 * significant digits other than trailing zeros, a decimal exponent beyond
 * +/-250, a decimal within 2^-100 of a midpoint between two doubles) the
 * text goes to Number() itself. Anything else (empty, "NaN", "inf", stray
 * characters) is not a number.
 */
import { decimalInto } from "./decimal-to-double";

/** parseNumber's result slot (decimalInto writes its result, see there). */
const generalValue = new Float64Array(1);

export const COMMA = 0x2c;
export const SEMICOLON = 0x3b;
export const TAB = 0x09;
export const SPACE = 0x20;
export const QUOTE = 0x22;
export const CR = 0x0d;
export const LF = 0x0a;
/** Marker for "fields separated by runs of spaces or tabs". */
export const WHITESPACE = -1;

function isSpace(b: number): boolean {
  return b === SPACE || b === TAB;
}

/** Decodes bytes [start, end) as Latin-1/ASCII text (headers, ids, fallbacks). */
export function decodeAscii(buf: Uint8Array, start: number, end: number): string {
  let s = "";
  for (let i = start; i < end; i += 4096) {
    // apply takes the typed array itself as its argument list (ECMA-262 CreateListFromArrayLike): no copy into an Array.
    s += String.fromCharCode.apply(null, buf.subarray(i, Math.min(end, i + 4096)) as unknown as number[]);
  }
  return s;
}

const UTF8 = new TextDecoder("utf-8", { fatal: true });

/**
 * Decodes the bytes of a field shown to the user or matched against a name (a header, an id, a
 * field quoted in a message): UTF-8, which the reader's input is (UTF-16 is converted on the way
 * in), so "σ1" and "Ecke-ä" are not shown as "Ï1" and "Ecke-Ã¤" and `--stress σ1` finds its
 * column; bytes that are not UTF-8 (an older Western export) are read one byte a character.
 */
export function decodeField(buf: Uint8Array, start: number, end: number): string {
  const ascii = decodeAscii(buf, start, end);
  if (!/[\x80-\xff]/.test(ascii)) return ascii;
  try {
    return UTF8.decode(buf.subarray(start, end));
  } catch {
    return ascii;
  }
}

/**
 * The number in bytes [start, end), or NaN if the field is not a plain
 * finite number. `altDecimal` is a second decimal-point byte (a comma), or -1.
 */
export function parseNumber(buf: Uint8Array, start: number, end: number, altDecimal: number): number {
  let i = start;
  let j = end;
  while (i < j && isSpace(buf[i])) i++;
  while (j > i && isSpace(buf[j - 1])) j--;
  if (j - i >= 2 && buf[i] === QUOTE && buf[j - 1] === QUOTE) {
    i++;
    j--;
    while (i < j && isSpace(buf[i])) i++;
    while (j > i && isSpace(buf[j - 1])) j--;
  }
  if (i >= j) return NaN;
  let negative = false;
  let b = buf[i];
  if (b === 0x2d || b === 0x2b) {
    negative = b === 0x2d;
    i++;
  }
  // Significant digits in groups of 8, 8 and 3 (see decimal-to-double.ts); leading zeros are not counted.
  let first = 0;
  let second = 0;
  let third = 0;
  let count = 0;
  let scale = 0; // decimal exponent adjustment
  let any = false;
  let seenPoint = false;
  let inexact = false; // a nonzero digit beyond the 19th
  for (; i < j; i++) {
    b = buf[i];
    const d = b - 0x30;
    if (d >= 0 && d <= 9) {
      any = true;
      if (count === 0 && d === 0) {
        if (seenPoint) scale--;
      } else if (count < 19) {
        if (count < 8) first = first * 10 + d;
        else if (count < 16) second = second * 10 + d;
        else third = third * 10 + d;
        count++;
        if (seenPoint) scale--;
      } else {
        if (d !== 0) inexact = true;
        if (!seenPoint) scale++;
      }
      continue;
    }
    if ((b === 0x2e || b === altDecimal) && !seenPoint) {
      seenPoint = true;
      continue;
    }
    break;
  }
  if (!any) return NaN;
  if (i < j) {
    b = buf[i];
    if (b !== 0x65 && b !== 0x45) return NaN;
    i++;
    let expNegative = false;
    if (i < j && (buf[i] === 0x2d || buf[i] === 0x2b)) {
      expNegative = buf[i] === 0x2d;
      i++;
    }
    if (i >= j) return NaN;
    let exponent = 0;
    for (; i < j; i++) {
      const d = buf[i] - 0x30;
      if (d < 0 || d > 9) return NaN;
      if (exponent < 100000) exponent = exponent * 10 + d;
    }
    scale += expNegative ? -exponent : exponent;
  }
  if (inexact || !decimalInto(first, second, third, count, scale, generalValue, 0)) {
    // Undecided by the exact method: Number() on the same text (validated above: sign, digits, mark, exponent).
    const value = Number(decodeAscii(buf, start, end).trim().replace(/^"|"$/g, "").trim().replace(",", "."));
    return Number.isFinite(value) ? value : NaN;
  }
  return negative ? -generalValue[0] : generalValue[0];
}

/**
 * End of the field that starts at `start` (exclusive): the next delimiter
 * outside quotes, or `end`. For WHITESPACE the field ends at the next space or tab.
 */
export function fieldEnd(buf: Uint8Array, start: number, end: number, delimiter: number): number {
  let i = start;
  if (delimiter === WHITESPACE) {
    while (i < end && !isSpace(buf[i])) i++;
    return i;
  }
  while (i < end && isSpace(buf[i])) i++;
  if (i < end && buf[i] === QUOTE) {
    i++;
    while (i < end) {
      if (buf[i] === QUOTE) {
        if (i + 1 < end && buf[i + 1] === QUOTE) i += 2;
        else {
          i++;
          break;
        }
      } else i++;
    }
  }
  while (i < end && buf[i] !== delimiter) i++;
  return i;
}

/** Start of the next field after a field ending at `at` (skipping the delimiter, or the run of blanks). */
export function nextFieldStart(buf: Uint8Array, at: number, end: number, delimiter: number): number {
  if (delimiter === WHITESPACE) {
    let i = at;
    while (i < end && isSpace(buf[i])) i++;
    return i;
  }
  return at + 1;
}

/** Splits one line into its fields' text (for the header and for detection; not for the hot path). */
export function splitFields(buf: Uint8Array, start: number, end: number, delimiter: number): string[] {
  const fields: string[] = [];
  let i = delimiter === WHITESPACE ? nextFieldStart(buf, start, end, WHITESPACE) : start;
  for (;;) {
    const e = fieldEnd(buf, i, end, delimiter);
    let text = decodeField(buf, i, e).trim();
    if (text.length >= 2 && text.startsWith('"') && text.endsWith('"')) text = text.slice(1, -1).replace(/""/g, '"').trim();
    fields.push(text);
    if (e >= end) break;
    i = nextFieldStart(buf, e, end, delimiter);
    if (delimiter === WHITESPACE && i >= end) break;
  }
  return fields;
}

/**
 * The value of four decimal digits at buf[i..i+3], or -1 if any of the four
 * bytes is not a digit: all four tested and combined at once in one 32-bit
 * word (bytes 0x30-0x39 are the ones whose high nibble is 3 both before and
 * after adding 6), instead of four rounds of test, multiply and add.
 */
function fourDigits(buf: Uint8Array, i: number): number {
  const w = buf[i] | (buf[i + 1] << 8) | (buf[i + 2] << 16) | (buf[i + 3] << 24);
  if ((w & 0xf0f0f0f0) !== 0x30303030 || ((w + 0x06060606) & 0xf0f0f0f0) !== 0x30303030) return -1;
  const d = w - 0x30303030; // digit k in byte k
  const pairs = (d * 10 + (d >>> 8)) & 0x00ff00ff; // 10 d0 + d1 in the low half, 10 d2 + d3 in the high
  return (pairs & 0xffff) * 100 + (pairs >>> 16);
}

/**
 * The common case only, fused with finding the field's end: a plain number
 * (sign, at most 19 significant digits, the file's decimal mark `decimal`,
 * an exponent of at most 3 digits) followed directly by the delimiter, CR,
 * LF or the end. Writes the value to out[at] and returns the index just
 * after the number, or -1 for anything else (spaces, quotes, the other mark,
 * long mantissas, junk, a decimal exactly between two doubles), and the
 * caller then takes the general path, which gives the same value or the
 * error message; -0 gives 0. `decimal` is '.' or ',' once the file's mark is settled, -1
 * before (whole numbers only). Only small integers cross the calls, so
 * nothing is boxed per number.
 */
export function fastNumber(
  buf: Uint8Array,
  start: number,
  end: number,
  delimiter: number,
  decimal: number,
  out: Float64Array,
  at: number,
): number {
  let i = start;
  let b = buf[i];
  let negative = false;
  if (b === 0x2d || b === 0x2b) {
    negative = b === 0x2d;
    b = buf[++i];
  }
  // Leading zeros (and the mark among them) are not significant digits.
  let point = -1;
  let zeros = false;
  while (i < end) {
    if (b === 0x30) zeros = true;
    else if (b === decimal && point < 0) point = i;
    else break;
    b = buf[++i];
  }
  // Significant digits in small-integer groups of 8, 8 and 3 (short dependency chains, no boxed
  // doubles); a 20th sends the text to the general path.
  let first = 0;
  let second = 0;
  let third = 0;
  let count = 0;
  digits: {
    while (count < 8) {
      if (count <= 4 && i + 4 <= end) {
        const four = fourDigits(buf, i);
        if (four >= 0) {
          first = first * 10000 + four;
          count += 4;
          i += 4;
          b = buf[i];
          continue;
        }
      }
      const d = b - 0x30;
      if (d >= 0 && d <= 9 && i < end) {
        first = first * 10 + d;
        count++;
      } else if (b === decimal && point < 0 && i < end) point = i;
      else break digits;
      b = buf[++i];
    }
    while (count < 16) {
      if (count <= 12 && i + 4 <= end) {
        const four = fourDigits(buf, i);
        if (four >= 0) {
          second = second * 10000 + four;
          count += 4;
          i += 4;
          b = buf[i];
          continue;
        }
      }
      const d = b - 0x30;
      if (d >= 0 && d <= 9 && i < end) {
        second = second * 10 + d;
        count++;
      } else if (b === decimal && point < 0 && i < end) point = i;
      else break digits;
      b = buf[++i];
    }
    while (count < 19) {
      const d = b - 0x30;
      if (d >= 0 && d <= 9 && i < end) {
        third = third * 10 + d;
        count++;
      } else if (b === decimal && point < 0 && i < end) point = i;
      else break digits;
      b = buf[++i];
    }
    if (b === decimal && point < 0 && i < end) {
      point = i;
      b = buf[++i];
    }
    if (b >= 0x30 && b <= 0x39 && i < end) return -1;
  }
  if (count === 0 && !zeros) return -1;
  let scale = point >= 0 ? point + 1 - i : 0;
  if (i < end && (b === 0x65 || b === 0x45)) {
    b = buf[++i];
    let expNegative = false;
    if (b === 0x2d || b === 0x2b) {
      expNegative = b === 0x2d;
      b = buf[++i];
    }
    let exponent = 0;
    let expDigits = 0;
    while (i < end) {
      const d = b - 0x30;
      if (d < 0 || d > 9) break;
      exponent = exponent * 10 + d;
      expDigits++;
      b = buf[++i];
    }
    if (expDigits === 0 || expDigits > 3) return -1;
    scale += expNegative ? -exponent : exponent;
  }
  if (i < end && b !== delimiter && b !== CR && b !== LF) return -1;
  if (!decimalInto(first, second, third, count, scale, out, at)) return -1;
  // -0 reads as 0, as on the general path (docs/files-and-formats.md).
  if (negative && out[at] !== 0) out[at] = -out[at];
  return i;
}

/**
 * An element id of 1 to 15 digits and nothing else, followed by the delimiter, CR, LF or the end:
 * its value (exact: below 2^53) to out[at] and the index after it, or -1 (then fastNumber decides).
 */
export function fastWholeNumber(buf: Uint8Array, start: number, end: number, delimiter: number, out: Float64Array, at: number): number {
  let i = start;
  let value = 0;
  while (i < end) {
    const d = buf[i] - 0x30;
    if (d < 0 || d > 9) break;
    value = value * 10 + d;
    i++;
  }
  const digits = i - start;
  if (digits === 0 || digits > 15) return -1;
  if (i < end) {
    const b = buf[i];
    if (b !== delimiter && b !== CR && b !== LF) return -1;
  }
  out[at] = value;
  return i;
}
