/**
 * The "How many specimens?" panel in a real headless Chromium (a system one, or the one the npm package
 * @sparticuz/chromium ships: see browser-launch.ts), standalone: the
 * pane is built into a temporary folder and served on a loopback port; the test types as a user
 * would and checks that the page shows what the core computes (the core is the reference for the
 * pane; it is checked against a seeded pivot simulation in specimens-needed.test.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createServer, type Server } from "node:http";
import { cp, mkdtemp, rm } from "node:fs/promises";
import { createReadStream, existsSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, normalize, resolve } from "node:path";
import type { AddressInfo } from "node:net";
import { build } from "vite";
import { chromium, type BrowserContext } from "playwright-core";
import { specimensNeeded } from "../src/design/specimens-needed";
import { CHROMIUM_ARGS, findChromium } from "./browser-launch";

const ROOT = resolve(import.meta.dirname, "..");
let outDir = "";
let profileDir = "";
let server: Server;
let baseUrl = "";
let context: BrowserContext;

const chromiumFound = await findChromium();
if (chromiumFound.executablePath === null) console.warn(`browser tests skipped: ${chromiumFound.reason}`);

beforeAll(async () => {
  if (chromiumFound.executablePath === null) return;
  outDir = await mkdtemp(join(tmpdir(), "brittle-plan-"));
  profileDir = await mkdtemp(join(tmpdir(), "brittle-plan-profile-"));
  await build({ configFile: join(ROOT, "vite.config.ts"), logLevel: "silent", build: { outDir, emptyOutDir: true } });
  await cp(join(ROOT, "node_modules/@microsoft/office-js/dist"), join(outDir, "office-js"), { recursive: true });
  server = createServer((req, res) => {
    const file = normalize(join(outDir, decodeURIComponent(new URL(req.url ?? "/", "http://127.0.0.1").pathname)));
    if (!file.startsWith(outDir) || !existsSync(file) || !statSync(file).isFile()) {
      res.writeHead(404).end("not found");
      return;
    }
    const type = file.endsWith(".html") ? "text/html; charset=utf-8" : file.endsWith(".js") ? "text/javascript" : file.endsWith(".css") ? "text/css" : "application/octet-stream";
    res.writeHead(200, { "content-type": type });
    createReadStream(file).pipe(res);
  });
  await new Promise<void>((done) => server.listen(0, "127.0.0.1", done));
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  context = await chromium.launchPersistentContext(profileDir, {
    executablePath: chromiumFound.executablePath,
    headless: true,
    args: CHROMIUM_ARGS,
  });
}, 180_000);

afterAll(async () => {
  await context?.close();
  await new Promise<void>((done) => (server ? server.close(() => done()) : done()));
  await rm(outDir, { recursive: true, force: true });
  await rm(profileDir, { recursive: true, force: true });
});

describe.skipIf(chromiumFound.executablePath === null)(`How many specimens? (headless Chromium: ${chromiumFound.executablePath === null ? "none found" : chromiumFound.source})`, () => {
  it("shows the core's number of specimens, updates as the user types, and names a bad field", async () => {
    const page = await context.newPage();
    const problems: string[] = [];
    page.on("pageerror", (e) => problems.push(String(e)));
    await page.goto(`${baseUrl}/taskpane.html`);
    await page.waitForSelector("body[data-ready=true]");
    await page.click("#step-planning summary");
    const first = specimensNeeded({ targetRatio: 0.8, shape: 10, survival: 0.999, confidence: 0.95 });
    expect(await page.textContent("#plan-answer")).toContain(`${first.specimens} specimens`);
    expect(await page.isVisible("#plan-table")).toBe(true);

    await page.fill("#plan-modulus", "6");
    const second = specimensNeeded({ targetRatio: 0.8, shape: 6, survival: 0.999, confidence: 0.95 });
    await page.waitForFunction((n) => document.getElementById("plan-answer")?.textContent?.includes(`${n} specimens`), second.specimens);
    expect(second.specimens).toBeGreaterThan(first.specimens as number);

    await page.fill("#plan-target", "1,2");
    await page.waitForFunction(() => (document.getElementById("plan-error")?.textContent ?? "") !== "");
    expect(await page.getAttribute("#plan-target", "aria-invalid")).toBe("true");
    expect(await page.isVisible("#plan-table")).toBe(false);
    expect(problems).toEqual([]);
    await page.close();
  }, 60_000);
});
