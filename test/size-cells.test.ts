// The effective-size cell functions through the guarded adapters a host calls:
// the JSDoc examples against scipy references (effective_size.json), and the cell
// policy (DESIGN.md "One policy for cells") on bad input for every adapter.
import { describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { guarded } from "../functions/registry";
import { spillShapes } from "../functions/spill-shapes";
import { fixture, relativeError } from "./helpers";

const ref = fixture("effective_size.json");

function num(r: CellResult): number {
  if (typeof r !== "number") throw new Error(`expected a number, got ${JSON.stringify(r)}`);
  return r;
}
function code(r: CellResult): unknown {
  return isCellFailure(r) ? r.cellError : r;
}
function message(r: CellResult): string {
  return isCellFailure(r) ? r.message : "";
}
const disk = (kind: string, m: number) => ref.disks.find((d: any) => d.kind === kind && d.shape === m && d.criterion === "PIA" && d.poisson === 0.25);

describe("the JSDoc examples equal scipy's integrals (effective_size.json)", () => {
  it("FLEXVOLUME, FLEXAREA: C1161 configuration B four-point at m = 10", () => {
    const b = ref.bars[0]; // m 10, spans 40/20, 4 x 3
    expect(relativeError(num(guarded.FLEXVOLUME(10, 40, 20, 4, 3)), b.volume)).toBeLessThan(1e-12);
    expect(num(guarded.FLEXVOLUME(10, 40, 20, 4, 3))).toBeCloseTo(11.9, 2);
    expect(relativeError(num(guarded.FLEXAREA(10, 40, 20, 4, 3)), b.area)).toBeLessThan(1e-12);
    expect(num(guarded.FLEXAREA(10, 40, 20, 4, 3))).toBeCloseTo(93.22, 2);
  });

  it("RODFLEXVOLUME, RODFLEXAREA", () => {
    const r = ref.rods[0]; // m 10, spans 40/20, diameter 5
    expect(relativeError(num(guarded.RODFLEXVOLUME(10, 40, 20, 5)), r.volume)).toBeLessThan(1e-11);
    expect(num(guarded.RODFLEXVOLUME(10, 40, 20, 5))).toBeCloseTo(8.786, 3);
    expect(relativeError(num(guarded.RODFLEXAREA(10, 40, 20, 5)), r.area)).toBeLessThan(1e-11);
    expect(num(guarded.RODFLEXAREA(10, 40, 20, 5))).toBeCloseTo(42.17, 2);
  });

  it("RINGAREA, RINGVOLUME, PISTONAREA, PISTONVOLUME at m = 10", () => {
    const ring = disk("ring", 10);
    const piston = disk("piston", 10);
    expect(relativeError(num(guarded.RINGAREA(10, 10, 20, 25, 0.25)), ring.area)).toBeLessThan(1e-9);
    expect(num(guarded.RINGAREA(10, 10, 20, 25, 0.25))).toBeCloseTo(195.5, 1);
    expect(relativeError(num(guarded.RINGVOLUME(10, 10, 20, 25, 1, 0.25)), ring.volume)).toBeLessThan(1e-9);
    expect(num(guarded.RINGVOLUME(10, 10, 20, 25, 1, 0.25))).toBeCloseTo(8.888, 3);
    expect(relativeError(num(guarded.PISTONAREA(10, 1.4, 10, 14, 0.25)), piston.area)).toBeLessThan(1e-9);
    expect(num(guarded.PISTONAREA(10, 1.4, 10, 14, 0.25))).toBeCloseTo(1.732, 3);
    expect(relativeError(num(guarded.PISTONVOLUME(10, 1.4, 10, 14, 1.2, 0.25)), piston.volume)).toBeLessThan(1e-9);
    expect(num(guarded.PISTONVOLUME(10, 1.4, 10, 14, 1.2, 0.25))).toBeCloseTo(0.0945, 4);
  });

  it("criteria by name, any case", () => {
    const nsa = ref.disks.find((d: any) => d.kind === "ring" && d.criterion === "NSA" && d.shape === 12);
    expect(relativeError(num(guarded.RINGAREA(12, 10, 20, 25, 0.25, "nsa")), nsa.area)).toBeLessThan(1e-9);
    const mp = ref.disks.find((d: any) => d.kind === "piston" && d.criterion === "MAXPRINCIPAL" && d.shape === 5);
    expect(relativeError(num(guarded.PISTONAREA(5, 1.4, 10, 14, 0.25, "MaxPrincipal")), mp.area)).toBeLessThan(1e-9);
  });

  it("SPECIMEN equals the fixture functions at the preset dimensions", () => {
    expect(num(guarded.SPECIMEN("C1161-B-4PT", 10))).toBe(num(guarded.FLEXVOLUME(10, 40, 20, 4, 3)));
    expect(num(guarded.SPECIMEN("c1161 a 3pt", 7, "surface"))).toBe(num(guarded.FLEXAREA(7, 20, 0, 2, 1.5)));
    expect(num(guarded.SPECIMEN("C1499-20/10", 10, "SURFACE", 0.25))).toBe(num(guarded.RINGAREA(10, 10, 20, 25, 0.25)));
    expect(num(guarded.SPECIMEN("ISO6872-P3B", 10, null as any, 0.25))).toBe(num(guarded.PISTONVOLUME(10, 1.4, 10, 14, 1.2, 0.25)));
  });
});

describe("element tables through the cells", () => {
  const c = ref.parts[0]; // numpy reference, 3 principal stresses per row
  const stresses = Array.from({ length: c.sizes.length }, (_, r) => c.stresses.slice(3 * r, 3 * r + 3));
  const sizes = c.sizes.map((s: number) => [s]);

  it("PARTEFFSIZE, PARTFAILPROB and RISKSHARE equal numpy (effective_size.json parts)", () => {
    expect(relativeError(num(guarded.PARTEFFSIZE(stresses, sizes, c.shape)), c.effectiveSizePIA)).toBeLessThan(1e-12);
    expect(relativeError(num(guarded.PARTEFFSIZE(stresses, sizes, c.shape, "maxprincipal")), c.effectiveSizeMAX)).toBeLessThan(1e-12);
    const sigma0 = 600;
    const pf = -Math.expm1(-c.effectiveSizePIA * (c.peak / sigma0) ** c.shape);
    expect(relativeError(num(guarded.PARTFAILPROB(stresses, sizes, c.shape, sigma0)), pf)).toBeLessThan(1e-12);
    const shares = guarded.RISKSHARE(stresses, sizes, c.shape) as number[][];
    expect(shares.length).toBe(stresses.length);
    c.sharesPIA.forEach((s: number, i: number) => expect(Math.abs(shares[i][0] - s)).toBeLessThan(1e-14));
  });

  it("blank rows are skipped (and spill as blank cells); a blank stress beside a size is 0", () => {
    const s = [[200], [null], [""], [100], [null]];
    const v = [[1], [null], [0], [2], [3]];
    // Rows 2 and 3 are blank; row 5 has a size and a blank stress (0): it adds nothing.
    expect(relativeError(num(guarded.PARTEFFSIZE(s, v, 4)), 1 + 2 / 16)).toBeLessThan(1e-15);
    const shares = guarded.RISKSHARE(s, v, 4) as unknown[][];
    expect(shares.map((r) => r[0])).toEqual([16 / 18, "", "", 2 / 18, 0]);
    expect(spillShapes.RISKSHARE).toEqual({ rows: { rowsOf: 0 }, cols: 1 });
  });

  it("six tensor columns", () => {
    const t = ref.parts[2];
    const rows = Array.from({ length: t.sizes.length }, (_, r) => t.stresses.slice(6 * r, 6 * r + 6));
    expect(relativeError(num(guarded.PARTEFFSIZE(rows, t.sizes.map((x: number) => [x]), t.shape)), t.effectiveSizePIA)).toBeLessThan(1e-12);
  });

  it("all compressive: failure probability 0; effective size and risk shares do not apply (#N/A with a message)", () => {
    expect(num(guarded.PARTFAILPROB([[-5], [-1]], [[1], [1]], 10, 300))).toBe(0);
    const r = guarded.PARTEFFSIZE([[-5], [-1]], [[1], [1]], 10);
    expect(code(r)).toBe("#N/A");
    expect(message(r)).toMatch(/no element carries tensile stress/);
    expect(code(guarded.RISKSHARE([[-5]], [[1]], 10))).toBe("#N/A");
  });

  it.each([
    ["mismatched rows", [[1], [2]], [[1]], "#VALUE!", /same rows|as many rows/],
    ["two stress columns", [[1, 2]], [[1]], "#VALUE!", /1 \(maximum principal\), 3 \(principal\) or 6/],
    ["sizes with two columns", [[1]], [[1, 2]], "#VALUE!", /one column/],
    ["text stress", [["abc"]], [[1]], "#VALUE!", /stresses, row 1 is not a number/],
    ["boolean stress", [[true]], [[1]], "#VALUE!", /not a number/],
    ["text size", [[100]], [["x"]], "#VALUE!", /sizes, row 1 is not a number/],
    ["negative size", [[100]], [[-1]], "#VALUE!", /sizes, row 1 is negative/],
    ["blank size beside a stress", [[100], [50]], [[1], [null]], "#VALUE!", /sizes, row 2 is blank or zero beside stresses/],
    ["zero size beside a stress", [[100]], [[0]], "#VALUE!", /blank or zero beside stresses/],
    ["infinite stress", [[Infinity]], [[1]], "#VALUE!", /too large to represent/],
    ["empty table", [[null]], [[null]], "#VALUE!", /empty/],
  ])("%s -> %s", (_, s, v, expected, text) => {
    for (const r of [guarded.PARTEFFSIZE(s, v, 10), guarded.PARTFAILPROB(s, v, 10, 400), guarded.RISKSHARE(s, v, 10)]) {
      expect(code(r)).toBe(expected);
      expect(message(r)).toMatch(text);
    }
  });

  it("bad modulus, scale and criterion", () => {
    expect(code(guarded.PARTEFFSIZE([[1]], [[1]], 0))).toBe("#VALUE!");
    expect(code(guarded.PARTEFFSIZE([[1]], [[1]], null as any))).toBe("#VALUE!");
    expect(code(guarded.PARTFAILPROB([[1]], [[1]], 10, -3))).toBe("#VALUE!");
    expect(code(guarded.RISKSHARE([[1]], [[1]], 10, "Weibull"))).toBe("#VALUE!");
  });
});

// Valid arguments for every scalar adapter, and for each argument what a bad value gives.
type Case = { fn: string; args: unknown[]; zeroOk?: number[]; negativeOk?: number[]; optional?: number[] };
const CASES: Case[] = [
  { fn: "FLEXVOLUME", args: [10, 40, 20, 4, 3], zeroOk: [2] },
  { fn: "FLEXAREA", args: [10, 40, 20, 4, 3], zeroOk: [2] },
  { fn: "RODFLEXVOLUME", args: [10, 40, 20, 5], zeroOk: [2] },
  { fn: "RODFLEXAREA", args: [10, 40, 0, 5], zeroOk: [2] },
  { fn: "RINGAREA", args: [10, 10, 20, 25, 0.25, "PIA"], zeroOk: [4], negativeOk: [4], optional: [5] },
  { fn: "RINGVOLUME", args: [10, 10, 20, 25, 1, 0.25, "NSA"], zeroOk: [5], negativeOk: [5], optional: [6] },
  { fn: "PISTONAREA", args: [10, 1.4, 10, 14, 0.25, "PIA"], zeroOk: [4], negativeOk: [4], optional: [5] },
  { fn: "PISTONVOLUME", args: [10, 1.4, 10, 14, 1.2, 0.25, "MAXPRINCIPAL"], zeroOk: [5], negativeOk: [5], optional: [6] },
];

describe("cell policy on every fixture adapter", () => {
  for (const c of CASES) {
    it(`${c.fn}: valid arguments give a finite positive number`, () => {
      const v = num(guarded[c.fn](...c.args));
      expect(Number.isFinite(v) && v > 0).toBe(true);
    });
    c.args.forEach((arg, i) => {
      if (typeof arg !== "number") return;
      it(`${c.fn} argument ${i + 1}: blank -> #VALUE!, text -> #VALUE!, NaN -> #VALUE!, out of domain -> #VALUE!`, () => {
        const with_ = (v: unknown) => guarded[c.fn](...c.args.map((a, k) => (k === i ? v : a)));
        expect(code(with_(null))).toBe("#VALUE!");
        expect(message(with_(null))).toMatch(/is required/);
        expect(code(with_("ten"))).toBe("#VALUE!");
        expect(code(with_(NaN))).toBe("#VALUE!");
        expect(code(with_(Infinity))).toBe("#VALUE!");
        if (!c.zeroOk?.includes(i)) expect(code(with_(0))).toBe("#VALUE!");
        if (!c.negativeOk?.includes(i)) expect(code(with_(-1))).toBe("#VALUE!");
      });
    });
    if (c.optional) {
      it(`${c.fn}: the criterion is optional and must be a known name`, () => {
        const k = c.optional![0];
        const without = c.args.slice(0, k);
        expect(typeof guarded[c.fn](...without)).toBe("number");
        expect(code(guarded[c.fn](...without, "Batdorf"))).toBe("#VALUE!");
        expect(code(guarded[c.fn](...without, 3))).toBe("#VALUE!");
      });
    }
  }

  it.each([
    ["FLEXVOLUME", [10, 40, 50, 4, 3], /inner span \(50\) must be shorter than the outer span \(40\)/],
    ["RODFLEXAREA", [10, 40, 40, 5], /shorter/],
    ["RINGAREA", [10, 30, 20, 25, 0.25], /load ring diameter \(30\) must be smaller than the support diameter \(20\)/],
    ["RINGAREA", [10, 10, 30, 25, 0.25], /support diameter \(30\) must not exceed the disk diameter \(25\)/],
    ["RINGVOLUME", [10, 10, 20, 25, 1, 0.5], /Poisson's ratio must lie between -1 and 0.5 \(got 0.5\)/],
    ["PISTONAREA", [10, 1.4, 10, 14, -1], /Poisson/],
    ["PISTONVOLUME", [10, 12, 10, 14, 1.2, 0.3], /piston diameter \(12\) must be smaller/],
  ])("%s(%j) -> #VALUE! with a message", (fn, args, text) => {
    const r = guarded[fn as string](...(args as unknown[]));
    expect(code(r)).toBe("#VALUE!");
    expect(message(r)).toMatch(text as RegExp);
  });
});

describe("cell policy on SPECIMEN", () => {
  it("unknown, blank or non-text configuration -> #VALUE! naming the presets", () => {
    expect(code(guarded.SPECIMEN("C1161-Z", 10))).toBe("#VALUE!");
    expect(message(guarded.SPECIMEN("C1161-Z", 10))).toMatch(/C1161-B-4PT/);
    expect(code(guarded.SPECIMEN("", 10))).toBe("#VALUE!");
    expect(code(guarded.SPECIMEN(5 as any, 10))).toBe("#VALUE!");
  });

  it("modulus, flaws, Poisson's ratio and criterion", () => {
    expect(code(guarded.SPECIMEN("C1161-B-4PT", 0))).toBe("#VALUE!");
    expect(code(guarded.SPECIMEN("C1161-B-4PT", null as any))).toBe("#VALUE!");
    expect(code(guarded.SPECIMEN("C1161-B-4PT", 10, "edges"))).toBe("#VALUE!");
    expect(code(guarded.SPECIMEN("ISO6872-P3B", 10))).toBe("#VALUE!");
    expect(message(guarded.SPECIMEN("ISO6872-P3B", 10))).toMatch(/Poisson/);
    expect(code(guarded.SPECIMEN("ISO6872-P3B", 10, "volume", 0.7))).toBe("#VALUE!");
    expect(code(guarded.SPECIMEN("ISO6872-P3B", 10, "volume", "x" as any))).toBe("#VALUE!");
    expect(code(guarded.SPECIMEN("C1499-40/20", 10, "surface", 0.2, "nope"))).toBe("#VALUE!");
    // A configuration that fixes no thickness has no effective volume: the result does not apply.
    expect(code(guarded.SPECIMEN("F394-P3B", 10, "volume", 0.25))).toBe("#N/A");
  });

  it("never NaN or Infinity: extreme moduli give finite numbers or #NUM! (beyond double precision)", () => {
    for (const m of [1e-3, 0.5, 200, 1e6]) {
      for (const r of [
        guarded.FLEXVOLUME(m, 40, 20, 4, 3),
        guarded.RODFLEXAREA(m, 40, 20, 5),
        guarded.RINGAREA(m, 10, 20, 25, 0.25),
        guarded.PISTONVOLUME(m, 1.4, 10, 14, 1.2, 0.25, "NSA"),
        guarded.PARTEFFSIZE([[1], [2]], [[1], [1]], m),
      ]) {
        if (typeof r === "number") expect(Number.isFinite(r)).toBe(true);
        else expect(code(r)).toBe("#NUM!");
      }
    }
  });
});
