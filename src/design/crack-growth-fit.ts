/**
 * Slow-crack-growth parameters from fatigue tests, by least-squares lines on
 * log10-log10 axes.
 *
 * Constant stress rate (dynamic fatigue, ASTM C1368):
 *   log10 s_f = alpha log10 sdot + log10 D,   alpha = 1/(n+1),  n = 1/alpha - 1.
 * Strength s_f is the dependent variable and every specimen is one point (the
 * rate is the controlled variable).
 *
 * Constant stress (static fatigue, ASTM C1576):
 *   log10 t_f = -n log10 s + log10 D_s.
 * Time to failure is the dependent variable; run-outs (specimens that did not
 * break) are not failures and must be left out of this fit.
 *
 * Confidence bounds on n come from the two-sided Student t interval on the
 * regression slope, alpha +/- t_{(1+c)/2, N-2} se(alpha), mapped through
 * n = 1/alpha - 1 (a decreasing map, so the upper slope bound gives the lower
 * n). When the lower slope bound is at or below zero the data cannot bound n
 * from above: nUpper is null.
 */
import { ensure, InputError, describe } from "../errors";
import { CompensatedSum } from "../numeric/sum";
import { studentQuantile } from "../numeric/student-t";

/** ASTM C1368 asks for at least four rates spanning three decades or more [memory of the standard's wording]. */
export const MINIMUM_DECADES = 3;
export const MINIMUM_LEVELS = 4;

export interface LineFit {
  slope: number;
  intercept: number;
  slopeStandardError: number;
  /** Two-sided Student t quantile used for the slope interval. */
  tQuantile: number;
  rSquared: number;
  points: number;
}

export interface StressRateFit {
  n: number;
  /** D in s_f = D sdot^(1/(n+1)): strength at unit stress rate, in the data's units. */
  D: number;
  line: LineFit;
  confidence: number;
  nLower: number;
  /** null when the data do not bound n from above (slope interval reaches zero). */
  nUpper: number | null;
  specimens: number;
  distinctRates: number;
  /** log10(largest rate / smallest rate). */
  decades: number;
  /** True when the rates span fewer than three decades (ASTM C1368 asks for three or more). */
  narrowSpan: boolean;
  /** True when fewer than four distinct rates were tested. */
  fewRates: boolean;
  /** Whether the t quantile solve converged. */
  converged: boolean;
}

export interface StaticFatigueFit {
  n: number;
  /** log10 D_s in t_f = D_s s^(-n); D_s itself overflows doubles for realistic n. */
  log10D: number;
  line: LineFit;
  confidence: number;
  nLower: number;
  nUpper: number;
  specimens: number;
  distinctStresses: number;
  /** log10(longest / shortest time to failure). */
  timeDecades: number;
  /** True when the failure times span fewer than three decades (convention carried over from C1368). */
  narrowSpan: boolean;
  /** True when fewer than four distinct stresses were tested. */
  fewStresses: boolean;
  converged: boolean;
}

/** ASTM C1368 constant stress-rate fit of strengths against stress rates. */
export function fitStressRate({
  stressRates,
  strengths,
  confidence = 0.95,
}: {
  stressRates: readonly number[];
  strengths: readonly number[];
  confidence?: number;
}): StressRateFit {
  const pairs = checkPairs(stressRates, strengths, "stress rate", "strength");
  checkConfidence(confidence);
  const x = pairs.map(([r]) => Math.log10(r));
  const y = pairs.map(([, s]) => Math.log10(s));
  const { line, converged } = fitLine(x, y, confidence, "stress rates");
  ensure(
    line.slope > 0,
    "strength does not rise with stress rate (slope <= 0): these data do not resolve slow crack growth, so n cannot be estimated",
  );
  const halfWidth = line.tQuantile * line.slopeStandardError;
  const slopeLower = line.slope - halfWidth;
  const slopeUpper = line.slope + halfWidth;
  const rates = pairs.map(([r]) => r);
  const decades = Math.log10(largest(rates) / smallest(rates));
  const distinctRates = new Set(rates).size;
  return {
    n: 1 / line.slope - 1,
    D: Math.pow(10, line.intercept),
    line,
    confidence,
    nLower: 1 / slopeUpper - 1,
    nUpper: slopeLower > 0 ? 1 / slopeLower - 1 : null,
    specimens: pairs.length,
    distinctRates,
    decades,
    narrowSpan: decades < MINIMUM_DECADES,
    fewRates: distinctRates < MINIMUM_LEVELS,
    converged,
  };
}

/** ASTM C1576 static-fatigue fit of times to failure against constant stresses. */
export function fitStaticFatigue({
  stresses,
  lifetimes,
  confidence = 0.95,
}: {
  stresses: readonly number[];
  lifetimes: readonly number[];
  confidence?: number;
}): StaticFatigueFit {
  const pairs = checkPairs(stresses, lifetimes, "stress", "time to failure");
  checkConfidence(confidence);
  const x = pairs.map(([s]) => Math.log10(s));
  const y = pairs.map(([, t]) => Math.log10(t));
  const { line, converged } = fitLine(x, y, confidence, "stresses");
  ensure(
    line.slope < 0,
    "time to failure does not fall with stress (slope >= 0): these data do not resolve slow crack growth, so n cannot be estimated",
  );
  const halfWidth = line.tQuantile * line.slopeStandardError;
  const times = pairs.map(([, t]) => t);
  const timeDecades = Math.log10(largest(times) / smallest(times));
  const distinctStresses = new Set(pairs.map(([s]) => s)).size;
  return {
    n: -line.slope,
    log10D: line.intercept,
    line,
    confidence,
    nLower: -line.slope - halfWidth,
    nUpper: -line.slope + halfWidth,
    specimens: pairs.length,
    distinctStresses,
    timeDecades,
    narrowSpan: timeDecades < MINIMUM_DECADES,
    fewStresses: distinctStresses < MINIMUM_LEVELS,
    converged,
  };
}

function checkPairs(
  xs: readonly number[],
  ys: readonly number[],
  xName: string,
  yName: string,
): Array<[number, number]> {
  if (xs.length !== ys.length) {
    throw new InputError("input", `the ${xName}s (${xs.length}) and ${yName}s (${ys.length}) must have the same length`);
  }
  const pairs: Array<[number, number]> = [];
  for (let i = 0; i < xs.length; i++) {
    // Test first, build the message only on failure (no closure per specimen either).
    if (!(Number.isFinite(xs[i]) && xs[i] > 0)) throw new InputError("input", `${xName} ${i + 1} must be a positive number (got ${describe(xs[i])})`);
    if (!(Number.isFinite(ys[i]) && ys[i] > 0)) throw new InputError("input", `${yName} ${i + 1} must be a positive number (got ${describe(ys[i])})`);
    pairs.push([xs[i], ys[i]]);
  }
  // N - 2 degrees of freedom for the slope interval need at least three points.
  ensure(pairs.length >= 3, () => `a fatigue fit needs at least three specimens (got ${pairs.length})`);
  return pairs;
}

function checkConfidence(confidence: number): void {
  ensure(
    Number.isFinite(confidence) && confidence > 0 && confidence < 1,
    () => `confidence must lie strictly between 0 and 1 (got ${confidence})`,
  );
}

/** Ordinary least squares of y on x, centred first so large logs do not cancel. */
function fitLine(
  x: readonly number[],
  y: readonly number[],
  confidence: number,
  levelName: string,
): { line: LineFit; converged: boolean } {
  const n = x.length;
  const xMean = mean(x);
  const yMean = mean(y);
  const sxx = new CompensatedSum();
  const sxy = new CompensatedSum();
  const syy = new CompensatedSum();
  for (let i = 0; i < n; i++) {
    const dx = x[i] - xMean;
    const dy = y[i] - yMean;
    sxx.add(dx * dx);
    sxy.add(dx * dy);
    syy.add(dy * dy);
  }
  ensure(sxx.value > 0, () => `a fatigue fit needs at least two different ${levelName}`);
  const slope = sxy.value / sxx.value;
  const intercept = yMean - slope * xMean;
  const residuals = new CompensatedSum();
  for (let i = 0; i < n; i++) {
    const r = y[i] - intercept - slope * x[i];
    residuals.add(r * r);
  }
  const sse = residuals.value;
  const slopeStandardError = Math.sqrt(sse / (n - 2) / sxx.value);
  const t = studentQuantile(0.5 + confidence / 2, n - 2);
  const rSquared = syy.value > 0 ? Math.max(0, 1 - sse / syy.value) : 1;
  return {
    line: { slope, intercept, slopeStandardError, tQuantile: t.value, rSquared, points: n },
    converged: t.converged,
  };
}

function mean(values: readonly number[]): number {
  const acc = new CompensatedSum();
  for (const v of values) acc.add(v);
  return acc.value / values.length;
}

// Loops, not Math.max(...values): spreading a full column of values overflows the call stack.
function largest(values: readonly number[]): number {
  let m = -Infinity;
  for (const v of values) if (v > m) m = v;
  return m;
}

function smallest(values: readonly number[]): number {
  let m = Infinity;
  for (const v of values) if (v < m) m = v;
  return m;
}
