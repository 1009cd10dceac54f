/**
 * Which formulas may stay formulas in a workbook that `brittle calc` writes.
 * A written workbook is opened later by a spreadsheet application that runs
 * what it finds: text from a CSV such as =HYPERLINK(...), =WEBSERVICE(...) or
 * the DDE form =cmd|' /C calc'!A0 must not arrive there as a live formula.
 * So a formula is kept only when it calls nothing but this add-in's functions
 * and a short list of plain built-ins, and refers to nothing outside the
 * workbook; anything else is written as text (see writtenText).
 */

/**
 * Built-ins a datasheet needs around the add-in's functions. Each computes
 * from its arguments only: no links, no lookups into other files, no volatile
 * or system functions. Keep the list short; docs/files-and-formats.md repeats it.
 */
export const SAFE_BUILTINS: readonly string[] = [
  "ABS", "AND", "AVERAGE", "COUNT", "EXP", "FALSE", "IF", "IFERROR", "LN", "LOG10",
  "MAX", "MIN", "NOT", "OR", "POWER", "ROUND", "SQRT", "SUM", "TRUE",
];

const SAFE = new Set(SAFE_BUILTINS);

/** Characters a kept formula may use outside string literals and quoted sheet names (# and ? for error literals such as #N/A). */
const PLAIN_FORMULA = /^[A-Za-z0-9_.$:!,()+\-*/^&%<>=#?\s]*$/;

/** Characters a sheet name cannot hold; inside '...' they mean another file or a link. */
const NOT_IN_SHEET_NAMES = /[[\]|\\/?*:]/;

export type FormulaVerdict = { safe: true } | { safe: false; reason: string };

/**
 * formula: the cell's text with its leading "=", as typed or as saved
 * (_xldudf_BRITTLE_FIT(...) and _xlfn. prefixes are understood).
 * addInNames: the add-in's function names without the namespace (FIT, MODULUS...).
 */
export function judgeFormula(formula: string, addInNames: ReadonlySet<string>): FormulaVerdict {
  if (!formula.startsWith("=")) return { safe: false, reason: "not a formula" };
  let plain = "";
  const body = formula.slice(1);
  for (let i = 0; i < body.length; i++) {
    const ch = body[i];
    if (ch !== '"' && ch !== "'") {
      plain += ch;
      continue;
    }
    // A string literal ("...") or a quoted sheet name ('...'), the quote doubled inside.
    let j = i + 1;
    let inner = "";
    for (; j < body.length; j++) {
      if (body[j] === ch && body[j + 1] === ch) {
        inner += ch;
        j++;
      } else if (body[j] === ch) break;
      else inner += body[j];
    }
    if (j >= body.length) return { safe: false, reason: "an unclosed quote" };
    if (ch === "'" && NOT_IN_SHEET_NAMES.test(inner)) return { safe: false, reason: "a reference to another file or program" };
    plain += ch === '"' ? "0" : "Sheet"; // keeps the shape (a value, a sheet name before its "!") without the text
    i = j;
  }
  if (/[[\]]/.test(plain)) return { safe: false, reason: "a reference to another file" };
  if (plain.includes("|")) return { safe: false, reason: "a link to another program (DDE)" };
  if (!PLAIN_FORMULA.test(plain)) return { safe: false, reason: "characters outside plain arithmetic" };
  for (const match of plain.matchAll(/([A-Za-z_][A-Za-z0-9_.]*)\s*\(/g)) {
    const name = match[1].toUpperCase().replace(/^_XL(FN|WS)\./, "");
    const addIn = /^(?:BRITTLE\.|_XLDUDF_BRITTLE_)([A-Z0-9]+)$/.exec(name);
    if (addIn ? !addInNames.has(addIn[1]) : !SAFE.has(name)) return { safe: false, reason: `it calls ${match[1]}, which is not on the safe list` };
  }
  return { safe: true };
}

/**
 * Text as written into a cell of the output: text that a spreadsheet or a
 * later CSV export could take for a formula (it starts with =, +, -, @, a tab
 * or a carriage return) gets a leading apostrophe, the usual defence against
 * CSV injection. The apostrophe shows in the cell; the computed results and
 * the printed or JSON output keep the original text.
 */
export function writtenText(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}
