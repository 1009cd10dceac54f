/**
 * Seeded, invented data for `npm run bench`: float64 files for the in-process python peers
 * (bench/peers.py), and the CSV files both command-line sides read, so every side works on
 * the very same numbers.
 */
import { closeSync, openSync, writeFileSync, writeSync } from "node:fs";
import { join } from "node:path";
import { SeededRandom } from "../src/numeric/random";

/** A Weibull sample: modulus 10, characteristic strength 400 (an invented material). */
export function weibullSample(n: number, seed: number): Float64Array {
  const random = new SeededRandom(seed);
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = 400 * random.exponential() ** (1 / 10);
  return x;
}

/**
 * An invented element table: 2^20 elements with three principal stresses
 * (a tensile peak region, most of the part lightly loaded or in compression)
 * and element volumes spread over two decades.
 */
export function elementTable(rows: number, seed: number): { principal: Float64Array; sizes: Float64Array } {
  const random = new SeededRandom(seed);
  const principal = new Float64Array(rows * 3);
  const sizes = new Float64Array(rows);
  for (let r = 0; r < rows; r++) {
    const load = 300 * random.uniform() ** 4;
    principal[3 * r] = load;
    principal[3 * r + 1] = load * (random.uniform() - 0.3);
    principal[3 * r + 2] = -load * random.uniform();
    sizes[r] = 0.01 * 10 ** (2 * random.uniform());
  }
  return { principal, sizes };
}

export function writeFloat64(dir: string, name: string, values: Float64Array): string {
  writeFileSync(join(dir, name), Buffer.from(values.buffer, values.byteOffset, values.byteLength));
  return name;
}

/**
 * The element table as the CSV a finite-element post-processor writes: elem,s1,s2,s3,ivol.
 * `digits` significant digits per value (post-processors typically write 6 to 8); omitted, every
 * double in full (up to 17 digits), the slowest case for a parser.
 */
export function elementCsv(principal: Float64Array, sizes: Float64Array, digits?: number): Uint8Array[] {
  const f = (x: number) => (digits ? x.toExponential(digits - 1) : String(x));
  const chunks: Uint8Array[] = [Buffer.from("elem,s1,s2,s3,ivol\n")];
  const encoder = new TextEncoder();
  let lines: string[] = [];
  for (let r = 0; r < sizes.length; r++) {
    lines.push(`${r + 1},${f(principal[3 * r])},${f(principal[3 * r + 1])},${f(principal[3 * r + 2])},${f(sizes[r])}`);
    if (lines.length === 65536 || r === sizes.length - 1) {
      chunks.push(encoder.encode(lines.join("\n") + "\n"));
      lines = [];
    }
  }
  return chunks;
}

/** Writes the element table CSV (see `elementCsv`) to a file, chunk by chunk; returns its size in bytes. */
export function writeElementCsv(file: string, principal: Float64Array, sizes: Float64Array, digits?: number): number {
  const fd = openSync(file, "w");
  let bytes = 0;
  try {
    for (const chunk of elementCsv(principal, sizes, digits)) bytes += writeSync(fd, chunk);
  } finally {
    closeSync(fd);
  }
  return bytes;
}

/** Spreadsheet column name of a 1-based column number: 1 -> A, 30 -> AD. */
export function columnName(column: number): string {
  let name = "";
  for (let c = column; c > 0; c = Math.floor((c - 1) / 26)) name = String.fromCharCode(65 + ((c - 1) % 26)) + name;
  return name;
}

/**
 * A strength sheet as a lab keeps it: a header line, then one specimen set per line (strengths in
 * MPa to 0.1 MPa), each followed by its formula cells over the line's own range. The modulus is
 * the maximum-likelihood value without unbiasing ("MLE-RAW"), the quantity the numpy peer solves;
 * the characteristic strength is the same with or without it.
 */
export function strengthSheet(sets: readonly Float64Array[], formulas: readonly ("modulus" | "charstrength")[]): string {
  const columns = sets[0].length;
  const header = [...Array.from({ length: columns }, (_, i) => `s${i + 1}`), ...formulas.map((f) => (f === "modulus" ? "modulus" : "characteristic_strength"))];
  const lines = [header.join(",")];
  sets.forEach((set, i) => {
    if (set.length !== columns) throw new Error("strengthSheet: every set needs the same number of specimens");
    const range = `A${i + 2}:${columnName(columns)}${i + 2}`;
    const cells = Array.from(set, (x) => x.toFixed(1));
    for (const f of formulas) cells.push(f === "modulus" ? `"=BRITTLE.MODULUS(${range},,""MLE-RAW"")"` : `=BRITTLE.CHARSTRENGTH(${range})`);
    lines.push(cells.join(","));
  });
  return lines.join("\n") + "\n";
}
