/**
 * Numbers inside plain-words verdicts: three significant figures, and
 * p-values that never claim more precision than their simulation has.
 */

/** Three significant figures, without exponent notation in the usual range of strengths and moduli. */
export function roundForText(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x !== 0 && (Math.abs(x) >= 1e6 || Math.abs(x) < 1e-3)) return x.toExponential(2);
  return String(Number(x.toPrecision(3)));
}

/**
 * "p = 0.012"; below 0.001 "p < 0.001" (a Monte Carlo p-value of a few
 * thousand draws resolves no finer). With the simulation's standard error:
 * "p = 0.0063 +- 0.0004" (one significant figure of error, the p-value to
 * the same decimal place), and "p < 0.001" only when 0.001 is more than two
 * standard errors away.
 */
export function pValueText(p: number, standardError?: number): string {
  if (standardError === undefined || !(standardError > 0)) return p < 0.001 ? "p < 0.001" : `p = ${Number(p.toPrecision(2))}`;
  if (p + 2 * standardError < 0.001) return "p < 0.001";
  const decimals = Math.max(0, -Math.floor(Math.log10(standardError)));
  return `p = ${p.toFixed(decimals)} +- ${standardError.toFixed(decimals)}`;
}
