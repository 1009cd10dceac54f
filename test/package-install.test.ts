/**
 * The installed command line: `npm pack` (which compiles cli/ into lib/), then
 * `npm install --omit=dev` of the tarball into an empty folder, as a user with
 * no development tools would, and every `brittle` command run from there. The
 * reference for each output is the same command run from source in this
 * process (the source is checked against outside references in the other
 * suites); what this file guards is that the compiled, installed program gives
 * the same answers without the metadata generator, the TypeScript compiler or
 * tsx (the failure was "Cannot find package 'custom-functions-metadata'").
 *
 * Needs the npm registry or a warm npm cache for exceljs and hyperformula.
 * Slow (a pack and an install): not in `npm run test:fast`.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { execFile } from "node:child_process";
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { availableParallelism, tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { promisify } from "node:util";
import { main } from "../cli/cli";
import { runPartCommand } from "../cli/part-command";
import { runCheckCommand } from "../cli/check-command";

const run = promisify(execFile);
const ROOT = resolve(import.meta.dirname, "..");
const SETUP_TIMEOUT = 900_000; // a pack and an install from the registry on a busy two-core machine
const NPM = process.platform === "win32" ? "npm.cmd" : "npm";

let work = "";
let installed = "";
let bin = "";

interface Outcome {
  code: number;
  stdout: string;
  stderr: string;
}

/** Runs the installed `brittle` with the folder of the install as working directory. */
async function brittle(...args: string[]): Promise<Outcome> {
  return brittleWith({}, ...args);
}

/** The same, with variables added to the environment. */
async function brittleWith(env: Record<string, string>, ...args: string[]): Promise<Outcome> {
  try {
    const { stdout, stderr } = await run(process.execPath, [bin, ...args], { cwd: installed, maxBuffer: 64 << 20, env: { ...process.env, ...env } });
    return { code: 0, stdout, stderr };
  } catch (error) {
    const e = error as { code?: number; stdout?: string; stderr?: string };
    return { code: typeof e.code === "number" ? e.code : -1, stdout: e.stdout ?? "", stderr: e.stderr ?? String(error) };
  }
}

/** The same command run from source in this process. */
async function fromSource(args: string[], entry: (args: string[], io: { out: (t: string) => void; err: (t: string) => void }) => Promise<number>) {
  let stdout = "";
  let stderr = "";
  const code = await entry(args, { out: (t) => (stdout += t), err: (t) => (stderr += t) });
  return { code, stdout, stderr };
}

/** Every command the dispatcher in cli/cli.ts accepts, read from its source so a new command cannot be missed. */
function dispatchedCommands(): string[] {
  const source = readFileSync(join(ROOT, "cli/cli.ts"), "utf8");
  const names = [...source.matchAll(/command === "([a-z]+)"/g)].map((m) => m[1]).filter((n) => n !== "help");
  return [...new Set(names)].sort();
}

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), "brittle-pack-"));
  installed = work;
  await run(NPM, ["pack", "--pack-destination", work, "--silent"], { cwd: ROOT, maxBuffer: 16 << 20 });
  const tarball = readdirSync(work).find((f) => f.endsWith(".tgz"));
  if (!tarball) throw new Error(`npm pack wrote no tarball into ${work}`);
  writeFileSync(join(work, "package.json"), JSON.stringify({ name: "install-check", version: "1.0.0", private: true }));
  await run(NPM, ["install", "--omit=dev", "--no-audit", "--no-fund", "--prefer-offline", join(work, tarball)], { cwd: work, maxBuffer: 16 << 20 });
  bin = join(work, "node_modules/brittle-design/bin/brittle.js");
}, SETUP_TIMEOUT);

afterAll(() => {
  if (work) rmSync(work, { recursive: true, force: true });
});

const TEST_TIMEOUT = 300_000; // each command starts a process; the source side compiles the metadata in process

describe("the packed package, installed with production dependencies only", { timeout: TEST_TIMEOUT }, () => {
  it("holds the compiled command line and its function catalogue, and no development tools", () => {
    const pkg = join(installed, "node_modules/brittle-design");
    expect(existsSync(join(pkg, "lib/brittle.mjs"))).toBe(true);
    const catalogue = JSON.parse(readFileSync(join(pkg, "lib/functions.json"), "utf8")) as { functions: { id: string }[] };
    expect(catalogue.functions.length).toBeGreaterThan(40);
    for (const dev of ["custom-functions-metadata", "typescript", "tsx", "vitest", "esbuild"]) {
      expect(existsSync(join(installed, "node_modules", dev)), `${dev} must not be installed`).toBe(false);
    }
    expect(existsSync(join(pkg, "src")), "sources are not shipped").toBe(false);
  });

  it("brittle --help lists every command the dispatcher accepts", async () => {
    const help = await brittle("--help");
    expect(help.code).toBe(0);
    const commands = dispatchedCommands();
    expect(commands).toEqual(expect.arrayContaining(["calc", "check", "demo", "part"]));
    for (const name of commands) expect(help.stdout, `--help names ${name}`).toMatch(new RegExp(`brittle ${name}\\b`));
    // Every command is exercised below; a new command fails here until it is.
    expect(commands).toEqual(["calc", "check", "demo", "part"]);
  });

  it("calc on a .csv gives the grid the source gives", async () => {
    const input = join(ROOT, "examples/quick-check.csv");
    const got = await brittle("calc", input, "--json");
    const want = await fromSource(["calc", input, "--json"], main);
    expect(got.stderr).toBe(want.stderr); // the reader's note on what it detected, the same from both
    expect(got.code).toBe(0);
    expect(want.code).toBe(0);
    expect(JSON.parse(got.stdout)).toEqual(JSON.parse(want.stdout));
  });

  it("calc on an .xlsx (exceljs loaded on demand) gives the grid the source gives, and --out writes a workbook", async () => {
    const input = join(ROOT, "examples/supplier-datasheet.xlsx");
    const got = await brittle("calc", input, "--json", "--out", join(installed, "filled.xlsx"));
    const want = await fromSource(["calc", input, "--json"], main);
    expect(got.code).toBe(0);
    expect(JSON.parse(got.stdout)).toEqual(JSON.parse(want.stdout));
    expect(existsSync(join(installed, "filled.xlsx"))).toBe(true);
  });

  it("part on an element table gives the report the source gives", async () => {
    // A small element table (stresses and volumes) made up for this comparison: both sides read the same file.
    const table = join(installed, "elements.csv");
    writeFileSync(table, "id,stress,volume\n1,300,0.5\n2,250,1.0\n3,120,4.0\n4,-20,2.0\n");
    const args = [table, "--modulus", "10", "--scale", "500", "--json"];
    const got = await brittle("part", ...args);
    const want = await fromSource(args, runPartCommand);
    expect(got.code).toBe(0);
    expect(want.code).toBe(0);
    expect(JSON.parse(got.stdout)).toEqual(JSON.parse(want.stdout));
  });

  it("part on a table of 32 MiB or more reads it on two threads, with the one-thread result and the one-thread error message", async () => {
    // An invented element table (seeded), about 40 MB of full-precision doubles: above PARALLEL_MIN_BYTES
    // (cli/part-parallel.ts), so it is cut into pieces that the main thread and a worker share.
    let seed = 20261202;
    const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const lines = ["# invented element table", "elem,s1,s2,s3,vol"];
    for (let r = 1; r <= 420_000; r++) {
      const load = 400 * rnd() ** 3;
      lines.push(`${r},${load},${load * (rnd() - 0.3)},${-load * rnd()},${rnd()}`);
      if (r === 300_000) lines.push("# a comment deep in the file", "");
    }
    const table = join(installed, "big-elements.csv");
    writeFileSync(table, lines.join("\n") + "\n");
    const args = ["part", table, "--modulus", "10", "--scale", "700", "--top", "5", "--json", "--quiet"];
    const two = await brittle(...args);
    const one = await brittleWith({ BRITTLE_THREADS: "1" }, ...args);
    expect(two.code, two.stderr).toBe(0);
    expect(one.code, one.stderr).toBe(0);
    const a = JSON.parse(two.stdout);
    const b = JSON.parse(one.stdout);
    expect(b.threads).toBe(1);
    expect(a.threads).toBe(availableParallelism() >= 2 ? 2 : 1);
    expect(a.rows).toBe(420_000);
    expect(a.skipped).toEqual(b.skipped); // header, comment and blank line, at their file line numbers
    expect([a.rows, a.peak, a.peakLine, a.peakId]).toEqual([b.rows, b.peak, b.peakLine, b.peakId]);
    // The pieces are summed in another order: equal to rounding, not bit for bit.
    expect(Math.abs(a.effectiveSize - b.effectiveSize) / b.effectiveSize).toBeLessThan(1e-14);
    expect(Math.abs(a.failureProbability - b.failureProbability) / b.failureProbability).toBeLessThan(1e-13);
    expect(a.hotSpots.map((h: { id: string; line: number }) => [h.id, h.line])).toEqual(b.hotSpots.map((h: { id: string; line: number }) => [h.id, h.line]));

    // A bad field near the end: the piece that meets it gives up, the file is read again in one pass,
    // and the message (with its line number) is the one-pass message.
    const badLine = 410_000;
    lines[badLine] = lines[badLine].replace(/,([^,]*)$/, ",0.5x");
    writeFileSync(table, lines.join("\n") + "\n");
    const twoBad = await brittle(...args);
    const oneBad = await brittleWith({ BRITTLE_THREADS: "1" }, ...args);
    expect(oneBad.code).toBe(1);
    expect(oneBad.stderr).toMatch(new RegExp(`line ${badLine + 1}\\b`));
    expect(twoBad.code).toBe(1);
    expect(twoBad.stderr).toBe(oneBad.stderr);
  });

  it("check reruns saved design checks (PASS exits 0, FAIL exits 1) with the verdict the source gives", async () => {
    for (const [name, code] of [["check-pass", 0], ["check-fail", 1], ["check-lifetime-proof", null]] as const) {
      const file = join(ROOT, `examples/${name}.check.json`);
      const got = await brittle("check", file, "--json");
      const want = await fromSource([file, "--json"], runCheckCommand);
      if (code !== null) expect(got.code, name).toBe(code);
      expect(got.code, name).toBe(want.code);
      expect(JSON.parse(got.stdout), name).toEqual(JSON.parse(want.stdout));
    }
  });

  it("demo evaluates the shipped datasheet with no errors and writes under the working folder", async () => {
    const got = await brittle("demo");
    expect(got.code).toBe(0);
    expect(got.stdout).toMatch(/14 formulas evaluated, 0 errors/);
    expect(existsSync(join(installed, "examples/out/supplier-datasheet.filled.xlsx"))).toBe(true);
  });

  it("a bad command exits 2 with the usage, and a missing file exits 1 naming it", async () => {
    const bad = await brittle("frobnicate");
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/unknown command frobnicate/);
    const missing = await brittle("calc", join(installed, "nope.csv"));
    expect(missing.code).toBe(1);
    expect(missing.stderr).toMatch(/nope\.csv/);
  });
});
