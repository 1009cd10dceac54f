/**
 * Simulations the task pane asks for, run by the same machinery as the
 * simulating cell functions (cancelable.ts): on a worker thread
 * (simulation-worker.ts) or in slices on the page (sliced-run.ts). They are
 * not cell functions, so they stay out of the registry, its metadata and its
 * reference pages.
 *
 * The thread protocol carries cell results, so a pane task returns its
 * answer as JSON text (a string passes through `guard` unchanged); a refused
 * input comes back as the CellFailure `guard` makes of the InputError, with
 * the same message.
 */
import { materialFitAnswer, type MaterialFitRequest } from "../src/design/material-fit-answer";
import { lotVerdicts, type RecordLot } from "../src/design/record-import-answer";
import { guard, type CellResult } from "./cells";

/** The name the pane's pooled material fit travels under (a space keeps it apart from every cell function's name). */
export const MATERIAL_FIT_TASK = "pane material fit";

/** The name the record import's lot verdicts (each lot against the rest of the record) travel under. */
export const RECORD_LOTS_TASK = "pane record lots";

export const paneTasks: Record<string, (...args: any[]) => unknown> = {
  [MATERIAL_FIT_TASK]: (request: MaterialFitRequest) => JSON.stringify(materialFitAnswer(request)),
  [RECORD_LOTS_TASK]: (lots: RecordLot[]) => JSON.stringify(lotVerdicts(lots)),
};

/** The tasks as a worker runs them: never throwing. */
export const guardedPaneTasks: Record<string, (...args: any[]) => CellResult> = Object.fromEntries(
  Object.entries(paneTasks).map(([name, task]) => [name, guard(task)]),
);
