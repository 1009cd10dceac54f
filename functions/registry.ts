/**
 * Every cell function the add-in registers, by the name users type after
 * "BRITTLE.". Each family file exports only adapters; add a family with one
 * import and one spread. Hosts register `guarded`, never the raw adapters.
 */
import { guard, type CellResult } from "./cells";
import * as strength from "./strength";

type Adapter = (...args: any[]) => unknown;

export const adapters: Record<string, Adapter> = {
  ...strength,
};

export const guarded: Record<string, (...args: any[]) => CellResult> = Object.fromEntries(
  Object.entries(adapters).map(([name, fn]) => [name, guard(fn)]),
);
