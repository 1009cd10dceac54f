// Multiaxial criteria (src/size/criteria.ts): normalising constants checked by
// integration, NSA averages against scipy (test/fixtures/generate_effective_size.py,
// a different sphere parametrisation), and the plane-stress identity.
import { describe, expect, it } from "vitest";
import { integrateAdaptive } from "../src/numeric/quadrature";
import {
  NsaEvaluator,
  makeIntensity,
  nsaSurfaceConstant,
  nsaVolumeConstant,
  parseCriterion,
} from "../src/size/criteria";
import { fixture, relativeError } from "./helpers";

const ref = fixture("effective_size.json");

describe("NSA normalising constants, verified by integration (derived, not taken from a table)", () => {
  it("k_S makes uniaxial tension count 1: k_S (1/pi) int_0^pi |cos psi|^(2m) dpsi = 1", () => {
    for (const m of [1, 2.5, 7, 10, 24.3, 60]) {
      const mean = integrateAdaptive((p) => Math.abs(Math.cos(p)) ** (2 * m), 0, Math.PI, { relativeTolerance: 1e-13 }).value / Math.PI;
      expect(relativeError(nsaSurfaceConstant(m) * mean, 1)).toBeLessThan(1e-12);
    }
  });

  it("k_V = 2m + 1 makes uniaxial tension count 1: (2m+1)/(4 pi) int_sphere |cos theta|^(2m) dOmega = 1", () => {
    for (const m of [1, 3.3, 10, 45]) {
      // Axisymmetric about the load axis: dOmega = 2 pi sin(theta) dtheta.
      const sphere = integrateAdaptive((t) => 2 * Math.PI * Math.abs(Math.cos(t)) ** (2 * m) * Math.sin(t), 0, Math.PI, {
        relativeTolerance: 1e-13,
      }).value;
      expect(relativeError((nsaVolumeConstant(m) * sphere) / (4 * Math.PI), 1)).toBeLessThan(1e-12);
    }
  });

  it("the evaluators give exactly 1 for uniaxial tension at the reference stress, under every criterion", () => {
    for (const m of [2, 10.5, 33]) {
      for (const c of ["PIA", "NSA", "MAXPRINCIPAL"] as const) {
        expect(relativeError(makeIntensity(c, m, "surface")(1, 0, 0), 1)).toBeLessThan(1e-13);
        expect(relativeError(makeIntensity(c, m, "volume")(1, 0, 0), 1)).toBeLessThan(1e-13);
        expect(relativeError(makeIntensity(c, m, "volume")(0, 1, 0), 1)).toBeLessThan(1e-13);
      }
    }
  });
});

describe("NSA averages against scipy/mpmath references", () => {
  it("surface form: scipy quad of the angular mean (effective_size.json nsaSurface)", () => {
    let worst = 0;
    for (const c of ref.nsaSurface) {
      const e = new NsaEvaluator(c.shape);
      worst = Math.max(worst, relativeError(e.surface(c.s1, c.s2), c.value));
    }
    expect(worst).toBeLessThan(1e-10);
  });

  it("volume form: scipy dblquad over the sphere with the polar axis on s1 (effective_size.json nsaVolume)", () => {
    let worst = 0;
    for (const c of ref.nsaVolume) {
      const e = new NsaEvaluator(c.shape);
      const [a, b, d] = c.s;
      // Any order of the principal stresses.
      worst = Math.max(worst, relativeError(e.volume(a, b, d), c.value), relativeError(e.volume(d, a, b), c.value));
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it("hydrostatic tension gives k_V and equibiaxial gives k_S (closed forms)", () => {
    for (const m of [3, 10, 25]) {
      const e = new NsaEvaluator(m);
      expect(relativeError(e.volume(1, 1, 1), 2 * m + 1)).toBeLessThan(1e-12);
      expect(relativeError(e.surface(1, 1), nsaSurfaceConstant(m))).toBeLessThan(1e-12);
    }
  });

  it("volume and surface forms agree for plane stress (derived identity, see criteria.ts header)", () => {
    for (const m of [2.2, 10, 31]) {
      const e = new NsaEvaluator(m);
      for (const [a, b] of [[1, 0.4], [1, -0.7], [0.3, 1], [1, 1]]) {
        expect(relativeError(e.volume(a, b, 0), e.surface(a, b))).toBeLessThan(1e-13);
      }
    }
    // ... and the sphere code path itself (no zero stress) tends to the surface value as s3 -> 0.
    const e = new NsaEvaluator(10);
    expect(relativeError(e.volume(1, 0.4, -1e-9), e.surface(1, 0.4))).toBeLessThan(1e-7);
    expect(relativeError(e.volume(1, 0.4, 1e-9), e.surface(1, 0.4))).toBeLessThan(1e-7);
  });

  it("compression everywhere counts nothing", () => {
    const e = new NsaEvaluator(10);
    expect(e.surface(-1, -0.5)).toBe(0);
    expect(e.volume(-1, -0.2, -3)).toBe(0);
    expect(e.volume(0, 0, 0)).toBe(0);
  });
});

describe("PIA and MAXPRINCIPAL", () => {
  it("an equibiaxial point at the peak counts 2 under PIA and 1 under MAXPRINCIPAL", () => {
    expect(makeIntensity("PIA", 10, "surface")(1, 1, 0)).toBe(2);
    expect(makeIntensity("MAXPRINCIPAL", 10, "surface")(1, 1, 0)).toBe(1);
  });

  it("compressive stresses contribute nothing", () => {
    const pia = makeIntensity("PIA", 4, "volume");
    expect(pia(0.5, -0.9, -2)).toBe(0.5 ** 4);
    expect(pia(-1, -1, -1)).toBe(0);
    expect(makeIntensity("MAXPRINCIPAL", 4, "volume")(-0.2, 0.5, -3)).toBe(0.5 ** 4);
  });

  it("NSA lies between MAXPRINCIPAL and PIA for equibiaxial tension only above m = 1 (k_S grows like sqrt(pi m))", () => {
    // k_S(1) = 2 = PIA; for larger m NSA counts an equibiaxial point more than PIA.
    expect(nsaSurfaceConstant(1)).toBeCloseTo(2, 14);
    expect(nsaSurfaceConstant(10)).toBeGreaterThan(2);
  });
});

describe("criterion names", () => {
  it("accepts the names in any case, blank -> PIA, rejects others with kind 'value'", () => {
    expect(parseCriterion(undefined)).toBe("PIA");
    expect(parseCriterion("  ")).toBe("PIA");
    expect(parseCriterion("nsa")).toBe("NSA");
    expect(parseCriterion("Max Principal")).toBe("MAXPRINCIPAL");
    expect(() => parseCriterion("Batdorf")).toThrow(/not one of/);
  });
});
