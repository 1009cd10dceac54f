/**
 * functions.json, generated from the adapters' JSDoc by
 * custom-functions-metadata, the single description of every function: the
 * spreadsheet host reads it from the build, the embedded engine and the
 * README generator read the same text.
 *
 * The generator exits 0 and returns partial output even when it reports
 * errors, so we check both: any error, or any registered adapter missing from
 * the metadata (or the reverse), is fatal.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join, dirname } from "node:path";
import { fileURLToPath } from "node:url";
import { generateCustomFunctionsMetadata } from "custom-functions-metadata";
import { adapters } from "./registry";

export interface ParameterMetadata {
  name: string;
  description?: string;
  type: "number" | "string" | "boolean" | "any";
  dimensionality?: "scalar" | "matrix";
  optional?: boolean;
}

export interface FunctionMetadata {
  id: string;
  name: string;
  description: string;
  parameters: ParameterMetadata[];
  result: { type?: string; dimensionality?: "scalar" | "matrix" };
  /** Present for the functions that simulate (JSDoc @cancelable): the host runs them asynchronously and may cancel them. */
  options?: { cancelable?: boolean };
  /** The function's section of the generated help page; the host links to it from the formula tooltip. */
  helpUrl?: string;
}

export interface MetadataOptions {
  /** Where the add-in is served (ends in "/"): every function gets helpUrl <base>help.html#<id>. */
  helpBaseUrl?: string;
}

/** JSDoc wraps its prose at the source's line width; the host shows a description as one paragraph. */
export function oneLine(text: string): string {
  return text.replace(/\s+/g, " ").trim();
}

export function helpUrlFor(baseUrl: string, id: string): string {
  return new URL(`help.html#${id}`, baseUrl).href;
}

export const FUNCTIONS_DIR = dirname(fileURLToPath(import.meta.url));

/** The adapter family files: every .ts file here whose JSDoc has a custom-function tag line. */
export function adapterFiles(): string[] {
  return readdirSync(FUNCTIONS_DIR)
    .filter((f) => f.endsWith(".ts"))
    .map((f) => join(FUNCTIONS_DIR, f))
    .filter((f) => /^\s*\*\s*@customfunction\s*$/m.test(readFileSync(f, "utf8")));
}

export async function generateMetadata(options: MetadataOptions = {}): Promise<{ json: string; functions: FunctionMetadata[] }> {
  const result = await generateCustomFunctionsMetadata(adapterFiles(), false);
  if (result.errors.length > 0) {
    throw new Error(`custom-functions-metadata reported errors:\n  ${result.errors.join("\n  ")}`);
  }
  const generated = JSON.parse(result.metadataJson) as { functions?: FunctionMetadata[] };
  const functions = (generated.functions ?? []).map((f) => ({
    ...f,
    description: oneLine(f.description ?? ""),
    parameters: f.parameters.map((p) => (p.description === undefined ? p : { ...p, description: oneLine(p.description) })),
    ...(options.helpBaseUrl ? { helpUrl: helpUrlFor(options.helpBaseUrl, f.id) } : {}),
  }));
  const described = new Set(functions.map((f) => f.id));
  const registered = new Set(Object.keys(adapters));
  const undocumented = [...registered].filter((n) => !described.has(n));
  const unregistered = [...described].filter((n) => !registered.has(n));
  if (undocumented.length || unregistered.length) {
    throw new Error(
      `functions.json and the registry disagree: missing from metadata [${undocumented.join(", ")}], ` +
        `missing from registry [${unregistered.join(", ")}]`,
    );
  }
  for (const f of functions) {
    const blank = [f.description, ...f.parameters.map((p) => p.description)].some((d) => !d || !d.trim());
    if (blank) throw new Error(`${f.id}: every function and parameter needs a description`);
    if (!/Example: *=BRITTLE\./.test(f.description)) throw new Error(`${f.id}: the description needs an "Example: =BRITTLE...." line`);
  }
  return { json: JSON.stringify({ ...generated, functions }, null, 2) + "\n", functions };
}

/**
 * Each function's @returns text (quantity and unit), by function id. functions.json has no place for it (the
 * host's schema gives a result only a type and a shape); the generated help page shows it.
 */
export function returnsDescriptions(): Record<string, string> {
  const returns: Record<string, string> = {};
  for (const file of adapterFiles()) {
    const source = readFileSync(file, "utf8");
    for (const match of source.matchAll(/\/\*\*((?:(?!\*\/)[\s\S])*)\*\/\s*export function (\w+)/g)) {
      const tag = /@returns\s+((?:(?!\n\s*\*\s*@)[\s\S])*)/.exec(match[1]);
      if (tag) returns[match[2].toUpperCase()] = oneLine(tag[1].replace(/\n\s*\*/g, " "));
    }
  }
  return returns;
}
