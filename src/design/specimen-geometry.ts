/**
 * What a configurations cell may say, and how a specimen's effective size
 * changes with the Weibull modulus: the size law a pooled fit re-evaluates at
 * every trial modulus.
 *
 * A configuration is either a standard preset's name (as SPECIMEN accepts it,
 * e.g. "C1161-B-4PT", "C1499-20/10") or a description by dimensions:
 *
 *   BAR outer/inner width x depth          "BAR 40/20 4x3"   (inner 0: three-point)
 *   ROD outer/inner diameter               "ROD 40/20 5"
 *   RING load/support disk [x thickness]   "RING 10/20 25x1" (ring-on-ring)
 *   PISTON piston/support disk [x thickness] "PISTON 1.4/10 14x1.2" (piston-on-three-balls)
 *
 * Width is the tensile face of a bar. "x", "X", "*" or the multiplication
 * sign separate a section; a decimal comma is read as a decimal point (a
 * comma never separates anything here). Lengths in millimetres when mixed
 * with presets (their dimensions are in mm); otherwise any one length unit.
 *
 * Size laws return ln(size) and d ln(size)/dm. Bars and rods are closed forms
 * (flexure.ts): bar V_E = b d (m Li + L) / (2 (m+1)^2), so
 *   d ln V_E/dm = Li/(m Li + L) - 2/(m+1);
 * bar S_E = ((m Li + L)/(m+1)) (b + d/(m+1)), so
 *   d ln S_E/dm = Li/(m Li + L) - 1/(m+1) - d / ((m+1)^2 (b + d/(m+1)));
 * rods add (psi((m+1)/2) - psi((m+4)/2))/2 (volume) or
 * (psi((m+1)/2) - psi((m+2)/2))/2 (area) to Li/(m Li + L) - 1/(m+1).
 * Disks cost a quadrature per modulus, so ln S_E (or ln V_E) is tabulated as a
 * Chebyshev interpolant in ln m over DISK_MODULUS_RANGE, once per fit.
 */
import { InputError } from "../errors";
import { chebyshevInterpolant } from "../numeric/chebyshev";
import { digamma } from "../numeric/digamma";
import { logGamma } from "../numeric/gamma";
import type { Criterion } from "../size/criteria";
import { pistonOnBallsArea, pistonOnBallsVolume, ringOnRingArea, ringOnRingVolume } from "../size/disk";
import { barFlexureArea, barFlexureVolume, rodFlexureArea, rodFlexureVolume } from "../size/flexure";
import { findSpecimen } from "../size/presets";

export type FlawKind = "volume" | "surface";

export type SpecimenGeometry =
  | { kind: "bar"; outerSpan: number; innerSpan: number; width: number; depth: number }
  | { kind: "rod"; outerSpan: number; innerSpan: number; diameter: number }
  | { kind: "ring"; loadDiameter: number; supportDiameter: number; diskDiameter: number; thickness: number | null }
  | { kind: "piston"; pistonDiameter: number; supportDiameter: number; diskDiameter: number; thickness: number | null };

/** Moduli over which a disk's effective size is tabulated; a pooled fit is sought inside it. */
export const DISK_MODULUS_RANGE = { lowest: 0.5, highest: 200 } as const;
const DISK_NODES = 64;

const SYNTAX =
  'a preset name (e.g. "C1161-B-4PT") or "BAR outer/inner width x depth", "ROD outer/inner diameter", ' +
  '"RING load/support disk x thickness", "PISTON piston/support disk x thickness" (e.g. "BAR 40/20 4x3")';

function bad(text: string, why: string): InputError {
  return new InputError("input", `configuration "${text}": ${why}; write ${SYNTAX}`);
}

function readLength(token: string, text: string, name: string): number {
  const t = token.replace(",", ".");
  if (!/^(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) throw bad(text, `${name} "${token}" is not a number`);
  const value = Number(t);
  if (!Number.isFinite(value)) throw bad(text, `${name} "${token}" is too large to represent`);
  return value;
}

function pair(token: string | undefined, text: string, names: [string, string]): [number, number] {
  const parts = (token ?? "").split("/");
  if (parts.length !== 2) throw bad(text, `expected ${names[0]}/${names[1]}`);
  return [readLength(parts[0], text, names[0]), readLength(parts[1], text, names[1])];
}

function section(token: string | undefined, text: string, names: [string, string], secondOptional: boolean): [number, number | null] {
  const parts = (token ?? "").split(/[xX*\u00d7]/);
  if (parts.length === 1 && secondOptional && parts[0] !== "") return [readLength(parts[0], text, names[0]), null];
  if (parts.length !== 2) throw bad(text, `expected ${names[0]} x ${names[1]}`);
  return [readLength(parts[0], text, names[0]), readLength(parts[1], text, names[1])];
}

/**
 * The geometry a configurations cell names.
 * @example parseConfiguration("BAR 40/20 4x3") // { kind: "bar", outerSpan: 40, innerSpan: 20, width: 4, depth: 3 }
 */
export function parseConfiguration(text: string): SpecimenGeometry {
  if (typeof text !== "string" || text.trim() === "") throw new InputError("input", `a configuration is empty; write ${SYNTAX}`);
  // Spaces around "/" and "x" are allowed: "BAR 40 / 20 4 x 3".
  const tokens = text
    .trim()
    .replace(/\s*\/\s*/g, "/")
    .replace(/(\d)\s*[xX*\u00d7]\s*(?=[\d.,])/g, "$1x")
    .split(/\s+/);
  const word = tokens[0].toUpperCase();
  if (word === "BAR" || word === "ROD" || word === "RING" || word === "PISTON") {
    if (tokens.length !== 3) throw bad(text, `${word} takes two groups of dimensions`);
    if (word === "BAR") {
      const [outerSpan, innerSpan] = pair(tokens[1], text, ["outer span", "inner span"]);
      const [width, depth] = section(tokens[2], text, ["width", "depth"], false);
      return { kind: "bar", outerSpan, innerSpan, width, depth: depth as number };
    }
    if (word === "ROD") {
      const [outerSpan, innerSpan] = pair(tokens[1], text, ["outer span", "inner span"]);
      return { kind: "rod", outerSpan, innerSpan, diameter: readLength(tokens[2], text, "diameter") };
    }
    if (word === "RING") {
      const [loadDiameter, supportDiameter] = pair(tokens[1], text, ["load ring diameter", "support ring diameter"]);
      const [diskDiameter, thickness] = section(tokens[2], text, ["disk diameter", "thickness"], true);
      return { kind: "ring", loadDiameter, supportDiameter, diskDiameter, thickness };
    }
    const [pistonDiameter, supportDiameter] = pair(tokens[1], text, ["piston diameter", "support circle diameter"]);
    const [diskDiameter, thickness] = section(tokens[2], text, ["disk diameter", "thickness"], true);
    return { kind: "piston", pistonDiameter, supportDiameter, diskDiameter, thickness };
  }
  const preset = findSpecimen(text);
  if (preset.kind === "bar-flexure") {
    return {
      kind: "bar",
      outerSpan: preset.outerSpan.value,
      innerSpan: preset.innerSpan.value,
      width: preset.width.value,
      depth: preset.depth.value,
    };
  }
  const thickness = preset.thickness?.value ?? null;
  if (preset.kind === "ring-on-ring") {
    return {
      kind: "ring",
      loadDiameter: preset.loadDiameter.value,
      supportDiameter: preset.supportDiameter.value,
      diskDiameter: preset.diskDiameter.value,
      thickness,
    };
  }
  return {
    kind: "piston",
    pistonDiameter: preset.pistonDiameter.value,
    supportDiameter: preset.supportDiameter.value,
    diskDiameter: preset.diskDiameter.value,
    thickness,
  };
}

/** ln(effective size) and its derivative in m, for one specimen geometry. */
export interface SizeLaw {
  logSize(shape: number): number;
  dLogSize(shape: number): number;
  /** Moduli where the law holds (the disks' tabulated range); bars and rods: all m > 0. */
  readonly lowest: number;
  readonly highest: number;
}

export interface SizeLawOptions {
  geometry: SpecimenGeometry;
  flaws: FlawKind;
  /** Poisson's ratio: the disks only. */
  poisson?: number;
  criterion?: Criterion;
}

/**
 * The size law of a geometry; checks its dimensions once, at m = 10.
 * @example sizeLaw({ geometry: parseConfiguration("BAR 40/20 4x3"), flaws: "volume" }).logSize(10) // ln 11.90 = 2.4766
 */
export function sizeLaw({ geometry: g, flaws, poisson, criterion = "PIA" }: SizeLawOptions): SizeLaw {
  if (g.kind === "bar") {
    const spec = { shape: 10, outerSpan: g.outerSpan, innerSpan: g.innerSpan, width: g.width, depth: g.depth };
    if (flaws === "volume") {
      barFlexureVolume(spec);
      return {
        lowest: 0,
        highest: Infinity,
        logSize: (m) => Math.log((g.width * g.depth) / 2) + Math.log(m * g.innerSpan + g.outerSpan) - 2 * Math.log1p(m),
        dLogSize: (m) => g.innerSpan / (m * g.innerSpan + g.outerSpan) - 2 / (m + 1),
      };
    }
    barFlexureArea(spec);
    return {
      lowest: 0,
      highest: Infinity,
      logSize: (m) => Math.log(m * g.innerSpan + g.outerSpan) - Math.log1p(m) + Math.log(g.width + g.depth / (m + 1)),
      dLogSize: (m) =>
        g.innerSpan / (m * g.innerSpan + g.outerSpan) - 1 / (m + 1) - g.depth / ((m + 1) * (m + 1) * (g.width + g.depth / (m + 1))),
    };
  }
  if (g.kind === "rod") {
    const spec = { shape: 10, outerSpan: g.outerSpan, innerSpan: g.innerSpan, diameter: g.diameter };
    const R = g.diameter / 2;
    const span = (m: number) => Math.log(m * g.innerSpan + g.outerSpan) - Math.log1p(m);
    const dSpan = (m: number) => g.innerSpan / (m * g.innerSpan + g.outerSpan) - 1 / (m + 1);
    if (flaws === "volume") {
      rodFlexureVolume(spec);
      return {
        lowest: 0,
        highest: Infinity,
        logSize: (m) => span(m) + Math.log((R * R * Math.sqrt(Math.PI)) / 2) + logGamma((m + 1) / 2) - logGamma((m + 4) / 2),
        dLogSize: (m) => dSpan(m) + 0.5 * (digamma((m + 1) / 2) - digamma((m + 4) / 2)),
      };
    }
    rodFlexureArea(spec);
    return {
      lowest: 0,
      highest: Infinity,
      logSize: (m) => span(m) + Math.log(R * Math.sqrt(Math.PI)) + logGamma((m + 1) / 2) - logGamma((m + 2) / 2),
      dLogSize: (m) => dSpan(m) + 0.5 * (digamma((m + 1) / 2) - digamma((m + 2) / 2)),
    };
  }
  if (poisson === undefined || poisson === null || !Number.isFinite(poisson)) {
    throw new InputError("input", "a disk configuration needs Poisson's ratio (the poisson argument)");
  }
  if (flaws === "volume" && g.thickness === null) {
    throw new InputError("input", "a disk configuration needs its thickness for volume flaws: write the disk as diameter x thickness");
  }
  const base = { criterion, poisson, supportDiameter: g.supportDiameter, diskDiameter: g.diskDiameter };
  let size: (m: number) => number;
  if (g.kind === "ring") {
    const ring = { ...base, loadDiameter: g.loadDiameter };
    size = flaws === "surface" ? (m) => ringOnRingArea({ ...ring, shape: m }) : (m) => ringOnRingVolume({ ...ring, shape: m, thickness: g.thickness as number });
  } else {
    const piston = { ...base, pistonDiameter: g.pistonDiameter };
    size =
      flaws === "surface"
        ? (m) => pistonOnBallsArea({ ...piston, shape: m })
        : (m) => pistonOnBallsVolume({ ...piston, shape: m, thickness: g.thickness as number });
  }
  size(10);
  const { lowest, highest } = DISK_MODULUS_RANGE;
  const table = chebyshevInterpolant({ f: (x) => Math.log(size(Math.exp(x))), lower: Math.log(lowest), upper: Math.log(highest), nodes: DISK_NODES });
  return {
    lowest,
    highest,
    logSize: (m) => table.value(Math.log(m)),
    dLogSize: (m) => table.derivative(Math.log(m)) / m,
  };
}
