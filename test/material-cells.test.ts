// MATERIALFIT, SPECIMENSNEEDED and BOUNDRATIOTABLE through the guarded adapters a host calls: the table
// against mpmath's 40-digit pooled fit (material_fit.json, generate_material_fit.py), the planning
// functions against the seeded pivot simulation (specimens_needed.json, generate_specimens_needed.py),
// and the cell policy on bad input: #VALUE! with a message, #N/A where the result does not apply.
import { describe, expect, it } from "vitest";
import { isCellFailure, type CellResult } from "../functions/cells";
import { guarded } from "../functions/registry";
import { spillShapes } from "../functions/spill-shapes";
import { fixture, relativeError } from "./helpers";

const fits = fixture("material_fit.json");
const planning = fixture("specimens_needed.json");

function table(r: CellResult): any[][] {
  if (!Array.isArray(r)) throw new Error(`expected a table, got ${JSON.stringify(r)}`);
  return r;
}
function value(rows: any[][], label: string): any {
  const row = rows.find((x) => x[0] === label);
  if (!row) throw new Error(`no row "${label}"`);
  return row[1];
}
function failure(r: CellResult): { code: string; message: string } {
  if (!isCellFailure(r)) throw new Error(`expected an error, got ${JSON.stringify(r).slice(0, 200)}`);
  return { code: r.cellError, message: r.message };
}

/** A fixture case as the two columns a sheet holds (strengths, configurations) and a censoring column. */
function columns(c: any) {
  const strengths: any[][] = [];
  const configs: any[][] = [];
  const censored: any[][] = [];
  for (const g of c.groups) {
    g.strengths.forEach((s: number, i: number) => {
      strengths.push([s]);
      configs.push([g.configuration]);
      censored.push([g.censored[i]]);
    });
  }
  return { strengths, configs, censored };
}

describe("MATERIALFIT table", () => {
  const disk = fits.cases.find((c: any) => c.poisson === 0.25);
  it("bars and ring-on-ring disks: modulus and material scale in rows 1 and 2 equal mpmath's fit", () => {
    const { strengths, configs } = columns(disk);
    const rows = table(guarded.MATERIALFIT(strengths, configs, "VOLUME", null, "PIA", 0.25));
    expect(rows.length).toBe((spillShapes.MATERIALFIT.rows as number));
    expect(rows[0][0]).toMatch(/^modulus m \(maximum likelihood, no unbiasing\)/);
    expect(relativeError(rows[0][1], disk.reference.shapeFloat)).toBeLessThan(1e-12);
    expect(rows[1][0]).toMatch(/^material scale sigma_0/);
    expect(relativeError(rows[1][1], disk.reference.materialScaleFloat)).toBeLessThan(1e-12);
    expect(value(rows, "configurations")).toBe(2);
    expect(value(rows, "C1161-B-4PT: specimens")).toBe(15);
    expect(value(rows, "C1499-20/10: specimens")).toBe(12);
    expect(relativeError(value(rows, "C1499-20/10: characteristic strength, material fit"), disk.reference.impliedScale[1])).toBeLessThan(1e-12);
    expect(relativeError(value(rows, "C1499-20/10: characteristic strength, own fit"), disk.reference.own[1].scale)).toBeLessThan(1e-12);
    const p1 = value(rows, "p-value: one modulus (common m vs separate fits)");
    const p2 = value(rows, "p-value: the size effect holds (tied by effective size vs free)");
    expect(p1).toBeGreaterThan(0);
    expect(p1).toBeLessThanOrEqual(1);
    expect(p2).toBeGreaterThan(0);
    expect(value(rows, "checks")).toMatch(/^no evidence against one modulus \(p = .*\); no evidence against the size effect/);
    expect(value(rows, "bounds and p-values from")).toMatch(/parametric simulation .* 2000 data sets, seed/);
    expect(value(rows, "converged")).toBe(true);
    // Rows beyond the used ones are blank, so a host shows empty cells.
    expect(rows[rows.length - 1]).toEqual(["", ""]);
  }, 60_000);

  it("a preset name and its dimensions are one group; the example in the JSDoc has 45 rows", () => {
    const c = fits.cases[0]; // C1161-A-4PT, C1161-B-4PT, C1161-C-3PT
    const { strengths, configs } = columns(c);
    const mixed = configs.map(([t]) => [t === "C1161-B-4PT" ? "bar 40/20 4 x 3" : t]);
    mixed[15] = ["C1161-B-4PT"]; // one B bar by name among B bars by dimensions
    const rows = table(guarded.MATERIALFIT(strengths, mixed));
    expect(value(rows, "configurations")).toBe(3);
    expect(relativeError(rows[0][1], c.reference.shapeFloat)).toBeLessThan(1e-12);
    expect(rows.length).toBe(45);
  }, 60_000);

  it("censored specimens: the fit equals mpmath's, and the simulated rows say why they are missing", () => {
    const c = fits.cases.find((x: any) => x.groups.some((g: any) => g.censored.includes(true)));
    const { strengths, configs, censored } = columns(c);
    const rows = table(guarded.MATERIALFIT(strengths, configs, null, censored));
    expect(relativeError(rows[0][1], c.reference.shapeFloat)).toBeLessThan(1e-12);
    expect(value(rows, "failures (population fitted)")).toBeLessThan(value(rows, "specimens"));
    expect(value(rows, "p-value: one modulus (common m vs separate fits)")).toMatch(/^n\/a \(censored/);
  });

  // The hostile case hostile/material-modulus-at-range-edge.json (found by properties-cells): the fit exists; the
  // simulated rows must say why they are missing, not turn the whole cell into #NUM!.
  it("a modulus near the end of the covered range: the fit is shown and the simulated rows say why they are missing", () => {
    const edge = fixture("hostile/material-modulus-at-range-edge.json");
    const strengths = edge.strengths.map((s: number) => [s]);
    const configs = edge.configurations.map((c: string) => [c]);
    const rows = table(guarded.MATERIALFIT(strengths, configs, edge.flaws, null, edge.criterion, edge.poisson));
    expect(rows[0][1]).toBeGreaterThan(150);
    expect(value(rows, "converged")).toBe(true);
    for (const label of ["p-value: the size effect holds (tied by effective size vs free)", "checks", "bounds and p-values from"]) {
      expect(value(rows, label)).toMatch(/^n\/a \(only \d+ of 2000 simulated data sets could be fitted \(pooled modulus inside 0\.5 to 200/);
    }
  }, 60_000);

  it("bad input is #VALUE! with its message; one configuration only is #N/A", () => {
    const c = fits.cases[0];
    const { strengths, configs } = columns(c);
    expect(failure(guarded.MATERIALFIT(strengths, configs.slice(1)))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/same rows and columns/) });
    const typo = configs.map((r) => [...r]);
    typo[3] = ["C1161-D-4PT"];
    expect(failure(guarded.MATERIALFIT(strengths, typo))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/unknown configuration/) });
    const blank = configs.map((r) => [...r]);
    blank[4] = [""];
    expect(failure(guarded.MATERIALFIT(strengths, blank))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/row 5/) });
    const same = configs.map(() => ["C1161-B-4PT"]);
    expect(failure(guarded.MATERIALFIT(strengths, same))).toMatchObject({ code: "#N/A", message: expect.stringMatching(/two or more/) });
    expect(failure(guarded.MATERIALFIT(strengths, configs, "BULK"))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/flaws/) });
    expect(failure(guarded.MATERIALFIT(strengths, configs, null, null, null, null, 0.999))).toMatchObject({ code: "#VALUE!" });
    const inverted = configs.map(([t]) => [t === "C1161-C-3PT" ? "BAR 40/50 4x3" : t]);
    expect(failure(guarded.MATERIALFIT(strengths, inverted))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/inner span/) });
    const text = strengths.map((r) => [...r]);
    text[2] = ["abc"];
    expect(failure(guarded.MATERIALFIT(text, configs))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/row 3/) });
    const seven = strengths.map((_, i) => [`BAR ${40 + (i % 7)}/20 4x3`]);
    expect(failure(guarded.MATERIALFIT(strengths, seven))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/at most 6/) });
  });

  it("a disk configuration without Poisson's ratio is #VALUE! naming the argument", () => {
    const disk2 = fits.cases.find((c: any) => c.poisson === 0.25);
    const { strengths, configs } = columns(disk2);
    expect(failure(guarded.MATERIALFIT(strengths, configs))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/poisson/i) });
  });
});

describe("SPECIMENSNEEDED and BOUNDRATIOTABLE", () => {
  it("BOUNDRATIOTABLE rows equal the simulated planned ratio at m = 10 (specimens_needed.json)", () => {
    const rows = table(guarded.BOUNDRATIOTABLE(10, 0.999));
    expect(rows.length).toBe(spillShapes.BOUNDRATIOTABLE.rows as number);
    expect(rows[0]).toEqual(["specimens", "planned ratio bound/estimate"]);
    for (const c of planning.cases.filter((x: any) => x.survival === 0.999)) {
      const row = rows.find((r) => r[0] === c.specimens);
      if (!row) continue; // n = 80 is not a table row
      // 5 Monte Carlo standard errors of u_C, divided by m (see specimens-needed.test.ts).
      expect(Math.abs(Math.log(row[1]) - Math.log(c.ratioAtModulus10))).toBeLessThan((5 * c.standardError) / 10);
    }
  });

  it("SPECIMENSNEEDED meets the target where the simulation says the sample size meets it", () => {
    const c = planning.cases.find((x: any) => x.specimens === 30 && x.survival === 0.999);
    const n = guarded.SPECIMENSNEEDED(c.ratioAtModulus10, 10, 0.999) as number;
    expect(Math.abs(n - 30)).toBeLessThanOrEqual(1);
  });

  it("bad input is #VALUE!; a target out of reach is #N/A", () => {
    expect(failure(guarded.SPECIMENSNEEDED(1.2, 10, 0.999))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/targetRatio/) });
    expect(failure(guarded.SPECIMENSNEEDED(0.8, 0, 0.999))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/modulus/) });
    expect(failure(guarded.SPECIMENSNEEDED(0.8, 10, 1))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/survival/) });
    expect(failure(guarded.SPECIMENSNEEDED(0.8, 10, 0.999, -1))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/sizeRatio/) });
    expect(failure(guarded.SPECIMENSNEEDED(0.8, 10, 0.999, 1, 0.2))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/confidence/) });
    expect(failure(guarded.SPECIMENSNEEDED("x", 10, 0.999))).toMatchObject({ code: "#VALUE!" });
    expect(failure(guarded.SPECIMENSNEEDED(0.999, 5, 0.999999))).toMatchObject({ code: "#N/A", message: expect.stringMatching(/10000 specimens/) });
    expect(failure(guarded.BOUNDRATIOTABLE(10, 0))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/survival/) });
  });
});

describe("the invented example examples/material-fit-and-planning.csv", () => {
  it("evaluates in the embedded engine: the pooled fit of bars and disks, and the planning cells", async () => {
    const { loadWorkbook } = await import("../cli/workbook-io");
    const { evaluateWorkbook } = await import("../cli/evaluate-workbook");
    const { generateMetadata } = await import("../functions/metadata");
    const book = await loadWorkbook(new URL("../examples/material-fit-and-planning.csv", import.meta.url).pathname);
    const result = evaluateWorkbook(book, (await generateMetadata()).functions);
    const grid = Object.values(result.grids)[0] as any[][];
    expect(grid[1][2]).toBe("modulus m (maximum likelihood, no unbiasing)");
    expect(typeof grid[1][3]).toBe("number");
    expect(grid[2][3]).toBeGreaterThan(0); // material scale
    expect(grid[25][3]).toBe(true); // converged
    // Planning: the same as the core at the same inputs (checked against the simulation above).
    expect(grid[1][6]).toBe(guarded.SPECIMENSNEEDED(0.8, 10, 0.999));
    expect(grid[4][6]).toBe(guarded.SPECIMENSNEEDED(0.8, grid[3][6], 0.999));
    expect(grid[1][8]).toBe("specimens");
  }, 120_000);
});

describe("MATERIALFIT invariants (weakest-link scaling, common practice)", () => {
  const c = fits.cases.find((x: any) => x.name.startsWith("bars and a rod")); // C1161-B-4PT, ROD 40/20 5, BAR 30/0 5x4, surface
  const { strengths, configs } = columns(c);
  const base = table(guarded.MATERIALFIT(strengths, configs, "SURFACE"));

  it("strengths x k: modulus and p-values unchanged, material scale and characteristic strengths x k", () => {
    const k = 7.3;
    const scaled = table(guarded.MATERIALFIT(strengths.map(([s]) => [s * k]), configs, "SURFACE"));
    for (let i = 0; i < base.length; i++) {
      const label = String(base[i][0]);
      expect(scaled[i][0]).toBe(base[i][0]);
      if (typeof base[i][1] !== "number") continue;
      const factor = /characteristic strength|material scale/.test(label) ? k : 1;
      // p-values count replicate statistics at or above the observed one: equal up to a tie at rounding.
      const tol = /^p-value/.test(label) ? 2 / 2001 : 1e-9;
      expect(Math.abs(scaled[i][1] / (base[i][1] * factor) - 1), label).toBeLessThan(tol);
    }
  }, 60_000);

  it("lengths x k (dimensions in another unit): modulus unchanged, areas x k^2, material scale x k^(2/m)", () => {
    const k = 1 / 25.4; // mm to inches
    const inches = (t: string) =>
      t === "C1161-B-4PT" ? `BAR ${40 * k}/${20 * k} ${4 * k}x${3 * k}` : t.replace(/[\d.]+/g, (x) => String(Number(x) * k));
    const scaled = table(guarded.MATERIALFIT(strengths, configs.map(([t]) => [inches(t)]), "SURFACE"));
    const m = base[0][1];
    expect(Math.abs(scaled[0][1] / m - 1)).toBeLessThan(1e-10);
    expect(Math.abs(scaled[1][1] / (base[1][1] * k ** (2 / m)) - 1)).toBeLessThan(1e-10);
    expect(Math.abs(scaled[7][1] / (base[7][1] * k * k) - 1)).toBeLessThan(1e-10); // first configuration's effective size
  }, 60_000);

  it("the order of the specimens does not matter", () => {
    const order = strengths.map((_, i) => i).sort((a, b) => ((a * 7919) % 31) - ((b * 7919) % 31));
    const shuffled = table(guarded.MATERIALFIT(order.map((i) => strengths[i]), order.map((i) => configs[i]), "SURFACE"));
    expect(Math.abs(shuffled[0][1] / base[0][1] - 1)).toBeLessThan(1e-12);
    expect(Math.abs(shuffled[1][1] / base[1][1] - 1)).toBeLessThan(1e-12);
  }, 60_000);
});
