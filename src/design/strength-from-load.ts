/**
 * Fracture strength from the breaking load and the specimen's dimensions:
 * what a test machine records turned into the stress the statistics need.
 * Each function returns the strength and, separately, the validity limits
 * the specimen breaks (empty when none): a strength outside the limits of
 * its formula is not a number to fit silently, and the caller decides how
 * to flag it (the cell functions return an error for that row).
 *
 * Bars in flexure (ASTM C1161; elastic beam theory, derived):
 *   M = F (L - Li) / 4 between the inner load points, s = M (d/2) / (b d^3/12)
 *   s = 3 F (L - Li) / (2 b d^2)        (three-point: Li = 0)
 * Round rods in flexure (same beam theory, I = pi D^4 / 64):
 *   s = 8 F (L - Li) / (pi D^3)
 * Ring-on-ring disk (ASTM C1499 equibiaxial strength; the centre value of the
 * plate field in src/size/plate-field.ts):
 *   s = 3 F / (2 pi h^2) [ (1 - nu)(D_S^2 - D_L^2) / (2 D^2) + (1 + nu) ln(D_S / D_L) ]
 * Piston-on-three-balls disk (ISO 6872; the centre value of the piston-on-ring
 * plate field, with 0.2387 written exactly as 3/(4 pi)):
 *   s = -(3/(4 pi)) P (X - Y) / t^2
 *   X = (1 + nu) ln((r2/r3)^2) + ((1 - nu)/2)(r2/r3)^2
 *   Y = (1 + nu)(1 + ln((r1/r3)^2)) + (1 - nu)(r1/r3)^2
 *   r1 support-circle radius, r2 piston radius, r3 disk radius.
 *
 * Validity limits. Beam theory ignores the wedging and contact stresses under
 * the load points and the shear deflection, which grow as the span shortens
 * against the depth: a span below 10 depths is flagged (common practice; the
 * C1161 configurations use about 13). Plate theory assumes a thin plate and
 * small deflection: a support diameter below 10 thicknesses is flagged for
 * ring-on-ring (common practice); the deflection limit needs the elastic
 * modulus, which these functions do not take, so it is not checked and the
 * docs say so. The ring-ratio window 0.2 <= D_L/D_S <= 0.5 is the range ASTM
 * C1499 recommends (from memory). For the piston test only the order of the
 * diameters and a support diameter of at least 5 thicknesses are checked
 * (ISO 6872's own disk, about 1.2 mm thick on a 10-12 mm circle, sits at 8-10;
 * common practice).
 */
import { InputError } from "../errors";

export interface LoadStrength {
  /** Fracture strength, in the stress unit implied by the inputs (N and mm give MPa). */
  strength: number;
  /** Validity limits the specimen breaks, in words; empty when it is within all of them. */
  outsideLimits: string[];
}

function positive(value: number, name: string): void {
  if (!(Number.isFinite(value) && value > 0)) throw new InputError("input", `${name} must be a positive number (got ${format(value)})`);
}

function format(value: number): string {
  return Number.isFinite(value) ? String(value) : "a non-finite value";
}

function innerSpanOk(innerSpan: number, outerSpan: number): void {
  if (!Number.isFinite(innerSpan) || innerSpan < 0) {
    throw new InputError("input", `inner span must be 0 (three-point) or positive (got ${format(innerSpan)})`);
  }
  if (innerSpan >= outerSpan) {
    throw new InputError("input", `the inner span (${innerSpan}) must be shorter than the outer span (${outerSpan})`);
  }
}

/** Beam-theory span check shared by bars and rods. */
function spanLimit(outerSpan: number, depth: number, depthName: string): string[] {
  const ratio = outerSpan / depth;
  return ratio < 10
    ? [`outer span / ${depthName} is ${ratio.toPrecision(3)}, below 10: beam theory misses the contact and shear stresses of short spans`]
    : [];
}

function finiteStrength(strength: number, what: string): number {
  if (!Number.isFinite(strength)) throw new InputError("notRepresentable", `the ${what} strength is too large to represent: check the load and the dimensions`);
  return strength;
}

/**
 * Strength of a rectangular bar in three-point (innerSpan 0) or four-point flexure, ASTM C1161.
 * @example flexureStrength({ load: 400, outerSpan: 40, innerSpan: 20, width: 4, depth: 3 }).strength // 333.33 (MPa)
 */
export function flexureStrength({
  load,
  outerSpan,
  innerSpan,
  width,
  depth,
}: {
  load: number;
  outerSpan: number;
  innerSpan: number;
  width: number;
  depth: number;
}): LoadStrength {
  positive(load, "load");
  positive(outerSpan, "outer span");
  innerSpanOk(innerSpan, outerSpan);
  positive(width, "width");
  positive(depth, "depth");
  const strength = finiteStrength((3 * load * (outerSpan - innerSpan)) / (2 * width * depth * depth), "flexural");
  return { strength, outsideLimits: spanLimit(outerSpan, depth, "depth") };
}

/**
 * Strength of a round rod in three-point (innerSpan 0) or four-point flexure.
 * @example rodFlexureStrength({ load: 300, outerSpan: 40, innerSpan: 20, diameter: 3 }).strength // 565.88 (MPa)
 */
export function rodFlexureStrength({
  load,
  outerSpan,
  innerSpan,
  diameter,
}: {
  load: number;
  outerSpan: number;
  innerSpan: number;
  diameter: number;
}): LoadStrength {
  positive(load, "load");
  positive(outerSpan, "outer span");
  innerSpanOk(innerSpan, outerSpan);
  positive(diameter, "diameter");
  const strength = finiteStrength((8 * load * (outerSpan - innerSpan)) / (Math.PI * diameter ** 3), "flexural");
  return { strength, outsideLimits: spanLimit(outerSpan, diameter, "diameter") };
}

interface DiskInputs {
  load: number;
  supportDiameter: number;
  diskDiameter: number;
  thickness: number;
  poisson: number;
}

function checkDisk(innerName: string, inner: number, d: DiskInputs): void {
  positive(d.load, "load");
  positive(inner, innerName);
  positive(d.supportDiameter, "support diameter");
  positive(d.diskDiameter, "disk diameter");
  positive(d.thickness, "thickness");
  if (!(Number.isFinite(d.poisson) && d.poisson > -1 && d.poisson < 0.5)) {
    throw new InputError("input", `Poisson's ratio must lie between -1 and 0.5 (got ${format(d.poisson)})`);
  }
  if (inner >= d.supportDiameter) {
    throw new InputError("input", `the ${innerName} (${inner}) must be smaller than the support diameter (${d.supportDiameter})`);
  }
  if (d.supportDiameter > d.diskDiameter) {
    throw new InputError("input", `the support diameter (${d.supportDiameter}) must not exceed the disk diameter (${d.diskDiameter})`);
  }
}

/**
 * Equibiaxial strength of a disk in ring-on-ring loading, ASTM C1499.
 * @example ringOnRingStrength({ load: 1000, loadDiameter: 12, supportDiameter: 24, diskDiameter: 30, thickness: 1.5, poisson: 0.22 }).strength // 219.18 (MPa)
 */
export function ringOnRingStrength({ loadDiameter, ...disk }: DiskInputs & { loadDiameter: number }): LoadStrength {
  checkDisk("load ring diameter", loadDiameter, disk);
  const { load, supportDiameter: DS, diskDiameter: D, thickness: h, poisson: nu } = disk;
  const DL = loadDiameter;
  const bracket = ((1 - nu) * (DS * DS - DL * DL)) / (2 * D * D) + (1 + nu) * Math.log(DS / DL);
  const strength = finiteStrength(((3 * load) / (2 * Math.PI * h * h)) * bracket, "equibiaxial");
  const outsideLimits: string[] = [];
  const ringRatio = DL / DS;
  if (ringRatio < 0.2 || ringRatio > 0.5) {
    outsideLimits.push(`load ring / support ring diameter is ${ringRatio.toPrecision(3)}, outside 0.2 to 0.5`);
  }
  if (DS / h < 10) outsideLimits.push(`support diameter / thickness is ${(DS / h).toPrecision(3)}, below 10: not a thin plate`);
  return { strength, outsideLimits };
}

/**
 * Biaxial strength of a disk on three balls loaded by a flat piston, ISO 6872.
 * @example pistonOnBallsStrength({ load: 100, pistonDiameter: 1.4, supportDiameter: 10, diskDiameter: 14, thickness: 1.2, poisson: 0.25 }).strength // 108.49 (MPa)
 */
export function pistonOnBallsStrength({ pistonDiameter, ...disk }: DiskInputs & { pistonDiameter: number }): LoadStrength {
  checkDisk("piston diameter", pistonDiameter, disk);
  const { load, supportDiameter, diskDiameter, thickness: t, poisson: nu } = disk;
  const r1 = supportDiameter / 2;
  const r2 = pistonDiameter / 2;
  const r3 = diskDiameter / 2;
  const X = (1 + nu) * Math.log((r2 / r3) ** 2) + ((1 - nu) / 2) * (r2 / r3) ** 2;
  const Y = (1 + nu) * (1 + Math.log((r1 / r3) ** 2)) + (1 - nu) * (r1 / r3) ** 2;
  const strength = finiteStrength((-(3 / (4 * Math.PI)) * load * (X - Y)) / (t * t), "biaxial");
  const outsideLimits: string[] = [];
  if (supportDiameter / t < 5) {
    outsideLimits.push(`support diameter / thickness is ${(supportDiameter / t).toPrecision(3)}, below 5: not a thin plate`);
  }
  return { strength, outsideLimits };
}
