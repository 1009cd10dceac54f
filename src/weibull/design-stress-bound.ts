/**
 * Lower confidence bound on the design stress: the stress a body of relative
 * size k survives with probability S, bounded below with confidence C, by the
 * pivotal quantity for a Weibull quantile (Thoman, Bain & Antle 1969; Lawless
 * 1982 section 4.1).
 *
 * The design stress is the quantile x = th (-ln S / k)^(1/m) = th exp(w/m),
 * w = ln(-ln S) - ln k. With raw maximum-likelihood estimates,
 *
 *   u = m_hat ln(x_hat / x) = t + w (1 - q)     (q = m_hat/m, t = m_hat ln(th_hat/th))
 *
 * is free of the true parameters, and P(u <= u_C) = C gives the bound
 *
 *   x_L = x_hat exp(-u_C / m_hat),   x_hat = th_hat exp(w / m_hat).
 *
 * u needs the joint law of q and t. Complete samples read u_C from a seeded
 * table (quantile-pivot-table.ts). Censored samples take it from the
 * competing-population bootstrap (censored-bootstrap.ts), the same
 * draws as their modulus and strength bounds: each replication gives
 * u_b = t_b + w (1 - q_b) = m_b ln(x_b / x_hat), the bootstrap counterpart
 * of u; the bound is then approximate, as for the parameter bounds.
 */
import { ensure, ensureConverged, ensurePositiveResult, ensureProbability } from "../errors";
import { isCensored, MIN_TAIL_DRAWS, pivotalSource, PIVOTAL_PROBABILITIES } from "./confidence-bounds";
import { fitMaximumLikelihood } from "./maximum-likelihood";
import { sortedQuantile } from "./pivotal-simulation";
import { quantilePivotQuantile } from "./quantile-pivot-table";
import type { StrengthSample } from "./sample";

export interface DesignStressBound {
  /** Lower confidence bound on the design stress. */
  lower: number;
  /** Point estimate from the raw ML fit (not the unbiased modulus): the bound's centre. */
  estimate: number;
  /** The quantile u_C used. */
  pivotQuantile: number;
  source: "table" | "bootstrap";
}

export function designStressBound({
  survival,
  strengths,
  censored,
  confidence = 0.95,
  sizeRatio = 1,
}: StrengthSample & { survival: number; confidence?: number; sizeRatio?: number }): DesignStressBound {
  ensureProbability(survival, "survival probability");
  ensureProbability(confidence, "confidence");
  ensure(Number.isFinite(sizeRatio) && sizeRatio > 0, () => `size ratio must be a positive number (got ${sizeRatio})`);
  const { lowest, highest } = PIVOTAL_PROBABILITIES;
  ensure(
    confidence >= lowest && confidence <= highest,
    () => `confidence must lie from ${lowest} to ${highest} for this bound (got ${confidence}): the pivotal quantities are simulated over that range`,
  );
  const sample = { strengths, censored };
  const fit = fitMaximumLikelihood(sample);
  ensureConverged(fit.converged, "the maximum-likelihood fit did not converge");
  // -ln S is exact for S near 1 (no 1 - S subtraction).
  const w = Math.log(-Math.log(survival)) - Math.log(sizeRatio);
  let uC: number;
  const censoredSample = isCensored(sample);
  if (!censoredSample) {
    uC = quantilePivotQuantile({ specimens: strengths.length, logHazard: w, probability: confidence });
  } else {
    const { shapeRatio, scaleLogError } = pivotalSource(sample, fit).pairs!;
    ensure(
      Math.min(confidence, 1 - confidence) * shapeRatio.length >= MIN_TAIL_DRAWS,
      () => `the bootstrap of this censored sample has ${shapeRatio.length} draws, too few for a bound at confidence ${confidence}: lower the confidence`,
    );
    const u = new Float64Array(shapeRatio.length);
    for (let i = 0; i < u.length; i++) u[i] = scaleLogError[i] + w * (1 - shapeRatio[i]);
    u.sort();
    uC = sortedQuantile(u, confidence);
  }
  return { ...boundFromPivot(fit, w, uC), pivotQuantile: uC, source: censoredSample ? "bootstrap" : "table" };
}

/**
 * x_hat = th_hat exp(w/m_hat) and x_L = th_hat exp((w - u_C)/m_hat): shared by
 * the bound from data and the bound from datasheet values.
 */
export function boundFromPivot(fit: { shape: number; scale: number }, logHazard: number, pivotQuantile: number): { lower: number; estimate: number } {
  const estimate = fit.scale * Math.exp(logHazard / fit.shape);
  const lower = fit.scale * Math.exp((logHazard - pivotQuantile) / fit.shape);
  ensurePositiveResult(lower, "design stress bound");
  ensurePositiveResult(estimate, "design stress");
  return { lower, estimate };
}
