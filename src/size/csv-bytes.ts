/**
 * Reading numbers and fields straight from the bytes of a delimited text
 * file, without building strings: the element-table reader parses tens of
 * millions of rows, and per-line strings would dominate its time.
 *
 * Numbers: optional spaces and quotes, sign, digits, one decimal point
 * (or a comma when the delimiter is not a comma), exponent. With at most 15
 * significant digits and a decimal exponent within +/-22 the result is
 * correctly rounded (both factors are exact doubles, one rounding). Longer
 * mantissas are accumulated in floating point, within about two units in the
 * last place; larger exponents fall back to Number() on the decoded text.
 * Anything else (empty, "NaN", "inf", stray characters) is not a number.
 */

export const COMMA = 0x2c;
export const SEMICOLON = 0x3b;
export const TAB = 0x09;
export const SPACE = 0x20;
export const QUOTE = 0x22;
export const CR = 0x0d;
export const LF = 0x0a;
/** Marker for "fields separated by runs of spaces or tabs". */
export const WHITESPACE = -1;

const POW10 = [
  1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19,
  1e20, 1e21, 1e22,
];

function isSpace(b: number): boolean {
  return b === SPACE || b === TAB;
}

/** Decodes bytes [start, end) as Latin-1/ASCII text (headers, ids, fallbacks). */
export function decodeAscii(buf: Uint8Array, start: number, end: number): string {
  let s = "";
  for (let i = start; i < end; i += 4096) {
    s += String.fromCharCode.apply(null, Array.from(buf.subarray(i, Math.min(end, i + 4096))));
  }
  return s;
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
  let mantissa = 0;
  let digits = 0; // significant digits taken into the mantissa
  let scale = 0; // decimal exponent adjustment
  let any = false;
  let seenPoint = false;
  for (; i < j; i++) {
    b = buf[i];
    const d = b - 0x30;
    if (d >= 0 && d <= 9) {
      any = true;
      if (digits < 19) {
        if (mantissa !== 0 || d !== 0) {
          mantissa = mantissa * 10 + d;
          digits++;
        }
        if (seenPoint) scale--;
      } else if (!seenPoint) {
        scale++;
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
  let value: number;
  if (mantissa === 0) value = 0;
  else if (scale === 0) value = mantissa;
  else if (scale > 0 && scale <= 22) value = mantissa * POW10[scale];
  else if (scale < 0 && scale >= -22) value = mantissa / POW10[-scale];
  else {
    value = Number(decodeAscii(buf, start, end).trim().replace(/^"|"$/g, "").replace(",", "."));
    if (!Number.isFinite(value)) return NaN;
    return value;
  }
  if (!Number.isFinite(value)) return NaN;
  return negative ? -value : value;
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
    let text = decodeAscii(buf, i, e).trim();
    if (text.length >= 2 && text.startsWith('"') && text.endsWith('"')) text = text.slice(1, -1).replace(/""/g, '"').trim();
    fields.push(text);
    if (e >= end) break;
    i = nextFieldStart(buf, e, end, delimiter);
    if (delimiter === WHITESPACE && i >= end) break;
  }
  return fields;
}

/** Where the last fastNumber call stopped (the byte after the number). */
export let fastStop = 0;

/**
 * The common case only, fused with finding the field's end: a plain number
 * (sign, at most 19 significant digits, the file's decimal mark `decimal`,
 * exponent within +/-22) followed directly by the delimiter, CR, LF or the
 * end. `decimal` is '.' or ',' once the file's mark is settled, -1 before
 * (whole numbers only). Returns NaN for anything else (spaces, quotes, the
 * other mark, long mantissas, junk), and the caller then takes the general
 * path, which gives the same value or the error message.
 */
export function fastNumber(buf: Uint8Array, start: number, end: number, delimiter: number, decimal: number): number {
  let i = start;
  let b = buf[i];
  let negative = false;
  if (b === 0x2d || b === 0x2b) {
    negative = b === 0x2d;
    b = buf[++i];
  }
  let mantissa = 0;
  let digits = 0;
  let scale = 0;
  let any = false;
  while (i < end) {
    const d = b - 0x30;
    if (d < 0 || d > 9) break;
    any = true;
    if (mantissa !== 0 || d !== 0) {
      mantissa = mantissa * 10 + d;
      digits++;
    }
    b = buf[++i];
  }
  if (i < end && b === decimal) {
    b = buf[++i];
    while (i < end) {
      const d = b - 0x30;
      if (d < 0 || d > 9) break;
      any = true;
      if (mantissa !== 0 || d !== 0) {
        mantissa = mantissa * 10 + d;
        digits++;
      }
      scale--;
      b = buf[++i];
    }
  }
  // Up to 15 digits the value is correctly rounded; 16 to 19 (full doubles as some programs write
  // them) accumulate within about two units in the last place, as on the general path.
  if (!any || digits > 19) return NaN;
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
    if (expDigits === 0 || expDigits > 3) return NaN;
    scale += expNegative ? -exponent : exponent;
  }
  if (i < end && b !== delimiter && b !== CR && b !== LF) return NaN;
  let value: number;
  if (mantissa === 0) value = 0;
  else if (scale === 0) value = mantissa;
  else if (scale > 0 && scale <= 22) value = mantissa * POW10[scale];
  else if (scale < 0 && scale >= -22) value = mantissa / POW10[-scale];
  else return NaN;
  fastStop = i;
  return negative ? -value : value;
}
