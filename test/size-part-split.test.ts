// A table read in two parts (src/size/part-split.ts, as `brittle part` does on two cores with
// cli/part-parallel.ts) against the same table read by one reader: the same result, to rounding
// in the effective size and shares (the parts sum in another order). The one-reader result is
// itself checked against numpy in test/size-part.test.ts; here it is the reference.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { joinPieces } from "../src/size/part-split";
import { PartTableReader, type PartStreamOptions, type PartStreamResult } from "../src/size/part-stream";
import { relativeError } from "./helpers";

const bytes = (s: string) => new TextEncoder().encode(s);

function lcg(seed: number): () => number {
  return () => (seed = (seed * 16807) % 2147483647) / 2147483647;
}

/** Reads `text` split after the line end nearest `at`: the first part whole, the second continuing. */
function readInTwo(text: string, at: number, options: PartStreamOptions): PartStreamResult {
  const data = bytes(text);
  const middle = data.indexOf(0x0a, at) + 1;
  const head = new PartTableReader(options);
  head.push(data.subarray(0, Math.min(middle, 4096)));
  head.push(data.subarray(Math.min(middle, 4096), middle));
  const settled = head.settled();
  expect(settled).not.toBeNull();
  const first = new PartTableReader(options);
  first.push(data.subarray(0, middle));
  const second = new PartTableReader({ ...options, continueFrom: settled! });
  for (let i = middle; i < data.length; i += 1000) second.push(data.subarray(i, Math.min(data.length, i + 1000)));
  return joinPieces([first.finishPiece(), second.finishPiece()], options.shape, options.top ?? 10, options.materialScale);
}

/**
 * Reads `data` cut at the line starts `cuts`, as the command line's pieces: the first whole (past the 200-line
 * read-ahead that settles the dialect), every later one continuing from what the first settled.
 */
function readInPieces(data: Uint8Array, cuts: number[], options: PartStreamOptions): { joined: PartStreamResult; pieces: number } {
  const bounds = [0, ...cuts, data.length].sort((a, b) => a - b);
  const first = new PartTableReader(options);
  first.push(data.subarray(0, bounds[1]));
  const settled = first.settled();
  expect(settled).not.toBeNull();
  const pieces = [first.finishPiece()];
  for (let k = 1; k + 1 < bounds.length; k++) {
    const reader = new PartTableReader({ ...options, continueFrom: settled! });
    reader.push(data.subarray(bounds[k], bounds[k + 1]));
    pieces.push(reader.finishPiece());
  }
  return { joined: joinPieces(pieces, options.shape, options.top ?? 10, options.materialScale), pieces: pieces.length };
}

/** What a one-reader read and a read in pieces must share: the same elements and lines, the sum to rounding. */
function expectSameTable(joined: PartStreamResult, whole: PartStreamResult): void {
  expect(joined.rows).toBe(whole.rows);
  expect(joined.skipped).toEqual(whole.skipped); // header, comment and blank lines keep their file line numbers
  expect([joined.peak, joined.peakLine, joined.peakId, joined.decimalMark]).toEqual([whole.peak, whole.peakLine, whole.peakId, whole.decimalMark]);
  expect(relativeError(joined.effectiveSize, whole.effectiveSize)).toBeLessThan(1e-14);
  expect(joined.hotSpots.map((h) => [h.id, h.line])).toEqual(whole.hotSpots.map((h) => [h.id, h.line]));
}

function readWhole(text: string, options: PartStreamOptions): PartStreamResult {
  const reader = new PartTableReader(options);
  reader.push(bytes(text));
  return reader.finish();
}

describe("an element table read in two parts", () => {
  const rnd = lcg(41);
  const lines = ["# invented table", "elem,s1,s2,s3,vol"];
  for (let r = 0; r < 3000; r++) {
    const load = 300 * rnd() ** 4;
    lines.push(`${r + 1},${load},${load * (rnd() - 0.3)},${-load * rnd()},${0.01 * 10 ** (2 * rnd())}`);
    if (r === 2100) lines.push("", "# a comment in the second half");
  }
  const text = lines.join("\n") + "\n";

  it("gives the one-reader result: rows, skipped lines, peak, effective size, failure probability, hot spots", () => {
    const options: PartStreamOptions = { shape: 10, top: 7, materialScale: 500 };
    const whole = readWhole(text, options);
    for (const at of [text.length / 3, text.length / 2, (3 * text.length) / 4]) {
      const split = readInTwo(text, Math.floor(at), options);
      expect(split.rows).toBe(whole.rows);
      expect(split.skippedLines).toBe(whole.skippedLines);
      expect(split.skipped).toEqual(whole.skipped);
      expect(split.peak).toBe(whole.peak);
      expect(split.peakLine).toBe(whole.peakLine);
      expect(split.peakId).toBe(whole.peakId);
      expect(relativeError(split.effectiveSize, whole.effectiveSize)).toBeLessThan(1e-14);
      expect(relativeError(split.failureProbability!, whole.failureProbability!)).toBeLessThan(1e-13);
      expect(split.hotSpots.map((h) => [h.id, h.line, h.principal, h.size])).toEqual(whole.hotSpots.map((h) => [h.id, h.line, h.principal, h.size]));
      split.hotSpots.forEach((h, k) => expect(Math.abs(h.share - whole.hotSpots[k].share)).toBeLessThan(1e-14));
      expect({ ...split, effectiveSize: 0, failureProbability: 0, risk: 0, hotSpots: [] }).toEqual({
        ...whole,
        effectiveSize: 0,
        failureProbability: 0,
        risk: 0,
        hotSpots: [],
      });
    }
  });

  it("many pieces, as `brittle part` cuts a large file (some starting on a blank or comment line), join to the one-reader result", () => {
    const options: PartStreamOptions = { shape: 12, top: 5 };
    const data = bytes(text);
    const cutAt = (from: number) => data.indexOf(0x0a, from) + 1;
    const blank = text.indexOf("\n\n# a comment") + 1; // the blank line's start: a piece may begin there
    const bounds = [...[0.1, 0.2, 0.21, 0.5, 0.69].map((f) => cutAt(Math.floor(f * data.length))), blank, cutAt(blank + 1)];
    const { joined, pieces } = readInPieces(data, bounds, options);
    expect(pieces).toBe(8);
    expectSameTable(joined, readWhole(text, options));
  });

  it("a hostile-corpus dialect (semicolons, decimal commas, an exponent, CRLF) is read alike in pieces", () => {
    // The data lines of test/fixtures/hostile/part-european.csv, renumbered and repeated to 1,500 elements with CRLF
    // line ends: later pieces must read "1,005E+02" as 100.5 with the mark the beginning settled.
    const corpus = readFileSync("test/fixtures/hostile/part-european.csv", "utf8").split("\n");
    const rows = corpus.filter((l) => /^\d+;/.test(l));
    const lines = ["# repeated from the hostile corpus", corpus[1]];
    for (let k = 0; k < 500; k++) rows.forEach((row, j) => lines.push(row.replace(/^\d+/, String(3 * k + j + 1))));
    const table = lines.join("\r\n") + "\r\n";
    const data = bytes(table);
    const options: PartStreamOptions = { shape: 8, top: 4 };
    const whole = readWhole(table, options);
    expect(whole.decimalMark).toBe("comma");
    expect(whole.peak).toBe(250);
    const bounds = [0.3, 0.55, 0.8].map((f) => data.indexOf(0x0a, Math.floor(f * data.length)) + 1);
    expectSameTable(readInPieces(data, bounds, options).joined, whole);
  });

  it("a beginning that leaves the decimal mark open is not settled (the file is then read in one pass)", () => {
    const reader = new PartTableReader({ shape: 10 });
    reader.push(bytes("s;vol\n100;1\n200;2\n"));
    reader.finish();
    expect(reader.settled()).toBeNull(); // semicolons and whole numbers: the mark is still open
    const utf16 = new PartTableReader({ shape: 10 });
    utf16.push(new Uint8Array([0xff, 0xfe, ...Array.from(bytes("s,vol\n1.5,1\n")).flatMap((b) => [b, 0])]));
    utf16.finish();
    expect(utf16.settled()).toBeNull(); // UTF-16: a later part could not be read on its own
  });
});

describe("a listing's text at a cut between pieces (common practice, no source: the one-reader read is the reference)", () => {
  // Invented table: 300 elements, a summary title and its row, then 10 more elements.
  const rows = Array.from({ length: 300 }, (_, i) => `${i + 1},${100 + (i % 50)},1`);
  const after = Array.from({ length: 10 }, (_, i) => `${301 + i},120,1`);
  const text = ["ELEM,S1,VOL", ...rows, "MINIMUM VALUES", "VALUE,-40,1", ...after].join("\n") + "\n";
  const data = bytes(text);
  const cut = data.indexOf(0x0a, text.indexOf("MINIMUM VALUES")) + 1;

  it("one reader stops at the text among the elements", () => {
    const one = new PartTableReader({ shape: 8 });
    expect(() => {
      one.push(data);
      one.finish();
    }).toThrow(/^line 302 \("MINIMUM VALUES"\) is no element, and rows follow it \(line 304\)/);
  });

  it("the piece ending on the title and the piece starting with the summary row both fail, so the file is read again by one reader (the title was skipped and VALUE summed as an element)", () => {
    const first = new PartTableReader({ shape: 8 });
    first.push(data.subarray(0, cut));
    const settled = first.settled();
    expect(settled).not.toBeNull();
    expect(() => first.finishPiece()).toThrow(/^line 302 \("MINIMUM VALUES"\) is no element/);
    const second = new PartTableReader({ shape: 8, continueFrom: settled! });
    expect(() => {
      second.push(data.subarray(cut));
      second.finishPiece();
    }).toThrow(/^line 1: the id field 1 \("VALUE"\) is a word where the ids before it were numbers/);
  });
});
