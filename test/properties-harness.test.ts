// A test of the property harness itself: the same properties that
// properties-cells.test.ts runs over every function must fail when an adapter
// is broken. Each case swaps one registered adapter for a broken one (before
// the engine registers its plugin, through a switchable stand-in), runs the
// property with a fixed seed, and expects it to report the fault; the same
// seed passes with the real adapter, so the failure comes from the fault.
//
// Safe to mutate the registry here: vitest runs each test file in its own
// module graph (isolate: true), and every swap is undone after its test.
import fc from "fast-check";
import { afterEach, beforeAll, describe, expect, it } from "vitest";
import { isCellFailure } from "../functions/cells";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { adapters, guarded } from "../functions/registry";
import { chaosCall, policyCase } from "./properties-arbitraries";
import { assertNone, checkChaos, checkHost, checkPolicy, newCounts } from "./properties-policy";

type Impl = (...args: unknown[]) => unknown;
const real: Record<string, Impl> = { ...guarded };
const current: Record<string, Impl> = { ...guarded };
// The engine captures guarded[id] when it registers: give it a stand-in that calls whatever is current.
for (const id of Object.keys(guarded)) guarded[id] = ((...args: unknown[]) => current[id](...args)) as (typeof guarded)[string];

let metadata: FunctionMetadata[];
const fn = (id: string) => metadata.find((f) => f.id === id)!;
beforeAll(async () => {
  metadata = (await generateMetadata()).functions;
});
afterEach(() => Object.assign(current, real));

const SEED = { seed: 20261201, numRuns: 30 };

/** What fc.assert reported: its own message and the problem list it carries as the cause ("" when it passed). */
function failureOf(property: fc.IRawProperty<any>): string {
  try {
    fc.assert(property, SEED);
    return "";
  } catch (error) {
    const e = error as Error & { cause?: unknown };
    return `${e.message}\n${e.cause instanceof Error ? e.cause.message : String(e.cause ?? "")}`;
  }
}

function engineProperty(id: string) {
  return fc.property(fc.array(chaosCall(fn(id)), { minLength: 12, maxLength: 12 }), (calls) => assertNone(checkChaos(calls, metadata, newCounts())));
}
function hostProperty(id: string) {
  return fc.property(chaosCall(fn(id)), (call) => assertNone(checkHost(call, fn(id), guarded[id] as Impl, newCounts())));
}
function policyProperty(id: string) {
  return fc.property(policyCase(fn(id))!, (pc) => assertNone(checkPolicy(pc, metadata, newCounts())));
}

describe("the properties fail on a broken adapter", () => {
  it("NaN from a scalar function: the host property sees NaN, the engine property sees the engine's #NUM! for it", () => {
    // The bug: a guard left out, so a NaN from the mathematics reaches the cell.
    current.FAILPROB = (stress, modulus, charStrength) => {
      const r = real.FAILPROB(stress, modulus, charStrength);
      return typeof r === "number" && r > 0.5 ? NaN : r;
    };
    expect(failureOf(hostProperty("FAILPROB"))).toMatch(/returned NaN/);
    expect(failureOf(engineProperty("FAILPROB"))).toMatch(/returned NaN or Infinity \(the engine shows #NUM!\)/);
    Object.assign(current, real);
    expect(failureOf(hostProperty("FAILPROB"))).toBe("");
    expect(failureOf(engineProperty("FAILPROB"))).toBe("");
  });

  it("NaN inside a spilled array reaches a cell: the engine property reports the cell", () => {
    current.FITQUALITY = (...args) => {
      const r = real.FITQUALITY(...args);
      return Array.isArray(r) ? [[NaN, r[0][1]]] : r;
    };
    expect(failureOf(engineProperty("FITQUALITY"))).toMatch(/non-finite NaN|non-finite number in a cell/);
    expect(failureOf(hostProperty("FITQUALITY"))).toMatch(/NaN, Infinity or a non-cell value/);
  });

  it("an unguarded adapter that throws: both properties report it", () => {
    current.MODULUS = adapters.MODULUS as Impl; // the raw adapter throws CellError on bad cells
    expect(failureOf(engineProperty("MODULUS"))).toMatch(/an adapter threw: internal error/);
    expect(failureOf(hostProperty("MODULUS"))).toMatch(/the guarded adapter threw/);
  });

  it("the wrong error for a value outside the documented domain: the one-fault property reports it", () => {
    current.DESIGNSTRESS = (...args) => {
      const r = real.DESIGNSTRESS(...args);
      return isCellFailure(r) && r.cellError === "#VALUE!" ? { cellError: "#N/A", message: r.message } : r;
    };
    expect(failureOf(policyProperty("DESIGNSTRESS"))).toMatch(/expected #VALUE!, got "#N\/A"/);
    Object.assign(current, real);
    expect(failureOf(policyProperty("DESIGNSTRESS"))).toBe("");
  });

  it("#NUM! for a bad input (its message lost in the host): the engine property reports it", () => {
    current.FAILPROB = (...args) => {
      const r = real.FAILPROB(...args);
      return isCellFailure(r) && r.cellError === "#VALUE!" ? { cellError: "#NUM!", message: r.message } : r;
    };
    expect(failureOf(engineProperty("FAILPROB"))).toMatch(/#NUM! for something other than a result beyond double precision/);
    Object.assign(current, real);
    expect(failureOf(engineProperty("FAILPROB"))).toBe("");
  });

  it("a blank cell read as a tiny strength: the blank-row property reports the changed result", () => {
    current.CHARSTRENGTH = (strengths, ...rest) =>
      real.CHARSTRENGTH(Array.isArray(strengths) ? strengths.map((row: unknown[]) => row.map((v) => (v === null || v === "" ? 1e-3 : v))) : strengths, ...rest);
    expect(failureOf(policyProperty("CHARSTRENGTH"))).toMatch(/expected the baseline's result/);
  });

  it("text in a range accepted as a number: the one-fault property reports the missing #VALUE!", () => {
    current.MODULUS = (strengths, ...rest) =>
      real.MODULUS(Array.isArray(strengths) ? strengths.map((row: unknown[]) => row.map((v) => (typeof v === "string" && v.trim() ? 0 : v))) : strengths, ...rest);
    expect(failureOf(policyProperty("MODULUS"))).toMatch(/expected #VALUE!, got \d/);
  });
});
