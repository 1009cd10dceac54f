/**
 * The simulating cell functions on real worker threads, in a headless Chromium (as in the shared
 * runtime, a browser page): the page runs them through functions/cancelable.ts with the worker script
 * the add-in build writes (simulation-worker.js), and the values must equal the synchronous guarded
 * adapters in the same page, and within 1e-12 relative of the same adapters in Node (which the other suites
 * check against mpmath, scipy and the standards). Not exactly Node's: the browser's V8 rounds Math.log and
 * Math.exp differently in the last bit (seen: 14.985507187343634 in Chromium, 14.98550718734364 in Node 20).
 * A page whose worker file is missing (not deployed) must fall back to slices with the same values. And the
 * real task pane page, built by vite with its Content-Security-Policy, registers them with a stand-in for the
 * host's CustomFunctions and runs them on the worker.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createServer, type Server } from "node:http";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { extname, join, normalize, resolve } from "node:path";
import type { AddressInfo } from "node:net";
import { build } from "esbuild";
import { build as viteBuild } from "vite";
import { OFFICE_JS_CDN } from "../scripts/deploy";
import { chromium, type Browser } from "playwright-core";
import { guarded } from "../functions/registry";
import { CHROMIUM_ARGS, findChromium } from "./browser-launch";
import { fixture } from "./helpers";

const ROOT = resolve(import.meta.dirname, "..");
const found = await findChromium();
const fits = fixture("weibull_fits.json").datasets;
const sample = (id: string) => fits.find((d: any) => d.id === id);
const column = (xs: readonly unknown[]) => xs.map((x) => [x]);
const complete = (n: number, k: number) => column(fits.filter((d: any) => d.kind === "complete" && d.strengths.length === n)[k].strengths);

// The page's side: the host's own runner, exposed to the test.
const PAGE_ENTRY = `
import { hostEnvironment, runCancelable } from "./functions/cancelable";
import { CANCELED } from "./functions/sliced-run";
import { guarded } from "./functions/registry";
window.syncCell = (name, args) => guarded[name](...args);
const shown = (r) => (r === CANCELED ? "canceled" : r);
window.cell = async (name, args) => shown(await runCancelable(name, args, {}, hostEnvironment()));
window.cellCanceledAtOnce = async (name, args) => {
  const invocation = {};
  const pending = runCancelable(name, args, invocation, hostEnvironment());
  invocation.onCanceled();
  return shown(await pending);
};
window.threadsAvailable = () => (hostEnvironment().threads ? hostEnvironment().threads.available : null);
`;

const TYPES: Record<string, string> = { ".html": "text/html; charset=utf-8", ".js": "text/javascript", ".css": "text/css", ".png": "image/png" };
let outDir = "";
let server: Server;
let baseUrl = "";
let browser: Browser;
const requested: string[] = [];

beforeAll(async () => {
  if (!found.executablePath) return;
  outDir = await mkdtemp(join(tmpdir(), "brittle-worker-"));
  await build({ absWorkingDir: ROOT, entryPoints: ["functions/simulation-worker.ts"], bundle: true, format: "iife", target: "es2020", outfile: join(outDir, "simulation-worker.js"), logLevel: "warning" });
  await build({ absWorkingDir: ROOT, stdin: { contents: PAGE_ENTRY, resolveDir: ROOT, loader: "ts" }, bundle: true, format: "iife", target: "es2020", outfile: join(outDir, "page.js"), logLevel: "warning" });
  await writeFile(join(outDir, "index.html"), `<!doctype html><meta charset="utf-8"><script src="page.js"></script>`);
  // The task pane as the add-in build makes it (vite), with the worker beside it.
  const pane = join(outDir, "pane");
  await viteBuild({ configFile: join(ROOT, "vite.config.ts"), logLevel: "silent", build: { outDir: pane, emptyOutDir: true } });
  await build({ absWorkingDir: ROOT, entryPoints: ["functions/simulation-worker.ts"], bundle: true, format: "iife", target: "es2020", outfile: join(pane, "simulation-worker.js"), logLevel: "warning" });
  server = createServer(async (req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? "/", "http://127.0.0.1").pathname);
    requested.push(path);
    // /with-worker/ and /pane/ serve everything; /without-worker/ serves the page but not the worker file.
    const [, area, rest] = /^\/(with-worker|without-worker|pane)\/(.+)$/.exec(path) ?? [];
    const file = area ? normalize(join(outDir, area === "pane" ? "pane" : "", rest)) : "";
    if (!area || !file.startsWith(outDir) || (area === "without-worker" && rest === "simulation-worker.js")) {
      res.writeHead(404).end("not found");
      return;
    }
    try {
      const body = await readFile(file);
      res.writeHead(200, { "content-type": TYPES[extname(file)] ?? "application/octet-stream" }).end(body);
    } catch {
      res.writeHead(404).end("not found");
    }
  });
  await new Promise<void>((done) => server.listen(0, "127.0.0.1", done));
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  browser = await chromium.launch({ executablePath: found.executablePath, headless: true, args: CHROMIUM_ARGS });
}, 180_000);

afterAll(async () => {
  await browser?.close();
  await new Promise<void>((done) => (server ? server.close(() => done()) : done()));
  if (outDir) await rm(outDir, { recursive: true, force: true });
});

/** Equal cell by cell, numbers within `tolerance` relative. */
function expectClose(actual: unknown, expected: unknown, tolerance: number, what: string): void {
  if (typeof expected === "number" && typeof actual === "number") {
    expect(Math.abs(actual - expected), what).toBeLessThanOrEqual(tolerance * Math.abs(expected));
  } else if (Array.isArray(expected) && Array.isArray(actual)) {
    expect(actual.length, what).toBe(expected.length);
    expected.forEach((e, k) => expectClose(actual[k], e, tolerance, `${what}[${k}]`));
  } else {
    expect(actual, what).toEqual(expected);
  }
}

async function checkCases(page: import("playwright-core").Page): Promise<void> {
  for (const [name, args] of CASES) {
    const value = await page.evaluate(([n, a]) => (window as any).cell(n, a), [name, args] as const);
    expect(value, name).toEqual(await page.evaluate(([n, a]) => (window as any).syncCell(n, a), [name, args] as const));
    expectClose(value, guarded[name](...args), 1e-12, name);
  }
}

const CASES: [string, unknown[]][] = [
  ["MODULUS", [column(sample("censored-n20").strengths), column(sample("censored-n20").censored), null]],
  ["FIT", [complete(30, 1), null, null, null]],
  ["LOTCHECK", [complete(10, 4), complete(30, 4), null]],
];

describe.skipIf(!found.executablePath)(`simulating functions in a browser page${found.executablePath ? "" : " (skipped: no Chromium)"}`, () => {
  it("run on the worker thread, with the synchronous adapters' values; a canceled one gives none", async () => {
    const page = await browser.newPage();
    const problems: string[] = [];
    page.on("pageerror", (e) => problems.push(String(e)));
    await page.goto(`${baseUrl}/with-worker/index.html`);
    await checkCases(page);
    expect(requested).toContain("/with-worker/simulation-worker.js");
    expect(await page.evaluate(() => (window as any).threadsAvailable())).toBe(true);
    const big = complete(1000, 0);
    expect(await page.evaluate((a) => (window as any).cellCanceledAtOnce("LOTCHECK", a), [big.slice(0, 500), big.slice(500), null])).toBe("canceled");
    // The terminated thread is replaced: the next invocation still gets its value.
    expectClose(await page.evaluate(([n, a]) => (window as any).cell(n, a), CASES[0]), guarded.MODULUS(...CASES[0][1]), 1e-12, "MODULUS after a cancel");
    expect(problems).toEqual([]);
    await page.close();
  }, 300_000);

  it("fall back to slices, with the same values, when the worker file is not deployed", async () => {
    const page = await browser.newPage();
    await page.goto(`${baseUrl}/without-worker/index.html`);
    await checkCases(page);
    expect(requested).toContain("/without-worker/simulation-worker.js");
    expect(await page.evaluate(() => (window as any).threadsAvailable())).toBe(false);
    await page.close();
  }, 300_000);

  it("the task pane page registers them as cancelable promises that run on the worker, under its security policy", async () => {
    const page = await browser.newPage();
    const problems: string[] = [];
    page.on("pageerror", (e) => problems.push(String(e)));
    await page.route(`${new URL(OFFICE_JS_CDN).origin}/**`, (route) => route.abort()); // never the internet
    // A stand-in for the host's CustomFunctions, there before the page's scripts run.
    await page.addInitScript(() => {
      const associated = new Map();
      class HostError {
        constructor(
          public code: string,
          public message?: string,
        ) {}
      }
      (window as any).CustomFunctions = {
        associate: (id: string, fn: unknown) => associated.set(id, fn),
        Error: HostError,
        ErrorCode: { invalidValue: "#VALUE!", invalidNumber: "#NUM!", notAvailable: "#N/A" },
      };
      (window as any).hostCall = async (id: string, args: unknown[]) => {
        const value = await associated.get(id)(...args, {});
        return value instanceof HostError ? { code: value.code, message: value.message } : value;
      };
    });
    const before = requested.length;
    await page.goto(`${baseUrl}/pane/taskpane.html`);
    await page.waitForFunction(() => typeof (window as any).hostCall === "function");
    const [name, args] = CASES[1];
    expectClose(await page.evaluate(([n, a]) => (window as any).hostCall(n, a), [name, args] as const), guarded[name](...args), 1e-12, name);
    expect(requested.slice(before)).toContain("/pane/simulation-worker.js");
    const bad = await page.evaluate(() => (window as any).hostCall("MODULUS", [[[300], ["oops"], [320]], null, null]));
    expect(bad).toEqual({ code: "#VALUE!", message: 'strengths, row 2 is not a number: it holds the text "oops"' });
    expect(problems).toEqual([]);
    await page.close();
  }, 300_000);
});
