/**
 * The check file (*.check.json): round trips, the examples, and every hostile
 * check file in test/fixtures/hostile/check-*.json, each with the failure it
 * guards against. Reference for the format: docs/check-file.md.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { CHECK_FORMAT, CHECK_FORMAT_VERSION } from "../src/design/check-description";
import { CheckFieldError, parseCheckFile, parseCheckFileBytes, serializeCheckFile } from "../src/design/check-file";
import { runDesignCheck } from "../src/design/design-check";
import { input, STRENGTHS } from "./taskpane-inputs";

const HOSTILE = "test/fixtures/hostile";
const bytes = (name: string) => new Uint8Array(readFileSync(join(HOSTILE, name)));

function refusal(name: string): CheckFieldError {
  try {
    parseCheckFileBytes(bytes(name));
  } catch (error) {
    if (error instanceof CheckFieldError) return error;
    throw error;
  }
  throw new Error(`${name} was accepted`);
}

describe("round trip", () => {
  const cases = {
    "data with censoring and a range source": input({
      material: { kind: "data", strengths: STRENGTHS, censored: STRENGTHS.map((_, i) => i === 3), method: "MLE", source: { kind: "range", strengthsAddress: "Tests!$B$2:$B$16", flagsAddress: "Tests!$C$2:$C$16" } },
    }),
    "datasheet values, lot requirement, lifetime and proof": input({
      title: "INVENTED round-trip case",
      material: { kind: "typed", shape: 11.2, scale: 402.5, specimens: 30, unbiased: false },
      requirement: { kind: "lot", allowedFailures: 2 },
      lifetime: { lifetime: 87660, timeUnit: "h", n: 24.5, B: 2.5e6, bUnit: "MPa^2 h" },
      proof: { proofStress: 260 },
    }),
    "element table, preset specimen, two-sided confidence, confirmed low survival": input({
      confidence: { level: 0.9, sides: "two-sided" },
      specimen: { kind: "preset", configuration: "C1499-20/10", poisson: 0.22 },
      flaws: "surface",
      sizeUnit: "mm^2",
      part: { kind: "table", columns: 3, stresses: [[120, 60, 0], [80.5, -10, 0]], sizes: [2.5, 4] },
      appliedStress: null,
      requirement: { kind: "survival", survival: 0.3 },
      confirmLowSurvival: true,
    }),
  };
  for (const [name, d] of Object.entries(cases)) {
    it(`${name}: parse(serialise(d)) equals d and gives the same verdict`, () => {
      const text = serializeCheckFile(d);
      expect(text.startsWith(`{\n  "format": "${CHECK_FORMAT}",\n  "version": ${CHECK_FORMAT_VERSION},`)).toBe(true);
      const back = parseCheckFile(text);
      expect(back).toEqual(d);
      expect(serializeCheckFile(back)).toBe(text);
      expect(runDesignCheck(back).verdict).toEqual(runDesignCheck(d).verdict);
    });
  }
});

describe("the invented examples", () => {
  const examples = readdirSync("examples").filter((f) => f.endsWith(".check.json"));
  it("has a pass, a fail and one with slow crack growth and a proof test", () => {
    expect(examples.sort()).toEqual(["check-fail.check.json", "check-lifetime-proof.check.json", "check-pass.check.json"]);
  });
  for (const name of examples) {
    it(`${name} is marked invented and written in the canonical form`, () => {
      const text = readFileSync(join("examples", name), "utf8");
      const d = parseCheckFile(text);
      expect(d.title).toMatch(/^INVENTED EXAMPLE/);
      expect(serializeCheckFile(d)).toBe(text);
    });
  }
});

describe("hostile check files (test/fixtures/hostile/check-*)", () => {
  const expected: Record<string, { field: string; message: RegExp; guards: string }> = {
    "check-decimal-comma.check.json": { field: "material.strengths[3]", message: /point as the decimal separator/, guards: "a quoted decimal-comma number read as text or as 430" },
    "check-typo-field.check.json": { field: "apliedStress", message: /unknown field/, guards: "a misspelt field silently dropping the applied stress" },
    "check-bare-confidence.check.json": { field: "confidence", message: /does not say its sidedness/, guards: "a confidence level read with the wrong sidedness" },
    "check-survival-as-failure-probability.check.json": { field: "requirement.survival", message: /failure probability may have been typed/, guards: "a failure probability passed off as the survival" },
    "check-unit-mismatch.check.json": { field: "sizeUnit", message: /is an area, but the flaws are volume flaws/, guards: "an area unit used as a volume" },
    "check-newer-version.check.json": { field: "version", message: /newer than the version 1/, guards: "a newer format read with the old meaning" },
    "check-wrong-format.check.json": { field: "format", message: /not a design-check file/, guards: "another JSON document taken for a check" },
    "check-truncated.check.json": { field: "", message: /^not a JSON file: line \d+, column \d+/, guards: "a truncated file read partially" },
    "check-b-unit-mismatch.check.json": { field: "lifetime.bUnit", message: /quoted in psi\^2 but the check's stresses are in MPa/, guards: "B in another stress unit mixed with MPa" },
    "check-overflow-number.check.json": { field: "appliedStress", message: /too large to represent/, guards: "1e400 read as Infinity" },
    "check-censored-mismatch.check.json": { field: "material.censored", message: /2 flags for 10 strengths/, guards: "censoring flags shifted against the strengths" },
    "check-nan-text.check.json": { field: "part.effectiveSize", message: /expected a number, got text that is not a number/, guards: "NaN reaching the mathematics" },
    "check-strengths-as-text.check.json": { field: "material.strengths", message: /expected a list, got text/, guards: "semicolon-separated text taken for data" },
    "check-utf16le-no-bom.check.json": { field: "", message: /UTF-16 without a byte-order mark/, guards: "UTF-16 bytes read as UTF-8 garbage" },
    "check-latin1.check.json": { field: "", message: /not valid UTF-8/, guards: "Latin-1 bytes read with replacement characters" },
    "check-duplicate-key.check.json": { field: "requirement.survival", message: /written twice \(lines 39 and 40\)/, guards: "a second key silently overriding the first (FAIL turned PASS)" },
    "check-line-comment.check.json": { field: "", message: /^not a JSON file: line 42, column 20: .*comments are not allowed in JSON/, guards: "a comment refused without saying so" },
    "check-block-comment.check.json": { field: "", message: /^not a JSON file: .*comments are not allowed in JSON/, guards: "a leading comment refused without a place or a reason" },
    "check-trailing-comma.check.json": { field: "", message: /^not a JSON file: line 45, column 1: .*a comma before a closing bracket/, guards: "a trailing comma refused without saying so" },
    "check-decimal-commas-in-list.check.json": { field: "material.strengths", message: /separates numbers by "," in some places and ", " in others: decimal commas\?/, guards: "decimal commas in a list read as twice as many strengths" },
    "check-nan-literal.check.json": { field: "", message: /^not a JSON file: line 41, column 20: .*a word where a number belongs/, guards: "a refusal spread over two lines without a place" },
    "check-plus-sign.check.json": { field: "", message: /^not a JSON file: line 41, column 20: .*no plus sign/, guards: "a refusal spread over two lines without a place" },
    "check-single-quotes.check.json": { field: "", message: /^not a JSON file: line 21, column 3: .*double quotes/, guards: "single quotes refused without saying so" },
    "check-decimal-comma-number.check.json": { field: "", message: /^not a JSON file: line 41, column 24: .*decimal comma\?/, guards: "a decimal comma refused as a missing property name" },
    "check-two-sided-zero.check.json": { field: "confidence.level", message: /must lie above 0 and at most 0\.99 \(got 0\)/, guards: "a refusal whose stated range includes the refused value" },
    "check-survival-rounds-to-one.check.json": { field: "requirement.survival", message: /strictly between 0 and 1 \(got 1\)/, guards: "a survival with more nines than a double holds, read as certain survival" },
    "check-ragged-table.check.json": { field: "part.stresses[1]", message: /needs at least 3 entries \(got 2\)/, guards: "a ragged element table shifting stresses between elements" },
    "check-without-lifetime.check.json": { field: "lifetime", message: /missing: write null when slow crack growth is not part of the check/, guards: "a file without its lifetime checked without slow crack growth (PASS where the lifetime gives FAIL)" },
    "check-disk-without-poisson.check.json": { field: "specimen.poisson", message: /expected a number, got nothing \(the field is missing\)$/, guards: "a missing field named \"undefined\"" },
  };
  const files = readdirSync(HOSTILE).filter((f) => f.startsWith("check-"));

  it("covers every check file in the corpus", () => {
    // Read and checked: check-fail-within-last-figure in test/design-verdict-digits.test.ts,
    // check-bound-above-estimate in test/design-bound-above-estimate.test.ts,
    // check-fail-probability-prints-as-allowed in test/design-verdict-digits.test.ts,
    // check-part-sizes-all-zero below (it parses; the check refuses it).
    const accepted = [
      "check-utf8-bom.check.json",
      "check-utf16le-bom.check.json",
      "check-formula-title.check.json",
      "check-fail-within-last-figure.check.json",
      "check-bound-above-estimate.check.json",
      "check-fail-probability-prints-as-allowed.check.json",
      "check-part-sizes-all-zero.check.json",
    ];
    expect(files.sort()).toEqual([...Object.keys(expected), ...accepted].sort());
  });

  for (const [name, want] of Object.entries(expected)) {
    it(`${name}: refused, naming the field (guards against ${want.guards})`, () => {
      const e = refusal(name);
      expect(e.field).toBe(want.field);
      expect(e.message).toMatch(want.message);
      expect(e.message).not.toMatch(/NaN|Infinity|undefined/);
    });
  }

  it("reads UTF-8 with a byte-order mark and UTF-16 with its mark (guards against refusing what spreadsheet tools save)", () => {
    const a = parseCheckFileBytes(bytes("check-utf8-bom.check.json"));
    const b = parseCheckFileBytes(bytes("check-utf16le-bom.check.json"));
    expect(b).toEqual(a);
    expect(runDesignCheck(a).verdict.pass).toBe(runDesignCheck(b).verdict.pass);
  });

  it("keeps a formula-looking title as text (guards against a title that a spreadsheet export would run)", () => {
    const d = parseCheckFileBytes(bytes("check-formula-title.check.json"));
    expect(d.title).toBe('=HYPERLINK("http://example.invalid","click")');
  });
});

describe("a part table whose every element in tension has size 0 (volumes rounded to 0.000 on export)", () => {
  it("is refused naming part.sizes and the likely cause, not run as a part of size 0 (a PASS at any stress)", () => {
    const d = parseCheckFile(readFileSync(join(HOSTILE, "check-part-sizes-all-zero.check.json"), "utf8"));
    expect(d.part.kind).toBe("table");
    expect(() => runDesignCheck(d)).toThrow(/^part\.sizes: every element in tension has size 0.*too few digits/);
  });
});
