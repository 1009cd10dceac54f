/**
 * Size effect of the weakest-link model (ASTM C1683 section 8).
 *
 * Specimens of effective size V1 and V2 from the same flaw population have
 * characteristic strengths in the ratio th2/th1 = (V1/V2)^(1/m). The same ratio
 * holds for any strength quantile, and for effective areas when the fracture
 * origins are at the surface.
 */
import { requirePositive } from "../errors";

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
  requirePositive(strength, "strength");
  requirePositive(shape, "modulus");
  requirePositive(fromSize, "effective size of the tested body");
  requirePositive(toSize, "effective size of the other body");
  return finitePositive(strength * Math.exp((Math.log(fromSize) - Math.log(toSize)) / shape));
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
  requirePositive(scale, "characteristic strength");
  requirePositive(shape, "modulus");
  requirePositive(effectiveSize, "effective size");
  return finitePositive(scale * Math.exp(Math.log(effectiveSize) / shape));
}

function finitePositive(x: number): number {
  requirePositive(x, "result (outside the double-precision range)");
  return x;
}
