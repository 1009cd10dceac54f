// Property tests of the cell policy (DESIGN.md "One policy for cells") over
// every registered function, generated from functions.json: a function added
// to the registry is covered here with no edit. Three properties each:
//
// 1. any cells through the embedded engine: no crash, no NaN or Infinity in any
//    cell, only the policy's errors (or errors passed through from inputs),
//    each with a message, #NUM! only for a result beyond double precision or a
//    solve that did not converge, and no adapter ever throws;
// 2. the same through the guarded adapter, with the values a spreadsheet host
//    passes (null for blanks, 2-D arrays for ranges);
// 3. one fault at a time on the documented example gets the promised error:
//    text or TRUE in a range -> #VALUE! naming the cell, a negative -> #VALUE!,
//    mismatched ranges -> #VALUE!, a value outside the documented domain ->
//    #VALUE!, input errors pass through, and blank rows change nothing.
//
// Seeds are random; a failure prints fast-check's seed and path. Reproduce with
// FC_SEED=<seed> (and FC_PATH=<path>); FC_SCALE=4 runs four times the cases.
import fc from "fast-check";
import { afterAll, describe, expect, it, vi } from "vitest";
import { generateMetadata } from "../functions/metadata";
import { guarded } from "../functions/registry";
import { spillShapes } from "../functions/spill-shapes";
import { chaosCall, policyCase } from "./properties-arbitraries";
import { addCounts, assertNone, checkChaos, checkHost, checkPolicy, newCounts, type Counts } from "./properties-policy";

const { functions: metadata } = await generateMetadata();
const scale = Number(process.env.FC_SCALE ?? 1);
// Each property runs a fixed number of cases, never a time budget, so a seed always checks the same cases.
// Functions that simulate (censored fits and bounds, population checks, lot checks) take 100 to 400 ms a
// call and get fewer cases (`slow`) than the closed forms (`n`).
const SIMULATING = new Set(["FIT", "ORIGINFIT", "MODULUSBOUNDS", "CHARSTRENGTHBOUNDS", "DESIGNSTRESSBOUND", "LOTCHECK", "MODULUS"]);
const runs = (id: string, n: number, slow: number) => ({
  numRuns: Math.max(1, Math.round((SIMULATING.has(id) ? slow : n) * scale)),
  ...(process.env.FC_SEED ? { seed: Number(process.env.FC_SEED), path: process.env.FC_PATH } : {}),
});
// Generous, and never a verdict: a slow machine takes longer, it does not fail.
vi.setConfig({ testTimeout: 600_000 });

const CALLS_PER_WORKBOOK = 16;
const totals: Record<string, Counts> = { engine: newCounts(), host: newCounts(), policy: newCounts() };

afterAll(() => {
  const line = Object.entries(totals)
    .map(([k, c]) => `${k} ${c.calls} calls${c.strict + c.loose ? ` (${c.strict} exact-error checks, ${c.loose} error-only)` : ""}`)
    .join("; ");
  console.log(`properties-cells: ${metadata.length} functions; ${line}`);
});

it("covers every registered function, and spilling functions are exactly those declared as matrix results", () => {
  expect(metadata.map((f) => f.id).sort()).toEqual(Object.keys(guarded).sort());
  for (const id of SIMULATING) expect(guarded, `SIMULATING names ${id}, which is not registered`).toHaveProperty(id);
  for (const f of metadata) expect(f.id in spillShapes, f.id).toBe(f.result.dimensionality === "matrix");
});

describe.each(metadata.map((f) => [f.id, f] as const))("%s", (_id, fn) => {
  it("any cells through the embedded engine: no crash, no NaN/Infinity, only policy errors with messages", () => {
    fc.assert(
      fc.property(fc.array(chaosCall(fn), { minLength: CALLS_PER_WORKBOOK, maxLength: CALLS_PER_WORKBOOK }), (calls) =>
        assertNone(checkChaos(calls, metadata, totals.engine)),
      ),
      runs(fn.id, 30, 3),
    );
  });

  it("any cells as a spreadsheet host passes them: the guarded adapter never throws nor returns NaN/Infinity", () => {
    fc.assert(
      fc.property(chaosCall(fn), (call) => assertNone(checkHost(call, fn, guarded[fn.id], totals.host))),
      runs(fn.id, 500, 50),
    );
  });

  const cases = policyCase(fn);
  it("one fault at a time on the documented example gets the error the policy promises", () => {
    expect(cases, "the documented example parses into arguments").not.toBeNull();
    const counts = newCounts();
    fc.assert(
      fc.property(cases!, (pc) => assertNone(checkPolicy(pc, metadata, counts))),
      runs(fn.id, 16, 4),
    );
    addCounts(totals.policy, counts);
    // A function whose documented example never gives a value passes every error check: that is a failure too.
    expect(counts.baselineValues, `the documented example never gave a value; last: ${counts.lastBaselineError}`).toBeGreaterThan(0);
  });
});
