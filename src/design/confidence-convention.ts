/**
 * One confidence convention for every surface: the verdict rests on a
 * one-sided lower bound at level C; the plot's band is the two-sided
 * interval at 2C - 1, whose lower edge is that same bound (a two-sided
 * interval at level L puts (1 - L)/2 in each tail, so its lower end is the
 * one-sided lower bound at (1 + L)/2: 90 % two-sided pairs with 95 %
 * one-sided). Every confidence shown carries its sidedness.
 */
import type { ConfidenceDescription } from "./check-description";
import type { ConfidenceConvention } from "./check-result";
import { formatLevel } from "./probability-text";

/** The one-sided level a confidence description asks for. */
export function oneSidedLevel(confidence: ConfidenceDescription): number {
  return confidence.sides === "two-sided" ? (1 + confidence.level) / 2 : confidence.level;
}

/**
 * @example confidenceConvention({ level: 0.95, sides: "one-sided" }).bandLabel // "90 % two-sided band"
 */
export function confidenceConvention(confidence: ConfidenceDescription): ConfidenceConvention {
  const oneSided = oneSidedLevel(confidence);
  const twoSided = 2 * oneSided - 1;
  const boundLabel = `${formatLevel(oneSided)} one-sided lower bound`;
  const bandLabel = `${formatLevel(twoSided)} two-sided band`;
  return {
    oneSided,
    twoSided,
    boundLabel,
    bandLabel,
    pairing: `the lower edge of the ${bandLabel} is the ${boundLabel}`,
  };
}
