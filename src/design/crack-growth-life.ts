/**
 * Lifetime under slow crack growth, from the power-law crack velocity
 *
 *   da/dt = A (K_I / K_IC)^n,   K_I = Y s sqrt(a),
 *
 * with A the velocity at K_I = K_IC, Y the crack geometry factor and n the
 * crack-growth exponent. Separating variables from the initial crack a_i
 * (inert strength s_i = K_IC / (Y sqrt(a_i))) to the crack a(t) gives, for
 * any tensile stress history s(t),
 *
 *   B (s_i^(n-2) - S(t)^(n-2)) = integral_0^t s(u)^n du,
 *   B = 2 K_IC^2 / (A Y^2 (n - 2)),
 *
 * where S(t) = K_IC / (Y sqrt(a(t))) is the strength that remains; the part
 * fails when S falls to the stress it carries. (Derived here; the B relation
 * matches docs/methods.md section 7, and test/time-life.test.ts checks it against
 * a numerical integration of the ODE.) Hence
 *
 *   constant stress s:     t_f = B s^(-n) (s_i^(n-2) - s^(n-2))
 *   constant rate sdot:    s_f^(n+1) = B (n+1) sdot (s_i^(n-2) - s_f^(n-2))
 *
 * The usual closed forms drop the second term (s/s_i)^(n-2), which is small
 * once a crack has grown well beyond its initial size; the rate-based
 * relations here, which need no B, use that approximation. The relations that
 * take B keep the exact form. Requires n > 2 throughout: B is undefined at
 * n = 2, and measured exponents of ceramics and glasses are well above that.
 *
 * Limits of the model: the power law describes one region of the v-K curve.
 * n and A change with environment (water, humidity, temperature); an n
 * fitted over a narrow range of rates or times may not hold far outside it:
 * a threshold below which cracks stop growing makes long-life predictions
 * conservative, a v-K curve that flattens at low K makes them unconservative.
 * Materials with a rising crack-growth resistance (R-curve: Y-TZP, some
 * silicon nitrides) do not follow it.
 */
import { ensure, ensurePositive, ensurePositiveResult } from "../errors";

export function checkExponent(n: number): void {
  ensure(Number.isFinite(n) && n > 2, () => `the crack-growth exponent n must be greater than 2 (got ${n})`);
}

/**
 * Every quantity here is positive by construction (it is exp of a finite
 * logarithm), so 0 means an underflow and Infinity an overflow: both are
 * errors, never a number in a cell.
 */
function finite(value: number, name: string): number {
  return ensurePositiveResult(value, name);
}

/**
 * B = 2 K_IC^2 / (A Y^2 (n - 2)). Units: with K_IC in MPa m^0.5 and A in m/s,
 * B is in MPa^2 s.
 */
export function crackGrowthB({
  n,
  velocityCoefficient,
  toughness,
  geometryFactor,
}: {
  n: number;
  /** A: crack velocity at K_I = K_IC (length per time). */
  velocityCoefficient: number;
  /** K_IC: fracture toughness (stress times square root of length). */
  toughness: number;
  /** Y: crack geometry factor in K_I = Y s sqrt(a), e.g. about 1.12 sqrt(pi) for a shallow edge crack. */
  geometryFactor: number;
}): number {
  checkExponent(n);
  ensurePositive(velocityCoefficient, "crack velocity coefficient");
  ensurePositive(toughness, "fracture toughness");
  ensurePositive(geometryFactor, "geometry factor");
  const logB =
    Math.LN2 + 2 * Math.log(toughness) - Math.log(velocityCoefficient) - 2 * Math.log(geometryFactor) - Math.log(n - 2);
  return finite(Math.exp(logB), "B parameter");
}

/**
 * B from a constant stress-rate fit and the inert strength at the same
 * failure probability: D^(n+1) = B (n+1) s_i^(n-2), from s_f^(n+1) = D^(n+1) sdot.
 */
export function crackGrowthBFromStressRateFit({
  D,
  n,
  inertStrength,
}: {
  D: number;
  n: number;
  inertStrength: number;
}): number {
  checkExponent(n);
  ensurePositive(D, "D");
  ensurePositive(inertStrength, "inert strength");
  const logB = (n + 1) * Math.log(D) - Math.log(n + 1) - (n - 2) * Math.log(inertStrength);
  return finite(Math.exp(logB), "B parameter");
}

/**
 * B from a static-fatigue fit and the inert strength at the same failure
 * probability: D_s = B s_i^(n-2), from t_f = D_s s^(-n).
 */
export function crackGrowthBFromStaticFit({
  log10D,
  n,
  inertStrength,
}: {
  log10D: number;
  n: number;
  inertStrength: number;
}): number {
  checkExponent(n);
  ensure(Number.isFinite(log10D), () => `log10 D must be a finite number (got ${log10D})`);
  ensurePositive(inertStrength, "inert strength");
  const logB = log10D * Math.LN10 - (n - 2) * Math.log(inertStrength);
  return finite(Math.exp(logB), "B parameter");
}

/**
 * Time to failure at constant stress of a flaw with inert strength s_i, exact
 * for the power law: t_f = B s_i^(n-2) s^(-n) (1 - (s/s_i)^(n-2)). Zero when
 * the stress reaches the inert strength (the part breaks on loading).
 */
export function timeToFailureFromInertStrength({
  stress,
  inertStrength,
  n,
  B,
}: {
  stress: number;
  inertStrength: number;
  n: number;
  B: number;
}): number {
  checkExponent(n);
  ensurePositive(stress, "stress");
  ensurePositive(inertStrength, "inert strength");
  ensurePositive(B, "B parameter");
  if (stress >= inertStrength) return 0;
  // ln(s/s_i) through log1p of an exact difference, and 1 - (s/s_i)^(n-2) through
  // expm1: both keep their digits when the stress is close to s_i.
  const logRatio = Math.log1p((stress - inertStrength) / inertStrength);
  const remaining = -Math.expm1((n - 2) * logRatio);
  const logTime = Math.log(B) + (n - 2) * Math.log(inertStrength) - n * Math.log(stress) + Math.log(remaining);
  return finite(Math.exp(logTime), "time to failure");
}

/**
 * Inert strength a flaw needs to survive a constant stress s for a time t,
 * exact for the power law: s_i = s (1 + t s^2 / B)^(1/(n-2)). This is also the
 * proof stress that guarantees the time t at service stress s.
 */
export function inertStrengthToSurvive({
  stress,
  duration,
  n,
  B,
}: {
  stress: number;
  duration: number;
  n: number;
  B: number;
}): number {
  checkExponent(n);
  ensurePositive(stress, "stress");
  ensurePositive(duration, "duration");
  ensurePositive(B, "B parameter");
  // log1p keeps short durations (t s^2 << B) exact.
  const logGrowth = Math.log1p(Math.exp(Math.log(duration) + 2 * Math.log(stress) - Math.log(B)));
  return finite(stress * Math.exp(logGrowth / (n - 2)), "inert strength");
}

/**
 * Time to failure under a constant stress, for a part whose strength at the
 * stress rate `stressRate` is `strength` (same failure probability):
 * t_f = s_f^(n+1) / ((n+1) sdot s^n). Needs no B; uses the usual approximation
 * that the strength left at failure is far below the inert strength.
 */
export function timeToFailure({
  stress,
  strength,
  stressRate,
  n,
}: {
  stress: number;
  strength: number;
  stressRate: number;
  n: number;
}): number {
  checkExponent(n);
  ensurePositive(stress, "stress");
  ensurePositive(strength, "strength");
  ensurePositive(stressRate, "stress rate");
  const logTime = Math.log(strength / stressRate) - Math.log(n + 1) + n * Math.log(strength / stress);
  return finite(Math.exp(logTime), "time to failure");
}

/**
 * The constant stress that gives, over `lifetime`, the same failure
 * probability as `strength` does at the stress rate `stressRate`:
 * s = s_f (s_f / ((n+1) sdot t))^(1/n). Same approximation as timeToFailure,
 * whose inverse it is.
 */
export function lifetimeStress({
  strength,
  stressRate,
  n,
  lifetime,
}: {
  strength: number;
  stressRate: number;
  n: number;
  lifetime: number;
}): number {
  checkExponent(n);
  ensurePositive(strength, "strength");
  ensurePositive(stressRate, "stress rate");
  ensurePositive(lifetime, "lifetime");
  const logRatio = Math.log(strength / stressRate) - Math.log(n + 1) - Math.log(lifetime);
  return finite(strength * Math.exp(logRatio / n), "lifetime stress");
}
