/**
 * How many parts of a production lot fail, given each part's failure
 * probability: the expected count N Pf, and an upper bound k such that
 * P(failures <= k) >= confidence for a binomial(N, Pf) count.
 *
 * The binomial terms are evaluated in log space around the mode, so lots of
 * millions of parts at Pf = 1e-9 or 0.5 alike neither underflow nor loop
 * through millions of negligible terms.
 */
import { require, requireProbability } from "../errors";
import { logGamma } from "../numeric/gamma";

function checkLot(failureProbability: number, lotSize: number): void {
  require(Number.isFinite(failureProbability) && failureProbability >= 0 && failureProbability < 1,
    `failure probability must lie in [0, 1) (got ${failureProbability})`);
  require(Number.isInteger(lotSize) && lotSize >= 1 && lotSize <= 1e9, `lot size must be a whole number from 1 to 1e9 (got ${lotSize})`);
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
  requireProbability(confidence, "confidence");
  if (p === 0) return 0;
  const logP = Math.log(p);
  const logQ = Math.log1p(-p);
  const logNFact = logGamma(n + 1);
  const logPmf = (k: number) => logNFact - logGamma(k + 1) - logGamma(n - k + 1) + k * logP + (n - k) * logQ;

  const mode = Math.min(n, Math.floor((n + 1) * p));
  const logPeak = logPmf(mode);
  // Relative pmf terms below 1e-20 of the peak change the sum by less than rounding.
  const cutoff = logPeak - 46;
  // Mass strictly below the mode, relative to the peak term.
  let below = 0;
  for (let k = mode - 1; k >= 0; k--) {
    const l = logPmf(k);
    if (l < cutoff) break;
    below += Math.exp(l - logPeak);
  }
  let above = 0;
  for (let k = mode + 1; k <= n; k++) {
    const l = logPmf(k);
    if (l < cutoff) break;
    above += Math.exp(l - logPeak);
  }
  const total = below + 1 + above;
  let cumulative = below;
  for (let k = mode; k <= n; k++) {
    if (k > mode) {
      cumulative += Math.exp(logPmf(k) - logPeak);
    } else {
      cumulative += 1;
    }
    if (cumulative / total >= confidence) {
      // The mode may already exceed the quantile: walk down while the bound still holds.
      if (k === mode) return walkDown(mode, cumulative, total, confidence, logPmf, logPeak);
      return k;
    }
  }
  return n;
}

function walkDown(
  k: number,
  cumulative: number,
  total: number,
  confidence: number,
  logPmf: (k: number) => number,
  logPeak: number,
): number {
  let c = cumulative;
  while (k > 0) {
    const without = c - Math.exp(logPmf(k) - logPeak);
    if (without / total < confidence) break;
    c = without;
    k--;
  }
  return k;
}
