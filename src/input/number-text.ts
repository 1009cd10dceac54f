/**
 * What a number written as text means, under one rule for every input
 * (CSV sheets, element tables, pasted strengths).
 *
 * A number is: optional sign, digits with at most one decimal mark (a point
 * or a comma), optional exponent (`1,5E+03` in a decimal-comma file). The
 * mark is the file's, decided once (`DecimalMark`), and a token that could
 * mean two different numbers is never guessed:
 *
 *   "1,250"  one comma and exactly three digits after it, 1-3 digits before
 *            (not a lone 0): 1.25 with decimal commas, 1250 with thousands
 *            commas. Read only when the file's mark is settled as comma.
 *   "1.250"  the same with a point: read only when the mark is point.
 *   "1,250.5", "1.250,5", "1 250,5" (no-break, narrow no-break or thin
 *            space), "1'250.5" (apostrophe, straight or curly): grouped thousands.
 *            Never read: a thousands separator is refused, not dropped.
 *
 * Sources: the digit-grouping conventions are common practice (comma groups
 * with a decimal point in English locales; point or space groups with a
 * decimal comma in most of Europe).
 */

export type DecimalMark = "point" | "comma";

export type NumberShape =
  /** Digits only (with sign or exponent): the same under either mark. */
  | { kind: "integer"; value: number }
  /** One decimal mark, and only one reading. */
  | { kind: "decimal"; mark: DecimalMark; value: number }
  /** "1,250" or "1.250": a decimal mark or a thousands separator. */
  | { kind: "ambiguous"; separator: DecimalMark; asDecimal: number; asThousands: number }
  /** Digits in groups of three with thousands separators. */
  | { kind: "grouped" }
  /** Number-shaped but beyond double precision ("1e999"). */
  | { kind: "too-large" }
  | { kind: "not-a-number" };

const NUMBER = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/;
const AMBIGUOUS = /^[+-]?[1-9]\d{0,2}[.,]\d{3}$/;
const GROUPED = /^[+-]?\d{1,3}([,.\u00a0\u2009\u202f'\u2019 ]\d{3})+([.,]\d+)?([eE][+-]?\d+)?$/;

/**
 * Classifies trimmed text (no quotes). "-0" reads as 0 so no output ever shows a negative zero.
 * @example classifyNumber("1,250") // { kind: "ambiguous", separator: "comma", asDecimal: 1.25, asThousands: 1250 }
 */
export function classifyNumber(text: string): NumberShape {
  if (!NUMBER.test(text)) {
    return GROUPED.test(text) ? { kind: "grouped" } : { kind: "not-a-number" };
  }
  const comma = text.indexOf(",");
  const point = text.indexOf(".");
  const asPoint = Number(text.replace(",", "."));
  if (!Number.isFinite(asPoint)) return { kind: "too-large" };
  const value = asPoint === 0 ? 0 : asPoint;
  if (comma < 0 && point < 0) return { kind: "integer", value };
  const separator: DecimalMark = comma >= 0 ? "comma" : "point";
  if (AMBIGUOUS.test(text)) {
    return { kind: "ambiguous", separator, asDecimal: value, asThousands: Number(text.replace(/[.,]/, "")) };
  }
  return { kind: "decimal", mark: separator, value };
}

/**
 * The value of the commonest token, read without a pattern match or a result
 * object: a sign, digits and at most one decimal point ("413.6", "-12",
 * ".5"), when readNumber would read it as that one number under `mark`.
 * Undefined for everything else (a comma, an exponent, blanks, "1.250",
 * a decimal point in a decimal-comma file, a value beyond double range),
 * which readNumber then reads or refuses as before.
 * @example plainNumberValue("413.6", null) // 413.6;  plainNumberValue("1.250", null) // undefined
 */
export function plainNumberValue(text: string, mark: DecimalMark | null): number | undefined {
  const n = text.length;
  let i = 0;
  let c = n > 0 ? text.charCodeAt(0) : 0;
  if (c === 43 || c === 45) c = ++i < n ? text.charCodeAt(i) : 0; // + or -
  const firstDigit = i;
  while (c >= 48 && c <= 57) c = ++i < n ? text.charCodeAt(i) : 0;
  const whole = i - firstDigit;
  let fraction = -1; // digits after the point; -1: no point
  if (i < n && c === 46) {
    if (mark === "comma") return undefined; // refused by readNumber, with its reason
    const start = ++i;
    c = i < n ? text.charCodeAt(i) : 0;
    while (c >= 48 && c <= 57) c = ++i < n ? text.charCodeAt(i) : 0;
    fraction = i - start;
  }
  if (i !== n || whole + Math.max(fraction, 0) === 0) return undefined;
  // "1.250": a decimal point or a thousands separator (AMBIGUOUS above); readNumber decides.
  if (fraction === 3 && whole >= 1 && whole <= 3 && text.charCodeAt(firstDigit) !== 48) return undefined;
  const value = Number(text);
  if (!Number.isFinite(value)) return undefined;
  return value === 0 ? 0 : value;
}

/** The outcome of reading one token under a file's decimal mark. */
export type NumberReading =
  | { ok: true; value: number; /** the mark this token proves, when the file's was not yet known */ proves?: DecimalMark }
  | { ok: false; reason: string };

/**
 * Reads a token under the file's decimal mark (null: not yet known). The
 * reason of a refusal is a phrase to follow the token's place in a message.
 * @example readNumber("445,3", null) // { ok: true, value: 445.3, proves: "comma" }
 */
export function readNumber(text: string, mark: DecimalMark | null): NumberReading {
  const shape = classifyNumber(text);
  switch (shape.kind) {
    case "integer":
      return { ok: true, value: shape.value };
    case "decimal":
      if (mark === null) return { ok: true, value: shape.value, proves: shape.mark };
      if (mark === shape.mark) return { ok: true, value: shape.value };
      return {
        ok: false,
        reason: `has a decimal ${shape.mark} but the file's decimal mark is a ${mark} (one mark per file)`,
      };
    case "ambiguous":
      if (mark === shape.separator) return { ok: true, value: shape.asDecimal };
      if (mark === null) {
        return {
          ok: false,
          reason:
            `could be ${shape.asThousands} (thousands separator) or ${shape.asDecimal} (decimal ${shape.separator}), ` +
            `and no other number settles it: remove thousands separators, or state the decimal mark ` +
            `(--decimal-comma or --decimal-point; in the form, the decimal-comma switch)`,
        };
      }
      return { ok: false, reason: `looks like ${shape.asThousands} with a thousands separator: thousands separators are not read, write ${shape.asThousands}` };
    case "grouped":
      return { ok: false, reason: "has thousands separators, which are not read: write the number without them" };
    case "too-large":
      return { ok: false, reason: "is too large to represent" };
    default:
      return { ok: false, reason: "is not a number" };
  }
}

/**
 * True when the text is number-shaped at all (for header detection): a number, ambiguous or grouped.
 * @example looksNumeric("49S.3") // false
 */
export function looksNumeric(text: string): boolean {
  return classifyNumber(text).kind !== "not-a-number";
}
