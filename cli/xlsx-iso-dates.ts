/**
 * Cells of type "d" (ECMA-376 Part 1, 18.18.11 ST_CellType: the value is an ISO 8601 date and time),
 * which some writing libraries use in place of a serial number. The workbook reader (exceljs 4.4)
 * reads their text as a plain number, so 2024-03-01 became 2024 and a SUM over it was off by
 * tens of thousands. They are turned into the serial number of the workbook's date system (the
 * number a spreadsheet computes with) before the reader sees them.
 */
import { WorkbookError } from "./workbook-errors";

/**
 * Days from 1970-01-01 back to day 0 of the workbook's date system: 1899-12-30 in the 1900 system
 * (25569 days), 1904-01-01 in the 1904 system (24107 days: 66 years, 17 of them leap). ECMA-376
 * Part 1, 18.17.4. The reader turns date cells into Dates with the workbook's system, so the serial
 * goes back with the same one and a formula computes with the number stored in the file (a 1904
 * workbook's dates were 1462 days later).
 */
export function dateSystemEpoch(workbookXml: string): number {
  return /<(?:\w+:)?workbookPr\b[^>]*\bdate1904="(?:1|true)"/.test(workbookXml) ? EPOCH_1904 : EPOCH_1900;
}

/** dateSystemEpoch's two answers: the 1900 system (day 0 = 1899-12-30) and the 1904 system (day 0 = 1904-01-01). */
export const EPOCH_1900 = 25569;
export const EPOCH_1904 = 24107;

/** A cell of type "d" with content: its prefix, the attributes around the type, and what it holds. */
const CELL = /<((?:\w+:)?)c\b([^>]*?)\st="d"((?:[^>/]|\/(?!>))*)>([\s\S]*?)<\/\1c>/g;
const VALUE = /(<(?:\w+:)?v>)([^<]*)(<\/(?:\w+:)?v>)/;
const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:T(\d{2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?)?(?:Z|[+-]\d{2}:?\d{2})?$/;

/**
 * A worksheet's XML with every date cell's ISO text replaced by its serial number (and the cell's type dropped).
 * @example isoDateCellsToSerials('<c r="A1" t="d"><v>2024-03-01</v></c>', 25569, "p") // '<c r="A1"><v>45352</v></c>'
 */
export function isoDateCellsToSerials(xml: string, epoch: number, part: string): string {
  if (!xml.includes('t="d"')) return xml;
  return xml.replace(CELL, (_cell, prefix: string, before: string, after: string, inner: string) => {
    const value = inner.replace(VALUE, (_v, open: string, text: string, close: string) => {
      const serial = serialOf(text.trim(), epoch);
      if (serial === null) {
        const ref = /\br="([^"]*)"/.exec(before + after)?.[1] ?? "?";
        throw new WorkbookError(`${part}, cell ${ref}: the date "${text}" is not an ISO 8601 date (YYYY-MM-DD or YYYY-MM-DDThh:mm:ss)`);
      }
      return `${open}${serial}${close}`;
    });
    return `<${prefix}c${before}${after}>${value}</${prefix}c>`;
  });
}

/** The serial number of an ISO date and time as written (its wall-clock reading; a zone, if any, is ignored). */
function serialOf(text: string, epoch: number): number | null {
  const m = ISO.exec(text);
  if (!m) return null;
  const [y, mo, d, h = "0", mi = "0", s = "0"] = m.slice(1);
  const ms = Date.UTC(Number(y), Number(mo) - 1, Number(d), Number(h), Number(mi), 0) + Number(s) * 1000;
  if (!Number.isFinite(ms)) return null;
  const serial = ms / 86400000 + epoch;
  // The 1900 system counts a 29 February 1900 that never was (ECMA-376 Part 1, 18.17.4.1): dates
  // before 1 March 1900 are one lower than the count of days; a time alone (day 0) is not a date.
  return epoch === 25569 && serial >= 1 && serial < 61 ? serial - 1 : serial;
}
