/**
 * A small reader for the formula text of one cell, enough to explain a
 * BRITTLE call without a formula engine in the pane: the function name and
 * each argument as a reference (A1, $B$2:$B$30, 'Lot 3'!C2:C9, a defined
 * name), a constant (number, text, TRUE/FALSE, an array constant {1,2;3,4}),
 * an omitted argument, a nested BRITTLE call, or any other expression, kept
 * as text and not evaluated (the pane says so rather than guessing).
 *
 * The host's `Range.formulas` gives formulas in the invariant (English)
 * syntax: comma between arguments, semicolon between array rows, a point as
 * the decimal mark. The form a workbook file stores for add-in functions,
 * `_xldudf_BRITTLE_FIT(...)`, is read as BRITTLE.FIT.
 */

export type Constant = number | string | boolean;

export type Argument =
  | { kind: "omitted"; text: "" }
  | { kind: "constant"; text: string; value: Constant }
  | { kind: "array"; text: string; value: Constant[][] }
  | { kind: "reference"; text: string; sheet: string | null; address: string }
  | { kind: "name"; text: string; name: string }
  | { kind: "call"; text: string; call: BrittleCall }
  | { kind: "expression"; text: string };

export interface BrittleCall {
  /** The name after "BRITTLE.", upper case. */
  name: string;
  /** The call as written. */
  text: string;
  args: Argument[];
}

export interface ParsedFormula {
  formula: string;
  /** The first BRITTLE call in the formula (outermost, leftmost). */
  call: BrittleCall;
  /** True when the formula is more than that one call (the rest is the spreadsheet's own). */
  wrapped: boolean;
}

export class FormulaError extends Error {}

// A BRITTLE function name as a formula or a stored workbook writes it.
const CALL_START = /(?:BRITTLE\.|_xldudf_BRITTLE_)([A-Z][A-Z0-9]*)\s*\(/iy;
const CELL = String.raw`\$?[A-Z]{1,3}\$?[0-9]{1,7}`;
const COLUMN = String.raw`\$?[A-Z]{1,3}`;
const ROW = String.raw`\$?[0-9]{1,7}`;
const AREA = `(?:${CELL}(?::${CELL})?|${COLUMN}:${COLUMN}|${ROW}:${ROW})`;
const SHEET = String.raw`(?:'(?:[^']|'')+'|[A-Za-z_][A-Za-z0-9_.]*)`;
const REFERENCE = new RegExp(`^(?:(${SHEET})!)?(${AREA})$`, "i");
const NAME = /^[A-Za-z_\\][A-Za-z0-9_.]*$/;
const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?%?$/;

/**
 * Read a cell's formula. Throws FormulaError when it is not a formula or
 * holds no BRITTLE call, with words a user can act on.
 */
export function parseFormula(formula: string): ParsedFormula {
  const text = formula.trim();
  if (!text.startsWith("=")) throw new FormulaError("The selected cell holds a value, not a formula.");
  const body = text.slice(1).trim();
  const start = findCall(body);
  if (start < 0) throw new FormulaError("The selected cell's formula has no BRITTLE function.");
  const { call, end } = readCall(body, start);
  return { formula: text, call, wrapped: start > 0 || body.slice(end).trim() !== "" };
}

/** Position of the first BRITTLE call outside text constants, or -1. */
function findCall(body: string): number {
  for (let i = 0; i < body.length; i++) {
    const ch = body[i];
    if (ch === '"') {
      i = skipString(body, i) - 1;
      continue;
    }
    if (ch === "'") {
      i = skipQuotedSheet(body, i) - 1;
      continue;
    }
    // A name starts here only after a character that cannot be part of one.
    if (i > 0 && /[A-Za-z0-9_.$]/.test(body[i - 1])) continue;
    CALL_START.lastIndex = i;
    if (CALL_START.test(body)) return i;
  }
  return -1;
}

function readCall(body: string, start: number): { call: BrittleCall; end: number } {
  CALL_START.lastIndex = start;
  const head = CALL_START.exec(body);
  if (!head) throw new FormulaError(`No BRITTLE call at position ${start + 1}.`);
  const name = head[1].toUpperCase();
  let i = CALL_START.lastIndex;
  const pieces: string[] = [];
  let depth = 0;
  let from = i;
  for (; i < body.length; i++) {
    const ch = body[i];
    if (ch === '"') {
      i = skipString(body, i) - 1;
    } else if (ch === "'") {
      i = skipQuotedSheet(body, i) - 1;
    } else if (ch === "(" || ch === "{") {
      depth++;
    } else if (ch === ")" || ch === "}") {
      if (depth === 0) {
        if (ch === "}") throw new FormulaError(`Unbalanced "}" in BRITTLE.${name}.`);
        pieces.push(body.slice(from, i));
        const end = i + 1;
        const args = pieces.length === 1 && pieces[0].trim() === "" ? [] : pieces.map(readArgument);
        return { call: { name, text: body.slice(start, end), args }, end };
      }
      depth--;
    } else if (ch === "," && depth === 0) {
      pieces.push(body.slice(from, i));
      from = i + 1;
    }
  }
  throw new FormulaError(`BRITTLE.${name}( has no closing parenthesis.`);
}

function readArgument(raw: string): Argument {
  const text = raw.trim();
  if (text === "") return { kind: "omitted", text: "" };
  const constant = readConstant(text);
  if (constant !== undefined) return { kind: "constant", text, value: constant };
  if (text.startsWith("{") && text.endsWith("}")) return { kind: "array", text, value: readArray(text) };
  const ref = REFERENCE.exec(text);
  if (ref) {
    const sheet = ref[1] ? unquoteSheet(ref[1]) : null;
    return { kind: "reference", text, sheet, address: ref[2].toUpperCase() };
  }
  CALL_START.lastIndex = 0;
  if (CALL_START.test(text)) {
    const { call, end } = readCall(text, 0);
    if (end === text.length) return { kind: "call", text, call };
  }
  if (NAME.test(text) && !/^(TRUE|FALSE)$/i.test(text)) return { kind: "name", text, name: text };
  return { kind: "expression", text };
}

function readConstant(text: string): Constant | undefined {
  if (NUMBER.test(text)) {
    const percent = text.endsWith("%");
    const value = Number(percent ? text.slice(0, -1) : text);
    return percent ? value / 100 : value;
  }
  if (/^TRUE$/i.test(text)) return true;
  if (/^FALSE$/i.test(text)) return false;
  if (text.startsWith('"') && skipString(text, 0) === text.length) return text.slice(1, -1).replace(/""/g, '"');
  return undefined;
}

function readArray(text: string): Constant[][] {
  const inner = text.slice(1, -1);
  const rows: Constant[][] = [];
  for (const rowText of splitOutsideStrings(inner, ";")) {
    rows.push(
      splitOutsideStrings(rowText, ",").map((item) => {
        const value = readConstant(item.trim());
        if (value === undefined) throw new FormulaError(`The array constant ${text} holds "${item.trim()}", which is not a constant.`);
        return value;
      }),
    );
  }
  if (rows.some((r) => r.length !== rows[0].length)) throw new FormulaError(`The rows of the array constant ${text} differ in length.`);
  return rows;
}

function splitOutsideStrings(text: string, separator: string): string[] {
  const parts: string[] = [];
  let from = 0;
  for (let i = 0; i < text.length; i++) {
    if (text[i] === '"') i = skipString(text, i) - 1;
    else if (text[i] === separator) {
      parts.push(text.slice(from, i));
      from = i + 1;
    }
  }
  parts.push(text.slice(from));
  return parts;
}

/** Index just past a "..." constant starting at `i` ("" inside is a quote). */
function skipString(text: string, i: number): number {
  for (let j = i + 1; j < text.length; j++) {
    if (text[j] !== '"') continue;
    if (text[j + 1] === '"') {
      j++;
      continue;
    }
    return j + 1;
  }
  throw new FormulaError("A text constant in the formula has no closing quote.");
}

/** Index just past a '...' sheet name starting at `i` ('' inside is a quote). */
function skipQuotedSheet(text: string, i: number): number {
  for (let j = i + 1; j < text.length; j++) {
    if (text[j] !== "'") continue;
    if (text[j + 1] === "'") {
      j++;
      continue;
    }
    return j + 1;
  }
  throw new FormulaError("A quoted sheet name in the formula has no closing quote.");
}

function unquoteSheet(sheet: string): string {
  return sheet.startsWith("'") ? sheet.slice(1, -1).replace(/''/g, "'") : sheet;
}

/** Every reference and defined name the call reads, nested calls included, each once. */
export function referencesOf(call: BrittleCall): Argument[] {
  const seen = new Map<string, Argument>();
  const walk = (c: BrittleCall) => {
    for (const a of c.args) {
      if (a.kind === "reference" || a.kind === "name") seen.set(referenceKey(a), a);
      else if (a.kind === "call") walk(a.call);
    }
  };
  walk(call);
  return [...seen.values()];
}

/** One key per distinct reference, for looking up what the host read. */
export function referenceKey(a: Argument): string {
  if (a.kind === "reference") return `${a.sheet ?? ""}!${a.address}`;
  if (a.kind === "name") return `name:${a.name.toUpperCase()}`;
  return a.text;
}
