/**
 * Two flaw populations with the same modulus: a likelihood-ratio check of
 * one Weibull distribution against a two-component Weibull mixture with a
 * common modulus,
 *
 *   F(s) = p [1 - exp(-(s/th_1)^m)] + (1 - p) [1 - exp(-(s/th_2)^m)].
 *
 * Why a second check: a mixture of two populations with the same modulus
 * and different characteristic strengths plots as an S-shaped band rather
 * than two straight segments, so the plot-bend check (bilinear-check.ts,
 * aimed at populations of different moduli) has almost no power against it
 * (flagged 2.5-4 % of samples at the 5 % level in a seeded trial with m 10,
 * th 300 and 450, 50/50, n = 40).
 *
 * Statistic: LR = 2 [l_mix - l_one], l the maximised log-likelihood. The
 * mixture is fitted by expectation-conditional maximisation (ECM; McLachlan
 * & Krishnan, "The EM Algorithm and Extensions", 2008, ch. 5) from three
 * starts that split the ordered sample at its lower quarter, half and upper
 * quarter, with a fixed iteration budget, keeping the best. The budget may
 * stop short of the exact maximum; the check stays valid because the
 * reference distribution is simulated with the same algorithm.
 *
 * Calibration: in ln s the model is a location-scale family (a Gumbel law
 * and a two-location Gumbel mixture with common scale 1/m), and the starts
 * and the fit are equivariant, so under one population LR depends on the
 * number of specimens only. The p-value is (1 + #{simulated >= observed}) /
 * (1 + R) over R samples of one Weibull population, seeded by N and cached
 * per N (a recalculation never changes a cell), reported with its binomial
 * standard error. Complete samples only: with censoring the mixture and the
 * censoring mechanism cannot be told apart.
 *
 * The asymptotic chi-square law does not apply to mixture likelihood ratios
 * (the null sits on the edge of the parameter space), hence the simulation.
 * No standard prescribes this check; a flag is a reason for fractography
 * (ASTM C1322).
 */
import { SeededRandom } from "../numeric/random";
import { replicationsPerSlice, simulate } from "../numeric/replication-slices";
import { patternSeed, solveShapeFromLogs } from "./pivotal-simulation";

/** Fewest specimens for the mixture check (each component needs a few). */
export const MIXTURE_MIN_SPECIMENS = 10;
/** Reference samples per N: p-values near 0.05 to about +-0.0035. */
export const MIXTURE_REPLICATIONS = 4000;
const SALT = 0x3a1c7e11;
const ITERATIONS = 15;
const STARTS = [0.25, 0.5, 0.75];

export interface MixtureStatistic {
  statistic: number;
  /** Share of the weaker component and the two characteristic strengths of the best mixture, with its modulus. */
  weakerShare: number;
  weakerScale: number;
  strongerScale: number;
  shape: number;
}

/**
 * LR of a complete sample given as y = ln s in ascending order. Scratch
 * arrays are allocated per call; the simulation reuses one `work` set.
 */
export function mixtureStatistic(y: Float64Array, work = new MixtureWork(y.length)): MixtureStatistic {
  const n = y.length;
  const { z, r } = work;
  const max = y[n - 1];
  let sumZ = 0;
  for (let i = 0; i < n; i++) {
    z[i] = y[i] - max;
    sumZ += z[i];
  }
  const one = solveShapeFromLogs(z, null, n);
  if (!one.converged) return { statistic: NaN, weakerShare: NaN, weakerScale: NaN, strongerScale: NaN, shape: NaN };
  const m0 = one.shape;
  // Single Weibull at its ML fit: n ln m + m sum(z - mu) - n, with e^(m mu) = sum e^(m z) / n.
  const lOne = n * Math.log(m0) + m0 * sumZ - n * Math.log(one.weightSum / n) - n;
  let best = { l: -Infinity, p: NaN, mu1: NaN, mu2: NaN, m: NaN };
  // e^(m0 z) for the first CM-step, the same for every start.
  const { w } = work;
  for (let i = 0; i < n; i++) w[i] = Math.exp(m0 * z[i]);
  const sums = work.sums;
  for (const start of STARTS) {
    const k = Math.max(1, Math.min(n - 1, Math.round(start * n)));
    for (let i = 0; i < n; i++) r[i] = i < k ? 1 : 0;
    weightedSums(z, r, w, sums);
    let m = m0;
    let p = 0;
    let mu1 = 0;
    let mu2 = 0;
    let l = -Infinity;
    for (let it = 0; it < ITERATIONS; it++) {
      // CM-step 1, at the current m: p and each th_k^m = sum r e^(m z) / sum r (mu_k = ln th_k).
      // CM-step 2: one Newton step on m of the expected complete-data log-likelihood, th_k profiled:
      // d/dm = n/m + sum z - sum_k R_k zbar_k, zbar_k the e^(m z)-weighted mean of z in component k.
      const [r1, a1, a2, b1, b2, c1, c2] = sums;
      const r2 = n - r1;
      p = r1 / n;
      mu1 = a1 > 0 ? Math.log(a1 / r1) / m : 0;
      mu2 = a2 > 0 ? Math.log(a2 / r2) / m : 0;
      const zb1 = a1 > 0 ? b1 / a1 : 0;
      const zb2 = a2 > 0 ? b2 / a2 : 0;
      const v1 = a1 > 0 ? Math.max(c1 / a1 - zb1 * zb1, 0) : 0;
      const v2 = a2 > 0 ? Math.max(c2 / a2 - zb2 * zb2, 0) : 0;
      const gradient = n / m + sumZ - r1 * zb1 - r2 * zb2;
      const curvature = n / (m * m) + r1 * v1 + r2 * v2;
      let next = m + gradient / curvature;
      if (!(next > 0.5 * m && next < 2 * m)) next = next > m ? 2 * m : 0.5 * m;
      // Keep th_k where CM-step 1 put them while m moves: mu_k stays, only m changes.
      m = next;
      // E-step, the observed log-likelihood at these parameters (up to the sum of -ln s), and the
      // sums for the next CM-step (same m) in the same pass.
      const total = eStep(z, r, m, p, mu1, mu2, it < ITERATIONS - 1 ? sums : null);
      const lNew = n * Math.log(m) + total;
      const done = lNew - l <= 1e-8 * n;
      l = lNew;
      if (done) break;
    }
    if (l > best.l) best = { l, p, mu1, mu2, m };
  }
  const weakerFirst = best.mu1 <= best.mu2;
  return {
    statistic: Math.max(2 * (best.l - lOne), 0),
    weakerShare: weakerFirst ? best.p : 1 - best.p,
    weakerScale: Math.exp(max + Math.min(best.mu1, best.mu2)),
    strongerScale: Math.exp(max + Math.max(best.mu1, best.mu2)),
    shape: best.m,
  };
}

/**
 * CM-step sums, in the order [sum r, sum r w, sum (1-r) w, sum r w z, sum (1-r) w z, sum r w z^2,
 * sum (1-r) w z^2], w = e^(m z) given.
 */
function weightedSums(z: Float64Array, r: Float64Array, w: Float64Array, sums: Float64Array): void {
  let r1 = 0;
  let a1 = 0;
  let a2 = 0;
  let b1 = 0;
  let b2 = 0;
  let c1 = 0;
  let c2 = 0;
  for (let i = 0; i < z.length; i++) {
    const w1 = r[i] * w[i];
    const w2 = w[i] - w1;
    r1 += r[i];
    a1 += w1;
    a2 += w2;
    b1 += w1 * z[i];
    b2 += w2 * z[i];
    c1 += w1 * z[i] * z[i];
    c2 += w2 * z[i] * z[i];
  }
  sums[0] = r1;
  sums[1] = a1;
  sums[2] = a2;
  sums[3] = b1;
  sums[4] = b2;
  sums[5] = c1;
  sums[6] = c2;
}

/** Logs of products smaller than this are taken at once: g >= SMALL_DENSITY keeps the product normal. */
const SMALL_DENSITY = 1e-50;
const FLUSH_PRODUCT = 1e-250;
/** Products of factors 1 + q (each below 1e50) are logged before they pass this. */
const FLUSH_FACTORS = 1e250;

/**
 * E-step at (m, p, mu1, mu2): new responsibilities r and the sum of ln g, g the mixture density of m z.
 * With `sums`, also the next CM-step's sums in the same pass. Why this shape (it was two passes with five
 * exponentials or logarithms per specimen, the whole cost of the check): e^(m z) is taken as
 * e^(m (z - mu1)) e^(m mu1) from the E-step's own exponential, both component densities from one more
 * exponential, and logarithms once per run of factors rather than per specimen. These agree with the
 * direct forms to rounding (statistics within 1e-11 in a seeded comparison of 1240 samples).
 */
function eStep(z: Float64Array, r: Float64Array, m: number, p: number, mu1: number, mu2: number, sums: Float64Array | null): number {
  const n = z.length;
  const shift = Math.exp(m * (mu1 - mu2));
  const scale1 = Math.exp(m * mu1);
  let total = 0;
  let product = 1;
  let factors = 1;
  let r1 = 0;
  let a1 = 0;
  let a2 = 0;
  let b1 = 0;
  let b2 = 0;
  let c1 = 0;
  let c2 = 0;
  // g = g1 (1 + q), q = g2 / g1 = ((1 - p) / p) shift e^(e1 - e2): one exponential for both terms where
  // neither can underflow (then g > 0 and the two forms differ by rounding only).
  const lnP = Math.log(p);
  const odds = ((1 - p) / p) * shift;
  const both = p > 1e-100 && 1 - p > 1e-100 && odds > 0 && odds < Infinity;
  for (let i = 0; i < n; i++) {
    const t = m * (z[i] - mu1);
    const e1 = Math.exp(t);
    const e2 = e1 * shift;
    if (both && e1 > 1e-100 && e1 < 200 && e2 > 1e-100 && e2 < 200) {
      const q = odds * Math.exp(e1 - e2);
      r[i] = 1 / (1 + q);
      total += lnP + t - e1;
      if (q < 1e50) {
        factors *= 1 + q;
        if (factors > FLUSH_FACTORS) {
          total += Math.log(factors);
          factors = 1;
        }
      } else total += Math.log(1 + q);
    } else {
      const g1 = p * e1 * Math.exp(-e1);
      const g2 = (1 - p) * e2 * Math.exp(-e2);
      const g = g1 + g2;
      if (g > 0) {
      r[i] = g1 / g;
        if (g < SMALL_DENSITY) total += Math.log(g);
        else {
          product *= g;
          if (product < FLUSH_PRODUCT) {
            total += Math.log(product);
            product = 1;
          }
        }
      } else total += -745;
    }
    if (sums) {
      // e^(m z) from e1 unless e1 overflowed or lost its precision to underflow.
      const w = e1 < Infinity && e1 > 1e-290 ? e1 * scale1 : Math.exp(m * z[i]);
      const w1 = r[i] * w;
      const w2 = w - w1;
      r1 += r[i];
      a1 += w1;
      a2 += w2;
      b1 += w1 * z[i];
      b2 += w2 * z[i];
      c1 += w1 * z[i] * z[i];
      c2 += w2 * z[i] * z[i];
    }
  }
  if (sums) {
    sums[0] = r1;
    sums[1] = a1;
    sums[2] = a2;
    sums[3] = b1;
    sums[4] = b2;
    sums[5] = c1;
    sums[6] = c2;
  }
  return total + Math.log(product) + Math.log(factors);
}

export class MixtureWork {
  readonly z: Float64Array;
  readonly r: Float64Array;
  /** e^(m z) at the start of each run of iterations. */
  readonly w: Float64Array;
  readonly sums = new Float64Array(7);
  constructor(n: number) {
    this.z = new Float64Array(n);
    this.r = new Float64Array(n);
    this.w = new Float64Array(n);
  }
}

const cache = new Map<number, Float64Array>();
const CACHE_ENTRIES = 8;

/** One simulated statistic. Outside the generator: V8 optimizes a long loop in a plain function, not in a generator. */
function oneReplication(random: SeededRandom, y: Float64Array, work: MixtureWork): number {
  for (let i = 0; i < y.length; i++) y[i] = Math.log(random.exponential());
  y.sort();
  return mixtureStatistic(y, work).statistic;
}

/** MIXTURE_REPLICATIONS statistics of complete one-population samples of n, ascending. */
export function simulateMixtureStatistics(n: number): Float64Array {
  const hit = cache.get(n);
  if (hit) return hit;
  // About 0.56 of the 20 n per replication it cost before the one-pass E-step (whole-run ratio): slices as long as before.
  const perSlice = replicationsPerSlice(11 * n);
  const sorted = simulate("mixture check", String(n), function* () {
    const random = new SeededRandom((patternSeed(n, []) ^ SALT) >>> 0);
    const y = new Float64Array(n);
    const work = new MixtureWork(n);
    const out = new Float64Array(MIXTURE_REPLICATIONS);
    let kept = 0;
    for (let rep = 0; rep < MIXTURE_REPLICATIONS; rep++) {
      if (rep % perSlice === perSlice - 1) yield;
      const s = oneReplication(random, y, work);
      if (Number.isFinite(s)) out[kept++] = s;
    }
    return out.slice(0, kept).sort();
  });
  cache.set(n, sorted);
  if (cache.size > CACHE_ENTRIES) cache.delete(cache.keys().next().value as number);
  return sorted;
}

export interface MixtureCheck extends MixtureStatistic {
  pValue: number;
  /** Binomial standard error of pValue, sqrt(p (1 - p) / replications). */
  pValueStandardError: number;
  replications: number;
}

/** The check for a complete sample of strengths (at least MIXTURE_MIN_SPECIMENS). */
export function mixtureCheck(strengths: readonly number[]): MixtureCheck {
  const y = Float64Array.from(strengths, Math.log).sort();
  const observed = mixtureStatistic(y);
  const reference = simulateMixtureStatistics(y.length);
  let lo = 0;
  let hi = reference.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (reference[mid] < observed.statistic) lo = mid + 1;
    else hi = mid;
  }
  const pValue = (1 + reference.length - lo) / (1 + reference.length);
  return { ...observed, pValue, pValueStandardError: Math.sqrt((pValue * (1 - pValue)) / reference.length), replications: reference.length };
}
