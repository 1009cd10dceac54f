/**
 * Bending stresses in a thin circular disk on a ring support, from
 * small-deflection (Kirchhoff) plate theory: axisymmetric, linear through the
 * thickness, free edge (no radial moment at r = R), contact stresses ignored.
 * Stresses are on the tensile face (opposite the load) in units of
 * k = 3F / (4 pi h^2), F the total load and h the thickness; the loaded face
 * carries the same stresses with the opposite sign.
 *
 * Derivation in brief. With g(r) proportional to the slope, s_r = g' + nu g/r
 * and s_t = nu g' + g/r; radial equilibrium of a ring element gives
 * d/dr[(1/r) d(r g)/dr] = -4k F(r)/(F r), F(r) the load inside radius r.
 * Integrating region by region with g finite at r = 0, g and s_r continuous
 * at every load or support radius, and s_r(R) = 0 gives the fields below.
 *
 * Ring-on-ring (ASTM C1499): load ring radius a, support ring b, disk R.
 *   r <= a:      s_r = s_t = 2(1+nu) ln(b/a) + (1-nu)(b^2-a^2)/R^2
 *   a <= r <= b: s_r,t = 2(1+nu) ln(b/r) + (1-nu)(b^2-a^2)/R^2 -/+ (1-nu)(1 - a^2/r^2)
 *   b <= r <= R: s_r = -K (R^2-r^2)/(R^2 r^2),  s_t = K (R^2+r^2)/(R^2 r^2),  K = (1-nu)(b^2-a^2)
 * The centre value is the equibiaxial strength formula of ASTM C1499.
 *
 * Piston on a ring (the ring-support model that ISO 6872's
 * piston-on-three-balls formula rests on): load spread uniformly over the
 * piston radius c, support circle b, disk R. With A = (1-nu)(b^2 - c^2/2)/R^2:
 *   r <= c:      s_r = (1+nu)(1 + 2 ln(b/c)) + A - (3+nu) r^2/(2c^2)
 *                s_t = (1+nu)(1 + 2 ln(b/c)) + A - (1+3nu) r^2/(2c^2)
 *   c <= r <= b: s_r,t = 2(1+nu) ln(b/r) + A -/+ (1-nu)(1 - c^2/(2 r^2))
 *   b <= r <= R: as the ring-on-ring overhang with K = (1-nu)(b^2 - c^2/2)
 * The centre value, k[(1+nu)(1 + 2 ln(b/c)) + A], is ISO 6872's
 * -0.2387 P (X - Y)/t^2 (0.2387 = 3/(4 pi)). Three balls are not a ring: near
 * each ball the true field is not axisymmetric, and the overhang between the
 * balls is stiffer than a ring-supported one. We keep the ring model there
 * because it is the one the standard's formula rests on, and because at the
 * usual moduli the overhang adds little to the effective size
 * (docs/methods.md section 5 gives the share).
 *
 * Every region's components have the form c + L ln(r/ref) + G/r^2 + S r^2,
 * so peaks and sign changes can be found exactly.
 */
import { ensure, ensurePositive, InputError } from "../errors";

/** c + ln * ln(r/ref) + invSq / r^2 + sq * r^2 */
export interface RadialTerm {
  readonly c: number;
  readonly ln: number;
  readonly ref: number;
  readonly invSq: number;
  readonly sq: number;
}

export interface FieldRegion {
  readonly inner: number;
  readonly outer: number;
  readonly radial: RadialTerm;
  readonly hoop: RadialTerm;
}

/** Tensile-face stresses of an axisymmetric disk field, in units of k = 3F/(4 pi h^2). */
export interface DiskField {
  readonly diskRadius: number;
  readonly regions: readonly FieldRegion[];
}

function term(c: number, ln = 0, ref = 1, invSq = 0, sq = 0): RadialTerm {
  return { c, ln, ref, invSq, sq };
}

export function evaluateTerm(t: RadialTerm, r: number): number {
  let v = t.c;
  if (t.ln !== 0) v += t.ln * Math.log(r / t.ref);
  if (t.invSq !== 0) v += t.invSq / (r * r);
  if (t.sq !== 0) v += t.sq * r * r;
  return v;
}

/** Radii in (lo, hi) where the term is stationary: 2S x^2 + L x - 2G = 0 with x = r^2. */
export function stationaryRadii(t: RadialTerm, lo: number, hi: number): number[] {
  const a = 2 * t.sq;
  const b = t.ln;
  const c = -2 * t.invSq;
  const xs: number[] = [];
  if (a === 0) {
    if (b !== 0) xs.push(-c / b);
  } else {
    const disc = b * b - 4 * a * c;
    if (disc >= 0) {
      // Stable roots: avoid subtracting nearly equal numbers.
      const q = -0.5 * (b + Math.sign(b || 1) * Math.sqrt(disc));
      if (q !== 0) xs.push(c / q);
      xs.push(q / a);
    }
  }
  return xs
    .filter((x) => x > 0)
    .map(Math.sqrt)
    .filter((r) => r > lo && r < hi);
}

export interface DiskGeometry {
  /** Support ring (or support-ball circle) diameter. */
  supportDiameter: number;
  /** Disk diameter: at least the support diameter. */
  diskDiameter: number;
  /** Poisson's ratio, -1 < nu < 0.5. */
  poisson: number;
}

function checkGeometry(innerName: string, innerDiameter: number, g: DiskGeometry): void {
  ensurePositive(innerDiameter, innerName);
  ensurePositive(g.supportDiameter, "support diameter");
  ensurePositive(g.diskDiameter, "disk diameter");
  ensure(
    innerDiameter < g.supportDiameter,
    () => `the ${innerName} (${innerDiameter}) must be smaller than the support diameter (${g.supportDiameter})`,
  );
  ensure(
    g.supportDiameter <= g.diskDiameter,
    () => `the support diameter (${g.supportDiameter}) must not exceed the disk diameter (${g.diskDiameter})`,
  );
  if (typeof g.poisson !== "number" || !Number.isFinite(g.poisson)) throw new InputError("input", "Poisson's ratio must be a number");
  ensure(g.poisson > -1 && g.poisson < 0.5, () => `Poisson's ratio must lie between -1 and 0.5 (got ${g.poisson})`);
}

function overhang(b: number, R: number, K: number): FieldRegion {
  return {
    inner: b,
    outer: R,
    radial: term(K / (R * R), 0, 1, -K),
    hoop: term(K / (R * R), 0, 1, K),
  };
}

/** Ring-on-ring disk (ASTM C1499 plate-theory field), overhang included. */
export function ringOnRingField({ loadDiameter, ...g }: DiskGeometry & { loadDiameter: number }): DiskField {
  checkGeometry("load ring diameter", loadDiameter, g);
  const a = loadDiameter / 2;
  const b = g.supportDiameter / 2;
  const R = g.diskDiameter / 2;
  const nu = g.poisson;
  const K = (1 - nu) * (b * b - a * a);
  const edgeTerm = K / (R * R);
  const centre = 2 * (1 + nu) * Math.log(b / a) + edgeTerm;
  const regions: FieldRegion[] = [
    { inner: 0, outer: a, radial: term(centre), hoop: term(centre) },
    {
      inner: a,
      outer: b,
      radial: term(edgeTerm - (1 - nu), -2 * (1 + nu), b, (1 - nu) * a * a),
      hoop: term(edgeTerm + (1 - nu), -2 * (1 + nu), b, -(1 - nu) * a * a),
    },
  ];
  if (R > b) regions.push(overhang(b, R, K));
  return { diskRadius: R, regions };
}

/** Disk loaded by a flat piston on a support circle (ISO 6872 piston-on-three-balls model). */
export function pistonOnRingField({ pistonDiameter, ...g }: DiskGeometry & { pistonDiameter: number }): DiskField {
  checkGeometry("piston diameter", pistonDiameter, g);
  const c = pistonDiameter / 2;
  const b = g.supportDiameter / 2;
  const R = g.diskDiameter / 2;
  const nu = g.poisson;
  const K = (1 - nu) * (b * b - (c * c) / 2);
  const A = K / (R * R);
  const centre = (1 + nu) * (1 + 2 * Math.log(b / c)) + A;
  const regions: FieldRegion[] = [
    {
      inner: 0,
      outer: c,
      radial: term(centre, 0, 1, 0, -(3 + nu) / (2 * c * c)),
      hoop: term(centre, 0, 1, 0, -(1 + 3 * nu) / (2 * c * c)),
    },
    {
      inner: c,
      outer: b,
      radial: term(A - (1 - nu), -2 * (1 + nu), b, ((1 - nu) * c * c) / 2),
      hoop: term(A + (1 - nu), -2 * (1 + nu), b, (-(1 - nu) * c * c) / 2),
    },
  ];
  if (R > b) regions.push(overhang(b, R, K));
  return { diskRadius: R, regions };
}

/** Tensile-face stresses at radius r (units of k). */
export function fieldAt(field: DiskField, r: number): { radial: number; hoop: number } {
  const region = field.regions.find((g) => r <= g.outer) ?? field.regions[field.regions.length - 1];
  return { radial: evaluateTerm(region.radial, r), hoop: evaluateTerm(region.hoop, r) };
}
