// Beam and tension closed forms (src/size/flexure.ts) against numerical
// integration of the beam-theory stress field: scipy (effective_size.json, bars
// and rods) and, here, nested adaptive Gauss-Kronrod over the same field.
import { describe, expect, it } from "vitest";
import { InputError } from "../src/errors";
import { integrateAdaptive } from "../src/numeric/quadrature";
import {
  barFlexureArea,
  barFlexureVolume,
  rodFlexureArea,
  rodFlexureVolume,
  tensionArea,
  tensionVolume,
} from "../src/size/flexure";
import { fixture, relativeError } from "./helpers";

const ref = fixture("effective_size.json");

function integrate(f: (x: number) => number, a: number, b: number, breakpoints: number[] = []): number {
  const r = integrateAdaptive(f, a, b, { relativeTolerance: 1e-13, breakpoints });
  expect(r.converged).toBe(true);
  return r.value;
}

/** (M(x)/M_max)^m integrated along the outer span: the beam-theory moment diagram. */
function spanIntegral(m: number, L: number, Li: number): number {
  const shear = (L - Li) / 2;
  const ratio = (x: number) => (Li === 0 ? 1 - Math.abs((2 * x) / L - 1) : Math.min(1, x / shear, (L - x) / shear));
  return integrate((x) => ratio(x) ** m, 0, L, Li === 0 ? [L / 2] : [shear, L - shear]);
}

describe("rectangular bar in flexure", () => {
  it("closed forms equal scipy's integral of the stress field (effective_size.json bars)", () => {
    for (const c of ref.bars) {
      const spec = { shape: c.shape, outerSpan: c.outerSpan, innerSpan: c.innerSpan, width: c.width, depth: c.depth };
      expect(relativeError(barFlexureVolume(spec), c.volume)).toBeLessThan(1e-11);
      expect(relativeError(barFlexureArea(spec), c.area)).toBeLessThan(1e-11);
    }
  });

  it("closed forms equal a nested adaptive integral over span and depth", () => {
    for (const [m, L, Li, b, d] of [[10, 40, 20, 4, 3], [6.5, 30, 0, 3, 2.5], [17, 80, 25, 8, 6]]) {
      const along = spanIntegral(m, L, Li);
      const depthPart = integrate((y) => ((2 * y) / d) ** m, 0, d / 2);
      expect(relativeError(barFlexureVolume({ shape: m, outerSpan: L, innerSpan: Li, width: b, depth: d }), along * b * depthPart)).toBeLessThan(1e-12);
      const area = along * (b + 2 * depthPart);
      expect(relativeError(barFlexureArea({ shape: m, outerSpan: L, innerSpan: Li, width: b, depth: d }), area)).toBeLessThan(1e-12);
    }
  });

  it("ASTM C1683's three-point bar: V_E = b d L / (2 (m+1)^2) (Quinn 2003; derived independently here)", () => {
    // from memory: C1683 lists V_E = L b d / (2 (m+1)^2) for three-point flexure; this is the Li = 0 case.
    const v = barFlexureVolume({ shape: 10, outerSpan: 40, innerSpan: 0, width: 4, depth: 3 });
    expect(relativeError(v, (40 * 4 * 3) / (2 * 121))).toBeLessThan(1e-15);
  });

  it("four-point effective size exceeds three-point, and both fall as m rises", () => {
    const base = { outerSpan: 40, width: 4, depth: 3 };
    const v4 = barFlexureVolume({ ...base, innerSpan: 20, shape: 10 });
    const v3 = barFlexureVolume({ ...base, innerSpan: 0, shape: 10 });
    expect(v4).toBeGreaterThan(v3);
    expect(barFlexureVolume({ ...base, innerSpan: 20, shape: 20 })).toBeLessThan(v4);
  });
});

describe("round rod in flexure", () => {
  it("closed forms (docs/methods.md section 5, derived) equal scipy's integral over the section (effective_size.json rods)", () => {
    for (const c of ref.rods) {
      const spec = { shape: c.shape, outerSpan: c.outerSpan, innerSpan: c.innerSpan, diameter: c.diameter };
      expect(relativeError(rodFlexureVolume(spec), c.volume)).toBeLessThan(1e-11);
      expect(relativeError(rodFlexureArea(spec), c.area)).toBeLessThan(1e-11);
    }
  });

  it("closed forms equal a nested adaptive integral over the circular section", () => {
    for (const [m, L, Li, D] of [[10, 40, 20, 5], [4.2, 50, 0, 6], [30, 40, 20, 3]]) {
      const R = D / 2;
      const along = spanIntegral(m, L, Li);
      // Tensile half: y from 0 to R, chord 2 sqrt(R^2 - y^2).
      const section = integrate((y) => (y / R) ** m * 2 * Math.sqrt(R * R - y * y), 0, R);
      const perimeter = integrate((t) => Math.cos(t) ** m * R, -Math.PI / 2, Math.PI / 2, [0]);
      const spec = { shape: m, outerSpan: L, innerSpan: Li, diameter: D };
      expect(relativeError(rodFlexureVolume(spec), along * section)).toBeLessThan(1e-10);
      expect(relativeError(rodFlexureArea(spec), along * perimeter)).toBeLessThan(1e-11);
    }
  });
});

describe("uniaxial tension", () => {
  it("is the gauge volume and lateral area", () => {
    expect(tensionVolume({ gaugeLength: 20, width: 4, depth: 3 })).toBe(240);
    expect(tensionArea({ gaugeLength: 20, width: 4, depth: 3 })).toBe(280);
    expect(relativeError(tensionVolume({ gaugeLength: 10, diameter: 2 }), 10 * Math.PI)).toBeLessThan(1e-15);
    expect(relativeError(tensionArea({ gaugeLength: 10, diameter: 2 }), 20 * Math.PI)).toBeLessThan(1e-15);
  });
});

describe("bad input throws InputError with a message", () => {
  const good = { shape: 10, outerSpan: 40, innerSpan: 20, width: 4, depth: 3 };
  it.each([
    ["inner span longer than outer", { innerSpan: 50 }, /inner span \(50\) must be shorter than the outer span \(40\)/],
    ["inner span equal to outer", { innerSpan: 40 }, /shorter/],
    ["negative inner span", { innerSpan: -1 }, /inner span/],
    ["zero modulus", { shape: 0 }, /modulus/],
    ["negative width", { width: -4 }, /width/],
    ["NaN depth", { depth: NaN }, /depth/],
    ["infinite outer span", { outerSpan: Infinity }, /outer span/],
  ])("%s", (_, change, message) => {
    const call = () => barFlexureVolume({ ...good, ...change });
    expect(call).toThrow(InputError);
    expect(call).toThrow(message);
    expect(() => barFlexureArea({ ...good, ...change })).toThrow(InputError);
  });

  it("rods and tension too", () => {
    expect(() => rodFlexureVolume({ shape: 10, outerSpan: 40, innerSpan: 0, diameter: 0 })).toThrow(/diameter/);
    expect(() => tensionVolume({ gaugeLength: -2, diameter: 3 })).toThrow(/gauge length/);
  });
});
