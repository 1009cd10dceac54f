/**
 * Multiaxial criteria: how a stress state at a point (principal stresses
 * s1, s2, s3) counts towards the risk of rupture, as a multiple of uniaxial
 * tension at the reference stress. Stresses passed here are already divided
 * by that reference (the peak stress), so a uniaxial point at the peak counts
 * exactly 1 under every criterion, and the integral of the intensity over a
 * body is its effective size referenced to uniaxial tension at the peak.
 *
 * - "PIA" (principle of independent action): <s1>^m + <s2>^m + <s3>^m.
 *   An equibiaxial point at the peak counts 2.
 * - "MAXPRINCIPAL": <max s_i>^m; the other principal stresses are ignored.
 * - "NSA" (Weibull's normal-stress averaging): the mean of <sigma_n>^m over
 *   all crack orientations, normalised so that uniaxial tension counts 1.
 *   Surface form (cracks normal to a free surface, plane stress s1, s2):
 *     k_S (1/pi) int_0^pi <s1 cos^2 psi + s2 sin^2 psi>^m dpsi,
 *     k_S = sqrt(pi) Gamma(m+1) / Gamma(m+1/2).
 *   Volume form (cracks of every orientation):
 *     k_V (1/(4 pi)) int_sphere <s1 l^2 + s2 m^2 + s3 n^2>^m dOmega,  k_V = 2m + 1.
 *   Both constants follow from requiring uniaxial tension to count 1 (checked
 *   by integration in test/size-criteria.test.ts). For plane stress the two
 *   forms agree exactly: with the polar axis along the zero principal stress
 *   the sphere integral separates into int sin^(2m+1) theta dtheta (a beta
 *   function) times the surface form's angular mean, and
 *   (2m+1) B(m+1, 1/2) / 2 = k_S.
 *
 * <x> = max(x, 0): compressive normal stresses do not open cracks.
 *
 * The NSA integrals use fixed Gauss-Legendre rules on the range of angles
 * where the normal stress is tensile, with a change of variable that makes
 * the integrand vanish smoothly at the zero crossing; accuracy is checked
 * against mpmath in test/size-criteria.test.ts.
 */
import { ensurePositive, InputError } from "../errors";
import { logGamma } from "../numeric/gamma";
import { gaussLegendre } from "../numeric/quadrature";

export const CRITERIA = ["PIA", "NSA", "MAXPRINCIPAL"] as const;
export type Criterion = (typeof CRITERIA)[number];

/** Surface flaws see the in-plane stresses of a face; volume flaws the full 3-D state. */
export type FlawForm = "surface" | "volume";

/** A criterion name as a user types it (case and spaces ignored); blank -> "PIA". */
export function parseCriterion(text: string | null | undefined): Criterion {
  if (text === null || text === undefined || text.trim() === "") return "PIA";
  const word = text.trim().toUpperCase().replace(/[\s_-]+/g, "");
  const aliases: Record<string, Criterion> = {
    PIA: "PIA",
    NSA: "NSA",
    MAXPRINCIPAL: "MAXPRINCIPAL",
    MAXIMUMPRINCIPAL: "MAXPRINCIPAL",
  };
  const found = aliases[word];
  if (!found) throw new InputError("input", `criterion "${text}" is not one of "PIA", "NSA", "MAXPRINCIPAL"`);
  return found;
}

/** k_S = sqrt(pi) Gamma(m+1) / Gamma(m+1/2), the surface-form NSA constant. */
export function nsaSurfaceConstant(shape: number): number {
  return Math.exp(0.5 * Math.log(Math.PI) + logGamma(shape + 1) - logGamma(shape + 0.5));
}

/** k_V = 2m + 1, the volume-form NSA constant. */
export function nsaVolumeConstant(shape: number): number {
  return 2 * shape + 1;
}

/** Points per Gauss-Legendre rule: the tensile lobe narrows like 1/sqrt(m), so the rule grows with m. */
function ruleOrder(shape: number): number {
  return Math.min(400, Math.max(16, Math.ceil(12 + 3 * Math.sqrt(shape))));
}

/**
 * Evaluators for one modulus. Build once per table or field (the rules and
 * constants are shared), then call per point.
 */
export class NsaEvaluator {
  readonly shape: number;
  private readonly kS: number;
  private readonly order: number;
  private readonly nodes: Float64Array;
  private readonly weights: Float64Array;

  constructor(shape: number) {
    ensurePositive(shape, "modulus");
    this.shape = shape;
    this.kS = nsaSurfaceConstant(shape);
    this.order = ruleOrder(shape);
    const rule = gaussLegendre(this.order);
    // Map the rule to [0, 1] once.
    this.nodes = rule.nodes.map((x) => 0.5 * (x + 1));
    this.weights = rule.weights.map((w) => 0.5 * w);
  }

  /** Surface form for in-plane principal stresses s1, s2 (divided by the reference stress). */
  surface(s1: number, s2: number): number {
    return this.kS * this.meanOverPlane(s1, s2);
  }

  /** Volume form for principal stresses s1, s2, s3 (divided by the reference stress). */
  volume(s1: number, s2: number, s3: number): number {
    // Sort descending without allocating.
    let a = s1;
    let b = s2;
    let c = s3;
    if (a < b) [a, b] = [b, a];
    if (b < c) [b, c] = [c, b];
    if (a < b) [a, b] = [b, a];
    if (!(a > 0)) return 0;
    // A zero principal stress makes the state plane: the forms coincide (see header).
    if (c === 0) return this.kS * this.meanOverPlane(a, b);
    if (b === 0) return this.kS * this.meanOverPlane(a, c);
    return this.sphere(a, b, c);
  }

  /** (1/pi) int_0^pi <A + B cos phi>^m dphi with A, B the in-plane mean and half-difference. */
  private meanOverPlane(s1: number, s2: number): number {
    const m = this.shape;
    const mean = 0.5 * (s1 + s2);
    const half = 0.5 * Math.abs(s1 - s2);
    if (half === 0) return mean > 0 ? Math.pow(mean, m) : 0;
    if (mean <= -half) return 0;
    const n = this.order;
    const t = this.nodes;
    const w = this.weights;
    let sum = 0;
    if (mean >= half) {
      // Tensile at every angle: plain rule on [0, pi].
      for (let i = 0; i < n; i++) {
        const base = mean + half * Math.cos(Math.PI * t[i]);
        if (base > 0) sum += w[i] * Math.pow(base, m);
      }
      return sum;
    }
    // Tensile for phi < phi0; phi = phi0 t (2 - t) flattens the zero at phi0.
    const phi0 = Math.acos(-mean / half);
    for (let i = 0; i < n; i++) {
      const u = t[i];
      const base = mean + half * Math.cos(phi0 * u * (2 - u));
      if (base > 0) sum += w[i] * Math.pow(base, m) * 2 * (1 - u);
    }
    return (sum * phi0) / Math.PI;
  }

  /**
   * k_V/(4 pi) over the sphere for a >= b >= c, a > 0, none zero. Polar axis
   * along c: sigma_n = p(phi)(1 - u^2) + c u^2 with p = a cos^2 phi + b sin^2 phi,
   * and by symmetry phi in [0, pi/2], u in [0, 1] (factor 8).
   */
  private sphere(a: number, b: number, c: number): number {
    const m = this.shape;
    const n = this.order;
    const t = this.nodes;
    const w = this.weights;
    // Outer range: p > 0 for phi < phiC (when b < 0).
    const phiC = b >= 0 ? Math.PI / 2 : Math.atan(Math.sqrt(a / -b));
    const flattenOuter = b < 0;
    let outer = 0;
    for (let i = 0; i < n; i++) {
      const v = t[i];
      const phi = flattenOuter ? phiC * v * (2 - v) : phiC * v;
      const jacobian = flattenOuter ? 2 * (1 - v) : 1;
      const cos2 = Math.cos(phi) ** 2;
      const p = a * cos2 + b * (1 - cos2);
      if (!(p > 0)) continue;
      let inner = 0;
      if (c >= 0) {
        for (let j = 0; j < n; j++) {
          const u = t[j];
          const base = p - (p - c) * u * u;
          inner += w[j] * Math.pow(base, m);
        }
      } else {
        const u1 = Math.sqrt(p / (p - c));
        for (let j = 0; j < n; j++) {
          const s = t[j];
          const u = u1 * s * (2 - s);
          const base = p - (p - c) * u * u;
          if (base > 0) inner += w[j] * Math.pow(base, m) * 2 * (1 - s);
        }
        inner *= u1;
      }
      outer += w[i] * jacobian * inner;
    }
    return nsaVolumeConstant(m) * (2 / Math.PI) * phiC * outer;
  }
}

/** A point intensity for one criterion, form and modulus: build once, call per point. */
export type Intensity = (s1: number, s2: number, s3: number) => number;

export function makeIntensity(criterion: Criterion, shape: number, form: FlawForm): Intensity {
  ensurePositive(shape, "modulus");
  const m = shape;
  switch (criterion) {
    case "PIA":
      return (s1, s2, s3) =>
        (s1 > 0 ? Math.pow(s1, m) : 0) + (s2 > 0 ? Math.pow(s2, m) : 0) + (s3 > 0 ? Math.pow(s3, m) : 0);
    case "MAXPRINCIPAL":
      return (s1, s2, s3) => {
        const top = Math.max(s1, s2, s3);
        return top > 0 ? Math.pow(top, m) : 0;
      };
    case "NSA": {
      const nsa = new NsaEvaluator(shape);
      return form === "surface" ? (s1, s2) => nsa.surface(s1, s2) : (s1, s2, s3) => nsa.volume(s1, s2, s3);
    }
  }
}
