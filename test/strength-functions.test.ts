// The first ten cell functions through the guarded adapters a host calls:
// a value from a named outside reference for each, and the cell policy
// (DESIGN.md "One policy for cells") on bad input.
import { describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { guarded } from "../functions/registry";
import { fixture, relativeError } from "./helpers";

const fits = fixture("weibull_fits.json").datasets;
const dist = fixture("weibull_distribution.json");
const lots = fixture("regression_and_lots.json");

const complete = fits.find((d: any) => d.kind === "complete" && d.strengths.length === 30);
const censored = fits.find((d: any) => d.id === "censored-n20");
const column = (xs: unknown[]) => xs.map((x) => [x]);

function code(r: CellResult): string | number | unknown {
  return isCellFailure(r) ? r.cellError : r;
}
function num(r: CellResult): number {
  if (typeof r !== "number") throw new Error(`expected a number, got ${JSON.stringify(r)}`);
  return r;
}

describe("values against named references", () => {
  it("MODULUS and CHARSTRENGTH with MLE-RAW equal the 40-digit ML solution (mpmath, weibull_fits.json)", () => {
    expect(relativeError(num(guarded.MODULUS(column(complete.strengths), null, "MLE-RAW")), complete.ml.shapeFloat)).toBeLessThan(1e-12);
    expect(relativeError(num(guarded.CHARSTRENGTH(column(complete.strengths), null, "MLE-RAW")), complete.ml.scaleFloat)).toBeLessThan(1e-12);
    expect(relativeError(num(guarded.CHARSTRENGTH(column(complete.strengths))), complete.ml.scaleFloat)).toBeLessThan(1e-12);
  });

  it("censoring flags from a range (TRUE/1/C) give the censored ML solution (mpmath)", () => {
    const flags = censored.censored.map((c: boolean, i: number) => (c ? [i % 3 === 0 ? true : i % 3 === 1 ? 1 : "C"] : [i % 2 ? false : null]));
    expect(relativeError(num(guarded.MODULUS(column(censored.strengths), flags, "MLE-RAW")), censored.ml.shapeFloat)).toBeLessThan(1e-12);
    expect(relativeError(num(guarded.CHARSTRENGTH(column(censored.strengths), flags)), censored.ml.scaleFloat)).toBeLessThan(1e-12);
  });

  it("LSQ methods equal scipy.stats.linregress on the Weibull plot (regression_and_lots.json)", () => {
    const s = lots.regression[1];
    expect(relativeError(num(guarded.MODULUS(column(s.strengths), null, "LSQ")), s.fits.HAZEN.shape)).toBeLessThan(1e-11);
    expect(relativeError(num(guarded.MODULUS(column(s.strengths), null, "lsq-meanrank")), s.fits.MEAN.shape)).toBeLessThan(1e-11);
    expect(relativeError(num(guarded.CHARSTRENGTH(column(s.strengths), null, "LSQ-MEDIANRANK")), s.fits.MEDIAN.scale)).toBeLessThan(1e-11);
  });

  it("FAILPROB and DESIGNSTRESS equal the mpmath values (weibull_distribution.json)", () => {
    const q = dist.quantileFromSurvival;
    for (const i of [3, 15, 27]) {
      expect(relativeError(num(guarded.DESIGNSTRESS(q.survival[i], q.shape[i], q.scale[i], q.sizeRatio[i])), q.stress[i])).toBeLessThan(1e-13);
    }
    const f = dist.failureProbability;
    for (const i of [4, 8, 30]) {
      expect(relativeError(num(guarded.FAILPROB(f.stress[i], f.shape[i], f.scale[i], f.sizeRatio[i])), f.pf[i])).toBeLessThan(1e-13);
    }
  });

  it("MEANSTRENGTH, CHARFROMMEAN, CHARFROMMEDIAN equal the mpmath mean and median", () => {
    const mm = dist.meanMedian;
    for (const i of [9, 21, 41]) {
      expect(relativeError(num(guarded.MEANSTRENGTH(mm.shape[i], mm.scale[i])), mm.mean[i])).toBeLessThan(1e-13);
      expect(relativeError(num(guarded.CHARFROMMEAN(mm.mean[i], mm.shape[i])), mm.scale[i])).toBeLessThan(1e-13);
      expect(relativeError(num(guarded.CHARFROMMEDIAN(mm.median[i], mm.shape[i])), mm.scale[i])).toBeLessThan(1e-14);
    }
  });

  it("SIZESCALE and MATERIALSCALE follow ASTM C1683 (th2 = th1 (V1/V2)^(1/m); sigma_0 = th V^(1/m))", () => {
    expect(relativeError(num(guarded.SIZESCALE(400, 10, 1.5, 150)), 400 * Math.pow(0.01, 0.1))).toBeLessThan(1e-15);
    expect(relativeError(num(guarded.MATERIALSCALE(400, 10, 1.5)), 400 * Math.pow(1.5, 0.1))).toBeLessThan(1e-15);
  });

  it("LOTFAILURES equals N p and scipy.stats.binom.ppf", () => {
    for (const lot of lots.lots) {
      expect(guarded.LOTFAILURES(lot.failureProbability, lot.lotSize, lot.confidence)).toBe(lot.upperBound);
    }
    expect(guarded.LOTFAILURES(1e-4, 20000)).toBeCloseTo(2, 12);
  });
});

describe("the blank rule: blanks, empty strings and zeros are no specimen", () => {
  it("gives the same fit with blanks (null from web hosts, 0 from desktop, empty text) scattered in", () => {
    const plain = guarded.MODULUS(column(complete.strengths), null, "MLE-RAW");
    const padded = complete.strengths.flatMap((s: number, i: number) => (i % 5 === 0 ? [[s], [null], [0], [""], ["  "]] : [[s]]));
    expect(guarded.MODULUS(padded, null, "MLE-RAW")).toBe(plain);
  });
  it("accepts a two-dimensional block of strengths", () => {
    const s = complete.strengths;
    const block = [];
    for (let i = 0; i < s.length; i += 3) block.push([s[i], s[i + 1] ?? null, s[i + 2] ?? null]);
    expect(guarded.CHARSTRENGTH(block, null, "MLE-RAW")).toBe(guarded.CHARSTRENGTH(column(s), null, "MLE-RAW"));
  });
});

describe("bad input follows the cell policy", () => {
  const s = column(complete.strengths);
  const fitters = ["MODULUS", "CHARSTRENGTH"];
  for (const name of fitters) {
    it(`${name}: text -> #VALUE!, negative -> #VALUE!, too few -> #VALUE!, mismatched flags -> #VALUE!, bad method -> #VALUE!`, () => {
      const withText = [...s.slice(0, 3), ["n/a"], ...s.slice(3)];
      const r = guarded[name](withText);
      expect(code(r)).toBe("#VALUE!");
      expect(isCellFailure(r) && r.message).toMatch(/row 4/);
      expect(code(guarded[name]([...s, [true]]))).toBe("#VALUE!");
      expect(code(guarded[name]([...s, [-310]]))).toBe("#VALUE!");
      expect(code(guarded[name]([[310]]))).toBe("#VALUE!");
      expect(code(guarded[name]([[null], [0], [""]]))).toBe("#VALUE!");
      expect(code(guarded[name]([[300], [300], [300]]))).toBe("#VALUE!");
      expect(code(guarded[name](s, s.slice(1).map(() => [false])))).toBe("#VALUE!");
      expect(code(guarded[name](s, s.map(() => ["maybe"])))).toBe("#VALUE!");
      expect(code(guarded[name](s, s.map(() => [true])))).toBe("#VALUE!");
      expect(code(guarded[name](s, null, "BEST"))).toBe("#VALUE!");
      expect(code(guarded[name](s, null, 3))).toBe("#VALUE!");
      expect(code(guarded[name]("text"))).toBe("#VALUE!");
    });
  }

  // [function, valid arguments, index of each argument that must be > 0, index of probabilities in (0, 1)]
  const scalars: [string, unknown[], number[], number[]][] = [
    ["FAILPROB", [300, 10, 400, 2], [1, 2, 3], []],
    ["DESIGNSTRESS", [0.999, 10, 400, 2], [1, 2, 3], [0]],
    ["SIZESCALE", [400, 10, 1.5, 150], [0, 1, 2, 3], []],
    ["CHARFROMMEAN", [380, 10], [0, 1], []],
    ["CHARFROMMEDIAN", [385, 10], [0, 1], []],
    ["MEANSTRENGTH", [10, 400], [0, 1], []],
    ["MATERIALSCALE", [400, 10, 1.5], [0, 1, 2], []],
    ["LOTFAILURES", [0.001, 1000, 0.9], [1], [2]],
  ];
  for (const [name, valid, positive, probabilities] of scalars) {
    it(`${name}: valid arguments give a finite number; text, blanks, zero, negative, out of range give errors`, () => {
      expect(Number.isFinite(guarded[name](...valid))).toBe(true);
      valid.forEach((_, k) => {
        const at = (v: unknown) => guarded[name](...valid.map((x, j) => (j === k ? v : x)));
        expect(code(at("abc"))).toBe("#VALUE!");
        expect(code(at(true))).toBe("#VALUE!");
        if (positive.includes(k)) {
          expect(code(at(0))).toBe("#VALUE!");
          expect(code(at(-1))).toBe("#VALUE!");
        }
        if (probabilities.includes(k)) {
          for (const p of [0, 1, 1.5, -0.2]) expect(code(at(p))).toBe("#VALUE!");
        }
      });
    });
  }

  it("FAILPROB: a negative stress is #VALUE!, zero stress is Pf = 0", () => {
    expect(code(guarded.FAILPROB(-5, 10, 400))).toBe("#VALUE!");
    expect(guarded.FAILPROB(0, 10, 400)).toBe(0);
  });
  it("required arguments left blank are #VALUE!, optional ones take their default", () => {
    expect(code(guarded.FAILPROB(null, 10, 400))).toBe("#VALUE!");
    expect(guarded.FAILPROB(300, 10, 400, null)).toBe(guarded.FAILPROB(300, 10, 400, 1));
    expect(code(guarded.LOTFAILURES(0.01, 100.5))).toBe("#VALUE!");
    expect(code(guarded.LOTFAILURES(1, 100))).toBe("#VALUE!");
  });
  it("results that overflow double precision are #NUM!, never Infinity or NaN", () => {
    expect(code(guarded.DESIGNSTRESS(1e-300, 0.01, 1e300))).toBe("#NUM!");
    expect(code(guarded.MEANSTRENGTH(0.001, 400))).toBe("#NUM!");
    expect(code(guarded.SIZESCALE(1e300, 0.01, 1e10, 1))).toBe("#NUM!");
  });
});
