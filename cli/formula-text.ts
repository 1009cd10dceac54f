/**
 * Formula text as the engine's parser takes it. Kept apart from engine.ts so
 * that reading a formula's ranges (range-budget.ts) does not load the engine.
 */

export const NAMESPACE = "BRITTLE";

const DIGIT_BEFORE_E = /[0-9.]E/;

/**
 * What a spreadsheet accepts but the engine's parser does not, rewritten
 * outside string literals: saved add-in calls (_xldudf_BRITTLE_NAME( becomes
 * BRITTLE.NAME( ), the prefix a spreadsheet saves before newer built-ins
 * (_xlfn.STDEV.S( becomes STDEV.S( ), an upper-case exponent in a number
 * (3.15E8 becomes 3.15e8), and a range from row 1 to the sheet's last row
 * (A1:A1048576), which the engine would build cell by cell, as the same
 * column range (A:A), which it does not. A bare TRUE or FALSE in an array
 * constant ({FALSE;TRUE;FALSE}) becomes TRUE() or FALSE(): the engine reads the
 * bare words through named expressions (engine.ts), which it cannot evaluate
 * inside an array constant (it stopped the whole run with "Value of the formula
 * cell is not computed").
 */
export function normaliseFormula(formula: string): string {
  // Each rewrite needs an underscore, a digit or point before an E, the last row's number or a brace: a formula
  // with none of them (the common case, checked once per formula before any evaluation) is returned as it is.
  if (!formula.includes("_") && !formula.includes("1048576") && !formula.includes("{") && !DIGIT_BEFORE_E.test(formula)) return formula;
  let inArray = false;
  return formula
    .split(/("(?:[^"]|"")*")/)
    .map((part, i) => {
      if (i % 2 === 1) return part;
      const rewritten = part
        .replace(/_xldudf_BRITTLE_([A-Za-z0-9]+)\s*\(/gi, (_, name: string) => `${NAMESPACE}.${name.toUpperCase()}(`)
        .replace(/(?<![A-Za-z0-9_.])_xl(?:fn|ws)\.(?=[A-Za-z][A-Za-z0-9_.]*\s*\()/gi, "")
        .replace(/(?<![A-Za-z_$\d.])(\d+\.?\d*|\.\d+)E([+-]?\d+)/g, "$1e$2")
        .replace(/(?<![A-Za-z0-9_.$])(\$?[A-Za-z]{1,3})\$?1:(\$?[A-Za-z]{1,3})\$?1048576(?![0-9A-Za-z_(])/g, "$1:$2");
      if (!inArray && !rewritten.includes("{")) return rewritten;
      // An array constant may hold text, so it can span several of these pieces: the brace is tracked across them.
      return rewritten.replace(/[{}]|(?<![A-Za-z0-9_.$])(TRUE|FALSE)(?![A-Za-z0-9_.])(?!\s*\()/gi, (token: string, word?: string) => {
        if (token === "{") inArray = true;
        else if (token === "}") inArray = false;
        else if (inArray && word) return `${word.toUpperCase()}()`;
        return token;
      });
    })
    .join("");
}
