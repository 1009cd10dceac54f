/**
 * Timing for `npm run bench`. Two ways to time:
 * - `alternate`: the project and its peers take turns (ours, peer, ours, peer, ...) with the
 *   same number of untimed warm-up turns first, so a busy machine or a slow drift in clock
 *   speed falls on both sides alike. Every paired row uses it.
 * - `median`: the project alone (rows with no peer), after one warm-up call.
 * Both report the median with the fastest and slowest timed run beside it.
 */

/** Median of the timed runs, with the fastest and slowest (the spread) and every run kept for the record. */
export interface Spread {
  seconds: number;
  fastest: number;
  slowest: number;
  /** Every timed run, in the order run (seconds per call). */
  times: number[];
}

export function summarize(times: readonly number[]): Spread {
  if (times.length === 0) throw new Error("summarize: no timed runs");
  const sorted = [...times].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  const seconds = sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
  return { seconds, fastest: sorted[0], slowest: sorted[sorted.length - 1], times: [...times] };
}

/** One turn of one side: the time per call it measured itself, and what it computed (for the agreement check). */
export interface Turn<T> {
  seconds: number;
  result: T;
}

export interface Contender<T> {
  name: string;
  turn: () => Promise<Turn<T>>;
  /** Calls timed together in the last turn, when more than one. */
  calls?: () => number;
}

export interface Outcome<T> extends Spread {
  name: string;
  /** The result of the last timed turn. */
  result: T;
}

/**
 * Runs `warmUps` untimed rounds, then `rounds` timed rounds; in every round each contender takes
 * one turn, in the order given. Each contender gets exactly the same number of turns.
 */
export async function alternate<T>(contenders: readonly Contender<T>[], rounds: number, warmUps = 1): Promise<Outcome<T>[]> {
  if (!(rounds >= 1)) throw new Error("alternate: at least one timed round");
  const times = contenders.map(() => [] as number[]);
  const last: T[] = [];
  for (let round = 0; round < warmUps + rounds; round++) {
    for (let i = 0; i < contenders.length; i++) {
      const turn = await contenders[i].turn();
      if (round >= warmUps) {
        times[i].push(turn.seconds);
        last[i] = turn.result;
      }
    }
  }
  return contenders.map((c, i) => ({ name: c.name, ...summarize(times[i]), result: last[i] }));
}

/**
 * Ratio of two sides' times round by round (peer / ours in the same round): its lowest and highest
 * value show how much the ratio itself moved while the machine was busy; its median is a second
 * estimate of the ratio, less moved by a busy spell that hits a few rounds.
 */
export function roundRatios(peer: readonly number[], ours: readonly number[]): { lowest: number; median: number; highest: number } {
  if (peer.length !== ours.length || peer.length === 0) throw new Error("roundRatios: both sides need the same rounds");
  const { seconds, fastest, slowest } = summarize(peer.map((p, i) => p / ours[i]));
  return { lowest: fastest, median: seconds, highest: slowest };
}

/**
 * A contender whose turns last about `seconds` however fast it is. The first turn (the warm-up)
 * makes `firstCalls` calls, the same number on every side; every later turn makes enough calls to
 * last about `seconds` at the time per call of the turn before (after the warm-up, the JavaScript
 * engine has compiled the code and a call gets much faster). On a shared machine, turns of equal
 * length see the same share of the processor: a turn far shorter than the scheduler's time slice
 * would run either whole or not at all.
 */
export function lasting<T>(name: string, seconds: number, firstCalls: number, run: (calls: number) => Promise<Turn<T>>): Contender<T> {
  let next = firstCalls;
  let last = 0;
  return {
    name,
    calls: () => last,
    turn: async () => {
      last = next;
      const turn = await run(last);
      next = Math.max(1, Math.min(1e7, Math.round(seconds / turn.seconds)));
      return turn;
    },
  };
}

/** Times `calls` calls of `task` together and returns the time per call (a single call at n = 30 is too short to time alone). */
export function batch<T>(calls: number, task: () => T): Turn<T> {
  let result!: T;
  const start = performance.now();
  for (let i = 0; i < calls; i++) result = task();
  return { seconds: (performance.now() - start) / 1000 / calls, result };
}

/** The project alone: the median of `runs` runs after one warm-up call. */
export async function median<T>(runs: number, task: () => T | Promise<T>, warmUp = true): Promise<Spread & { result: T }> {
  if (warmUp) await task();
  const times: number[] = [];
  let result!: T;
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    result = await task();
    times.push((performance.now() - start) / 1000);
  }
  return { ...summarize(times), result };
}

/** 0.000123 s -> "123 us", 1.5 s -> "1.50 s". */
export function formatSeconds(s: number): string {
  if (s < 1e-5) return `${(s * 1e6).toFixed(2)} us`;
  if (s < 1e-3) return `${(s * 1e6).toFixed(0)} us`;
  if (s < 1) return `${(s * 1e3).toFixed(s < 0.01 ? 2 : 1)} ms`;
  return `${s.toFixed(2)} s`;
}
