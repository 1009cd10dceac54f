/**
 * `brittle part` on a large file with two threads, the default where a
 * second processor is available (BRITTLE_THREADS=1 asks for one thread).
 *
 * The file is cut into pieces of about PIECE_BYTES, each starting just after
 * a line end, and the main thread and one worker take pieces in turn from a
 * shared counter until none is left; src/size/part-split.ts joins the pieces
 * in file order. Taking small pieces from a counter, rather than a half
 * each, keeps both threads busy to the end however they are slowed: the
 * worker starts some tens of milliseconds late (a second runtime booting),
 * and on a shared machine either thread may be held up at any time. The
 * worker is started first of all, so that its start overlaps the reading of
 * the beginning.
 *
 * Used only where it is safe: a file (not standard input) of at least
 * PARALLEL_MIN_BYTES, the compiled command line (a worker loads this same
 * compiled module; under the TypeScript test runner it could not), at least
 * two processors, and a beginning that settles everything a later piece
 * needs (UTF-8, LF or CRLF line ends, a settled decimal mark). Any error in
 * any piece, or a worker that fails, sends the whole file through one reader
 * instead, so messages and line numbers are exactly those of a sequential
 * read. Progress counts the rows and bytes of both threads.
 */
import { closeSync, openSync, readSync } from "node:fs";
import { READ_CHUNK, readFileRange } from "./read-file-range";
import { availableParallelism } from "node:os";
import { Worker, isMainThread, parentPort, workerData } from "node:worker_threads";
import { joinPieces } from "../src/size/part-split";
import { type PartStreamOptions, type PartStreamResult, PartTableReader, type SettledTable, type TablePiece } from "../src/size/part-stream";

/** Below this size a worker's start-up (tens of milliseconds) costs more than the second thread saves. */
export const PARALLEL_MIN_BYTES = 32 << 20;
/** The beginning is read in small steps: the dialect settles within the first few hundred lines. */
const HEAD_CHUNK = 256 << 10;
/** About this much per piece: small enough that the threads finish within a few milliseconds of each other. */
const PIECE_BYTES = 4 << 20;
/** A piece boundary is the first line end this far past its nominal place (a longer line: one pass instead). */
const BOUNDARY_WINDOW = 64 << 10;

const WORKER_KIND = "brittle-part-pieces";
/** Slots of the shared control array: the next piece to take, and whether any piece failed. */
const NEXT = 0;
const FAILED = 1;

interface PiecesJob {
  file: string;
  /** Piece k is bytes [bounds[k], bounds[k + 1]). */
  bounds: number[];
  /** Options of every piece after the first (which the main thread reads with the caller's). */
  later: PartStreamOptions;
  /** Int32Array [next piece, failed]. */
  control: SharedArrayBuffer;
  /** Float64Array [bytes, rows] the worker has read so far (for progress). */
  progress: SharedArrayBuffer;
}

type PiecesReply = { ok: true; pieces: [number, TablePiece][] } | { ok: false };

/** Whether this run can use a worker at all. */
export function parallelAvailable(file: string, size: number | null): boolean {
  return (
    file !== "-" &&
    size !== null &&
    size >= PARALLEL_MIN_BYTES &&
    process.env.BRITTLE_THREADS !== "1" &&
    /\.m?js$/.test(new URL(import.meta.url).pathname) &&
    availableParallelism() >= 2
  );
}

/** The byte just after the first LF at or after `from` (within the window), or -1. */
function lineStartAfter(fd: number, from: number, size: number, window: Uint8Array): number {
  const n = readSync(fd, window, 0, Math.min(window.length, size - from), from);
  const lf = window.subarray(0, n).indexOf(0x0a);
  return lf < 0 ? -1 : from + lf + 1;
}

/**
 * Piece boundaries: 0, then line starts near every PIECE_BYTES from `firstEnd` on, then size;
 * null if a line end is not found near one.
 */
function pieceBounds(fd: number, size: number, firstEnd: number): number[] | null {
  const count = Math.max(2, Math.round((size - firstEnd) / PIECE_BYTES));
  const bounds = [0];
  const window = new Uint8Array(BOUNDARY_WINDOW);
  for (let k = 0; k < count; k++) {
    const from = Math.max(firstEnd + Math.floor((k * (size - firstEnd)) / count), bounds[bounds.length - 1]);
    const at = lineStartAfter(fd, from, size, window);
    if (at < 0) return null;
    if (at > bounds[bounds.length - 1] && at < size) bounds.push(at);
  }
  bounds.push(size);
  return bounds.length >= 3 ? bounds : null;
}

/**
 * Takes pieces from the shared counter and reads them until none is left (true) or a piece
 * fails here or in the other thread (false). `progress` gets this thread's bytes and rows so far,
 * counted from `bytesDone` and `rowsDone`.
 */
function readPieces(
  job: PiecesJob,
  taken: [number, TablePiece][],
  progress: (bytes: number, rows: number) => void,
  bytesDone = 0,
  rowsDone = 0,
): boolean {
  const control = new Int32Array(job.control);
  const pieces = job.bounds.length - 1;
  const buffer = new Uint8Array(READ_CHUNK);
  const fd = openSync(job.file, "r");
  try {
    for (;;) {
      if (Atomics.load(control, FAILED) !== 0) return false;
      const k = Atomics.add(control, NEXT, 1);
      if (k >= pieces) return true;
      const reader = new PartTableReader(job.later);
      try {
        readFileRange(fd, job.bounds[k], job.bounds[k + 1], reader, (bytes) => progress(bytesDone + bytes, rowsDone + reader.rows), buffer);
        taken.push([k, reader.finishPiece()]);
      } catch {
        Atomics.store(control, FAILED, 1);
        return false;
      }
      bytesDone += job.bounds[k + 1] - job.bounds[k];
      rowsDone += reader.rows;
    }
  } finally {
    closeSync(fd);
  }
}

/**
 * Reads the file on two threads; null where it cannot (the caller then reads it in one pass,
 * which also reports any error).
 */
export async function readPartFileInParallel(
  file: string,
  size: number,
  options: PartStreamOptions,
  onProgress?: (rows: number, bytes: number, totalBytes: number) => void,
): Promise<PartStreamResult | null> {
  // First of all, so that the worker boots while this thread reads the beginning.
  const worker = new Worker(new URL(import.meta.url), { workerData: { kind: WORKER_KIND } });
  const reply = new Promise<PiecesReply>((resolve) => {
    worker.once("message", (message: PiecesReply) => resolve(message));
    worker.once("error", () => resolve({ ok: false }));
    worker.once("exit", () => resolve({ ok: false }));
  });
  try {
    // Piece 0 is this thread's: its reader settles the dialect and columns a later piece needs
    // from the beginning, then the worker is given the job, then piece 0 is read to its end.
    const first = new PartTableReader(options);
    const mine: [number, TablePiece][] = [];
    const progress = new SharedArrayBuffer(2 * Float64Array.BYTES_PER_ELEMENT);
    const theirs = new Float64Array(progress);
    const report = (bytes: number, rows: number) => onProgress?.(rows + theirs[1], bytes + theirs[0], size);
    let job: PiecesJob;
    const fd = openSync(file, "r");
    try {
      let settled: SettledTable | null = null;
      let headEnd = 0;
      try {
        while (settled === null && headEnd < Math.min(size / 4, 16 << 20)) {
          const next = Math.min(size, headEnd + HEAD_CHUNK);
          readFileRange(fd, headEnd, next, first);
          headEnd = next;
          settled = first.settled();
        }
      } catch {
        return null; // a bad line near the start: the one-pass read reports it
      }
      if (settled === null) return null;
      const bounds = pieceBounds(fd, size, headEnd);
      if (bounds === null) return null;
      job = { file, bounds, later: { ...options, continueFrom: settled }, control: new SharedArrayBuffer(2 * Int32Array.BYTES_PER_ELEMENT), progress };
      new Int32Array(job.control)[NEXT] = 1;
      worker.postMessage(job);
      try {
        readFileRange(fd, headEnd, bounds[1], first, (bytes) => report(headEnd + bytes, first.rows));
        mine.push([0, first.finishPiece()]);
      } catch {
        Atomics.store(new Int32Array(job.control), FAILED, 1);
        return null;
      }
    } finally {
      closeSync(fd);
    }
    if (!readPieces(job, mine, report, job.bounds[1], first.rows)) return null;
    const pieces = job.bounds.length - 1;
    // Every piece read here (the worker was slow to start, or failed to): no need to wait for it.
    const all = mine.length === pieces ? mine : [...mine, ...(await reply.then((r) => (r.ok ? r.pieces : [])))];
    if (all.length !== pieces) return null;
    all.sort((a, b) => a[0] - b[0]);
    return joinPieces(
      all.map(([, piece]) => piece),
      options.shape,
      Math.max(0, Math.floor(options.top ?? 10)),
      options.materialScale,
    );
  } finally {
    await worker.terminate();
  }
}

/** In the worker: wait for the job, read pieces until none is left, post them back. */
function serveJob(): void {
  parentPort?.once("message", (job: PiecesJob) => {
    const progress = new Float64Array(job.progress);
    const taken: [number, TablePiece][] = [];
    let reply: PiecesReply;
    try {
      const ok = readPieces(job, taken, (bytes, rows) => {
        progress[0] = bytes;
        progress[1] = rows;
      });
      reply = ok ? { ok: true, pieces: taken } : { ok: false };
    } catch {
      reply = { ok: false };
    }
    parentPort?.postMessage(reply);
  });
}

if (!isMainThread && (workerData as { kind?: string } | null)?.kind === WORKER_KIND) serveJob();
