/**
 * Reads the strengths from the range selected in the sheet (host only): one
 * column of strengths, or two with censoring flags, with or without a header
 * row. The text goes into the form's box so the user sees exactly what was
 * taken; the addresses go to the report sheet so its formulas refer to the
 * data where they are.
 */
import type { DataSource } from "../../src/design/check-description";
import { positionalHeaderProblem } from "../../src/size/part-columns";

export interface Selection {
  text: string;
  source: DataSource & { kind: "range" };
  description: string;
}

export async function readSelection(context: Excel.RequestContext): Promise<Selection> {
  const range = context.workbook.getSelectedRange();
  range.load("values,rowCount,columnCount,address");
  await context.sync();
  if (range.columnCount > 2) {
    throw new Error("Select one column of strengths, or two columns: strengths and censoring flags.");
  }
  const values = range.values as unknown[][];
  const first = values[0]?.[0];
  const header = typeof first === "string" && first.trim() !== "" && !Number.isFinite(Number(first));
  if (header && range.rowCount < 2) throw new Error("The selection holds only a header.");
  const problem = header ? positionalHeaderProblem(values[0].map(cellText)) : null;
  if (problem !== null) throw new Error(`${problem.charAt(0).toUpperCase()}${problem.slice(1)}: select the columns in that order, or paste the table with its header.`);
  const data = header ? range.getOffsetRange(1, 0).getResizedRange(-1, 0) : range;
  const strengths = data.getColumn(0);
  strengths.load("address");
  const flags = range.columnCount === 2 ? data.getColumn(1) : null;
  flags?.load("address");
  await context.sync();

  const rows = header ? values.slice(1) : values;
  const text = rows.map((row) => row.map(cellText).join("\t")).join("\n");
  const source: Selection["source"] = { kind: "range", strengthsAddress: strengths.address, flagsAddress: flags?.address };
  return {
    text,
    source,
    description: `Taken from ${strengths.address}${flags ? ` with flags in ${flags.address}` : ""}${header ? " (header row skipped)" : ""}.`,
  };
}

function cellText(v: unknown): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  return String(v);
}

export interface TableSelection {
  text: string;
  source: { kind: "range"; stressesAddress: string; sizesAddress: string };
  description: string;
}

/** An element table from the selection: 2, 4 or 7 columns (stresses, then the element size), header optional. */
export async function readTableSelection(context: Excel.RequestContext): Promise<TableSelection> {
  const range = context.workbook.getSelectedRange();
  range.load("values,rowCount,columnCount");
  await context.sync();
  const cols = range.columnCount;
  if (cols !== 2 && cols !== 4 && cols !== 7) {
    throw new Error("Select 2, 4 or 7 columns: 1, 3 or 6 stress columns, then the element sizes.");
  }
  const values = range.values as unknown[][];
  const header = values[0].some((v) => typeof v === "string" && v.trim() !== "" && !Number.isFinite(Number(v)));
  if (header && range.rowCount < 2) throw new Error("The selection holds only a header.");
  const problem = header ? positionalHeaderProblem(values[0].map(cellText)) : null;
  if (problem !== null) throw new Error(`${problem.charAt(0).toUpperCase()}${problem.slice(1)}: select the columns in that order, or paste the table with its header.`);
  const data = header ? range.getOffsetRange(1, 0).getResizedRange(-1, 0) : range;
  const stresses = data.getResizedRange(0, -1);
  const sizes = data.getLastColumn();
  stresses.load("address");
  sizes.load("address");
  await context.sync();
  // The header row goes into the box with the data: its names and units are checked there against the form.
  return {
    text: values.map((row) => row.map(cellText).join("\t")).join("\n"),
    source: { kind: "range", stressesAddress: stresses.address, sizesAddress: sizes.address },
    description: `Taken from ${stresses.address} with sizes in ${sizes.address}${header ? " (the header row names the columns and their units)" : ""}.`,
  };
}
