// Serves dist/ over HTTPS on localhost:3000 for sideloading the add-in.
// Certificates come from office-addin-dev-certs (generateCertificates); on
// Linux the CA is not installed into a trust store: trust it by hand, as
// printed below, on the machine that runs the spreadsheet application.
import { createServer } from "node:https";
import { existsSync, readFileSync, statSync, createReadStream } from "node:fs";
import { extname, join, normalize, resolve } from "node:path";
import { generateCertificates } from "office-addin-dev-certs";

const port = Number(process.env.PORT ?? 3000);
const root = resolve("dist");
const certDir = resolve(".certs");
const ca = join(certDir, "ca.crt");
const cert = join(certDir, "localhost.crt");
const key = join(certDir, "localhost.key");

if (!existsSync(join(root, "taskpane.html"))) {
  console.error("serve: dist/ is missing: run `npm run build` first");
  process.exit(1);
}
if (!existsSync(cert) || !existsSync(key)) {
  await generateCertificates(ca, cert, key, 30, ["localhost", "127.0.0.1"]);
}

const TYPES = {
  ".html": "text/html; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".css": "text/css; charset=utf-8",
  ".json": "application/json; charset=utf-8",
  ".png": "image/png",
  ".svg": "image/svg+xml",
  ".xml": "application/xml; charset=utf-8",
};

const server = createServer({ cert: readFileSync(cert), key: readFileSync(key) }, (req, res) => {
  const path = decodeURIComponent(new URL(req.url ?? "/", "https://localhost").pathname);
  const file = normalize(join(root, path === "/" ? "taskpane.html" : path));
  if (!file.startsWith(root) || !existsSync(file) || !statSync(file).isFile()) {
    res.writeHead(404, { "content-type": "text/plain" });
    res.end("not found");
    return;
  }
  res.writeHead(200, {
    "content-type": TYPES[extname(file)] ?? "application/octet-stream",
    "cache-control": "no-store",
    "x-content-type-options": "nosniff",
  });
  createReadStream(file).pipe(res);
});

server.listen(port, "localhost", () => {
  console.log(`Serving the add-in at https://localhost:${port}/taskpane.html`);
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
