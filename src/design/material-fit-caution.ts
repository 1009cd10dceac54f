/**
 * What the two pooled-fit checks say, in words, with their basis (the
 * p-values and the 5 % level). A failed size-effect check is a caution, not a
 * verdict on the part: the specimens may not share one flaw population, or the
 * size scaling is not to be trusted for the part.
 */
import type { MaterialSimulation } from "./material-fit-simulation";

/** Significance level below which a check is reported as failed (common practice). */
export const CHECK_LEVEL = 0.05;

/**
 * One line for the fit table.
 * @example materialFitCaution({ oneModulusP: 0.4, sizeEffectP: 0.003 }) // "CAUTION: the size effect fails (p = 0.003 < 0.05): ..."
 */
export function materialFitCaution({ oneModulusP, sizeEffectP }: Pick<MaterialSimulation, "oneModulusP" | "sizeEffectP">): string {
  const p = (x: number) => `p = ${Number(x.toPrecision(2))}`;
  const failed: string[] = [];
  if (oneModulusP !== null && oneModulusP < CHECK_LEVEL) failed.push(`one modulus fails (${p(oneModulusP)} < ${CHECK_LEVEL}): the configurations may break from different flaw populations`);
  if (sizeEffectP < CHECK_LEVEL) {
    failed.push(
      `the size effect fails (${p(sizeEffectP)} < ${CHECK_LEVEL}): the specimens may not share one flaw population, or the size scaling is not to be trusted for the part`,
    );
  }
  if (failed.length === 0) {
    const one = oneModulusP === null ? "one modulus not checked (a configuration's failures are all equal)" : `no evidence against one modulus (${p(oneModulusP)})`;
    return `${one}; no evidence against the size effect (${p(sizeEffectP)}) at the ${CHECK_LEVEL} level; fractography still decides the flaw populations`;
  }
  return `CAUTION: ${failed.join("; ")}. Fit the configurations separately and confirm the origins by fractography`;
}
