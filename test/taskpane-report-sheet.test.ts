/**
 * Writing the design check to a new worksheet, through the spreadsheet API
 * mocked with office-addin-mock: the sheet name it picks, the cells, formulas
 * and chart it creates, and that it never writes to an existing sheet or to a
 * sheet that is not empty. The formulas are then evaluated in the embedded
 * formula engine (cli/engine.ts, the same adapters the host runs) and
 * must give the numbers the form shows; the form's numbers come from the core
 * (the reference here is the core, through runDesignCheck; the core is tested
 * against mpmath/scipy fixtures in its own suites).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { OfficeMockObject } from "office-addin-mock";
import { adapters } from "../functions/registry";
import { createEngine } from "../cli/engine";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { DetailedCellError } from "hyperformula";
import type { DesignCheckResult } from "../src/design/check-result";
import { runDesignCheck } from "../src/design/design-check";
import { planReportSheet, type SheetPlan } from "../taskpane/report/sheet-plan";
import { freshSheetName, SheetNotEmptyError, writeReportSheet } from "../taskpane/report/sheet-writer";
import { format as numfmt } from "numfmt";
import { relativeError } from "./helpers";
import { input, STRENGTHS } from "./taskpane-inputs";


function plan(result: DesignCheckResult): SheetPlan {
  return planReportSheet(result, { functions: new Set(Object.keys(adapters)), cautions: result.cautions, written: new Date("2026-01-02T03:04:00Z") });
}

// ---- A workbook built from office-addin-mock objects ----

interface RangeRecord {
  address: string;
  mock: any;
}
interface SheetState {
  name: string;
  ranges: RangeRecord[];
  charts: any[];
  usedRangeEmpty: boolean;
  activated: boolean;
}

function mockWorkbook(existing: string[], opts: { hiddenFromFirstListing?: string[]; newSheetNotEmpty?: boolean } = {}) {
  const sheets = new Map<string, SheetState>();
  const created: any[] = [];
  let listings = 0;
  const track = <T>(o: T): T => {
    created.push(o);
    return o;
  };

  // The address each range was asked for (a mock's own address property needs load() and sync() first).
  const addressOf = new WeakMap<object, string>();
  function rangeMock(state: SheetState, address: string) {
    const mock = track(new OfficeMockObject({ address, format: { font: {}, fill: {}, columnWidth: 0 } }));
    addressOf.set(mock, address);
    state.ranges.push({ address, mock });
    return mock;
  }

  function sheetMock(state: SheetState) {
    return track(
      new OfficeMockObject({
        name: state.name,
        getRange(address: string) {
          return rangeMock(state, address);
        },
        getUsedRangeOrNullObject() {
          return track(new OfficeMockObject({ isNullObject: state.usedRangeEmpty }));
        },
        activate() {
          state.activated = true;
        },
        charts: {
          add(type: string, source: any, seriesBy: string) {
            const series: any[] = [];
            const seriesMock = (name: string) => {
              const s: any = track(
                new OfficeMockObject({
                  name,
                  setXAxisValues(r: any) {
                    s.x = addressOf.get(r);
                  },
                  setValues(r: any) {
                    s.y = addressOf.get(r);
                  },
                }),
              );
              s.name = name; // as named in series.add(name): readable without load()
              series.push(s);
              return s;
            };
            seriesMock("Series1");
            const chart: any = track(
              new OfficeMockObject({
                title: {},
                legend: {},
                axes: { categoryAxis: { title: {} }, valueAxis: { title: {} } },
                series: {
                  getItemAt: (i: number) => series[i],
                  add: (name: string) => seriesMock(name),
                },
                setPosition(from: string, to: string) {
                  chart.position = [from, to];
                },
              }),
            );
            // What the add-in asked for, kept as plain fields for the test to read.
            Object.assign(chart, { type, source: addressOf.get(source), seriesBy, allSeries: series });
            state.charts.push(chart);
            return chart;
          },
        },
      }),
    );
  }

  const stateOf = (name: string): SheetState => {
    const state = { name, ranges: [], charts: [], usedRangeEmpty: true, activated: false };
    sheets.set(name, state);
    return state;
  };
  const sheetMocks = new Map<string, any>();
  for (const name of [...existing, ...(opts.hiddenFromFirstListing ?? [])]) sheetMocks.set(name, sheetMock(stateOf(name)));

  const context = new OfficeMockObject({
    workbook: {
      worksheets: {
        // The listing a real host gives after load("items") and sync; the first one can be stale, as when
        // another user adds a sheet between our look and our add.
        load(this: any) {
          const hidden = listings++ === 0 ? new Set(opts.hiddenFromFirstListing ?? []) : new Set<string>();
          this.items = [...sheets.keys()].filter((n) => !hidden.has(n)).map((name) => ({ name }));
          return this;
        },
        add(name: string) {
          if ([...sheets.keys()].some((n) => n.toLowerCase() === name.toLowerCase())) {
            throw new Error(`A sheet named "${name}" already exists`);
          }
          const state = stateOf(name);
          if (opts.newSheetNotEmpty) state.usedRangeEmpty = false;
          const mock = sheetMock(state);
          sheetMocks.set(name, mock);
          return mock;
        },
      },
    },
    async sync() {
      for (const o of created) await o.sync();
    },
  });
  return { context: context as unknown as Excel.RequestContext, sheets };
}

// ---- Reading back what was written ----

function parseCell(a1: string): [number, number] {
  const m = /^\$?([A-Z]+)\$?(\d+)$/.exec(a1)!;
  let col = 0;
  for (const ch of m[1]) col = col * 26 + (ch.charCodeAt(0) - 64);
  return [Number(m[2]) - 1, col - 1];
}

/** The new sheet's grid, from the values and formulas set on each range. */
function grid(state: SheetState): (string | number | boolean | null)[][] {
  const rows: (string | number | boolean | null)[][] = [];
  for (const { address, mock } of state.ranges) {
    const contents = mock.formulas ?? mock.values;
    if (!Array.isArray(contents)) continue;
    const [r0, c0] = parseCell(address.split(":")[0]);
    contents.forEach((row: unknown[], i: number) =>
      row.forEach((v, j) => {
        while (rows.length <= r0 + i) rows.push([]);
        const line = rows[r0 + i];
        while (line.length <= c0 + j) line.push(null);
        expect(line[c0 + j], `cell written twice at ${address}`).toBeNull();
        line[c0 + j] = v as string | number | boolean;
      }),
    );
  }
  return rows;
}

let metadata: FunctionMetadata[];
beforeAll(async () => {
  metadata = (await generateMetadata()).functions;
});

function evaluate(sheets: Record<string, unknown[][]>, sheetName: string, refs: Record<string, string>) {
  const engine = createEngine(sheets, metadata);
  const sheet = engine.getSheetId(sheetName)!;
  const at = (ref: string) => {
    const [row, col] = parseCell(ref);
    const v = engine.getCellValue({ sheet, row, col });
    if (v instanceof DetailedCellError) throw new Error(`${ref}: ${v.value} ${v.message}`);
    return v as number | string;
  };
  return { engine, sheet, at, value: (key: string) => at(refs[key]) };
}

describe("fresh sheet names", () => {
  it("takes the base name, else the first free numbered one, comparing names case-insensitively", () => {
    expect(freshSheetName("Design check", ["Sheet1"])).toBe("Design check");
    expect(freshSheetName("Design check", ["design CHECK", "Design check 2"])).toBe("Design check 3");
    // Sheet names are at most 31 characters: the base is shortened, never the number.
    expect(freshSheetName("A".repeat(31), ["A".repeat(31)])).toBe(`${"A".repeat(29)} 2`);
  });
});

describe("writing the design check through the spreadsheet API (office-addin-mock)", () => {
  it("adds a new sheet, writes inputs, live formulas, chart data and cautions, and they recompute to the form's numbers", async () => {
    const result = runDesignCheck(input());
    const p = plan(result);
    const { context, sheets } = mockWorkbook(["Tests", "Design check", "design check 2"]);
    const { sheetName } = await writeReportSheet(context, p);
    expect(sheetName).toBe("Design check 3");

    // Nothing was written to the sheets that were there before.
    for (const name of ["Tests", "Design check", "design check 2"]) expect(sheets.get(name)!.ranges).toEqual([]);
    const state = sheets.get("Design check 3")!;
    expect(state.activated).toBe(true);

    const cells = grid(state);
    const text = cells.flat().filter((v) => typeof v === "string") as string[];
    // Live formulas, not pasted numbers.
    expect(text).toContain("=BRITTLE.MODULUS($F$5:$F$19,$G$5:$G$19,$B$6)");
    expect(text).toContain("=BRITTLE.CHARSTRENGTH($F$5:$F$19,$G$5:$G$19,$B$6)");
    expect(text.some((t) => t.startsWith("=BRITTLE.DESIGNSTRESS($B$10,"))).toBe(true);
    expect(text.some((t) => t.startsWith("=BRITTLE.FAILPROB($B$11,"))).toBe(true);
    expect(text.some((t) => t.startsWith("=BRITTLE.LOTFAILURES("))).toBe(true);
    // The cautions are on the sheet, warnings marked.
    for (const c of result.cautions) expect(text).toContain(c.text);
    expect(text).toContain("Warning");
    // Below the live part: the verdict's basis lines, the methods, and the identification and sign-off fields to fill.
    for (const b of result.basis) expect(text).toContain(b.text);
    expect(text).toContain("Identification and sign-off");
    for (const label of ["Part and drawing", "Lot or batch", "Revision", "Author", "Checker", "Checked by (name, signature, date)"]) expect(text).toContain(label);
    expect(text.some((t) => /ASTM C1683/.test(t))).toBe(true);
    // Text written as values never starts a formula.
    for (const { mock } of state.ranges) {
      if (mock.values) for (const v of mock.values.flat()) if (typeof v === "string") expect(v).not.toMatch(/^[=+\-@]/);
    }

    // Evaluate the sheet in the embedded engine: the same numbers as the form.
    const { value, at } = evaluate({ [sheetName]: cells }, sheetName, p.refs);
    const rel = (key: string, want: number) => expect(relativeError(value(key) as number, want), key).toBeLessThan(1e-12);
    rel("modulus", result.parameters.shape);
    rel("scale", result.parameters.scale);
    rel("mean", result.parameters.mean);
    rel("sizeRatio", result.sizeRatio.value);
    rel("allowablePoint", result.allowablePoint.value);
    if (result.allowableLower) {
      // The sheet's bound is the registered DESIGNSTRESSBOUND on the same data, evaluated in the engine.
      expect(text).toContain(`=BRITTLE.DESIGNSTRESSBOUND($B$10,$F$5:$F$19,$G$5:$G$19,$B$5,${p.refs.sizeRatio})`);
      rel("allowableLower", result.allowableLower.value);
    }
    rel("pfApplied", result.failureProbabilityAtApplied.value);
    // The sheet's lot counts are the point estimate's, shown beside the form's upper-bound counts.
    rel("expected", result.expectedFailures.pointEstimate);
    expect(value("upperCount")).toBe(result.failuresUpperBound.pointEstimate);
    rel("reserveFactor", result.reserveFactor.value);
    rel("marginOfSafety", result.marginOfSafety.value);
    expect(value("verdict")).toBe(result.verdict.pass ? "PASS" : "FAIL");

    // Plot points: sorted strengths and (i - 0.5)/N, as the core's plotting positions.
    const chart = state.charts[0];
    const failures = chart.allSeries[0];
    expect(chart.source).toBe("$J$5:$K$19");
    result.points.forEach((pt, i) => {
      expect(at(`J${5 + i}`)).toBe(pt.strength);
      expect(relativeError(at(`L${5 + i}`) as number, pt.failureProbability)).toBeLessThan(1e-15);
      expect(relativeError(at(`K${5 + i}`) as number, pt.y)).toBeLessThan(1e-12);
    });
    expect(failures.name).toBe("Failures");

    // The chart: a native XY scatter with a log stress axis, the fitted lines and the design point.
    expect(chart.type).toBe("XYScatter");
    expect(chart.seriesBy).toBe("Columns");
    expect(chart.axes.categoryAxis.scaleType).toBe("Logarithmic");
    expect(chart.axes.categoryAxis.title.text).toBe("Stress (MPa), log scale");
    expect(chart.axes.valueAxis.title.text).toMatch(/ln\(-ln\(1 - failure probability\)\)/);
    expect(chart.allSeries.map((s: any) => s.name)).toEqual([
      "Failures",
      "Fitted line, specimen size",
      "Fitted line, part size",
      "Design point (point estimate)",
    ]);
    for (const s of chart.allSeries.slice(1)) {
      expect(s.x).toMatch(/^\$J\$\d+(:\$J\$\d+)?$/);
      expect(s.y).toMatch(/^\$K\$\d+(:\$K\$\d+)?$/);
    }
    // The design point sits at the allowable stress and the required survival, on the part-size line.
    const design = chart.allSeries[3];
    expect(relativeError(at(design.x) as number, result.allowablePoint.value)).toBeLessThan(1e-12);
    expect(relativeError(at(design.y) as number, Math.log(-Math.log(0.9999)))).toBeLessThan(1e-12);
    const partLine = chart.allSeries[2];
    const [xa] = partLine.x.split(":");
    const [ya] = partLine.y.split(":");
    const y = at(ya) as number;
    // On the part line: y = m ln(s / theta) + ln k (docs/methods.md section 1 in Weibull-plot form).
    const m = result.parameters.shape;
    const th = result.parameters.scale;
    expect(relativeError(m * Math.log((at(xa) as number) / th) + Math.log(result.sizeRatio.value), y)).toBeLessThan(1e-12);
  });

  it("refers to a selected range where it is, so the sheet follows the data", async () => {
    const source = { kind: "range" as const, strengthsAddress: "Tests!$B$2:$B$16" };
    const result = runDesignCheck(input({ material: { kind: "data", strengths: STRENGTHS, method: "LSQ", source } }));
    const p = plan(result);
    const { context, sheets } = mockWorkbook(["Tests"]);
    const { sheetName } = await writeReportSheet(context, p);
    expect(sheetName).toBe("Design check");
    const cells = grid(sheets.get(sheetName)!);
    expect(cells.flat()).toContain("=BRITTLE.MODULUS(Tests!$B$2:$B$16,,$B$6)");

    const tests: unknown[][] = [["strength"], ...STRENGTHS.map((s) => [null, s])];
    tests[0] = [null, "strength"];
    const { value, engine, sheet } = evaluate({ Tests: tests, [sheetName]: cells }, sheetName, p.refs);
    expect(relativeError(value("modulus") as number, result.parameters.shape)).toBeLessThan(1e-12);
    expect(relativeError(value("allowablePoint") as number, result.allowablePoint.value)).toBeLessThan(1e-12);

    // Change a strength in the data sheet: the report recomputes (the weakest specimen drops by 10 %).
    const weakest = STRENGTHS.indexOf(Math.min(...STRENGTHS));
    engine.setCellContents({ sheet: engine.getSheetId("Tests")!, row: weakest + 1, col: 1 }, [[STRENGTHS[weakest] * 0.9]]);
    const changed = STRENGTHS.map((s, i) => (i === weakest ? s * 0.9 : s));
    const again = runDesignCheck(input({ material: { kind: "data", strengths: changed, method: "LSQ", source } }));
    const [row, col] = parseCell(p.refs.modulus);
    expect(relativeError(engine.getCellValue({ sheet, row, col }) as number, again.parameters.shape)).toBeLessThan(1e-12);
    expect(again.parameters.shape).not.toBeCloseTo(result.parameters.shape, 3);
  });

  it("writes typed parameters and a failures-per-lot target as inputs the formulas use", async () => {
    const result = runDesignCheck(
      input({ material: { kind: "typed", shape: 9.5, scale: 350 }, requirement: { kind: "lot", allowedFailures: 2 }, lotSize: 100000, appliedStress: 120 }),
    );
    const p = plan(result);
    const { context, sheets } = mockWorkbook([]);
    const { sheetName } = await writeReportSheet(context, p);
    const cells = grid(sheets.get(sheetName)!);
    const { value } = evaluate({ [sheetName]: cells }, sheetName, p.refs);
    expect(value("modulus")).toBe(9.5);
    expect(relativeError(value("targetPf") as number, 2e-5)).toBeLessThan(1e-15);
    expect(relativeError(value("allowablePoint") as number, result.allowablePoint.value)).toBeLessThan(1e-10);
    expect(value("verdict")).toBe(result.verdict.pass ? "PASS" : "FAIL");
    // No data, no plot points: the chart starts from the fitted line.
    expect(sheets.get(sheetName)!.charts[0].allSeries[0].name).toBe("Fitted line, specimen size");
  });

  it("plots a censored sample from PLOTPOINTS where registered (adjusted ranks have no native formula), else as values, and says which", async () => {
    const censored = STRENGTHS.map((_, i) => i === 2 || i === 7);
    const result = runDesignCheck(input({ material: { kind: "data", strengths: STRENGTHS, censored, method: "MLE-RAW", source: { kind: "pasted" } } }));
    const p = plan(result);
    const { context, sheets } = mockWorkbook([]);
    const { sheetName } = await writeReportSheet(context, p);
    const cells = grid(sheets.get(sheetName)!);
    const live = Object.keys(adapters).includes("PLOTPOINTS");
    expect(cells.flat()).toContain(
      live ? "censored sample: adjusted ranks from PLOTPOINTS in AG:AH, live" : "censored sample: plot points are values at the time of writing",
    );
    // PLOTPOINTS spills its own header row, so the formula sits on the header's row.
    if (live) expect(cells[3][32]).toBe("=BRITTLE.PLOTPOINTS($F$5:$F$19,$G$5:$G$19)");
    const { at, value } = evaluate({ [sheetName]: cells }, sheetName, p.refs);
    expect(relativeError(value("modulus") as number, result.parameters.shape)).toBeLessThan(1e-12);
    // Reference: the core's Johnson adjusted ranks (plotting-positions.ts), as the form plots them.
    expect(result.points.length).toBe(13);
    result.points.forEach((pt, i) => {
      expect(relativeError(at(`J${5 + i}`) as number, pt.strength), `J${5 + i}`).toBeLessThan(1e-14);
      expect(relativeError(at(`L${5 + i}`) as number, pt.failureProbability), `L${5 + i}`).toBeLessThan(1e-12);
    });
  });

  it("sizes a standard specimen and a pasted element table live where the build has their functions", async () => {
    // Invented element table: four elements, principal stresses (MPa) and volumes (mm³).
    const stresses = [[150, 40, 0], [120, 120, 0], [90, -30, 0], [-50, -20, 0]];
    const sizes = [2, 5, 10, 40];
    const result = runDesignCheck(
      input({
        specimen: { kind: "preset", configuration: "C1161-B-4PT" },
        part: { kind: "table", stresses, columns: 3, sizes, source: { kind: "pasted" } },
        appliedStress: null,
      }),
    );
    expect(result.appliedStress.value).toBe(150);
    const p = plan(result);
    const { context, sheets } = mockWorkbook([]);
    const { sheetName } = await writeReportSheet(context, p);
    const cells = grid(sheets.get(sheetName)!);
    const flat = cells.flat();
    // The table sits from column W, so the formulas can refer to it.
    expect(cells[4].slice(22, 26)).toEqual([150, 40, 0, 2]);
    const live = Object.keys(adapters).includes("PARTEFFSIZE") && Object.keys(adapters).includes("SPECIMEN");
    if (live) {
      expect(flat).toContain(`=BRITTLE.SPECIMEN($B$8,${p.refs.modulus},"VOLUME")`);
      expect(flat.some((v) => typeof v === "string" && v === `=BRITTLE.PARTEFFSIZE($W$5:$Y$8,$Z$5:$Z$8,${p.refs.modulus},${p.refs.criterion})`)).toBe(true);
    } else {
      // Not in this build: the values when written, said so beside them.
      expect(flat.some((v) => typeof v === "string" && v.includes("value when written"))).toBe(true);
    }
    expect(flat).toContain("=MAX($W$5:$Y$8)");
    const { value } = evaluate({ [sheetName]: cells }, sheetName, p.refs);
    expect(relativeError(value("specimenSize") as number, result.specimenSize.value)).toBeLessThan(1e-12);
    expect(relativeError(value("partSize") as number, result.partSize.value)).toBeLessThan(1e-12);
    expect(value("applied")).toBe(150);
    expect(relativeError(value("allowablePoint") as number, result.allowablePoint.value)).toBeLessThan(1e-12);
  });

  it("carries a lifetime and a proof test into live formulas that agree with the form", async () => {
    // Invented crack-growth constants (B in MPa² s) and loads, chosen so that each case below takes a different branch.
    const life = { lifetime: 3.15e7, timeUnit: "s" as const, n: 18, B: 5e5, bUnit: "MPa^2 s" };
    const cases = [
      { name: "lifetime governs", proof: null, applied: 60 },
      { name: "proof test guarantees the life", proof: { proofStress: 300 }, applied: 60 },
      { name: "applied above the proof stress", proof: { proofStress: 100 }, applied: 120 },
    ];
    for (const c of cases) {
      const result = runDesignCheck(input({ lifetime: life, proof: c.proof, appliedStress: c.applied }));
      const p = plan(result);
      const { context, sheets } = mockWorkbook([]);
      const { sheetName } = await writeReportSheet(context, p);
      const cells = grid(sheets.get(sheetName)!);
      const { value } = evaluate({ [sheetName]: cells }, sheetName, p.refs);
      const rel = (key: string, want: number) => expect(relativeError(value(key) as number, want), `${c.name}: ${key}`).toBeLessThan(1e-12);
      rel("lifetimeAllowable", result.lifetimeAllowable!.value);
      rel("reserveFactor", result.reserveFactor.value);
      expect(value("verdict"), c.name).toBe(result.verdict.pass ? "PASS" : "FAIL");
      if (c.proof) {
        rel("proofBreaks", result.proof!.breaks.pointEstimate);
        if (result.proof!.survivorsFailureProbability.value === 0) expect(value("postProofPf")).toBe(0);
        else rel("postProofPf", result.proof!.survivorsFailureProbability.value);
      }
      if (c.name === "lifetime governs") {
        expect(result.reserveFactor.value).toBeCloseTo(result.lifetimeAllowable!.value / 60, 12);
        expect(result.verdict.text).toMatch(/allowable stress over 3\.150e7 s of sustained load \(slow crack growth\)/);
      }
      if (c.name === "proof test guarantees the life") {
        rel("proofMinLife", result.proof!.minimumLife!.value);
        expect(result.proof!.minimumLife!.value).toBeGreaterThanOrEqual(life.lifetime);
        expect(result.proof!.credited).toBe(true);
        expect(result.verdict.pass).toBe(true);
      }
      if (c.name === "applied above the proof stress") {
        expect(result.proof!.minimumLife!.value).toBe(0);
        expect(result.proof!.text).toMatch(/exceeds the proof stress/);
        expect(result.cautions.find((x) => x.id === "proof")!.level).toBe("warning");
      }
    }
  });

  it("picks the next name when another sheet took the name between looking and adding", async () => {
    const result = runDesignCheck(input());
    const { context, sheets } = mockWorkbook(["Sheet1"], { hiddenFromFirstListing: ["Design check"] });
    const { sheetName } = await writeReportSheet(context, plan(result));
    expect(sheetName).toBe("Design check 2");
    expect(sheets.get("Design check")!.ranges).toEqual([]);
  });

  it("on a host below ExcelApi 1.7 (isSetSupported says no) plots the data points only, with no 1.7 chart calls", async () => {
    // source: @types/office-js 1.0.612 API-set tags: ChartSeriesCollection.add, ChartSeries.setValues/setXAxisValues,
    // ChartSeries.chartType and ChartAxis.scaleType are ExcelApi 1.7; the manifest requires 1.4.
    const asked: [string, string | undefined][] = [];
    const office = { context: { requirements: { isSetSupported: (name: string, version?: string) => (asked.push([name, version]), false) } } };
    (globalThis as { Office?: unknown }).Office = office;
    try {
      const result = runDesignCheck(input());
      const { context, sheets } = mockWorkbook([]);
      await writeReportSheet(context, plan(result));
      const chart = sheets.get("Design check")!.charts[0] as any;
      expect(asked).toContainEqual(["ExcelApi", "1.7"]);
      expect(chart.allSeries.map((s: any) => s.name)).toEqual(["Failures"]);
      expect(chart.axes.categoryAxis.scaleType).toBeUndefined();
      expect(chart.axes.categoryAxis.title.text).toBe("Stress (MPa)"); // the axis is linear, and says nothing else
    } finally {
      delete (globalThis as { Office?: unknown }).Office;
    }
  });

  it("refuses to write into a new sheet that is not empty", async () => {
    const result = runDesignCheck(input());
    const { context, sheets } = mockWorkbook([], { newSheetNotEmpty: true });
    await expect(writeReportSheet(context, plan(result))).rejects.toBeInstanceOf(SheetNotEmptyError);
    expect(sheets.get("Design check")!.ranges).toEqual([]);
    expect(sheets.get("Design check")!.charts).toEqual([]);
  });
});

describe("the functions the sheet calls", () => {
  it("must all be registered: a renamed function fails the plan instead of dropping its row", () => {
    const result = runDesignCheck(input());
    const without = new Set(Object.keys(adapters).filter((id) => id !== "PLOTPOINTS"));
    expect(() => planReportSheet(result, { functions: without, cautions: result.cautions, written: new Date("2026-01-02T03:04:00Z") })).toThrow(
      /calls BRITTLE\.PLOTPOINTS, which this build does not register/,
    );
  });
});

describe("the reserve factor and margin beside the verdict, as the spreadsheet shows them", () => {
  // Rendering reference: numfmt 4.0.1 (npm registry), an implementation of the spreadsheet number
  // format codes, conditions included. A value on the FAIL side must never be shown as a pass.
  const result = runDesignCheck(input());
  const p = plan(result);
  const formatAt = (key: string) => {
    const address = p.refs[key].replace(/\$/g, "");
    const block = p.blocks.find((b) => b.address === address);
    expect(block?.numberFormat, key).toBeDefined();
    return block!.numberFormat!;
  };
  const reserve = formatAt("reserveFactor");
  const margin = formatAt("marginOfSafety");

  it("never shows a reserve factor below 1 as 1 or above, and keeps three decimals elsewhere", () => {
    for (const rf of [0.9995, 0.9996, 0.99999, 0.99999999, 1 - 1e-12, 0.999, 0.5, 0.0123]) {
      const shown = numfmt(reserve, rf);
      expect(Number(shown), `${rf} shown as ${shown}`).toBeLessThan(1);
    }
    expect(numfmt(reserve, 1)).toBe("1.000");
    expect(numfmt(reserve, 1.23456)).toBe("1.235");
    expect(numfmt(reserve, 0.9994)).toBe("0.999");
    expect(numfmt(reserve, 0.9996)).toBe("0.9996");
    // The plain three-decimal format this replaces shows the FAIL as a pass:
    expect(numfmt("0.000", 0.9996)).toBe("1.000");
  });

  it("never shows a negative margin as zero or positive", () => {
    for (const m of [-0.0004, -0.0005, -1e-5, -1e-8, -1e-12, -0.001, -0.5, -3]) {
      const shown = numfmt(margin, m);
      expect(Number(shown), `${m} shown as ${shown}`).toBeLessThan(0);
    }
    expect(numfmt(margin, 0)).toBe("0.000");
    expect(numfmt(margin, 0.23456)).toBe("0.235");
    expect(numfmt(margin, -0.5)).toBe("-0.500");
    expect(numfmt("0.000", -0.0004)).toBe("0.000");
  });
});
