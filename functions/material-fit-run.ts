/**
 * The task pane's pooled material fit, run off the page thread: its seeded
 * simulation takes a second or more, and the pane must keep answering
 * clicks meanwhile. It runs like a simulating cell function
 * (cancelable.ts): on a worker thread where the page can start one, else in
 * slices between the page's events; either way the answer is the one
 * materialFitAnswer gives for the same request (the same seeded loop).
 *
 * Only the latest run counts (latest-pane-run.ts): a run that was canceled
 * or superseded resolves to CANCELED, never to an answer.
 */
import { MATERIAL_SIMULATION } from "../src/design/material-fit-simulation";
import type { MaterialFitAnswer, MaterialFitRequest } from "../src/design/material-fit-answer";
import { hostEnvironment, type CancelableEnvironment } from "./cancelable";
import { isCellFailure, type CellResult } from "./cells";
import { LatestPaneRun } from "./latest-pane-run";
import { MATERIAL_FIT_TASK } from "./pane-tasks";
import type { Canceled } from "./sliced-run";

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

/** The material fit's runs: the latest only (latest-pane-run.ts). */
export class MaterialFitRuns extends LatestPaneRun<MaterialFitOutcome> {
  constructor(environment: () => CancelableEnvironment = hostEnvironment) {
    super(MATERIAL_FIT_TASK, materialFitOutcome, environment);
  }

  /** Runs the fit for `request`, canceling any run still under way; CANCELED if this run is canceled or superseded. */
  run(request: MaterialFitRequest): Promise<MaterialFitOutcome | Canceled> {
    return this.start([request]);
  }
}
