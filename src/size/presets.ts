/**
 * Standard specimen configurations, by the standards' designations, with the
 * source of every dimension. Sources are marked:
 *   [source: ...] read in the named document;
 *   [memory] recalled, not confirmed against the document: check your copy;
 *   [choice] a value we picked inside the standard's permitted range.
 * All lengths in millimetres, so effective volumes come out in mm^3 and
 * areas in mm^2.
 *
 * Names are matched ignoring case, spaces, hyphens, slashes and a leading
 * "ASTM" or "ISO": "astm c1161 b 4pt" finds C1161-B-4PT.
 */
import { ensureApplicable, ensurePositive, InputError } from "../errors";
import type { Criterion } from "./criteria";
import { pistonOnBallsArea, pistonOnBallsVolume, ringOnRingArea, ringOnRingVolume } from "./disk";
import { barFlexureArea, barFlexureVolume } from "./flexure";

export interface Dimension {
  readonly value: number;
  readonly source: string;
}

interface Base {
  readonly name: string;
  readonly standard: string;
  readonly description: string;
}

export interface BarPreset extends Base {
  readonly kind: "bar-flexure";
  readonly outerSpan: Dimension;
  readonly innerSpan: Dimension;
  readonly width: Dimension;
  readonly depth: Dimension;
}

export interface RingPreset extends Base {
  readonly kind: "ring-on-ring";
  readonly loadDiameter: Dimension;
  readonly supportDiameter: Dimension;
  readonly diskDiameter: Dimension;
  readonly thickness: Dimension | null;
}

export interface PistonPreset extends Base {
  readonly kind: "piston-on-balls";
  readonly pistonDiameter: Dimension;
  readonly supportDiameter: Dimension;
  readonly diskDiameter: Dimension;
  readonly thickness: Dimension | null;
}

export type SpecimenPreset = BarPreset | RingPreset | PistonPreset;

const C1161_SPANS = "[source: ASTM C1161-13 sec. 1.1: 40 mm outer span for configuration B, half (A) or twice (C) these sizes]";
const C1161_QUARTER = "[source: ASTM C1161-13 sec. 1.1: four-point-1/4 point loading, so the inner span is half the outer]";
const C1161_SECTION = "[source: ASTM C1161-13 sec. 1.1: 3 by 4 mm section for B, half (A) or twice (C)]";
const C1161_ORIENT = "[memory: C1161 tests the bar with the wider side (b) as the tensile face]";

function bar(config: "A" | "B" | "C", points: 3 | 4, scale: number): BarPreset {
  const outer = 40 * scale;
  return {
    name: `C1161-${config}-${points}PT`,
    standard: "ASTM C1161",
    kind: "bar-flexure",
    description: `ASTM C1161 configuration ${config}, ${points === 4 ? "four-point-1/4 point" : "three-point"} flexure`,
    outerSpan: { value: outer, source: C1161_SPANS },
    innerSpan:
      points === 4
        ? { value: outer / 2, source: C1161_QUARTER }
        : { value: 0, source: "three-point flexure has a single load point" },
    width: { value: 4 * scale, source: `${C1161_SECTION} ${C1161_ORIENT}` },
    depth: { value: 3 * scale, source: `${C1161_SECTION} ${C1161_ORIENT}` },
  };
}

const RING_CHOICE =
  "[choice: a 2:1 support-to-load ring ratio and support ring at 0.8 of the disk diameter, inside C1499's " +
  "limit 0.2 <= D_L/D_S <= 0.5 [memory]; not a table of the standard, confirm against your fixture]";

export const SPECIMENS: readonly SpecimenPreset[] = [
  bar("A", 3, 0.5),
  bar("A", 4, 0.5),
  bar("B", 3, 1),
  bar("B", 4, 1),
  bar("C", 3, 2),
  bar("C", 4, 2),
  {
    name: "C1499-20/10",
    standard: "ASTM C1499",
    kind: "ring-on-ring",
    description: "ASTM C1499 ring-on-ring, support ring 20 mm, load ring 10 mm, disk 25 mm x 1 mm",
    loadDiameter: { value: 10, source: RING_CHOICE },
    supportDiameter: { value: 20, source: RING_CHOICE },
    diskDiameter: { value: 25, source: RING_CHOICE },
    thickness: { value: 1, source: "[choice: a disk thin enough for plate theory, h/D = 0.04]" },
  },
  {
    name: "C1499-40/20",
    standard: "ASTM C1499",
    kind: "ring-on-ring",
    description: "ASTM C1499 ring-on-ring, support ring 40 mm, load ring 20 mm, disk 50 mm x 2 mm",
    loadDiameter: { value: 20, source: RING_CHOICE },
    supportDiameter: { value: 40, source: RING_CHOICE },
    diskDiameter: { value: 50, source: RING_CHOICE },
    thickness: { value: 2, source: "[choice: a disk thin enough for plate theory, h/D = 0.04]" },
  },
  {
    name: "ISO6872-P3B",
    standard: "ISO 6872",
    kind: "piston-on-balls",
    description: "ISO 6872 piston-on-three-balls (dental ceramics), 14 mm x 1.2 mm disk",
    pistonDiameter: { value: 1.4, source: "[memory: ISO 6872 flat punch 1.2 mm to 1.6 mm; nominal 1.4 mm]" },
    supportDiameter: { value: 10, source: "[memory: ISO 6872 support circle of the three balls, 10 mm]" },
    diskDiameter: { value: 14, source: "[memory: ISO 6872 disks 12 mm to 16 mm] [choice: the midpoint, 14 mm]" },
    thickness: { value: 1.2, source: "[memory: ISO 6872 disks (1.2 +/- 0.2) mm thick]" },
  },
  {
    name: "F394-P3B",
    standard: "ASTM F394 (withdrawn 2001)",
    kind: "piston-on-balls",
    description: "ASTM F394 piston-on-three-balls (ceramic substrates), 1.25 in disk; no fixed thickness",
    pistonDiameter: {
      value: 1.5875,
      source: "[source: Wyoming Test Fixtures, ASTM C1499 & F394 fixture page: 0.0625 in flat-ended piston]",
    },
    supportDiameter: { value: 25.4, source: "[source: same page: three balls on a 1 in diameter circle]" },
    diskDiameter: { value: 31.75, source: "[source: same page: 1.25 in diameter disk]" },
    thickness: null,
  },
];

function key(text: string): string {
  return text
    .toUpperCase()
    .replace(/^\s*(ASTM|ISO)\s*/, "")
    .replace(/[^A-Z0-9]/g, "");
}

const BY_KEY = new Map(SPECIMENS.map((s) => [key(s.name), s]));

/** The preset for a configuration name, or an InputError listing the names. */
export function findSpecimen(configuration: string): SpecimenPreset {
  const found = typeof configuration === "string" ? BY_KEY.get(key(configuration)) : undefined;
  if (!found) {
    throw new InputError(
      "input",
      `unknown configuration "${String(configuration)}"; use one of ${SPECIMENS.map((s) => s.name).join(", ")}`,
    );
  }
  return found;
}

export interface SpecimenSizeOptions {
  configuration: string;
  /** Weibull modulus m. */
  shape: number;
  /** "volume" (default) or "surface" flaws. */
  flaws?: "volume" | "surface";
  /** Poisson's ratio: needed by the disk configurations only. */
  poisson?: number;
  /** Multiaxial criterion for the disk configurations; default "PIA". */
  criterion?: Criterion;
}

/** Effective volume (mm^3) or area (mm^2) of a standard configuration. */
export function specimenEffectiveSize({
  configuration,
  shape,
  flaws = "volume",
  poisson,
  criterion = "PIA",
}: SpecimenSizeOptions): number {
  ensurePositive(shape, "modulus");
  const preset = findSpecimen(configuration);
  if (preset.kind === "bar-flexure") {
    const spec = {
      shape,
      outerSpan: preset.outerSpan.value,
      innerSpan: preset.innerSpan.value,
      width: preset.width.value,
      depth: preset.depth.value,
    };
    return flaws === "surface" ? barFlexureArea(spec) : barFlexureVolume(spec);
  }
  if (poisson === undefined || poisson === null) {
    throw new InputError("input", `${preset.name} is a disk test: give Poisson's ratio`);
  }
  const disk = {
    shape,
    criterion,
    poisson,
    supportDiameter: preset.supportDiameter.value,
    diskDiameter: preset.diskDiameter.value,
  };
  if (flaws === "volume") {
    ensureApplicable(preset.thickness !== null, () => `${preset.name} fixes no specimen thickness, so it has no effective volume here`);
  }
  const thickness = preset.thickness?.value ?? NaN;
  if (preset.kind === "ring-on-ring") {
    const ring = { ...disk, loadDiameter: preset.loadDiameter.value };
    return flaws === "surface" ? ringOnRingArea(ring) : ringOnRingVolume({ ...ring, thickness });
  }
  const piston = { ...disk, pistonDiameter: preset.pistonDiameter.value };
  return flaws === "surface" ? pistonOnBallsArea(piston) : pistonOnBallsVolume({ ...piston, thickness });
}
