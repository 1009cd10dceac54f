// Competing flaw populations, the lot check and the modulus from a
// datasheet's CV. References: mpmath at 30 digits and numpy simulations
// through test/fixtures/generate_uncertainty.py (uncertainty.json), the
// 40-digit censored ML fits of weibull_fits.json, scipy's chi-square.
import { describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { guarded } from "../functions/registry";
import { competingDesignStress, competingFailureProbability, populationSample } from "../src/weibull/competing-populations";
import { meanStrength, strengthStandardDeviation } from "../src/weibull/distribution";
import { compareLots, lotPValue } from "../src/weibull/lot-comparison";
import { logOnePlusSquaredCv, modulusFromCoefficientOfVariation } from "../src/weibull/modulus-from-cv";
import { SeededRandom } from "../src/numeric/random";
import { fixture, relativeError } from "./helpers";

const ref = fixture("uncertainty.json");
const edges = fixture("competing_edges.json");
const lotTails = fixture("lot_pvalue.json");
const fits = fixture("weibull_fits.json").datasets;
const column = (xs: readonly unknown[]) => xs.map((x) => [x]);
const code = (r: CellResult) => (isCellFailure(r) ? r.cellError : r);

describe("competing flaw populations", () => {
  for (const c of ref.competing) {
    it(`stress ${c.stress}, S = ${c.survival}: failure probability and design stress equal mpmath`, () => {
      expect(relativeError(competingFailureProbability({ stress: c.stress, populations: c.populations }), c.failureProbability)).toBeLessThan(1e-13);
      expect(relativeError(competingDesignStress({ survival: c.survival, populations: c.populations }), c.designStress)).toBeLessThan(1e-12);
      const [a, b] = c.populations;
      expect(
        relativeError(guarded.COMPETINGFAILPROB(c.stress, a.shape, a.scale, b.shape, b.scale, a.sizeRatio, b.sizeRatio) as number, c.failureProbability),
      ).toBeLessThan(1e-13);
      expect(
        relativeError(guarded.COMPETINGDESIGNSTRESS(c.survival, a.shape, a.scale, b.shape, b.scale, a.sizeRatio, b.sizeRatio) as number, c.designStress),
      ).toBeLessThan(1e-12);
    });
  }

  it("ORIGINFIT with labels reproduces the 40-digit censored ML fit (weibull_fits.json)", () => {
    const d = fits.find((x: any) => x.id === "censored-n20");
    const labels = d.censored.map((c: boolean, i: number) => (c ? (i % 2 ? "pore" : "Inclusion") : i % 3 ? " Surface" : "surface"));
    const table = guarded.ORIGINFIT(column(d.strengths), column(labels), "SURFACE", 0.9, "MLE-RAW") as unknown[][];
    expect(table[1]).toEqual(["failures (population fitted)", d.censored.filter((c: boolean) => !c).length]);
    expect(relativeError(table[4][1] as number, d.ml.shapeFloat)).toBeLessThan(1e-12);
    expect(relativeError(table[7][1] as number, d.ml.scaleFloat)).toBeLessThan(1e-12);
    expect(table).toEqual(guarded.FIT(column(d.strengths), column(d.censored), 0.9, "MLE-RAW"));
  });

  it("origin labels follow the cell policy", () => {
    const s = column([300, 320, 350, 380]);
    expect(code(guarded.ORIGINFIT(s, column(["a", "", "a", "b"]), "a"))).toBe("#VALUE!");
    expect(code(guarded.ORIGINFIT(s, column(["a", "b"]), "a"))).toBe("#VALUE!");
    expect(code(guarded.ORIGINFIT(s, column(["a", "b", "a", "b"]), "c"))).toBe("#VALUE!");
    expect(code(guarded.ORIGINFIT(s, column(["a", "b", "b", "b"]), "a"))).toBe("#VALUE!"); // one failure
    expect(code(guarded.COMPETINGFAILPROB(300, 10, 400, 0, 900))).toBe("#VALUE!");
    expect(code(guarded.COMPETINGDESIGNSTRESS(1, 10, 400, 5, 900))).toBe("#VALUE!");
    expect(code(guarded.COMPETINGDESIGNSTRESS(0.99, 10, 400, 5, 900, -1))).toBe("#VALUE!");
    expect(() => populationSample({ strengths: [1, 2], origins: ["a", "b"], population: " " })).toThrow(/name the flaw population/);
  });

  describe("design stress where the solve's bracket ends are the root", () => {
    // Identical populations put the root on the lower end of the bracket, a negligible population on
    // the upper end; the residual there is rounding noise (this returned "did not converge").
    it("=BRITTLE.COMPETINGDESIGNSTRESS(0.999,10,400,10,400) is 400 (-ln 0.999 / 2)^(1/10)", () => {
      // source: closed form (two identical populations double the hazard of one), common practice
      const expected = 400 * Math.pow(-Math.log(0.999) / 2, 1 / 10);
      expect(relativeError(guarded.COMPETINGDESIGNSTRESS(0.999, 10, 400, 10, 400) as number, expected)).toBeLessThan(1e-14);
    });

    for (const c of edges.cases) {
      it(`${c.label}: equals the 50-digit root`, () => {
        // source: mpmath 1.3 at 50 digits via test/fixtures/generate_competing_edges.py
        expect(relativeError(competingDesignStress({ survival: c.survival, populations: c.populations }), c.designStress)).toBeLessThan(1e-13);
      });
    }

    it("converges on 4000 seeded pairs built to sit on the bracket's ends, hazard within a few ulp of ln s", () => {
      // Each case is its own check: the total hazard at the returned stress equals -ln S (common practice:
      // the defining equation, evaluated in the opposite direction to the solve).
      const random = new SeededRandom(20261202);
      let worst = 0;
      for (let i = 0; i < 4000; i++) {
        const mA = 0.5 + 60 * random.uniform();
        const thA = Math.exp(-8 + 24 * random.uniform());
        const kind = i % 4;
        const mB = kind === 0 ? mA : kind === 1 ? mA * (1 + 1e-12 * random.uniform()) : 0.5 + 60 * random.uniform();
        const thB = kind === 0 ? thA : kind === 1 ? thA * (1 + 1e-12 * random.uniform()) : thA * Math.exp((kind === 2 ? 1 : -1) * 40 * random.uniform());
        const survival = 1 - Math.exp(-30 * random.uniform());
        const populations = [{ shape: mA, scale: thA }, { shape: mB, scale: thB }];
        const s = competingDesignStress({ survival, populations });
        const hazard = Math.pow(s / thA, mA) + Math.pow(s / thB, mB);
        // The solve stops at 4 ulp of ln s; the hazard carries m |ln s| times that relative error.
        const scale = Math.max(mA, mB) * Math.max(1, Math.abs(Math.log(s))) * Number.EPSILON;
        worst = Math.max(worst, relativeError(hazard, -Math.log(survival)) / scale);
      }
      expect(worst).toBeLessThan(16);
    });
  });

  it("one population alone reduces to the two-parameter Weibull quantile", () => {
    const s = competingDesignStress({ survival: 0.9999, populations: [{ shape: 10, scale: 400, sizeRatio: 25 }] });
    expect(relativeError(s, guarded.DESIGNSTRESS(0.9999, 10, 400, 25) as number)).toBeLessThan(1e-13);
  });
});

describe("lot check", () => {
  for (const c of ref.lotCheck) {
    it(`${c.id}: statistic equals mpmath; the p-value matches numpy's simulation`, () => {
      const r = compareLots({ lot: c.lot, baseline: c.baseline });
      expect(relativeError(r.statistic, c.statistic)).toBeLessThan(1e-8);
      expect(relativeError(r.chiSquarePValue, c.chiSquareP)).toBeLessThan(1e-10); // scipy.stats.chi2.sf(LR, 2)
      // Two Monte Carlo p-values (ours: 40,000 replications, numpy: 100000): 4 combined standard errors.
      const se = Math.sqrt(Math.max(c.monteCarloP * (1 - c.monteCarloP), 1e-4) * (1 / r.replications + 1 / c.replications));
      expect(Math.abs(r.pValue - c.monteCarloP)).toBeLessThan(4 * se + 1 / r.replications);
      const cells = guarded.LOTCHECK(column(c.lot), column(c.baseline)) as unknown[][];
      expect(cells.map((row) => row[0])).toEqual(["likelihood-ratio statistic", "p-value (simulated)", "verdict"]);
      expect(cells[0][1]).toBe(r.statistic);
      expect(cells[1][1]).toBe(r.pValue);
      expect(cells[2][1]).toMatch(r.differs ? /^The lot differs/ : /^Consistent with the baseline/);
    });
  }

  for (const c of lotTails.cases) {
    it(`lot of ${c.lot} against a baseline of ${c.baseline}, statistic ${c.statistic}: p-value within 3 standard errors of 400,000 numpy draws`, () => {
      // source: numpy 2.4 via test/fixtures/generate_lot_pvalue.py (400,000 draws); ours 40,000, so 3 combined SEs.
      const r = lotPValue({ lotSpecimens: c.lot, baselineSpecimens: c.baseline, statistic: c.statistic });
      expect(r.replications).toBeGreaterThanOrEqual(40000);
      const se = Math.sqrt(c.pValue * (1 - c.pValue) * (1 / r.replications + 1 / c.replications));
      expect(Math.abs(r.pValue - c.pValue)).toBeLessThan(3 * se);
      expect(relativeError(r.pValueStandardError, Math.sqrt((r.pValue * (1 - r.pValue)) / r.replications))).toBeLessThan(1e-12);
    });
  }

  it("the verdict states the p-value with its Monte Carlo standard error", () => {
    const byId = Object.fromEntries(ref.lotCheck.map((c: any) => [c.id, c]));
    const r = compareLots({ lot: byId.same.lot, baseline: byId.same.baseline });
    expect(r.verdict).toMatch(/p = 0\.\d+ \+- 0\.\d+ by simulation/);
  });

  it("flags the weaker lot and passes the lot from the same distribution", () => {
    const byId = Object.fromEntries(ref.lotCheck.map((c: any) => [c.id, c]));
    expect(compareLots({ lot: byId.same.lot, baseline: byId.same.baseline }).differs).toBe(false);
    expect(compareLots({ lot: byId["weaker-lot"].lot, baseline: byId["weaker-lot"].baseline }).differs).toBe(true);
  });

  it("confidence and bad input follow the cell policy", () => {
    const a = column([300, 320, 350, 380]);
    expect(code(guarded.LOTCHECK(a, a, 1))).toBe("#VALUE!");
    expect(code(guarded.LOTCHECK(a, a, 0))).toBe("#VALUE!");
    expect(code(guarded.LOTCHECK(column([300]), a))).toBe("#VALUE!");
    expect(code(guarded.LOTCHECK(column([300, "x"]), a))).toBe("#VALUE!");
    expect(code(guarded.LOTCHECK(a, column([300, -2, 400])))).toBe("#VALUE!");
  });
});

describe("modulus from a datasheet's mean and standard deviation", () => {
  for (const c of ref.modulusFromCv) {
    it(`CV = ${c.cv}: equals the 30-digit root (mpmath)`, () => {
      expect(relativeError(modulusFromCoefficientOfVariation({ mean: 1, standardDeviation: c.cv }).shape, c.shape)).toBeLessThan(2e-13);
      expect(relativeError(guarded.MODULUSFROMCV(400, 400 * c.cv) as number, c.shape)).toBeLessThan(2e-13);
    });
  }

  it("round-trips through the mean and standard deviation of the distribution", () => {
    // At large m the forward CV (distribution.ts, a difference of log-gammas near 1) carries ~1e-15
    // absolute error on a CV^2 of 1.6/m^2, so the round trip is good to about 1e-16 m^2 relative.
    for (const m of [0.7, 1, 3.2, 10, 10.1, 25, 60, 400]) {
      const p = { shape: m, scale: 350 };
      const back = modulusFromCoefficientOfVariation({ mean: meanStrength(p), standardDeviation: strengthStandardDeviation(p) });
      expect(relativeError(back.shape, m), `m = ${m}`).toBeLessThan(Math.max(1e-13, 1e-15 * m * m));
      expect(back.converged).toBe(true);
    }
  });

  it("the series branch (1/m <= 0.1) and the log-gamma branch meet at m = 10", () => {
    // Both sides of the switch against each other and the distribution's own CV^2 (distribution.ts).
    const near = (m: number) => Math.log1p((strengthStandardDeviation({ shape: m, scale: 1 }) / meanStrength({ shape: m, scale: 1 })) ** 2);
    for (const m of [9.999999, 10, 10.000001]) expect(relativeError(logOnePlusSquaredCv(m), near(m))).toBeLessThan(1e-11);
  });

  it("bad input: #VALUE! for non-positive values and CVs no Weibull modulus gives, #VALUE! for text", () => {
    expect(code(guarded.MODULUSFROMCV(0, 10))).toBe("#VALUE!");
    expect(code(guarded.MODULUSFROMCV(380, 0))).toBe("#VALUE!");
    expect(code(guarded.MODULUSFROMCV(380, -4))).toBe("#VALUE!");
    expect(code(guarded.MODULUSFROMCV(1, 1e40))).toBe("#VALUE!");
    expect(code(guarded.MODULUSFROMCV(1, 1e-12))).toBe("#VALUE!");
    expect(code(guarded.MODULUSFROMCV("a" as unknown as number, 3))).toBe("#VALUE!");
  });
});
