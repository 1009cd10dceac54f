/**
 * A simulating cell function run in slices on the host's own thread, for the
 * spreadsheet runtime that has no worker threads (see
 * src/numeric/replication-slices.ts for how the simulations pause). Between
 * slices the host's other work runs (`pause`), and a canceled invocation
 * stops there: no more replications, and no value.
 *
 * The value is the one `guard(adapter)(...args)` returns when run at once:
 * the same adapter, the same seeded simulations, in the same order.
 */
import { withSliceHost, type ReplicationSteps } from "../src/numeric/replication-slices";
import { guard, type CellResult } from "./cells";

export interface SliceControl {
  /** Lets the host run its other work; the run continues when the promise settles. */
  pause(): Promise<void>;
  /** True once the host has canceled this invocation. */
  canceled(): boolean;
}

/** What a canceled run returns instead of a value. */
export const CANCELED: unique symbol = Symbol("canceled");
export type Canceled = typeof CANCELED;

/** Thrown through the adapter when it asks for a simulation not yet run; `guard` turns it into a failure we discard. */
class NotYetSimulated extends Error {
  constructor() {
    super("a simulation still has to run");
  }
}

export async function runInSlices(adapter: (...args: any[]) => unknown, args: readonly unknown[], control: SliceControl): Promise<CellResult | Canceled> {
  const attempt = guard(adapter);
  const done = new Map<string, unknown>();
  for (;;) {
    if (control.canceled()) return CANCELED;
    let next: { name: string; steps: () => ReplicationSteps<unknown> } | null = null;
    const result = withSliceHost(
      {
        simulation<T>(what: string, key: string, steps: () => ReplicationSteps<T>): T {
          const name = `${what}|${key}`;
          if (done.has(name)) return done.get(name) as T;
          next = { name, steps };
          throw new NotYetSimulated();
        },
      },
      () => attempt(...args),
    );
    const pending = next as { name: string; steps: () => ReplicationSteps<unknown> } | null;
    if (pending === null) return result;
    const steps = pending.steps();
    for (;;) {
      // A pause before every slice, the first included: the call itself returns at once, and a cancel
      // that comes while the host runs its other work stops the run before the next slice.
      await control.pause();
      if (control.canceled()) return CANCELED;
      const step = steps.next();
      if (step.done) {
        done.set(pending.name, step.value);
        break;
      }
    }
  }
}
