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
 * samples of N = 3 .. 500 (for N = 2 the mean of m_hat is infinite and no
 * factor exists); between tabulated sizes we interpolate linearly in 1/N, and
 * beyond the table we use the fitted asymptotic form 1 - a/N - b/N^2.
 *
 * A censored sample has no table: its factor comes from a seeded bootstrap
 * of the competing flaw populations fitted to it (see censored-bootstrap.ts).
 */
import { ensure, ensureApplicable } from "../errors";
import { bootstrapCensored } from "./censored-bootstrap";
import { fitMaximumLikelihood } from "./maximum-likelihood";
import { pivotalTable } from "./pivotal-table";

export function unbiasingFactor(specimens: number): number {
  ensure(Number.isInteger(specimens) && specimens >= 2, () => `the unbiasing factor needs at least 2 specimens (got ${specimens})`);
  return pivotalTable().unbiasingFactor(specimens);
}

/**
 * Bootstrap replications for a censored sample of n specimens: the spread of
 * q_b falls like 1/sqrt(n), so fewer draws keep E[q_b] to about 0.2 % at any n
 * while the time per recalculation stays near a quarter of a second.
 */
export function censoredReplications(n: number): number {
  return Math.min(10000, Math.max(2000, Math.round(400000 / n)));
}

/**
 * For a censored sample, 1/E[q_b] from the competing-population bootstrap
 * (censored-bootstrap.ts): the factor that removes the bias of the ML modulus
 * under censoring like this sample's.
 */
export function censoredUnbiasingFactor(strengths: readonly number[], censored: readonly boolean[]): number {
  const failures = censored.filter((c) => !c).length;
  // With two failures the mean of the ML modulus is infinite, as for a complete sample of two.
  ensureApplicable(failures >= 3, "no unbiasing factor exists with only 2 failures (the mean of the ML modulus is infinite): use \"MLE-RAW\"");
  const fit = fitMaximumLikelihood({ strengths, censored });
  const { shapeRatio } = bootstrapCensored({ strengths, censored, fit, replications: censoredReplications(strengths.length) });
  let sum = 0;
  for (const q of shapeRatio) sum += q;
  return shapeRatio.length / sum;
}
