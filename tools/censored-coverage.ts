/**
 * Coverage of the censored-sample bounds under competing flaw populations,
 * with the truth known by construction: population A (the one fitted) and a
 * censoring population B, independent Weibull; each specimen breaks from the
 * weaker of its two draws and is censored for A when B broke first. The
 * bounds are computed exactly as a cell computes them (parameterBounds,
 * designStressBound), and we count how often they contain the true values.
 *
 * Used by tools/simulate_censored_coverage.ts (the committed record) and by
 * test/uncertainty-censored-coverage.test.ts (a smaller seeded run).
 */
import { SeededRandom } from "../src/numeric/random";
import { parameterBounds } from "../src/weibull/confidence-bounds";
import { designStressBound } from "../src/weibull/design-stress-bound";
import { findRoot } from "../src/numeric/roots";

export interface CoverageCase {
  specimens: number;
  /** Probability that a specimen breaks from B (is censored for A). */
  censoredFraction: number;
  /** Modulus of B; A is m 10, th 400. */
  otherShape: number;
  samples: number;
  seed: number;
}

export interface CoverageResult extends CoverageCase {
  otherScale: number;
  /** Samples drawn in all (those with fewer than 2 A-failures or no censored specimen are redrawn). */
  drawn: number;
  /** Samples whose bounds could not be computed (counted as not covering). */
  refused: number;
  meanCensoredFraction: number;
  /** Coverage of the 90 % two-sided modulus interval, and its binomial standard error. */
  modulus: { coverage: number; se: number; belowLower: number; aboveUpper: number };
  charStrength: { coverage: number; se: number; belowLower: number; aboveUpper: number };
  /** Coverage of the 95 % one-sided lower bound on the design stress at survival 0.999, size ratio 10. */
  designStress: { coverage: number; se: number };
}

export const TRUTH = { shape: 10, scale: 400 };
export const DESIGN = { survival: 0.999, sizeRatio: 10 };
export const TRUE_DESIGN_STRESS = TRUTH.scale * Math.pow(-Math.log(DESIGN.survival) / DESIGN.sizeRatio, 1 / TRUTH.shape);

/** Scale of B that makes P(B breaks first) = fraction, by quadrature-free root finding on ln th_B. */
export function otherScaleFor(fraction: number, otherShape: number): number {
  // P(b < a) = E_a[1 - exp(-(a/th_B)^m_B)], a ~ Weibull(10, 400): Gauss-Laguerre-free midpoint sum over u = (a/400)^10.
  const pOther = (logScale: number) => {
    const k = 4000;
    let sum = 0;
    for (let j = 0; j < k; j++) {
      const p = (j + 0.5) / k; // a at failure probability p
      const a = TRUTH.scale * Math.pow(-Math.log1p(-p), 1 / TRUTH.shape);
      sum += -Math.expm1(-Math.pow(a / Math.exp(logScale), otherShape));
    }
    return sum / k;
  };
  const r = findRoot((u) => pOther(u) - fraction, Math.log(TRUTH.scale) - 5, Math.log(TRUTH.scale) + 5, { relativeTolerance: 1e-10 });
  return Math.exp(r.root);
}

function weibull(random: SeededRandom, shape: number, scale: number): number {
  return scale * Math.pow(random.exponential(), 1 / shape);
}

export function measureCoverage(c: CoverageCase): CoverageResult {
  const otherScale = otherScaleFor(c.censoredFraction, c.otherShape);
  const random = new SeededRandom(c.seed);
  let drawn = 0;
  let refused = 0;
  let censoredTotal = 0;
  const hits = { m: 0, mLow: 0, mHigh: 0, th: 0, thLow: 0, thHigh: 0, x: 0 };
  for (let k = 0; k < c.samples; ) {
    drawn++;
    const strengths: number[] = [];
    const censored: boolean[] = [];
    for (let i = 0; i < c.specimens; i++) {
      const a = weibull(random, TRUTH.shape, TRUTH.scale);
      const b = weibull(random, c.otherShape, otherScale);
      strengths.push(Math.min(a, b));
      censored.push(b < a);
    }
    const r = censored.filter(Boolean).length;
    if (r === 0 || c.specimens - r < 2) continue; // complete samples use the exact table; < 2 failures: no fit
    k++;
    censoredTotal += r / c.specimens;
    try {
      const bounds = parameterBounds({ strengths, censored, confidence: 0.9, sides: 2 });
      if (TRUTH.shape < bounds.shape.lower) hits.mLow++;
      else if (TRUTH.shape > bounds.shape.upper) hits.mHigh++;
      else hits.m++;
      if (TRUTH.scale < bounds.scale.lower) hits.thLow++;
      else if (TRUTH.scale > bounds.scale.upper) hits.thHigh++;
      else hits.th++;
      const x = designStressBound({ strengths, censored, survival: DESIGN.survival, sizeRatio: DESIGN.sizeRatio, confidence: 0.95 });
      if (x.lower <= TRUE_DESIGN_STRESS) hits.x++;
    } catch {
      refused++;
    }
  }
  const n = c.samples;
  const share = (h: number) => h / n;
  const se = (p: number, level: number) => Math.sqrt((level * (1 - level)) / n) || Math.sqrt((p * (1 - p)) / n);
  return {
    ...c,
    otherScale,
    drawn,
    refused,
    meanCensoredFraction: censoredTotal / n,
    modulus: { coverage: share(hits.m), se: se(share(hits.m), 0.9), belowLower: share(hits.mLow), aboveUpper: share(hits.mHigh) },
    charStrength: { coverage: share(hits.th), se: se(share(hits.th), 0.9), belowLower: share(hits.thLow), aboveUpper: share(hits.thHigh) },
    designStress: { coverage: share(hits.x), se: se(share(hits.x), 0.95) },
  };
}
