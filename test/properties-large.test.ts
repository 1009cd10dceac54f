// Large inputs. A full spreadsheet column (1,048,576 rows) of strengths
// through MODULUS and CHARSTRENGTH in the embedded engine, checked against
// the maximum-likelihood equations of ASTM C1239 section 7 evaluated here
// independently; and every function that takes a range, given 200,000 rows,
// returns a value or a clear error, never an internal error (a JavaScript
// exception such as a stack overflow from spreading a long array).
//
// Speed is not asserted here: `npm run bench` measures it.
import { beforeAll, describe, expect, it } from "vitest";
import { createEngine } from "../cli/engine";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { guarded } from "../functions/registry";
import { hostValue } from "./properties-policy";
import { hostViolations } from "./properties-workbook";

const FULL_COLUMN = 1_048_576;

/** Strengths as exact decimal steps, so any tool regenerates the same numbers (200.0 to 400.2). */
const strengthAt = (i: number) => 200 + ((i * 7919) % 2003) / 10;

let metadata: FunctionMetadata[];
beforeAll(async () => {
  metadata = (await generateMetadata()).functions;
});

/** Neumaier's compensated sum, written out here so the check does not share code with the core. */
function sum(n: number, term: (i: number) => number): number {
  let s = 0;
  let c = 0;
  for (let i = 0; i < n; i++) {
    const t = term(i);
    const u = s + t;
    c += Math.abs(s) >= Math.abs(t) ? s - u + t : t - u + s;
    s = u;
  }
  return s + c;
}

describe("a full column of strengths", () => {
  // Found by this test: the engine once kept HyperFormula's default sheet limit (40,000 rows), so a larger
  // workbook failed before any formula ran; createEngine now sets a spreadsheet's own limits.
  it("1,048,576 rows through MODULUS and CHARSTRENGTH in the engine solve the maximum-likelihood equations", () => {
    const rows: unknown[][] = Array.from({ length: FULL_COLUMN }, (_, i) => [strengthAt(i)]);
    rows[0].push('=BRITTLE.MODULUS(A:A, , "MLE-RAW")', '=BRITTLE.CHARSTRENGTH(A1:A1048576, , "MLE-RAW")', "=BRITTLE.MODULUS(A:A)");
    const engine = createEngine({ Column: rows }, metadata);
    const m = engine.getCellValue({ sheet: 0, row: 0, col: 1 });
    const scale = engine.getCellValue({ sheet: 0, row: 0, col: 2 });
    const unbiased = engine.getCellValue({ sheet: 0, row: 0, col: 3 });
    expect(typeof m, String(m)).toBe("number");
    expect(typeof scale, String(scale)).toBe("number");
    expect(typeof unbiased, String(unbiased)).toBe("number");

    // ASTM C1239 section 7, complete sample: sum(x^m ln x)/sum(x^m) - mean(ln x) - 1/m = 0 and
    // sigma_theta = (sum x^m / N)^(1/m); with x = s / max(s) so nothing overflows.
    const n = FULL_COLUMN;
    const max = 200 + 2002 / 10;
    const mm = m as number;
    const w = (i: number) => (strengthAt(i) / max) ** mm;
    const s0 = sum(n, w);
    const s1 = sum(n, (i) => w(i) * Math.log(strengthAt(i) / max));
    const meanLog = sum(n, (i) => Math.log(strengthAt(i) / max)) / n;
    const residual = s1 / s0 - meanLog - 1 / mm;
    expect(Math.abs(residual) * mm).toBeLessThan(1e-10);
    expect(Math.abs((scale as number) / (max * (s0 / n) ** (1 / mm)) - 1)).toBeLessThan(1e-12);
    // The unbiasing factor at a million specimens differs from 1 by about 1e-6 (ASTM C1239 table trend).
    expect(Math.abs((unbiased as number) / mm - 1)).toBeLessThan(1e-4);
    // The same numbers through the host path (guarded adapter) give the same modulus to the last bit.
    expect(guarded.MODULUS(rows.map((r) => [r[0]]), null, "MLE-RAW")).toBe(m);
  }, 900_000); // generous own timeout: a full column takes minutes on a loaded machine
});

describe("200,000 rows in every range: a value or a clear error, never an internal error", () => {
  const ROWS = 200_000;
  const SIMULATING = new Set(["FIT", "ORIGINFIT", "LOTCHECK"]);

  it("runs every function that takes a range (those that simulate at 100 rows)", () => {
    const withRanges = metadata.filter((f) => f.parameters.some((p) => p.dimensionality === "matrix"));
    expect(withRanges.length).toBeGreaterThan(5);
    const skipped: string[] = [];
    const problems: string[] = [];
    for (const fn of withRanges) {
      // The documented example with its ranges filled to the size under test.
      const stretch = (n: number) =>
        fn.parameters.map((p, k) => {
          if (p.dimensionality !== "matrix") return p.optional ? null : exampleScalar(fn, k);
          if (/flag/i.test(p.description ?? "")) return p.optional ? null : Array.from({ length: n }, () => [false]);
          if (/label/i.test(p.description ?? "")) return Array.from({ length: n }, (_, i) => [i % 3 ? "surface" : "pore"]);
          return Array.from({ length: n }, (_, i) => [strengthAt(i) * (k + 1)]);
        });
      // Functions that simulate run at 100 rows only: a fixed list, never a timing probe (a loaded machine
      // would skip different functions on different runs).
      if (SIMULATING.has(fn.id)) {
        const small = guarded[fn.id](...stretch(100));
        problems.push(...hostViolations(small, fn).map((p) => `${fn.id} at 100 rows: ${p}`));
        skipped.push(`${fn.id} (simulates: 100 rows)`);
        continue;
      }
      const result = guarded[fn.id](...stretch(ROWS));
      const found = hostViolations(result, fn);
      problems.push(...found.map((p) => `${fn.id}: ${p}`));
    }
    console.log(`properties-large: ${withRanges.length - skipped.length} functions at ${ROWS} rows; not tried at that size: ${skipped.join(", ") || "none"}`);
    expect(problems).toEqual([]);
  }, 900_000); // generous own timeout: a full column takes minutes on a loaded machine
});

// Once faults: Math.max(...array) on a whole range overflowed the call stack beyond about 120,000 values.
describe("long ranges that once overflowed the call stack", () => {
  const ROWS = 200_000;
  const rates = Array.from({ length: ROWS }, (_, i) => [10 ** ((i % 5) - 2)]);
  // Strengths that rise with the rate as slow crack growth predicts (n = 20), with a little scatter.
  const strengths = rates.map(([r], i) => [100 * r ** (1 / 21) * (1 + (((i * 7919) % 101) - 50) / 5000)]);
  it("SCGFIT on 200,000 specimens gives n and D, not an internal error", () => {
    expect(hostViolations(guarded.SCGFIT(rates, strengths), metadata.find((f) => f.id === "SCGFIT")!)).toEqual([]);
  });
  it("LOTCHECK of 100,000 against 200,000 specimens gives a clear error (beyond the simulation limit), not an internal one", () => {
    const baseline = strengths;
    expect(hostViolations(guarded.LOTCHECK(baseline.slice(0, ROWS / 2), baseline), metadata.find((f) => f.id === "LOTCHECK")!)).toEqual([]);
  });
});

/** The documented example's literal for a scalar argument (ranges are generated). */
function exampleScalar(fn: FunctionMetadata, k: number): unknown {
  const example = /Example: ?=BRITTLE\.\w+\(([^)]*)\)/.exec(fn.description.replace(/\s+/g, " "));
  const text = example?.[1].split(",")[k]?.trim() ?? "";
  return hostValue(text === "" ? { kind: "omit" } : { kind: "literal", text: text.replace(/E(?=[+-]?\d)/, "e") });
}
