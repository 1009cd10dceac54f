// Builds the add-in into dist/: functions.json from the adapters' JSDoc (fatal
// on any generator error or missing function), the task pane through vite,
// functions.js through esbuild, and the local office.js folder.
import { cp, mkdir, writeFile } from "node:fs/promises";
import { build as viteBuild } from "vite";
import { build as esbuild } from "esbuild";
import { register } from "tsx/esm/api";

register();
const started = Date.now();
const step = (text) => process.stdout.write(`build: ${text}\n`);

try {
  await viteBuild({ configFile: "vite.config.ts", logLevel: "warn" });
  step("task pane -> dist/taskpane.html");

  const { generateMetadata } = await import("../functions/metadata.ts");
  const { json, functions } = await generateMetadata();
  await writeFile("dist/functions.json", json);
  step(`functions.json: ${functions.length} functions`);

  await esbuild({
    entryPoints: ["functions/office-entry.ts"],
    bundle: true,
    format: "iife",
    target: "es2020",
    outfile: "dist/functions.js",
    logLevel: "warning",
  });
  step("functions.js");

  await mkdir("dist/office-js", { recursive: true });
  await cp("node_modules/@microsoft/office-js/dist", "dist/office-js", { recursive: true });
  await cp("taskpane/assets", "dist/assets", { recursive: true });
  await cp("manifest.xml", "dist/manifest.xml");
  step(`office.js, icons and manifest copied (${((Date.now() - started) / 1000).toFixed(1)} s)`);
} catch (error) {
  process.stderr.write(`build failed: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
}
