/**
 * One material across specimen geometries: the joint maximum-likelihood fit
 * of one Weibull modulus m and one material scale sigma_0, in which every
 * group's characteristic strength is sigma_0 V_g(m)^(-1/m) with its effective
 * size V_g re-evaluated at every trial m (the size effect is part of the fit).
 * The likelihoods are in material-likelihood.ts; this file finds their
 * maxima, the per-group comparison and the two likelihood-ratio statistics:
 *
 *   one modulus:  L1 = 2 (sum_g l_g(own m_g, th_g) - l_c(common m, free th_g)),
 *   size effect:  L2 = 2 (l_c(common m, free th_g) - l_p(m, sigma_0)),
 *
 * each with G - 1 degrees of freedom in the large-sample limit. Small samples
 * calibrate them by simulation (material-fit-simulation.ts).
 *
 * The pooled profile need not be concave in m (the size law bends it), so the
 * data's fit scans ln m on a grid for the highest point before solving
 * l_p'(m) = 0 beside it: a maximum at the end of the scanned range is
 * reported as not converged.
 */
import { InputError } from "../errors";
import { findRoot } from "../numeric/roots";
import {
  freeLogScale,
  freeScalesProfile,
  pooledSample,
  solveDecreasingSlope,
  startingModulus,
  tiedProfile,
  type PooledSample,
} from "./material-likelihood";
import type { SizeLaw } from "./specimen-geometry";

/** Moduli a pooled fit searches (bars and rods; disks are limited to their tabulated range). */
export const POOLED_MODULUS_RANGE = { lowest: 0.1, highest: 2000 } as const;
const GRID_POINTS = 120;

export interface MaterialGroupInput {
  /** The configuration as written (for labels). */
  label: string;
  law: SizeLaw;
  strengths: readonly number[];
  /** true: the specimen broke from another flaw population (censored at its strength). */
  censored?: readonly boolean[];
}

export interface MaterialGroupResult {
  label: string;
  specimens: number;
  failures: number;
  /** Effective size at the pooled modulus. */
  effectiveSize: number;
  /** sigma_0 V_g(m)^(-1/m): what the material fit says this group's characteristic strength is. */
  impliedScale: number;
  /** This group's own maximum-likelihood fit; null when its failures are all equal (no finite modulus). */
  ownShape: number | null;
  ownScale: number | null;
}

export interface MaterialFitResult {
  shape: number;
  materialScale: number;
  converged: boolean;
  groups: MaterialGroupResult[];
  /** Common modulus with free characteristic strengths. */
  commonShape: number;
  logLikelihood: { pooled: number; commonModulus: number; separate: number | null };
  /**
   * Likelihood-ratio statistics (>= 0) and their large-sample degrees of freedom. The one-modulus
   * statistic is null when a configuration's failures are all equal (ties from rounding, say): its own
   * fit has no finite modulus, so there is nothing to compare.
   */
  oneModulusStatistic: number | null;
  sizeEffectStatistic: number;
  degreesOfFreedom: number;
  censored: boolean;
}

/** The three fits on pooled data: used for the data and for every simulated replicate. */
export interface ThreeFits {
  pooled: { shape: number; logScale: number; logLikelihood: number; converged: boolean };
  common: { shape: number; logLikelihood: number; converged: boolean };
  separate: { shape: number; logScale: number; logLikelihood: number; converged: boolean }[];
}

function scanPooled(data: PooledSample, laws: readonly SizeLaw[], lowest: number, highest: number) {
  const profile = (m: number) => tiedProfile(data, laws, m);
  const a = Math.log(lowest);
  const b = Math.log(highest);
  let best = -1;
  let bestValue = -Infinity;
  const grid: number[] = [];
  for (let k = 0; k < GRID_POINTS; k++) {
    const m = Math.exp(a + ((b - a) * k) / (GRID_POINTS - 1));
    grid.push(m);
    const v = profile(m).logLikelihood;
    if (v > bestValue) {
      bestValue = v;
      best = k;
    }
  }
  if (best <= 0 || best >= GRID_POINTS - 1) return { shape: grid[Math.max(best, 0)], converged: false };
  // The slope changes sign between the neighbours of the highest grid point.
  const lo = grid[best - 1];
  const hi = grid[best + 1];
  const slope = (m: number) => profile(m).slope;
  let root = findRoot(slope, lo, hi);
  if (!root.converged) root = findRoot(slope, lo, grid[best]);
  if (!root.converged) root = findRoot(slope, grid[best], hi);
  return { shape: root.converged ? root.root : grid[best], converged: root.converged };
}

export function threeFits(
  data: PooledSample,
  laws: readonly SizeLaw[],
  { scan, lowest, highest }: { scan: boolean; lowest: number; highest: number },
): ThreeFits {
  const all = () => true;
  const common = solveDecreasingSlope((m) => freeScalesProfile(data, all, m), startingModulus(data));
  const separate = [];
  for (let g = 0; g < data.groupCount; g++) {
    const own = solveDecreasingSlope((m) => freeScalesProfile(data, (k) => k === g, m), Number.isFinite(common.shape) ? common.shape : 5);
    separate.push({ ...own, logScale: own.converged ? freeLogScale(data, g, own.shape) : NaN });
  }
  let pooledShape: number;
  let pooledConverged: boolean;
  if (scan) {
    const s = scanPooled(data, laws, lowest, highest);
    pooledShape = s.shape;
    pooledConverged = s.converged;
  } else {
    const start = Math.min(Math.max(Number.isFinite(common.shape) ? common.shape : 5, lowest * 1.01), highest / 1.01);
    const s = solveDecreasingSlope((m) => tiedProfile(data, laws, m), start, lowest, highest);
    pooledShape = s.shape;
    pooledConverged = s.converged;
  }
  const at = Number.isFinite(pooledShape) ? tiedProfile(data, laws, pooledShape) : { logScale: NaN, logLikelihood: NaN };
  return {
    pooled: { shape: pooledShape, logScale: at.logScale, logLikelihood: at.logLikelihood, converged: pooledConverged },
    common,
    separate,
  };
}

/** L1 (one modulus) and L2 (size effect), clamped at 0 against rounding. */
export function ratioStatistics(fits: ThreeFits): { oneModulus: number; sizeEffect: number } {
  const separate = fits.separate.reduce((s, f) => s + f.logLikelihood, 0);
  return {
    oneModulus: Math.max(0, 2 * (separate - fits.common.logLikelihood)),
    sizeEffect: Math.max(0, 2 * (fits.common.logLikelihood - fits.pooled.logLikelihood)),
  };
}

/** Moduli every group's size law covers, within POOLED_MODULUS_RANGE. */
export function searchRange(laws: readonly SizeLaw[]): { lowest: number; highest: number } {
  let lowest: number = POOLED_MODULUS_RANGE.lowest;
  let highest: number = POOLED_MODULUS_RANGE.highest;
  for (const law of laws) {
    lowest = Math.max(lowest, law.lowest);
    highest = Math.min(highest, law.highest);
  }
  return { lowest, highest };
}

/**
 * The pooled fit of one material over several specimen geometries.
 * @example fitMaterial({ groups: [bars, disks] }).shape // the pooled modulus; each group { label, law: sizeLaw(...), strengths }
 */
export function fitMaterial({ groups }: { groups: readonly MaterialGroupInput[] }): MaterialFitResult {
  if (groups.length < 2) throw new InputError("notApplicable", `a pooled fit needs specimens of at least two configurations (got ${groups.length})`);
  groups.forEach((g) => {
    if (g.censored && g.censored.length !== g.strengths.length) throw new InputError("input", `${g.label}: censoring flags do not match the strengths`);
    for (const s of g.strengths) if (!(Number.isFinite(s) && s > 0)) throw new InputError("input", `${g.label}: every strength must be a positive number`);
    const failures = g.strengths.length - (g.censored?.filter(Boolean).length ?? 0);
    if (failures < 2) throw new InputError("input", `${g.label}: each configuration needs at least two failures for its own fit (got ${failures})`);
  });
  const data = pooledSample(groups);
  // A group whose failures all share one strength has no finite modulus of its own.
  const first = new Float64Array(groups.length).fill(NaN);
  const spread = new Uint8Array(groups.length);
  for (let i = 0; i < data.logStrength.length; i++) {
    if (!data.failed[i]) continue;
    const g = data.group[i];
    if (Number.isNaN(first[g])) first[g] = data.logStrength[i];
    else if (data.logStrength[i] !== first[g]) spread[g] = 1;
  }
  if (!spread.some(Boolean)) throw new InputError("input", "all failure strengths within each configuration are equal: no modulus can be fitted");
  const flat = (g: number) => !spread[g];
  const laws = groups.map((g) => g.law);
  const range = searchRange(laws);
  const fits = threeFits(data, laws, { scan: true, ...range });
  const { oneModulus, sizeEffect } = ratioStatistics(fits);
  const m = fits.pooled.shape;
  const logScale = fits.pooled.logScale;
  return {
    shape: m,
    materialScale: Math.exp(logScale),
    converged: fits.pooled.converged && fits.common.converged && fits.separate.every((f, g) => flat(g) || f.converged),
    groups: groups.map((g, k) => {
      const lnV = laws[k].logSize(m);
      return {
        label: g.label,
        specimens: g.strengths.length,
        failures: data.failures[k],
        effectiveSize: Math.exp(lnV),
        impliedScale: Math.exp(logScale - lnV / m),
        ownShape: flat(k) ? null : fits.separate[k].shape,
        ownScale: flat(k) ? null : Math.exp(fits.separate[k].logScale),
      };
    }),
    commonShape: fits.common.shape,
    logLikelihood: {
      pooled: fits.pooled.logLikelihood,
      commonModulus: fits.common.logLikelihood,
      separate: groups.some((_, g) => flat(g)) ? null : fits.separate.reduce((s, f) => s + f.logLikelihood, 0),
    },
    oneModulusStatistic: groups.some((_, g) => flat(g)) ? null : oneModulus,
    sizeEffectStatistic: sizeEffect,
    degreesOfFreedom: groups.length - 1,
    censored: groups.some((g) => g.censored?.some(Boolean) ?? false),
  };
}
