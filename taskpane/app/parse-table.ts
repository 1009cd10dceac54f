/**
 * An element table pasted into the form (or read from a selected range): one
 * element per line. Without a header: its stresses first (1 column: maximum
 * principal; 3: principal stresses; 6: tensor sxx, syy, szz, sxy, syz, szx)
 * and its volume or area last. With a header, the columns are found by their
 * names as `brittle part` finds them (src/size/part-columns.ts): any order,
 * extra columns ignored, 2-D tensors, units written in the names (which must
 * agree with the form's units), and an id column whose repeats (rows of
 * integration-point or nodal output) are refused. Delimiter and decimal mark
 * follow the rules of every input (src/input); a first line with a field of
 * plain text (not number-shaped, no mark or error value; a name may carry a
 * unit, "S1 (MPa)") and no value the rules refuse is a header; blank lines
 * and '#' comments are skipped, and every skipped line is named in `notes`.
 * Compressive (negative) stresses are kept, the core counts them as nothing.
 */
import { InputError } from "../../src/errors";
import { contentLines, detectDelimiter, settleDecimalMark, splitRecords } from "../../src/input/delimited-text";
import { explainNotANumber, looksNumeric, quoteText, readNumber } from "../../src/input/number-text";
import { isComment } from "../../src/input/read-table";
import { type ResolvedColumns, resolveColumns, sameUnit, splitUnit, withUnitsJoined } from "../../src/size/part-columns";
import { fortranReason } from "../../src/input/fortran-fields";

export interface ElementTable {
  stresses: number[][];
  columns: 1 | 3 | 6;
  sizes: number[];
}

export class TableError extends Error {}

export interface TableOptions {
  decimalComma?: boolean;
  /** The form's stress and size units: a unit written in the header must be the same. */
  stressUnit?: string;
  sizeUnit?: string;
}

export function parseElementTable(text: string, options: TableOptions = {}): ElementTable {
  return readElementTable(text, options).table;
}

/** The table, and the notes for under the field: which lines were skipped, which columns were read. */
export function readElementTable(text: string, options: TableOptions = {}): { table: ElementTable; notes: string[] } {
  try {
    return read(text, options.decimalComma ? "comma" : "auto", options);
  } catch (error) {
    if (error instanceof InputError) {
      // The shared column rules speak of the command line's options; here a header names the columns.
      const message = error.message
        .replace(/; name (them|it) with --\w+/, "; name the columns in the header as docs/files-and-formats.md lists them")
        .replace(/; if (each row's size|the size column holds each point's own share)[^;]*--integration-points/, "")
        .replace(", or choose the columns with --stress, --size and --id", "");
      throw new TableError(message.charAt(0).toUpperCase() + message.slice(1) + ".");
    }
    throw error;
  }
}

function read(text: string, decimalMark: "comma" | "auto", options: TableOptions): { table: ElementTable; notes: string[] } {
  const choice = { allowWhitespace: true, decimalMark };
  const delimiter = detectDelimiter(contentLines(text, true, Number.POSITIVE_INFINITY), choice);
  const all = splitRecords(text, delimiter.delimiter);
  const skipped: string[] = [];
  const records = all.filter((r) => {
    if (r.fields.length === 0) {
      if (r.line <= all[all.length - 1].line) skipped.push(`line ${r.line} (blank)`);
      return false;
    }
    // "#N/A", "#DIV/0!" are no comment (isComment): a spreadsheet's error value where a stress was, refused below with its line.
    if (isComment(r)) {
      skipped.push(`line ${r.line} (comment)`);
      return false;
    }
    return true;
  });
  if (records.length === 0) throw new TableError("Paste the element table: stresses, then the element's volume or area, one element per line.");
  const mark = settleDecimalMark(records, delimiter, choice).decimalMark;
  // A header holds a field that is no number, and every such field is plain text (a name, perhaps with its unit:
  // "S1 (MPa)"): "1,250", "1 250" or "412 MPa" on the first line is a value the rules refuse below, not a header to skip.
  // Blank-separated: a unit in brackets after a name ("S1 (MPa)") is a field of its own there.
  const split = records[0].fields.map((f) => f.text);
  const names = delimiter.delimiter === "space" ? withUnitsJoined(split) : split;
  const readable = names.map((t) => readNumber(t, mark).ok);
  let byPosition: string | null = null;
  if (readable.includes(false) && names.every((t, k) => readable[k] || isColumnName(t))) {
    const header = names;
    // In line order: comments and blank lines may come before the header.
    skipped.splice(skipped.filter((t) => Number(/\d+/.exec(t)![0]) < records[0].line).length, 0, `line ${records[0].line} (header)`);
    records.shift();
    if (records.length === 0) throw new TableError("The element table has a header but no rows.");
    const columns = byNames(header);
    if (columns !== null) return readByHeader(header, columns, records, mark, skipped, options, delimiter.delimiter === "space");
    byPosition = `No column names recognised in the header (${header.join(", ")}): read by position, stresses first, size last.`;
  }
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
      if (!v.ok) throw new TableError(`Line ${r.line}: ${quoteText(f.text)} ${whyNot(f.text, v.reason)}.`);
      return v.value;
    });
    const size = values[width - 1];
    if (size < 0) throw new TableError(`Line ${r.line}: the element size is negative.`);
    stresses.push(values.slice(0, columns));
    sizes.push(size);
  }
  const notes = [...(skipped.length > 0 ? [`Skipped ${skipped.join(", ")}.`] : []), ...(byPosition ? [byPosition] : [])];
  return { table: { stresses, columns: columns as 1 | 3 | 6, sizes }, notes };
}

type Records = ReturnType<typeof splitRecords>;

/** Why a field is no number, in the words the shared rules and the Fortran-style fields give. */
function whyNot(text: string, reason: string): string {
  return reason === "is not a number" ? (fortranReason(text) ?? explainNotANumber(text) ?? reason) : reason;
}

/** Plain text, or plain text with a unit after it ("S1 (MPa)", "IVOL [mm^3]"): a column name, not a value. */
function isColumnName(text: string): boolean {
  const plain = (t: string) => !looksNumeric(t) && explainNotANumber(t) === null;
  if (plain(text)) return true;
  const { name, unit } = splitUnit(text);
  return unit !== null && plain(name);
}

/** The columns a header names, or null when it names no stress or no size column (then read by position, as before). */
function byNames(header: string[]): ResolvedColumns | null {
  try {
    return resolveColumns(header, header.length);
  } catch (error) {
    if (error instanceof InputError && /^no (stress|size) column/.test(error.message)) return null;
    throw error;
  }
}

/** A table whose header names its columns: read by those names, as `brittle part` reads it. */
function readByHeader(
  header: string[],
  columns: ResolvedColumns,
  records: Records,
  mark: ReturnType<typeof settleDecimalMark>["decimalMark"],
  skipped: string[],
  options: TableOptions,
  blankSeparated: boolean,
): { table: ElementTable; notes: string[] } {
  const { stress: stressUnit, size: sizeUnit } = columns.units;
  if (stressUnit !== null && options.stressUnit !== undefined && !sameUnit(stressUnit, options.stressUnit)) {
    throw new TableError(`The header gives the stresses in ${stressUnit}, but the stress unit of this check is ${options.stressUnit}: convert the table, or set the stress unit to ${stressUnit}.`);
  }
  if (sizeUnit !== null && options.sizeUnit !== undefined && !sameUnit(sizeUnit, options.sizeUnit)) {
    throw new TableError(`The header gives the sizes in ${sizeUnit}, but the size unit of this check is ${options.sizeUnit}: choose ${sizeUnit} as the size unit, or convert the table.`);
  }
  const width = header.length;
  const stresses: number[][] = [];
  const sizes: number[] = [];
  let previousId: string | null = null;
  let previousLine = 0;
  const value = (r: Records[number], k: number): number => {
    const f = r.fields[k];
    const v = readNumber(f.text, mark);
    if (!v.ok) throw new TableError(`Line ${r.line}: ${quoteText(f.text)} ${whyNot(f.text, v.reason)}.`);
    return v.value;
  };
  for (const r of records) {
    // A listing's header repeated on each page: skipped and named.
    const texts = blankSeparated ? withUnitsJoined(r.fields.map((f) => f.text)) : r.fields.map((f) => f.text);
    if (texts.length >= width && texts.every((t, k) => (k < width ? t === header[k] : t === ""))) {
      skipped.push(`line ${r.line} (repeated header)`);
      continue;
    }
    const fields = r.fields.length > width && r.fields.slice(width).every((f) => f.text === "") ? r.fields.slice(0, width) : r.fields;
    if (fields.length !== width) throw new TableError(`Line ${r.line}: expected ${width} values like the header, found ${fields.length}.`);
    if (columns.id >= 0) {
      const id = fields[columns.id].text;
      if (id === previousId) {
        throw new TableError(
          `Element ${id} is on line ${previousLine} and again on line ${r.line}: several rows per element, as integration-point or nodal output writes them? ` +
            "Repeated sizes would count each element once per row. Paste one row per element (element-averaged or centroid stresses) with the element volume or area.",
        );
      }
      previousId = id;
      previousLine = r.line;
    }
    const size = value(r, columns.size);
    if (size < 0) throw new TableError(`Line ${r.line}: the element size is negative.`);
    stresses.push(columns.stress.map((k) => (k < 0 ? 0 : value(r, k))));
    sizes.push(size);
  }
  const used = [...columns.stress.filter((k) => k >= 0), columns.size, ...(columns.id >= 0 ? [columns.id] : [])];
  const ignored = header.filter((_, k) => !used.includes(k));
  const form = columns.tensor === "plane stress" || (columns.kind === 3 && columns.stress[2] < 0) ? " (plane stress)" : columns.tensor === "axisymmetric or plane strain" ? ` (axisymmetric or plane strain, ${columns.labels.stress[2]} the hoop stress)` : "";
  skipped.sort((a, b) => Number(/\d+/.exec(a)![0]) - Number(/\d+/.exec(b)![0]));
  const notes = [
    ...(skipped.length > 0 ? [`Skipped ${skipped.join(", ")}.`] : []),
    `Read stresses ${columns.stress.filter((k) => k >= 0).map((k) => header[k]).join(", ")}${form} and sizes ${columns.labels.size} by the header` +
      (ignored.length > 0 ? `; ignored ${ignored.join(", ")}.` : "."),
  ];
  return { table: { stresses, columns: columns.kind, sizes }, notes };
}
