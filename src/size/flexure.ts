/**
 * Effective volume and area of beams in flexure and of tension specimens
 * (ASTM C1683; Quinn 2003, J Am Ceram Soc 86:475 and 86:508). Beam theory:
 * the bending stress is uniaxial, linear through the depth and, along the
 * span, constant between the inner load points and linear to zero at the
 * outer supports; shear, contact and wedging stresses are ignored. Since the
 * stress is uniaxial, every multiaxial criterion gives the same answer.
 *
 * Span factor: integral along the outer span of (M(x)/M_max)^m dx
 *   = Li + 2 (L - Li)/2 / (m + 1) = (m Li + L)/(m + 1),
 * L the outer span, Li the inner span (0: three-point).
 *
 * Rectangular bar, width b (the tensile face), depth d (along the load) [derived]:
 *   V_E = b d (m Li + L) / (2 (m+1)^2)
 *   S_E = ((m Li + L)/(m+1)) (b + d/(m+1))
 * (tensile face, plus the tensile halves of both side faces).
 *
 * Round rod, radius R [derived by integrating over the section, verified numerically]:
 *   V_E = ((m Li + L)/(m+1)) R^2 (sqrt(pi)/2) Gamma((m+1)/2) / Gamma((m+4)/2)
 *   S_E = ((m Li + L)/(m+1)) R sqrt(pi) Gamma((m+1)/2) / Gamma((m+2)/2)
 *
 * Uniaxial tension: the gauge section's volume and lateral area (the stress
 * is the peak everywhere in it; shoulders and grips are left out).
 */
import { ensure, ensurePositive, InputError } from "../errors";
import { logGamma } from "../numeric/gamma";

export interface Spans {
  /** Weibull modulus m. */
  shape: number;
  /** Outer (support) span L. */
  outerSpan: number;
  /** Inner (load) span Li, 0 for three-point flexure, smaller than the outer span. */
  innerSpan: number;
}

function spanFactor({ shape, outerSpan, innerSpan }: Spans): number {
  ensurePositive(shape, "modulus");
  ensurePositive(outerSpan, "outer span");
  if (typeof innerSpan !== "number" || !Number.isFinite(innerSpan)) throw new InputError("input", "inner span must be a finite number");
  ensure(innerSpan >= 0, () => `inner span must be 0 (three-point) or positive (got ${innerSpan})`);
  ensure(
    innerSpan < outerSpan,
    () => `the inner span (${innerSpan}) must be shorter than the outer span (${outerSpan})`,
  );
  return (shape * innerSpan + outerSpan) / (shape + 1);
}

export interface BarFlexure extends Spans {
  /** Width b: the tensile face's width. */
  width: number;
  /** Depth d: in the direction of the load. */
  depth: number;
}

/** Effective volume of a rectangular bar in three- or four-point flexure. */
export function barFlexureVolume(spec: BarFlexure): number {
  const along = spanFactor(spec);
  ensurePositive(spec.width, "width");
  ensurePositive(spec.depth, "depth");
  return (along * spec.width * spec.depth) / (2 * (spec.shape + 1));
}

/** Effective area of a rectangular bar in flexure: tensile face plus the tensile halves of the side faces. */
export function barFlexureArea(spec: BarFlexure): number {
  const along = spanFactor(spec);
  ensurePositive(spec.width, "width");
  ensurePositive(spec.depth, "depth");
  return along * (spec.width + spec.depth / (spec.shape + 1));
}

export interface RodFlexure extends Spans {
  diameter: number;
}

/** Effective volume of a round rod in three- or four-point flexure. */
export function rodFlexureVolume(spec: RodFlexure): number {
  const along = spanFactor(spec);
  ensurePositive(spec.diameter, "diameter");
  const R = spec.diameter / 2;
  const m = spec.shape;
  const ratio = Math.exp(logGamma((m + 1) / 2) - logGamma((m + 4) / 2));
  return along * R * R * (Math.sqrt(Math.PI) / 2) * ratio;
}

/** Effective area of a round rod in three- or four-point flexure. */
export function rodFlexureArea(spec: RodFlexure): number {
  const along = spanFactor(spec);
  ensurePositive(spec.diameter, "diameter");
  const R = spec.diameter / 2;
  const m = spec.shape;
  const ratio = Math.exp(logGamma((m + 1) / 2) - logGamma((m + 2) / 2));
  return along * R * Math.sqrt(Math.PI) * ratio;
}

/** Gauge section of a tension specimen: rectangular (width, depth) or round (diameter). */
export type TensionGauge =
  | { gaugeLength: number; width: number; depth: number }
  | { gaugeLength: number; diameter: number };

function checkGauge(g: TensionGauge): void {
  ensurePositive(g.gaugeLength, "gauge length");
  if ("diameter" in g) ensurePositive(g.diameter, "diameter");
  else {
    ensurePositive(g.width, "width");
    ensurePositive(g.depth, "depth");
  }
}

/** Effective volume in uniaxial tension: the gauge volume. */
export function tensionVolume(g: TensionGauge): number {
  checkGauge(g);
  if ("diameter" in g) return (Math.PI * g.diameter * g.diameter * g.gaugeLength) / 4;
  return g.width * g.depth * g.gaugeLength;
}

/** Effective area in uniaxial tension: the gauge section's lateral surface. */
export function tensionArea(g: TensionGauge): number {
  checkGauge(g);
  if ("diameter" in g) return Math.PI * g.diameter * g.gaugeLength;
  return 2 * (g.width + g.depth) * g.gaugeLength;
}
