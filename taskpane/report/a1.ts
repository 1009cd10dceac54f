/** A1 references for the report sheet's layout. */
export function columnLetter(index: number): string {
  let name = "";
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) name = String.fromCharCode(65 + ((n - 1) % 26)) + name;
  return name;
}

/** "B7" for row 6, column 1 (both from 0). */
export function cell(row: number, col: number): string {
  return `${columnLetter(col)}${row + 1}`;
}

export function absolute(row: number, col: number): string {
  return `$${columnLetter(col)}$${row + 1}`;
}

export function rangeAddress(row: number, col: number, rows: number, cols: number): string {
  const start = cell(row, col);
  return rows === 1 && cols === 1 ? start : `${start}:${cell(row + rows - 1, col + cols - 1)}`;
}

export function absoluteRange(row: number, col: number, rows: number, cols = 1): string {
  return `${absolute(row, col)}:${absolute(row + rows - 1, col + cols - 1)}`;
}
