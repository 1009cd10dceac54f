/**
 * Strength-probability-time design: the constant stress a part may carry for
 * a lifetime at a target survival probability, and the equivalent constant
 * stress of a varying load.
 *
 * Weakest-link statistics and slow crack growth combine through the flaw that
 * sits at the design quantile: every flaw keeps its rank while it grows (the
 * remaining strength falls monotonically with the initial one), so the part
 * survives the lifetime with probability R exactly when the flaw at the
 * inert-strength quantile 1 - R survives it.
 */
import { ensure, ensurePositiveResult, ensurePositive, InputError, describe } from "../errors";
import { findRoot } from "../numeric/roots";
import { CompensatedSum } from "../numeric/sum";
import { designStress } from "../weibull/distribution";
import { checkExponent, lifetimeStress } from "./crack-growth-life";

export interface LifeDesignResult {
  /** Allowable constant stress over the lifetime. */
  stress: number;
  /** The inert strength at the target survival (the design flaw). */
  inertStrength: number;
  converged: boolean;
  iterations: number;
}

/**
 * Allowable constant stress for survival probability `survival` over
 * `lifetime`, from the inert-strength Weibull parameters (tested in an inert
 * environment or fast enough that no crack grew) and the crack-growth n and B.
 *
 * Solves B s^(n-2) + t s^n = B s_i^(n-2) (the exact power-law relation), with
 * s_i the inert design strength. When t s^2 >> B this is the familiar
 * s = (B s_i^(n-2) / t)^(1/n).
 */
export function lifeDesignStress({
  survival,
  lifetime,
  shape,
  scale,
  sizeRatio = 1,
  n,
  B,
}: {
  survival: number;
  lifetime: number;
  shape: number;
  scale: number;
  sizeRatio?: number;
  n: number;
  B: number;
}): LifeDesignResult {
  checkExponent(n);
  ensurePositive(lifetime, "lifetime");
  ensurePositive(B, "B parameter");
  const inertStrength = designStress({ survival, shape, scale, sizeRatio });
  // In u = ln(s / s_i): g(u) = (n-2) u + log1p(c e^(2u)) with c = t s_i^2 / B.
  // g rises with slope between n-2 and n, so from any hi with g(hi) >= 0 the
  // root lies within g(hi)/(n-2) below it.
  const logC = Math.log(lifetime) + 2 * Math.log(inertStrength) - Math.log(B);
  const g = (u: number) => (n - 2) * u + log1pExp(logC + 2 * u);
  // u = -ln(c)/n solves the approximate relation and is never below the root.
  const hi = Math.min(0, -logC / n);
  const gHi = g(hi);
  if (gHi === 0) return { stress: inertStrength * Math.exp(hi), inertStrength, converged: true, iterations: 0 };
  const lo = hi - gHi / (n - 2) - 1e-12 * (1 + Math.abs(hi));
  const result = findRoot(g, lo, hi, { relativeTolerance: 1e-15 });
  const stress = inertStrength * Math.exp(result.root);
  ensurePositiveResult(stress, "allowable stress");
  return { stress, inertStrength, converged: result.converged, iterations: result.iterations };
}

/**
 * The same design from Weibull parameters measured at a constant stress rate
 * (in the service environment): the design strength at that rate, carried to
 * the lifetime with lifetimeStress (needs n but no B).
 */
export function lifeDesignStressFromRateTests({
  survival,
  lifetime,
  shape,
  scale,
  sizeRatio = 1,
  stressRate,
  n,
}: {
  survival: number;
  lifetime: number;
  shape: number;
  scale: number;
  sizeRatio?: number;
  stressRate: number;
  n: number;
}): number {
  const strength = designStress({ survival, shape, scale, sizeRatio });
  return lifetimeStress({ strength, stressRate, n, lifetime });
}

/** ln(1 + e^x) without overflow. */
function log1pExp(x: number): number {
  return x > 0 ? x + Math.log1p(Math.exp(-x)) : Math.log1p(Math.exp(x));
}

export interface LoadHistoryResult {
  /** Constant stress that grows cracks as much as the history does over the reference duration. */
  stress: number;
  /** Sum of the durations. */
  totalDuration: number;
  /** The duration the equivalent stress is quoted for. */
  referenceDuration: number;
}

/**
 * Equivalent constant stress of a load history given as blocks of constant
 * stress: s_eq^n T = sum s_j^n t_j. Because crack growth depends on the
 * history only through the integral of s^n (crack-growth-life.ts), a constant
 * s_eq for T grows every crack exactly as much as the history does.
 * Compressive blocks grow no crack: enter them as zero.
 */
export function loadHistoryStress({
  stresses,
  durations,
  n,
  referenceDuration,
}: {
  stresses: readonly number[];
  durations: readonly number[];
  n: number;
  /** Duration to quote the equivalent stress for; default the total of the durations. */
  referenceDuration?: number;
}): LoadHistoryResult {
  checkExponent(n);
  if (stresses.length !== durations.length) {
    throw new InputError(
      "input",
      `the stresses (${stresses.length}) and durations (${durations.length}) must have the same length`,
    );
  }
  ensure(stresses.length > 0, "the load history is empty");
  let maxStress = 0;
  const total = new CompensatedSum();
  for (let j = 0; j < stresses.length; j++) {
    const s = stresses[j];
    const t = durations[j];
    // Test first, build the message only on failure (no closure per block either).
    if (!(Number.isFinite(s) && s >= 0)) {
      throw new InputError("input", `stress ${j + 1} must be zero or positive (got ${describe(s)}); enter compressive blocks as zero`);
    }
    if (!(Number.isFinite(t) && t >= 0)) throw new InputError("input", `duration ${j + 1} must be zero or positive (got ${describe(t)})`);
    maxStress = Math.max(maxStress, s);
    total.add(t);
  }
  const totalDuration = total.value;
  ensure(totalDuration > 0, "the load history has no duration");
  const reference = referenceDuration ?? totalDuration;
  ensurePositive(reference, "reference duration");
  if (maxStress === 0) return { stress: 0, totalDuration, referenceDuration: reference };
  // Scaled by the largest stress so s^n cannot overflow.
  const damage = new CompensatedSum();
  for (let j = 0; j < stresses.length; j++) {
    if (stresses[j] > 0 && durations[j] > 0) damage.add(durations[j] * Math.pow(stresses[j] / maxStress, n));
  }
  const stress = maxStress * Math.exp((Math.log(damage.value) - Math.log(reference)) / n);
  ensurePositiveResult(stress, "equivalent stress");
  return { stress, totalDuration, referenceDuration: reference };
}
