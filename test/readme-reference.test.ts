// The README's function reference is generated from functions.json; this
// fails when a function's JSDoc changed and `npm run readme` was not run.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { generateMetadata } from "../functions/metadata";
import { renderReference, spliceReference } from "../scripts/readme-reference";

describe("README function reference", () => {
  it("matches the functions' JSDoc (run `npm run readme` if this fails)", async () => {
    const { functions } = await generateMetadata();
    const readme = readFileSync("README.md", "utf8");
    expect(spliceReference(readme, renderReference(functions))).toBe(readme);
    for (const f of functions) expect(readme).toContain(`BRITTLE.${f.id}(`);
  });

  it("opens with a paragraph that states the job, and carries the cautions", () => {
    const readme = readFileSync("README.md", "utf8");
    const first = readme.split("\n").find((l) => l.trim() && !l.startsWith("#"))!;
    expect(first.length).toBeGreaterThan(300);
    expect(first).toMatch(/allowable stress/);
    for (const caution of [/extrapolates/, /one flaw population/, /surface finish/, /slow crack growth/, /licensed engineer/]) {
      expect(readme).toMatch(caution);
    }
  });
});
