// Offline checks of manifest.xml (office-addin-manifest's validator needs an
// online service): well-formed XML with namespaces, every resid resolves and
// every resource is used, namespace BRITTLE, HTTPS only, icons present at the
// sizes they claim, the least permissions the add-in needs, a shared runtime,
// and every URL a file that scripts/build.mjs writes into dist/.
//
// The same checks run on the repository's manifest (the development server)
// and on the one `npm run build -- --base-url` writes for a team's server.
//
// The XML parser is saxes (a declared development dependency).
// Schema facts marked "from memory" come from the Office add-in manifest
// schema (OfficeApp 1.1, VersionOverrides 1.0) as its documentation states them.
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { SaxesParser } from "saxes";
import { describe, expect, it } from "vitest";
import { NAMESPACE } from "../cli/engine";
import { BuildOptionError, DEVELOPMENT_BASE, DIST_FILES, manifestForBase, OFFICE_JS_CDN, paneHtmlFor, parseBuildOptions } from "../scripts/deploy";

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

/** A parsed manifest and the lookups the checks use. */
function loadManifest(xml: string) {
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
  return { errors, doc, everything, resources, byId, resolve, urls };
}

/** The paths under dist/ the add-in build writes (it checks each exists before it finishes). */
function builtPaths(): Set<string> {
  return new Set<string>(DIST_FILES);
}

const REPOSITORY_MANIFEST = readFileSync("manifest.xml", "utf8");
// A team's own server, below a path, as `npm run build -- --base-url` is meant for (example host).
const TEAM_BASE = "https://addins.example.org/tools/brittle/";
const VARIANTS = [
  { title: "manifest.xml (development: npm start on https://localhost:3000/)", xml: REPOSITORY_MANIFEST, base: DEVELOPMENT_BASE },
  { title: `dist/manifest.xml built with --base-url ${TEAM_BASE}`, xml: manifestForBase(REPOSITORY_MANIFEST, TEAM_BASE), base: TEAM_BASE },
];

function pngSize(file: string): { width: number; height: number } | null {
  const bytes = readFileSync(file);
  const signature = "89504e470d0a1a0a";
  if (bytes.subarray(0, 8).toString("hex") !== signature || bytes.subarray(12, 16).toString("latin1") !== "IHDR") return null;
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

describe.each(VARIANTS)("$title", ({ xml, base }) => {
  const { errors, doc, everything, resources, byId, resolve, urls } = loadManifest(xml);

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

  it("names HTTPS URLs only, every one under the base URL, and the base's origin as its app domain", () => {
    const found = urls();
    expect(found.length).toBeGreaterThan(5);
    for (const { where, url } of found) expect(url, where).toMatch(/^https:\/\/[^\s/]+/);
    for (const { where, url } of found) {
      if (where === "AppDomain") expect(url).toBe(new URL(base).origin);
      else expect(url.startsWith(base), `${where}: ${url} is not under ${base}`).toBe(true);
    }
    if (base !== DEVELOPMENT_BASE) expect(xml).not.toMatch(/localhost/);
    // The development manifest points at the port the dev server listens on by default.
    const port = /PORT \?\? (\d+)/.exec(readFileSync("scripts/serve.mjs", "utf8"))?.[1];
    if (base === DEVELOPMENT_BASE) expect(new URL(base).port).toBe(port);
  });

  it("declares every requirement set the code needs: shared runtime, custom functions runtime, ExcelApi 1.4", () => {
    const sets = new Map(everything.filter((e) => e.local === "Set").map((e) => [attr(e, "Name"), attr(e, "MinVersion")]));
    expect(sets.get("SharedRuntime")).toBe("1.1");
    expect(sets.get("CustomFunctionsRuntime")).toBe("1.1");
    // The highest API set the pane uses without asking isSetSupported first (sheet-writer.ts, host-selection.ts).
    // source: @types/office-js 1.0.612, the "[Api set: ExcelApi x]" tag of each member.
    const unguarded: Record<string, string> = {
      "getUsedRangeOrNullObject(": "1.4",
      "getResizedRange(": "1.2",
      "format.columnWidth": "1.2",
      "getSelectedRange(": "1.1",
      "getOffsetRange(": "1.1",
      "charts.add(": "1.1",
      "worksheets": "1.1",
    };
    const code = ["taskpane/report/sheet-writer.ts", "taskpane/app/host-selection.ts"].map((f) => readFileSync(f, "utf8")).join("\n");
    for (const member of Object.keys(unguarded)) expect(code, member).toContain(member);
    const needed = Math.max(...Object.values(unguarded).map((v) => Number(v.split(".")[1])));
    expect(sets.get("ExcelApi")).toBe(`1.${needed}`);
    // ExcelApi 1.7 members (series.add, setValues, setXAxisValues, chartType, scaleType) run only after the check.
    const writer = readFileSync("taskpane/report/sheet-writer.ts", "utf8");
    const guard = writer.indexOf("if (!chartExtrasSupported())");
    expect(guard).toBeGreaterThan(0);
    for (const member of ["series.add(", "setValues(", "setXAxisValues(", ".chartType", ".scaleType"]) {
      expect(writer.indexOf(member), member).toBeGreaterThan(guard);
    }
    expect(writer).toMatch(/isSetSupported\("ExcelApi", "1\.7"\)/);
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
      const path = url.slice(base.length).replace(/^assets\//, "");
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

  it("names, for every URL, a file the build writes into dist/ (functions.json, functions.js, pages, icons)", () => {
    const built = builtPaths();
    expect(built).toContain("functions.json");
    expect(built).toContain("functions.js");
    const customFunctions = everything.find((e) => e.local === "ExtensionPoint" && xsiType(e) === "CustomFunctions")!;
    const script = resolve(attr(child(child(customFunctions, "Script")!, "SourceLocation")!, "resid")!);
    const metadata = resolve(attr(child(child(customFunctions, "Metadata")!, "SourceLocation")!, "resid")!);
    expect(script).toBe(`${base}functions.js`);
    expect(metadata).toBe(`${base}functions.json`);
    for (const { where, url } of urls()) {
      if (where === "AppDomain") continue;
      const path = url.slice(base.length);
      expect(built.has(path), `${where} -> ${path} is not among the files the build writes: ${[...built].join(", ")}`).toBe(true);
      // After `npm run build`, the file is there.
      if (existsSync("dist/functions.json")) expect(existsSync(join("dist", path)), `dist/${path}`).toBe(true);
    }
  });
});

describe("build options for a team's server (scripts/deploy.ts)", () => {
  it("takes an HTTPS base URL, adds the closing slash, and refuses http, queries, fragments and credentials", () => {
    expect(parseBuildOptions([])).toEqual({ baseUrl: DEVELOPMENT_BASE, officeJs: "cdn", cliOnly: false, ifStale: false });
    expect(parseBuildOptions(["--base-url", "https://addins.example.org/brittle"]).baseUrl).toBe("https://addins.example.org/brittle/");
    expect(parseBuildOptions(["--base-url=https://addins.example.org/", "--office-js=local"])).toMatchObject({ officeJs: "local" });
    for (const bad of ["http://addins.example.org/", "https://a.example.org/x/?v=1", "https://a.example.org/#x", "https://u:p@a.example.org/", "addins/brittle"]) {
      expect(() => parseBuildOptions(["--base-url", bad]), bad).toThrow(BuildOptionError);
    }
    expect(() => parseBuildOptions(["--base-url"])).toThrow(/needs a value/);
    expect(() => parseBuildOptions(["--office-js", "bundled"])).toThrow(/cdn or local/);
    expect(() => parseBuildOptions(["--baseurl", "https://a.example.org/"])).toThrow(/unknown option/);
  });

  it("loads office.js from the platform's CDN by default, allowed by the page's CSP; --office-js local points at the copy and allows 'self' only", () => {
    const page = readFileSync("taskpane/taskpane.html", "utf8");
    const csp = (html: string) => /http-equiv="Content-Security-Policy" content="([^"]+)"/.exec(html)![1];
    const directive = (html: string, name: string) => csp(html).split(";").map((d) => d.trim()).find((d) => d.startsWith(name + " "));
    expect(paneHtmlFor(page, "cdn")).toBe(page);
    expect(page).toContain(`<script src="${OFFICE_JS_CDN}"></script>`);
    expect(directive(page, "script-src")).toBe("script-src 'self' https://appsforoffice.microsoft.com");
    const local = paneHtmlFor(page, "local");
    expect(local).toContain('<script src="./office-js/office.js"></script>');
    expect(local).not.toContain("appsforoffice.microsoft.com");
    expect(directive(local, "script-src")).toBe("script-src 'self'");
    expect(directive(local, "connect-src")).toBe("connect-src 'self'");
    expect(() => paneHtmlFor(page.replace(OFFICE_JS_CDN, "./office.js"), "cdn")).toThrow(/must load office.js/);
  });
});
