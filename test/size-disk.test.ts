// Disk fields and effective sizes (src/size/plate-field.ts, disk.ts, presets.ts):
// fields against a numerical solution of the plate equations (scipy,
// effective_size.json "fields"), the centre stress against the published
// formulas of ASTM C1499 and ISO 6872, equilibrium and compatibility by finite
// differences, and effective sizes against scipy integrals (effective_size.json "disks").
import { describe, expect, it } from "vitest";
import { InputError } from "../src/errors";
import {
  diskEffectiveArea,
  diskEffectiveAreaBreakdown,
  diskEffectiveVolume,
  diskPeakStress,
  diskRimArea,
  pistonOnBallsArea,
  pistonOnBallsVolume,
  ringOnRingArea,
  ringOnRingVolume,
} from "../src/size/disk";
import { type DiskField, fieldAt, pistonOnRingField, ringOnRingField } from "../src/size/plate-field";
import { SPECIMENS, findSpecimen, specimenEffectiveSize } from "../src/size/presets";
import { barFlexureArea, barFlexureVolume } from "../src/size/flexure";
import { fixture, relativeError } from "./helpers";

const ref = fixture("effective_size.json");

function field(kind: string, inner: number, support: number, disk: number, poisson: number): DiskField {
  return kind === "ring"
    ? ringOnRingField({ loadDiameter: 2 * inner, supportDiameter: 2 * support, diskDiameter: 2 * disk, poisson })
    : pistonOnRingField({ pistonDiameter: 2 * inner, supportDiameter: 2 * support, diskDiameter: 2 * disk, poisson });
}

describe("plate-theory fields", () => {
  it("equal a numerical solution of the axisymmetric plate equations (scipy, effective_size.json fields)", () => {
    for (const f of ref.fields) {
      const fld = field(f.kind, f.inner, f.support, f.disk, f.poisson);
      f.radii.forEach((r: number, i: number) => {
        const { radial, hoop } = fieldAt(fld, r);
        expect(Math.abs(radial - f.stresses[i][0])).toBeLessThan(1e-9);
        expect(Math.abs(hoop - f.stresses[i][1])).toBeLessThan(1e-9);
      });
    }
  });

  it("ring-on-ring centre stress equals ASTM C1499's equibiaxial strength formula", () => {
    // source: ASTM C1499 sigma_f = 3F/(2 pi h^2)[(1-nu)(D_S^2-D_L^2)/(2D^2) + (1+nu) ln(D_S/D_L)]
    // (formula from memory of the standard; values evaluated in effective_size.json centres.c1499)
    for (const c of ref.centres.c1499) {
      const fld = ringOnRingField({ loadDiameter: c.DL, supportDiameter: c.DS, diskDiameter: c.D, poisson: c.nu });
      const k = (3 * c.F) / (4 * Math.PI * c.h * c.h);
      expect(relativeError(k * fieldAt(fld, 0).radial, c.stress)).toBeLessThan(1e-14);
    }
  });

  it("piston-on-three-balls centre stress equals ISO 6872's -0.2387 P (X - Y)/t^2", () => {
    // source: ISO 6872 formula (docs/methods.md section 9, from memory); 0.2387 is 3/(4 pi) rounded, hence 1e-4.
    for (const c of ref.centres.iso6872) {
      const fld = pistonOnRingField({ pistonDiameter: 2 * c.r2, supportDiameter: 2 * c.r1, diskDiameter: 2 * c.r3, poisson: c.nu });
      const k = (3 * c.P) / (4 * Math.PI * c.t * c.t);
      expect(relativeError(k * fieldAt(fld, 0).radial, c.stress)).toBeLessThan(2e-4);
      expect(relativeError(k * fieldAt(fld, 0).radial * (0.2387 / (3 / (4 * Math.PI))), c.stress)).toBeLessThan(1e-13);
    }
  });

  it("satisfy plate equilibrium d(r s_r)/dr - s_t = -4 F(r)/F and strain compatibility, by finite differences", () => {
    const cases: [DiskField, (r: number) => number][] = [
      [ringOnRingField({ loadDiameter: 8, supportDiameter: 20, diskDiameter: 26, poisson: 0.23 }), (r) => (r > 4 && r < 10 ? 1 : 0)],
      [pistonOnRingField({ pistonDiameter: 1.6, supportDiameter: 10, diskDiameter: 13, poisson: 0.3 }), (r) => (r < 0.8 ? (r / 0.8) ** 2 : r < 5 ? 1 : 0)],
    ];
    for (const [fld, loadInside] of cases) {
      const nu = fld === cases[0][0] ? 0.23 : 0.3;
      for (const r of [0.3, 0.7, 2, 3.9, 4.5, 6, 9.5, 11, 12.4]) {
        if (r >= fld.diskRadius) continue;
        const h = 1e-5 * r;
        const rsr = (x: number) => x * fieldAt(fld, x).radial;
        const equilibrium = (rsr(r + h) - rsr(r - h)) / (2 * h) - fieldAt(fld, r).hoop;
        expect(Math.abs(equilibrium + 4 * loadInside(r))).toBeLessThan(1e-6);
        // Curvatures k_r ~ s_r - nu s_t and k_t ~ s_t - nu s_r satisfy k_r = d(r k_t)/dr.
        const kt = (x: number) => x * (fieldAt(fld, x).hoop - nu * fieldAt(fld, x).radial);
        const { radial, hoop } = fieldAt(fld, r);
        expect(Math.abs((kt(r + h) - kt(r - h)) / (2 * h) - (radial - nu * hoop))).toBeLessThan(1e-6);
      }
      // Free edge.
      expect(Math.abs(fieldAt(fld, fld.diskRadius).radial)).toBeLessThan(1e-14);
    }
  });
});

describe("disk effective sizes", () => {
  it("equal scipy's integrals of the field over both faces, every criterion (effective_size.json disks)", () => {
    for (const c of ref.disks) {
      const geometry = { supportDiameter: c.supportDiameter, diskDiameter: c.diskDiameter, poisson: c.poisson };
      const fld =
        c.kind === "ring"
          ? ringOnRingField({ ...geometry, loadDiameter: c.innerDiameter })
          : pistonOnRingField({ ...geometry, pistonDiameter: c.innerDiameter });
      expect(relativeError(diskPeakStress(fld), c.peak)).toBeLessThan(1e-12);
      const area = diskEffectiveArea({ field: fld, shape: c.shape, criterion: c.criterion });
      expect(relativeError(area, c.area)).toBeLessThan(1e-8);
      if (c.volume !== undefined) {
        // scipy's volume integrates through the thickness numerically (dblquad, 1e-10).
        const vol = diskEffectiveVolume({ field: fld, shape: c.shape, criterion: c.criterion, thickness: c.thickness });
        expect(relativeError(vol, c.volume)).toBeLessThan(1e-8);
      }
    }
  });

  it("inside the load ring the PIA integrand is exactly 2 (equibiaxial at the peak)", () => {
    const fld = ringOnRingField({ loadDiameter: 10, supportDiameter: 20, diskDiameter: 25, poisson: 0.25 });
    const parts = diskEffectiveAreaBreakdown({ field: fld, shape: 10, criterion: "PIA" });
    expect(relativeError(parts.regions[0], 2 * Math.PI * 25)).toBeLessThan(1e-15);
    const maxp = diskEffectiveAreaBreakdown({ field: fld, shape: 10, criterion: "MAXPRINCIPAL" });
    expect(relativeError(maxp.regions[0], Math.PI * 25)).toBeLessThan(1e-15);
  });

  it("criteria order for ring-on-ring at m = 10: MAXPRINCIPAL < PIA < NSA", () => {
    const spec = { shape: 10, loadDiameter: 10, supportDiameter: 20, diskDiameter: 25, poisson: 0.25 };
    const maxp = ringOnRingArea({ ...spec, criterion: "MAXPRINCIPAL" });
    const pia = ringOnRingArea(spec);
    const nsa = ringOnRingArea({ ...spec, criterion: "NSA" });
    expect(maxp).toBeLessThan(pia);
    expect(pia).toBeLessThan(nsa);
  });

  it("volume = h/(2(m+1)) x the two-face area (linear stress through the thickness)", () => {
    const spec = { shape: 7, pistonDiameter: 1.4, supportDiameter: 10, diskDiameter: 14, poisson: 0.22 };
    expect(relativeError(pistonOnBallsVolume({ ...spec, thickness: 1.2 }), (1.2 / 16) * pistonOnBallsArea(spec))).toBeLessThan(1e-13);
    const ring = { shape: 12, loadDiameter: 10, supportDiameter: 20, diskDiameter: 25, poisson: 0.2, criterion: "NSA" as const };
    expect(relativeError(ringOnRingVolume({ ...ring, thickness: 1 }), ringOnRingArea(ring) / 26)).toBeLessThan(1e-13);
  });

  it("the overhang and loaded face add little at m = 10 (the share quoted in the README)", () => {
    const fld = ringOnRingField({ loadDiameter: 10, supportDiameter: 20, diskDiameter: 25, poisson: 0.25 });
    const parts = diskEffectiveAreaBreakdown({ field: fld, shape: 10 });
    expect(parts.regions[2] / parts.total).toBeLessThan(1e-3);
    expect(parts.loadedFace / parts.total).toBeLessThan(1e-9);
  });

  it("a negative Poisson's ratio moves the peak off the centre and the code finds it (scipy scan agrees above)", () => {
    const fld = ringOnRingField({ loadDiameter: 6, supportDiameter: 20, diskDiameter: 40, poisson: -0.8 });
    expect(diskPeakStress(fld)).toBeGreaterThan(fieldAt(fld, 0).radial);
  });

  it("the rim adds 2 pi R h/(2(m+1)) (s_t(R)/s_max)^m", () => {
    const fld = ringOnRingField({ loadDiameter: 10, supportDiameter: 20, diskDiameter: 25, poisson: 0.25 });
    const st = fieldAt(fld, 12.5).hoop / diskPeakStress(fld);
    expect(relativeError(diskRimArea({ field: fld, shape: 10, thickness: 1 }), ((2 * Math.PI * 12.5) / 22) * st ** 10)).toBeLessThan(1e-14);
  });

  it("the overhang's share of the presets' effective area is the one docs/methods.md section 5 states", () => {
    // docs/methods.md section 5 (PIA, nu = 0.25): ISO6872-P3B 0.10 % at m = 5 and 2e-7 at m = 10;
    // C1499-20/10 0.68 % and 8e-5. The integrals themselves are checked against scipy above.
    const share = (fld: DiskField, m: number) => {
      const b = diskEffectiveAreaBreakdown({ field: fld, shape: m, criterion: "PIA" });
      return b.regions[b.regions.length - 1] / b.total;
    };
    const iso = findSpecimen("ISO6872-P3B") as { pistonDiameter: { value: number }; supportDiameter: { value: number }; diskDiameter: { value: number } };
    const piston = pistonOnRingField({ pistonDiameter: iso.pistonDiameter.value, supportDiameter: iso.supportDiameter.value, diskDiameter: iso.diskDiameter.value, poisson: 0.25 });
    const ring = ringOnRingField({ loadDiameter: 10, supportDiameter: 20, diskDiameter: 25, poisson: 0.25 });
    const stated: [DiskField, number, number][] = [
      [piston, 5, 1.0e-3],
      [piston, 10, 2e-7],
      [ring, 5, 6.8e-3],
      [ring, 10, 8e-5],
    ];
    for (const [fld, m, value] of stated) expect(relativeError(share(fld, m), value), `m = ${m}`).toBeLessThan(0.1);
  });
});

describe("disk bad input", () => {
  const ring = { shape: 10, loadDiameter: 10, supportDiameter: 20, diskDiameter: 25, poisson: 0.25 };
  it.each([
    ["load ring larger than support ring", { loadDiameter: 30 }, /load ring diameter \(30\) must be smaller than the support diameter/],
    ["support ring larger than the disk", { supportDiameter: 30 }, /support diameter \(30\) must not exceed the disk diameter \(25\)/],
    ["Poisson's ratio 0.5", { poisson: 0.5 }, /Poisson's ratio must lie between -1 and 0.5/],
    ["Poisson's ratio -1", { poisson: -1 }, /Poisson/],
    ["zero load ring", { loadDiameter: 0 }, /load ring diameter/],
    ["negative modulus", { shape: -2 }, /modulus/],
  ])("%s", (_, change, message) => {
    expect(() => ringOnRingArea({ ...ring, ...change })).toThrow(InputError);
    expect(() => ringOnRingArea({ ...ring, ...change })).toThrow(message);
  });

  it("thickness must be positive", () => {
    expect(() => ringOnRingVolume({ ...ring, thickness: 0 })).toThrow(/thickness/);
  });
});

describe("standard specimen presets", () => {
  it("every preset documents every dimension with a marked source", () => {
    for (const s of SPECIMENS) {
      const dims = Object.values(s).filter((v): v is { value: number; source: string } => typeof v === "object" && v !== null && "source" in v);
      expect(dims.length).toBeGreaterThanOrEqual(3);
      for (const d of dims) expect(d.source).toMatch(/\[(source|memory|choice)|three-point/);
    }
  });

  it("C1161 presets equal the bar formulas at the standard's dimensions (ASTM C1161-13 sec. 1.1)", () => {
    // B four-point: 40/20 mm spans, 4 x 3 mm section.
    const spec = { shape: 10, outerSpan: 40, innerSpan: 20, width: 4, depth: 3 };
    expect(specimenEffectiveSize({ configuration: "C1161-B-4PT", shape: 10 })).toBe(barFlexureVolume(spec));
    expect(specimenEffectiveSize({ configuration: "astm c1161 b 4pt", shape: 10, flaws: "surface" })).toBe(barFlexureArea(spec));
    // A and C are half and twice B: volume scales by 1/8 and 8, area by 1/4 and 4.
    const b3 = specimenEffectiveSize({ configuration: "C1161-B-3PT", shape: 8 });
    expect(relativeError(specimenEffectiveSize({ configuration: "C1161-A-3PT", shape: 8 }), b3 / 8)).toBeLessThan(1e-15);
    expect(relativeError(specimenEffectiveSize({ configuration: "C1161-C-3PT", shape: 8, flaws: "surface" }), 4 * specimenEffectiveSize({ configuration: "C1161-B-3PT", shape: 8, flaws: "surface" }))).toBeLessThan(1e-15);
  });

  it("disk presets need Poisson's ratio, and F394 has no volume", () => {
    expect(() => specimenEffectiveSize({ configuration: "ISO6872-P3B", shape: 10 })).toThrow(/Poisson/);
    expect(specimenEffectiveSize({ configuration: "ISO6872-P3B", shape: 10, poisson: 0.25 })).toBeGreaterThan(0);
    expect(() => specimenEffectiveSize({ configuration: "F394-P3B", shape: 10, poisson: 0.25 })).toThrow(/no specimen thickness/);
    expect(specimenEffectiveSize({ configuration: "F394-P3B", shape: 10, poisson: 0.25, flaws: "surface" })).toBeGreaterThan(0);
    const r = findSpecimen("c1499 20/10");
    expect(r.kind).toBe("ring-on-ring");
  });

  it("unknown names list the known ones", () => {
    expect(() => findSpecimen("C1161-D")).toThrow(/C1161-B-4PT/);
  });
});
