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

/** "p = 0.012"; below 0.001 "p < 0.001" (a Monte Carlo p-value of a few thousand draws resolves no finer). */
export function pValueText(p: number): string {
  return p < 0.001 ? "p < 0.001" : `p = ${Number(p.toPrecision(2))}`;
}
