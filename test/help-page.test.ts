/**
 * Help inside the host: every function in functions.json carries a one-line
 * description (JSDoc's line wrapping collapsed) and a helpUrl whose anchor
 * is a section of the generated help.html, which shows the function's
 * signature, parameters with their units, what it returns and its example.
 * What is checked is the build's own output (functions.json and help.html
 * as scripts/build.mjs writes them), for a team's base URL.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { generateMetadata, helpUrlFor, returnsDescriptions, type FunctionMetadata } from "../functions/metadata";
import { families } from "../functions/registry";
import { renderHelpPage, signature, splitExample } from "../scripts/help-page";

const BASE = "https://addins.example.org/tools/brittle/";
let functions: FunctionMetadata[] = [];
let json = "";
let page = "";

beforeAll(async () => {
  ({ functions, json } = await generateMetadata({ helpBaseUrl: BASE }));
  const helpFamilies = families.map((f) => ({ title: f.title, ids: functions.filter((fn) => fn.id in f.adapters).map((fn) => fn.id) }));
  page = renderHelpPage(functions, helpFamilies, returnsDescriptions());
});

/** The ids of every element in the page. */
const anchors = (html: string) => new Set([...html.matchAll(/\sid="([^"]+)"/g)].map((m) => m[1]));

describe("functions.json for the host", () => {
  it("gives every function and parameter a one-line description", () => {
    expect(functions.length).toBeGreaterThan(40);
    const written = JSON.parse(json) as { functions: FunctionMetadata[] };
    expect(written.functions.map((f) => f.id)).toEqual(functions.map((f) => f.id));
    for (const f of written.functions) {
      expect(f.description, f.id).not.toMatch(/[\n\r]|\s{2,}/);
      expect(f.description.trim(), f.id).toBe(f.description);
      for (const p of f.parameters) expect(p.description ?? "", `${f.id}.${p.name}`).not.toMatch(/[\n\r]|\s{2,}/);
    }
  });

  it("gives every function a helpUrl under the base whose anchor is a section of help.html", () => {
    const written = JSON.parse(json) as { functions: FunctionMetadata[] };
    const ids = anchors(page);
    for (const f of written.functions) {
      expect(f.helpUrl, f.id).toBe(`${BASE}help.html#${f.id}`);
      const url = new URL(f.helpUrl!);
      expect(ids.has(url.hash.slice(1)), `help.html has no #${f.id}`).toBe(true);
    }
    expect(helpUrlFor("https://localhost:3000/", "FIT")).toBe("https://localhost:3000/help.html#FIT");
  });

  it("leaves helpUrl out when no base is given (the command line's copy)", async () => {
    const plain = await generateMetadata();
    expect(plain.functions.every((f) => f.helpUrl === undefined)).toBe(true);
  });
});

describe("help.html", () => {
  it("has one section per function with its signature, every parameter, what it returns and its example", () => {
    for (const f of functions) {
      const start = page.indexOf(`<section class="function" id="${f.id}">`);
      expect(start, f.id).toBeGreaterThan(0);
      const section = page.slice(start, page.indexOf("</section>", start));
      expect(section).toContain(signature(f));
      for (const p of f.parameters) expect(section, `${f.id}.${p.name}`).toContain(`<code>${p.name}</code>`);
      expect(section, f.id).toMatch(/<b>Returns:<\/b> \S/);
      expect(section, f.id).not.toMatch(/<b>Returns:<\/b> (number|string|a value)</); // the @returns text, with its unit
      const { example } = splitExample(f.description);
      expect(example, `${f.id} has no example`).not.toBeNull();
      expect(section).toContain(`<b>Example:</b>`);
    }
  });

  it("escapes markup from descriptions and loads nothing but its own style sheet", () => {
    expect(page).not.toMatch(/<script/i);
    expect(page).toContain(`content="default-src 'none'; style-src 'self'; img-src 'self'"`);
    const hostile: FunctionMetadata = { id: "X", name: "BRITTLE.X", description: 'a <b>"bold"</b> & more. Example: =BRITTLE.X(1) is about 1.', parameters: [], result: {} };
    const html = renderHelpPage([hostile], [{ title: "t", ids: ["X"] }], {});
    expect(html).toContain("a &lt;b&gt;&quot;bold&quot;&lt;/b&gt; &amp; more.");
    expect(() => renderHelpPage([hostile], [], {})).toThrow(/in no family: X/);
  });
});
