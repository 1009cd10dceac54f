/**
 * A strength sample as the estimators see it: positive strengths, each either
 * a failure from the population being fitted or censored (the specimen broke
 * from another flaw population, or did not break, at that stress).
 */
import { InputError, describe } from "../errors";

export interface StrengthSample {
  strengths: readonly number[];
  /** censored[i] true: specimen i did not fail from the population being fitted. */
  censored?: readonly boolean[];
}

/** What the checks find: the number of failures and the largest strength (every fit divides by it). */
export interface SampleSummary {
  failures: number;
  largest: number;
}

export interface CheckedSample extends SampleSummary {
  strengths: Float64Array;
  censored: Uint8Array;
}

/**
 * The checks every estimator applies, without copying the sample: each
 * strength a positive finite number, flags (if any) one per strength, at least
 * two failures.
 *
 * @example
 * summarizeSample({ strengths: [300, 350, 320], censored: [false, true, false] }) // { failures: 2, largest: 350 }
 */
export function summarizeSample({ strengths, censored }: StrengthSample): SampleSummary {
  if (censored && censored.length !== strengths.length) {
    throw new InputError("input", `the censoring flags (${censored.length}) do not match the strengths (${strengths.length})`);
  }
  let failures = 0;
  let largest = 0;
  for (let i = 0; i < strengths.length; i++) {
    const s = strengths[i];
    // Test first, build the message only on failure: this runs once per specimen.
    if (!(Number.isFinite(s) && s > 0)) throw new InputError("input", `strength ${i + 1} must be a positive number (got ${describe(s)})`);
    if (s > largest) largest = s;
    if (!censored?.[i]) failures++;
  }
  if (failures < 2) throw new InputError("input", `a fit needs at least two failures from the population (got ${failures})`);
  return { failures, largest };
}

/** The checks of summarizeSample, and the sample copied into typed arrays (censored[i] = 1 for a censored specimen). */
export function checkSample(sample: StrengthSample): CheckedSample {
  const { failures, largest } = summarizeSample(sample);
  const { strengths, censored } = sample;
  const values = new Float64Array(strengths.length);
  const flags = new Uint8Array(strengths.length);
  for (let i = 0; i < strengths.length; i++) {
    values[i] = strengths[i];
    if (censored?.[i]) flags[i] = 1;
  }
  return { strengths: values, censored: flags, failures, largest };
}
