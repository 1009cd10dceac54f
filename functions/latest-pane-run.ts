/**
 * One of the task pane's simulations (pane-tasks.ts) run off the page thread
 * by runCancelable (cancelable.ts): on a worker thread where the page can
 * start one, else in slices between the page's events. Either way the answer
 * is the one the task's pure function gives for the same arguments.
 *
 * Only the latest run counts: starting a run cancels the one before it, and
 * a run that was canceled or superseded resolves to CANCELED, never to an
 * answer, so a stale result cannot overwrite a newer one. The material fit
 * (material-fit-run.ts) and the record's lot verdicts (record-lots-run.ts)
 * each keep one.
 */
import { hostEnvironment, runCancelable, type CancelableEnvironment, type CancelableInvocationLike } from "./cancelable";
import type { CellResult } from "./cells";
import { CANCELED, type Canceled } from "./sliced-run";

export class LatestPaneRun<Outcome> {
  private current: { cancel(): void } | null = null;

  constructor(
    /** The task's name in pane-tasks.ts. */
    private readonly task: string,
    /** Reads what the task returned (its JSON text, or a failure). */
    private readonly outcome: (result: CellResult) => Outcome,
    private readonly environment: () => CancelableEnvironment = hostEnvironment,
  ) {}

  /** True while a run is under way. */
  get running(): boolean {
    return this.current !== null;
  }

  /** Runs the task on `args`, canceling any run still under way; CANCELED if this run is canceled or superseded. */
  protected async start(args: readonly unknown[]): Promise<Outcome | Canceled> {
    this.cancel();
    const invocation: CancelableInvocationLike = {};
    // runCancelable sets onCanceled before its first pause, so the run can be canceled from here on.
    const pending = runCancelable(this.task, args, invocation, this.environment());
    const mine = { cancel: () => invocation.onCanceled?.() };
    this.current = mine;
    try {
      const result = await pending;
      return result === CANCELED || this.current !== mine ? CANCELED : this.outcome(result);
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
