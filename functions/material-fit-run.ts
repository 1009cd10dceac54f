/**
 * The task pane's pooled material fit, run off the page thread: its seeded
 * simulation takes a second or more, and the pane must keep answering
 * clicks meanwhile. It runs like a simulating cell function
 * (cancelable.ts): on a worker thread where the page can start one, else in
 * slices between the page's events; either way the answer is the one
 * materialFitAnswer gives for the same request (the same seeded loop).
 *
 * Only the latest run counts: starting a run cancels the one before it, and
 * a run that was canceled or superseded resolves to CANCELED, never to an
 * answer, so a stale result cannot overwrite a newer one.
 */
import { MATERIAL_SIMULATION } from "../src/design/material-fit-simulation";
import type { MaterialFitAnswer, MaterialFitRequest } from "../src/design/material-fit-answer";
import { hostEnvironment, runCancelable, type CancelableEnvironment, type CancelableInvocationLike } from "./cancelable";
import { isCellFailure, type CellResult } from "./cells";
import { MATERIAL_FIT_TASK } from "./pane-tasks";
import { CANCELED, type Canceled } from "./sliced-run";

/** The answer, or the reason there is none (the message of the refused input). */
export type MaterialFitOutcome = { answer: MaterialFitAnswer } | { error: string };

/** What the pane shows while a run is under way. */
export const MATERIAL_FIT_BUSY = `Simulating ${MATERIAL_SIMULATION.replications.toLocaleString("en-US")} data sets ...`;

/** Reads what the task returned (pane-tasks.ts): the answer as JSON text, or a failure with its message. */
export function materialFitOutcome(result: CellResult): MaterialFitOutcome {
  if (isCellFailure(result)) return { error: result.message };
  if (typeof result !== "string") return { error: "internal error: the material fit returned no answer" };
  return { answer: JSON.parse(result) as MaterialFitAnswer };
}

export class MaterialFitRuns {
  private current: { cancel(): void } | null = null;

  constructor(private readonly environment: () => CancelableEnvironment = hostEnvironment) {}

  /** True while a run is under way. */
  get running(): boolean {
    return this.current !== null;
  }

  /** Runs the fit for `request`, canceling any run still under way; CANCELED if this run is canceled or superseded. */
  async run(request: MaterialFitRequest): Promise<MaterialFitOutcome | Canceled> {
    this.cancel();
    const invocation: CancelableInvocationLike = {};
    // runCancelable sets onCanceled before its first pause, so the run can be canceled from here on.
    const pending = runCancelable(MATERIAL_FIT_TASK, [request], invocation, this.environment());
    const mine = { cancel: () => invocation.onCanceled?.() };
    this.current = mine;
    try {
      const result = await pending;
      return result === CANCELED || this.current !== mine ? CANCELED : materialFitOutcome(result);
    } finally {
      if (this.current === mine) this.current = null;
    }
  }

  /** Stops the run under way, if any: its thread is terminated, or no further slice runs. */
  cancel(): void {
    const run = this.current;
    this.current = null;
    run?.cancel();
  }
}
