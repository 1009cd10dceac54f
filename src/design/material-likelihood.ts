/**
 * The three likelihoods a pooled fit compares, on strengths from several
 * specimen geometries (groups g, r_g failures, censored specimens counted in
 * the sums over all specimens only):
 *
 * 1. Tied by size (the material model): group g's characteristic strength is
 *    sigma_0 V_g(m)^(-1/m), V_g its effective size at modulus m. With the
 *    failure probability 1 - exp(-V_g (s/sigma_0)^m), the log-likelihood is
 *      l = r ln m - r m ln sigma_0 + sum_f ln V_g + (m-1) sum_f ln s - sum_all V_g (s/sigma_0)^m.
 *    d l/d sigma_0 = 0 gives sigma_0^m = sum_all V_g s^m / r in closed form, and
 *    with it the profile
 *      l_p(m) = r ln m - r ln(sum_all V_g s^m / r) + sum_g r_g ln V_g(m) + (m-1) sum_f ln s - r,
 *      l_p'(m) = r/m - r <ln s + D_g>_w + sum_g r_g D_g + sum_f ln s,
 *    D_g = d ln V_g/dm and <.>_w the mean weighted by w_i = V_g s_i^m: a
 *    one-dimensional search in m [derived].
 * 2. One modulus, free characteristic strengths th_g: th_g^m = sum_g s^m / r_g and
 *      l_c(m) = r ln m - sum_g r_g ln(sum_g s^m / r_g) + (m-1) sum_f ln s - r,
 *      l_c'(m) = r/m - sum_g r_g <ln s>_g + sum_f ln s (decreasing: one root).
 * 3. Separate fits: model 2 on each group alone.
 *
 * Sums of s^m are formed as exp(.. - max) (log-sum-exp), so no unit or modulus
 * overflows. All log-likelihoods are in the strengths' own units, so their
 * differences (the likelihood-ratio statistics) are unit-free.
 */
import { findRoot } from "../numeric/roots";
import type { SizeLaw } from "./specimen-geometry";

/** Strengths of all groups, as logs, with the per-group totals the likelihoods need. */
export interface PooledSample {
  logStrength: Float64Array;
  group: Int32Array;
  failed: Uint8Array;
  groupCount: number;
  failures: Int32Array;
  /** sum over failures of ln s, per group. */
  failureLogSum: Float64Array;
}

export function pooledSample(groups: readonly { strengths: ArrayLike<number>; censored?: ArrayLike<boolean> | null }[]): PooledSample {
  const n = groups.reduce((k, g) => k + g.strengths.length, 0);
  const logStrength = new Float64Array(n);
  const group = new Int32Array(n);
  const failed = new Uint8Array(n);
  const failures = new Int32Array(groups.length);
  const failureLogSum = new Float64Array(groups.length);
  let i = 0;
  groups.forEach((g, k) => {
    for (let j = 0; j < g.strengths.length; j++, i++) {
      logStrength[i] = Math.log(g.strengths[j]);
      group[i] = k;
      failed[i] = g.censored?.[j] ? 0 : 1;
      if (failed[i]) {
        failures[k]++;
        failureLogSum[k] += logStrength[i];
      }
    }
  });
  return { logStrength, group, failed, groupCount: groups.length, failures, failureLogSum };
}

export interface ProfilePoint {
  logLikelihood: number;
  slope: number;
}

/** Model 1 at modulus m: the profile log-likelihood, its slope, and ln sigma_0. */
export function tiedProfile(data: PooledSample, laws: readonly SizeLaw[], m: number): ProfilePoint & { logScale: number } {
  const G = data.groupCount;
  const lnV = new Float64Array(G);
  const D = new Float64Array(G);
  let r = 0;
  let sizeTerm = 0;
  let sizeSlope = 0;
  let logSum = 0;
  for (let g = 0; g < G; g++) {
    lnV[g] = laws[g].logSize(m);
    D[g] = laws[g].dLogSize(m);
    r += data.failures[g];
    sizeTerm += data.failures[g] * lnV[g];
    sizeSlope += data.failures[g] * D[g];
    logSum += data.failureLogSum[g];
  }
  const { logStrength: x, group } = data;
  let top = -Infinity;
  for (let i = 0; i < x.length; i++) top = Math.max(top, lnV[group[i]] + m * x[i]);
  let s0 = 0;
  let s1 = 0;
  for (let i = 0; i < x.length; i++) {
    const w = Math.exp(lnV[group[i]] + m * x[i] - top);
    s0 += w;
    s1 += w * (x[i] + D[group[i]]);
  }
  const mLogScale = top + Math.log(s0) - Math.log(r);
  return {
    logLikelihood: r * Math.log(m) - r * mLogScale + sizeTerm + (m - 1) * logSum - r,
    slope: r / m - (r * s1) / s0 + sizeSlope + logSum,
    logScale: mLogScale / m,
  };
}

/** Model 2 on the groups flagged in `use` (all groups: one modulus; one group: its own fit). */
export function freeScalesProfile(data: PooledSample, use: (g: number) => boolean, m: number): ProfilePoint {
  const G = data.groupCount;
  const top = new Float64Array(G).fill(-Infinity);
  const s0 = new Float64Array(G);
  const s1 = new Float64Array(G);
  const { logStrength: x, group } = data;
  for (let i = 0; i < x.length; i++) if (use(group[i])) top[group[i]] = Math.max(top[group[i]], m * x[i]);
  for (let i = 0; i < x.length; i++) {
    const g = group[i];
    if (!use(g)) continue;
    const w = Math.exp(m * x[i] - top[g]);
    s0[g] += w;
    s1[g] += w * x[i];
  }
  let r = 0;
  let logSum = 0;
  let scaleTerm = 0;
  let meanTerm = 0;
  for (let g = 0; g < G; g++) {
    if (!use(g)) continue;
    const rg = data.failures[g];
    r += rg;
    logSum += data.failureLogSum[g];
    scaleTerm += rg * (top[g] + Math.log(s0[g]) - Math.log(rg));
    meanTerm += (rg * s1[g]) / s0[g];
  }
  return { logLikelihood: r * Math.log(m) - scaleTerm + (m - 1) * logSum - r, slope: r / m - meanTerm + logSum };
}

/** ln th_g at modulus m for group g under model 2: (1/m) ln(sum_g s^m / r_g). */
export function freeLogScale(data: PooledSample, g: number, m: number): number {
  const { logStrength: x, group } = data;
  let top = -Infinity;
  for (let i = 0; i < x.length; i++) if (group[i] === g) top = Math.max(top, m * x[i]);
  let s0 = 0;
  for (let i = 0; i < x.length; i++) if (group[i] === g) s0 += Math.exp(m * x[i] - top);
  return (top + Math.log(s0) - Math.log(data.failures[g])) / m;
}

export interface ModulusSolve {
  shape: number;
  logLikelihood: number;
  converged: boolean;
}

/**
 * Root of a decreasing slope starting near m0: expands a bracket by factors of
 * 1.5 (at most 200 times), then Brent's method to full precision.
 */
export function solveDecreasingSlope(profile: (m: number) => ProfilePoint, m0: number, lowest = 0, highest = Infinity): ModulusSolve {
  let lo = m0;
  let hi = m0;
  const start = profile(m0).slope;
  let found = false;
  for (let k = 0; k < 200; k++) {
    if (start > 0) {
      lo = hi;
      hi = Math.min(hi * 1.5, highest);
      if (profile(hi).slope <= 0) {
        found = true;
        break;
      }
      if (hi === highest) break;
    } else {
      hi = lo;
      lo = Math.max(lo / 1.5, lowest);
      if (profile(lo).slope >= 0) {
        found = true;
        break;
      }
      if (lo === lowest) break;
    }
  }
  if (!found) return { shape: NaN, logLikelihood: NaN, converged: false };
  const root = findRoot((m) => profile(m).slope, lo, hi);
  return { shape: root.root, logLikelihood: profile(root.root).logLikelihood, converged: root.converged };
}

/** Moment start for the modulus: ln s of one Weibull population has standard deviation pi/(m sqrt 6). */
export function startingModulus(data: PooledSample): number {
  let pooled = 0;
  let count = 0;
  const mean = new Float64Array(data.groupCount);
  for (let g = 0; g < data.groupCount; g++) mean[g] = data.failureLogSum[g] / data.failures[g];
  for (let i = 0; i < data.logStrength.length; i++) {
    if (!data.failed[i]) continue;
    pooled += (data.logStrength[i] - mean[data.group[i]]) ** 2;
    count++;
  }
  const sd = Math.sqrt(pooled / Math.max(count - data.groupCount, 1));
  const m0 = Math.PI / Math.sqrt(6) / sd;
  return Number.isFinite(m0) && m0 > 0 ? Math.min(Math.max(m0, 0.1), 1e4) : 5;
}
