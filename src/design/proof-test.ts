/**
 * Proof testing: load every part to a proof stress s_p once, discard the ones
 * that break, and the survivors carry a guarantee.
 *
 * Assumes the proof load is applied and removed in an inert environment (or
 * fast enough that no crack grows during unloading) so every survivor has an
 * inert strength above s_p. Evans & Wiederhorn (1974, Int J Fract 10:379)
 * set out this analysis; the relations below are re-derived from the Weibull
 * distribution and the power-law crack velocity (crack-growth-life.ts).
 */
import { ensure, ensurePositive, notRepresentable } from "../errors";
import { failureProbability } from "../weibull/distribution";
import { checkExponent, inertStrengthToSurvive, timeToFailureFromInertStrength } from "./crack-growth-life";

interface ProofWeibull {
  proofStress: number;
  shape: number;
  scale: number;
  sizeRatio?: number;
}

/** Fraction of parts that break in the proof test: 1 - exp(-k (s_p/sigma_theta)^m). */
export function proofBreakFraction({ proofStress, shape, scale, sizeRatio = 1 }: ProofWeibull): number {
  ensurePositive(proofStress, "proof stress");
  return failureProbability({ stress: proofStress, shape, scale, sizeRatio });
}

/**
 * Failure probability, at inert stress `stress`, of a part that survived the
 * proof test: the Weibull distribution truncated at s_p,
 *   F(s) = 1 - exp(-k ((s/th)^m - (s_p/th)^m)) for s > s_p, and 0 for s <= s_p.
 */
export function postProofFailureProbability({
  stress,
  proofStress,
  shape,
  scale,
  sizeRatio = 1,
}: ProofWeibull & { stress: number }): number {
  ensurePositive(proofStress, "proof stress");
  ensurePositive(shape, "modulus");
  ensurePositive(scale, "characteristic strength");
  ensurePositive(sizeRatio, "size ratio");
  ensure(Number.isFinite(stress) && stress >= 0, () => `stress must be zero or positive (got ${stress})`);
  if (stress <= proofStress) return 0;
  // k (s/th)^m (1 - (s_p/s)^m): the difference through expm1, so a stress just
  // above the proof stress keeps its digits.
  const logHazardAtStress = Math.log(sizeRatio) + shape * Math.log(stress / scale);
  // ln(s_p/s) as -log1p((s - s_p)/s_p): the subtraction is exact near s_p, a quotient is not.
  const truncated = -Math.expm1(-shape * Math.log1p((stress - proofStress) / proofStress));
  const hazard = Math.exp(logHazardAtStress) * truncated;
  // Positive above the proof stress: 0 there is an underflow, an error rather than a probability.
  const pf = -Math.expm1(-hazard);
  if (pf === 0) throw notRepresentable("failure probability", "small");
  return pf;
}

/**
 * Guaranteed minimum life at constant service stress s_a after a proof test
 * at s_p: t_min = B s_a^(-n) (s_p^(n-2) - s_a^(n-2)). The familiar
 * B s_p^(n-2) s_a^(-n) drops the second term; keeping it makes the guarantee
 * fall to zero, as it must, when the service stress reaches the proof stress.
 */
export function proofMinimumLife({
  proofStress,
  serviceStress,
  n,
  B,
}: {
  proofStress: number;
  serviceStress: number;
  n: number;
  B: number;
}): number {
  checkExponent(n);
  ensurePositive(proofStress, "proof stress");
  ensurePositive(serviceStress, "service stress");
  ensure(
    serviceStress <= proofStress,
    () => `the service stress (${serviceStress}) exceeds the proof stress (${proofStress}): the proof test guarantees nothing`,
  );
  return timeToFailureFromInertStrength({ stress: serviceStress, inertStrength: proofStress, n, B });
}

/**
 * Proof stress that guarantees a minimum life t at service stress s_a, the
 * inverse of proofMinimumLife: s_p = s_a (1 + t s_a^2 / B)^(1/(n-2)).
 */
export function proofStressForLife({
  serviceStress,
  minimumLife,
  n,
  B,
}: {
  serviceStress: number;
  minimumLife: number;
  n: number;
  B: number;
}): number {
  return inertStrengthToSurvive({ stress: serviceStress, duration: minimumLife, n, B });
}
