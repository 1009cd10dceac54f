/**
 * Timing for `npm run bench`: the median of several runs after one warm-up,
 * so a JIT compile or a garbage collection does not set the figure.
 */
export interface Timing<T> {
  seconds: number;
  /** Fastest and slowest run: the spread around the median. */
  fastest: number;
  slowest: number;
  runs: number;
  result: T;
}

export async function median<T>(runs: number, task: () => T | Promise<T>, warmUp = true): Promise<Timing<T>> {
  if (warmUp) await task();
  const times: number[] = [];
  let result!: T;
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    result = await task();
    times.push((performance.now() - start) / 1000);
  }
  times.sort((a, b) => a - b);
  const mid = Math.floor(times.length / 2);
  const seconds = times.length % 2 ? times[mid] : (times[mid - 1] + times[mid]) / 2;
  return { seconds, fastest: times[0], slowest: times[times.length - 1], runs, result };
}

/** 0.000123 s -> "123 us", 1.5 s -> "1.50 s". */
export function formatSeconds(s: number): string {
  if (s < 1e-3) return `${(s * 1e6).toFixed(0)} us`;
  if (s < 1) return `${(s * 1e3).toFixed(s < 0.01 ? 2 : 1)} ms`;
  return `${s.toFixed(2)} s`;
}
