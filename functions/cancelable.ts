/**
 * How the spreadsheet host runs a simulating function (simulating.ts): on a
 * worker thread where the runtime has Worker (the shared runtime, a browser
 * page), otherwise in slices between the host's events (the JavaScript-only
 * custom-functions runtime has no Worker). Either way the invocation returns
 * a promise, and the host's cancel (it recalculates or the user edits an
 * input before the value arrives) stops the work: the thread is terminated, or
 * no further slice runs. The task pane's simulations (pane-tasks.ts) run the
 * same way.
 */
import type { CellResult } from "./cells";
import { paneTasks } from "./pane-tasks";
import { adapters } from "./registry";
import { SimulationThreads, UNAVAILABLE, type ThreadLike } from "./simulation-threads";
import { CANCELED, runInSlices, type Canceled } from "./sliced-run";

/** The worker script, deployed beside functions.js and the task pane page (scripts/build.mjs). */
export const WORKER_FILE = "simulation-worker.js";

export interface CancelableEnvironment {
  /** Worker threads, or null where the runtime has none. */
  threads: SimulationThreads | null;
  /** Yields to the host's event loop between slices. */
  pause(): Promise<void>;
}

let shared: CancelableEnvironment | null = null;

/** Threads when the runtime has Worker (one per spare core, at most 4), else slices after a zero-delay timer. */
export function hostEnvironment(): CancelableEnvironment {
  if (shared) return shared;
  const cores = typeof navigator !== "undefined" && navigator.hardwareConcurrency > 0 ? navigator.hardwareConcurrency : 2;
  const threads =
    typeof Worker === "function"
      ? new SimulationThreads(() => new Worker(WORKER_FILE) as unknown as ThreadLike, Math.min(4, Math.max(1, cores - 1)))
      : null;
  // A zero-delay timer lets the host's queued events run (the custom-functions runtimes have timers: their streaming
  // samples use setInterval); a bare promise would only let other promises run, still better than no pause at all.
  const pause = typeof setTimeout === "function" ? () => new Promise<void>((resume) => setTimeout(resume, 0)) : () => Promise.resolve();
  shared = { threads, pause };
  return shared;
}

/** The part of the host's invocation object a cancelable function uses. */
export interface CancelableInvocationLike {
  onCanceled?: () => void;
}

export async function runCancelable(
  name: string,
  args: readonly unknown[],
  invocation: CancelableInvocationLike | undefined,
  environment: CancelableEnvironment = hostEnvironment(),
): Promise<CellResult | Canceled> {
  let canceled = false;
  let stopThread: (() => void) | null = null;
  if (invocation) {
    invocation.onCanceled = () => {
      canceled = true;
      stopThread?.();
    };
  }
  if (environment.threads?.available) {
    const result = await environment.threads.run({ name, args: [...args] }, (stop) => {
      stopThread = stop;
      if (canceled) stop();
    });
    if (result !== UNAVAILABLE) return result;
  }
  if (canceled) return CANCELED;
  return runInSlices(adapters[name] ?? paneTasks[name], args, { pause: environment.pause, canceled: () => canceled });
}
