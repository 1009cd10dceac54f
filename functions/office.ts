/**
 * Registration in the spreadsheet host. With a shared runtime the task pane
 * page loads this module once, and each guarded adapter is associated with
 * the id functions.json gives it. A CellFailure becomes the host's error
 * object; only #VALUE! and #N/A carry a message there.
 */
import { isCellFailure, type CellFailure, type CellResult } from "./cells";
import { guarded } from "./registry";

const CODES = { "#VALUE!": "invalidValue", "#NUM!": "invalidNumber", "#N/A": "notAvailable" } as const;

function hostError(failure: CellFailure): CustomFunctions.Error {
  const code = CustomFunctions.ErrorCode[CODES[failure.cellError]];
  return failure.cellError === "#NUM!" ? new CustomFunctions.Error(code) : new CustomFunctions.Error(code, failure.message);
}

/** A failure becomes the host's error object, also inside a spilled array (CustomFunctionsRuntime 1.2). */
export function toHostValue(result: CellResult): unknown {
  if (isCellFailure(result)) return hostError(result);
  if (Array.isArray(result)) return result.map((row) => row.map((v) => (isCellFailure(v) ? hostError(v) : v)));
  return result;
}

export function registerInHost(): void {
  if (typeof CustomFunctions === "undefined") return;
  for (const [name, fn] of Object.entries(guarded)) {
    CustomFunctions.associate(name, (...args: unknown[]) => toHostValue(fn(...args)));
  }
}
