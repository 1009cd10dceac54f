// The function reference (docs/functions.md) is generated from functions.json; this fails when a
// function's JSDoc changed and `npm run reference` was not run. The README must state the job in
// its first paragraph, carry the cautions, stay short, and link to the reference.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { generateMetadata } from "../functions/metadata";
import { REFERENCE_PATH, renderReference } from "../scripts/functions-reference";

describe("docs/functions.md", () => {
  it("matches the functions' JSDoc (run `npm run reference` if this fails), and names every function", async () => {
    const { functions } = await generateMetadata();
    const page = readFileSync(REFERENCE_PATH, "utf8");
    expect(page).toBe(renderReference(functions));
    for (const f of functions) expect(page).toContain(`BRITTLE.${f.id}(`);
  });
});

describe("README", () => {
  const readme = readFileSync("README.md", "utf8");

  it("opens with a paragraph that states the job, and carries the cautions", () => {
    const first = readme.split("\n").find((l) => l.trim() && !l.startsWith("#"))!;
    expect(first.length).toBeGreaterThan(300);
    expect(first).toMatch(/allowable stress/);
    for (const caution of [/extrapolates/, /one flaw population/, /surface finish/, /slow crack growth/, /licensed engineer/]) {
      expect(readme).toMatch(caution);
    }
  });

  it("stays at most 20 KB, with a quick start of two commands and links to the reference and the methods", () => {
    expect(Buffer.byteLength(readme, "utf8")).toBeLessThanOrEqual(20_000);
    const quick = readme.slice(readme.indexOf("## Quick start"), readme.indexOf("## ", readme.indexOf("## Quick start") + 3));
    const commands = quick.match(/```sh\n([\s\S]*?)```/)![1].trim().split("\n");
    expect(commands).toEqual([expect.stringMatching(/^npm ci && npm run demo\b/), expect.stringMatching(/^npm test\b/)]);
    expect(readme).toContain("(docs/functions.md)");
    expect(readme).toContain("(docs/methods.md)");
  });

  it("links only to files that exist", () => {
    for (const [, target] of readme.matchAll(/\]\(((?:docs\/|DEVELOPERS|LICENSE)[^)#]*)/g)) {
      expect(() => readFileSync(target), target).not.toThrow();
    }
  });
});
