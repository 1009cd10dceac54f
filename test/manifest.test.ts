// Offline checks of manifest.xml (office-addin-manifest's validator needs an
// online service): well-formed XML with namespaces, every resid resolves and
// every resource is used, namespace BRITTLE, HTTPS only, icons present at the
// sizes they claim, the least permissions the add-in needs, a shared runtime,
// and every URL a file that scripts/build.mjs writes into dist/.
//
// The XML parser is saxes, already installed as a dependency of exceljs.
// Schema facts marked "from memory" come from the Office add-in manifest
// schema (OfficeApp 1.1, VersionOverrides 1.0) as its documentation states them.
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { SaxesParser } from "saxes";
import { describe, expect, it } from "vitest";
import { NAMESPACE } from "../cli/engine";

const OFFICE_APP = "http://schemas.microsoft.com/office/appforoffice/1.1";
const BASIC_TYPES = "http://schemas.microsoft.com/office/officeappbasictypes/1.0";
const OVERRIDES = "http://schemas.microsoft.com/office/taskpaneappversionoverrides";
const XSI = "http://www.w3.org/2001/XMLSchema-instance";

interface Element {
  uri: string;
  local: string;
  attributes: Map<string, { uri: string; value: string }>;
  children: Element[];
  text: string;
}

function parse(xml: string): { root: Element | null; errors: string[] } {
  const parser = new SaxesParser({ xmlns: true, position: true });
  const errors: string[] = [];
  const stack: Element[] = [];
  let root: Element | null = null;
  parser.on("error", (e) => errors.push(e.message));
  parser.on("opentag", (tag) => {
    const el: Element = { uri: tag.uri, local: tag.local, attributes: new Map(), children: [], text: "" };
    for (const a of Object.values(tag.attributes)) el.attributes.set(a.local, { uri: a.uri, value: a.value });
    if (stack.length) stack[stack.length - 1].children.push(el);
    else root = el;
    stack.push(el);
  });
  parser.on("text", (t) => {
    if (stack.length) stack[stack.length - 1].text += t;
  });
  parser.on("closetag", () => stack.pop());
  parser.write(xml).close();
  return { root, errors };
}

const all = (el: Element): Element[] => [el, ...el.children.flatMap(all)];
const attr = (el: Element, name: string) => el.attributes.get(name)?.value;
const child = (el: Element, local: string) => el.children.find((c) => c.local === local);
const xsiType = (el: Element) => [...el.attributes.entries()].find(([k, v]) => k === "type" && v.uri === XSI)?.[1].value;

const xml = readFileSync("manifest.xml", "utf8");
const { root, errors } = parse(xml);
const doc = root as unknown as Element;
const everything = doc ? all(doc) : [];
const resources = everything.filter((e) => e.uri === BASIC_TYPES && ["Image", "Url", "String"].includes(e.local) && attr(e, "id"));
const byId = new Map(resources.map((r) => [attr(r, "id")!, r]));
const resolve = (resid: string) => attr(byId.get(resid)!, "DefaultValue")!;

/** Every URL the manifest names, with where it was found. */
function urls(): { where: string; url: string }[] {
  const found: { where: string; url: string }[] = [];
  for (const e of everything) {
    const value = attr(e, "DefaultValue");
    if (value && (["IconUrl", "HighResolutionIconUrl", "SupportUrl", "SourceLocation"].includes(e.local) || (e.uri === BASIC_TYPES && ["Image", "Url"].includes(e.local)))) {
      found.push({ where: `${e.local}${attr(e, "id") ? ` ${attr(e, "id")}` : ""}`, url: value });
    }
    if (e.local === "AppDomain") found.push({ where: "AppDomain", url: e.text.trim() });
  }
  return found;
}

/** The paths under dist/ that scripts/build.mjs produces, read from the build script and the vite config. */
function builtPaths(): Set<string> {
  const build = readFileSync("scripts/build.mjs", "utf8");
  const vite = readFileSync("vite.config.ts", "utf8");
  const paths = new Set<string>();
  for (const m of build.matchAll(/(?:writeFile\(|outfile:\s*)"dist\/([^"]+)"/g)) paths.add(m[1]);
  for (const m of vite.matchAll(/resolve\(import\.meta\.dirname,\s*"taskpane\/([^"/]+\.html)"\)/g)) paths.add(m[1]);
  const assets = /cp\("taskpane\/assets",\s*"dist\/assets"/.test(build);
  if (assets) for (const icon of ["icon-16.png", "icon-32.png", "icon-64.png", "icon-80.png", "icon-128.png"]) if (existsSync(join("taskpane/assets", icon))) paths.add(`assets/${icon}`);
  return paths;
}

function pngSize(file: string): { width: number; height: number } | null {
  const bytes = readFileSync(file);
  const signature = "89504e470d0a1a0a";
  if (bytes.subarray(0, 8).toString("hex") !== signature || bytes.subarray(12, 16).toString("latin1") !== "IHDR") return null;
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

describe("manifest.xml", () => {
  it("is well-formed XML with an OfficeApp task-pane root in the 1.1 namespace", () => {
    expect(errors).toEqual([]);
    expect(doc).not.toBeNull();
    expect(doc.local).toBe("OfficeApp");
    expect(doc.uri).toBe(OFFICE_APP);
    expect(xsiType(doc)).toBe("TaskPaneApp");
    expect(child(doc, "Id")!.text.trim()).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i);
    expect(child(doc, "Version")!.text.trim()).toMatch(/^\d+\.\d+\.\d+\.\d+$/);
    const vo = child(doc, "VersionOverrides")!;
    expect(vo.uri).toBe(OVERRIDES);
    expect(xsiType(vo)).toBe("VersionOverridesV1_0");
  });

  it("keeps the element order the OfficeApp schema requires (from memory: OfficeApp 1.1 TaskPaneApp sequence)", () => {
    const sequence = ["Id", "AlternateId", "Version", "ProviderName", "DefaultLocale", "DisplayName", "Description", "IconUrl", "HighResolutionIconUrl", "SupportUrl", "AppDomains", "Hosts", "Requirements", "DefaultSettings", "Permissions", "VersionOverrides"];
    const present = doc.children.map((c) => c.local);
    expect(present.every((name) => sequence.includes(name))).toBe(true);
    expect(present).toEqual(sequence.filter((name) => present.includes(name)));
    for (const required of ["Id", "Version", "ProviderName", "DefaultLocale", "DisplayName", "Description", "IconUrl", "DefaultSettings", "Permissions"]) {
      expect(present, required).toContain(required);
    }
  });

  it("resolves every resid to exactly one resource, uses every resource, and keeps ids within 32 characters (from memory: schema limit)", () => {
    const ids = resources.map((r) => attr(r, "id")!);
    expect(new Set(ids).size).toBe(ids.length);
    const referenced = everything.map((e) => attr(e, "resid")).filter((r): r is string => r !== undefined);
    expect(referenced.length).toBeGreaterThan(5);
    for (const resid of referenced) {
      expect(byId.has(resid), `resid "${resid}"`).toBe(true);
      expect(resid.length, resid).toBeLessThanOrEqual(32);
    }
    for (const id of ids) expect(referenced, `resource "${id}" is never used`).toContain(id);
  });

  it("keeps short strings within 125 characters and long strings within 250 (from memory: schema limits)", () => {
    const section = (name: string) => everything.find((e) => e.uri === BASIC_TYPES && e.local === name)?.children ?? [];
    for (const s of section("ShortStrings")) expect(attr(s, "DefaultValue")!.length, attr(s, "id")).toBeLessThanOrEqual(125);
    for (const s of section("LongStrings")) expect(attr(s, "DefaultValue")!.length, attr(s, "id")).toBeLessThanOrEqual(250);
    expect(attr(child(doc, "DisplayName")!, "DefaultValue")!.length).toBeLessThanOrEqual(125);
    expect(attr(child(doc, "Description")!, "DefaultValue")!.length).toBeLessThanOrEqual(250);
  });

  it("declares the custom functions' namespace BRITTLE, the one the engine registers", () => {
    const ns = everything.find((e) => e.local === "Namespace")!;
    expect(resolve(attr(ns, "resid")!)).toBe("BRITTLE");
    expect(NAMESPACE).toBe("BRITTLE");
  });

  it("names HTTPS URLs only, all on one origin, the port the dev server uses", () => {
    const found = urls();
    expect(found.length).toBeGreaterThan(5);
    for (const { where, url } of found) expect(url, where).toMatch(/^https:\/\/[^\s/]+/);
    const origins = new Set(found.map(({ url }) => new URL(url).origin));
    expect(origins.size).toBe(1);
    const port = /PORT \?\? (\d+)/.exec(readFileSync("scripts/serve.mjs", "utf8"))?.[1];
    expect(new URL(found[0].url).port).toBe(port);
  });

  it("points every icon at a PNG in taskpane/assets of the size it claims", () => {
    const icons = [
      ...everything.filter((e) => e.uri === BASIC_TYPES && e.local === "Image" && attr(e, "id")).map((e) => ({ url: attr(e, "DefaultValue")!, size: Number(/\d+/.exec(attr(e, "id")!)![0]) })),
      { url: attr(child(doc, "IconUrl")!, "DefaultValue")!, size: 32 }, // from memory: IconUrl 32 x 32
      { url: attr(child(doc, "HighResolutionIconUrl")!, "DefaultValue")!, size: 64 }, // from memory: 64 x 64
    ];
    // Every <bt:Image size="..."> names an image of that size.
    for (const use of everything.filter((e) => e.uri === BASIC_TYPES && e.local === "Image" && attr(e, "size"))) {
      expect(Number(/\d+/.exec(attr(use, "resid")!)![0]), attr(use, "resid")).toBe(Number(attr(use, "size")));
    }
    for (const { url, size } of icons) {
      const path = new URL(url).pathname.replace(/^\/assets\//, "");
      const file = join("taskpane/assets", path);
      expect(existsSync(file), file).toBe(true);
      expect(pngSize(file), file).toEqual({ width: size, height: size });
    }
  });

  it("asks for the least permission the task pane needs: ReadWriteDocument at most (it writes the report sheet)", () => {
    const permission = child(doc, "Permissions")!.text.trim();
    expect(["Restricted", "ReadDocument", "ReadWriteDocument"]).toContain(permission);
  });

  it("requires the shared runtime and runs functions, task pane and commands in that one long-lived page", () => {
    const sets = everything.filter((e) => e.local === "Set").map((e) => [attr(e, "Name"), attr(e, "MinVersion")]);
    expect(sets).toContainEqual(["SharedRuntime", "1.1"]);
    const runtime = everything.find((e) => e.local === "Runtime")!;
    expect(attr(runtime, "lifetime")).toBe("long");
    const page = attr(runtime, "resid")!;
    const customFunctions = everything.find((e) => e.local === "ExtensionPoint" && xsiType(e) === "CustomFunctions")!;
    expect(attr(child(child(customFunctions, "Page")!, "SourceLocation")!, "resid")).toBe(page);
    expect(attr(everything.find((e) => e.local === "FunctionFile")!, "resid")).toBe(page);
    for (const action of everything.filter((e) => e.local === "Action" && xsiType(e) === "ShowTaskpane")) {
      expect(attr(child(action, "SourceLocation")!, "resid")).toBe(page);
    }
    expect(new URL(resolve(page)).pathname).toBe(new URL(attr(child(child(doc, "DefaultSettings")!, "SourceLocation")!, "DefaultValue")!).pathname);
    // The page registers the functions itself (shared runtime): the task pane entry calls registerInHost.
    expect(readFileSync("taskpane/taskpane.ts", "utf8")).toMatch(/registerInHost\(\)/);
  });

  it("names, for every URL, a file that scripts/build.mjs writes into dist/ (functions.json, functions.js, pages, icons)", () => {
    const built = builtPaths();
    expect(built).toContain("functions.json");
    expect(built).toContain("functions.js");
    const customFunctions = everything.find((e) => e.local === "ExtensionPoint" && xsiType(e) === "CustomFunctions")!;
    const script = resolve(attr(child(child(customFunctions, "Script")!, "SourceLocation")!, "resid")!);
    const metadata = resolve(attr(child(child(customFunctions, "Metadata")!, "SourceLocation")!, "resid")!);
    expect(new URL(script).pathname).toBe("/functions.js");
    expect(new URL(metadata).pathname).toBe("/functions.json");
    for (const { where, url } of urls()) {
      if (where === "AppDomain") continue;
      const path = new URL(url).pathname.replace(/^\//, "");
      expect(built.has(path), `${where} -> ${path} is not among the files the build writes: ${[...built].join(", ")}`).toBe(true);
      // After `npm run build`, the file is there.
      if (existsSync("dist/functions.json")) expect(existsSync(join("dist", path)), `dist/${path}`).toBe(true);
    }
  });
});
