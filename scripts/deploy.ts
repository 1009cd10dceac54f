/**
 * Build options for deploying the add-in on a team's own server, and the two
 * rewrites they imply: the manifest's URLs moved under the base URL, and the
 * task pane's office.js taken from the platform's CDN (default) or from a
 * local copy for networks without internet access. Pure functions, so the
 * manifest tests check exactly what the build writes.
 */

/** Where the repository's manifest.xml points: the development server (`npm start`). */
export const DEVELOPMENT_BASE = "https://localhost:3000/";
/** The platform's CDN copy of office.js, which the hosts expect add-ins to load. */
export const OFFICE_JS_CDN = "https://appsforoffice.microsoft.com/lib/1/hosted/office.js";
/** The local copy: the whole dist/ folder of @microsoft/office-js (office.js loads files beside it). */
export const OFFICE_JS_LOCAL = "./office-js/office.js";

export type OfficeJsSource = "cdn" | "local";

/**
 * What the add-in build writes into dist/ (office-js/ only with --office-js local); the manifest names only these,
 * and the build checks each one exists before it finishes.
 */
export const DIST_FILES = [
  "taskpane.html",
  "functions.json",
  "functions.js",
  "simulation-worker.js", // loaded by the task pane page as a worker (functions/cancelable.ts), not named in the manifest
  "help.html",
  "help.css",
  "manifest.xml",
  "assets/icon-16.png",
  "assets/icon-32.png",
  "assets/icon-64.png",
  "assets/icon-80.png",
] as const;

export interface BuildOptions {
  baseUrl: string;
  officeJs: OfficeJsSource;
  /** Compile the command line only (lib/), as `npm pack` does. */
  cliOnly: boolean;
  /** With cliOnly: do nothing when lib/ is newer than every source (the `npm run calc` dev path). */
  ifStale: boolean;
}

export class BuildOptionError extends Error {}

export const BUILD_USAGE = `usage: npm run build -- [--base-url https://host/path/] [--office-js cdn|local]
  --base-url   where dist/ will be served (HTTPS); every URL in dist/manifest.xml is under it.
               Default ${DEVELOPMENT_BASE} (npm start).
  --office-js  cdn (default): the pane loads office.js from ${OFFICE_JS_CDN}
               local: copy office.js into dist/office-js/ for networks without internet access.`;

/** A base URL as the manifest needs it: HTTPS, no query or fragment, ending in "/". */
export function normaliseBaseUrl(text: string): string {
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    throw new BuildOptionError(`--base-url ${JSON.stringify(text)} is not a URL (give e.g. https://addins.example.org/brittle/)`);
  }
  if (url.protocol !== "https:") throw new BuildOptionError(`--base-url must use https: (the hosts load add-ins over HTTPS only), got ${url.protocol}`);
  if (url.search || url.hash) throw new BuildOptionError("--base-url takes no query (?) or fragment (#)");
  if (url.username || url.password) throw new BuildOptionError("--base-url must not carry a user name or password");
  if (!url.pathname.endsWith("/")) url.pathname += "/";
  return url.href;
}

export function parseBuildOptions(argv: string[]): BuildOptions {
  const options: BuildOptions = { baseUrl: DEVELOPMENT_BASE, officeJs: "cdn", cliOnly: false, ifStale: false };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    const [flag, inline] = arg.includes("=") ? [arg.slice(0, arg.indexOf("=")), arg.slice(arg.indexOf("=") + 1)] : [arg, undefined];
    const value = (): string => {
      const v = inline ?? argv[++i];
      if (v === undefined || v.startsWith("--")) throw new BuildOptionError(`${flag} needs a value`);
      return v;
    };
    if (flag === "--base-url") options.baseUrl = normaliseBaseUrl(value());
    else if (flag === "--office-js") {
      const v = value();
      if (v !== "cdn" && v !== "local") throw new BuildOptionError(`--office-js takes cdn or local, got ${JSON.stringify(v)}`);
      options.officeJs = v;
    } else if (flag === "--cli-only") options.cliOnly = true;
    else if (flag === "--if-stale") options.ifStale = true;
    else throw new BuildOptionError(`unknown option ${arg}`);
  }
  return options;
}

/**
 * The repository's manifest (written for the development server) with every URL moved under baseUrl and the
 * app domain set to its origin. Fails if a development URL would survive.
 */
export function manifestForBase(xml: string, baseUrl: string): string {
  const base = normaliseBaseUrl(baseUrl);
  const origin = new URL(base).origin;
  const out = xml
    .split(DEVELOPMENT_BASE)
    .join(base)
    .replace(/<AppDomain>[^<]*<\/AppDomain>/g, `<AppDomain>${origin}</AppDomain>`);
  if (base !== DEVELOPMENT_BASE && out.includes("localhost:3000")) {
    throw new Error("manifest.xml names https://localhost:3000 in a form the build does not rewrite: write every URL as https://localhost:3000/...");
  }
  return out;
}

/**
 * The built task pane page for an office.js source. The source page loads office.js from the CDN and its
 * Content-Security-Policy allows exactly that origin; the local build points at the copy and allows 'self' only.
 */
export function paneHtmlFor(html: string, source: OfficeJsSource): string {
  if (!html.includes(`src="${OFFICE_JS_CDN}"`)) throw new Error(`taskpane.html must load office.js from ${OFFICE_JS_CDN}`);
  if (source === "cdn") return html;
  const cdnOrigin = new URL(OFFICE_JS_CDN).origin;
  return html.split(`src="${OFFICE_JS_CDN}"`).join(`src="${OFFICE_JS_LOCAL}"`).split(` ${cdnOrigin}`).join("");
}
