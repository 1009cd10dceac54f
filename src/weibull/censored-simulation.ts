/**
 * Monte Carlo of the maximum-likelihood modulus for one censoring pattern.
 *
 * Tables serve complete samples; a censored sample needs its own simulation.
 * We draw N unit Weibull strengths (m = 1, sigma_theta = 1: the pivotal
 * quantities m_hat/m and m_hat ln(th_hat/th) do not depend on the true values),
 * sort them, censor the same ranks as in the observed sample, and refit. This
 * treats the censoring as fixed by rank, an approximation for competing flaw
 * populations that ISO 20501 and ASTM C1239 leave to the analyst; it is stated
 * wherever a censored result is reported.
 *
 * The generator is seeded from the pattern itself, so the same sample always
 * gives the same numbers: a recalculation never changes a cell.
 */
import { SeededRandom } from "../numeric/random";
import { fitMaximumLikelihood } from "./maximum-likelihood";

export interface PivotalDraws {
  /** m_hat / m for each replication that converged */
  shapeRatio: Float64Array;
  /** m_hat ln(th_hat / th) for each replication that converged */
  scaleLogError: Float64Array;
}

/** Ranks (0-based, in increasing strength) of the censored specimens. */
export function censoredRanks(strengths: readonly number[], censored: readonly boolean[]): number[] {
  const order = strengths.map((_, i) => i).sort((a, b) => strengths[a] - strengths[b] || Number(censored[a]) - Number(censored[b]));
  const ranks: number[] = [];
  order.forEach((i, rank) => {
    if (censored[i]) ranks.push(rank);
  });
  return ranks;
}

export function simulatePivotals({
  specimens,
  censoredRanks: ranks,
  replications,
}: {
  specimens: number;
  censoredRanks: readonly number[];
  replications: number;
}): PivotalDraws {
  const random = new SeededRandom(patternSeed(specimens, ranks));
  const isCensored = new Array<boolean>(specimens).fill(false);
  for (const r of ranks) isCensored[r] = true;
  const shapeRatio = new Float64Array(replications);
  const scaleLogError = new Float64Array(replications);
  const draw = new Array<number>(specimens);
  let kept = 0;
  for (let rep = 0; rep < replications; rep++) {
    for (let i = 0; i < specimens; i++) draw[i] = random.exponential();
    draw.sort((a, b) => a - b);
    try {
      const fit = fitMaximumLikelihood({ strengths: draw, censored: isCensored });
      if (!fit.converged) continue;
      shapeRatio[kept] = fit.shape;
      scaleLogError[kept] = fit.shape * Math.log(fit.scale);
      kept++;
    } catch {
      // A draw whose failures coincide has no finite estimate; with continuous draws it is vanishingly rare.
    }
  }
  return { shapeRatio: shapeRatio.subarray(0, kept), scaleLogError: scaleLogError.subarray(0, kept) };
}

/** FNV-1a over the pattern: a stable seed for the same N and censored ranks. */
function patternSeed(specimens: number, ranks: readonly number[]): number {
  let h = 0x811c9dc5;
  for (const v of [specimens, ...ranks]) {
    h = Math.imul(h ^ (v & 0xffff), 0x01000193) >>> 0;
    h = Math.imul(h ^ (v >>> 16), 0x01000193) >>> 0;
  }
  return h;
}
