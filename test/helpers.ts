import { readFileSync } from "node:fs";
import { join } from "node:path";

export function fixture<T = any>(name: string): T {
  return JSON.parse(readFileSync(join(import.meta.dirname, "fixtures", name), "utf8")) as T;
}

/** |a - b| / |b|, or |a - b| when b is 0. */
export function relativeError(a: number, b: number): number {
  return b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b);
}
