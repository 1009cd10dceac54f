/**
 * Which Chromium the browser tests drive, so `npm ci && npm test` passes on a
 * fresh machine: a system Chromium where there is one, otherwise the binary
 * that the npm package @sparticuz/chromium ships inside itself (Linux x64
 * only; it unpacks into the temporary folder and runs under playwright-core
 * with no system libraries added). BRITTLE_CHROMIUM overrides the choice:
 * "npm" forces the package's binary (to test the fresh-machine path on a
 * machine that has a system Chromium), a path names a binary to use.
 */
import { existsSync } from "node:fs";

export const SYSTEM_CHROMIUMS = ["/usr/bin/chromium", "/usr/bin/chromium-browser", "/usr/bin/google-chrome", "/usr/bin/google-chrome-stable"];

/** Flags for a headless run in a container (no sandbox, no GPU, no background traffic). */
export const CHROMIUM_ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

export type Chromium = { executablePath: string; source: string } | { executablePath: null; reason: string };

export async function findChromium(env: NodeJS.ProcessEnv = process.env): Promise<Chromium> {
  const wanted = env.BRITTLE_CHROMIUM?.trim();
  if (wanted && wanted !== "npm") {
    if (!existsSync(wanted)) throw new Error(`BRITTLE_CHROMIUM=${wanted}: no such file`);
    return { executablePath: wanted, source: "BRITTLE_CHROMIUM" };
  }
  if (!wanted) {
    const system = SYSTEM_CHROMIUMS.find((path) => existsSync(path));
    if (system) return { executablePath: system, source: "system" };
  }
  if (process.platform !== "linux" || process.arch !== "x64") {
    return {
      executablePath: null,
      reason: `no system Chromium found (${SYSTEM_CHROMIUMS.join(", ")}) and @sparticuz/chromium ships a Linux x64 binary only (this is ${process.platform} ${process.arch}): set BRITTLE_CHROMIUM to a Chromium or Chrome binary to run the browser tests`,
    };
  }
  const { default: packaged } = await import("@sparticuz/chromium");
  return { executablePath: await packaged.executablePath(), source: "@sparticuz/chromium (npm)" };
}
