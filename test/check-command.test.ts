/**
 * `brittle check FILE [--json]` on the invented examples and on bad input:
 * exit 0 PASS, 1 FAIL, 2 when no verdict can be given; the JSON shape; and
 * that it prints what the core's runDesignCheck says for the same file (the
 * reference is the core, run on the parsed file).
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../cli/cli";
import { parseCheckFile } from "../src/design/check-file";
import { resultRows } from "../src/design/check-rows";
import { runDesignCheck } from "../src/design/design-check";
import { input } from "./taskpane-inputs";

async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = "";
  let err = "";
  const code = await main(args, { out: (t) => void (out += t), err: (t) => void (err += t) });
  return { code, out, err };
}

const EXAMPLES = {
  "examples/check-pass.check.json": { code: 0, verdict: "PASS" },
  "examples/check-fail.check.json": { code: 1, verdict: "FAIL" },
  "examples/check-lifetime-proof.check.json": { code: 0, verdict: "PASS" },
};

describe("brittle check on the examples", () => {
  for (const [file, want] of Object.entries(EXAMPLES)) {
    it(`${file}: exit ${want.code}, ${want.verdict}, the core's verdict and basis`, async () => {
      const core = runDesignCheck(parseCheckFile(readFileSync(file, "utf8")));
      const text = await run(["check", file]);
      expect(text.code).toBe(want.code);
      expect(text.err).toBe("");
      expect(text.out).toContain(core.verdict.text);
      expect(text.out.split("\n")[2]).toMatch(new RegExp(`^${want.verdict}: `));
      for (const b of core.basis) expect(text.out).toContain(`  ${b.topic}: ${b.text}`);
      expect(text.out).toMatch(/Note: This result supports, and does not replace, the judgement of a licensed engineer/);

      const json = await run(["check", file, "--json"]);
      expect(json.code).toBe(want.code);
      const o = JSON.parse(json.out);
      expect(o).toMatchObject({ format: "brittle-design-check-result", version: 1, verdict: want.verdict, pass: want.verdict === "PASS", text: core.verdict.text });
      expect(o.reserveFactor).toBe(core.reserveFactor.value);
      expect(o.marginOfSafety).toBe(core.marginOfSafety.value);
      expect(o.highestPassingStress).toBe(core.highestPassingStress.value);
      expect(o.confidence.boundLabel).toBe("95 % one-sided lower bound");
      expect(o.results.map((r: { id: string }) => r.id)).toEqual(resultRows(core).map((r) => r.id));
      expect(o.basis).toEqual(core.basis);
      expect(o.input.title).toMatch(/^INVENTED EXAMPLE/);
      expect(json.out).not.toMatch(/NaN|Infinity/);
    });
  }

  it("the lifetime example credits its proof test and shows both the bound and the point estimate", async () => {
    const o = JSON.parse((await run(["check", "examples/check-lifetime-proof.check.json", "--json"])).out);
    expect(o.governing.check).toBe("lifetime");
    expect(o.proof.credited).toBe(true);
    expect(o.results.find((r: { id: string }) => r.id === "lifetime-allowable-point")).toBeDefined();
  });
});

describe("brittle check on bad input: exit 2, never 0 or 1", () => {
  it("names the field of a bad file, in text and in JSON", async () => {
    const file = "test/fixtures/hostile/check-survival-as-failure-probability.check.json";
    const text = await run(["check", file]);
    expect(text.code).toBe(2);
    expect(text.out).toBe("");
    expect(text.err).toMatch(/requirement\.survival: .*failure probability may have been typed/);
    const json = await run(["check", file, "--json"]);
    expect(json.code).toBe(2);
    expect(JSON.parse(json.out).error).toMatchObject({ field: "requirement.survival" });
  });

  it("refuses a missing file, a missing argument and an unknown option", async () => {
    expect((await run(["check", "test/fixtures/hostile/no-such.check.json"])).code).toBe(2);
    const none = await run(["check"]);
    expect(none.code).toBe(2);
    expect(none.err).toMatch(/usage: brittle check FILE\.check\.json \[--json\]/);
    expect((await run(["check", "examples/check-pass.check.json", "--jsn"])).code).toBe(2);
  });

  it("is listed in --help", async () => {
    expect((await run(["--help"])).out).toMatch(/brittle check FILE\.check\.json \[--json\]/);
  });
});

describe("the command's exit status in a real process", () => {
  it("sets the process exit code: 1 for the failing example, with the verdict printed", () => {
    // The TypeScript entry through tsx (the compiled lib/ is exercised by test/package-install.test.ts).
    const script = "const m = await import('./cli/cli.ts'); process.exitCode = await m.main(['check', 'examples/check-fail.check.json']);";
    let status = 0;
    let stdout = "";
    try {
      stdout = execFileSync(process.execPath, ["--import", "tsx", "--input-type=module", "-e", script], { stdio: "pipe", encoding: "utf8" });
    } catch (error) {
      status = (error as { status: number }).status;
      stdout = String((error as { stdout: string }).stdout);
    }
    expect(status).toBe(1);
    expect(stdout).toMatch(/^Design check: INVENTED EXAMPLE/);
    expect(stdout).toMatch(/\nFAIL: the applied stress 100 MPa exceeds/);
  }, 60_000);
});

describe("exit status of a verdict on the point estimate alone", () => {
  // Datasheet values without the number of specimens give no confidence bound. The inert allowable
  // point estimate, closed form (ASTM C1239, two-parameter Weibull; k = 1): 400 (-ln 0.9999)^(1/10)
  // = 159.24 MPa, so 100 MPa passes and 200 MPa fails.
  const description = (appliedStress: number, specimens?: number) => ({
    format: "brittle-design-check",
    version: 1,
    title: "INVENTED EXAMPLE (made-up values, not for design)",
    ...input({
      material: { kind: "typed", shape: 10, scale: 400, ...(specimens ? { specimens } : {}) },
      specimen: { kind: "typed", effectiveSize: 10 },
      part: { kind: "typed", effectiveSize: 10 },
      appliedStress,
    }),
  });
  const allowable = 400 * (-Math.log(0.9999)) ** (1 / 10);
  const runOn = async (d: object) => {
    const dir = mkdtempSync(join(tmpdir(), "brittle-check-"));
    const file = join(dir, "typed.check.json");
    writeFileSync(file, JSON.stringify(d));
    try {
      return { text: await run(["check", file]), json: await run(["check", file, "--json"]) };
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  };

  it("a PASS on the point estimate exits 3, not 0, and says it is provisional", async () => {
    expect(100).toBeLessThan(allowable);
    const { text, json } = await runOn(description(100));
    expect(text.code).toBe(3);
    expect(json.code).toBe(3);
    expect(text.out).toMatch(/PASS: .*point estimate: no confidence bound, not a design verdict on its own/);
    expect(JSON.parse(json.out)).toMatchObject({ verdict: "PASS", onLowerBound: false });
  });
  it("a FAIL on the point estimate exits 1 (a bound could only be lower)", async () => {
    expect(200).toBeGreaterThan(allowable);
    const { text } = await runOn(description(200));
    expect(text.code).toBe(1);
  });
  it("with the number of specimens the same PASS rests on the bound and exits 0", async () => {
    const { json } = await runOn(description(100, 30));
    expect(JSON.parse(json.out)).toMatchObject({ verdict: "PASS", onLowerBound: true });
    expect(json.code).toBe(0);
  });
  it("is listed in --help", async () => {
    expect((await run(["--help"])).out).toMatch(/3 PASS on the point estimate alone/);
  });
});
