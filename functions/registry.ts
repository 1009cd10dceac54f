/**
 * Every cell function the add-in registers, by the name users type after
 * "BRITTLE.", grouped in families as the README lists them. Each family file
 * exports only adapters; add a family with one import and one entry below.
 * Hosts register `guarded`, never the raw adapters.
 */
import { guard, type CellResult } from "./cells";
import * as loadStrength from "./load-strength";
import * as material from "./material";
import * as size from "./size";
import * as strength from "./strength";
import * as time from "./time";
import * as uncertainty from "./uncertainty";

type Adapter = (...args: any[]) => unknown;

export const families: { title: string; adapters: Record<string, Adapter> }[] = [
  { title: "Strength from breaking load and specimen dimensions", adapters: loadStrength },
  { title: "Fitting strength data and designing with the fit", adapters: strength },
  { title: "Confidence bounds, fit quality, flaw populations and lot checks", adapters: uncertainty },
  { title: "Effective volume and area: specimens, fixtures and parts", adapters: size },
  { title: "Slow crack growth, lifetime and proof testing", adapters: time },
  { title: "One material across specimen geometries, and test planning", adapters: material },
];

export const adapters: Record<string, Adapter> = Object.assign({}, ...families.map((f) => f.adapters));

export const guarded: Record<string, (...args: any[]) => CellResult> = Object.fromEntries(
  Object.entries(adapters).map(([name, fn]) => [name, guard(fn)]),
);
