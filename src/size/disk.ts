/**
 * Effective area and volume of disks in biaxial flexure (ring-on-ring,
 * piston-on-three-balls), referenced to uniaxial tension at the peak stress.
 *
 * Area: both faces, S_E = int_0^R 2 pi r [I(s_r, s_t) + I(-s_r, -s_t)] dr / s_max^m,
 * with I the criterion's intensity (surface form). The loaded face is in
 * compression inside the support but its radial stress turns tensile near
 * and beyond the support, so it is included. The cylindrical rim is left out
 * unless asked for (it needs the thickness, and rim origins are usually
 * treated apart from face origins): rim = 2 pi R h/(2(m+1)) <s_t(R)/s_max>^m.
 *
 * Volume: the stresses are linear through the thickness, s(z) = (2z/h) s,
 * and every criterion's intensity is homogeneous of degree m, so
 *   V_E = h/(2(m+1)) int_0^R 2 pi r [I_V(s) + I_V(-s)] dr / s_max^m
 * (the volume form; for these plane-stress states it equals the surface form).
 *
 * s_max is the largest tensile principal stress anywhere on either face; for
 * the usual Poisson's ratios it is the centre, but a negative ratio can move
 * it outwards, and the overhang's radial stress on the loaded face can exceed
 * it, so every region is searched.
 *
 * The inner constant region (inside a load ring) is integrated exactly; the
 * rest by adaptive Gauss-Kronrod split at every sign change and stationary
 * point of the stresses, to 1e-12 relative.
 */
import { ensureApplicable, ensureConverged, ensurePositive } from "../errors";
import { findRoot } from "../numeric/roots";
import { integrateAdaptive } from "../numeric/quadrature";
import { type Criterion, type FlawForm, makeIntensity } from "./criteria";
import {
  type DiskField,
  type DiskGeometry,
  type FieldRegion,
  type RadialTerm,
  evaluateTerm,
  pistonOnRingField,
  ringOnRingField,
  stationaryRadii,
} from "./plate-field";

/** Points of a region where a term may peak: the ends and its stationary radii. */
function criticalRadii(region: FieldRegion): number[] {
  const pts = [
    region.inner,
    region.outer,
    ...stationaryRadii(region.radial, region.inner, region.outer),
    ...stationaryRadii(region.hoop, region.inner, region.outer),
  ];
  return [...new Set(pts)].sort((x, y) => x - y);
}

function valueAt(t: RadialTerm, r: number): number {
  // The inner regions have no ln or 1/r^2 terms, so r = 0 is safe there.
  return evaluateTerm(t, r);
}

/** Largest tensile principal stress on either face (units of k). */
export function diskPeakStress(field: DiskField): number {
  let peak = 0;
  for (const region of field.regions) {
    for (const r of criticalRadii(region)) {
      const sr = valueAt(region.radial, r);
      const st = valueAt(region.hoop, r);
      peak = Math.max(peak, Math.abs(sr), Math.abs(st));
    }
  }
  return peak;
}

/** Sign changes of the region's stresses: kinks of <s>^m, used as breakpoints. */
function zeroCrossings(region: FieldRegion): number[] {
  const crit = criticalRadii(region);
  const roots: number[] = [];
  for (const t of [region.radial, region.hoop]) {
    for (let i = 0; i + 1 < crit.length; i++) {
      const lo = crit[i];
      const hi = crit[i + 1];
      const flo = valueAt(t, lo);
      const fhi = valueAt(t, hi);
      if (flo * fhi < 0) {
        const root = findRoot((r) => valueAt(t, r), lo, hi);
        if (root.converged) roots.push(root.root);
      }
    }
  }
  return [...crit.slice(1, -1), ...roots];
}

function isConstant(t: RadialTerm): boolean {
  return t.ln === 0 && t.invSq === 0 && t.sq === 0;
}

export interface DiskSizeBreakdown {
  /** Effective size of each region (both faces), inner to outer. */
  regions: number[];
  /** Contribution of the loaded (compressive-side) face, included in the regions. */
  loadedFace: number;
  total: number;
  /** Peak tensile stress in units of k = 3F/(4 pi h^2). */
  peak: number;
}

/** int_0^R 2 pi r [I(s/s_max) + I(-s/s_max)] dr for one form: the common core of area and volume. */
function faceIntegral(field: DiskField, shape: number, criterion: Criterion, form: FlawForm): DiskSizeBreakdown {
  ensurePositive(shape, "modulus");
  const intensity = makeIntensity(criterion, shape, form);
  const peak = diskPeakStress(field);
  ensureApplicable(peak > 0, "the disk carries no tensile stress");
  const inv = 1 / peak;
  const R = field.diskRadius;
  const regions: number[] = [];
  let loadedFace = 0;
  for (const region of field.regions) {
    if (isConstant(region.radial) && isConstant(region.hoop)) {
      const sr = region.radial.c * inv;
      const st = region.hoop.c * inv;
      const ring = Math.PI * (region.outer * region.outer - region.inner * region.inner);
      const loaded = ring * intensity(-sr, -st, 0);
      regions.push(ring * intensity(sr, st, 0) + loaded);
      loadedFace += loaded;
      continue;
    }
    const options = {
      relativeTolerance: 1e-12,
      absoluteTolerance: 1e-15 * Math.PI * R * R,
      breakpoints: zeroCrossings(region),
      maxIntervals: 4000,
    };
    const tensile = integrateAdaptive(
      (r) => 2 * Math.PI * r * intensity(valueAt(region.radial, r) * inv, valueAt(region.hoop, r) * inv, 0),
      region.inner,
      region.outer,
      options,
    );
    const loaded = integrateAdaptive(
      (r) => 2 * Math.PI * r * intensity(-valueAt(region.radial, r) * inv, -valueAt(region.hoop, r) * inv, 0),
      region.inner,
      region.outer,
      options,
    );
    ensureConverged(tensile.converged && loaded.converged, "the disk integral did not converge");
    regions.push(tensile.value + loaded.value);
    loadedFace += loaded.value;
  }
  const total = regions.reduce((s, v) => s + v, 0);
  return { regions, loadedFace, total, peak };
}

export interface DiskSizeOptions {
  field: DiskField;
  /** Weibull modulus m. */
  shape: number;
  /** Multiaxial criterion; default "PIA". */
  criterion?: Criterion;
}

/** Effective area (both faces, rim excluded) with its breakdown by region. */
export function diskEffectiveAreaBreakdown({ field, shape, criterion = "PIA" }: DiskSizeOptions): DiskSizeBreakdown {
  return faceIntegral(field, shape, criterion, "surface");
}

/** Effective area of both faces, rim excluded, referenced to uniaxial tension at the peak stress. */
export function diskEffectiveArea(options: DiskSizeOptions): number {
  return diskEffectiveAreaBreakdown(options).total;
}

/** Effective area of the cylindrical rim (its tensile half), for a disk of the given thickness. */
export function diskRimArea({ field, shape, thickness }: { field: DiskField; shape: number; thickness: number }): number {
  ensurePositive(shape, "modulus");
  ensurePositive(thickness, "thickness");
  const R = field.diskRadius;
  const last = field.regions[field.regions.length - 1];
  const hoop = Math.abs(evaluateTerm(last.hoop, R)) / diskPeakStress(field);
  // Uniaxial hoop stress, linear through the thickness: every criterion gives <s>^m.
  return ((2 * Math.PI * R * thickness) / (2 * (shape + 1))) * Math.pow(hoop, shape);
}

/** Effective volume referenced to uniaxial tension at the peak stress. */
export function diskEffectiveVolume({ thickness, ...options }: DiskSizeOptions & { thickness: number }): number {
  ensurePositive(thickness, "thickness");
  const faces = faceIntegral(options.field, options.shape, options.criterion ?? "PIA", "volume");
  return (thickness / (2 * (options.shape + 1))) * faces.total;
}

export interface RingOnRingSpec extends DiskGeometry {
  shape: number;
  loadDiameter: number;
  criterion?: Criterion;
}

export interface PistonOnBallsSpec extends DiskGeometry {
  shape: number;
  pistonDiameter: number;
  criterion?: Criterion;
}

/** Ring-on-ring (ASTM C1499) effective area of both faces, overhang included, rim excluded. */
export function ringOnRingArea({ shape, criterion, ...geometry }: RingOnRingSpec): number {
  return diskEffectiveArea({ field: ringOnRingField(geometry), shape, criterion });
}

/** Ring-on-ring (ASTM C1499) effective volume, overhang included. */
export function ringOnRingVolume({ shape, criterion, thickness, ...geometry }: RingOnRingSpec & { thickness: number }): number {
  return diskEffectiveVolume({ field: ringOnRingField(geometry), shape, criterion, thickness });
}

/** Piston-on-three-balls (ISO 6872 model) effective area of both faces, overhang included, rim excluded. */
export function pistonOnBallsArea({ shape, criterion, ...geometry }: PistonOnBallsSpec): number {
  return diskEffectiveArea({ field: pistonOnRingField(geometry), shape, criterion });
}

/** Piston-on-three-balls (ISO 6872 model) effective volume, overhang included. */
export function pistonOnBallsVolume({
  shape,
  criterion,
  thickness,
  ...geometry
}: PistonOnBallsSpec & { thickness: number }): number {
  return diskEffectiveVolume({ field: pistonOnRingField(geometry), shape, criterion, thickness });
}
