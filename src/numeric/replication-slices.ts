/**
 * Simulations that can run in slices. Each simulation loop is written as a
 * generator that pauses (`yield`) between batches of replications. By
 * default `simulate` runs it to the end at once, so the command line, the
 * tests and a worker thread get exactly the computation they always had.
 *
 * A spreadsheet runtime without threads cannot hold its event loop for the
 * seconds a large censored sample takes. There a slice host is installed for
 * one attempt at a cell function: the first simulation the function asks for
 * that the host has not finished yet stops the attempt (the host records the
 * loop and throws); the host runs that loop a slice at a time between
 * events, then tries the function again, now answering that simulation from
 * what it kept. Simulations are seeded from their input, so the loop the host
 * ran is the one the function would have run, and the final attempt computes
 * the very numbers the all-at-once run does.
 *
 * Two rules for a simulation loop: everything it fills is created inside the
 * generator and returned (the host may run it apart from the call that asked),
 * and `key` names its inputs (an attempt may skip a simulation an earlier one
 * put in a cache, so the host matches results by key, not by order).
 */

/** A simulation loop: pauses between slices, returns its result. */
export type ReplicationSteps<T> = Generator<void, T, void>;

/** Replacement for the all-at-once run, installed by `withSliceHost` for the length of one call. */
export interface SliceHost {
  simulation<T>(what: string, key: string, steps: () => ReplicationSteps<T>): T;
}

let host: SliceHost | null = null;

/** Runs a generator to its end, ignoring its pauses. */
export function runToEnd<T>(steps: ReplicationSteps<T>): T {
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
  }
}

/** The result of the simulation loop `steps`: `what` it simulates, and a `key` that tells its inputs apart. */
export function simulate<T>(what: string, key: string, steps: () => ReplicationSteps<T>): T {
  return host ? host.simulation(what, key, steps) : runToEnd(steps());
}

/** Calls `body` with `sliceHost` answering every simulation it asks for. */
export function withSliceHost<T>(sliceHost: SliceHost, body: () => T): T {
  const previous = host;
  host = sliceHost;
  try {
    return body();
  } finally {
    host = previous;
  }
}

/**
 * How many replications make one slice, from the cost of one replication in
 * units of SLICE_UNITS per slice. Each loop states its cost (a multiple of its
 * sample size), set so that a slice took 4 to 9 ms (medians) on a two-core
 * machine under a load of 9, measured with a throwaway script: long enough
 * that the pauses (a timer each, clamped to 1 to 4 ms by the runtimes) cost
 * little, short enough that the host's events barely wait. The slices never
 * change a value, only where the loop pauses.
 */
const SLICE_UNITS = 20000;

export function replicationsPerSlice(costPerReplication: number): number {
  return Math.max(1, Math.floor(SLICE_UNITS / Math.max(1, costPerReplication)));
}
