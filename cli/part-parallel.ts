/**
 * `brittle part` on a large file with two threads, when asked for with
 * BRITTLE_THREADS=2 in the environment: the first half of the file is read
 * on the main thread while a worker reads the second half (split just after
 * a line end), and src/size/part-split.ts joins the two.
 *
 * Not the default, as measured: on a two-core machine shared with other
 * work (load average about 8), two threads took about 0.3 s more processor
 * time than one on a 171 MB table (a second isolate loading and warming up
 * the same code, the beginning read twice) and were no faster by the clock.
 * With cores to spare it halves the parsing time.
 *
 * Used only where it is safe: a file (not standard input) of at least
 * PARALLEL_MIN_BYTES, the compiled command line (a worker loads this same
 * compiled module; under the TypeScript test runner it could not), at least
 * two processors, and a beginning that settles everything a second reader
 * needs (UTF-8, LF or CRLF line ends, a settled decimal mark). Any error in
 * either half, or an empty half, sends the whole file through one reader
 * instead, so messages and line numbers are exactly those of a sequential
 * read.
 */
import { closeSync, openSync, readSync } from "node:fs";
import { readFileRange } from "./read-file-range";
import { availableParallelism } from "node:os";
import { Worker, isMainThread, parentPort, workerData } from "node:worker_threads";
import { joinPieces } from "../src/size/part-split";
import { type PartStreamOptions, type PartStreamResult, PartTableReader, type SettledTable, type TablePiece } from "../src/size/part-stream";

/** Below this size a worker's start-up (tens of milliseconds) costs more than half the parse saves. */
export const PARALLEL_MIN_BYTES = 32 << 20;
/** The beginning is read in small steps: the dialect settles within the first few hundred lines. */
const HEAD_CHUNK = 256 << 10;
/** How far past the middle a line end is looked for. */
const SPLIT_WINDOW = 1 << 20;

interface PieceJob {
  kind: "brittle-part-piece";
  file: string;
  start: number;
  end: number;
  options: PartStreamOptions;
}

type PieceReply = { ok: true; piece: TablePiece } | { ok: false };

/** The byte just after the first LF at or after `from` (within the window), or -1. */
function lineStartAfter(fd: number, from: number, size: number): number {
  const window = new Uint8Array(Math.min(SPLIT_WINDOW, size - from));
  const n = readSync(fd, window, 0, window.length, from);
  const lf = window.subarray(0, n).indexOf(0x0a);
  return lf < 0 ? -1 : from + lf + 1;
}

/** Whether this run can use a worker at all. */
export function parallelAvailable(file: string, size: number | null): boolean {
  return (
    file !== "-" &&
    size !== null &&
    size >= PARALLEL_MIN_BYTES &&
    process.env.BRITTLE_THREADS === "2" &&
    /\.m?js$/.test(new URL(import.meta.url).pathname) &&
    availableParallelism() >= 2
  );
}

/**
 * Reads the file in two halves at once; null where it cannot (the caller
 * then reads it in one pass, which also reports any error).
 */
export async function readPartFileInHalves(file: string, size: number, options: PartStreamOptions): Promise<PartStreamResult | null> {
  const fd = openSync(file, "r");
  try {
    // The beginning, read once to learn what the second reader needs.
    const head = new PartTableReader(options);
    let headEnd = 0;
    let settled: SettledTable | null = null;
    try {
      while (settled === null && headEnd < Math.min(size / 4, 16 << 20)) {
        const next = Math.min(size, headEnd + HEAD_CHUNK);
        readFileRange(fd, headEnd, next, head);
        headEnd = next;
        settled = head.settled();
      }
    } catch {
      return null; // a bad line near the start: the one-pass read reports it
    }
    if (settled === null) return null;
    const middle = lineStartAfter(fd, Math.floor(size / 2), size);
    if (middle < 0) return null;
    const job: PieceJob = { kind: "brittle-part-piece", file, start: middle, end: size, options: { ...options, continueFrom: settled } };
    const worker = new Worker(new URL(import.meta.url), { workerData: job });
    const second = new Promise<PieceReply>((resolve) => {
      worker.once("message", (reply: PieceReply) => resolve(reply));
      worker.once("error", () => resolve({ ok: false }));
      worker.once("exit", () => resolve({ ok: false }));
    });
    let first: TablePiece | null = null;
    try {
      const reader = new PartTableReader(options);
      readFileRange(fd, 0, middle, reader);
      first = reader.finishPiece();
    } catch {
      first = null;
    }
    const reply = await second;
    await worker.terminate();
    if (first === null || !reply.ok) return null;
    return joinPieces([first, reply.piece], options.shape, Math.max(0, Math.floor(options.top ?? 10)), options.materialScale);
  } finally {
    closeSync(fd);
  }
}

/** In a worker: read the part named in workerData and post it back (or that it failed). */
function runPieceJob(job: PieceJob): void {
  let reply: PieceReply;
  try {
    const fd = openSync(job.file, "r");
    try {
      const reader = new PartTableReader(job.options);
      readFileRange(fd, job.start, job.end, reader);
      reply = { ok: true, piece: reader.finishPiece() };
    } finally {
      closeSync(fd);
    }
  } catch {
    reply = { ok: false };
  }
  parentPort?.postMessage(reply);
}

if (!isMainThread && (workerData as PieceJob | null)?.kind === "brittle-part-piece") runPieceJob(workerData as PieceJob);
