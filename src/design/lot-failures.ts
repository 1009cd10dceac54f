/**
 * How many parts of a production lot fail, given each part's failure
 * probability: the expected count N Pf, and an upper bound k such that
 * P(failures <= k) >= confidence for a binomial(N, Pf) count.
 *
 * The binomial terms are built outwards from the mode by their ratios, so
 * lots of a billion parts at Pf = 1e-9 or 0.5 alike neither underflow nor
 * loop through millions of negligible terms.
 */
import { ensure, ensureProbability } from "../errors";

function checkLot(failureProbability: number, lotSize: number): void {
  ensure(Number.isFinite(failureProbability) && failureProbability >= 0 && failureProbability < 1,
    () => `failure probability must lie in [0, 1) (got ${failureProbability})`);
  ensure(Number.isInteger(lotSize) && lotSize >= 1 && lotSize <= 1e9, () => `lot size must be a whole number from 1 to 1e9 (got ${lotSize})`);
}

export function expectedFailures({ failureProbability, lotSize }: { failureProbability: number; lotSize: number }): number {
  checkLot(failureProbability, lotSize);
  return failureProbability * lotSize;
}

/** Smallest k with P(X <= k) >= confidence, X ~ binomial(lotSize, failureProbability). */
export function failuresUpperBound({
  failureProbability: p,
  lotSize: n,
  confidence,
}: {
  failureProbability: number;
  lotSize: number;
  confidence: number;
}): number {
  checkLot(p, n);
  ensureProbability(confidence, "confidence");
  if (p === 0) return 0;
  // Terms relative to the one at the mode, by the ratio pmf(k+1)/pmf(k) = (n-k)/(k+1) * p/q:
  // no factorials, and terms below 1e-20 of the peak change no quantile, so the walk spans
  // only about ten standard deviations each side.
  const odds = p / (1 - p);
  const mode = Math.min(n, Math.floor((n + 1) * p));
  const below: number[] = [];
  for (let k = mode, term = 1; k > 0; k--) {
    term *= k / ((n - k + 1) * odds);
    if (term < 1e-20) break;
    below.push(term);
  }
  const above: number[] = [];
  for (let k = mode, term = 1; k < n; k++) {
    term *= ((n - k) / (k + 1)) * odds;
    if (term < 1e-20) break;
    above.push(term);
  }
  let total = 1;
  for (const t of below) total += t;
  for (const t of above) total += t;
  // Cumulative from the lowest term kept upwards.
  let cumulative = 0;
  for (let i = below.length - 1; i >= 0; i--) {
    cumulative += below[i];
    if (cumulative / total >= confidence) return mode - 1 - i;
  }
  cumulative += 1;
  if (cumulative / total >= confidence) return mode;
  for (let i = 0; i < above.length; i++) {
    cumulative += above[i];
    if (cumulative / total >= confidence) return mode + 1 + i;
  }
  return Math.min(n, mode + above.length);
}
