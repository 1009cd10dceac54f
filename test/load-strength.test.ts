// Strength from breaking load (src/design/strength-from-load.ts, functions/load-strength.ts):
// each formula against its standard's equation as evaluated by the committed scipy generator
// (effective_size.json "centres": ASTM C1499 and ISO 6872 centre stresses), against the plate
// fields the project integrates (src/size/plate-field.ts, centre value), and the beam formulas
// against elastic beam theory written out here as M c / I (source: any strength-of-materials
// text, e.g. Timoshenko & Gere, Mechanics of Materials, ch. 5; from memory). Then the cell
// policy: columns and single values, blank rows, per-row errors for rows outside the limits.
import { describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { guarded } from "../functions/registry";
import { spillShapes } from "../functions/spill-shapes";
import {
  flexureStrength,
  pistonOnBallsStrength,
  ringOnRingStrength,
  rodFlexureStrength,
} from "../src/design/strength-from-load";
import { InputError } from "../src/errors";
import { fieldAt, pistonOnRingField, ringOnRingField } from "../src/size/plate-field";
import { fixture, relativeError } from "./helpers";

const ref = fixture("effective_size.json");

function spill(r: CellResult): unknown[][] {
  if (!Array.isArray(r)) throw new Error(`expected a spilled array, got ${JSON.stringify(r)}`);
  return r;
}

describe("bars and rods in flexure: elastic beam theory", () => {
  it("FLEXSTRENGTH equals M c / I with M = F (L - Li) / 4, c = d/2, I = b d^3 / 12 (three- and four-point)", () => {
    for (const [F, L, Li, b, d] of [
      [400, 40, 20, 4, 3],
      [250, 40, 0, 4, 3],
      [37.5, 20, 10, 2, 1.5],
      [1200, 80, 40, 8, 6],
    ]) {
      const M = (F * (L - Li)) / 4;
      const expected = (M * (d / 2)) / ((b * d ** 3) / 12);
      expect(relativeError(flexureStrength({ load: F, outerSpan: L, innerSpan: Li, width: b, depth: d }).strength, expected)).toBeLessThan(1e-14);
    }
  });

  it("quarter-point four-point flexure reduces to ASTM C1161's 3 F L / (4 b d^2)", () => {
    // source: ASTM C1161, quarter-point four-point formula (from memory of the standard's eq.)
    const F = 400;
    const L = 40;
    const expected = (3 * F * L) / (4 * 4 * 3 * 3);
    expect(relativeError(flexureStrength({ load: F, outerSpan: L, innerSpan: L / 2, width: 4, depth: 3 }).strength, expected)).toBeLessThan(1e-15);
  });

  it("RODFLEXSTRENGTH equals M c / I with I = pi D^4 / 64", () => {
    for (const [F, L, Li, D] of [
      [300, 40, 20, 3],
      [150, 50, 0, 5],
    ]) {
      const M = (F * (L - Li)) / 4;
      const expected = (M * (D / 2)) / ((Math.PI * D ** 4) / 64);
      expect(relativeError(rodFlexureStrength({ load: F, outerSpan: L, innerSpan: Li, diameter: D }).strength, expected)).toBeLessThan(1e-14);
    }
  });

  it("flags spans shorter than 10 depths (common practice) and rejects impossible geometry", () => {
    expect(flexureStrength({ load: 100, outerSpan: 40, innerSpan: 20, width: 4, depth: 3 }).outsideLimits).toEqual([]);
    const short = flexureStrength({ load: 100, outerSpan: 20, innerSpan: 10, width: 4, depth: 3 });
    expect(short.outsideLimits[0]).toMatch(/outer span \/ depth is 6\.67, below 10/);
    expect(rodFlexureStrength({ load: 100, outerSpan: 30, innerSpan: 0, diameter: 5 }).outsideLimits[0]).toMatch(/diameter is 6\.00/);
    expect(() => flexureStrength({ load: 100, outerSpan: 40, innerSpan: 40, width: 4, depth: 3 })).toThrow(InputError);
    expect(() => flexureStrength({ load: -1, outerSpan: 40, innerSpan: 20, width: 4, depth: 3 })).toThrow(/load must be a positive number/);
    expect(() => flexureStrength({ load: 1e300, outerSpan: 1e300, innerSpan: 0, width: 1e-300, depth: 1e-10 })).toThrow(/too large to represent/);
  });
});

describe("disks: the standards' formulas and the plate field's centre", () => {
  it("RINGSTRENGTH equals ASTM C1499's equibiaxial formula (scipy generator, effective_size.json centres.c1499)", () => {
    for (const c of ref.centres.c1499) {
      const s = ringOnRingStrength({ load: c.F, loadDiameter: c.DL, supportDiameter: c.DS, diskDiameter: c.D, thickness: c.h, poisson: c.nu });
      expect(relativeError(s.strength, c.stress)).toBeLessThan(1e-14);
    }
  });

  it("RINGSTRENGTH equals the centre of the ring-on-ring plate field, k = 3F/(4 pi h^2)", () => {
    for (const [F, DL, DS, D, h, nu] of [
      [1000, 12, 24, 30, 1.5, 0.22],
      [350, 10, 40, 45, 2, 0.3],
      [80, 5, 20, 20, 1, -0.2],
    ]) {
      const field = ringOnRingField({ loadDiameter: DL, supportDiameter: DS, diskDiameter: D, poisson: nu });
      const k = (3 * F) / (4 * Math.PI * h * h);
      const s = ringOnRingStrength({ load: F, loadDiameter: DL, supportDiameter: DS, diskDiameter: D, thickness: h, poisson: nu });
      expect(relativeError(s.strength, k * fieldAt(field, 0).radial)).toBeLessThan(1e-13);
    }
  });

  it("PISTONSTRENGTH equals ISO 6872's formula (effective_size.json centres.iso6872, which uses the rounded 0.2387)", () => {
    for (const c of ref.centres.iso6872) {
      const s = pistonOnBallsStrength({ load: c.P, pistonDiameter: 2 * c.r2, supportDiameter: 2 * c.r1, diskDiameter: 2 * c.r3, thickness: c.t, poisson: c.nu });
      // 0.2387 is 3/(4 pi) = 0.238732 rounded: 1.4e-4 relative.
      expect(relativeError(s.strength, c.stress)).toBeLessThan(2e-4);
      expect(relativeError(s.strength * (0.2387 / (3 / (4 * Math.PI))), c.stress)).toBeLessThan(1e-13);
    }
  });

  it("PISTONSTRENGTH equals the centre of the piston-on-ring plate field", () => {
    for (const [P, dp, ds, D, t, nu] of [
      [100, 1.4, 10, 14, 1.2, 0.25],
      [60, 1.2, 12, 16, 1.4, 0.3],
    ]) {
      const field = pistonOnRingField({ pistonDiameter: dp, supportDiameter: ds, diskDiameter: D, poisson: nu });
      const k = (3 * P) / (4 * Math.PI * t * t);
      const s = pistonOnBallsStrength({ load: P, pistonDiameter: dp, supportDiameter: ds, diskDiameter: D, thickness: t, poisson: nu });
      expect(relativeError(s.strength, k * fieldAt(field, 0).radial)).toBeLessThan(1e-13);
    }
  });

  it("flags disks outside the formulas' limits and rejects impossible geometry", () => {
    const ok = ringOnRingStrength({ load: 500, loadDiameter: 10, supportDiameter: 20, diskDiameter: 25, thickness: 1, poisson: 0.2 });
    expect(ok.outsideLimits).toEqual([]);
    const narrow = ringOnRingStrength({ load: 500, loadDiameter: 2, supportDiameter: 20, diskDiameter: 25, thickness: 1, poisson: 0.2 });
    expect(narrow.outsideLimits[0]).toMatch(/0\.100, outside 0\.2 to 0\.5/);
    const thick = ringOnRingStrength({ load: 500, loadDiameter: 10, supportDiameter: 20, diskDiameter: 25, thickness: 4, poisson: 0.2 });
    expect(thick.outsideLimits.join()).toMatch(/below 10: not a thin plate/);
    expect(pistonOnBallsStrength({ load: 100, pistonDiameter: 1.4, supportDiameter: 10, diskDiameter: 14, thickness: 3, poisson: 0.25 }).outsideLimits[0]).toMatch(/below 5/);
    expect(() => ringOnRingStrength({ load: 500, loadDiameter: 20, supportDiameter: 20, diskDiameter: 25, thickness: 1, poisson: 0.2 })).toThrow(/smaller than the support/);
    expect(() => ringOnRingStrength({ load: 500, loadDiameter: 10, supportDiameter: 30, diskDiameter: 25, thickness: 1, poisson: 0.2 })).toThrow(/must not exceed the disk/);
    expect(() => pistonOnBallsStrength({ load: 100, pistonDiameter: 1.4, supportDiameter: 10, diskDiameter: 14, thickness: 1.2, poisson: 0.5 })).toThrow(/Poisson/);
  });
});

describe("the cell functions: one strength per row of the load column", () => {
  const loads = [[400], [380.5], [null], [412]];

  it("spill as many rows as the load range, with single values shared by every row", () => {
    expect(spillShapes.FLEXSTRENGTH).toEqual({ rows: { cellsOf: 0 }, cols: 1 });
    const out = spill(guarded.FLEXSTRENGTH(loads, [[40]], [[20]], [[4]], [[3]]));
    expect(out).toHaveLength(4);
    expect(out[0][0]).toBeCloseTo((3 * 400 * 20) / (2 * 4 * 9), 12);
    expect(out[2][0]).toBe(""); // a blank load is no specimen: the row stays blank
  });

  it("take a column for a dimension measured on each specimen", () => {
    const out = spill(guarded.FLEXSTRENGTH(loads, [[40]], [[20]], [[4.01], [3.99], [4], [4.02]], [[3], [3.01], [3], [2.98]]));
    expect(out[1][0]).toBeCloseTo((3 * 380.5 * 20) / (2 * 3.99 * 3.01 ** 2), 12);
  });

  it("a row outside the limits, or with a blank or text dimension, is #VALUE! in that row alone, with the reason", () => {
    const out = spill(guarded.FLEXSTRENGTH([[400], [410], [420]], [[40]], [[20]], [[4]], [[3], [5], ["3,0"]]));
    expect(typeof out[0][0]).toBe("number");
    expect(isCellFailure(out[1][0]) && out[1][0].cellError).toBe("#VALUE!");
    expect(isCellFailure(out[1][0]) && out[1][0].message).toMatch(/row 2: outside the formula's limits: outer span \/ depth is 8\.00/);
    expect(isCellFailure(out[2][0]) && out[2][0].message).toMatch(/row 3: depth, row 3 is not a number/);
    const blank = spill(guarded.RODFLEXSTRENGTH([[300], [310]], [[40]], [[20]], [[3], [null]]));
    expect(isCellFailure(blank[1][0]) && blank[1][0].message).toMatch(/diameter is blank beside a load/);
  });

  it("columns of different lengths, a two-dimensional block, or a missing argument are #VALUE! for the whole call", () => {
    const mismatch = guarded.FLEXSTRENGTH(loads, [[40]], [[20]], [[4], [4]], [[3]]);
    expect(isCellFailure(mismatch) && mismatch.cellError).toBe("#VALUE!");
    expect(isCellFailure(mismatch) && mismatch.message).toMatch(/width has 2 rows but load has 4/);
    const block = guarded.RINGSTRENGTH([[1, 2], [3, 4]], [[10]], [[20]], [[25]], [[1]], [[0.2]]);
    expect(isCellFailure(block) && block.message).toMatch(/load must be one value or one column/);
  });

  it("RINGSTRENGTH and PISTONSTRENGTH give the standards' values per row", () => {
    const c = ref.centres.c1499[0];
    const ring = spill(guarded.RINGSTRENGTH([[c.F], [2 * c.F]], [[c.DL]], [[c.DS]], [[c.D]], [[c.h]], [[c.nu]]));
    expect(relativeError(ring[0][0] as number, c.stress)).toBeLessThan(1e-14);
    expect(relativeError(ring[1][0] as number, 2 * c.stress)).toBeLessThan(1e-14);
    const p = ref.centres.iso6872[0];
    const piston = spill(guarded.PISTONSTRENGTH([[p.P]], [[2 * p.r2]], [[2 * p.r1]], [[2 * p.r3]], [[p.t]], [[p.nu]]));
    expect(relativeError(piston[0][0] as number, p.stress)).toBeLessThan(2e-4);
  });
});
