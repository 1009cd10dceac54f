import { readFileSync } from "node:fs";
import { expect } from "vitest";
import { InputError, type FailureKind } from "../src/errors";
import { join } from "node:path";

export function fixture<T = any>(name: string): T {
  return JSON.parse(readFileSync(join(import.meta.dirname, "fixtures", name), "utf8")) as T;
}

/** |a - b| / |b|, or |a - b| when b is 0. */
export function relativeError(a: number, b: number): number {
  return b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b);
}

/** Expects `fn` to throw the core's InputError of the given kind ("input": the caller's input cannot be used). */
export function expectInputError(fn: () => unknown, kind: FailureKind = "input"): void {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).kind).toBe(kind);
    return;
  }
  throw new Error(`expected an InputError of kind "${kind}"`);
}

/** Counts the draws of a SeededRandom class (the one of the module graph under test) until `restore()`. */
export function countDraws(SeededRandom: { prototype: { uniform(): number } }): { count: () => number; restore: () => void } {
  const original = SeededRandom.prototype.uniform;
  let draws = 0;
  SeededRandom.prototype.uniform = function (this: unknown) {
    draws++;
    return original.call(this);
  };
  return { count: () => draws, restore: () => void (SeededRandom.prototype.uniform = original) };
}
