/**
 * Errors the core raises for inputs outside a formula's domain.
 *
 * The core knows nothing about cells; it only says *why* an input cannot be
 * used. `kind` tells an adapter which spreadsheet error fits: "value" for
 * input of the wrong type or shape, "num" for a number outside the domain.
 */
export type InputErrorKind = "value" | "num";

export class InputError extends Error {
  readonly kind: InputErrorKind;
  constructor(kind: InputErrorKind, message: string) {
    super(message);
    this.name = "InputError";
    this.kind = kind;
  }
}

/** Throws a domain ("num") error unless `ok`. */
export function require(ok: boolean, message: string): asserts ok {
  if (!ok) throw new InputError("num", message);
}

export function requirePositive(value: number, name: string): void {
  require(Number.isFinite(value) && value > 0, `${name} must be a positive number (got ${value})`);
}

export function requireProbability(value: number, name: string): void {
  require(Number.isFinite(value) && value > 0 && value < 1, `${name} must lie strictly between 0 and 1 (got ${value})`);
}
