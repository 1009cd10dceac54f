// Importing a test-machine record in the task pane (src/design/record-import-answer.ts, what the panel shows):
// the record read through the shared reader, strengths by the core formulas (checked against ASTM
// C1161 / C1499 in test/load-strength.test.ts), origins to censoring flags as ASTM C1239 sec. 7
// prescribes for competing flaw populations, and what step 1 receives read back by its own paste
// reader. The examples are invented demo data (marked in their headers); the hostile records in
// test/fixtures/hostile/export-* each name the failure they guard against.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { flexureStrength, ringOnRingStrength } from "../src/design/strength-from-load";
import { decodeText } from "../src/input/encoding";
import { parsePasted } from "../taskpane/app/parse-pasted";
import { importAnswer, readRecordTable } from "../src/design/record-import-answer";
import { relativeError } from "./helpers";

const text = (path: string) => decodeText(new Uint8Array(readFileSync(path))).text;
const BARS = "examples/machine-export-bars.csv";
const DISKS = "examples/machine-export-disks-decimal-comma.csv";
const barColumns = { id: 0, width: 1, depth: 2, load: 3, origin: 4, lot: 5 };

describe("the invented bar record (comma-delimited, N and mm)", () => {
  const table = readRecordTable(text(BARS), false);

  it("gives every broken bar its strength by ASTM C1161's formula, and names the row left out", () => {
    const a = importAnswer({ table, configuration: "bar-flexure", columns: barColumns, fixed: { outerSpan: 40, innerSpan: 20 }, population: "" });
    expect(a.specimens).toHaveLength(19);
    const first = a.specimens[0];
    // VB-01: 433.7 N on 3.992 x 3.009 mm (the record's first line).
    expect(relativeError(first.strength!, flexureStrength({ load: 433.7, outerSpan: 40, innerSpan: 20, width: 3.992, depth: 3.009 }).strength)).toBeLessThan(1e-14);
    const left = a.specimens.filter((s) => s.strength === null);
    expect(left.map((s) => s.id)).toEqual(["VB-X1"]);
    expect(a.notes.join("\n")).toMatch(/Row 9 \(VB-X1\) left out: Fmax \[N\] is blank/);
    expect(a.notes[1]).toBe("18 of 19 specimens have a strength (MPa).");
  });

  it("fits one fracture origin: the others are censored, and step 1 reads back the same sample", () => {
    const a = importAnswer({ table, configuration: "bar-flexure", columns: barColumns, fixed: { outerSpan: 40, innerSpan: 20 }, population: "surface" });
    expect(a.origins).toEqual(["surface", "pore"]);
    const used = a.specimens.filter((s) => s.strength !== null);
    const back = parsePasted(a.pasteText);
    expect(back.strengths).toEqual(used.map((s) => s.strength));
    expect(back.censored).toEqual(used.map((s) => s.origin !== "surface"));
  });

  it("compares each lot with the rest of the record by the likelihood-ratio lot check", () => {
    const a = importAnswer({ table, configuration: "bar-flexure", columns: barColumns, fixed: { outerSpan: 40, innerSpan: 20 }, population: "" });
    expect(a.lots.map((l) => [l.lot, l.specimens])).toEqual([
      ["L1", 9],
      ["L2", 9],
    ]);
    for (const l of a.lots) expect(l.text).toMatch(/^(The lot differs from|Consistent with) the baseline \(/);
  });
});

describe("the invented disk record (semicolons, decimal commas, kN)", () => {
  it("reads the decimal commas and converts kN to N: strengths equal ASTM C1499's formula", () => {
    const table = readRecordTable(text(DISKS), false);
    expect(table.rows[0]).toEqual(["RD01", 1.2003, 1.493, "surface", "B7"]);
    const a = importAnswer({
      table,
      configuration: "ring-on-ring",
      columns: { id: 0, load: 1, thickness: 2, origin: 3, lot: 4 },
      fixed: { loadDiameter: 12, supportDiameter: 24, diskDiameter: 30, poisson: 0.22 },
      population: "",
    });
    const expected = ringOnRingStrength({ load: 1200.3, loadDiameter: 12, supportDiameter: 24, diskDiameter: 30, thickness: 1.493, poisson: 0.22 }).strength;
    expect(relativeError(a.specimens[0].strength!, expected)).toBeLessThan(1e-13);
    expect(a.notes[0]).toMatch(/semicolon-delimited/);
    expect(a.lots).toEqual([]); // one lot: nothing to compare
  });
});

describe("hostile records (test/fixtures/hostile/export-*)", () => {
  const H = "test/fixtures/hostile";
  const bar = (file: string, columns: Record<string, number>, decimalComma = false) =>
    importAnswer({ table: readRecordTable(text(`${H}/${file}`), decimalComma), configuration: "bar-flexure", columns, fixed: { outerSpan: 40, innerSpan: 20, width: 4 }, population: "" });

  it("a load column with no unit is refused, not guessed to be N (a kN record would be 1000 times too weak)", () => {
    expect(() => bar("export-load-without-unit.csv", { id: 0, load: 1, depth: 2 })).toThrow(/names no unit/);
  });

  it("an unknown unit (kgf) is refused with the units it knows", () => {
    expect(() => bar("export-unknown-unit.csv", { id: 0, load: 1, depth: 2 })).toThrow(/unknown unit; use N, kN, lbf/);
  });

  it("a typo in a load (4OO) leaves that specimen out with the reason, the others keep their strengths", () => {
    const a = bar("export-text-in-load.csv", { id: 0, load: 1, depth: 2 });
    expect(a.specimens[0].problem).toBe('Load [N] "4OO" is not a number');
    expect(a.specimens[1].strength).toBeGreaterThan(0);
  });

  it("a record that quotes every field is read: a quoted load is a number (every specimen was left out as 'not a number')", () => {
    const a = bar("export-quoted-fields.csv", { id: 0, load: 1, depth: 2 });
    // Four-point-1/4 point flexure, S = 3PL/(4bd^2) at L = 40 mm, b = 4 mm, d = 3 mm (ASTM C1161, from memory).
    expect(a.specimens.map((s) => s.id)).toEqual(["A1", "A2"]);
    expect(relativeError(a.specimens[0].strength!, flexureStrength({ load: 400, outerSpan: 40, innerSpan: 20, width: 4, depth: 3 }).strength)).toBeLessThan(1e-15);
    expect(relativeError(a.specimens[1].strength!, (3 * 410.5 * 40) / (4 * 4 * 3 * 3))).toBeLessThan(1e-13);
  });

  it("decimal commas in a comma-delimited record split each number in two: refused, never read as extra columns", () => {
    expect(() => readRecordTable(text(`${H}/export-comma-decimals-in-comma-file.csv`), false)).toThrow(/line 2 has 4 fields, but line 1 has 3/);
  });

  it("a UTF-16 record with lbf and inches reads like the same record in N and mm", () => {
    const a = bar("export-utf16-lbf-in.csv", { id: 0, load: 1, depth: 2 });
    const expected = flexureStrength({ load: 90 * 4.4482216152605, outerSpan: 40, innerSpan: 20, width: 4, depth: 0.118 * 25.4 }).strength;
    expect(relativeError(a.specimens[0].strength!, expected)).toBeLessThan(1e-13);
  });
});
