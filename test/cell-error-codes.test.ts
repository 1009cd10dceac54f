// The cell policy's error codes: which code each kind of core failure becomes, and
// that the host-facing codes carry their messages. The rule comes from the
// spreadsheet host's documented behaviour (custom functions: only #VALUE! and
// #N/A show a custom message; source: Office Add-ins documentation on custom
// function errors, from memory).
import { describe, expect, it } from "vitest";
import { CODE_OF_KIND, toFailure } from "../functions/cells";
import { guarded } from "../functions/registry";
import { InputError, ensure, ensureApplicable, ensureConverged, ensurePositiveResult, ensureFiniteResult } from "../src/errors";

describe("core failure kinds become cell codes", () => {
  it("input -> #VALUE!, notApplicable -> #N/A, notRepresentable and notConverged -> #NUM!", () => {
    expect(CODE_OF_KIND).toEqual({ input: "#VALUE!", notApplicable: "#N/A", notRepresentable: "#NUM!", notConverged: "#NUM!" });
    expect(toFailure(new InputError("input", "m"))).toEqual({ cellError: "#VALUE!", message: "m" });
    expect(toFailure(new InputError("notApplicable", "m")).cellError).toBe("#N/A");
    expect(toFailure(new InputError("notRepresentable", "m")).cellError).toBe("#NUM!");
    expect(toFailure(new InputError("notConverged", "m")).cellError).toBe("#NUM!");
    // Anything else that escapes the mathematics is a bare internal error, never a throw.
    expect(toFailure(new Error("boom"))).toEqual({ cellError: "#VALUE!", message: "internal error: boom" });
  });

  it("the guards throw the kind they name, and build a lazy message only when they fail", () => {
    let built = 0;
    const message = () => `built ${++built}`;
    for (let i = 0; i < 1000; i++) ensure(true, message);
    expect(built).toBe(0);
    expect(() => ensure(false, message)).toThrow("built 1");
    expect(() => ensureApplicable(false, "x")).toThrow(expect.objectContaining({ kind: "notApplicable" }));
    expect(() => ensureConverged(false, "x")).toThrow(expect.objectContaining({ kind: "notConverged" }));
  });

  it("a positive result that underflows to 0 or overflows is notRepresentable, and the message prints no NaN or Infinity", () => {
    expect(ensurePositiveResult(5e-324, "q")).toBe(5e-324);
    for (const v of [0, Infinity, NaN]) {
      try {
        ensurePositiveResult(v, "design stress");
        throw new Error("no throw");
      } catch (e) {
        expect((e as InputError).kind).toBe("notRepresentable");
        expect((e as Error).message).toMatch(/^the design stress is too (large|small) to represent in double precision/);
        expect((e as Error).message).not.toMatch(/NaN|Infinity/);
      }
    }
    expect(() => ensureFiniteResult(-Infinity, "log")).toThrow(/too large to represent/);
    expect(ensureFiniteResult(-1e308, "log")).toBe(-1e308);
  });
});

describe("through the cells", () => {
  const code = (r: unknown) => (r as { cellError?: string }).cellError;
  it("bad inputs are #VALUE! with a message (they used to be #NUM!, whose message the host drops)", () => {
    for (const r of [guarded.FAILPROB(200, -10, 400), guarded.DESIGNSTRESS(1.5, 10, 400), guarded.MODULUS([[300], [-310], [320]])]) {
      expect(code(r)).toBe("#VALUE!");
      expect((r as { message: string }).message.length).toBeGreaterThan(10);
    }
    expect((guarded.MODULUS([[300]]) as { cellError: string }).cellError).toBe("#VALUE!"); // too few specimens
  });

  it("a result that does not apply is #N/A: the fit quality of a censored sample", () => {
    const s = [[300], [310], [320], [330], [340]];
    const r = guarded.FITQUALITY(s, [[false], [true], [false], [false], [false]]);
    expect(code(r)).toBe("#N/A");
  });
});
