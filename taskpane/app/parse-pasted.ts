/**
 * Strengths pasted or typed into the form: one specimen per line, an optional
 * second column of censoring flags, an optional header line. The numbers then
 * go through the same cell policy as a range in the sheet (functions/cells.ts),
 * so a blank, a zero or a negative means here what it means in a cell.
 */
import { readSample, CellError } from "../../functions/cells";

export interface PastedSample {
  strengths: number[];
  censored?: boolean[];
  /** Lines that held a specimen (blank lines and the header excluded). */
  rows: number;
  header: boolean;
}

export class PasteError extends Error {}

// Tabs (cells copied from a sheet), semicolons, commas or runs of spaces.
const SEPARATOR = /\s*[\t;,]\s*|\s+/;

export function parsePasted(text: string): PastedSample {
  const lines = text.split(/\r\n|\n|\r/).map((l) => l.trim()).filter((l) => l !== "");
  if (lines.length === 0) throw new PasteError("Paste or type the fracture strengths, one per line.");
  let header = false;
  if (!isNumber(lines[0].split(SEPARATOR)[0])) {
    header = true;
    lines.shift();
  }
  const strengths: (number | string)[][] = [];
  const flags: (boolean | number | string | null)[][] = [];
  let anyFlag = false;
  lines.forEach((line, i) => {
    const lineNo = i + 1 + (header ? 1 : 0);
    const cells = line.split(SEPARATOR);
    if (cells.length > 2) throw new PasteError(`Line ${lineNo}: expected a strength and at most one flag, found ${cells.length} values.`);
    if (!isNumber(cells[0])) throw new PasteError(`Line ${lineNo}: "${cells[0]}" is not a number (use a point as the decimal separator).`);
    strengths.push([Number(cells[0])]);
    if (cells.length === 2) {
      anyFlag = true;
      flags.push([flagValue(cells[1])]);
    } else {
      flags.push([null]);
    }
  });
  try {
    const sample = readSample(strengths, anyFlag ? flags : undefined);
    return { strengths: sample.strengths, censored: sample.censored, rows: lines.length, header };
  } catch (error) {
    if (error instanceof CellError) throw new PasteError(reword(error.message, header));
    throw error;
  }
}

function isNumber(token: string | undefined): boolean {
  return token !== undefined && token !== "" && Number.isFinite(Number(token));
}

function flagValue(token: string): boolean | number | string {
  if (isNumber(token)) return Number(token);
  return token;
}

/** The cell policy names rows of a range; here they are lines of the box. */
function reword(message: string, header: boolean): string {
  const text = message.replace(/^(strengths|censored), row (\d+)/, (_m, what: string, row: string) => {
    const line = Number(row) + (header ? 1 : 0);
    return `Line ${line}${what === "censored" ? " (flag)" : ""}`;
  });
  return text.charAt(0).toUpperCase() + text.slice(1) + (text.endsWith(".") ? "" : ".");
}
