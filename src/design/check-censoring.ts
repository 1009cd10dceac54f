/**
 * Censoring the weakest specimens is the one choice that moves a verdict
 * most: each censored specimen leaves the fitted population, so censoring
 * the low end raises the fitted modulus and the allowable stress. When any
 * censored specimen is among the weakest quarter of the sample (ranks 1 to
 * ceil(N/4), the weakest always included), the check says so and runs the
 * same check with every specimen counted as a failure, beside it.
 *
 * The quarter is judgement (common practice, no source): the low tail is
 * where a design extrapolates from, and the fit is most sensitive to it.
 * The comparison is shown for any censored sample; the warning is louder
 * when the weakest are censored or the verdict flips.
 */
import { InputError } from "../errors";
import type { CheckDescription } from "./check-description";
import type { CensoringComparison } from "./check-result";
import { formatNumber } from "./probability-text";

interface CheckOutcome {
  governing: { allowable: number };
  pass: boolean;
  onBound: boolean;
  shape: number;
}

export function weakestQuarter(specimens: number): number {
  return Math.max(1, Math.ceil(specimens / 4));
}

/**
 * Ranks (1 = weakest) of the censored specimens; ties take the lowest rank.
 *
 * @example censoredRanks([300, 250, 400], [true, false, false]) // [2]
 */
export function censoredRanks(strengths: readonly number[], censored: readonly boolean[]): number[] {
  const order = strengths.map((s, i) => ({ s, i })).sort((a, b) => a.s - b.s || Number(censored[b.i]) - Number(censored[a.i]));
  const ranks: number[] = [];
  order.forEach(({ i }, r) => {
    if (censored[i]) ranks.push(r + 1);
  });
  return ranks;
}

export function censoringComparison(
  input: CheckDescription,
  censoredOutcome: CheckOutcome,
  run: (complete: CheckDescription) => CheckOutcome,
): CensoringComparison {
  const material = input.material;
  if (material.kind !== "data" || !material.censored) throw new InputError("input", "the censoring comparison needs a censored sample");
  const ranks = censoredRanks(material.strengths, material.censored);
  const quarter = weakestQuarter(material.strengths.length);
  const weakestCensored = ranks.some((r) => r <= quarter);
  const complete: CheckDescription = { ...input, material: { ...material, censored: undefined } };
  const u = run(complete);
  const unit = input.stressUnit;
  const verdict = (pass: boolean) => (pass ? "PASS" : "FAIL");
  const flips = u.pass !== censoredOutcome.pass;
  const text =
    (weakestCensored
      ? `The censored specimens include some of the weakest (ranks ${ranks.join(", ")} of ${material.strengths.length}; the weakest quarter is ranks 1-${quarter}). `
      : `${ranks.length} specimen(s) censored (ranks ${ranks.join(", ")} of ${material.strengths.length}). `) +
    `With censoring: modulus ${formatNumber(censoredOutcome.shape)}, allowable ${formatNumber(censoredOutcome.governing.allowable)} ${unit}, ${verdict(censoredOutcome.pass)}. ` +
    `Counting every specimen as a failure: modulus ${formatNumber(u.shape)}, allowable ${formatNumber(u.governing.allowable)} ${unit}, ${verdict(u.pass)}` +
    (flips ? ": the censoring decides the verdict. " : ". ") +
    "Censor a specimen only where fractography (ASTM C1322) shows it broke from another flaw population.";
  return {
    weakestCensored,
    censoredRanks: ranks,
    text,
    uncensored: { shape: u.shape, allowable: u.governing.allowable, pass: u.pass, onBound: u.onBound },
  };
}
