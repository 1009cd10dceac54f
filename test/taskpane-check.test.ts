/**
 * The design check's logic without a page: reading pasted data and element
 * tables, the numbers of the result against published formulas, the caution
 * thresholds, the plot coordinates and the CSV export.
 *
 * References: the closed forms of the two-parameter Weibull distribution
 * (quantile, failure probability) and of power-law crack growth
 * (strength-probability-time relation, proof-test life; Evans & Wiederhorn
 * 1974), written out here; the binomial lot count against jstat 1.9.6's binomial CDF;
 * everything else is the core (tested against mpmath/scipy elsewhere), named
 * where used.
 */
import { describe, expect, it } from "vitest";
import jStat from "jstat";
import { runDesignCheck } from "../src/design/design-check";
import { cautionsFor, FAR_EXTRAPOLATION_DECADES } from "../src/design/check-cautions";
import { parsePasted, PasteError } from "../taskpane/app/parse-pasted";
import { parseElementTable, TableError } from "../taskpane/app/parse-table";
import { resultRows } from "../taskpane/app/result-table";
import { designCheckCsv } from "../taskpane/export/csv";
import { plotData, weibullY } from "../taskpane/plot/plot-data";
import { percentLabel } from "../taskpane/plot/probability-plot";
import { estimateWeibull } from "../src/weibull/estimate";
import { fitQuality } from "../src/weibull/anderson-darling";
import { relativeError } from "./helpers";
import { input, STRENGTHS } from "./taskpane-inputs";

// Typed values without a specimen count carry no uncertainty: the point-estimate path.
const typedPoint = (overrides = {}) =>
  input({ material: { kind: "typed", shape: 12, scale: 430 }, ...overrides });

describe("pasted strengths", () => {
  it("reads a column with a header, tab-separated censoring flags and blank lines, under the cell policy", () => {
    // A comma between a strength and a flag is no longer taken for granted ("430,1" may be 430.1):
    // test/hostile-input.test.ts covers commas and semicolons.
    const parsed = parsePasted("strength\tflag\n410\n\n420\tc\n430\t1\n 440 \t 0 \n0\n");
    expect(parsed.header).toBe(true);
    // The zero is no specimen, as a zero cell is (functions/cells.ts).
    expect(parsed.strengths).toEqual([410, 420, 430, 440]);
    expect(parsed.censored).toEqual([false, true, true, false]);
  });

  it("names the line of a bad value", () => {
    expect(() => parsePasted("410\n4x0\n")).toThrow(new PasteError('Line 2: "4x0" is not a number (use a point as the decimal separator).'));
    expect(() => parsePasted("410\n-5\n420")).toThrow(/Line 2 is negative/);
    expect(() => parsePasted("410\t1\t2")).toThrow(/at most one flag, found 3/);
    expect(() => parsePasted("410\tmaybe\n420")).toThrow(/Line 1 \(flag\) must be TRUE/);
    expect(() => parsePasted("  \n")).toThrow(/Paste or type/);
    expect(() => parsePasted("410")).toThrow(/at least two specimens/);
  });
});

describe("pasted element tables", () => {
  it("reads 1, 3 or 6 stress columns and a size, with or without a header", () => {
    expect(parseElementTable("s\tV\n100\t2\n-20\t3")).toEqual({ stresses: [[100], [-20]], columns: 1, sizes: [2, 3] });
    expect(parseElementTable("100 50 0 2\n80 80 0 1").columns).toBe(3);
    expect(parseElementTable("1,2,3,4,5,6,7").columns).toBe(6);
  });
  it("rejects a wrong column count, ragged rows, text and negative sizes, naming the line", () => {
    expect(() => parseElementTable("1 2 3")).toThrow(new TableError("Line 1: expected 2, 4 or 7 values (1, 3 or 6 stresses and a size), found 3."));
    expect(() => parseElementTable("1 2\n1 2 3 4")).toThrow(/Line 2: expected 2 values/);
    expect(() => parseElementTable("h1 h2\n1 2\n1 x")).toThrow(/Line 3: "x" is not a number/);
    expect(() => parseElementTable("1 -2")).toThrow(/Line 1: the element size is negative/);
  });
});

describe("the result against published formulas", () => {
  const r = runDesignCheck(input());
  const { shape: m, scale: th } = r.parameters;
  const k = 800 / 12.5;

  it("fits with the core's estimator", () => {
    const fit = estimateWeibull({ strengths: STRENGTHS }, "MLE-RAW"); // reference: the core
    expect(m).toBe(fit.shape);
    expect(th).toBe(fit.scale);
    expect(r.sizeRatio.value).toBe(k);
  });

  it("gives the design stress sigma_theta (-ln S / k)^(1/m) and Pf = 1 - exp(-k (s/sigma_theta)^m)", () => {
    // The two-parameter Weibull distribution, written out here (source: any statistics text).
    expect(relativeError(r.allowablePoint.value, th * Math.pow(-Math.log(0.9999) / k, 1 / m))).toBeLessThan(1e-13);
    expect(relativeError(r.failureProbabilityAtApplied.value, -Math.expm1(-k * Math.pow(180 / th, m)))).toBeLessThan(1e-13);
    expect(relativeError(r.expectedFailures.pointEstimate, 5000 * r.failureProbabilityAtApplied.value)).toBeLessThan(1e-15);
    // On the bound: reserve factor = lower-bound allowable / applied, margin of safety = reserve factor - 1.
    expect(relativeError(r.reserveFactor.value, r.allowableLower!.value / 180)).toBeLessThan(1e-15);
    expect(r.marginOfSafety.value).toBe(r.reserveFactor.value - 1);
  });

  it("gives the binomial lot count jstat 1.9.6 gives", () => {
    const p = r.failureProbabilityAtApplied.value;
    let want = 0;
    while (jStat.binomial.cdf(want, 5000, p) < 0.9) want++;
    expect(r.failuresUpperBound.pointEstimate).toBe(want);
    // On the bound the count uses the upper-bound failure probability.
    const pu = r.failureProbabilityUpper!.value;
    let wantBound = 0;
    while (jStat.binomial.cdf(wantBound, 5000, pu) < 0.9) wantBound++;
    expect(r.failuresUpperBound.value).toBe(wantBound);
  });

  it("measures the extrapolation from the lowest plotted failure, (i - 0.5)/N, at specimen size", () => {
    const lowest = 0.5 / STRENGTHS.length; // Hazen position of the weakest of 15
    const specimenPf = -Math.expm1(Math.log1p(-1e-4) / k);
    expect(r.extrapolationDecades).toBeCloseTo(Math.log10(lowest / specimenPf), 6);
  });

  it("says which method and assumptions produced each row (typed values without a specimen count: no bound)", () => {
    const t = runDesignCheck(typedPoint());
    const rows = resultRows(t);
    for (const row of rows) expect(row.basis.length, row.id).toBeGreaterThan(10);
    expect(rows.find((x) => x.id === "allowable-lower")!.display).toBe("not available");
    expect(t.verdict.onLowerBound).toBe(false);
    expect(t.verdict.text).toMatch(/point estimate: no confidence bound, not a design verdict on its own/);
  });

  it("turns failures per lot into the allowed failure probability", () => {
    const lot = runDesignCheck(input({ requirement: { kind: "lot", allowedFailures: 3 }, lotSize: 30000 }));
    expect(lot.targetFailureProbability.value).toBe(1e-4);
    expect(relativeError(lot.allowablePoint.value, th * Math.pow(-Math.log1p(-1e-4) / k, 1 / m))).toBeLessThan(1e-13);
  });
});

describe("lifetime and proof test against the power-law relations (B s^(n-2) + t s^n = B s_i^(n-2); t_min)", () => {
  const life = { lifetime: 3.15e7, timeUnit: "s" as const, n: 18, B: 5e5, bUnit: "MPa^2 s" };
  it("satisfies B s^(n-2) + t s^n = B s_i^(n-2), s_i the lower-bound inert allowable (the point estimate beside from the point s_i)", () => {
    const r = runDesignCheck(input({ lifetime: life, appliedStress: 60 }));
    const check = (s: number, si: number) => {
      const lhs = life.B * s ** (life.n - 2) + life.lifetime * s ** life.n;
      expect(relativeError(lhs, life.B * si ** (life.n - 2))).toBeLessThan(1e-12);
    };
    check(r.lifetimeAllowable!.value, r.allowableLower!.value);
    check(r.lifetimeAllowable!.pointEstimate, r.allowablePoint.value);
    // The lifetime governs, on the bound.
    expect(r.governing.check).toBe("lifetime");
    expect(r.reserveFactor.value).toBe(r.lifetimeAllowable!.value / 60);
  });

  it("gives t_min = B s_a^-n (s_p^(n-2) - s_a^(n-2)) and the truncated failure probability of survivors", () => {
    const r = runDesignCheck(input({ lifetime: life, proof: { proofStress: 300 }, appliedStress: 310 }));
    const { shape: m, scale: th } = r.parameters;
    const k = r.sizeRatio.value;
    const pf = -Math.expm1(-k * ((310 / th) ** m - (300 / th) ** m));
    expect(relativeError(r.proof!.survivorsFailureProbability.value, pf)).toBeLessThan(1e-10);
    expect(relativeError(r.proof!.breaks.pointEstimate, -Math.expm1(-k * (300 / th) ** m))).toBeLessThan(1e-13);
    expect(r.proof!.minimumLife!.value).toBe(0);
    expect(r.proof!.credited).toBe(false);

    const ok = runDesignCheck(input({ lifetime: life, proof: { proofStress: 300 }, appliedStress: 60 }));
    const tmin = life.B * 60 ** -life.n * (300 ** (life.n - 2) - 60 ** (life.n - 2));
    expect(relativeError(ok.proof!.minimumLife!.value, tmin)).toBeLessThan(1e-12);
    expect(ok.verdict.pass).toBe(tmin >= life.lifetime);
  });
});

describe("caution notes", () => {
  const ids = (r: ReturnType<typeof runDesignCheck>) => Object.fromEntries(cautionsFor(r).map((c) => [c.id, c.level]));

  it("always carries the extrapolation, size, environment and code notes, and the result carries the same list", () => {
    const r = runDesignCheck(input());
    const c = ids(r);
    for (const id of ["extrapolation", "size", "environment", "codes"]) expect(c[id], id).toBeDefined();
    expect(r.cautions).toEqual(cautionsFor(r));
    expect(r.cautions.find((x) => x.id === "codes")!.text).toMatch(/licensed engineer under the local codes/);
  });

  it("warns more strongly for a small sample, a far extrapolation, a huge size ratio and typed parameters", () => {
    expect(ids(runDesignCheck(input()))).toMatchObject({ sample: "note" }); // 15 specimens
    const small = runDesignCheck(input({ material: { kind: "data", strengths: STRENGTHS.slice(0, 8), method: "MLE-RAW", source: { kind: "pasted" } } }));
    expect(ids(small)).toMatchObject({ sample: "warning" });
    const far = runDesignCheck(input({ requirement: { kind: "survival", survival: 1 - 1e-7 } }));
    expect(far.extrapolationDecades!).toBeGreaterThan(FAR_EXTRAPOLATION_DECADES);
    expect(ids(far)).toMatchObject({ extrapolation: "warning" });
    const near = runDesignCheck(input({ part: { kind: "typed", effectiveSize: 12.5 }, requirement: { kind: "survival", survival: 0.99 } }));
    expect(near.extrapolationDecades!).toBeLessThan(FAR_EXTRAPOLATION_DECADES);
    expect(ids(near)).toMatchObject({ extrapolation: "note" });
    expect(ids(runDesignCheck(input({ part: { kind: "typed", effectiveSize: 2e4 } })))).toMatchObject({ size: "warning" });
    expect(ids(runDesignCheck(typedPoint()))).toMatchObject({ sample: "warning", bound: "warning" });
  });

  it("reports the core's goodness of fit and warns when it rejects at 5 %", () => {
    // Invented two-cluster sample: one Weibull line cannot fit it.
    const clusters = [200, 205, 210, 212, 215, 218, 220, 222, 225, 228, 500, 505, 510, 512, 515, 518, 520, 522, 525, 530];
    const poor = runDesignCheck(input({ material: { kind: "data", strengths: clusters, method: "MLE-RAW" }, appliedStress: 50 }));
    const q = fitQuality({ strengths: clusters }); // reference: the core (checked against Lawless/CMH-17 in its own suite)
    expect(poor.fitQuality).toEqual({ statistic: q.aStar, significance: q.osl });
    expect(q.osl).toBeLessThan(0.05);
    expect(ids(poor)).toMatchObject({ fit: "warning" });
    expect(cautionsFor(poor).find((c) => c.id === "fit")!.text).toContain(`A* ${q.aStar.toFixed(3)}`);
    const good = runDesignCheck(input());
    expect(good.fitQuality!.significance).toBeGreaterThan(0.05);
    expect(ids(good).fit).toBeUndefined();
  });
});

describe("probability plot coordinates", () => {
  const r = runDesignCheck(input());
  const d = plotData(r);
  it("puts the design point on the part-size line and spans the data and the design point", () => {
    expect(d.design).toEqual({ stress: r.allowablePoint.value, probability: r.targetFailureProbability.value });
    const { shape: m, scale: th } = r.parameters;
    // On Weibull axes the part line is y = m ln(s/theta) + ln k (the Weibull distribution function, rearranged).
    for (const pt of d.partLine!) {
      expect(weibullY(pt.probability)).toBeCloseTo(m * Math.log(pt.stress / th) + Math.log(r.sizeRatio.value), 9);
    }
    expect(d.probabilityRange[0]).toBeLessThan(r.targetFailureProbability.value);
    expect(d.stressRange[0]).toBeLessThan(r.allowablePoint.value);
    expect(d.stressRange[1]).toBeGreaterThan(Math.max(...STRENGTHS));
    expect(runDesignCheck(input({ part: { kind: "typed", effectiveSize: 12.5 } })).sizeRatio.value).toBe(1);
    expect(plotData(runDesignCheck(input({ part: { kind: "typed", effectiveSize: 12.5 } }))).partLine).toBeNull();
  });
  it("labels probabilities in percent", () => {
    expect(percentLabel(0.632)).toBe("63.2 %");
    expect(percentLabel(1e-4)).toBe("0.01 %");
    expect(percentLabel(1e-7)).toBe("1e-5 %");
  });
});

describe("CSV export", () => {
  it("writes every row with its basis, quotes text with commas, and defuses formula-like text", () => {
    const r = runDesignCheck(input({ stressUnit: "=MPa" }));
    const csv = designCheckCsv(r, resultRows(r), r.cautions);
    expect(csv.endsWith("\r\n")).toBe(true);
    expect(csv).toContain("'=MPa");
    expect(csv).not.toMatch(/(^|,)=/m);
    const lines = csv.split("\r\n");
    // The label holds a comma, so it is quoted; the full-precision number follows it.
    const allowable = lines.find((l) => l.startsWith('"Inert allowable stress, point estimate",'))!;
    expect(Number(allowable.split('",')[1].split(",")[0])).toBe(r.allowablePoint.value);
    expect(lines.filter((l) => /^\d/.test(l))).toHaveLength(STRENGTHS.length);
    // A basis with commas is one quoted field.
    expect(csv).toMatch(/"point estimate: two-parameter Weibull, size ratio 64, maximum likelihood/);
  });
});
