// Serves dist/ over HTTPS on localhost (PORT, default 3000; HOST, default localhost) for sideloading
// the add-in. Certificates come from office-addin-dev-certs (generateCertificates); on Linux the CA
// is not installed into a trust store: trust it by hand, as printed below, on the machine that runs
// the spreadsheet application.
//
// Every request is hostile until shown otherwise: a path that does not decode is answered 400 and
// the server keeps serving; a path is resolved and compared with path.relative, so nothing outside
// dist/ is served (not a sibling folder whose name starts with "dist", not through a symbolic link);
// every answer carries the page's content security policy, nosniff and no-store as headers.
import { createServer } from "node:https";
import { chmodSync, createReadStream, existsSync, mkdirSync, readFileSync, realpathSync, statSync } from "node:fs";
import { extname, isAbsolute, join, relative, resolve, sep } from "node:path";
import { pathToFileURL } from "node:url";

const TYPES = {
  ".html": "text/html; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".mjs": "text/javascript; charset=utf-8",
  ".css": "text/css; charset=utf-8",
  ".json": "application/json; charset=utf-8",
  ".png": "image/png",
  ".svg": "image/svg+xml",
  ".xml": "application/xml; charset=utf-8",
  ".map": "application/json; charset=utf-8",
};

/** Used when the built page carries no policy of its own. */
export const DEFAULT_CSP = "default-src 'self'; object-src 'none'; base-uri 'self'; form-action 'none'";

/** The policy the built task pane declares in its meta tag, sent as a header too (one policy, one place). */
export function pagePolicy(root) {
  const page = join(root, "taskpane.html");
  if (!existsSync(page)) return DEFAULT_CSP;
  const meta = /<meta\s+http-equiv=["']Content-Security-Policy["']\s+content=(["'])(.*?)\1/i.exec(readFileSync(page, "utf8"));
  return meta ? meta[2] : DEFAULT_CSP;
}

export function securityHeaders(csp) {
  return {
    "content-security-policy": csp,
    "x-content-type-options": "nosniff",
    "cache-control": "no-store",
    "referrer-policy": "no-referrer",
  };
}

/** The request handler: only files under root, GET and HEAD, malformed paths 400. */
export function createHandler(root, csp = pagePolicy(root)) {
  const realRoot = realpathSync(root);
  const headers = securityHeaders(csp);
  const answer = (res, status, text) => {
    res.writeHead(status, { ...headers, "content-type": "text/plain; charset=utf-8" });
    res.end(text);
  };
  return (req, res) => {
    try {
      if (req.method !== "GET" && req.method !== "HEAD") {
        res.setHeader("allow", "GET, HEAD");
        return answer(res, 405, "method not allowed");
      }
      let path;
      try {
        path = decodeURIComponent(new URL(req.url ?? "/", "https://localhost").pathname);
      } catch {
        return answer(res, 400, "bad request");
      }
      if (path.includes("\0")) return answer(res, 400, "bad request");
      const file = resolve(realRoot, "." + sep + (path === "/" ? "taskpane.html" : path));
      if (!inside(realRoot, file) || !existsSync(file)) return answer(res, 404, "not found");
      // A symbolic link inside dist/ may point anywhere: judge where it leads.
      const real = realpathSync(file);
      if (!inside(realRoot, real) || !statSync(real).isFile()) return answer(res, 404, "not found");
      res.writeHead(200, { ...headers, "content-type": TYPES[extname(real).toLowerCase()] ?? "application/octet-stream" });
      if (req.method === "HEAD") return res.end();
      const stream = createReadStream(real);
      stream.on("error", () => res.destroy());
      stream.pipe(res);
    } catch {
      if (!res.headersSent) answer(res, 500, "internal error");
      else res.destroy();
    }
  };
}

function inside(root, file) {
  const rel = relative(root, file);
  return rel === "" || (!rel.startsWith("..") && !isAbsolute(rel));
}

/** Certificates in dir, made once; the private key readable by its owner only. */
export async function ensureCertificates(dir) {
  const ca = join(dir, "ca.crt");
  const cert = join(dir, "localhost.crt");
  const key = join(dir, "localhost.key");
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  if (!existsSync(cert) || !existsSync(key)) {
    const { generateCertificates } = await import("office-addin-dev-certs");
    await generateCertificates(ca, cert, key, 30, ["localhost", "127.0.0.1"]);
  }
  chmodSync(key, 0o600);
  return { ca, cert, key };
}

export function parsePort(text) {
  const port = Number(text);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`PORT must be a whole number from 0 to 65535 (got ${text})`);
  return port;
}

async function run() {
  const root = resolve("dist");
  if (!existsSync(join(root, "taskpane.html"))) {
    console.error("serve: dist/ is missing: run `npm run build` first");
    process.exit(1);
  }
  let port;
  try {
    port = parsePort(process.env.PORT ?? 3000);
  } catch (error) {
    console.error(`serve: ${error.message}`);
    process.exit(1);
  }
  const host = process.env.HOST || "localhost";
  const { ca, cert, key } = await ensureCertificates(resolve(".certs"));
  const server = createServer({ cert: readFileSync(cert), key: readFileSync(key) }, createHandler(root));
  // A malformed request line never reaches the handler: answer it and keep serving.
  server.on("clientError", (_error, socket) => {
    if (socket.writable) socket.end("HTTP/1.1 400 Bad Request\r\nConnection: close\r\n\r\n");
    else socket.destroy();
  });
  server.listen(port, host, () => {
    const actual = server.address().port;
    console.log(`Serving the add-in at https://${host}:${actual}/taskpane.html`);
    console.log("");
    console.log("To try it in a spreadsheet application:");
    console.log(`  1. Trust the development CA ${ca} on the machine running the application`);
    console.log("     (Linux cannot install it here without administrator rights).");
    console.log("  2. Sideload manifest.xml: in the web version, Home > Add-ins > More add-ins > Upload my add-in;");
    console.log("     on desktop, put manifest.xml in a shared-folder catalog and add it under Trusted Add-in Catalogs.");
    console.log("  3. Type =BRITTLE. in a cell to list the functions, or open Design check on the Home tab.");
    console.log("");
    console.log("Press Ctrl+C to stop.");
  });
  const stop = () => {
    server.close(() => process.exit(0));
    server.closeAllConnections();
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) await run();
