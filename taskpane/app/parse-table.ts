/**
 * An element table pasted into the form (or read from a selected range): one
 * element per line, its stresses first (1 column: maximum principal; 3:
 * principal stresses; 6: tensor sxx, syy, szz, sxy, syz, szx) and its volume
 * or area last. A header line is skipped, blank lines too; compressive
 * (negative) stresses are kept, the core counts them as nothing.
 */
export interface ElementTable {
  stresses: number[][];
  columns: 1 | 3 | 6;
  sizes: number[];
}

export class TableError extends Error {}

const SEPARATOR = /\s*[\t;,]\s*|\s+/;

export function parseElementTable(text: string): ElementTable {
  const lines = text.split(/\r\n|\n|\r/).map((l) => l.trim()).filter((l) => l !== "");
  if (lines.length === 0) throw new TableError("Paste the element table: stresses, then the element's volume or area, one element per line.");
  let offset = 1;
  if (lines[0].split(SEPARATOR).some((t) => !Number.isFinite(Number(t)))) {
    lines.shift();
    offset = 2;
  }
  if (lines.length === 0) throw new TableError("The element table has a header but no rows.");
  const width = lines[0].split(SEPARATOR).length;
  const columns = width - 1;
  if (columns !== 1 && columns !== 3 && columns !== 6) {
    throw new TableError(`Line ${offset}: expected 2, 4 or 7 values (1, 3 or 6 stresses and a size), found ${width}.`);
  }
  const stresses: number[][] = [];
  const sizes: number[] = [];
  lines.forEach((line, i) => {
    const tokens = line.split(SEPARATOR);
    if (tokens.length !== width) throw new TableError(`Line ${i + offset}: expected ${width} values like the first row, found ${tokens.length}.`);
    const values = tokens.map(Number);
    const bad = values.findIndex((v) => !Number.isFinite(v));
    if (bad >= 0) throw new TableError(`Line ${i + offset}: "${tokens[bad]}" is not a number.`);
    const size = values[width - 1];
    if (size < 0) throw new TableError(`Line ${i + offset}: the element size is negative.`);
    stresses.push(values.slice(0, columns));
    sizes.push(size);
  });
  return { stresses, columns: columns as 1 | 3 | 6, sizes };
}
