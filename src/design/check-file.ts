/**
 * The check file, `*.check.json`: one design check with every input (test
 * data included), so it can be reopened in the task pane, rerun with
 * `brittle check FILE`, reviewed and signed. docs/check-file.md documents
 * every field.
 *
 *   { "format": "brittle-design-check", "version": 1, "title": ..., "material": ..., ... }
 *
 * The fields after "version" are a CheckDescription (check-description.ts).
 * Reading is strict: a wrong format or a newer version, malformed JSON, an
 * unknown field or a bad value is refused with a message naming the field
 * (or the line and column of a JSON syntax error). Files arrive as bytes in
 * UTF-8 (with or without a byte-order mark) or UTF-16 with its mark.
 */
import { CHECK_FORMAT, CHECK_FORMAT_VERSION, type CheckDescription } from "./check-description";
import { CheckFieldError, validateCheckDescription } from "./check-validate";
import { mixedListSeparators } from "./json-decimal-commas";
import { firstDuplicateKey, pathAt } from "./json-duplicate-keys";

export { CheckFieldError } from "./check-validate";

/** Largest check file read, in bytes: an element table of a million rows fits well within it. */
export const MAX_CHECK_FILE_BYTES = 200 * 1024 * 1024;

/**
 * Decodes a check file's bytes: UTF-8 (a byte-order mark is dropped), or
 * UTF-16 little- or big-endian when the file starts with that mark. Invalid
 * UTF-8 is refused rather than read with replacement characters.
 *
 * @example decodeCheckFile(new Uint8Array([0xef, 0xbb, 0xbf, 0x7b, 0x7d])) // "{}"
 */
export function decodeCheckFile(bytes: Uint8Array): string {
  if (bytes.length > MAX_CHECK_FILE_BYTES) {
    throw new CheckFieldError("", `the file has ${bytes.length} bytes, more than the ${MAX_CHECK_FILE_BYTES} a check file may have`);
  }
  let encoding = "utf-8";
  let start = 0;
  if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) start = 3;
  else if (bytes[0] === 0xff && bytes[1] === 0xfe) [encoding, start] = ["utf-16le", 2];
  else if (bytes[0] === 0xfe && bytes[1] === 0xff) [encoding, start] = ["utf-16be", 2];
  else if (bytes.length >= 2 && (bytes[0] === 0 || bytes[1] === 0)) {
    throw new CheckFieldError("", "the file looks like UTF-16 without a byte-order mark: save it as UTF-8");
  }
  try {
    return new TextDecoder(encoding, { fatal: true }).decode(bytes.subarray(start));
  } catch {
    throw new CheckFieldError("", `the file is not valid ${encoding.toUpperCase()} text: save it as UTF-8`);
  }
}

/**
 * Reads a check file's text into a validated description.
 *
 * @example parseCheckFile(serializeCheckFile(description)) // deep-equal to description
 */
export function parseCheckFile(text: string): CheckDescription {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  let value: unknown;
  try {
    value = JSON.parse(body);
  } catch (error) {
    throw new CheckFieldError("", `not a JSON file: ${syntaxWhere(body, error)}`);
  }
  const twice = firstDuplicateKey(body);
  if (twice) {
    throw new CheckFieldError(
      twice.path === "" ? twice.key : `${twice.path}.${twice.key}`,
      `written twice (lines ${twice.firstLine} and ${twice.line}); a JSON reader would keep only the last one: remove the one you do not mean`,
    );
  }
  const mixed = mixedListSeparators(body);
  if (mixed) {
    throw new CheckFieldError(
      pathAt(body, mixed.position + 1),
      `line ${mixed.line}: ${mixed.text} separates numbers by "," in some places and ", " in others: decimal commas? JSON numbers take a point (412.5, not 412,5)`,
    );
  }
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    throw new CheckFieldError("", "a check file holds one JSON object");
  }
  const o = value as Record<string, unknown>;
  if (o.format !== CHECK_FORMAT) {
    throw new CheckFieldError("format", `expected "${CHECK_FORMAT}" (got ${JSON.stringify(o.format) ?? "nothing"}): this is not a design-check file`);
  }
  if (typeof o.version !== "number" || !Number.isInteger(o.version) || o.version < 1) {
    throw new CheckFieldError("version", `expected a whole number (got ${JSON.stringify(o.version) ?? "nothing"})`);
  }
  if (o.version > CHECK_FORMAT_VERSION) {
    throw new CheckFieldError("version", `the file is format version ${o.version}, newer than the version ${CHECK_FORMAT_VERSION} this program reads: update the add-in`);
  }
  const description = validateCheckDescription(o);
  // A file must write these even when they do not apply (null): a file without them would be checked as if there were
  // no slow crack growth, no proof test or no applied stress, which check-file.md marks required for that reason.
  // (After the validation, so that a misspelt name is reported as the unknown field it is.)
  for (const [field, write] of MEANINGFUL_NULLS) {
    if (!(field in o)) throw new CheckFieldError(field, `missing: ${write}`);
  }
  return description;
}

/** Required fields whose null means "none": what to write instead of leaving them out. */
const MEANINGFUL_NULLS: readonly [string, string][] = [
  ["appliedStress", "give the applied peak stress, or null to use the peak of the part's element table"],
  ["lifetime", "write null when slow crack growth is not part of the check, else the lifetime, n and B"],
  ["proof", "write null when the parts are not proof-tested, else { \"proofStress\": P }"],
];

/**
 * Reads a check file from its bytes (decoding, then parseCheckFile).
 *
 * @example parseCheckFileBytes(new Uint8Array(await file.arrayBuffer()))
 */
export function parseCheckFileBytes(bytes: Uint8Array): CheckDescription {
  return parseCheckFile(decodeCheckFile(bytes));
}

/**
 * Writes a description as a check file: format and version first, then the
 * fields in the order docs/check-file.md lists them, two-space indented, with
 * lists of numbers or flags on one line so the data stay readable.
 *
 * @example serializeCheckFile(description) // '{\n  "format": "brittle-design-check",\n  "version": 1, ...'
 */
export function serializeCheckFile(description: CheckDescription): string {
  const d = validateCheckDescription(description);
  const ordered: Record<string, unknown> = { format: CHECK_FORMAT, version: CHECK_FORMAT_VERSION };
  if (d.title !== undefined) ordered.title = d.title;
  Object.assign(ordered, {
    material: d.material,
    stressUnit: d.stressUnit,
    confidence: d.confidence,
    flaws: d.flaws,
    sizeUnit: d.sizeUnit,
    criterion: d.criterion,
    specimen: d.specimen,
    part: d.part,
    requirement: d.requirement,
  });
  if (d.confirmLowSurvival !== undefined) ordered.confirmLowSurvival = d.confirmLowSurvival;
  Object.assign(ordered, { appliedStress: d.appliedStress, lotSize: d.lotSize, lifetime: d.lifetime, proof: d.proof });
  return pretty(ordered, "") + "\n";
}

function pretty(value: unknown, indent: string): string {
  if (Array.isArray(value)) {
    if (value.every((v) => v === null || typeof v !== "object")) return `[${value.map((v) => JSON.stringify(v)).join(", ")}]`;
    const inner = indent + "  ";
    return `[\n${value.map((v) => inner + pretty(v, inner)).join(",\n")}\n${indent}]`;
  }
  if (value !== null && typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined);
    if (entries.length === 0) return "{}";
    const inner = indent + "  ";
    return `{\n${entries.map(([k, v]) => `${inner}${JSON.stringify(k)}: ${pretty(v, inner)}`).join(",\n")}\n${indent}}`;
  }
  return JSON.stringify(value);
}

/** "line 3, column 14: ..." from a JSON syntax error, where the engine gives a position. */
function syntaxWhere(text: string, error: unknown): string {
  const message = error instanceof Error ? error.message : String(error);
  const at = /position (\d+)/.exec(message);
  const token = TOKEN_IN_CONTEXT.exec(message);
  const position = at ? Number(at[1]) : token ? tokenPosition(text, token) : null;
  if (position === null) return message;
  const before = text.slice(0, position);
  const line = before.split("\n").length;
  const column = position - before.lastIndexOf("\n");
  const what = token ? `Unexpected token '${token[1]}'` : message.replace(/\s*in JSON at position \d+.*$/, "").replace(/\s*\(line \d+ column \d+\)$/, "");
  return `line ${line}, column ${column}: ${what}${editHint(text, position)}`;
}

/**
 * The reader's message for some errors gives no position, only the text around the token (which may
 * span lines): `Unexpected token 'N', ..."Stress": NaN, "l"... is not valid JSON`. The context runs
 * from 10 characters before the token (V8's JSON parser; "..." when cut) to 10 after it.
 */
const TOKEN_IN_CONTEXT = /^Unexpected token '(.)', (\.\.\.)?"([\s\S]*?)"(\.\.\.)? is not valid JSON$/;

function tokenPosition(text: string, m: RegExpExecArray): number | null {
  const [, token, cutBefore, context, cutAfter] = m;
  if (cutBefore) {
    const at = text.indexOf(context);
    return at < 0 ? null : at + 10;
  }
  if (cutAfter) return context.length - 10;
  const at = text.indexOf(token);
  return at < 0 ? null : at;
}

const COMMENT_HINT = " (comments are not allowed in JSON: remove them)";

/** What a hand-edited file most often holds at a syntax error, and what to do about it. */
function editHint(text: string, position: number): string {
  const rest = text.slice(position, position + 10);
  const before = text.slice(Math.max(0, position - 200), position);
  if (rest.startsWith("//") || rest.startsWith("/*")) return COMMENT_HINT;
  if (/^[\]}]/.test(rest) && /,\s*$/.test(before)) return " (a comma before a closing bracket is not allowed in JSON: remove it)";
  if (/^-?(NaN|Infinity)/.test(rest)) return " (a word where a number belongs: JSON numbers are digits)";
  if (rest.startsWith("+")) return " (a JSON number has no plus sign: remove it)";
  if (rest.startsWith("'")) return " (JSON takes double quotes around names and text)";
  if (/^\d/.test(rest) && /\d,\s*$/.test(before)) return " (a decimal comma? JSON numbers take a point: 150.5, not 150,5)";
  return "";
}
