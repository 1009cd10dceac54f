/**
 * An element table pasted into the form (or read from a selected range): one
 * element per line, its stresses first (1 column: maximum principal; 3:
 * principal stresses; 6: tensor sxx, syy, szz, sxy, syz, szx) and its volume
 * or area last. Delimiter and decimal mark follow the rules of every input
 * (src/input); a first line with a field of plain text (not number-shaped, no
 * unit, mark or error value) and no value the rules refuse is a header;
 * blank lines and '#' comments are skipped, and every skipped line is named
 * in `notes`. Compressive (negative) stresses are kept, the core counts them
 * as nothing.
 */
import { InputError } from "../../src/errors";
import { contentLines, detectDelimiter, settleDecimalMark, splitRecords } from "../../src/input/delimited-text";
import { explainNotANumber, isSpreadsheetError, looksNumeric, quoteText, readNumber } from "../../src/input/number-text";

export interface ElementTable {
  stresses: number[][];
  columns: 1 | 3 | 6;
  sizes: number[];
}

export class TableError extends Error {}

export function parseElementTable(text: string, options: { decimalComma?: boolean } = {}): ElementTable {
  return readElementTable(text, options).table;
}

/** The table, and the notes for under the field: which lines were skipped. */
export function readElementTable(text: string, options: { decimalComma?: boolean } = {}): { table: ElementTable; notes: string[] } {
  try {
    return read(text, options.decimalComma ? "comma" : "auto");
  } catch (error) {
    if (error instanceof InputError) throw new TableError(error.message.charAt(0).toUpperCase() + error.message.slice(1) + ".");
    throw error;
  }
}

function read(text: string, decimalMark: "comma" | "auto"): { table: ElementTable; notes: string[] } {
  const choice = { allowWhitespace: true, decimalMark };
  const delimiter = detectDelimiter(contentLines(text, true, Number.POSITIVE_INFINITY), choice);
  const all = splitRecords(text, delimiter.delimiter);
  const skipped: string[] = [];
  const records = all.filter((r) => {
    if (r.fields.length === 0) {
      if (r.line <= all[all.length - 1].line) skipped.push(`line ${r.line} (blank)`);
      return false;
    }
    // "#N/A", "#DIV/0!": a spreadsheet's error value where a stress was, not a comment; refused below with its line.
    if (!r.fields[0].quoted && r.fields[0].text.startsWith("#") && !isSpreadsheetError(r.fields[0].text)) {
      skipped.push(`line ${r.line} (comment)`);
      return false;
    }
    return true;
  });
  if (records.length === 0) throw new TableError("Paste the element table: stresses, then the element's volume or area, one element per line.");
  const mark = settleDecimalMark(records, delimiter, choice).decimalMark;
  // A header holds a field that is no number, and every such field is plain text: "1,250", "1 250" or "412 MPa"
  // on the first line is a value the rules refuse below, not a header to skip.
  const readable = records[0].fields.map((f) => readNumber(f.text, mark).ok);
  if (readable.includes(false) && records[0].fields.every((f, k) => readable[k] || (!looksNumeric(f.text) && explainNotANumber(f.text) === null))) {
    skipped.unshift(`line ${records[0].line} (header)`);
    records.shift();
  }
  if (records.length === 0) throw new TableError("The element table has a header but no rows.");
  const first = records[0];
  const width = first.fields.length;
  const columns = width - 1;
  if (columns !== 1 && columns !== 3 && columns !== 6) {
    throw new TableError(`Line ${first.line}: expected 2, 4 or 7 values (1, 3 or 6 stresses and a size), found ${width}.`);
  }
  const stresses: number[][] = [];
  const sizes: number[] = [];
  for (const r of records) {
    const fields = r.fields.length > width && r.fields.slice(width).every((f) => f.text === "") ? r.fields.slice(0, width) : r.fields;
    if (fields.length !== width) throw new TableError(`Line ${r.line}: expected ${width} values like the first row, found ${fields.length}.`);
    const values = fields.map((f) => {
      const v = readNumber(f.text, mark);
      if (!v.ok) throw new TableError(`Line ${r.line}: ${quoteText(f.text)} ${(v.reason === "is not a number" && explainNotANumber(f.text)) || v.reason}.`);
      return v.value;
    });
    const size = values[width - 1];
    if (size < 0) throw new TableError(`Line ${r.line}: the element size is negative.`);
    stresses.push(values.slice(0, columns));
    sizes.push(size);
  }
  const notes = skipped.length > 0 ? [`Skipped ${skipped.join(", ")}.`] : [];
  return { table: { stresses, columns: columns as 1 | 3 | 6, sizes }, notes };
}
