/**
 * The verdict sentence states its basis in every outcome, so it can be
 * quoted alone in a design review: which estimate or bound and at what
 * confidence, the survival target, and the size scaling; and the cautions
 * (deferring to local codes and licensed engineers) go with it in every
 * output form: `brittle check` text and --json, the printed report and the
 * report sheet.
 *
 * References: the expected words are the inputs written out by arithmetic
 * (survival 0.9999 is 99.99 %; part 850 mm^3 over specimen 10 mm^3 is a
 * size ratio of 85; 1 failure in a lot of 10,000 is 1e-4 per part). All
 * values are invented.
 */
import { describe, expect, it } from "vitest";
import { checkJson, checkText } from "../cli/check-command";
import type { CheckDescription } from "../src/design/check-description";
import { runDesignCheck } from "../src/design/design-check";
import { adapters } from "../functions/registry";
import { reportContent } from "../taskpane/export/report-content";
import { planReportSheet } from "../taskpane/report/sheet-plan";
import { input } from "./taskpane-inputs";

const STRENGTHS = [445.3, 369.7, 282.1, 390.3, 419.1, 362.8, 365.5, 388.8, 360.5, 407.7, 420.1, 404.1, 412.8, 336, 358.1];

function check(over: Partial<CheckDescription>): CheckDescription {
  return {
    format: "brittle-design-check",
    version: 1,
    title: "INVENTED EXAMPLE (made-up data, not for design)",
    ...input({
      material: { kind: "data", strengths: STRENGTHS, method: "MLE" },
      confidence: { level: 0.95, sides: "one-sided" },
      specimen: { kind: "typed", effectiveSize: 10 },
      part: { kind: "typed", effectiveSize: 850 },
      appliedStress: 60,
      lotSize: 10000,
      ...over,
    }),
  } as CheckDescription;
}

const OUTCOMES: [string, CheckDescription, RegExp][] = [
  ["PASS on the lower bound", check({}), /^PASS: .*\(95 % one-sided lower bound; point estimate \S+ MPa shown beside, not used; /],
  ["FAIL on the lower bound", check({ appliedStress: 200 }), /^FAIL: .*\(95 % one-sided lower bound; point estimate \S+ MPa shown beside, not used; /],
  ["two-sided 90 % asked: the 95 % one-sided bound", check({ confidence: { level: 0.9, sides: "two-sided" } }), /^PASS: .*\(95 % one-sided lower bound; /],
  ["PASS on the point estimate (no bound)", check({ material: { kind: "typed", shape: 10, scale: 400 } }), /^PASS: .*\(point estimate: no confidence bound, not a design verdict on its own; /],
  ["FAIL on the point estimate (no bound)", check({ material: { kind: "typed", shape: 10, scale: 400 }, appliedStress: 300 }), /^FAIL: .*\(point estimate: no confidence bound, not a design verdict on its own; /],
  ["PASS from a credited proof test", check({ appliedStress: 250, proof: { proofStress: 300 } }), /^PASS: .*\(from the proof stress 300 MPa, credited above the 95 % one-sided lower bound; /],
  [
    "FAIL over a lifetime",
    check({ lifetime: { lifetime: 10, timeUnit: "years", n: 20, B: 1e9, bUnit: "MPa^2 s" }, appliedStress: 150 }),
    /^FAIL: .*slow crack growth.*\(95 % one-sided lower bound; /,
  ],
];

describe("the verdict sentence names its basis in every outcome", () => {
  for (const [name, description, basis] of OUTCOMES) {
    it(name, () => {
      const r = runDesignCheck(description);
      expect(r.verdict.text).toMatch(basis);
      expect(r.verdict.text).toContain("required survival 99.99 % per part"); // 0.9999 x 100
      expect(r.verdict.text).toContain("part / specimen effective volume 85)"); // 850 / 10
      // The cautions travel with it: text, --json and the printed report.
      expect(checkText(r)).toMatch(/Note: This result supports, and does not replace, the judgement of a licensed engineer under the local codes/);
      const json = checkJson(r) as { text: string; cautions: { id: string }[] };
      expect(json.text).toBe(r.verdict.text);
      expect(json.cautions.map((c) => c.id)).toContain("codes");
      const printed = reportContent(r, new Date(0));
      expect(printed.verdict.text).toBe(r.verdict.text);
      expect(printed.cautions.some((c) => /licensed engineer/.test(c.text))).toBe(true);
      const sheet = planReportSheet(r, { functions: new Set(Object.keys(adapters)), cautions: r.cautions, written: new Date(0) });
      const cells = sheet.blocks.flatMap((block) => block.cells.flat()).filter((c): c is string => typeof c === "string");
      expect(cells.some((c) => /licensed engineer/.test(c))).toBe(true);
      expect(cells).toContain(r.basis.find((b) => b.topic === "result")!.text);
    });
  }

  it("a lot requirement and surface flaws: the allowed failure probability per part and the area ratio", () => {
    const r = runDesignCheck(
      check({ requirement: { kind: "lot", allowedFailures: 1 }, flaws: "surface", sizeUnit: "mm^2", specimen: { kind: "typed", effectiveSize: 4 }, part: { kind: "typed", effectiveSize: 1000 } }),
    );
    expect(r.verdict.text).toContain("allowed failure probability 1.0e-4 per part, for 1 expected failure(s) in a lot of 10000"); // 1 / 10000
    expect(r.verdict.text).toContain("part / specimen effective area 250)"); // 1000 / 4
  });
});

describe("the size-scaling caution writes the factor readably at any size", () => {
  // Factors by arithmetic: 12,500 / 10 = 1,250; 1e10 / 10 = 1e9; 1e301 / 10 = 1e300; 10 / 1e-5 = 1e6.
  const factor = (partSize: number) => {
    const r = runDesignCheck(check({ part: { kind: "typed", effectiveSize: partSize }, appliedStress: 1 }));
    const text = r.cautions.map((c) => c.text).join(" ");
    return /by a factor of ([^:]+):/.exec(text)?.[1];
  };
  it("with digit groups below a million, a power of ten above (never a 300-digit number)", () => {
    expect(factor(12500)).toBe("1,250");
    expect(factor(1e10)).toBe("1.00e9");
    expect(factor(1e301)).toBe("1.00e300");
    expect(factor(1e-5)).toBe("1.00e6");
  });
});

describe("a proof stress below the applied stress", () => {
  it("is not called credited in the verdict sentence, as the proof line says it is not credited", () => {
    // Invented values: the proof stress 150 MPa lies above the lower-bound allowable at this size (the
    // basis says the inert allowable is raised to it) but below the applied stress 200 MPa.
    const r = runDesignCheck(check({ appliedStress: 200, proof: { proofStress: 150 } }));
    expect(r.verdict.pass).toBe(false);
    expect(r.proof?.text).toMatch(/^Not credited: the applied stress 200 MPa exceeds the proof stress 150 MPa/);
    expect(r.verdict.text).toMatch(/^FAIL: .*\(from the proof stress 150 MPa, which the applied stress exceeds; it lies above the 95 % one-sided lower bound; /);
    expect(r.verdict.text).not.toMatch(/credited/);
  });
});
