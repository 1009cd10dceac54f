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

export interface CheckedSample {
  strengths: Float64Array;
  censored: Uint8Array;
  failures: number;
  /** The largest strength (every fit divides by it). */
  largest: number;
}

export function checkSample({ strengths, censored }: StrengthSample): CheckedSample {
  if (censored && censored.length !== strengths.length) {
    throw new InputError("input", `the censoring flags (${censored.length}) do not match the strengths (${strengths.length})`);
  }
  const values = new Float64Array(strengths.length);
  const flags = new Uint8Array(strengths.length);
  let failures = 0;
  let largest = 0;
  for (let i = 0; i < strengths.length; i++) {
    const s = strengths[i];
    // Test first, build the message only on failure: this runs once per specimen.
    if (!(Number.isFinite(s) && s > 0)) throw new InputError("input", `strength ${i + 1} must be a positive number (got ${describe(s)})`);
    values[i] = s;
    if (s > largest) largest = s;
    if (censored?.[i]) flags[i] = 1;
    else failures++;
  }
  if (failures < 2) throw new InputError("input", `a fit needs at least two failures from the population (got ${failures})`);
  return { strengths: values, censored: flags, failures, largest };
}
