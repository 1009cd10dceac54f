// Test planning (src/design/specimens-needed.ts) against an independent seeded simulation of the
// design-stress pivot: numpy 2.4.6 via test/fixtures/generate_specimens_needed.py (2e5 replications
// per sample size, drawn at the tested log hazards directly, no angle grid or table).
import { describe, expect, it } from "vitest";
import { boundRatio, MOST_SPECIMENS, PLANNING_SIZES, specimensNeeded } from "../src/design/specimens-needed";
import { InputError } from "../src/errors";
import { quantilePivotQuantile } from "../src/weibull/quantile-pivot-table";
import { fixture } from "./helpers";

const ref = fixture("specimens_needed.json");

describe("the planned bound ratio exp(-u_C/m) against the simulated pivot (specimens_needed.json)", () => {
  for (const c of ref.cases) {
    it(`n = ${c.specimens}, S = ${c.survival}, k = ${c.sizeRatio}, C = ${c.confidence}`, () => {
      const u = quantilePivotQuantile({ specimens: c.specimens, logHazard: c.logHazard, probability: c.confidence });
      // Two Monte Carlo estimates (the shipped table, 1e6 draws; this one, 2e5, its standard error
      // from 20 batches) plus the table's interpolation between sample sizes and angles: within 5
      // standard errors of this run (measured: 4.5 at worst, n = 10 and S = 0.5, an absolute 0.008 in u,
      // 0.08 % in the ratio at m = 10).
      expect(Math.abs(u - c.pivotQuantile)).toBeLessThan(5 * c.standardError);
      const ratio = boundRatio({ specimens: c.specimens, shape: 10, survival: c.survival, sizeRatio: c.sizeRatio, confidence: c.confidence });
      expect(Math.abs(Math.log(ratio) - Math.log(c.ratioAtModulus10))).toBeLessThan((5 * c.standardError) / 10);
    });
  }

  it("SPECIMENSNEEDED returns the simulated sample size when the target is the simulated ratio there", () => {
    for (const c of ref.cases.filter((x: any) => x.specimens >= 5 && x.survival > 0.5)) {
      const n = specimensNeeded({
        targetRatio: c.ratioAtModulus10,
        shape: 10,
        survival: c.survival,
        sizeRatio: c.sizeRatio,
        confidence: c.confidence,
      }).specimens;
      // Monte Carlo error of either estimate can move the crossing by one specimen.
      expect(Math.abs((n as number) - c.specimens), JSON.stringify(c)).toBeLessThanOrEqual(1);
    }
  });
});

describe("specimensNeeded: its definition", () => {
  it("is the smallest n meeting the target (the ratio at n - 1 falls short)", () => {
    for (const target of [0.5, 0.7, 0.8, 0.9]) {
      for (const survival of [0.99, 0.999999]) {
        const { specimens, ratio } = specimensNeeded({ targetRatio: target, shape: 8, survival });
        expect(ratio).toBeGreaterThanOrEqual(target);
        const n = specimens as number;
        if (n > 2) expect(boundRatio({ specimens: n - 1, shape: 8, survival })).toBeLessThan(target);
      }
    }
  });

  it("the planned ratio rises with the number of specimens over the planning table", () => {
    for (const survival of [0.5, 0.999, 0.9999999]) {
      const ratios = PLANNING_SIZES.map((n) => boundRatio({ specimens: n, shape: 10, survival }));
      for (let i = 1; i < ratios.length; i++) expect(ratios[i]).toBeGreaterThan(ratios[i - 1]);
    }
  });

  it("a target beyond reach gives null with the ratio at the largest searched size", () => {
    const r = specimensNeeded({ targetRatio: 0.999, shape: 5, survival: 0.999999 });
    expect(r.specimens).toBeNull();
    expect(r.ratio).toBeCloseTo(boundRatio({ specimens: MOST_SPECIMENS, shape: 5, survival: 0.999999 }), 12);
  });

  it("rejects inputs outside the domain (InputError of kind input)", () => {
    const bad = [
      () => specimensNeeded({ targetRatio: 1, shape: 10, survival: 0.999 }),
      () => specimensNeeded({ targetRatio: 0, shape: 10, survival: 0.999 }),
      () => specimensNeeded({ targetRatio: 0.8, shape: -1, survival: 0.999 }),
      () => specimensNeeded({ targetRatio: 0.8, shape: 10, survival: 1 }),
      () => specimensNeeded({ targetRatio: 0.8, shape: 10, survival: 0.9, sizeRatio: 0 }),
      () => specimensNeeded({ targetRatio: 0.8, shape: 10, survival: 0.9, confidence: 0.3 }),
      () => boundRatio({ specimens: 1, shape: 10, survival: 0.9 }),
      () => boundRatio({ specimens: 2.5, shape: 10, survival: 0.9 }),
    ];
    for (const f of bad) {
      expect(f).toThrow(InputError);
      try {
        f();
      } catch (e) {
        expect((e as InputError).kind).toBe("input");
      }
    }
  });
});
