/**
 * The compiled command line's functions/metadata.ts: scripts/build.mjs swaps
 * this module in when it compiles cli/ to lib/, so `brittle` reads the
 * functions.json the build wrote beside it instead of regenerating it from
 * the adapters' JSDoc. An installed package then needs neither
 * custom-functions-metadata nor the TypeScript compiler at run time. Running
 * from source (tests, scripts) keeps the generator, so it is never stale.
 */
import { readFile } from "node:fs/promises";
import type { FunctionMetadata } from "../functions/metadata";

export type { FunctionMetadata };

export async function generateMetadata(): Promise<{ json: string; functions: FunctionMetadata[] }> {
  // Every compiled file sits directly in lib/, beside functions.json.
  const file = new URL("./functions.json", import.meta.url);
  let json: string;
  try {
    json = await readFile(file, "utf8");
  } catch {
    throw new Error(`the function catalogue ${file.pathname} is missing: reinstall the package, or run \`npm run build\` in the repository`);
  }
  const functions = (JSON.parse(json) as { functions?: FunctionMetadata[] }).functions ?? [];
  if (functions.length === 0) throw new Error(`the function catalogue ${file.pathname} lists no functions: rebuild it`);
  return { json, functions };
}
