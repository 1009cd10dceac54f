/**
 * Confidence bounds and calibrated p-values for a pooled material fit, by a
 * seeded parametric simulation: replicate data sets of the same design (the
 * same groups and specimen counts, complete samples) are drawn from the
 * fitted material model (m_hat, sigma_0_hat) and refitted.
 *
 * Bounds use the pivots of ASTM C1239's method, estimated from the
 * replicates instead of a table (a parametric bootstrap): q = m_b/m_hat and
 * t = m_b ln(sigma_0_b/sigma_0_hat) (b: a replicate's fit), so at two-sided confidence C
 *   m_L = m_hat / q_(1+C)/2,  m_U = m_hat / q_(1-C)/2,
 *   sigma_0_L = sigma_0_hat exp(-t_(1+C)/2 / m_hat), sigma_0_U = sigma_0_hat exp(-t_(1-C)/2 / m_hat).
 * sigma_0 is the characteristic strength of a body of unit effective size, so
 * its bounds widen as the unit moves away from the tested sizes: they depend
 * on the size unit, as any extrapolated strength does.
 *
 * p-values: (1 + #{replicate statistic >= observed}) / (1 + replicates).
 * The one-modulus statistic's null law does not depend on the parameters
 * (it is invariant under rescaling each group and raising all strengths to a
 * common power), so this p-value is exact up to Monte Carlo error; the
 * size-effect statistic's law depends on m through the size laws, so its
 * p-value is a parametric bootstrap at the fitted values.
 *
 * Complete samples only: censored specimens would need a model of the
 * competing population that censored them.
 */
import { InputError } from "../errors";
import { SeededRandom } from "../numeric/random";
import { replicationsPerSlice, simulate } from "../numeric/replication-slices";
import { sortedQuantile } from "../weibull/pivotal-simulation";
import { requireSimulationSize } from "../weibull/simulation-limits";
import { type MaterialFitResult, ratioStatistics, searchRange, threeFits } from "./material-fit";
import { pooledSample } from "./material-likelihood";
import type { SizeLaw } from "./specimen-geometry";

export const MATERIAL_SIMULATION = { replications: 2000, seed: 20261202 } as const;

export interface MaterialSimulation {
  confidence: number;
  shapeBounds: { lower: number; upper: number };
  scaleBounds: { lower: number; upper: number };
  /** null when the fit has no one-modulus statistic (a configuration's failures all equal). */
  oneModulusP: number | null;
  sizeEffectP: number;
  /** Replicates whose three fits all converged (the others are left out). */
  replications: number;
  requested: number;
  seed: number;
}

export function simulateMaterialFit({
  fit,
  laws,
  confidence = 0.9,
  replications = MATERIAL_SIMULATION.replications,
  seed = MATERIAL_SIMULATION.seed,
}: {
  fit: MaterialFitResult;
  laws: readonly SizeLaw[];
  confidence?: number;
  replications?: number;
  seed?: number;
}): MaterialSimulation {
  if (!(confidence >= 0.5 && confidence <= 0.99)) {
    throw new InputError("input", `confidence must lie from 0.5 to 0.99 for the simulated bounds (got ${confidence})`);
  }
  if (fit.censored) throw new InputError("notApplicable", "the simulated bounds and p-values need complete samples (no censored specimens)");
  requireSimulationSize(
    fit.groups.reduce((s, g) => s + g.specimens, 0),
    "the pooled fit's bounds and p-values",
  );
  const m = fit.shape;
  const logScale = Math.log(fit.materialScale);
  const logTheta = laws.map((law) => logScale - law.logSize(m) / m);
  const sizes = fit.groups.map((g) => g.specimens);
  const range = searchRange(laws);
  const perSlice = replicationsPerSlice(16 * sizes.reduce((s, n) => s + n, 0));
  const { q, t, above1, above2 } = simulate("material fit", `${seed}|${replications}|${m}|${logTheta.join(",")}|${sizes.join(",")}`, function* () {
    const random = new SeededRandom(seed);
    const q: number[] = [];
    const t: number[] = [];
    let above1 = 0;
    let above2 = 0;
    const strengths = sizes.map((n) => new Array<number>(n));
    // One replication as a plain function: V8 optimizes a long loop inside a generator poorly.
    const replicate = (): void => {
      for (let g = 0; g < sizes.length; g++) {
        for (let i = 0; i < sizes[g]; i++) strengths[g][i] = Math.exp(logTheta[g] + Math.log(random.exponential()) / m);
      }
      const data = pooledSample(strengths.map((s) => ({ strengths: s })));
      const fits = threeFits(data, laws, { scan: false, ...range });
      if (!fits.pooled.converged || !fits.common.converged || !fits.separate.every((f) => f.converged)) return;
      const stats = ratioStatistics(fits);
      if (fit.oneModulusStatistic !== null && stats.oneModulus >= fit.oneModulusStatistic) above1++;
      if (stats.sizeEffect >= fit.sizeEffectStatistic) above2++;
      q.push(fits.pooled.shape / m);
      t.push(fits.pooled.shape * (fits.pooled.logScale - logScale));
    };
    for (let b = 0; b < replications; b++) {
      if (b % perSlice === perSlice - 1) yield;
      replicate();
    }
    return { q, t, above1, above2 };
  });
  const used = q.length;
  if (used < 0.95 * replications) {
    // Simulated fits fail mostly where the fitted modulus sits near the end of the moduli the size laws cover
    // (a pooled fit beyond it has no effective size), or where groups are too small for their own fits. The
    // bounds and p-values then do not exist for these data: the fit itself still does.
    throw new InputError(
      "notApplicable",
      `only ${used} of ${replications} simulated data sets could be fitted (pooled modulus inside ${range.lowest} to ${range.highest}, the moduli every configuration's size law covers, and each configuration's own fit), too few for simulated bounds and p-values`,
    );
  }
  q.sort((a, b) => a - b);
  t.sort((a, b) => a - b);
  const hi = (1 + confidence) / 2;
  const lo = (1 - confidence) / 2;
  return {
    confidence,
    shapeBounds: { lower: m / sortedQuantile(q, hi), upper: m / sortedQuantile(q, lo) },
    scaleBounds: {
      lower: Math.exp(logScale - sortedQuantile(t, hi) / m),
      upper: Math.exp(logScale - sortedQuantile(t, lo) / m),
    },
    oneModulusP: fit.oneModulusStatistic === null ? null : (1 + above1) / (1 + used),
    sizeEffectP: (1 + above2) / (1 + used),
    replications: used,
    requested: replications,
    seed,
  };
}
