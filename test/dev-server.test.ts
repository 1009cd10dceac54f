// The development server (`npm start`, scripts/serve.mjs) run for real: a child process on 127.0.0.1
// at a port chosen here (PORT honoured), with certificates it makes itself, answering the requests of
// the hostile corpus (test/fixtures/hostile/server-requests.json), each naming the failure it guards
// against. The test stops the server. Status codes: RFC 9110 (400 bad request, 404 not found, 405).
import { spawn, type ChildProcess } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, statSync, symlinkSync, writeFileSync } from "node:fs";
import { request } from "node:https";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

const REPO = join(import.meta.dirname, "..");
const corpus = JSON.parse(readFileSync(join(import.meta.dirname, "fixtures", "hostile", "server-requests.json"), "utf8"));
const CSP = "default-src 'self'; script-src 'self'; object-src 'none'";

let project: string;
let port: number;
let server: ChildProcess;
let output = "";

/** A port the system has just handed out and released. */
async function freePort(): Promise<number> {
  return new Promise((done, fail) => {
    const probe = createServer();
    probe.once("error", fail);
    probe.listen(0, "127.0.0.1", () => {
      const { port: p } = probe.address() as { port: number };
      probe.close(() => done(p));
    });
  });
}

function get(path: string, method = "GET"): Promise<{ status: number; headers: Record<string, unknown>; body: string }> {
  return new Promise((done, fail) => {
    // The path goes out exactly as written: the request line carries what a hostile client sends.
    const req = request({ host: "127.0.0.1", port, path, method, rejectUnauthorized: false, timeout: 10_000 }, (res) => {
      let body = "";
      res.setEncoding("utf8");
      res.on("data", (chunk) => (body += chunk));
      res.on("end", () => done({ status: res.statusCode ?? 0, headers: res.headers, body }));
    });
    req.on("timeout", () => req.destroy(new Error(`no answer to ${path} within 10 s`)));
    req.on("error", fail);
    req.end();
  });
}

beforeAll(async () => {
  project = mkdtempSync(join(tmpdir(), "brittle-serve-"));
  mkdirSync(join(project, "dist"));
  mkdirSync(join(project, "dist-secret"));
  writeFileSync(join(project, "dist", "taskpane.html"), `<!doctype html><meta http-equiv="Content-Security-Policy" content="${CSP}"><title>pane</title>`);
  writeFileSync(join(project, "dist", "app.js"), "console.log('pane');\n");
  writeFileSync(join(project, "dist-secret", "s.txt"), "secret\n");
  writeFileSync(join(project, "outside.txt"), "outside\n");
  symlinkSync(join(project, "outside.txt"), join(project, "dist", "link-out.txt"));
  port = await freePort();
  server = spawn(process.execPath, [join(REPO, "scripts", "serve.mjs")], {
    cwd: project,
    env: { ...process.env, PORT: String(port), HOST: "127.0.0.1" },
    stdio: ["ignore", "pipe", "pipe"],
  });
  await new Promise<void>((ready, fail) => {
    const timer = setTimeout(() => fail(new Error(`the server did not start within 90 s:\n${output}`)), 90_000);
    const listen = (chunk: Buffer) => {
      output += chunk.toString();
      if (output.includes("Serving the add-in at")) {
        clearTimeout(timer);
        ready();
      }
    };
    server.stdout!.on("data", listen);
    server.stderr!.on("data", (chunk: Buffer) => (output += chunk.toString()));
    server.once("exit", (code) => fail(new Error(`the server exited with ${code}:\n${output}`)));
  });
}, 120_000);

afterAll(async () => {
  if (server && server.exitCode === null) {
    const exited = new Promise((done) => server.once("exit", done));
    server.kill("SIGTERM");
    await exited;
  }
});

describe("development server", () => {
  it("listens on the PORT it is given", () => {
    expect(output).toContain(`Serving the add-in at https://127.0.0.1:${port}/taskpane.html`);
  });

  for (const [i, r] of (corpus.requests as { path: string; method?: string; status: number; guards: string }[]).entries()) {
    it(`${r.method ?? "GET"} ${r.path} -> ${r.status} (${r.guards}) [${i}]`, async () => {
      const res = await get(r.path, r.method);
      expect(res.status).toBe(r.status);
      expect(res.body).not.toContain("secret");
      expect(res.body).not.toContain("outside");
      // Every answer, errors included, carries the policy and the two headers.
      expect(res.headers["content-security-policy"]).toBe(CSP);
      expect(res.headers["x-content-type-options"]).toBe("nosniff");
      expect(res.headers["cache-control"]).toBe("no-store");
      if (r.path === "/app.js") expect(res.headers["content-type"]).toBe("text/javascript; charset=utf-8");
    });
  }

  it("writes the private key readable by its owner only (mode 0600; it was world-readable)", () => {
    expect(statSync(join(project, ".certs", "localhost.key")).mode & 0o777).toBe(0o600);
  });

  it("is still running after the hostile requests", () => {
    expect(server.exitCode).toBeNull();
  });
});
