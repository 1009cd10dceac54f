/**
 * What the printed report and the report sheet say beyond the result rows:
 * the identification block with its fields left to fill, the specimen table
 * (every specimen once, weakest first, censored marked), the method
 * references that apply to this check and only those, and the file name a
 * saved check gets. References: the standards named in each line are the
 * ones the methods come from (ASTM C1239 fitting and bounds, C1683 size
 * scaling, C1161 flexure configurations, C1322 fractography; Evans &
 * Wiederhorn 1974 for proof testing), from memory of their scopes; the
 * counts are read off the invented input below.
 */
import { describe, expect, it } from "vitest";
import { runDesignCheck } from "../src/design/design-check";
import { checkFileName } from "../taskpane/export/check-file-ui";
import { methodReferences, reportContent } from "../taskpane/export/report-content";
import { input, STRENGTHS } from "./taskpane-inputs";

const PRINTED = new Date("2026-03-04T05:06:00Z");

describe("the printed report's content", () => {
  it("leaves the reviewer's fields empty, dates the print, and lists every specimen weakest first", () => {
    const censored = STRENGTHS.map((_, i) => i === 4 || i === 9);
    const result = runDesignCheck(input({ material: { kind: "data", strengths: STRENGTHS, censored, method: "MLE-RAW" }, title: "Bracket B-12 (invented)" }));
    const c = reportContent(result, PRINTED);
    const field = (label: string) => c.identification.find((f) => f.label === label)?.value;
    expect(field("Check")).toBe("Bracket B-12 (invented)");
    for (const label of ["Part and drawing", "Material and supplier", "Lot or batch", "Revision", "Author", "Checker"]) expect(field(label)).toBe("");
    expect(field("Date printed")).toBe("2026-03-04");
    // 15 invented strengths, two flagged (377.9 and 389.6, the two weakest): sorted ascending, ranks 1..15.
    expect(c.specimens.map((s) => s.strength)).toEqual([...STRENGTHS].sort((a, b) => a - b));
    expect(c.specimens.map((s) => s.rank)).toEqual(STRENGTHS.map((_, i) => i + 1));
    expect(c.specimens.filter((s) => s.censored).map((s) => s.strength)).toEqual([377.9, 389.6]);
    expect(c.specimensMissing).toBeNull();
    expect(c.verdict.text).toBe(result.verdict.text);
    expect(c.basis).toEqual(result.basis.map((b) => ({ topic: b.topic, text: b.text })));
    expect(c.cautions.some((x) => /licensed engineer/.test(x.text))).toBe(true);
    expect(c.signatures).toHaveLength(3);
  });

  it("names the methods this check used, and only those", () => {
    const plain = methodReferences(runDesignCheck(input()));
    expect(plain.some((m) => /maximum likelihood.*ASTM C1239/.test(m))).toBe(true);
    expect(plain.some((m) => /ASTM C1683/.test(m))).toBe(true);
    expect(plain.some((m) => /ASTM C1322/.test(m))).toBe(true);
    // The bound line carries the sidedness and the pairing with the band.
    expect(plain.some((m) => /90 % one-sided lower bound/.test(m) && /80 % two-sided/.test(m))).toBe(true);
    expect(plain.some((m) => /Evans & Wiederhorn/.test(m))).toBe(false);
    expect(plain.some((m) => /C1161/.test(m))).toBe(false);

    const withProof = methodReferences(
      runDesignCheck(input({ specimen: { kind: "preset", configuration: "C1161-B-4PT" }, sizeUnit: "mm^3", proof: { proofStress: 250 } })),
    );
    expect(withProof.some((m) => /Evans & Wiederhorn 1974/.test(m))).toBe(true);
    expect(withProof.some((m) => /ASTM C1161/.test(m))).toBe(true);
  });

  it("says there is no specimen table for datasheet values", () => {
    const c = reportContent(runDesignCheck(input({ material: { kind: "typed", shape: 10, scale: 400, specimens: 30 } })), PRINTED);
    expect(c.specimens).toEqual([]);
    expect(c.specimensMissing).toMatch(/m 10, characteristic strength 400 MPa, 30 specimens/);
  });
});

describe("the saved check's file name", () => {
  it("comes from the title, in plain lower-case words, and defaults to design", () => {
    expect(checkFileName("Bracket B-12 (invented)")).toBe("bracket-b-12-invented.check.json");
    // Letters without an ASCII form (Ø) are dropped rather than guessed; separators become one hyphen (common practice for file names).
    expect(checkFileName("  Ø40 disk / lot 7 ")).toBe("40-disk-lot-7.check.json");
    expect(checkFileName("../../etc/passwd")).toBe("etcpasswd.check.json");
    expect(checkFileName(undefined)).toBe("design.check.json");
    expect(checkFileName("***")).toBe("design.check.json");
  });
});
