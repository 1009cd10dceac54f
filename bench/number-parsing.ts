/**
 * Number parsing alone, for the bench row that shows the element reader's parser apart from
 * everything around it (line and field bookkeeping, batches, the PIA sum, file reading): every
 * field of an in-memory element table, bytes to double, with the reader's own parser
 * (src/size/csv-bytes.ts: fastWholeNumber for the id, fastNumber for the others). Throughput is
 * the table's bytes over that time. The check beside it compares every value with Number() of
 * its text, which ECMAScript requires to round correctly (7.1.4.1.1).
 */
import { COMMA, LF, fastNumber, fastWholeNumber } from "../src/size/csv-bytes";

/** Header line length (through its LF) of a chunk that starts with one, else 0. */
function headerEnd(chunk: Uint8Array): number {
  const first = chunk[0];
  if (first >= 0x30 && first <= 0x39) return 0;
  return chunk.indexOf(LF) + 1;
}

/**
 * Parses every field of the comma-separated chunks (whole lines, LF ends, an optional header
 * line first) into `out`, in order; returns how many. Throws on a field the fast parser leaves
 * to the general path: the bench table has none, so the figure is the fast parser's alone.
 * One call per line, as the reader makes one per row: a single long loop is optimised by V8 on
 * the fly (on-stack replacement) and ran up to 1.7x slower here than the same work per line.
 */
export function parseTableNumbers(chunks: readonly Uint8Array[], out: Float64Array): number {
  let n = 0;
  for (const chunk of chunks) {
    const end = chunk.length;
    let i = headerEnd(chunk);
    while (i < end) {
      const fields = parseLine(chunk, i, end, out, n);
      n += fields;
      i = lineEnd;
    }
  }
  return n;
}

/** Where the last parseLine call stopped: just after its LF (a second result without an allocation). */
let lineEnd = 0;

/** The fields of the line at `start` into out[at...]: the id (a whole number), then decimals. */
function parseLine(buf: Uint8Array, start: number, end: number, out: Float64Array, at: number): number {
  let next = fastWholeNumber(buf, start, end, COMMA, out, at);
  let n = 0;
  for (;;) {
    if (next < 0) throw new Error(`number parsing bench: field ${at + n + 1} left to the general path`);
    n++;
    if (buf[next] === LF) break;
    next = fastNumber(buf, next + 1, end, COMMA, 0x2e, out, at + n);
  }
  lineEnd = next + 1;
  return n;
}

/** How many values differ from Number() of their field's text (0 when all are correctly rounded). */
export function differencesFromNumber(chunks: readonly Uint8Array[], values: Float64Array, count: number): number {
  const decoder = new TextDecoder();
  let n = 0;
  let differ = 0;
  for (const chunk of chunks) {
    const text = decoder.decode(chunk.subarray(headerEnd(chunk)));
    for (const line of text.split("\n")) {
      if (line === "") continue;
      for (const field of line.split(",")) {
        const expected = Number(field);
        // -0 reads as 0 (docs/files-and-formats.md): the same value for this check.
        if (values[n] !== expected) differ++;
        n++;
      }
    }
  }
  if (n !== count) throw new Error(`number parsing bench: ${count} values parsed, ${n} fields in the text`);
  return differ;
}

/**
 * A yardstick for the parser's speed on this machine and runtime: the same bytes through the
 * simplest loop that still looks at every byte and keeps the digits it sees (one load, one
 * compare, one multiply-add a byte; no validation, no decimal point, no conversion to a double,
 * so it is not a parser). One call per line, like parseTableNumbers. Returns a checksum, so the
 * loop cannot be dropped as dead code.
 */
export function digitLoopFloor(chunks: readonly Uint8Array[]): number {
  let check = 0;
  for (const chunk of chunks) {
    const end = chunk.length;
    let i = headerEnd(chunk);
    while (i < end) {
      check ^= digitsOfLine(chunk, i, end);
      i = lineEnd;
    }
  }
  return check;
}

/** The digits of the line at `start` summed as whole numbers; sets lineEnd to just after its LF. */
function digitsOfLine(buf: Uint8Array, start: number, end: number): number {
  let value = 0;
  let sum = 0;
  let i = start;
  for (; i < end; i++) {
    const b = buf[i];
    const d = b - 0x30;
    if (d >>> 0 < 10) value = (value * 10 + d) | 0;
    else if (b === LF) break;
    else {
      sum = (sum + value) | 0;
      value = 0;
    }
  }
  lineEnd = i + 1;
  return (sum + value) | 0;
}
