/**
 * Unbiasing factor for the maximum-likelihood Weibull modulus.
 *
 * The ML modulus of a small sample is biased high. We define the factor as
 *
 *   UF(N) = 1 / E[m_hat / m]
 *
 * so that UF(N) * m_hat has the true modulus as its mean (Thoman, Bain & Antle
 * 1969, Technometrics 11:445, tabulated the same quantity; ASTM C1239 and
 * ISO 20501 reproduce their table). Our values come from a seeded Monte Carlo
 * (tools/simulate_pivotal_tables.py, committed with its output), for complete
 * samples of N = 2 .. 500; between tabulated sizes we interpolate linearly in
 * 1/N, and beyond the table we use the fitted asymptotic form 1 - a/N - b/N^2.
 *
 * A censored sample has no table: its factor comes from a seeded simulation of
 * the same censoring pattern (see censored-simulation.ts).
 */
import { require } from "../errors";
import { censoredRanks, simulatePivotals } from "./censored-simulation";
import { pivotalTable } from "./pivotal-table";

export function unbiasingFactor(specimens: number): number {
  require(Number.isInteger(specimens) && specimens >= 2, `the unbiasing factor needs at least 2 specimens (got ${specimens})`);
  return pivotalTable().unbiasingFactor(specimens);
}

/** Replications for a censored pattern: E[q] to about 0.1 % (sd of q is ~0.8/sqrt(r)). */
export const CENSORED_REPLICATIONS = 20000;

export function censoredUnbiasingFactor(strengths: readonly number[], censored: readonly boolean[]): number {
  const { shapeRatio } = simulatePivotals({
    specimens: strengths.length,
    censoredRanks: censoredRanks(strengths, censored),
    replications: CENSORED_REPLICATIONS,
  });
  require(shapeRatio.length > 0, "the censoring pattern leaves too few failures to estimate the bias");
  let sum = 0;
  for (const q of shapeRatio) sum += q;
  return shapeRatio.length / sum;
}
