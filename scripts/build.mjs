// Builds the add-in and the command line.
//
//   npm run build -- [--base-url https://host/path/] [--office-js cdn|local]
//     dist/  the add-in for a static HTTPS host: the task pane (vite), functions.json with one-line
//            descriptions and a help link per function, help.html generated from it, functions.js,
//            icons, and manifest.xml with every URL under the base (default https://localhost:3000/).
//     lib/   the compiled command line (see below).
//   node scripts/build.mjs --cli-only [--if-stale]
//     lib/ only: brittle.mjs and its chunks (esbuild) beside functions.json, which it reads at run time
//     instead of regenerating it. `npm pack` runs this (prepack); `npm run calc` runs it with --if-stale.
//
// The metadata generator exits 0 even on errors, so functions/metadata.ts checks its output is complete
// and this build stops on any error. Progress goes to stderr: `npm run --silent calc -- F --json` stays
// clean JSON.
import { cp, mkdir, readFile, readdir, rm, stat, writeFile } from "node:fs/promises";
import { existsSync } from "node:fs";
import { join, resolve } from "node:path";
import { build as esbuild } from "esbuild";
import { register } from "tsx/esm/api";

register();
const ROOT = resolve(import.meta.dirname, "..");
const started = Date.now();
const step = (text) => process.stderr.write(`build: ${text}\n`);
const { parseBuildOptions, manifestForBase, paneHtmlFor, BuildOptionError, BUILD_USAGE, DIST_FILES } = await import("./deploy.ts");

/** Sources the compiled command line is made of: any newer than lib/brittle.mjs makes it stale. */
const CLI_SOURCES = ["src", "functions", "cli", "examples/demo.ts", "package.json", "scripts/build.mjs"];

async function newestMtime(path) {
  const info = await stat(path);
  if (!info.isDirectory()) return info.mtimeMs;
  let newest = info.mtimeMs;
  for (const entry of await readdir(path)) newest = Math.max(newest, await newestMtime(join(path, entry)));
  return newest;
}

async function cliIsCurrent() {
  const outputs = ["lib/brittle.mjs", "lib/functions.json"].map((p) => join(ROOT, p));
  if (!outputs.every((p) => existsSync(p))) return false;
  const built = Math.min(...(await Promise.all(outputs.map(async (p) => (await stat(p)).mtimeMs))));
  const sources = await Promise.all(CLI_SOURCES.map((p) => newestMtime(join(ROOT, p))));
  return Math.max(...sources) < built;
}

/** The compiled command line: functions/metadata.ts (generator + TypeScript compiler) is swapped for cli/built-metadata.ts. */
async function buildCommandLine(functionsJson) {
  await rm(join(ROOT, "lib"), { recursive: true, force: true });
  await mkdir(join(ROOT, "lib"), { recursive: true });
  await writeFile(join(ROOT, "lib/functions.json"), functionsJson);
  const readBuiltMetadata = {
    name: "read-built-functions-json",
    setup(build) {
      build.onResolve({ filter: /[\\/]functions[\\/]metadata(\.ts)?$/ }, () => ({ path: join(ROOT, "cli/built-metadata.ts") }));
    },
  };
  // Large JSON tables (the Monte Carlo tables in src/weibull/tables) as one JSON.parse of a string: V8 parses JSON
  // faster than the same data written as a JavaScript object literal (v8.dev, "The cost of JavaScript in 2019").
  const jsonAsParse = {
    name: "json-as-parse",
    setup(build) {
      build.onLoad({ filter: /\.json$/ }, async (args) => {
        const text = JSON.stringify(JSON.parse(await readFile(args.path, "utf8")));
        return { contents: `export default JSON.parse(${JSON.stringify(text)});`, loader: "js" };
      });
    },
  };
  // HyperFormula builds its formula parser and lexer (chevrotain) for every engine, and chevrotain checks the
  // grammar's definition each time (chevrotain's docs: skipValidations "can be used to optimize the parser's
  // initialization time" once the grammar is known to be valid). The grammar is fixed by the pinned version and
  // passes those checks (the tests build engines from source, with the checks on), so the compiled program skips
  // them; the build fails if the text it edits is not found, rather than silently checking again.
  const skipGrammarChecks = {
    name: "skip-grammar-checks",
    setup(build) {
      build.onLoad({ filter: /hyperformula[\\/]es[\\/]parser[\\/]FormulaParser\.mjs$/ }, async (args) => {
        const source = await readFile(args.path, "utf8");
        const edits = [
          ["outputCst: false,\n      maxLookahead: 7", "outputCst: false,\n      maxLookahead: 7,\n      skipValidations: true"],
          ["ensureOptimizations: true\n", "ensureOptimizations: true,\n      skipValidations: true\n"],
        ];
        let contents = source;
        for (const [from, to] of edits) {
          if (contents.split(from).length !== 2) throw new Error(`${args.path}: "${from}" not found once; update skip-grammar-checks in scripts/build.mjs`);
          contents = contents.replace(from, to);
        }
        return { contents, loader: "js" };
      });
    },
  };
  const result = await esbuild({
    absWorkingDir: ROOT,
    entryPoints: { brittle: "cli/run.ts" },
    bundle: true,
    splitting: true, // calc, part, demo and the engine load as separate chunks, each only when used
    format: "esm",
    platform: "node",
    target: "node20",
    outdir: "lib",
    outExtension: { ".js": ".mjs" },
    chunkNames: "[name]-[hash]", // beside functions.json, which built-metadata.ts finds next to itself
    // exceljs and jszip load from node_modules (only for .xlsx). HyperFormula and its parser library are bundled
    // into the engine chunk: one file to compile instead of about 300 modules, loaded only when a workbook needs
    // the engine (cli/direct-evaluation.ts evaluates a plain .csv without it). Legal comments are kept.
    external: ["exceljs", "jszip"],
    plugins: [readBuiltMetadata, jsonAsParse, skipGrammarChecks],
    metafile: true,
    minify: true,
    logLevel: "warning",
  });
  const bundled = Object.keys(result.metafile.inputs);
  const leaked = bundled.filter((p) => /functions[\\/]metadata\.ts$/.test(p));
  if (leaked.length) throw new Error(`the compiled command line still contains the metadata generator (${leaked.join(", ")})`);
  const external = new Set(Object.values(result.metafile.outputs).flatMap((o) => o.imports.filter((i) => i.external).map((i) => i.path)));
  const dev = ["custom-functions-metadata", "typescript", "tsx"].filter((name) => external.has(name));
  if (dev.length) throw new Error(`the compiled command line imports development packages: ${dev.join(", ")}`);
}

async function buildAddIn(options, functionsJson, functions) {
  const { build: viteBuild } = await import("vite");
  await viteBuild({ root: undefined, configFile: join(ROOT, "vite.config.ts"), logLevel: "warn" });
  const dist = join(ROOT, "dist");
  const pane = join(dist, "taskpane.html");
  await writeFile(pane, paneHtmlFor(await readFile(pane, "utf8"), options.officeJs));
  step(`task pane -> dist/taskpane.html (office.js: ${options.officeJs === "cdn" ? "platform CDN" : "local copy"})`);

  await writeFile(join(dist, "functions.json"), functionsJson);
  const { renderHelpPage } = await import("./help-page.ts");
  const { families } = await import("../functions/registry.ts");
  const { returnsDescriptions } = await import("../functions/metadata.ts");
  const helpFamilies = families.map((f) => ({ title: f.title, ids: functions.filter((fn) => fn.id in f.adapters).map((fn) => fn.id) }));
  await writeFile(join(dist, "help.html"), renderHelpPage(functions, helpFamilies, returnsDescriptions()));
  await cp(join(ROOT, "taskpane/help.css"), join(dist, "help.css"));
  step(`functions.json and help.html: ${functions.length} functions, help links under ${options.baseUrl}`);

  await esbuild({
    absWorkingDir: ROOT,
    entryPoints: ["functions/office-entry.ts"],
    bundle: true,
    format: "iife",
    target: "es2020",
    outfile: "dist/functions.js",
    logLevel: "warning",
  });
  // The worker thread that runs the simulating functions in the shared runtime (functions/cancelable.ts), and the
  // task pane's material fit (functions/material-fit-run.ts).
  await esbuild({
    absWorkingDir: ROOT,
    entryPoints: ["functions/simulation-worker.ts"],
    bundle: true,
    format: "iife",
    target: "es2020",
    outfile: "dist/simulation-worker.js",
    logLevel: "warning",
  });
  step("functions.js and simulation-worker.js");

  if (options.officeJs === "local") {
    // Copied whole: office.js lazily loads a mapping file and its locale files from beside itself.
    await cp(join(ROOT, "node_modules/@microsoft/office-js/dist"), join(dist, "office-js"), { recursive: true });
  }
  await cp(join(ROOT, "taskpane/assets"), join(dist, "assets"), { recursive: true });
  await writeFile(join(dist, "manifest.xml"), manifestForBase(await readFile(join(ROOT, "manifest.xml"), "utf8"), options.baseUrl));
  step(`icons and manifest.xml for ${options.baseUrl}`);
  const missing = DIST_FILES.filter((file) => !existsSync(join(dist, file)));
  if (missing.length) throw new Error(`dist/ lacks ${missing.join(", ")}`);
}

try {
  const options = parseBuildOptions(process.argv.slice(2));
  if (options.cliOnly && options.ifStale && (await cliIsCurrent())) process.exit(0);
  const { generateMetadata } = await import("../functions/metadata.ts");
  const { json, functions } = await generateMetadata({ helpBaseUrl: options.baseUrl });
  await buildCommandLine(json);
  step(`command line -> lib/brittle.mjs (${functions.length} functions)`);
  if (!options.cliOnly) await buildAddIn(options, json, functions);
  step(`done in ${((Date.now() - started) / 1000).toFixed(1)} s`);
} catch (error) {
  if (error instanceof BuildOptionError) process.stderr.write(`build: ${error.message}\n${BUILD_USAGE}\n`);
  else process.stderr.write(`build failed: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
}
