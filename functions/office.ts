/**
 * Registration in the spreadsheet host. With a shared runtime the task pane
 * page loads this module once, and each guarded adapter is associated with
 * the id functions.json gives it. A CellFailure becomes the host's error
 * object; only #VALUE! and #N/A carry a message there.
 */
import { isCellFailure, type CellResult } from "./cells";
import { guarded } from "./registry";

const CODES = { "#VALUE!": "invalidValue", "#NUM!": "invalidNumber", "#N/A": "notAvailable" } as const;

export function toHostValue(result: CellResult): unknown {
  if (!isCellFailure(result)) return result;
  const code = CustomFunctions.ErrorCode[CODES[result.cellError]];
  return result.cellError === "#NUM!" ? new CustomFunctions.Error(code) : new CustomFunctions.Error(code, result.message);
}

export function registerInHost(): void {
  if (typeof CustomFunctions === "undefined") return;
  for (const [name, fn] of Object.entries(guarded)) {
    CustomFunctions.associate(name, (...args: unknown[]) => toHostValue(fn(...args)));
  }
}
