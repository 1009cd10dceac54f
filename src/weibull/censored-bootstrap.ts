/**
 * Sampling distribution of the maximum-likelihood estimates for a censored
 * sample, by a parametric bootstrap conditional on the observed censoring.
 *
 * Censoring here means competing flaw populations: a censored specimen broke
 * from another population at its recorded stress, so all we know is that its
 * strength for the fitted population exceeds that stress. The experiment that
 * reproduces this: every specimen gets a strength from the fitted Weibull
 * distribution; a specimen recorded as censored at c stays censored at c if
 * its drawn strength exceeds c, and fails at the drawn strength otherwise;
 * a recorded failure is a failure at its drawn strength. Refitting each draw
 * gives q_b = m_b / m_hat and t_b = m_b ln(th_b / th_hat), the bootstrap counterparts
 * of the pivotal quantities q = m_hat/m and t = m_hat ln(th_hat/th).
 *
 * Holding the censoring *values* fixed is the usual conditional bootstrap of
 * survival analysis (Efron & Tibshirani 1993, "An Introduction to the
 * Bootstrap", ch. 3 and 11). Holding censoring *ranks* fixed would be wrong
 * whenever censored specimens lie below failures: it would censor the
 * weakest draws of the fitted population itself, an informative censoring
 * that the likelihood does not describe.
 *
 * Unlike the complete-sample case the distribution of (q_b, t_b) depends on
 * where the censoring values sit relative to th_hat, so it is evaluated at
 * the ML estimates. The generator is seeded from the data, so the same sample
 * always gives the same numbers: a recalculation never changes a cell.
 */
import { ensure } from "../errors";
import { SeededRandom } from "../numeric/random";
import { requireSimulationSize } from "./simulation-limits";
import { solveShapeFromLogs } from "./pivotal-simulation";
import type { WeibullParameters } from "./distribution";

export interface BootstrapDraws {
  /** q_b = m_b / m_hat of each usable replication. */
  shapeRatio: Float64Array;
  /** t_b = m_b ln(th_b / th_hat), paired with shapeRatio. */
  scaleLogError: Float64Array;
  replications: number;
}

const cache = new Map<string, BootstrapDraws>();
const CACHE_ENTRIES = 16;

export function bootstrapCensored({
  strengths,
  censored,
  fit,
  replications,
}: {
  strengths: readonly number[];
  censored: readonly boolean[];
  fit: WeibullParameters;
  replications: number;
}): BootstrapDraws {
  requireSimulationSize(strengths.length, "the bootstrap of a censored sample");
  const key = `${replications}|${fit.shape}|${fit.scale}|${strengths.join(",")}|${censored.map(Number).join("")}`;
  const hit = cache.get(key);
  if (hit) return hit;

  const n = strengths.length;
  // Draw in increasing strength, seeded from the pattern of strength ratios: the same specimens in
  // another row order or another stress unit give the same draws, hence the same cell values.
  const order = strengths.map((_, i) => i).sort((a, b) => strengths[a] - strengths[b] || Number(censored[a]) - Number(censored[b]));
  const random = new SeededRandom(patternSeedOf(order.map((i) => strengths[i]), order.map((i) => censored[i])));
  const inverseShape = 1 / fit.shape;
  const drawn = new Float64Array(n);
  const flags = new Uint8Array(n);
  const z = new Float64Array(n);
  const shapeRatio = new Float64Array(replications);
  const scaleLogError = new Float64Array(replications);
  let kept = 0;
  for (let rep = 0; rep < replications; rep++) {
    let failures = 0;
    let max = 0;
    for (const i of order) {
      const a = fit.scale * Math.pow(random.exponential(), inverseShape);
      const survives = censored[i] && a > strengths[i];
      drawn[i] = survives ? strengths[i] : a;
      flags[i] = survives ? 1 : 0;
      if (!survives) failures++;
      if (drawn[i] > max) max = drawn[i];
    }
    if (failures < 2) continue; // no finite estimate: such draws say nothing about the spread
    for (let i = 0; i < n; i++) z[i] = Math.log(drawn[i] / max);
    const solve = solveShapeFromLogs(z, flags, failures);
    if (!solve.converged || !(solve.shape > 0)) continue;
    const scale = max * Math.exp(Math.log(solve.weightSum / failures) / solve.shape);
    shapeRatio[kept] = solve.shape / fit.shape;
    scaleLogError[kept] = solve.shape * Math.log(scale / fit.scale);
    kept++;
  }
  ensure(kept >= replications / 2, "too few failures in this sample for a bootstrap of its censoring: test more specimens");
  const draws = { shapeRatio: shapeRatio.slice(0, kept), scaleLogError: scaleLogError.slice(0, kept), replications };
  if (cache.size >= CACHE_ENTRIES) cache.delete(cache.keys().next().value!);
  cache.set(key, draws);
  return draws;
}

/**
 * FNV-1a over the sorted strengths as ratios to the largest, rounded to 9
 * significant digits (so a change of unit, which alters their last bits,
 * leaves the seed alone), and over the censoring flags in the same order.
 */
function patternSeedOf(sorted: readonly number[], flags: readonly boolean[]): number {
  const max = sorted[sorted.length - 1];
  let h = 0x811c9dc5;
  const mix = (v: number) => {
    h = Math.imul(h ^ (v & 0xffff), 0x01000193) >>> 0;
    h = Math.imul(h ^ (v >>> 16), 0x01000193) >>> 0;
  };
  sorted.forEach((s, i) => {
    mix(Math.round((s / max) * 1e9) >>> 0);
    mix(flags[i] ? 1 : 0);
  });
  return h;
}
