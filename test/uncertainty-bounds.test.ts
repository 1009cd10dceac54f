// Confidence bounds on m and sigma_theta and the lower bound on the design
// stress: against an independent numpy simulation (uncertainty.json, written
// by test/fixtures/generate_uncertainty.py with its own ML solver and
// seeds), the recalled Thoman, Bain & Antle / ASTM C1239 factors, the
// coverage the method promises, and the cell policy.
import { describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { guarded } from "../functions/registry";
import { SeededRandom } from "../src/numeric/random";
import { parameterBounds, pivotalSource } from "../src/weibull/confidence-bounds";
import { designStressBound } from "../src/weibull/design-stress-bound";
import { fitMaximumLikelihood } from "../src/weibull/maximum-likelihood";
import { pivotalTable } from "../src/weibull/pivotal-table";
import { solveShapeFromLogs } from "../src/weibull/pivotal-simulation";
import { quantilePivotQuantile } from "../src/weibull/quantile-pivot-table";
import quantilePivotFile from "../src/weibull/tables/quantile-pivot.json";
import pivotalFile from "../src/weibull/tables/pivotal-quantiles.json";
import { fixture, relativeError } from "./helpers";

const ref = fixture("uncertainty.json");
const boot = fixture("censored_bootstrap.json");
const fits = fixture("weibull_fits.json").datasets;
const column = (xs: readonly unknown[]) => xs.map((x) => [x]);
const code = (r: CellResult) => (isCellFailure(r) ? r.cellError : r);

/** Weibull strengths drawn with the add-in's own seeded generator: th * E^(1/m). */
function weibullSample(random: SeededRandom, n: number, shape: number, scale: number): number[] {
  return Array.from({ length: n }, () => scale * Math.pow(random.exponential(), 1 / shape));
}

describe("complete samples: bounds from the pivotal table", () => {
  // Bounds are m_hat/q and th_hat exp(-t/m_hat) (ASTM C1239 sec. 8); here the q and t come from the
  // independent numpy simulation in uncertainty.json instead of the table, so the comparison checks the
  // table reading and the formulas together. Tolerance: 4 combined Monte Carlo standard errors.
  for (const row of ref.completeQuantilePivot.filter((r: any) => r.n <= 500)) {
    it(`n = ${row.n}: 90 % two-sided bounds match the numpy quantiles of q and t`, () => {
      const random = new SeededRandom(1000 + row.n);
      const strengths = weibullSample(random, row.n, 9, 420);
      const fit = fitMaximumLikelihood({ strengths });
      const b = parameterBounds({ strengths, confidence: 0.9 });
      const i05 = row.probabilities.indexOf(0.05);
      const i95 = row.probabilities.indexOf(0.95);
      const table = pivotalFile.rows.find((r: any) => r.n === row.n);
      // The table's own SE where the size is tabulated; else (between rows) the fixture's SE stands in.
      const tableSe = (key: "qSE" | "tSE", j: number) => (table ? (table as any)[key][pivotalFile.probabilities.indexOf(row.probabilities[j])] : row[key][j]);
      const tolQ = (j: number) => 4 * Math.hypot(row.qSE[j], tableSe("qSE", j)) + 1e-4;
      const tolT = (j: number) => 4 * Math.hypot(row.tSE[j], tableSe("tSE", j)) + 1e-4;
      expect(Math.abs(fit.shape / b.shape.lower - row.q[i95])).toBeLessThan(tolQ(i95));
      expect(Math.abs(fit.shape / b.shape.upper - row.q[i05])).toBeLessThan(tolQ(i05));
      expect(Math.abs(-fit.shape * Math.log(b.scale.lower / fit.scale) - row.t[i95])).toBeLessThan(tolT(i95));
      expect(Math.abs(-fit.shape * Math.log(b.scale.upper / fit.scale) - row.t[i05])).toBeLessThan(tolT(i05));
    });
  }

  it("agrees with the recalled ASTM C1239 / Thoman, Bain & Antle 90 % factors", () => {
    // from memory, low confidence (2-3 digits): ASTM C1239 tables of q_0.05, q_0.95 (modulus) and
    // t_0.05, t_0.95 (characteristic strength) after Thoman, Bain & Antle (1969), Technometrics 11:445.
    // Tolerance 3 % (q) and 0.03 (t) reflects the recall, not the simulation (whose error is ~0.1 %).
    const recalled = [
      { n: 5, q05: 0.683, q95: 2.779, t05: -1.247, t95: 1.107 },
      { n: 10, t05: -0.666, t95: 0.628 },
    ];
    const table = pivotalTable();
    for (const r of recalled) {
      if (r.q05 !== undefined) {
        expect(relativeError(table.shapeQuantile(r.n, 0.05), r.q05)).toBeLessThan(0.03);
        expect(relativeError(table.shapeQuantile(r.n, 0.95), r.q95!)).toBeLessThan(0.03);
      }
      expect(Math.abs(table.scaleQuantile(r.n, 0.05) - r.t05)).toBeLessThan(0.03);
      expect(Math.abs(table.scaleQuantile(r.n, 0.95) - r.t95)).toBeLessThan(0.03);
    }
  });

  it("covers the true parameters at the stated rate (1000 seeded samples, n = 10, m = 8)", () => {
    // A two-sided 90 % interval must contain the truth 90 % of the time: binomial sd sqrt(.09/1000) = 0.0095.
    const random = new SeededRandom(4242);
    let shapeIn = 0;
    let scaleIn = 0;
    const trials = 1000;
    for (let k = 0; k < trials; k++) {
      const b = parameterBounds({ strengths: weibullSample(random, 10, 8, 500), confidence: 0.9 });
      if (b.shape.lower <= 8 && 8 <= b.shape.upper) shapeIn++;
      if (b.scale.lower <= 500 && 500 <= b.scale.upper) scaleIn++;
    }
    expect(Math.abs(shapeIn / trials - 0.9)).toBeLessThan(3 * 0.0095);
    expect(Math.abs(scaleIn / trials - 0.9)).toBeLessThan(3 * 0.0095);
  });

  it("a one-sided bound at C is the lower end of the two-sided interval at 2C - 1", () => {
    const strengths = weibullSample(new SeededRandom(7), 24, 11, 300);
    const one = parameterBounds({ strengths, confidence: 0.95, sides: 1 });
    const two = parameterBounds({ strengths, confidence: 0.9, sides: 2 });
    expect(relativeError(one.shape.lower, two.shape.lower)).toBeLessThan(1e-12);
    expect(relativeError(one.scale.upper, two.scale.upper)).toBeLessThan(1e-12);
    expect(two.shape.lower).toBeLessThan(fitMaximumLikelihood({ strengths }).shape);
  });
});

describe("censored samples: bootstrap conditional on the censoring values", () => {
  it("the fast solve inside every simulation agrees with the 40-digit ML fits (weibull_fits.json) to 1e-8", () => {
    for (const d of fits) {
      const max = Math.max(...d.strengths);
      const z = Float64Array.from(d.strengths, (x: number) => Math.log(x / max));
      const flags = Uint8Array.from(d.censored ?? d.strengths.map(() => false), (c: boolean) => (c ? 1 : 0));
      const failures = flags.length - flags.reduce((a, b) => a + b, 0);
      const r = solveShapeFromLogs(z, flags, failures);
      expect(r.converged).toBe(true);
      expect(relativeError(r.shape, d.ml.shapeFloat), d.id).toBeLessThan(1e-8);
      const scale = max * Math.exp(Math.log(r.weightSum / failures) / r.shape);
      expect(relativeError(scale, d.ml.scaleFloat), d.id).toBeLessThan(1e-8);
    }
  });

  for (const c of boot.datasets) {
    it(`${c.id}: bootstrap quantiles of q, t and u match numpy's competing-population bootstrap of the same data`, () => {
      // source: numpy 2.4 + mpmath 1.3 via test/fixtures/generate_censored_bootstrap.py, which draws a and b
      // separately (we draw the weaker directly): an independent check of that shortcut too.
      const sample = { strengths: c.strengths, censored: c.censored };
      const fit = fitMaximumLikelihood(sample);
      expect(relativeError(fit.shape, c.mlShape)).toBeLessThan(1e-10); // 30-digit mpmath fit
      const source = pivotalSource(sample, fit);
      expect(source.kind).toBe("bootstrap");
      const reps = source.replications!;
      // Our standard error is the fixture's scaled by sqrt(its replications / ours): 4 combined SEs.
      const inflate = Math.sqrt(1 + c.replications / reps);
      for (const p of [0.025, 0.05, 0.1, 0.5, 0.9, 0.95, 0.975]) {
        const j = c.probabilities.indexOf(p);
        expect(Math.abs(source.shapeQuantile(p) - c.q[j]), `q at ${p}`).toBeLessThan(4 * inflate * c.qSE[j]);
        expect(Math.abs(source.scaleQuantile(p) - c.t[j]), `t at ${p}`).toBeLessThan(4 * inflate * c.tSE[j]);
      }
      for (const u of c.u) {
        for (const p of [0.9, 0.95]) {
          const j = c.probabilities.indexOf(p);
          // Survival e^-1 and size ratio e^-w put the bound at log hazard w.
          const r = designStressBound({ ...sample, survival: Math.exp(-1), confidence: p, sizeRatio: Math.exp(-u.w) });
          expect(r.source).toBe("bootstrap");
          const uOurs = fit.shape * Math.log(r.estimate / r.lower);
          expect(Math.abs(uOurs - u.quantiles[j]), `u(w=${u.w}) at ${p}`).toBeLessThan(4 * inflate * u.se[j]);
        }
      }
    });
  }

  // Coverage under competing populations: test/uncertainty-censored-coverage.test.ts.

  it("gives the same numbers on every call (seeded by the data) and refuses tails it cannot resolve", () => {
    const c = boot.datasets[0];
    const sample = { strengths: c.strengths, censored: c.censored };
    const a = guarded.MODULUSBOUNDS(column(sample.strengths), column(sample.censored), 0.9);
    const b = parameterBounds({ ...sample, confidence: 0.9 });
    expect(a).toEqual([
      ["modulus, lower bound (90 %, two-sided)", b.shape.lower],
      ["modulus, upper bound (90 %, two-sided)", b.shape.upper],
    ]);
    expect(designStressBound({ ...sample, survival: 0.99 }).lower).toBe(designStressBound({ ...sample, survival: 0.99 }).lower);
    // 200 specimens get 2000 bootstrap draws: the 0.005 quantile would rest on 10 of them.
    const big = weibullSample(new SeededRandom(31), 200, 9, 300);
    const flags = big.map((_, i) => i % 9 === 0);
    expect(code(guarded.MODULUSBOUNDS(column(big), column(flags), 0.99))).toBe("#VALUE!");
    expect(typeof (guarded.MODULUSBOUNDS(column(big), column(flags), 0.9) as unknown[][])[0][1]).toBe("number");
  });
});

describe("design stress bound, complete samples", () => {
  // u-quantiles of the table reader against the independent numpy simulation: table rows (7..120),
  // between rows (57, 230: interpolation in 1/sqrt(n)) and beyond the table (800: large-n form).
  for (const row of ref.completeQuantilePivot) {
    it(`n = ${row.n}: u quantiles match numpy at every w`, () => {
      const tabulated = quantilePivotFile.rows.find((r: any) => r.n === row.n);
      const tableReps = tabulated?.replications ?? quantilePivotFile.rows[quantilePivotFile.rows.length - 1].replications;
      // Interpolation between rows / the large-n form adds its own error: the generator measured the
      // large-n hold-out at 0.003 in v; allow 0.004 * sqrt(1 + w^2) on top of the Monte Carlo error.
      const extra = tabulated ? 0 : 0.004;
      for (const u of row.u) {
        const degrees = (Math.atan(u.w) * 180) / Math.PI;
        const onGrid = Math.abs(degrees / 5 - Math.round(degrees / 5)) < 1e-9;
        for (const p of [0.05, 0.5, 0.9, 0.95, 0.975]) {
          const j = row.probabilities.indexOf(p);
          const ours = quantilePivotQuantile({ specimens: row.n, logHazard: u.w, probability: p });
          const seTable = u.se[j] * Math.sqrt(row.replications / tableReps);
          // 4 combined standard errors; off the 5-degree grid also the Catmull-Rom error, which the
          // generator measured at up to 1.3 of the table's standard errors for n >= 3: allow 2.
          const tol = 4 * Math.hypot(u.se[j], seTable) + (onGrid ? 0 : 2 * seTable) + extra * Math.hypot(1, u.w) + 1e-6;
          expect(Math.abs(ours - u.quantiles[j]), `w = ${u.w}, p = ${p}`).toBeLessThan(tol);
        }
      }
    });
  }

  it("the table's v = t (angle 0) and v = 1 - q (angle 90) columns agree with the q/t pivotal table", () => {
    // Two independent seeded simulations (tools/simulate_quantile_pivot_table.py and
    // tools/simulate_pivotal_tables.py): differences in units of their combined standard error.
    const angles = quantilePivotFile.anglesDegrees;
    const a0 = angles.indexOf(0);
    const a90 = angles.indexOf(90);
    const P = pivotalFile.probabilities.length;
    const z: number[] = [];
    for (const row of quantilePivotFile.rows) {
      const other: any = pivotalFile.rows.find((r: any) => r.n === row.n);
      const ratio = other.replications / row.replications;
      for (let j = 0; j < P; j++) {
        z.push((row.v[a0][j] - other.t[j]) / (other.tSE[j] * Math.sqrt(1 + ratio)));
        z.push((row.v[a90][j] - (1 - other.q[P - 1 - j])) / (other.qSE[P - 1 - j] * Math.sqrt(1 + ratio)));
      }
    }
    const rms = Math.sqrt(z.reduce((s, v) => s + v * v, 0) / z.length);
    expect(rms).toBeGreaterThan(0.7); // pure noise has rms 1: much less would mean the SEs are overstated
    expect(rms).toBeLessThan(1.3);
    // 2190 comparisons whose batch standard errors are themselves uncertain by about 16 % (20 batches):
    // a gross error (a shifted column, a wrong sign) shows as a deviation far beyond 6.
    expect(Math.max(...z.map(Math.abs))).toBeLessThan(6);
  });

  it("at a cumulative hazard of 1 the bound is the one-sided lower bound on sigma_theta (two tables agree)", () => {
    const strengths = weibullSample(new SeededRandom(21), 20, 12, 380);
    const d = designStressBound({ strengths, survival: Math.exp(-1), confidence: 0.95 });
    const b = parameterBounds({ strengths, confidence: 0.95, sides: 1 });
    // t_0.95 at n = 20 has a standard error near 0.002 in each table: 0.01/m_hat in ln(stress) is generous.
    expect(Math.abs(Math.log(d.lower / b.scale.lower))).toBeLessThan(0.01 / fitMaximumLikelihood({ strengths }).shape);
  });

  it("covers the true design stress at the stated rate (1000 samples, n = 10, S = 0.9999, k = 25)", () => {
    const random = new SeededRandom(2718);
    const shape = 9;
    const scale = 450;
    const truth = scale * Math.exp((Math.log(-Math.log(0.9999)) - Math.log(25)) / shape);
    let hits = 0;
    const trials = 1000;
    for (let k = 0; k < trials; k++) {
      const r = designStressBound({ strengths: weibullSample(random, 10, shape, scale), survival: 0.9999, sizeRatio: 25, confidence: 0.9 });
      if (r.lower <= truth) hits++;
    }
    expect(Math.abs(hits / trials - 0.9)).toBeLessThan(3 * 0.0095);
  });

  it("is centred on DESIGNSTRESS at the raw ML fit and lies below it", () => {
    const strengths = weibullSample(new SeededRandom(5), 30, 10, 400);
    const fit = fitMaximumLikelihood({ strengths });
    const r = designStressBound({ strengths, survival: 0.9999, sizeRatio: 25, confidence: 0.95 });
    const point = guarded.DESIGNSTRESS(0.9999, fit.shape, fit.scale, 25) as number;
    expect(relativeError(r.estimate, point)).toBeLessThan(1e-13);
    expect(r.lower).toBeLessThan(r.estimate);
    expect(guarded.DESIGNSTRESSBOUND(0.9999, column(strengths), null, 0.95, 25)).toBe(r.lower);
  });
});

describe("cell policy", () => {
  const s = column([312, 355, 371, 389, 398, 402, 415, 421]);
  it("confidence outside (0, 1), or beyond the simulated range, is #VALUE!", () => {
    for (const c of [0, 1, 1.5, -0.2]) {
      expect(code(guarded.MODULUSBOUNDS(s, null, c))).toBe("#VALUE!");
      expect(code(guarded.CHARSTRENGTHBOUNDS(s, null, c))).toBe("#VALUE!");
      expect(code(guarded.DESIGNSTRESSBOUND(0.999, s, null, c))).toBe("#VALUE!");
      expect(code(guarded.FIT(s, null, c))).toBe("#VALUE!");
    }
    expect(code(guarded.MODULUSBOUNDS(s, null, 0.995))).toBe("#VALUE!"); // two-sided needs the 0.0025 quantile
    expect(code(guarded.MODULUSBOUNDS(s, null, 0.995, 1))).not.toBe("#VALUE!");
    expect(code(guarded.DESIGNSTRESSBOUND(0.999, s, null, 0.999))).toBe("#VALUE!");
    expect(code(guarded.MODULUSBOUNDS(s, null, 0.9, 3))).toBe("#VALUE!");
  });

  it("bad strengths, flags, survival and size ratio follow the one policy", () => {
    expect(code(guarded.MODULUSBOUNDS([[300], ["abc"], [400]]))).toBe("#VALUE!");
    expect(code(guarded.MODULUSBOUNDS([[300], [-5], [400]]))).toBe("#VALUE!");
    expect(code(guarded.MODULUSBOUNDS([[300]]))).toBe("#VALUE!");
    expect(code(guarded.MODULUSBOUNDS([[300], [0], [null], [""], [350], [410]]))).toEqual(guarded.MODULUSBOUNDS([[300], [350], [410]]));
    expect(code(guarded.CHARSTRENGTHBOUNDS(s, [[true], [false]], 0.9))).toBe("#VALUE!");
    expect(code(guarded.DESIGNSTRESSBOUND(1, s))).toBe("#VALUE!");
    expect(code(guarded.DESIGNSTRESSBOUND(0, s))).toBe("#VALUE!");
    expect(code(guarded.DESIGNSTRESSBOUND(0.99, s, null, 0.9, 0))).toBe("#VALUE!");
    expect(code(guarded.DESIGNSTRESSBOUND("x" as unknown as number, s))).toBe("#VALUE!");
    expect(code(guarded.MODULUSBOUNDS([[300], [300], [300]]))).toBe("#VALUE!"); // no finite ML modulus
    const all = [[300, true], [350, true], [410, false]];
    expect(code(guarded.MODULUSBOUNDS(all.map((r) => [r[0]]), all.map((r) => [r[1]]), 0.9))).toBe("#VALUE!"); // one failure
  });
});
