// A test machine's record to strengths (src/design/test-record.ts): units read from the header and
// converted with the exact factors of their definitions (1 in = 25.4 mm, international inch 1959;
// 1 lbf = 4.4482216152605 N, NIST SP 811 appendix B), strengths by the formulas of
// src/design/strength-from-load.ts (themselves checked against ASTM C1161 / C1499 / ISO 6872 in
// test/load-strength.test.ts), and every row either a specimen or a reported problem.
import { describe, expect, it } from "vitest";
import { InputError } from "../src/errors";
import { flexureStrength, ringOnRingStrength } from "../src/design/strength-from-load";
import { guessColumns, strengthsFromRecord, unitInHeader } from "../src/design/test-record";
import { relativeError } from "./helpers";

describe("units in the header", () => {
  it("reads brackets, parentheses, a slash or 'in <unit>'", () => {
    expect(unitInHeader("Load [kN]")).toBe("kN");
    expect(unitInHeader("Fmax (N)")).toBe("N");
    expect(unitInHeader("F / lbf")).toBe("lbf");
    expect(unitInHeader("Width [in]")).toBe("in");
    expect(unitInHeader("Thickness in mm")).toBe("mm");
    expect(unitInHeader("Depth")).toBe("");
    expect(unitInHeader("Load [kgf]")).toBe("unknown");
  });
});

describe("guessing the columns from the header", () => {
  it("maps the usual words of a flexure record, and leaves what it cannot tell to the user", () => {
    const headers = ["Specimen", "Width [mm]", "Depth [mm]", "Fmax [N]", "Fracture origin", "Lot"];
    expect(guessColumns(headers, "bar-flexure")).toEqual({ id: 0, width: 1, depth: 2, load: 3, origin: 4, lot: 5 });
  });

  it("for a ring-on-ring record", () => {
    const headers = ["ID", "Load (kN)", "Thickness (mm)", "Disk diameter (mm)"];
    expect(guessColumns(headers, "ring-on-ring")).toEqual({ id: 0, load: 1, thickness: 2, diskDiameter: 3 });
  });
});

describe("strengths from a record", () => {
  const fixed = { outerSpan: 40, innerSpan: 20 };

  it("converts kN to N and keeps mm: the strength of a bar equals the formula in N and mm", () => {
    const r = strengthsFromRecord({
      configuration: "bar-flexure",
      headers: ["Specimen", "Load [kN]", "Width [mm]", "Depth [mm]", "Origin"],
      rows: [["B-01", 0.4123, 4.01, 3.0, "surface"], ["B-02", 0.3871, 3.99, 2.98, "volume"]],
      columns: { id: 0, load: 1, width: 2, depth: 3, origin: 4 },
      fixed,
    });
    const expected = flexureStrength({ load: 412.3, outerSpan: 40, innerSpan: 20, width: 4.01, depth: 3.0 }).strength;
    expect(relativeError(r.specimens[0].strength!, expected)).toBeLessThan(1e-14);
    expect(r.specimens[0]).toMatchObject({ id: "B-01", origin: "surface", row: 2 });
    expect(r.specimens[1]).toMatchObject({ id: "B-02", origin: "volume", row: 3 });
    expect(r.conversions[0]).toBe('load: "Load [kN]" in kN x 1000 -> N');
  });

  it("lbf and inches: the same bar in US units gives the same MPa", () => {
    const F = 412.3 / 4.4482216152605;
    const r = strengthsFromRecord({
      configuration: "bar-flexure",
      headers: ["Load (lbf)", "Width (in)", "Depth (in)"],
      rows: [[F, 4.01 / 25.4, 3.0 / 25.4]],
      columns: { load: 0, width: 1, depth: 2 },
      fixed,
    });
    const expected = flexureStrength({ load: 412.3, outerSpan: 40, innerSpan: 20, width: 4.01, depth: 3.0 }).strength;
    expect(relativeError(r.specimens[0].strength!, expected)).toBeLessThan(1e-13);
  });

  it("disks: Poisson's ratio typed once, diameters from the record", () => {
    const r = strengthsFromRecord({
      configuration: "ring-on-ring",
      headers: ["Id", "Load [N]", "Thickness [mm]"],
      rows: [["D1", 1000, 1.5]],
      columns: { id: 0, load: 1, thickness: 2 },
      fixed: { loadDiameter: 12, supportDiameter: 24, diskDiameter: 30, poisson: 0.22 },
    });
    const expected = ringOnRingStrength({ load: 1000, loadDiameter: 12, supportDiameter: 24, diskDiameter: 30, thickness: 1.5, poisson: 0.22 });
    expect(r.specimens[0].strength).toBe(expected.strength);
  });

  it("reports each row it cannot use, with the reason, and keeps the others", () => {
    const r = strengthsFromRecord({
      configuration: "bar-flexure",
      headers: ["Id", "Load [N]", "Depth [mm]"],
      rows: [["a", 400, 3], ["b", null, 3], ["c", "41O", 3], ["d", 400, 5]],
      columns: { id: 0, load: 1, depth: 2 },
      fixed: { ...fixed, width: 4 },
    });
    expect(r.specimens.map((s) => s.strength === null)).toEqual([false, true, true, true]);
    expect(r.specimens[1].problem).toBe("Load [N] is blank");
    expect(r.specimens[2].problem).toBe('Load [N] "41O" is not a number');
    expect(r.specimens[3].problem).toMatch(/outside the formula's limits: outer span \/ depth is 8\.00/);
  });

  it("refuses a column without a unit or with an unknown one, and a quantity neither mapped nor typed", () => {
    const base = { configuration: "bar-flexure" as const, rows: [[400, 3]], fixed: { ...fixed, width: 4 } };
    expect(() => strengthsFromRecord({ ...base, headers: ["Load", "Depth [mm]"], columns: { load: 0, depth: 1 } })).toThrow(/names no unit/);
    expect(() => strengthsFromRecord({ ...base, headers: ["Load [kgf]", "Depth [mm]"], columns: { load: 0, depth: 1 } })).toThrow(/unknown unit/);
    expect(() => strengthsFromRecord({ ...base, headers: ["Load [mm]", "Depth [mm]"], columns: { load: 0, depth: 1 } })).toThrow(/mm is not a unit of force/);
    expect(() => strengthsFromRecord({ ...base, headers: ["Load [N]", "Depth [mm]"], columns: { load: 0 } })).toThrow(InputError);
    // A column without a unit in its header takes the unit the user chose.
    const chosen = strengthsFromRecord({ ...base, headers: ["Load", "Depth [mm]"], columns: { load: 0, depth: 1 }, units: { load: "kN" } });
    expect(relativeError(chosen.specimens[0].strength!, flexureStrength({ load: 400e3, outerSpan: 40, innerSpan: 20, width: 4, depth: 3 }).strength)).toBeLessThan(1e-15);
  });
});
