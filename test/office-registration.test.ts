// Registration in the spreadsheet host, with the host's CustomFunctions
// object replaced by a recording stand-in: every function in functions.json
// is associated, and a cell failure becomes the host's error object, with a
// message only for #VALUE! and #N/A (the host drops others: common practice
// documented in the host's custom-functions error guide).
import { afterEach, describe, expect, it } from "vitest";
import { generateMetadata } from "../functions/metadata";
import { registerInHost } from "../functions/office";
import { guarded } from "../functions/registry";

class HostError {
  constructor(
    public code: string,
    public message?: string,
  ) {}
}

afterEach(() => {
  delete (globalThis as any).CustomFunctions;
});

describe("registration through the shared runtime", () => {
  it("associates every function of functions.json, and maps failures to host errors", async () => {
    const associated = new Map<string, (...args: unknown[]) => unknown>();
    (globalThis as any).CustomFunctions = {
      associate: (id: string, fn: (...args: unknown[]) => unknown) => associated.set(id, fn),
      Error: HostError,
      ErrorCode: { invalidValue: "#VALUE!", invalidNumber: "#NUM!", notAvailable: "#N/A" },
    };
    registerInHost();
    const { functions } = await generateMetadata();
    expect([...associated.keys()].sort()).toEqual(functions.map((f) => f.id).sort());

    const failprob = associated.get("FAILPROB")!;
    expect(failprob(200, 10, 400, null)).toBeCloseTo(-Math.expm1(-Math.pow(0.5, 10)), 15);
    // A bad input is #VALUE! with its message (the host shows it).
    const bad = failprob(200, -10, 400, null) as HostError;
    expect(bad).toBeInstanceOf(HostError);
    expect(bad.code).toBe("#VALUE!");
    expect(bad.message).toMatch(/modulus/);
    // A result beyond double precision is #NUM!, which the host shows with no message.
    const num = associated.get("MEANSTRENGTH")!(0.001, 400) as HostError;
    expect(num.code).toBe("#NUM!");
    expect(num.message).toBeUndefined();
    // A simulating function returns a promise (declared @cancelable; the host passes the invocation last).
    const pending = associated.get("MODULUS")!([[300], ["oops"], [320]], null, null, {});
    expect(pending).toBeInstanceOf(Promise);
    const value = (await pending) as HostError;
    expect(value.code).toBe("#VALUE!");
    expect(value.message).toMatch(/row 2/);
    // The raw ML modulus (no simulation) through the same path: the synchronous adapter's value.
    const strengths = [[300], [320], [310], [350], [290]];
    expect(await associated.get("MODULUS")!(strengths, null, "MLE-RAW", {})).toBe(guarded.MODULUS(strengths, null, "MLE-RAW"));
    // Canceled by the host before it finished: no value, an error saying so (the host discards it).
    const invocation: { onCanceled?: () => void } = {};
    const canceled = associated.get("MODULUS")!(strengths, [[false], [true], [false], [false], [false]], null, invocation);
    invocation.onCanceled!();
    expect(await canceled).toMatchObject({ code: "#N/A", message: expect.stringMatching(/canceled/) });
    // An error in one cell of a spill is the host's error object in that cell, with its message
    // (CustomFunctionsRuntime 1.2 allows errors inside returned arrays).
    const rows = associated.get("FLEXSTRENGTH")!([[400], [410]], [[40]], [[20]], [[4]], [[3], [5]]) as unknown[][];
    expect(rows[0][0]).toBeCloseTo((3 * 400 * 20) / (2 * 4 * 9), 12);
    expect(rows[1][0]).toBeInstanceOf(HostError);
    expect((rows[1][0] as HostError).code).toBe("#VALUE!");
    expect((rows[1][0] as HostError).message).toMatch(/row 2: outside the formula's limits/);
    // Desktop hosts pass empty cells as 0: they are skipped, never a zero-strength specimen.
    expect(associated.get("CHARSTRENGTH")!([[300], [0], [320], [0]], null, "MLE-RAW")).toBe(
      associated.get("CHARSTRENGTH")!([[300], [320]], null, "MLE-RAW"),
    );
  });

  it("does nothing outside a host", () => {
    expect(() => registerInHost()).not.toThrow();
  });
});
