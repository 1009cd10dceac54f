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

/** The standard value for an engine error code, with a message that keeps what the engine said. */
export function standardError(code: string, message?: string): ShownError {
  const said = message ? firstLine(message) : "";
  const mapped = ENGINE_ONLY[code];
  if (mapped) return { value: mapped.value, message: `${mapped.meaning} (engine: ${code}${said ? ` ${said}` : ""})` };
  if ((STANDARD_ERRORS as readonly string[]).includes(code)) return { value: code as StandardError, ...(said ? { message: said } : {}) };
  return { value: "#VALUE!", message: `unknown error ${code}${said ? `: ${said}` : ""}` };
}

function firstLine(text: string): string {
  return text.split("\n")[0].trim();
}
