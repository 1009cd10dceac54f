/**
 * Fields that fixed-width, Fortran-style listings print where a number belongs, named in words
 * so a refusal says what went wrong: a run of asterisks (the number did not fit its field), two
 * numbers touching, or a mantissa and a signed exponent with no exponent letter.
 */

/**
 * Why a field Fortran-style writers produce is no number, in words; null for other text:
 * asterisks (the number overflowed its field width) and two numbers touching, or a mantissa
 * with a signed exponent but no exponent letter ("1.234-102"), which could be either.
 * @example fortranReason("*********") // "is a run of asterisks, ..."
 */
export function fortranReason(text: string): string | null {
  if (/^\*+$/.test(text)) {
    return "is a run of asterisks, which Fortran-style writers print when a number does not fit its field: the value is lost; export with a wider number format";
  }
  const m = /^([+-]?(?:\d+\.?\d*|\.\d+))([EeDd][+-]?\d+)?([+-](?:\d+\.?\d*|\.\d+)(?:[EeDd][+-]?\d+)?)$/.exec(text);
  if (!m) return null;
  if (!m[2] && /^[+-]\d{1,3}$/.test(m[3])) {
    return (
      `is a mantissa and a signed exponent with no exponent letter (${m[1]}E${m[3]}, as some Fortran formats write three-digit exponents), ` +
      `or two numbers touching (${m[1]} and ${m[3]}): it is not read; export with an exponent letter and blanks or a delimiter between columns`
    );
  }
  return `holds two numbers with nothing between them (${m[1]}${m[2] ?? ""} and ${m[3]}), as fixed-width columns print a negative number that fills its field: export with a delimiter or wider columns`;
}
