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
 * Characters with no width that copying from web pages, PDFs and right-to-left
 * text leaves around a number: zero-width space, non-joiner and joiner,
 * left-to-right and right-to-left marks, word joiner, Arabic letter mark, the
 * directional embeddings and isolates, a byte-order mark, a soft hyphen.
 */
const INVISIBLE = /[\u00ad\u061c\u200b-\u200f\u202a-\u202e\u2060\u2066-\u2069\ufeff]/;
const INVISIBLE_EDGES = /^[\u00ad\u061c\u200b-\u200f\u202a-\u202e\u2060\u2066-\u2069\ufeff]+|[\u00ad\u061c\u200b-\u200f\u202a-\u202e\u2060\u2066-\u2069\ufeff]+$/g;

/**
 * The zero of each run of decimal digits read besides ASCII: Arabic-Indic,
 * Extended Arabic-Indic (Persian, Urdu), Devanagari, Bengali, Thai and
 * full-width (East Asian input). Each run holds the digits 0 to 9 in order
 * (Unicode Standard, sec. 4.6, Numeric_Type=Decimal), so a digit's value is
 * its distance from the zero.
 */
const DIGIT_ZEROS = [0x0660, 0x06f0, 0x0966, 0x09e6, 0x0e50, 0xff10];

const SUPERSCRIPT = "⁰¹²³⁴⁵⁶⁷⁸⁹";
/** "4.12×10^2", "4.12 x 10²", "4,12·10^-3", "4.12*10^2": a mantissa times a power of ten, as people type it. */
const TIMES_TEN = /^([+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+))\s*[×xX·*]\s*10(?:\^\s*([+-]?\d+)|([⁺⁻]?[⁰¹²³⁴⁵⁶⁷⁸⁹]+))$/;

/**
 * The same number in the characters the reader knows, where a convention
 * makes the meaning certain: invisible characters at either end dropped; the
 * minus sign U+2212 (and full-width plus and minus) as + and -; digits of the
 * scripts in DIGIT_ZEROS as 0-9, the full-width point as a point (not the
 * full-width comma: East Asian text uses it between items and digit groups),
 * the Arabic decimal separator U+066B as a point and the Arabic thousands
 * separator U+066C as a thin space (so a grouped number stays refused);
 * "4.12×10^2" and "4.12 x 10²" as 4.12E2. Anything else is left as written,
 * so a dash, a superscript footnote mark or a unit still makes the text no
 * number. ASCII text without a times sign comes back as it is, at the cost of
 * one pass over its characters.
 * @example normalizeNumberText("\u2212412") // "-412";  normalizeNumberText("４１２") // "412"
 */
export function normalizeNumberText(text: string): string {
  let plain = true;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c >= 128 || c === 94 || c === 120 || c === 88 || c === 42) {
      plain = false;
      break;
    }
  }
  if (plain) return text;
  let t = INVISIBLE.test(text) ? text.replace(INVISIBLE_EDGES, "") : text;
  let out = "";
  for (const ch of t) {
    const c = ch.codePointAt(0)!;
    if (c < 128) out += ch;
    else if (c === 0x2212 || c === 0xff0d) out += "-";
    else if (c === 0xff0b) out += "+";
    else if (c === 0xff0e || c === 0x066b) out += ".";
    else if (c === 0x066c) out += "\u2009";
    else {
      const zero = DIGIT_ZEROS.find((z) => c >= z && c <= z + 9);
      out += zero === undefined ? ch : String.fromCharCode(48 + c - zero);
    }
  }
  t = out;
  const m = TIMES_TEN.exec(t);
  if (m) {
    const exponent = m[2] ?? [...m[3]].map((ch) => (ch === "⁺" ? "+" : ch === "⁻" ? "-" : String(SUPERSCRIPT.indexOf(ch)))).join("");
    t = `${m[1]}E${exponent}`;
  }
  return t;
}

/**
 * Text with blanks and invisible characters (INVISIBLE) removed from both ends,
 * for lines and fields copied from web pages and documents.
 * @example trimInvisible(" \u200b412\u00a0") // "412"
 */
export function trimInvisible(text: string): string {
  let t = text.trim();
  while (t !== "" && INVISIBLE.test(t)) {
    const u = t.replace(INVISIBLE_EDGES, "").trim();
    if (u === t) break;
    t = u;
  }
  return t;
}

/**
 * Blanks around a times sign before a power of ten removed ("4.12 x 10^2" to
 * "4.12x10^2"), so that a reader splitting a line at blanks keeps the number whole.
 * @example closeUpTimesTen("4.12 x 10² C") // "4.12x10² C"
 */
export function closeUpTimesTen(line: string): string {
  return /10/.test(line) ? line.replace(/(\d)[ \t\u00a0]*([×xX·*])[ \t\u00a0]*(10(?:\^|[⁺⁻⁰¹²³⁴⁵⁶⁷⁸⁹]))/g, "$1$2$3") : line;
}

/**
 * Classifies trimmed text (no quotes). "-0" reads as 0 so no output ever shows a negative zero.
 * The text is first put in the characters the reader knows (normalizeNumberText).
 * @example classifyNumber("1,250") // { kind: "ambiguous", separator: "comma", asDecimal: 1.25, asThousands: 1250 }
 */
export function classifyNumber(written: string): NumberShape {
  const text = normalizeNumberText(written);
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

/**
 * Text for a message: quoted as written, with invisible characters shown by
 * their code point (`"412<U+200B>"`), so the reader sees why "412" is refused.
 * @example quoteText("412\u200b") // "\"412<U+200B>\""
 */
export function quoteText(text: string): string {
  let out = "";
  for (const ch of text) {
    const c = ch.charCodeAt(0);
    out += (c < 32 && c !== 9) || INVISIBLE.test(ch) ? `<U+${c.toString(16).toUpperCase().padStart(4, "0")}>` : ch;
  }
  return `"${out}"`;
}

/**
 * A percentage's text as the fraction it means, by moving the decimal mark two
 * places ("99.99" to "0.9999"), so the value is the double nearest the
 * fraction itself rather than a quotient rounded twice; null if the text is
 * not a plain decimal number (an exponent, a grouped or ambiguous number).
 * @example percentOf("99.99") // "0.9999";  percentOf("5") // "0.05"
 */
export function percentOf(text: string): string | null {
  const m = /^([+-]?)(\d*)(?:([.,])(\d*))?$/.exec(text.trim());
  if (!m || (m[2] === "" && (m[4] ?? "") === "")) return null;
  const shape = classifyNumber(text.trim()).kind;
  if (shape !== "integer" && shape !== "decimal") return null; // "1,250 %": 1250 % or 1.25 %? the reader refuses it
  const digits = m[2].padStart(3, "0") + (m[4] ?? "");
  const point = m[2].padStart(3, "0").length - 2;
  const whole = digits.slice(0, point).replace(/^0+(?=\d)/, "");
  const fraction = digits.slice(point).replace(/0+$/, "");
  return `${m[1] === "-" ? "-" : ""}${whole}${fraction === "" ? "" : `${m[3] ?? "."}${fraction}`}`;
}

/** Spreadsheet error values as they appear when a sheet with errors is copied or exported. */
const SPREADSHEET_ERROR = /^#(N\/A|DIV\/0!|VALUE!|REF!|NAME\?|NUM!|NULL!|SPILL!|CALC!|FIELD!|BLOCKED!|CONNECT!|BUSY!|UNKNOWN!|GETTING_DATA|ERROR!|CYCLE!|LIC!)$/i;

/**
 * True for a spreadsheet error value ("#N/A", "#DIV/0!", "#VALUE!", ...), which
 * begins with '#' like a comment line but stands where a value was.
 * @example isSpreadsheetError("#DIV/0!") // true;  isSpreadsheetError("# mesh 2") // false
 */
export function isSpreadsheetError(text: string): boolean {
  return text.length < 16 && SPREADSHEET_ERROR.test(text.trim());
}

/** Words and marks that stand for "no value" in tables and datasheets. */
const MISSING = /^(?:[-‐‑‒–—―]{1,3}|\?|n\/?a|n\.a\.|nan|none|null|nil|missing|void|empty|k\.\s?a\.)$/i;
const INFINITE = /^[+-]?(?:inf(?:inity)?|∞)$/i;

/** Units a strength, load or size is written with (force, stress, length, area, volume), matched case-sensitively. */
const UNIT = /^(GPa|MPa|kPa|Pa|N\/mm(?:²|2|\^2)|N\/m(?:²|2|\^2)|kN\/mm(?:²|2|\^2)|psi|ksi|Msi|bar|kgf\/mm(?:²|2|\^2)|kp\/mm(?:²|2|\^2)|kN|MN|mN|N|lbf|lb|kgf|kp|mm(?:²|2|\^2|³|3|\^3)?|cm(?:²|2|³|3)?|µm|μm|um|m(?:²|2|³|3)?|in(?:ch(?:es)?)?|"|s|min|h)$/;

/** What one unit is in the unit a user most likely uses beside it: a factor of ten or more is named (SI prefixes, NIST SP 811). */
const UNIT_HINT: Record<string, string> = {
  GPa: "1 GPa = 1000 MPa",
  kPa: "1 MPa = 1000 kPa",
  Pa: "1 MPa = 1,000,000 Pa",
  MPa: "1 GPa = 1000 MPa",
  "N/mm²": "1 N/mm² = 1 MPa",
  "N/mm2": "1 N/mm² = 1 MPa",
  "N/mm^2": "1 N/mm² = 1 MPa",
  ksi: "1 ksi = 1000 psi",
  psi: "1 ksi = 1000 psi",
  Msi: "1 Msi = 1000 ksi",
  kN: "1 kN = 1000 N",
  N: "1 kN = 1000 N",
  mN: "1 N = 1000 mN",
  MN: "1 MN = 1000 kN",
  µm: "1 mm = 1000 µm",
  μm: "1 mm = 1000 µm",
  um: "1 mm = 1000 µm",
  m: "1 m = 1000 mm",
};

const NUMBER_PART = String.raw`[+\-−]?(?:\d[\d.,  ' ]*|[.,]\d+)(?:[eE][+-]?\d+)?`;
const WITH_UNIT = new RegExp(String.raw`^(${NUMBER_PART})\s*(\S+)$`);
const WITH_REMARK = new RegExp(String.raw`^(${NUMBER_PART})\s*(\(.*\)|\[.*\])$`);
const FOOTNOTE = new RegExp(String.raw`^(${NUMBER_PART})\s*([*†‡§¶#]+|[⁰¹²³⁴⁵⁶⁷⁸⁹]+|[a-z])$`);
const IN_PARENTHESES = new RegExp(String.raw`^\(\s*(${NUMBER_PART})\s*\)$`);
const BOUND = new RegExp(String.raw`^([<>≤≥]=?|[⩽⩾])\s*(${NUMBER_PART})$`);
const APPROXIMATE = new RegExp(String.raw`^(~|≈|∼|ca\.?|approx\.?|about)\s*(${NUMBER_PART})$`, "i");
const PERCENT = new RegExp(String.raw`^(${NUMBER_PART})\s*%$`);
const DASH_SIGN = new RegExp(String.raw`^([‐‑‒–—―﹣])\s*(\d[\d.,]*(?:[eE][+-]?\d+)?)$`);

/**
 * Why text that is no number cannot be read, and what to type instead: a
 * phrase to follow the quoted text in a message, or null where nothing more
 * specific than "is not a number" can be said. Units are refused, never
 * dropped: a strength in GPa beside strengths in MPa is a factor of 1000.
 * @example explainNotANumber("0.41 GPa") // 'carries a unit ("GPa"): type the number alone, every value in one unit (1 GPa = 1000 MPa)'
 */
export function explainNotANumber(written: string): string | null {
  const text = written.trim();
  if (isSpreadsheetError(text)) return "is a spreadsheet error value, not a number: correct it in the sheet it came from, or leave the value out";
  if (MISSING.test(text)) return "marks a missing value: leave the value (or its line) out, or type the number";
  if (INFINITE.test(text)) return "is infinite, not a number: type a finite value";
  const t = normalizeNumberText(text);
  if (/[\u00ad\u061c\u200b-\u200f\u202a-\u202e\u2060\u2066-\u2069\ufeff]/.test(t)) {
    return "holds an invisible character inside (shown as <U+...>), copied from a web page or a document: retype the number";
  }
  let m: RegExpExecArray | null;
  if ((m = /^0[xXbBoO][0-9a-fA-F]+$/.exec(t))) return "is written in another base (0x, 0b or 0o): type the decimal number";
  if ((m = PERCENT.exec(t))) {
    const fraction = percentOf(m[1]);
    return `is a percentage: type it as a plain number${fraction === null ? "" : ` (${fraction})`}`;
  }
  if ((m = IN_PARENTHESES.exec(t))) return `is in parentheses (a negative number in accounting notation, or a remark?): type -${m[1]} or ${m[1]}`;
  if ((m = BOUND.exec(t))) {
    const above = /[>≥⩾]/.test(m[1]);
    return `is a bound ("${m[1]}"), not a measured value: type the measured number alone${above ? "; a specimen that did not break is censored at the stress reached (flag C)" : ""}`;
  }
  if ((m = APPROXIMATE.exec(t))) return `is marked approximate ("${m[1]}"): type the number alone if it is the measured value`;
  if ((m = DASH_SIGN.exec(t))) return `begins with a dash (U+${m[1].charCodeAt(0).toString(16).toUpperCase().padStart(4, "0")}), not a minus sign: type - for a negative number`;
  if (/^['"‘’“”„«»]/.test(t) || /['"‘’“”„«»]$/.test(t)) return "is in quote marks or begins with an apostrophe: type the number alone";
  if ((m = FOOTNOTE.exec(t)) && !UNIT.test(m[2])) return `ends in a footnote mark ("${m[2]}"): read the note, then type the number alone`;
  if ((m = WITH_REMARK.exec(t))) return `has a remark after the number ("${m[2]}"): leave the value out if the remark makes it invalid, else type the number alone`;
  if ((m = WITH_UNIT.exec(t)) && UNIT.test(m[2])) {
    const hint = UNIT_HINT[m[2]];
    return `carries a unit ("${m[2]}"): type the number alone, every value in one unit${hint ? ` (${hint})` : ""}`;
  }
  if (/[⁰¹²³⁴⁵⁶⁷⁸⁹]/.test(t)) return "holds a superscript digit (a footnote mark or a power?): type the number alone, powers of ten as E (4.12E+02)";
  if (/(?![0-9])\p{Nd}/u.test(t)) return "holds digits the reader does not know: type them as 0-9";
  return null;
}

/** How a single typed value treats a decimal comma. */
export interface TypedNumberRule {
  /**
   * "point-only": a point is the decimal mark and a decimal comma is refused (the form's own fields);
   * "either": a decimal point or comma, whichever the value shows; "comma": the decimal mark is stated as a comma.
   */
  decimalMark: "point-only" | "either" | "comma";
  /** Whether "99.9 %" may be typed for 0.999 (probabilities and confidence levels). */
  percent?: boolean;
}

/**
 * One value typed into a field of the form, read under the rules of every
 * input (normalizeNumberText, readNumber): a value that could be read two ways
 * ("1.250": 1250 with a thousands separator, or 1.25) is refused, as in a
 * pasted column where no other number settles the mark; a unit, a footnote
 * mark or a word is refused with what to change. The reason follows the
 * quoted text in a message.
 * @example readTypedNumber("99.99 %", { decimalMark: "point-only", percent: true }) // { ok: true, value: 0.9999 }
 */
export function readTypedNumber(written: string, rule: TypedNumberRule): NumberReading {
  let text = trimInvisible(written);
  const percent = /^(.*?)\s*%$/.exec(text);
  if (percent && rule.percent) {
    const fraction = percentOf(normalizeNumberText(percent[1]));
    if (fraction === null) return { ok: false, reason: "is a percentage that cannot be read: type the fraction (0.999 for 99.9 %)" };
    text = fraction;
  }
  const mark: DecimalMark | null = rule.decimalMark === "comma" ? "comma" : null;
  const shape = classifyNumber(text);
  if (shape.kind === "ambiguous" && mark === null) {
    return {
      ok: false,
      reason: `could be ${shape.asThousands} (with a thousands separator) or ${shape.asDecimal}: type ${shape.asThousands} for the first, ${text}0 for the second`,
    };
  }
  const r = readNumber(text, mark);
  if (r.ok) {
    if (rule.decimalMark === "point-only" && r.proves === "comma") {
      return { ok: false, reason: `has a decimal comma: use a point as the decimal separator (${text.replace(",", ".")})` };
    }
    return { ok: true, value: r.value };
  }
  if (r.reason !== "is not a number") return r;
  const why = explainNotANumber(written);
  if (why) return { ok: false, reason: why };
  return { ok: false, reason: rule.decimalMark === "point-only" ? "is not a number (use a point as the decimal separator)" : "is not a number" };
}
