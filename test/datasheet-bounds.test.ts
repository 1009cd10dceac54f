// Bounds from datasheet values (modulus, characteristic strength, number of
// specimens): identical to the bounds from the data given the data's own ML
// values, checked against an independent numpy simulation of the pivotal
// quantities (uncertainty.json, test/fixtures/generate_uncertainty.py) and the
// recalled ASTM C1239 factors, and the cell policy on bad input.
import { describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { guarded } from "../functions/registry";
import { spillShapes } from "../functions/spill-shapes";
import { evaluateWorkbook } from "../cli/evaluate-workbook";
import { generateMetadata } from "../functions/metadata";
import { SeededRandom } from "../src/numeric/random";
import { parameterBounds } from "../src/weibull/confidence-bounds";
import { datasheetBounds } from "../src/weibull/datasheet-bounds";
import { designStressBound } from "../src/weibull/design-stress-bound";
import { fitMaximumLikelihood } from "../src/weibull/maximum-likelihood";
import { pivotalTable } from "../src/weibull/pivotal-table";
import { expectInputError, fixture, relativeError } from "./helpers";

const fits = fixture("weibull_fits.json").datasets.filter((d: any) => !d.censored?.some(Boolean) && d.strengths.length >= 3);
const ref = fixture("uncertainty.json");
const column = (xs: readonly unknown[]) => xs.map((x) => [x]);
const code = (r: CellResult) => (isCellFailure(r) ? r.cellError : r);

describe("identical to the bounds from the data, given the data's own ML values", () => {
  for (const d of fits) {
    it(`${d.id}: raw ML modulus typed (unbiased FALSE) gives exactly the bounds from the data`, () => {
      const fit = fitMaximumLikelihood({ strengths: d.strengths });
      for (const [confidence, sides] of [[0.9, 2], [0.95, 2], [0.95, 1]] as const) {
        const fromData = parameterBounds({ strengths: d.strengths, confidence, sides });
        const fromSheet = datasheetBounds({ shape: fit.shape, scale: fit.scale, specimens: d.strengths.length, unbiased: false, confidence, sides });
        expect(fromSheet.shape).toEqual(fromData.shape);
        expect(fromSheet.scale).toEqual(fromData.scale);
      }
      // The design-stress bound at the intervals' lower-end confidence: 90 % two-sided -> 95 % one-sided.
      const sheet = datasheetBounds({ shape: fit.shape, scale: fit.scale, specimens: d.strengths.length, unbiased: false, survival: 0.999, sizeRatio: 4 });
      const data = designStressBound({ strengths: d.strengths, survival: 0.999, sizeRatio: 4, confidence: 0.95 });
      expect(sheet.designStress!.confidence).toBeCloseTo(0.95, 14);
      expect(relativeError(sheet.designStress!.lower, data.lower)).toBeLessThan(1e-13);
      expect(sheet.designStress!.estimate).toBe(data.estimate);
    });
  }

  it("the unbiased modulus a datasheet reports (UF(N) m_hat) gives the same bounds to rounding", () => {
    for (const d of fits) {
      const n = d.strengths.length;
      const fit = fitMaximumLikelihood({ strengths: d.strengths });
      const reported = pivotalTable().unbiasingFactor(n) * fit.shape;
      const fromSheet = datasheetBounds({ shape: reported, scale: fit.scale, specimens: n });
      const fromData = parameterBounds({ strengths: d.strengths });
      for (const [a, b] of [
        [fromSheet.shape.lower, fromData.shape.lower],
        [fromSheet.shape.upper, fromData.shape.upper],
        [fromSheet.scale.lower, fromData.scale.lower],
        [fromSheet.scale.upper, fromData.scale.upper],
      ]) {
        expect(relativeError(a, b), d.id).toBeLessThan(1e-13);
      }
    }
  });

  it("the cell equals FIT's bounds on the same data", () => {
    const d = fits.find((x: any) => x.id === "complete-n30-m10-s350");
    const fit = fitMaximumLikelihood({ strengths: d.strengths });
    const table = guarded.DATASHEETBOUNDS(fit.shape, fit.scale, 30, false) as unknown[][];
    const fitTable = guarded.FIT(column(d.strengths)) as unknown[][];
    const fitValue = (label: string) => fitTable.find((row) => row[0] === label)![1];
    for (const row of table.slice(0, 4)) expect(row[1], String(row[0])).toBe(fitValue(String(row[0])));
  });
});

describe("against an independent simulation and the recalled standard's factors", () => {
  // The lower bound on m is m_hat / q_(0.95) and the upper m_hat / q_(0.05); the characteristic strength's
  // th_hat exp(-t_(0.95)/m_hat) and th_hat exp(-t_(0.05)/m_hat). q and t from numpy (uncertainty.json,
  // generate_uncertainty.py, own seeds and ML solver); tolerance 4 combined Monte Carlo standard errors.
  for (const row of ref.completeQuantilePivot.filter((r: any) => r.n <= 500)) {
    it(`n = ${row.n}: 90 % two-sided bounds from m = 12, 400 MPa match the numpy quantiles of q and t`, () => {
      const b = datasheetBounds({ shape: 12, scale: 400, specimens: row.n, unbiased: false });
      const i05 = row.probabilities.indexOf(0.05);
      const i95 = row.probabilities.indexOf(0.95);
      // The shipped table's own error is of the same order as the fixture's: sqrt(2) covers both.
      const tol = (se: number) => 4 * Math.SQRT2 * se + 1e-4;
      expect(Math.abs(12 / b.shape.lower - row.q[i95])).toBeLessThan(tol(row.qSE[i95]));
      expect(Math.abs(12 / b.shape.upper - row.q[i05])).toBeLessThan(tol(row.qSE[i05]));
      expect(Math.abs(-12 * Math.log(b.scale.lower / 400) - row.t[i95])).toBeLessThan(tol(row.tSE[i95]));
      expect(Math.abs(-12 * Math.log(b.scale.upper / 400) - row.t[i05])).toBeLessThan(tol(row.tSE[i05]));
    });
  }

  it("n = 5: the modulus bounds divide by the ASTM C1239 / Thoman, Bain & Antle factors", () => {
    // from memory, 2-3 digits: q_0.05 = 0.683, q_0.95 = 2.779 at n = 5 (ASTM C1239 table after Thoman, Bain &
    // Antle 1969). Tolerance 3 % reflects the recall.
    const b = datasheetBounds({ shape: 10, scale: 350, specimens: 5, unbiased: false });
    expect(relativeError(b.shape.lower, 10 / 2.779)).toBeLessThan(0.03);
    expect(relativeError(b.shape.upper, 10 / 0.683)).toBeLessThan(0.03);
  });

  it("covers the true modulus at the stated rate (800 seeded samples of 12, m = 9)", () => {
    // A 90 % two-sided interval from the ML values must hold the truth 90 % of the time: binomial sd 0.0106.
    const random = new SeededRandom(20261202);
    let inside = 0;
    const trials = 800;
    for (let k = 0; k < trials; k++) {
      const strengths = Array.from({ length: 12 }, () => 300 * Math.pow(random.exponential(), 1 / 9));
      const fit = fitMaximumLikelihood({ strengths });
      const reported = pivotalTable().unbiasingFactor(12) * fit.shape;
      const b = datasheetBounds({ shape: reported, scale: fit.scale, specimens: 12 });
      if (b.shape.lower <= 9 && 9 <= b.shape.upper) inside++;
    }
    expect(Math.abs(inside / trials - 0.9)).toBeLessThan(3 * 0.0106);
  });
});

describe("DATASHEETBOUNDS in a cell", () => {
  it("spills six labelled rows, in the documented order, each confidence with its sidedness", () => {
    const t = guarded.DATASHEETBOUNDS(10.2, 412, 30, true, 0.9, 0.999) as unknown[][];
    expect(t.map((r) => r[0])).toEqual([
      "modulus, lower bound (90 %, two-sided)",
      "modulus, upper bound (90 %, two-sided)",
      "characteristic strength, lower bound (90 %, two-sided)",
      "characteristic strength, upper bound (90 %, two-sided)",
      "design stress (maximum-likelihood estimate)",
      "design stress, lower bound (95 %, one-sided)",
    ]);
    const core = datasheetBounds({ shape: 10.2, scale: 412, specimens: 30, survival: 0.999 });
    expect(t.map((r) => r[1])).toEqual([core.shape.lower, core.shape.upper, core.scale.lower, core.scale.upper, core.designStress!.estimate, core.designStress!.lower]);
    expect(spillShapes.DATASHEETBOUNDS).toEqual({ rows: 6, cols: 2 });
    // The JSDoc example's documented value (the last row, 172.1).
    expect(relativeError(t[5][1] as number, 172.1)).toBeLessThan(5e-4);
    // Without a survival the design-stress rows stay blank; the default is an unbiased modulus.
    const short = guarded.DATASHEETBOUNDS(10.2, 412, 30) as unknown[][];
    expect(short.slice(0, 4)).toEqual(t.slice(0, 4));
    expect(short.slice(4)).toEqual([["", ""], ["", ""]]);
    expect(guarded.DATASHEETBOUNDS(10.2, 412, 30, "TRUE" as any)).toEqual(short);
    expect(guarded.DATASHEETBOUNDS(10.2, 412, 30, null as any, null as any, "" as any)).toEqual(short);
  });

  it("bad inputs are #VALUE! with a message; two specimens need the raw modulus", () => {
    for (const r of [
      guarded.DATASHEETBOUNDS(-10, 412, 30),
      guarded.DATASHEETBOUNDS(10, 0, 30),
      guarded.DATASHEETBOUNDS(10, 412, 29.5),
      guarded.DATASHEETBOUNDS(10, 412, 1, false),
      guarded.DATASHEETBOUNDS(10, 412, 2),
      guarded.DATASHEETBOUNDS(10, 412, 30, "maybe" as any),
      guarded.DATASHEETBOUNDS(10, 412, 30, true, 1.2),
      guarded.DATASHEETBOUNDS(10, 412, 30, true, 0.995), // two-sided needs the 0.0025 quantile
      guarded.DATASHEETBOUNDS(10, 412, 30, true, 0.9, 1),
      guarded.DATASHEETBOUNDS(10, 412, 30, true, 0.9, 0.99, 0),
      guarded.DATASHEETBOUNDS("x" as any, 412, 30),
      guarded.DATASHEETBOUNDS(null as any, 412, 30),
    ]) {
      expect(code(r)).toBe("#VALUE!");
      expect((r as { message: string }).message).toMatch(/\w{4}/);
      expect((r as { message: string }).message).not.toMatch(/NaN|Infinity/);
    }
    expect((guarded.DATASHEETBOUNDS(10, 412, 2) as { message: string }).message).toMatch(/raw maximum-likelihood modulus/);
    expect(Array.isArray(guarded.DATASHEETBOUNDS(10, 412, 2, false))).toBe(true);
    expectInputError(() => datasheetBounds({ shape: 10, scale: 400, specimens: 2 }));
  });

  it("spills through the embedded engine", async () => {
    const { functions: metadata } = await generateMetadata();
    const { grids } = evaluateWorkbook({ kind: "csv", sheets: { S: [["=BRITTLE.DATASHEETBOUNDS(10.2, 412, 30, TRUE(), 0.9, 0.999)", null]] } }, metadata);
    const want = guarded.DATASHEETBOUNDS(10.2, 412, 30, true, 0.9, 0.999) as unknown[][];
    expect(grids.S.slice(0, 6).map((r) => r.slice(0, 2))).toEqual(want);
  });
});

describe("the censoring range directly follows the strengths", () => {
  it("MODULUSBOUNDS(strengths, flags) reads the flags as censoring (a range 2nd used to be taken for the confidence)", () => {
    const strengths = [[312], [355], [371], [389], [398], [402], [415], [421], [433], [447]];
    const flags = strengths.map((_, i) => [i === 3 || i === 7]);
    const cell = guarded.MODULUSBOUNDS(strengths, flags) as unknown[][];
    const core = parameterBounds({ strengths: strengths.map((r) => r[0]), censored: flags.map((r) => r[0]) });
    expect(cell.map((r) => r[1])).toEqual([core.shape.lower, core.shape.upper]);
    expect(guarded.CHARSTRENGTHBOUNDS(strengths, flags, 0.9, 1)).toEqual([
      ["characteristic strength, lower bound (90 %, one-sided)", parameterBounds({ strengths: strengths.map((r) => r[0]), censored: flags.map((r) => r[0]), sides: 1 }).scale.lower],
      ["characteristic strength, upper bound (90 %, one-sided)", parameterBounds({ strengths: strengths.map((r) => r[0]), censored: flags.map((r) => r[0]), sides: 1 }).scale.upper],
    ]);
    const bound = guarded.DESIGNSTRESSBOUND(0.999, strengths, flags, 0.95, 4);
    expect(bound).toBe(designStressBound({ strengths: strengths.map((r) => r[0]), censored: flags.map((r) => r[0]), survival: 0.999, confidence: 0.95, sizeRatio: 4 }).lower);
  });
});
