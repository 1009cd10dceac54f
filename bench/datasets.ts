/**
 * Seeded data for `npm run bench`, written as little-endian float64 files so
 * the python peers (bench/peers.py) read the very same numbers.
 */
import { writeFileSync } from "node:fs";
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
