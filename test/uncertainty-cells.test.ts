// The uncertainty functions as a user meets them: FIT's table, spills in the
// embedded engine, PLOTPOINTS coordinates, and errors inside spills.
import { beforeAll, describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { evaluateWorkbook } from "../cli/evaluate-workbook";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { guarded } from "../functions/registry";
import { parameterBounds } from "../src/weibull/confidence-bounds";
import { fixture, relativeError } from "./helpers";

const data = fixture("weibull_fits.json").datasets.find((d: any) => d.kind === "complete" && d.strengths.length === 30);
const column = (xs: readonly unknown[]) => xs.map((x) => [x]);
const code = (r: CellResult) => (isCellFailure(r) ? r.cellError : r);

let metadata: FunctionMetadata[];
beforeAll(async () => {
  metadata = (await generateMetadata()).functions;
});

describe("FIT", () => {
  it("is a 21 x 2 labelled table whose values agree with the single-purpose functions", () => {
    const s = column(data.strengths);
    const t = guarded.FIT(s) as unknown[][];
    expect(t).toHaveLength(21);
    expect(t.every((row) => row.length === 2 && typeof row[0] === "string")).toBe(true);
    const value = (label: RegExp) => t.find((row) => label.test(row[0] as string))![1];
    expect(value(/^specimens$/)).toBe(30);
    expect(value(/^modulus m$/)).toBe(guarded.MODULUS(s));
    expect(value(/^characteristic strength$/)).toBe(guarded.CHARSTRENGTH(s));
    const [[, mLo], [, mHi]] = guarded.MODULUSBOUNDS(s) as unknown[][];
    expect(value(/^modulus, lower bound \(90 %, two-sided\)$/)).toBe(mLo);
    expect(value(/^modulus, upper bound/)).toBe(mHi);
    const [[, a], [, osl]] = guarded.FITQUALITY(s) as unknown[][];
    expect(value(/A\*/)).toBe(a);
    expect(value(/OSL/)).toBe(osl);
    expect(value(/^mean strength$/)).toBe(guarded.MEANSTRENGTH(value(/^modulus m$/), value(/^characteristic strength$/)));
    expect(value(/^converged$/)).toBe(true);
    expect(value(/^verdict$/)).toMatch(/\.$/);
  });

  it("labels the bounds with the confidence asked for, and takes the method", () => {
    const t = guarded.FIT(column(data.strengths), null, 0.95, "lsq") as unknown[][];
    expect(t[5][0]).toBe("modulus, lower bound (95 %, two-sided)");
    expect(t[2][1]).toBe("LSQ");
    expect(t[4][1]).toBe(guarded.MODULUS(column(data.strengths), null, "LSQ"));
    // Bounds are the ML pivotal bounds whatever the point-estimate method.
    expect(t[5][1]).toBe(parameterBounds({ strengths: data.strengths, confidence: 0.95 }).shape.lower);
    expect(code(guarded.FIT(column(data.strengths), null, 0.9, "BAYES"))).toBe("#VALUE!");
  });
});

describe("PLOTPOINTS", () => {
  it("complete sample: X = ln s, Y = ln ln(1/(1-P)) with the three estimators of docs/methods.md section 2", () => {
    const s = [410, 350, 388, 372, 401];
    const sorted = [...s].sort((a, b) => a - b);
    const n = s.length;
    const estimators: [string | null, (i: number) => number][] = [
      [null, (i) => (i - 0.5) / n],
      ["MEANRANK", (i) => i / (n + 1)],
      ["medianrank", (i) => (i - 0.3) / (n + 0.4)],
    ];
    for (const [name, p] of estimators) {
      const [header, ...rows] = guarded.PLOTPOINTS(column(s), null, name) as number[][];
      expect(header).toEqual(["ln(strength)", "ln(ln(1/(1-P)))", "failure probability P"]);
      rows.forEach(([x, y, fraction], k) => {
        expect(relativeError(x, Math.log(sorted[k]))).toBeLessThan(1e-15);
        expect(relativeError(y, Math.log(Math.log(1 / (1 - p(k + 1)))))).toBeLessThan(1e-13);
        // The third column is P itself, for a percent axis.
        expect(relativeError(fraction, p(k + 1))).toBeLessThan(1e-15);
      });
    }
    expect(code(guarded.PLOTPOINTS(column(s), null, "WEIRD"))).toBe("#VALUE!");
  });

  it("censored sample: Johnson's adjusted ranks (worked by hand), blank rows for censored and blank cells", () => {
    // n = 5, the 2nd weakest censored. Johnson: rank += (n + 1 - previous) / (1 + specimens at or above):
    // 1st failure 1; 3rd weakest (3 at or above) 1 + 5/4 = 2.25; 4th 2.25 + 3.75/3 = 3.5; 5th 3.5 + 2.5/2 = 4.75.
    // Hazen P = (rank - 0.5)/5 = 0.1, 0.35, 0.6, 0.85.
    const s = [[300], [320], [null], [350], [380], [395]];
    const c = [[false], [true], [null], [0], [""], ["F"]];
    const [header, ...rows] = guarded.PLOTPOINTS(s, c) as unknown[][];
    expect(header).toHaveLength(3);
    expect(rows).toHaveLength(6); // one row per cell of the range, under the header
    const expected = [
      [300, 0.1],
      [350, 0.35],
      [380, 0.6],
      [395, 0.85],
    ];
    expected.forEach(([strength, p], k) => {
      expect(relativeError(rows[k][0] as number, Math.log(strength))).toBeLessThan(1e-15);
      expect(relativeError(rows[k][1] as number, Math.log(-Math.log1p(-p)))).toBeLessThan(1e-13);
      expect(relativeError(rows[k][2] as number, p)).toBeLessThan(1e-15);
    });
    expect(rows.slice(4)).toEqual([
      ["", "", ""],
      ["", "", ""],
    ]);
  });
});

describe("in the embedded engine", () => {
  function evaluate(formulas: string[]) {
    const rows: unknown[][] = data.strengths.map((s: number, i: number) => [s, i % 7 === 3 ? true : null]);
    formulas.forEach((f, i) => {
      while (rows.length <= i) rows.push([null, null]);
      rows[i][3] = f;
    });
    const sheet = rows.map((r) => Array.from({ length: 4 }, (_, k) => r[k] ?? null));
    return evaluateWorkbook({ kind: "csv", sheets: { S: sheet as never } }, metadata);
  }

  it("spills FIT, the bounds, FITQUALITY and LOTCHECK, and computes DESIGNSTRESSBOUND", () => {
    const { grids } = evaluate([
      "=BRITTLE.FIT(A1:A30)",
      ...Array(20).fill(null),
      "=BRITTLE.MODULUSBOUNDS(A1:A30)",
      null,
      "=brittle.charstrengthbounds(A1:A30, B1:B30, 0.95)",
      null,
      "=BRITTLE.FITQUALITY(A1:A30)",
      null,
      "=BRITTLE.LOTCHECK(A1:A10, A11:A30)",
      null,
      null,
      "=BRITTLE.DESIGNSTRESSBOUND(0.9999, A1:A30, , 0.95, 25)",
      "=BRITTLE.MODULUSBOUNDS(A1:A30, , 1.2)",
      null,
      "=BRITTLE.FITQUALITY(A1:A30, B1:B30)",
    ]);
    const g = grids.S;
    const block = (r: number, rows: number) => g.slice(r, r + rows).map((row) => [row[3], row[4]]);
    const fit = guarded.FIT(column(data.strengths)) as unknown[][];
    expect(block(0, 21)).toEqual(fit);
    expect(block(21, 2)).toEqual(guarded.MODULUSBOUNDS(column(data.strengths)));
    const censored = data.strengths.map((_: number, i: number) => [i % 7 === 3 ? true : null]);
    expect(block(23, 2)).toEqual(guarded.CHARSTRENGTHBOUNDS(column(data.strengths), censored, 0.95));
    expect(block(25, 2)).toEqual(guarded.FITQUALITY(column(data.strengths)));
    expect(g[29][4]).toMatch(/baseline/);
    expect(g[30][3]).toBe(guarded.DESIGNSTRESSBOUND(0.9999, column(data.strengths), null, 0.95, 25));
    expect(g[31][3]).toBe("#VALUE!");
    expect(g[33][3]).toBe("#N/A");
  });

  it("spills PLOTPOINTS over one row per cell of the strengths range, blank rows last", () => {
    const { grids } = evaluate(["=BRITTLE.PLOTPOINTS(A1:A30, B1:B30)"]);
    const expected = guarded.PLOTPOINTS(column(data.strengths), data.strengths.map((_: number, i: number) => [i % 7 === 3 ? true : null])) as unknown[][];
    expect(expected).toHaveLength(31); // a header row, then one row per cell
    for (let r = 0; r < 31; r++) expect([grids.S[r][3], grids.S[r][4], grids.S[r][5]]).toEqual(expected[r]);
    expect(expected[30]).toEqual(["", "", ""]);
  });
});
