/**
 * Child processes for `npm run bench`: the command-line rows time whole processes (start-up
 * included), and the in-process python peers live in one long-running python3 process that
 * answers one JSON request per line (bench/peers.py serve).
 */
import { spawn, type ChildProcessWithoutNullStreams } from "node:child_process";
import { createInterface } from "node:readline";
import type { Turn } from "./measure";

/** Runs a command to its end; the time runs from just before the spawn to the exit. Fails on a non-zero exit. */
export function timeProcess(command: string, args: readonly string[]): Promise<Turn<string>> {
  return new Promise((resolve, reject) => {
    const start = performance.now();
    const child = spawn(command, args, { stdio: ["ignore", "pipe", "pipe"] });
    const out: Buffer[] = [];
    const err: Buffer[] = [];
    child.stdout.on("data", (b: Buffer) => out.push(b));
    child.stderr.on("data", (b: Buffer) => err.push(b));
    child.on("error", reject);
    child.on("close", (code) => {
      const seconds = (performance.now() - start) / 1000;
      if (code !== 0) {
        const tail = Buffer.concat(err).toString("utf8").trim().split("\n").slice(-3).join(" | ");
        reject(new Error(`${command} ${args.join(" ")} exited with ${code}: ${tail}`));
        return;
      }
      resolve({ seconds, result: Buffer.concat(out).toString("utf8") });
    });
  });
}

/** The python peers, one request at a time: write a JSON line, read a JSON line back. */
export class PythonPeers {
  private readonly child: ChildProcessWithoutNullStreams;
  private readonly replies: AsyncIterator<string>;
  private stderr = "";

  constructor(workdir: string) {
    this.child = spawn("python3", ["bench/peers.py", "serve", workdir], { stdio: ["pipe", "pipe", "pipe"] });
    this.child.stderr.on("data", (b: Buffer) => (this.stderr = (this.stderr + b.toString("utf8")).slice(-2000)));
    this.replies = createInterface({ input: this.child.stdout })[Symbol.asyncIterator]();
  }

  async ask<T>(request: Record<string, unknown>): Promise<T> {
    this.child.stdin.write(JSON.stringify(request) + "\n");
    const line = await this.replies.next();
    if (line.done) throw new Error(`bench/peers.py stopped: ${this.stderr.trim().split("\n").pop() ?? "no message"}`);
    const reply = JSON.parse(line.value) as T & { error?: string };
    if (reply.error) throw new Error(`bench/peers.py: ${reply.error}`);
    return reply;
  }

  close(): void {
    this.child.stdin.end();
  }
}
