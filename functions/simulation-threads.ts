/**
 * Simulating cell functions on worker threads (the shared runtime is a
 * browser page, which has Worker). Each worker runs one invocation at a time
 * with the same guarded adapter the host would call (simulation-worker.ts);
 * invocations beyond the pool's size wait in a queue. Canceling a queued
 * invocation drops it; canceling a running one terminates its worker, which
 * stops the simulation at once (a new worker takes its place for the next).
 *
 * If a worker cannot start (its file was not deployed beside functions.js, or
 * the host forbids it), that invocation and every later one run in slices on
 * the host's thread instead, with the same values.
 */
import type { CellResult } from "./cells";
import { CANCELED, type Canceled } from "./sliced-run";

/** The part of a Worker this pool uses (a stand-in in tests). */
export interface ThreadLike {
  postMessage(message: SimulationRequest): void;
  terminate(): void;
  onmessage: ((event: { data: SimulationReply }) => void) | null;
  onerror: ((event: unknown) => void) | null;
}

export interface SimulationRequest {
  name: string;
  args: unknown[];
}

export interface SimulationReply {
  result: CellResult;
}

interface Job {
  request: SimulationRequest;
  settle: (result: CellResult | Canceled | ThreadsUnavailable) => void;
  thread?: ThreadLike;
  canceled: boolean;
}

/** The answer when no worker could run the invocation: the caller runs it in slices. */
export const UNAVAILABLE: unique symbol = Symbol("threads unavailable");
export type ThreadsUnavailable = typeof UNAVAILABLE;

export class SimulationThreads {
  private idle: ThreadLike[] = [];
  private running = 0;
  private queue: Job[] = [];
  private broken = false;

  constructor(
    private readonly start: () => ThreadLike,
    private readonly size: number,
  ) {}

  get available(): boolean {
    return !this.broken;
  }

  /** Runs one invocation; `onCancel` receives the function that cancels it. */
  run(request: SimulationRequest, onCancel: (cancel: () => void) => void): Promise<CellResult | Canceled | ThreadsUnavailable> {
    if (this.broken) return Promise.resolve(UNAVAILABLE);
    return new Promise((settle) => {
      const job: Job = { request, settle, canceled: false };
      this.queue.push(job);
      onCancel(() => this.cancel(job));
      this.dispatch();
    });
  }

  private cancel(job: Job): void {
    if (job.canceled) return;
    job.canceled = true;
    const queued = this.queue.indexOf(job);
    if (queued >= 0) this.queue.splice(queued, 1);
    if (job.thread) {
      job.thread.terminate(); // the only way to stop a computation already running on a thread
      job.thread = undefined;
      this.running--;
    }
    job.settle(CANCELED);
    this.dispatch();
  }

  private dispatch(): void {
    while (this.queue.length > 0 && this.running < this.size && !this.broken) {
      const job = this.queue.shift()!;
      let thread: ThreadLike;
      try {
        thread = this.idle.pop() ?? this.start();
      } catch {
        this.fail(job);
        return;
      }
      job.thread = thread;
      this.running++;
      thread.onmessage = (event) => {
        if (job.thread !== thread) return;
        job.thread = undefined;
        this.running--;
        this.idle.push(thread);
        job.settle(event.data.result);
        this.dispatch();
      };
      thread.onerror = () => {
        if (job.thread !== thread) return;
        thread.terminate();
        job.thread = undefined;
        this.running--;
        this.fail(job);
      };
      thread.postMessage(job.request);
    }
  }

  /** A worker that cannot run: this and every waiting invocation go back to the caller, to run in slices. */
  private fail(job: Job): void {
    this.broken = true;
    for (const t of this.idle) t.terminate();
    this.idle = [];
    for (const waiting of [job, ...this.queue.splice(0)]) waiting.settle(UNAVAILABLE);
  }
}
