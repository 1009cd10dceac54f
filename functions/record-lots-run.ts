/**
 * The record import's lot verdicts, run off the page thread: each lot of a
 * test-machine record is compared with the rest by the simulated lot check
 * (40,000 seeded samples per pair of lot sizes), which can take seconds for a
 * record with several lots, and the pane must stay responsive meanwhile. It
 * runs like the material fit (latest-pane-run.ts): on a worker thread, else
 * in slices; the lines are the ones lotVerdicts gives for the same lots.
 *
 * Only the latest lots count: asking for other lots cancels the run under
 * way, which then resolves to CANCELED. Asking again for the very lots of the
 * run under way (the user chose another fracture origin, which changes no
 * lot) joins that run instead of restarting it.
 */
import type { LotLine, RecordLot } from "../src/design/record-import-answer";
import { hostEnvironment, type CancelableEnvironment } from "./cancelable";
import { isCellFailure, type CellResult } from "./cells";
import { LatestPaneRun } from "./latest-pane-run";
import { RECORD_LOTS_TASK } from "./pane-tasks";
import type { Canceled } from "./sliced-run";

/** The lines, or why there are none (an internal failure: a refused lot is a line of its own). */
export type RecordLotsOutcome = { lines: LotLine[] } | { error: string };

/** Reads what the task returned (pane-tasks.ts): the lines as JSON text, or a failure with its message. */
export function recordLotsOutcome(result: CellResult): RecordLotsOutcome {
  if (isCellFailure(result)) return { error: result.message };
  if (typeof result !== "string") return { error: "internal error: the lot check returned no answer" };
  return { lines: JSON.parse(result) as LotLine[] };
}

export class RecordLotRuns extends LatestPaneRun<RecordLotsOutcome> {
  private underWay: { key: string; pending: Promise<RecordLotsOutcome | Canceled> } | null = null;

  constructor(environment: () => CancelableEnvironment = hostEnvironment) {
    super(RECORD_LOTS_TASK, recordLotsOutcome, environment);
  }

  /** The verdicts for `lots`; CANCELED if the run is canceled or superseded by other lots. */
  verdicts(lots: readonly RecordLot[]): Promise<RecordLotsOutcome | Canceled> {
    const key = JSON.stringify(lots);
    if (this.running && this.underWay?.key === key) return this.underWay.pending;
    const pending = this.start([lots]);
    this.underWay = { key, pending };
    return pending;
  }
}
