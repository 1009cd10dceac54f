/**
 * Registration in the spreadsheet host. With a shared runtime the task pane
 * page loads this module once, and each guarded adapter is associated with
 * the id functions.json gives it. A CellFailure becomes the host's error
 * object; only #VALUE! and #N/A carry a message there.
 *
 * The functions that simulate (simulating.ts) are declared @cancelable: the
 * host passes a CancelableInvocation after their arguments, and they return
 * a promise (cancelable.ts runs them off the host's thread, or in slices).
 */
import { isCellFailure, type CellFailure, type CellResult } from "./cells";
import { runCancelable } from "./cancelable";
import { adapters, guarded } from "./registry";
import { SIMULATING } from "./simulating";
import { CANCELED } from "./sliced-run";

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

/**
 * A simulating function as the host calls it: its declared arguments, then the invocation. The host
 * discards what a canceled invocation returns; it gets an error saying so rather than a value.
 */
export function cancelableInHost(name: string): (...args: unknown[]) => Promise<unknown> {
  const arity = adapters[name].length; // the declared parameters, as functions.json lists them (checked in the tests)
  return async (...args: unknown[]) => {
    const invocation = args[arity] as CustomFunctions.CancelableInvocation | undefined;
    const result = await runCancelable(name, args.slice(0, arity), invocation);
    if (result === CANCELED) return hostError({ cellError: "#N/A", message: "canceled before the simulation finished" });
    return toHostValue(result);
  };
}

export function registerInHost(): void {
  if (typeof CustomFunctions === "undefined") return;
  for (const [name, fn] of Object.entries(guarded)) {
    if (SIMULATING.includes(name)) CustomFunctions.associate(name, cancelableInHost(name));
    else CustomFunctions.associate(name, (...args: unknown[]) => toHostValue(fn(...args)));
  }
}
