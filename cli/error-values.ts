/**
 * Error values as a spreadsheet application knows them. The engine has a few
 * of its own (#ERROR!, #CYCLE!, #LIC!, #SPILL!) that no spreadsheet reads
 * from a file; each maps to the standard value closest in meaning, and the
 * engine's code and message stay in the result's message. A number that is
 * not finite is #NUM!: a result beyond double precision.
 */

/** The error values of the file format (ECMA-376 Part 1, 18.17.2.6, the error type). */
export const STANDARD_ERRORS = ["#NULL!", "#DIV/0!", "#VALUE!", "#REF!", "#NAME?", "#NUM!", "#N/A"] as const;
export type StandardError = (typeof STANDARD_ERRORS)[number];

const ENGINE_ONLY: Record<string, { value: StandardError; meaning: string }> = {
  "#ERROR!": { value: "#VALUE!", meaning: "the formula cannot be read" },
  "#CYCLE!": { value: "#REF!", meaning: "circular reference: the formula depends on its own result" },
  "#LIC!": { value: "#VALUE!", meaning: "the formula engine refused to evaluate" },
  "#SPILL!": { value: "#REF!", meaning: "the result does not fit: other cells are in the way" },
};

export const NOT_REPRESENTABLE = "too large to represent";

export interface ShownError {
  value: StandardError;
  /** One line; for an engine-only error it names the engine's code. */
  message?: string;
}

/**
 * The standard value for an engine error code, with a message that keeps what the engine said.
 * formula: the cell's formula, when the error is a formula's own; the engine's wording about it
 * (a parse error in the parser's terms, an unknown function or name) is then said in a spreadsheet's terms.
 */
export function standardError(code: string, message?: string, formula?: string): ShownError {
  const said = message ? firstLine(message) : "";
  const plain = formula === undefined ? undefined : plainWording(code, said, formula);
  const mapped = ENGINE_ONLY[code];
  if (plain !== undefined) return { value: mapped ? mapped.value : (code as StandardError), message: mapped ? `${plain} (engine: ${code})` : plain };
  if (mapped) return { value: mapped.value, message: `${mapped.meaning} (engine: ${code}${said ? ` ${said}` : ""})` };
  if ((STANDARD_ERRORS as readonly string[]).includes(code)) return { value: code as StandardError, ...(said ? { message: said } : {}) };
  return { value: "#VALUE!", message: `unknown error ${code}${said ? `: ${said}` : ""}` };
}

function firstLine(text: string): string {
  return text.split("\n")[0].trim();
}

/** Spreadsheet features the engine lacks, recognised in the formula text, with what to write instead. */
const UNSUPPORTED: { test: RegExp; say: string }[] = [
  { test: /\[[^\]]*\.xl[a-z]*\]|\[\d+\][^!]*!/i, say: "it refers to another workbook, which brittle calc does not open: copy the values into this workbook" },
  { test: /(?<![A-Za-z0-9_.])R(?:\[-?\d+\]|\d+)?C(?:\[-?\d+\]|\d+)?(?![A-Za-z0-9_(])/, say: "R1C1-style references are not supported: use A1-style references (B2, A2:A31)" },
  { test: /[A-Za-z_][A-Za-z0-9_.]*\[/, say: "table references such as Table1[Column] are not supported: use the cell range of the column (B2:B31)" },
  { test: /\|/, say: "a link to another program (DDE, as in =cmd|'...'!A0) is never evaluated" },
  { test: /(?<![A-Za-z0-9_.])@/, say: "the implicit intersection operator @ is not supported: remove the @, or refer to the one cell meant" },
  { test: /\$?[A-Za-z]{1,3}\$?\d+#/, say: "a reference to a spilled range (A1#) is not supported: use the range the array fills (A1:A10)" },
];

/**
 * A message in a spreadsheet's terms for what the engine said about a formula, or undefined to keep the
 * engine's (its messages about function arguments, "Value cannot be coerced to number." and the like, are plain).
 */
function plainWording(code: string, said: string, formula: string): string | undefined {
  if (code === "#ERROR!" && said.startsWith("Parsing error")) return `the formula cannot be read: ${parseProblem(said, formula)}`;
  const fn = /^Function name (.+) not recognized\.$/.exec(said);
  if (fn) {
    const name = fn[1];
    if (/^(ANCHORARRAY)$/i.test(name)) return "a reference to a spilled range (A1#) is not supported: use the range the array fills (A1:A10)";
    if (/^(SINGLE)$/i.test(name)) return "the implicit intersection operator @ is not supported: remove the @, or refer to the one cell meant";
    if (/^BRITTLE\./i.test(name)) return `${name} is not one of the add-in's functions (the function reference lists them)`;
    return `unknown function ${name}: it is not a function brittle calc evaluates (its formula engine lacks some spreadsheet functions, LET and LAMBDA among them)`;
  }
  const named = /^Named expression (.+) not recognized\.$/.exec(said);
  if (named) {
    // The engine reads an array constant before any defined name: {Survival} is #NAME? even where Survival is defined.
    const inArray = formula.includes("{") ? " (or it stands inside an array constant { }, which holds only numbers, text, TRUE, FALSE and error values)" : "";
    return `${named[1]} is neither a function, a cell reference nor a defined name of this workbook${inArray}`;
  }
  if (said === "Sheet does not exist.") {
    const other = UNSUPPORTED[0];
    return other.test.test(outsideQuotes(formula, true)) ? other.say : "the formula refers to a sheet that is not in this workbook";
  }
  if (said === "Address is not correct.") return "the formula refers to a cell outside the sheet (rows 1 to 1,048,576, columns A to XFD)";
  return undefined;
}

/** What the parser stumbled on, in words: a hint for a known unsupported form, else the token and the place. */
function parseProblem(said: string, formula: string): string {
  const code = outsideQuotes(formula, false);
  for (const { test, say } of UNSUPPORTED) if (test.test(code)) return say;
  const unexpected = /unexpected character: ->(.+?)<- at offset: (\d+)/.exec(said);
  if (unexpected) {
    const [, said1, offset] = unexpected;
    // The parser names one UTF-16 unit: half of a character beyond the first plane (an emoji), which prints as "?".
    const at = formula.codePointAt(Number(offset));
    const ch = at !== undefined && formula.charAt(Number(offset)) === said1.charAt(0) ? String.fromCodePoint(at) : said1;
    if (ch === '"') return `a text in quotes is not closed (the quote at character ${Number(offset) + 1})`;
    if (ch === "#") return `"#" at character ${Number(offset) + 1} is not understood (an error value such as #N/A is written whole, and A1# is not supported)`;
    return `"${ch}" at character ${Number(offset) + 1} is not understood there`;
  }
  if (said.includes("Unknown error literal")) {
    const literal = /#[A-Za-z0-9_/]+[!?]?/.exec(code)?.[0];
    return `${literal ?? "the error value"} is not an error value the formula engine knows (it knows #N/A, #DIV/0!, #VALUE!, #REF!, #NAME?, #NUM!)`;
  }
  const expected = /Expecting token of type --> (\w+) <-- but found --> '(.*)' <--/.exec(said);
  if (expected) {
    const want = TOKEN_WORDS[expected[1]] ?? expected[1];
    const found = expected[2];
    if (found === "") return `${want} is missing at the end`;
    if (found === ";") return `";" where ${want} or a comma was expected (arguments are separated by commas)`;
    return `"${found}" where ${want} was expected`;
  }
  const redundant = /Redundant input, expecting EOF but found: (.*)$/.exec(said);
  if (redundant) {
    const found = redundant[1];
    if (found === ")") return "a closing parenthesis ) has no opening one";
    if (found === "}") return "a closing brace } has no opening one";
    if (found === "(") return "a ( follows a complete expression (a LAMBDA called in place is not supported)";
    return `"${found}" follows a complete formula`;
  }
  if (said.includes("Expecting: one of these possible Token sequences")) {
    return "a value, reference or function is missing where one is expected (the formula is empty, ends in an operator, or has two operators in a row such as ==)";
  }
  return "its syntax is not one the formula engine reads";
}

const TOKEN_WORDS: Record<string, string> = {
  RParen: "a closing parenthesis )",
  ArrayRParen: "a closing brace }",
  LParen: "an opening parenthesis (",
  ArrayLParen: "an opening brace {",
};

/**
 * The formula with string literals blanked (and, unless keepSheetNames, quoted sheet names too), so text in
 * quotes never looks like a reference.
 */
function outsideQuotes(formula: string, keepSheetNames: boolean): string {
  const blanked = formula.replace(/"(?:[^"]|"")*"/g, '""');
  return keepSheetNames ? blanked : blanked.replace(/'(?:[^']|'')*'/g, "''");
}
