/**
 * Reads the strengths from the range selected in the sheet (host only): one
 * column of strengths, or two with censoring flags, with or without a header
 * row. The text goes into the form's box so the user sees exactly what was
 * taken; the addresses go to the report sheet so its formulas refer to the
 * data where they are.
 */
import type { DataSource } from "./inputs";

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
