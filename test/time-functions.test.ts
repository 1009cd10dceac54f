// The time-under-load cell functions through the guarded adapters a host
// calls: values against the outside references in crack_growth.json
// (scipy/numpy/mpmath via test/fixtures/generate_crack_growth.py), the JSDoc
// examples, and the cell policy (DESIGN.md "One policy for cells").
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { guarded } from "../functions/registry";
import { spillShapes } from "../functions/spill-shapes";
import { fixture, relativeError } from "./helpers";

const data = fixture("crack_growth.json");
const column = (xs: unknown[]) => xs.map((x) => [x]);

function code(r: CellResult): unknown {
  return isCellFailure(r) ? r.cellError : r;
}
function num(r: CellResult): number {
  if (typeof r !== "number") throw new Error(`expected a number, got ${JSON.stringify(r)}`);
  return r;
}
/** The values of a labelled two-column block (label, value), in order. */
function row(r: CellResult): unknown[] {
  if (!Array.isArray(r)) throw new Error(`expected a spill, got ${JSON.stringify(r)}`);
  for (const line of r) {
    expect(line).toHaveLength(2);
    expect(typeof line[0]).toBe("string");
  }
  return r.map((line) => line[1]);
}
const B = (c: any) => num(guarded.SCGBFROMVELOCITY(c.n, c.A, c.K, c.Y));

describe("values against named references", () => {
  it("SCGFIT and SCGNBOUNDS equal numpy.polyfit / scipy linregress + t.ppf", () => {
    for (const d of data.rateFits) {
      for (const ref of d.fits) {
        const [n, D] = row(guarded.SCGFIT(column(d.stressRates), column(d.strengths))) as number[];
        expect(relativeError(n, ref.n)).toBeLessThan(1e-11);
        expect(relativeError(D, ref.D)).toBeLessThan(1e-11);
        const [lo, hi, decades, check] = row(guarded.SCGNBOUNDS(column(d.stressRates), column(d.strengths), ref.confidence));
        expect(relativeError(lo as number, ref.nLower)).toBeLessThan(1e-10);
        if (ref.nUpper === null) expect(hi).toBe("unbounded");
        else expect(relativeError(hi as number, ref.nUpper)).toBeLessThan(1e-10);
        expect(decades).toBeCloseTo(ref.decades, 12);
        expect(check === "OK").toBe(ref.decades >= 3 && new Set(d.stressRates).size >= 4);
      }
    }
    const narrow = data.rateFits[1];
    expect(row(guarded.SCGNBOUNDS(column(narrow.stressRates), column(narrow.strengths)))[3]).toBe(
      "SPAN 2.0 DECADES (<3); 3 RATES (<4)",
    );
  });

  it("SCGSTATICFIT and SCGSTATICNBOUNDS equal numpy.polyfit / linregress", () => {
    for (const d of data.staticFits) {
      for (const ref of d.fits) {
        const [n, logD] = row(guarded.SCGSTATICFIT(column(d.stresses), column(d.lifetimes))) as number[];
        expect(relativeError(n, ref.n)).toBeLessThan(1e-11);
        expect(relativeError(logD, ref.log10D)).toBeLessThan(1e-11);
        const [lo, hi, decades] = row(guarded.SCGSTATICNBOUNDS(column(d.stresses), column(d.lifetimes), ref.confidence)) as number[];
        expect(relativeError(lo, ref.nLower)).toBeLessThan(1e-10);
        expect(relativeError(hi, ref.nUpper)).toBeLessThan(1e-10);
        expect(decades).toBeCloseTo(ref.timeDecades, 12);
      }
    }
  });

  it("SCGBFROMVELOCITY and PROOFMINLIFE reproduce the integrated crack-growth law (scipy quad / solve_ivp)", () => {
    for (const c of data.lifetimes) {
      for (const p of c.static) {
        // An inert strength in place of the proof stress: the exact time to failure.
        const t = num(guarded.PROOFMINLIFE(c.inertStrength, p.stress, c.n, B(c)));
        expect(relativeError(t, p.timeQuad)).toBeLessThan(1e-10);
      }
    }
    for (const c of data.proof.filter((p: any) => p.minimumLifeQuad !== undefined)) {
      expect(relativeError(num(guarded.PROOFMINLIFE(c.proofStress, c.serviceStress, c.n, B(c))), c.minimumLifeQuad)).toBeLessThan(1e-10);
    }
    for (const c of data.proof.filter((p: any) => p.requiredLife !== undefined)) {
      expect(relativeError(num(guarded.PROOFSTRESSFORLIFE(c.serviceStress, c.requiredLife, c.n, B(c))), c.proofStressForLife)).toBeLessThan(1e-10);
    }
  });

  it("TIMETOFAILURE and LIFETIMESTRESS match the integrated law where the closed form's neglected terms are tiny", () => {
    let checked = 0;
    for (const c of data.lifetimes) {
      for (const r of c.rates) {
        for (const p of c.static) {
          const x = Math.pow(r.strength / c.inertStrength, c.n - 2) + Math.pow(p.stress / c.inertStrength, c.n - 2);
          if (x > 1e-6) continue;
          checked++;
          // source: scipy solve_ivp failure stress at the rate, scipy quad life at the stress (same flaw)
          expect(relativeError(num(guarded.TIMETOFAILURE(p.stress, r.strength, r.stressRate, c.n)), p.timeQuad)).toBeLessThan(2e-6);
          expect(relativeError(num(guarded.LIFETIMESTRESS(r.strength, r.stressRate, c.n, p.timeQuad)), p.stress)).toBeLessThan(2e-7);
        }
      }
    }
    expect(checked).toBeGreaterThan(3);
  });

  it("SCGBFROMFIT recovers B from a single specimen's D within the neglected term", () => {
    const c = data.lifetimes[0];
    const r = c.rates[0];
    const D = r.strength / Math.pow(r.stressRate, 1 / (c.n + 1));
    const xf = Math.pow(r.strength / c.inertStrength, c.n - 2);
    expect(relativeError(num(guarded.SCGBFROMFIT(D, c.n, c.inertStrength)), B(c) * (1 - xf))).toBeLessThan(1e-9);
    const p = c.static[0];
    const logD = Math.log10(p.timeQuad) + c.n * Math.log10(p.stress);
    const xs = Math.pow(p.stress / c.inertStrength, c.n - 2);
    expect(relativeError(num(guarded.SCGBFROMFIT(logD, c.n, c.inertStrength, "static")), B(c) * (1 - xs))).toBeLessThan(1e-9);
  });

  it("LIFEDESIGNSTRESS equals scipy brentq on the integrated life at the weibull_min quantile", () => {
    for (const c of data.lifeDesign) {
      const s = num(guarded.LIFEDESIGNSTRESS(1 - c.failureProbability, c.lifetime, c.shape, c.scale, c.n, B(c), c.sizeRatio));
      expect(relativeError(s, c.allowableStress)).toBeLessThan(1e-9);
    }
  });

  it("LOADHISTORYSTRESS grows cracks as the ODE-integrated history did", () => {
    for (const h of data.histories) {
      const s = num(guarded.LOADHISTORYSTRESS(column(h.stresses), column(h.durations), h.n));
      const total = h.durations.reduce((a: number, b: number) => a + b, 0);
      const growth =
        Math.log(B(h)) + (h.n - 2) * Math.log(h.inertStrength) + Math.log(-Math.expm1((h.n - 2) * Math.log(h.remainingStrength / h.inertStrength)));
      expect(relativeError(s, Math.exp((growth - Math.log(total)) / h.n))).toBeLessThan(1e-9);
    }
  });

  it("PROOFBREAKS and POSTPROOFFAILPROB equal the mpmath conditional probability", () => {
    for (const c of data.postProof) {
      expect(relativeError(num(guarded.PROOFBREAKS(c.proofStress, c.shape, c.scale, c.sizeRatio)), c.proofBreaks)).toBeLessThan(1e-13);
      const pf = num(guarded.POSTPROOFFAILPROB(c.stress, c.proofStress, c.shape, c.scale, c.sizeRatio));
      if (c.failureProbability === 0) expect(pf).toBe(0);
      else expect(relativeError(pf, c.failureProbability)).toBeLessThan(1e-12);
    }
  });
});

describe("the JSDoc examples say what the functions return", () => {
  const source = readFileSync(join(import.meta.dirname, "..", "functions", "time.ts"), "utf8");
  const examples = [...source.matchAll(/=BRITTLE\.([A-Z]+)\(([-0-9.,E ]+)\) is about ([-0-9.E]+)/g)];
  it("has numeric examples to check", () => expect(examples.length).toBeGreaterThanOrEqual(9));
  for (const [, name, args, stated] of examples) {
    const value = stated.replace(/\.$/, ""); // the sentence's full stop
    it(`${name}(${args}) is about ${value}`, () => {
      const result = num(guarded[name](...args.split(",").map(Number)));
      const digits = value.replace(/E.*$/, "").replace(/^[-0.]+/, "").replace(".", "").length;
      // The stated value is the result rounded to the digits shown.
      expect(relativeError(result, Number(value))).toBeLessThan(0.5 * Math.pow(10, 1 - digits) + 1e-12);
    });
  }
});

describe("spill shapes", () => {
  it("declares the labelled two-column spills with the rows the adapters return", () => {
    const d = data.rateFits[0];
    const s = data.staticFits[0];
    for (const [name, args] of [
      ["SCGFIT", [column(d.stressRates), column(d.strengths)]],
      ["SCGNBOUNDS", [column(d.stressRates), column(d.strengths)]],
      ["SCGSTATICFIT", [column(s.stresses), column(s.lifetimes)]],
      ["SCGSTATICNBOUNDS", [column(s.stresses), column(s.lifetimes)]],
    ] as const) {
      const out = row(guarded[name](...args));
      expect(spillShapes[name]).toEqual({ rows: out.length, cols: 2 });
    }
  });
});

describe("paired ranges follow the blank rule", () => {
  const d = data.rateFits[0];
  const rates = column(d.stressRates);
  const strengths = column(d.strengths);
  const plain = guarded.SCGFIT(rates, strengths);

  it("skips rows blank on both sides (null, 0, empty text) and accepts 2-D blocks", () => {
    const padRates = [...rates, [null], [0], [""], ["  "]];
    const padStrengths = [...strengths, [null], [0], [""], [0]];
    expect(guarded.SCGFIT(padRates, padStrengths)).toEqual(plain);
    const block = (xs: number[]) => [xs.slice(0, 15), xs.slice(15, 30)];
    const r = row(guarded.SCGFIT(block(d.stressRates), block(d.strengths))) as number[];
    // Row-major reading of a block reorders the points; the least-squares fit is order-free.
    const p = row(plain) as number[];
    expect(relativeError(r[0], p[0])).toBeLessThan(1e-12);
  });

  it("one-sided blanks or zeros, negatives, text, mismatched shapes and too few points", () => {
    for (const fn of ["SCGFIT", "SCGNBOUNDS", "SCGSTATICFIT", "SCGSTATICNBOUNDS"]) {
      const withZeroRate = rates.map((r, i) => (i === 2 ? [0] : r));
      expect(code(guarded[fn](withZeroRate, strengths))).toBe("#VALUE!");
      const withBlankStrength = strengths.map((r, i) => (i === 4 ? [null] : r));
      expect(code(guarded[fn](rates, withBlankStrength))).toBe("#VALUE!");
      expect(code(guarded[fn](rates.map((r, i) => (i === 1 ? [-1] : r)), strengths))).toBe("#VALUE!");
      const text = guarded[fn](rates, strengths.map((r, i) => (i === 3 ? ["broke"] : r)));
      expect(code(text)).toBe("#VALUE!");
      expect(isCellFailure(text) && text.message).toMatch(/row 4/);
      expect(code(guarded[fn](rates, strengths.map((r, i) => (i === 3 ? [true] : r))))).toBe("#VALUE!");
      expect(code(guarded[fn](rates.slice(1), strengths))).toBe("#VALUE!");
      expect(code(guarded[fn]([[1], [10]], [[100], [110]]))).toBe("#VALUE!");
      expect(code(guarded[fn]([[null]], [[null]]))).toBe("#VALUE!");
      expect(code(guarded[fn]("text", strengths))).toBe("#VALUE!");
    }
    // Static fits: a positive slope of life on stress is no crack growth.
    expect(code(guarded.SCGSTATICFIT([[50], [60], [70]], [[1], [10], [100]]))).toBe("#VALUE!");
    expect(code(guarded.SCGFIT([[1], [10], [100]], [[120], [110], [100]]))).toBe("#VALUE!");
  });

  it("confidence outside (0, 1) or text -> #VALUE! / #VALUE!", () => {
    for (const fn of ["SCGNBOUNDS", "SCGSTATICNBOUNDS"]) {
      const [x, y] = fn === "SCGNBOUNDS" ? [rates, strengths] : [column(data.staticFits[0].stresses), column(data.staticFits[0].lifetimes)];
      for (const bad of [0, 1, -0.5, 1.5, Infinity, NaN]) expect(code(guarded[fn](x, y, bad))).toBe("#VALUE!");
      expect(code(guarded[fn](x, y, "high"))).toBe("#VALUE!");
      expect(Array.isArray(guarded[fn](x, y, null))).toBe(true);
    }
  });

  it("LOADHISTORYSTRESS: a blank stress beside a duration is an unloaded block; a blank duration beside a stress is #VALUE!", () => {
    const withUnloaded = num(guarded.LOADHISTORYSTRESS([[100], [null], [50]], [[10], [990], [100]], 20));
    const explicit = num(guarded.LOADHISTORYSTRESS([[100], [50]], [[10], [100]], 20, 1100));
    expect(relativeError(withUnloaded, explicit)).toBeLessThan(1e-15);
    expect(code(guarded.LOADHISTORYSTRESS([[100], [50]], [[10], [0]], 20))).toBe("#VALUE!");
    expect(code(guarded.LOADHISTORYSTRESS([[100], [-50]], [[10], [5]], 20))).toBe("#VALUE!");
    expect(code(guarded.LOADHISTORYSTRESS([[100], [50]], [[10], [-5]], 20))).toBe("#VALUE!");
    expect(code(guarded.LOADHISTORYSTRESS([[100], ["x"]], [[10], [5]], 20))).toBe("#VALUE!");
    expect(code(guarded.LOADHISTORYSTRESS([[100], [50]], [[10]], 20))).toBe("#VALUE!");
    expect(code(guarded.LOADHISTORYSTRESS([[null]], [[null]], 20))).toBe("#VALUE!");
    expect(code(guarded.LOADHISTORYSTRESS([[100]], [[10]], 2))).toBe("#VALUE!");
    expect(code(guarded.LOADHISTORYSTRESS([[100]], [[10]], 20, 0))).toBe("#VALUE!");
    expect(code(guarded.LOADHISTORYSTRESS([[100]], [[10]], 20, "long"))).toBe("#VALUE!");
  });
});

describe("scalar functions follow the cell policy", () => {
  // [function, valid arguments, indices that must be > 0, index of n (> 2) or -1, probability indices]
  const scalars: [string, unknown[], number[], number, number[]][] = [
    ["LIFETIMESTRESS", [300, 10, 20, 3.15e8], [0, 1, 3], 2, []],
    ["TIMETOFAILURE", [150, 300, 10, 20], [0, 1, 2], 3, []],
    ["SCGBFROMVELOCITY", [20, 0.001, 3.5, 1.99], [1, 2, 3], 0, []],
    ["SCGBFROMFIT", [300, 20, 450, "RATE"], [0, 2], 1, []],
    ["LIFEDESIGNSTRESS", [0.9999, 3.15e8, 10, 450, 20, 2, 25], [1, 2, 3, 5, 6], 4, [0]],
    ["PROOFBREAKS", [250, 10, 400, 2], [0, 1, 2, 3], -1, []],
    ["POSTPROOFFAILPROB", [300, 250, 10, 400, 2], [1, 2, 3, 4], -1, []],
    ["PROOFMINLIFE", [250, 100, 20, 2], [0, 1, 3], 2, []],
    ["PROOFSTRESSFORLIFE", [100, 3.15e8, 20, 2], [0, 1, 3], 2, []],
  ];
  for (const [name, args, positive, nIndex, probabilities] of scalars) {
    it(`${name}: blanks and text -> #VALUE!, zero, negative, non-finite, n <= 2, probabilities outside (0, 1) -> #VALUE!`, () => {
      const call = (i: number, v: unknown) => guarded[name](...args.map((a, j) => (j === i ? v : a)));
      expect(typeof guarded[name](...args)).toBe("number");
      for (let i = 0; i < args.length; i++) {
        if (typeof args[i] !== "number") continue;
        expect(code(call(i, "abc"))).toBe("#VALUE!");
        expect(code(call(i, true))).toBe("#VALUE!");
        expect(code(call(i, NaN))).toBe("#VALUE!");
        expect(code(call(i, Infinity))).toBe("#VALUE!");
        const optional = (name === "LIFEDESIGNSTRESS" && i === 6) || (["PROOFBREAKS", "POSTPROOFFAILPROB"].includes(name) && i === args.length - 1);
        if (optional) expect(typeof call(i, null)).toBe("number");
        else expect(code(call(i, null))).toBe("#VALUE!");
      }
      for (const i of positive) {
        expect(code(call(i, 0))).toBe("#VALUE!");
        expect(code(call(i, -1))).toBe("#VALUE!");
      }
      if (nIndex >= 0) {
        for (const bad of [2, 1.5, 0, -3]) expect(code(call(nIndex, bad))).toBe("#VALUE!");
        // Just above 2 is in the domain (a result too large for doubles would be #VALUE!, so 2.5).
        expect(typeof call(nIndex, 2.5)).toBe("number");
      }
      for (const i of probabilities) for (const bad of [0, 1, 1.2, -0.1]) expect(code(call(i, bad))).toBe("#VALUE!");
    });
  }

  it("PROOFMINLIFE: service stress above the proof stress -> #VALUE!; equal -> 0", () => {
    expect(code(guarded.PROOFMINLIFE(200, 250, 20, 2))).toBe("#VALUE!");
    expect(guarded.PROOFMINLIFE(200, 200, 20, 2)).toBe(0);
  });

  it("POSTPROOFFAILPROB: 0 at and below the proof stress, #VALUE! for a negative stress", () => {
    expect(guarded.POSTPROOFFAILPROB(250, 250, 10, 400)).toBe(0);
    expect(guarded.POSTPROOFFAILPROB(0, 250, 10, 400)).toBe(0);
    expect(code(guarded.POSTPROOFFAILPROB(-1, 250, 10, 400))).toBe("#VALUE!");
  });

  it("SCGBFROMFIT: an unknown test kind -> #VALUE!; STATIC accepts any finite log10 Ds", () => {
    expect(code(guarded.SCGBFROMFIT(300, 20, 450, "CYCLIC"))).toBe("#VALUE!");
    expect(typeof guarded.SCGBFROMFIT(-3, 20, 450, "STATIC")).toBe("number");
  });

  it("never returns NaN or Infinity over a grid of extreme inputs", () => {
    const extremes = [1e-300, 1e-12, 0.5, 1, 2.0001, 3, 50, 1e6, 1e300];
    const bad: string[] = [];
    for (const [name, args] of scalars) {
      for (let i = 0; i < args.length; i++) {
        if (typeof args[i] !== "number") continue;
        for (const v of extremes) {
          const r = guarded[name](...args.map((a, j) => (j === i ? v : a)));
          if (typeof r === "number" && !Number.isFinite(r)) bad.push(`${name} arg ${i} = ${v}`);
          if (!(typeof r === "number" || isCellFailure(r))) bad.push(`${name} arg ${i} = ${v}: ${String(r)}`);
        }
      }
    }
    expect(bad).toEqual([]);
  });
});
