/**
 * e^t by plain arithmetic that the JavaScript engine compiles inline, for the
 * one place where Math.exp is the largest cost: the maximum-likelihood fit
 * evaluates x^m = e^(m ln x) for every specimen at every iterate, and there a
 * call to the engine's Math.exp costs about twice this function.
 *
 * Method (Tang, ACM TOMS 15(2), 1989, 144-157): write t = (64 k + j) ln2/64 + r
 * with j in 0..63 and |r| <= ln2/128, so that
 *
 *   e^t = 2^k * 2^(j/64) * e^r.
 *
 * 2^k is exact (a table of powers of two), 2^(j/64) comes from a table
 * correctly rounded by mpmath (exp-table.ts), r is formed with ln2/64 split
 * into two parts so k * HI is exact, and e^r - 1 is its Taylor polynomial to
 * degree 6 (truncation below 3e-20 relative at |r| = ln2/128).
 *
 * Accuracy: within 2e-16 relative of the exact e^t (1.9e-16 at worst) at 2,300
 * doubles across [-708, 0], measured against mpmath at 60 digits
 * (test/fast-exp.test.ts, from test/fixtures/generate_fast_exp.py), and within
 * 4e-16 of Math.exp at 200,000 seeded points: about one unit in the last
 * place, like Math.exp. Outside [-708, 0] (results that would be subnormal,
 * positive t, NaN) it returns Math.exp(t), so it is correct everywhere and
 * fast where the fit needs it: m ln(s / s_max) is never positive.
 *
 * @example
 * fastExp(-1) // 0.36787944117144233, e^-1
 */
import { EXP_INV_STEP, EXP_STEP_HI, EXP_STEP_LO, EXP_TABLE } from "./exp-table";

/** 2^k for k = -1022..0 (index k + 1022): halving 1 is exact down to the smallest normal double. */
const POWERS_OF_TWO = new Float64Array(1023);
POWERS_OF_TWO[1022] = 1;
for (let i = 1021; i >= 0; i--) POWERS_OF_TWO[i] = POWERS_OF_TWO[i + 1] / 2;

/** The fast range: below -708 the result nears the subnormal doubles, where Math.exp takes over. */
const FAST_LOWEST = -708;

export function fastExp(t: number): number {
  if (!(t >= FAST_LOWEST && t <= 0)) return Math.exp(t);
  // The nearest multiple of ln2/64 (Math.round compiles to one instruction; ties may go either way).
  const multiple = Math.round(t * EXP_INV_STEP);
  const r = t - multiple * EXP_STEP_HI - multiple * EXP_STEP_LO;
  const index = multiple | 0;
  const r2 = r * r;
  // e^r - 1, grouped so the short products run side by side.
  const q = r + r2 * (0.5 + r * (1 / 6) + r2 * (1 / 24 + r * (1 / 120) + r2 * (1 / 720)));
  const tableValue = EXP_TABLE[index & 63];
  // index >> 6 is k (arithmetic shift: floor for negative multiples), between -1022 and 0 here.
  return POWERS_OF_TWO[(index >> 6) + 1022] * (tableValue + tableValue * q);
}
