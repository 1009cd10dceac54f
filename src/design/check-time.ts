/**
 * Slow crack growth and proof testing in a design check, on one footing: the
 * inert strength of the design flaw.
 *
 * Every flaw keeps its rank while it grows, so a part survives a lifetime t
 * at constant stress s with the required probability exactly when the flaw
 * at the inert design strength s_i does (lifetime-design.ts). The check
 * takes s_i on the verdict's basis (the lower bound when there is one), so
 * the lifetime allowable rests on the same bound as the inert allowable.
 *
 * A proof test at s_p leaves only parts whose inert strength is at least
 * s_p (unloaded fast or in an inert environment). The check credits it by
 * the floor max(s_i, s_p) on the design flaw's inert strength: conservative
 * (the survivors' strengths above s_p are not credited) and, because
 * s_i,L <= s_i holds with the bound's confidence, still a bound at that
 * confidence. With a lifetime, the floor s_p alone gives back the proof
 * test's guaranteed minimum life, t_min >= t exactly when s is at or below
 * the lifetime allowable from s_p.
 */
import { InputError } from "../errors";
import { findRoot } from "../numeric/roots";
import { inertStrengthToSurvive, timeToFailureFromInertStrength } from "./crack-growth-life";

/**
 * The constant stress a flaw of inert strength `inertStrength` sustains for
 * `lifetime`: the s with B s^(n-2) + t s^n = B s_i^(n-2), found as the
 * inverse of inertStrengthToSurvive (the same power-law relation).
 *
 * @example lifetimeStressFromInert({ inertStrength: 125.4, lifetime: 3.15e8, n: 35, B: 1e9 }) // about 98.4
 */
export function lifetimeStressFromInert({
  inertStrength,
  lifetime,
  n,
  B,
}: {
  inertStrength: number;
  lifetime: number;
  n: number;
  B: number;
}): number {
  // s_i^(n-2) = s^(n-2) (1 + t s^2 / B) with s < s_i, so ln s lies in [ln s_i - ln(1 + t s_i^2 / B) / (n-2), ln s_i].
  const hi = Math.log(inertStrength);
  const x = Math.log(lifetime) + 2 * hi - Math.log(B);
  // ln(1 + e^x) without overflow.
  const growth = x > 0 ? x + Math.log1p(Math.exp(-x)) : Math.log1p(Math.exp(x));
  const lo = hi - growth / (n - 2) - 1e-9;
  const f = (u: number) => Math.log(inertStrengthToSurvive({ stress: Math.exp(u), duration: lifetime, n, B })) - hi;
  const fHi = f(hi);
  if (fHi <= 0) return inertStrength;
  const root = findRoot(f, lo, hi, { relativeTolerance: 1e-15 });
  if (!root.converged) throw new InputError("notConverged", "the lifetime allowable stress did not converge");
  return Math.exp(root.root);
}

/**
 * Minimum time to failure at `stress` of a part whose inert strength is at
 * least `proofStress`: the proof test's guarantee (zero when the stress
 * reaches the proof stress).
 */
export function proofGuaranteedLife({ proofStress, stress, n, B }: { proofStress: number; stress: number; n: number; B: number }): number {
  if (stress >= proofStress) return 0;
  return timeToFailureFromInertStrength({ stress, inertStrength: proofStress, n, B });
}
