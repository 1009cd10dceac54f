/**
 * Bytes of a file into an element-table reader in chunks, read with
 * positional reads into one reused buffer: no stream machinery, and no fresh
 * memory (page faults, zero-filling) for every chunk. A new buffer is taken
 * only while the reader is still reading ahead, since it keeps those chunks.
 */
import { readSync } from "node:fs";
import type { PartTableReader } from "../src/size/part-stream";

/**
 * Read buffer: fits the processor's second-level cache, where the parser then finds the bytes
 * (a 4 MiB buffer does not). On 2e6 rows in one thread: median 0.79 s against 0.85 s for 4 MiB
 * and 0.83 s for 128 KiB (11 alternating processes each).
 */
export const READ_CHUNK = 256 << 10;

/**
 * Feeds bytes [start, end) of the open file `fd` to `reader`; `onChunk` gets the bytes read so far.
 * `buffer` (optional) is reused for the chunks, so that a caller reading many ranges allocates once.
 */
export function readFileRange(
  fd: number,
  start: number,
  end: number,
  reader: PartTableReader,
  onChunk?: (bytes: number) => void,
  buffer: Uint8Array = new Uint8Array(Math.min(READ_CHUNK, Math.max(1, end - start))),
): void {
  for (let at = start; at < end; ) {
    if (reader.keepsChunks) buffer = new Uint8Array(buffer.length);
    const n = readSync(fd, buffer, 0, Math.min(buffer.length, end - at), at);
    if (n <= 0) break;
    reader.push(n === buffer.length ? buffer : buffer.subarray(0, n));
    at += n;
    onChunk?.(at - start);
  }
}
