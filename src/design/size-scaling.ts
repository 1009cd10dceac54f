/**
 * Size effect of the weakest-link model (ASTM C1683 section 8).
 *
 * Specimens of effective size V1 and V2 from the same flaw population have
 * characteristic strengths in the ratio th2/th1 = (V1/V2)^(1/m). The same ratio
 * holds for any strength quantile, and for effective areas when the fracture
 * origins are at the surface.
 */
import { ensurePositiveResult, ensurePositive } from "../errors";

export function scaleStrengthToSize({
  strength,
  shape,
  fromSize,
  toSize,
}: {
  strength: number;
  shape: number;
  fromSize: number;
  toSize: number;
}): number {
  ensurePositive(strength, "strength");
  ensurePositive(shape, "modulus");
  ensurePositive(fromSize, "effective size of the tested body");
  ensurePositive(toSize, "effective size of the other body");
  return ensurePositiveResult(strength * Math.exp((Math.log(fromSize) - Math.log(toSize)) / shape), "scaled strength");
}

/**
 * Material scale parameter sigma_0 = sigma_theta V_E^(1/m): the characteristic
 * strength of a unit effective size, in stress x size^(1/m) (e.g. MPa mm^(3/m)).
 */
export function materialScale({
  scale,
  shape,
  effectiveSize,
}: {
  scale: number;
  shape: number;
  effectiveSize: number;
}): number {
  ensurePositive(scale, "characteristic strength");
  ensurePositive(shape, "modulus");
  ensurePositive(effectiveSize, "effective size");
  return ensurePositiveResult(scale * Math.exp(Math.log(effectiveSize) / shape), "material scale");
}
