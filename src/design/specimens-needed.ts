/**
 * Test planning: how many specimens make the lower confidence bound on the
 * design stress close enough to its point estimate.
 *
 * With a complete sample of n specimens and raw maximum-likelihood estimates,
 * the lower bound at confidence C on the stress a body k times the specimen's
 * effective size survives with probability S is x_hat exp(-u_C/m_hat), u_C the
 * C-quantile of the design-stress pivot u = m_hat ln(x_hat/x)
 * (design-stress-bound.ts; u's law depends on n and w = ln(-ln S) - ln k only).
 * The bound's ratio to the estimate is exp(-u_C/m_hat): random through m_hat.
 * For planning we evaluate it at the modulus the engineer expects:
 *
 *   planned ratio(n) = exp(-u_C(n, w) / m)
 *
 * i.e. the ratio a test series would show if its fitted modulus came out
 * equal to the assumed one. It is not an average over future fits: samples
 * whose fitted modulus falls short of m give a smaller ratio. The number of
 * specimens is the smallest n >= 2 whose planned ratio reaches the target;
 * u_C falls as n grows (like 1/sqrt(n)), so every larger n meets it too.
 */
import { InputError } from "../errors";
import { PIVOTAL_PROBABILITIES } from "../weibull/confidence-bounds";
import { quantilePivotQuantile } from "../weibull/quantile-pivot-table";

/** Largest sample size the planner searches. */
export const MOST_SPECIMENS = 10000;

/** Sample sizes of the planning table (BOUNDRATIOTABLE): dense where decisions are made. */
export const PLANNING_SIZES: readonly number[] = [
  ...Array.from({ length: 29 }, (_, i) => i + 2),
  35, 40, 45, 50, 55, 60, 70, 80, 90, 100, 120, 150, 200, 300, 500, 1000,
];

export interface PlanningInputs {
  /** Weibull modulus the engineer expects (from a datasheet or earlier tests). */
  shape: number;
  /** Required survival probability of the part, strictly between 0 and 1. */
  survival: number;
  /** Part's effective size over the specimen's; default 1. */
  sizeRatio?: number;
  /** One-sided confidence of the lower bound; default 0.95 as DESIGNSTRESSBOUND. */
  confidence?: number;
}

function check({ shape, survival, sizeRatio = 1, confidence = 0.95 }: PlanningInputs): number {
  if (!(Number.isFinite(shape) && shape > 0)) throw new InputError("input", `modulus must be a positive number (got ${shape})`);
  if (!(survival > 0 && survival < 1)) throw new InputError("input", `survival must lie strictly between 0 and 1 (got ${survival})`);
  if (!(Number.isFinite(sizeRatio) && sizeRatio > 0)) throw new InputError("input", `sizeRatio must be a positive number (got ${sizeRatio})`);
  const { lowest, highest } = PIVOTAL_PROBABILITIES;
  if (!(confidence >= Math.max(lowest, 0.5) && confidence <= highest)) {
    throw new InputError("input", `confidence must lie from 0.5 to ${highest} (got ${confidence})`);
  }
  // -ln S without forming 1 - S, as the design-stress bound does.
  return Math.log(-Math.log(survival)) - Math.log(sizeRatio);
}

/**
 * Planned ratio of the design-stress lower bound to its point estimate, for n specimens.
 * @example boundRatio({ specimens: 30, shape: 10, survival: 0.999 }) // about 0.784
 */
export function boundRatio(inputs: PlanningInputs & { specimens: number }): number {
  const w = check(inputs);
  const n = inputs.specimens;
  if (!(Number.isInteger(n) && n >= 2 && n <= MOST_SPECIMENS)) {
    throw new InputError("input", `specimens must be a whole number from 2 to ${MOST_SPECIMENS} (got ${n})`);
  }
  return Math.exp(-quantilePivotQuantile({ specimens: n, logHazard: w, probability: inputs.confidence ?? 0.95 }) / inputs.shape);
}

export interface SpecimensNeeded {
  /** Smallest n meeting the target, or null when even MOST_SPECIMENS does not. */
  specimens: number | null;
  /** Planned ratio at that n (or at MOST_SPECIMENS). */
  ratio: number;
}

/**
 * Smallest complete sample whose planned bound ratio reaches targetRatio.
 * @example specimensNeeded({ targetRatio: 0.8, shape: 10, survival: 0.999 }).specimens // 35
 */
export function specimensNeeded(inputs: PlanningInputs & { targetRatio: number }): SpecimensNeeded {
  const w = check(inputs);
  const { targetRatio, shape, confidence = 0.95 } = inputs;
  if (!(targetRatio > 0 && targetRatio < 1)) {
    throw new InputError("input", `targetRatio must lie strictly between 0 and 1: the bound is below the estimate (got ${targetRatio})`);
  }
  const ratio = (n: number) => Math.exp(-quantilePivotQuantile({ specimens: n, logHazard: w, probability: confidence }) / shape);
  // Double until the target is met, then bisect: the ratio rises with n.
  let hi = 2;
  while (hi < MOST_SPECIMENS && ratio(hi) < targetRatio) hi = Math.min(hi * 2, MOST_SPECIMENS);
  if (ratio(hi) < targetRatio) return { specimens: null, ratio: ratio(MOST_SPECIMENS) };
  let lo = Math.max(2, Math.floor(hi / 2));
  if (ratio(lo) >= targetRatio) return { specimens: lo, ratio: ratio(lo) };
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (ratio(mid) >= targetRatio) hi = mid;
    else lo = mid;
  }
  return { specimens: hi, ratio: ratio(hi) };
}
