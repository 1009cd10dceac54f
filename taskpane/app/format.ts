/**
 * How numbers read on screen and in exports: four significant figures;
 * probabilities through the core's formatter (src/design/probability-text.ts),
 * which never rounds a probability to 0 % or 100 %, with "1 in N" when small.
 */
import { probabilityDisplay } from "../../src/design/check-rows";

export function sig(x: number, digits = 4): string {
  if (x === 0) return "0";
  const abs = Math.abs(x);
  if (abs >= 1e-3 && abs < 1e7) return Number(x.toPrecision(digits)).toLocaleString("en-US", { maximumSignificantDigits: digits });
  return x.toExponential(digits - 1);
}

export function formatProbability(p: number): string {
  return probabilityDisplay(p);
}

/** A confidence level, "95 %"; say its sidedness beside it (src/design/confidence-convention.ts). */
export function formatPercent(p: number): string {
  return `${Number((p * 100).toPrecision(4))} %`;
}
