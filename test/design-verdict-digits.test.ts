/**
 * A FAIL by less than the last figure shown must still read as a FAIL: the
 * applied stress written above the allowable, never equal to it, and the
 * reserve factor written below 1, never "1", in the verdict sentence, the
 * basis, the result rows (pane, printout, CSV) and `brittle check` text and
 * --json alike.
 *
 * References: the allowable stress of typed parameters without a specimen
 * count is the Weibull quantile s = sigma_theta (-ln S / k)^(1/m) (ASTM C1239
 * sec. 3; docs/methods.md section 1), written out below; what a printed
 * number means is read back with Number() (ECMAScript spec, StringToNumber);
 * the next double above x comes from its IEEE 754 bit pattern.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { main } from "../cli/cli";
import { parseCheckFile } from "../src/design/check-file";
import { resultRows } from "../src/design/check-rows";
import { runDesignCheck } from "../src/design/design-check";
import type { DesignCheckResult } from "../src/design/check-result";
import { formatProbability, formatProbabilityApart, formatReserveFactor } from "../src/design/probability-text";

const FILE = "test/fixtures/hostile/check-fail-within-last-figure.check.json";

/** The next double above x > 0 (IEEE 754: the bit pattern plus one). */
function nextUp(x: number): number {
  const f = new Float64Array([x]);
  new BigInt64Array(f.buffer)[0] += 1n;
  return f[0];
}

/** The numbers the verdict sentence prints: applied, allowable and reserve factor, as Number() reads them. */
function printed(text: string): { applied: number; allowable: number; reserve: number } {
  const m = /applied stress (\S+) MPa (?:exceeds|is at or below) the .*?, (\S+) MPa \(.*reserve factor (\S+), margin/.exec(text);
  if (!m) throw new Error(`verdict sentence not recognised: ${text}`);
  return { applied: Number(m[1]), allowable: Number(m[2]), reserve: Number(m[3]) };
}

function expectFailReadsAsFail(r: DesignCheckResult): void {
  expect(r.verdict.pass).toBe(false);
  const p = printed(r.verdict.text);
  expect(p.applied).toBeGreaterThan(p.allowable);
  expect(p.reserve).toBeLessThan(1);
  const row = (id: string) => resultRows(r).find((x) => x.id === id)!.display;
  expect(Number(row("reserve-factor"))).toBeLessThan(1);
  expect(parseFloat(row("applied"))).toBeGreaterThan(parseFloat(row("highest-passing")));
  const result = r.basis.find((b) => b.topic === "result")!.text;
  expect(Number(/reserve factor (\S+);/.exec(result)![1])).toBeLessThan(1);
  expect(Number(/passes (\S+) MPa/.exec(result)![1])).toBeLessThan(p.applied);
}

describe("a fail within the last printed figure", () => {
  it("the hostile file: applied 159.245 MPa against the closed-form allowable 159.2437 MPa reads as a fail everywhere", async () => {
    // Weibull quantile at S = 0.9999, m = 10, sigma_theta = 400 MPa, k = 1 (ASTM C1239 sec. 3).
    const allowable = 400 * (-Math.log(0.9999)) ** (1 / 10);
    expect(allowable).toBeLessThan(159.245);
    expect(Number(allowable.toPrecision(4))).toBe(Number((159.245).toPrecision(4))); // four figures alone cannot tell them apart
    const r = runDesignCheck(parseCheckFile(readFileSync(FILE, "utf8")));
    expect(r.governing.allowable).toBeCloseTo(allowable, 10);
    expectFailReadsAsFail(r);

    let out = "";
    const code = await main(["check", FILE], { out: (t) => void (out += t), err: () => {} });
    expect(code).toBe(1);
    expect(out).toContain(r.verdict.text);
    expect(Number(/Reserve factor \(allowable \/ applied\): (\S+)/.exec(out)![1])).toBeLessThan(1);

    let json = "";
    await main(["check", FILE, "--json"], { out: (t) => void (json += t), err: () => {} });
    const j = JSON.parse(json);
    expect(j.verdict).toBe("FAIL");
    expect(printed(j.text).reserve).toBeLessThan(1);
    expect(Number(j.results.find((x: { id: string }) => x.id === "reserve-factor").display)).toBeLessThan(1);
  });

  it("an applied stress one double above the allowable reads above it, with a reserve factor below 1", () => {
    const d = parseCheckFile(readFileSync(FILE, "utf8"));
    const allowable = runDesignCheck(d).governing.allowable;
    expectFailReadsAsFail(runDesignCheck({ ...d, appliedStress: nextUp(allowable) }));
    // The same on a lower-bound verdict (typed values with a specimen count).
    const bounded = { ...d, material: { kind: "typed" as const, shape: 10, scale: 400, specimens: 30, unbiased: true } };
    const lower = runDesignCheck(bounded).governing.allowable;
    const r = runDesignCheck({ ...bounded, appliedStress: nextUp(lower) });
    expect(r.verdict.onLowerBound).toBe(true);
    expectFailReadsAsFail(r);
  });

  it("at the allowable exactly the check passes with reserve factor 1 (the tie passes: at or below)", () => {
    const d = parseCheckFile(readFileSync(FILE, "utf8"));
    const allowable = runDesignCheck(d).governing.allowable;
    const r = runDesignCheck({ ...d, appliedStress: allowable });
    expect(r.verdict.pass).toBe(true);
    expect(printed(r.verdict.text).reserve).toBe(1);
    expect(r.verdict.text).toMatch(/margin of safety 0\./);
  });

  it("formatReserveFactor keeps three figures at and above 1 and adds figures only below 1", () => {
    // Number() of the text is the reference (ECMAScript StringToNumber).
    expect(formatReserveFactor(1.77)).toBe("1.77");
    expect(formatReserveFactor(1.0004)).toBe("1");
    expect(formatReserveFactor(0.686)).toBe("0.686");
    expect(formatReserveFactor(0.9996)).toBe("0.9996");
    expect(formatReserveFactor(0.99996)).toBe("0.99996");
    expect(Number(formatReserveFactor(1 - 2 ** -53))).toBe(1 - 2 ** -53);
  });
});

describe("a proof stress a hair below the applied stress", () => {
  it("reads below it in the verdict and in the proof test's line", () => {
    const d = parseCheckFile(readFileSync(FILE, "utf8"));
    // The proof stress one double below 200 MPa, above the inert allowable (159.2 MPa, closed form above): it sets the allowable.
    const proofStress = 200 - 2 ** -45; // 2^-45 is the spacing of doubles in [128, 256) (IEEE 754 binary64)
    expect(nextUp(proofStress)).toBe(200);
    const r = runDesignCheck({ ...d, appliedStress: 200, proof: { proofStress } });
    expectFailReadsAsFail(r);
    expect(Number(/from the proof stress (\S+) MPa/.exec(r.verdict.text)![1])).toBeLessThan(200);
    const m = /^Not credited: the applied stress (\S+) MPa exceeds the proof stress (\S+) MPa/.exec(r.proof!.text)!;
    expect(Number(m[1])).toBeGreaterThan(Number(m[2]));
  });
});

describe("a failure probability in service that two figures print like the allowed one", () => {
  const PF_FILE = "test/fixtures/hostile/check-fail-probability-prints-as-allowed.check.json";
  /** The leading number of a probability display ("1.03e-4 (1 in 9,718)"), as Number() reads it. */
  const shown = (display: string) => {
    const text = display.split(" (")[0].split(",")[0];
    return text.endsWith(" %") ? Number(text.slice(0, -2)) / 100 : Number(text);
  };
  const row = (r: DesignCheckResult, id: string) => resultRows(r).find((x) => x.id === id)!.display;

  it("the hostile file: 159.7 MPa fails, and its failure probability 1.029e-4 reads above the allowed 1.0e-4", async () => {
    // Two-parameter Weibull failure probability P = 1 - exp(-k (s / sigma_theta)^m) (ASTM C1239 sec. 3), k = 1.
    const expected = -Math.expm1(-((159.7 / 400) ** 10));
    expect(expected / 1e-4).toBeGreaterThan(1.02);
    expect(formatProbability(expected)).toBe(formatProbability(1e-4)); // what two figures alone would print: "1.0e-4" twice
    const r = runDesignCheck(parseCheckFile(readFileSync(PF_FILE, "utf8")));
    expect(r.verdict.pass).toBe(false);
    expect(r.failureProbabilityAtApplied.value).toBeCloseTo(expected, 15);
    expect(shown(row(r, "pf-applied"))).toBeGreaterThan(shown(row(r, "target-pf")));
    expect(row(r, "pf-applied")).toMatch(/^1\.03e-4 \(1 in 9,7\d\d\)$/);

    let out = "";
    expect(await main(["check", PF_FILE], { out: (t) => void (out += t), err: () => {} })).toBe(1);
    expect(out).toContain("1.03e-4");
  });

  it("on a lower-bound verdict the upper bound reads on the verdict's side of the allowed probability, or says it equals it", () => {
    const d = parseCheckFile(readFileSync(PF_FILE, "utf8"));
    const bounded = { ...d, material: { kind: "typed" as const, shape: 10, scale: 400, specimens: 30, unbiased: true } };
    const lower = runDesignCheck(bounded).governing.allowable;
    for (const factor of [1.003, 1.0003, 0.997, 0.9997]) {
      const r = runDesignCheck({ ...bounded, appliedStress: lower * factor });
      expect(r.verdict.pass).toBe(factor < 1);
      const upper = shown(row(r, "pf-upper"));
      const allowed = shown(row(r, "target-pf"));
      if (factor > 1) expect(upper).toBeGreaterThan(allowed);
      else expect(upper).toBeLessThan(allowed);
    }
    // One double above the allowable: the two probabilities differ only by the solvers' error, and the row says so.
    const tie = runDesignCheck({ ...bounded, appliedStress: nextUp(lower) });
    expect(tie.verdict.pass).toBe(false);
    expect(row(tie, "pf-upper")).toMatch(/^1\.0e-4 \(1 in 10,000\), equal to the allowed failure probability to within the solvers' accuracy/);
  });

  it("formatProbabilityApart adds figures only where the two would read as one value", () => {
    // Number() of the text is the reference (ECMAScript StringToNumber); "1.0e-3" and "0.1 %" are the same value.
    expect(formatProbabilityApart(1.04e-4, 1e-4)).toBe("1.04e-4");
    expect(formatProbabilityApart(2e-4, 1e-4)).toBe("2.0e-4");
    expect(formatProbabilityApart(1e-4, 1e-4)).toBe("1.0e-4");
    expect(Number(formatProbabilityApart(0.00099999, 0.001))).toBeLessThan(0.001);
    expect(formatProbabilityApart(0.01234, 0.0123)).toBe("1.234 %");
    expect(formatProbabilityApart(1 - 1.04e-9, 1 - 1e-9)).toBe("1 - 1.04e-9");
  });
});
