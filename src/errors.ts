/**
 * Errors the core raises when it cannot give a number, and why.
 *
 * The core knows nothing about cells; it only says what kind of failure it
 * is, and the cell layer picks the code a spreadsheet shows for it:
 *
 * - "input": the caller gave something the formula cannot use (wrong type or
 *   shape, a value outside the domain, too few specimens, mismatched lengths).
 * - "notApplicable": the inputs are fine, but the quantity asked for does not
 *   exist for them (a goodness-of-fit statistic of a censored sample, an
 *   effective size of a part with no tensile stress).
 * - "notRepresentable": the true result exists but lies beyond double
 *   precision (overflows, or underflows to zero).
 * - "notConverged": an iterative solve stopped without meeting its tolerance.
 *
 * Every message is built only when the check fails: pass a function where the
 * text is costly to format or the check sits in a loop.
 */
export type FailureKind = "input" | "notApplicable" | "notRepresentable" | "notConverged";

/** Kept for readers of older code: the kind of an InputError. */
export type InputErrorKind = FailureKind;

export type Message = string | (() => string);

const text = (message: Message): string => (typeof message === "function" ? message() : message);

export class InputError extends Error {
  readonly kind: FailureKind;
  constructor(kind: FailureKind, message: string) {
    super(message);
    this.name = "InputError";
    this.kind = kind;
  }
}

/** Throws an "input" error unless `ok`: the caller's input cannot be used. */
export function ensure(ok: boolean, message: Message): asserts ok {
  if (!ok) throw new InputError("input", text(message));
}

/** Throws a "notApplicable" error unless `ok`: the quantity does not exist for these inputs. */
export function ensureApplicable(ok: boolean, message: Message): asserts ok {
  if (!ok) throw new InputError("notApplicable", text(message));
}

/** Throws a "notConverged" error unless the solve converged. */
export function ensureConverged(converged: boolean, message: Message): void {
  if (!converged) throw new InputError("notConverged", text(message));
}

/**
 * Returns `value` when it is a finite number greater than zero; otherwise
 * throws a "notRepresentable" error saying the quantity is too large or too
 * small to represent. For results that are positive by construction, so 0 can
 * only mean an underflow and Infinity an overflow.
 */
export function ensurePositiveResult(value: number, name: string): number {
  if (value > 0 && value < Infinity) return value;
  // NaN here means an intermediate overflowed against another (Infinity / Infinity, 0 * Infinity).
  throw notRepresentable(name, value === 0 ? "small" : "large");
}

/** Returns `value` when finite; otherwise a "notRepresentable" error. */
export function ensureFiniteResult(value: number, name: string): number {
  if (Number.isFinite(value)) return value;
  // NaN here means an intermediate overflowed against another (Infinity / Infinity, 0 * Infinity).
  throw notRepresentable(name, "large");
}

/** The error for a result too large or too small (nonzero) for double precision. */
export function notRepresentable(name: string, which: "large" | "small"): InputError {
  return new InputError(
    "notRepresentable",
    which === "large"
      ? `the ${name} is too large to represent in double precision`
      : `the ${name} is too small to represent in double precision (it is not zero, but below the smallest double, about 5e-324)`,
  );
}

export function ensurePositive(value: number, name: string): void {
  if (!(Number.isFinite(value) && value > 0)) throw new InputError("input", `${name} must be a positive number (got ${describe(value)})`);
}

export function ensureProbability(value: number, name: string): void {
  if (!(Number.isFinite(value) && value > 0 && value < 1)) {
    throw new InputError("input", `${name} must lie strictly between 0 and 1 (got ${describe(value)})`);
  }
}

/** A number as a message may show it: never "NaN" or "Infinity". */
export function describe(value: number): string {
  if (Number.isNaN(value)) return "not a number";
  if (value === Infinity) return "a number too large to represent";
  if (value === -Infinity) return "a negative number too large to represent";
  return String(value);
}
