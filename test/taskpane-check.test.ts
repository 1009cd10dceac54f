/**
 * The design check's logic without a page: reading pasted data and element
 * tables, the numbers of the result against published formulas, the caution
 * thresholds, the plot coordinates and the CSV export.
 *
 * References: the closed forms of METHODS.md sections 1 and 6 (quantile,
 * failure probability, strength-probability-time relation, proof-test life),
 * written out here; the binomial lot count against jstat 1.9.6's binomial CDF;
 * everything else is the core (tested against mpmath/scipy elsewhere), named
 * where used.
 */
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import jStat from "jstat";
import { runDesignCheck } from "../taskpane/app/check";
import { cautionsFor, FAR_EXTRAPOLATION_DECADES } from "../taskpane/app/cautions";
import { optionalCore } from "../taskpane/app/optional-core";
import { parsePasted, PasteError } from "../taskpane/app/parse-pasted";
import { parseElementTable, TableError } from "../taskpane/app/parse-table";
import { resultRows } from "../taskpane/app/result-table";
import { designCheckCsv } from "../taskpane/export/csv";
import { plotData, weibullY } from "../taskpane/plot/plot-data";
import { percentLabel } from "../taskpane/plot/probability-plot";
import { estimateWeibull } from "../src/weibull/estimate";
import { relativeError } from "./helpers";
import { input, STRENGTHS } from "./taskpane-inputs";


// Tests of the path without bounds or fit quality take the plug-ins out; every test gets the build's own back.
const built = { ...optionalCore };
function withoutOptionalCore(): void {
  delete optionalCore.designStressLowerBound;
  delete optionalCore.fitQuality;
  delete optionalCore.populationChecks;
}
beforeEach(() => Object.assign(optionalCore, built));
afterEach(() => {
  withoutOptionalCore();
  Object.assign(optionalCore, built);
});

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
  withoutOptionalCore();
  const r = runDesignCheck(input());
  Object.assign(optionalCore, built);
  const { shape: m, scale: th } = r.parameters;
  const k = 800 / 12.5;

  it("fits with the core's estimator", () => {
    const fit = estimateWeibull({ strengths: STRENGTHS }, "MLE-RAW"); // reference: the core
    expect(m).toBe(fit.shape);
    expect(th).toBe(fit.scale);
    expect(r.sizeRatio.value).toBe(k);
  });

  it("gives the design stress sigma_theta (-ln S / k)^(1/m) and Pf = 1 - exp(-k (s/sigma_theta)^m)", () => {
    // METHODS.md section 1, written out here.
    expect(relativeError(r.allowablePoint.value, th * Math.pow(-Math.log(0.9999) / k, 1 / m))).toBeLessThan(1e-13);
    expect(relativeError(r.failureProbabilityAtApplied.value, -Math.expm1(-k * Math.pow(180 / th, m)))).toBeLessThan(1e-13);
    expect(relativeError(r.expectedFailures.value, 5000 * r.failureProbabilityAtApplied.value)).toBeLessThan(1e-15);
    expect(relativeError(r.margin.value, r.allowablePoint.value / 180)).toBeLessThan(1e-15);
  });

  it("gives the binomial lot count jstat 1.9.6 gives", () => {
    const p = r.failureProbabilityAtApplied.value;
    let want = 0;
    while (jStat.binomial.cdf(want, 5000, p) < 0.9) want++;
    expect(r.failuresUpperBound.value).toBe(want);
  });

  it("measures the extrapolation from the lowest plotted failure, (i - 0.5)/N, at specimen size", () => {
    const lowest = 0.5 / STRENGTHS.length; // Hazen position of the weakest of 15
    const specimenPf = -Math.expm1(Math.log1p(-1e-4) / k);
    expect(r.extrapolationDecades).toBeCloseTo(Math.log10(lowest / specimenPf), 6);
  });

  it("says which method and assumptions produced each row (build without bounds)", () => {
    const rows = resultRows(r);
    for (const row of rows) expect(row.basis.length, row.id).toBeGreaterThan(10);
    expect(rows.find((x) => x.id === "allowable-lower")!.display).toBe("not available");
    expect(r.verdict.onLowerBound).toBe(false);
    expect(r.verdict.text).toMatch(/point-estimate allowable stress \(no confidence bound: not a design verdict on its own\)/);
  });

  it("turns failures per lot into the allowed failure probability", () => {
    const lot = runDesignCheck(input({ requirement: { kind: "lot", allowedFailures: 3 }, lotSize: 30000 }));
    expect(lot.targetFailureProbability.value).toBe(1e-4);
    expect(relativeError(lot.allowablePoint.value, th * Math.pow(-Math.log1p(-1e-4) / k, 1 / m))).toBeLessThan(1e-13);
  });
});

describe("lifetime and proof test against METHODS.md section 6", () => {
  const life = { lifetime: 3.15e7, timeUnit: "s", n: 18, B: 5e5 };
  it("satisfies B s^(n-2) + t s^n = B s_i^(n-2) with s_i the inert design strength", () => {
    const r = runDesignCheck(input({ lifetime: life, appliedStress: 60 }));
    const s = r.time.lifetimeAllowable!.value;
    const si = r.allowablePoint.value;
    const lhs = life.B * s ** (life.n - 2) + life.lifetime * s ** life.n;
    expect(relativeError(lhs, life.B * si ** (life.n - 2))).toBeLessThan(1e-12);
    // The lifetime governs: it is far below the inert allowable stress.
    expect(r.margin.value).toBe(s / 60);
  });

  it("gives t_min = B s_a^-n (s_p^(n-2) - s_a^(n-2)) and the truncated failure probability of survivors", () => {
    const r = runDesignCheck(input({ lifetime: life, proof: { proofStress: 300 }, appliedStress: 310 }));
    const { shape: m, scale: th } = r.parameters;
    const k = r.sizeRatio.value;
    const pf = -Math.expm1(-k * ((310 / th) ** m - (300 / th) ** m));
    expect(relativeError(r.time.postProofFailureProbability!.value, pf)).toBeLessThan(1e-10);
    expect(relativeError(r.time.proofBreaks!.value, -Math.expm1(-k * (300 / th) ** m))).toBeLessThan(1e-13);
    expect(r.time.proofMinimumLife).toBeNull();

    const ok = runDesignCheck(input({ lifetime: life, proof: { proofStress: 300 }, appliedStress: 60 }));
    const tmin = life.B * 60 ** -life.n * (300 ** (life.n - 2) - 60 ** (life.n - 2));
    expect(relativeError(ok.time.proofMinimumLife!.value, tmin)).toBeLessThan(1e-12);
    expect(ok.time.proofCoversLifetime).toBe(tmin >= life.lifetime);
  });
});

describe("caution notes", () => {
  const ids = (r: ReturnType<typeof runDesignCheck>) => Object.fromEntries(cautionsFor(r).map((c) => [c.id, c.level]));

  beforeEach(withoutOptionalCore);

  it("always carries the extrapolation, size, environment and code notes", () => {
    const c = ids(runDesignCheck(input()));
    for (const id of ["extrapolation", "size", "environment", "codes"]) expect(c[id], id).toBeDefined();
    expect(cautionsFor(runDesignCheck(input())).find((x) => x.id === "codes")!.text).toMatch(/licensed engineer/);
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
    expect(ids(runDesignCheck(input({ material: { kind: "typed", shape: 10, scale: 400 } })))).toMatchObject({ sample: "warning", bound: "warning" });
  });

  it("warns about a poor fit when the build tests goodness of fit, and otherwise says it is not tested", () => {
    expect(ids(runDesignCheck(input()))).toMatchObject({ fit: "note" });
    optionalCore.fitQuality = () => ({ statistic: 1.2, significance: 0.004 });
    const poor = runDesignCheck(input());
    expect(ids(poor)).toMatchObject({ fit: "warning" });
    expect(cautionsFor(poor).find((c) => c.id === "fit")!.text).toMatch(/A\* 1\.200, observed significance 0\.0040/);
    optionalCore.fitQuality = () => ({ statistic: 0.3, significance: 0.6 });
    expect(ids(runDesignCheck(input())).fit).toBeUndefined();
  });
});

describe("plugging in the one-population checks", () => {
  it("warns of a bend or an outlying low value only when its test rejects at 5 %", () => {
    withoutOptionalCore();
    optionalCore.populationChecks = () => ({ bend: { pValue: 0.01, knotStrength: 402.5 }, lowOutlier: { pValue: 0.2, strength: 377.9 } });
    const c = cautionsFor(runDesignCheck(input()));
    expect(c.find((x) => x.id === "bend")).toMatchObject({ level: "warning" });
    expect(c.find((x) => x.id === "bend")!.text).toMatch(/bends near 402\.5 MPa \(two-segment test, p = 0\.010\)/);
    expect(c.find((x) => x.id === "low-outlier")).toBeUndefined();
    optionalCore.populationChecks = () => ({ bend: null, lowOutlier: { pValue: 0.003, strength: 377.9 } });
    expect(cautionsFor(runDesignCheck(input())).find((x) => x.id === "low-outlier")!.text).toMatch(/377\.9 MPa, is unusually low/);
  });
});

describe("plugging in the lower confidence bound", () => {
  it("puts the verdict and margin on the bound once the build provides one", () => {
    withoutOptionalCore();
    const calls: unknown[] = [];
    optionalCore.designStressLowerBound = (args) => {
      calls.push(args);
      return 170; // a stand-in bound, only to follow the plumbing
    };
    const r = runDesignCheck(input());
    expect(calls[0]).toMatchObject({ survival: 0.9999, confidence: 0.9, sizeRatio: 64 });
    expect(r.allowableLower!.value).toBe(170);
    expect(r.verdict.onLowerBound).toBe(true);
    expect(r.verdict.pass).toBe(false); // 180 > 170
    expect(r.margin.value).toBe(170 / 180);
    expect(ids(r).bound).toBeUndefined();
    // The plot draws a two-sided band from the same function at (1 + c)/2 and (1 - c)/2.
    const band = plotData(r).band!;
    expect(band.length).toBeGreaterThan(10);
    expect(calls.some((c) => (c as { confidence: number }).confidence === 0.95)).toBe(true);
    expect(calls.some((c) => Math.abs((c as { confidence: number }).confidence - 0.05) < 1e-15)).toBe(true);
  });
  const ids = (r: ReturnType<typeof runDesignCheck>) => Object.fromEntries(cautionsFor(r).map((c) => [c.id, c.level]));
});

describe("probability plot coordinates", () => {
  withoutOptionalCore();
  const r = runDesignCheck(input());
  const d = plotData(r);
  Object.assign(optionalCore, built);
  it("puts the design point on the part-size line and spans the data and the design point", () => {
    expect(d.design).toEqual({ stress: r.allowablePoint.value, probability: r.targetFailureProbability.value });
    const { shape: m, scale: th } = r.parameters;
    // On Weibull axes the part line is y = m ln(s/theta) + ln k (METHODS.md section 1).
    for (const pt of d.partLine!) {
      expect(weibullY(pt.probability)).toBeCloseTo(m * Math.log(pt.stress / th) + Math.log(r.sizeRatio.value), 9);
    }
    expect(d.probabilityRange[0]).toBeLessThan(r.targetFailureProbability.value);
    expect(d.stressRange[0]).toBeLessThan(r.allowablePoint.value);
    expect(d.stressRange[1]).toBeGreaterThan(Math.max(...STRENGTHS));
    expect(d.band).toBeNull();
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
    const csv = designCheckCsv(r, resultRows(r), cautionsFor(r));
    expect(csv.endsWith("\r\n")).toBe(true);
    expect(csv).toContain("'=MPa");
    expect(csv).not.toMatch(/(^|,)=/m);
    const lines = csv.split("\r\n");
    // The label holds a comma, so it is quoted; the full-precision number follows it.
    const allowable = lines.find((l) => l.startsWith('"Allowable stress, point estimate",'))!;
    expect(Number(allowable.split('",')[1].split(",")[0])).toBe(r.allowablePoint.value);
    expect(lines.filter((l) => /^\d/.test(l))).toHaveLength(STRENGTHS.length);
    // A basis with commas is one quoted field.
    expect(csv).toMatch(/"point estimate: two-parameter Weibull, maximum likelihood/);
  });
});
