/**
 * The units a design check converts, against their definitions: 1 in =
 * 25.4 mm exactly (international inch, 1959), 1 h = 3600 s, 1 year = 365.25 d
 * (the Julian year); and the spellings the check file accepts.
 */
import { describe, expect, it } from "vitest";
import { convertTime, parseBUnit, parseSizeUnit } from "../src/design/check-units";
import { formatLevel, formatNumber, oneIn } from "../src/design/probability-text";
import { confidenceConvention } from "../src/design/confidence-convention";

describe("size units", () => {
  it("reads ^3, 3 and ³ alike, and gives the size of one unit in mm^power (source: 1 in = 25.4 mm exactly)", () => {
    for (const t of ["in^3", "in3", "in³", " in ^ 3 "]) expect(parseSizeUnit(t)).toEqual({ text: "in^3", length: "in", power: 3, inMillimetres: 25.4 ** 3 });
    expect(parseSizeUnit("cm²")!.inMillimetres).toBe(100);
    expect(parseSizeUnit("m^3")!.inMillimetres).toBe(1e9);
    for (const bad of ["mm", "mm^4", "ft^3", "", "3mm", "mm^3^3"]) expect(parseSizeUnit(bad), bad).toBeNull();
  });
});

describe("time units and the unit of B", () => {
  it("converts with 1 h = 3600 s and 1 year = 365.25 d", () => {
    expect(convertTime(1, "h", "s")).toBe(3600);
    expect(convertTime(10, "years", "s")).toBe(315576000);
    expect(convertTime(10, "years", "h")).toBe(87660);
    expect(convertTime(7, "s", "s")).toBe(7);
  });
  it("reads the stress and time parts of B's unit", () => {
    expect(parseBUnit("MPa^2 s")).toEqual({ stress: "MPa", time: "s" });
    expect(parseBUnit("MPa² h")).toEqual({ stress: "MPa", time: "h" });
    expect(parseBUnit("N/mm²^2 years")).toEqual({ stress: "N/mm²", time: "years" });
    expect(parseBUnit("MPa s")).toBeNull();
    expect(parseBUnit("MPa^2 days")).toBeNull();
  });
});

describe("words for numbers and confidence", () => {
  it("writes levels, small probabilities as 1 in N, and never NaN", () => {
    expect(formatLevel(0.95)).toBe("95 %");
    expect(formatLevel(0.995)).toBe("99.5 %");
    expect(oneIn(1e-4)).toBe("1 in 10,000");
    expect(oneIn(0.7)).toBeNull();
    expect(formatNumber(Number.NaN)).toBe("not a number");
    expect(formatNumber(3.15e8)).toBe("3.150e8");
  });
  it("pairs a one-sided level C with the two-sided band 2C - 1 (a two-sided interval leaves (1 - L)/2 in each tail)", () => {
    expect(confidenceConvention({ level: 0.95, sides: "one-sided" })).toMatchObject({ oneSided: 0.95, boundLabel: "95 % one-sided lower bound", bandLabel: "90 % two-sided band" });
    expect(confidenceConvention({ level: 0.9, sides: "two-sided" }).oneSided).toBe(0.95);
    expect(confidenceConvention({ level: 0.99, sides: "two-sided" }).boundLabel).toBe("99.5 % one-sided lower bound");
  });
});
