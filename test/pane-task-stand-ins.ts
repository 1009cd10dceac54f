// A worker stand-in for the pane's tasks (functions/pane-tasks.ts), shared by the tests of the runs that use them:
// it runs the worker's own task table when the test says so (`reply`), on copies as a real worker gets them.
import type { CancelableEnvironment } from "../functions/cancelable";
import { guardedPaneTasks } from "../functions/pane-tasks";
import { SimulationThreads, type ThreadLike } from "../functions/simulation-threads";

export class StandInThread implements ThreadLike {
  onmessage: ((event: { data: any }) => void) | null = null;
  onerror: ((event: unknown) => void) | null = null;
  received: { name: string; args: unknown[] }[] = [];
  terminated = false;
  postMessage(message: { name: string; args: unknown[] }) {
    this.received.push(structuredClone(message));
  }
  reply() {
    const { name, args } = this.received[this.received.length - 1];
    this.onmessage!({ data: structuredClone({ result: guardedPaneTasks[name](...args) }) });
  }
  terminate() {
    this.terminated = true;
  }
}

/** A pool of one stand-in thread at a time; `started` lists every thread it started. */
export function withStandIns(): { started: StandInThread[]; environment: () => CancelableEnvironment } {
  const started: StandInThread[] = [];
  const pool = new SimulationThreads(() => {
    const thread = new StandInThread();
    started.push(thread);
    return thread;
  }, 1);
  return { started, environment: () => ({ threads: pool, pause: async () => {} }) };
}

