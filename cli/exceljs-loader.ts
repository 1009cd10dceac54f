/**
 * exceljs on demand: it is the slowest module the command line loads (about
 * 15 % of a start-up), and only .xlsx input or output needs it, so a .csv
 * calculation and `brittle part` never pay for it.
 */
import type ExcelJS from "exceljs";

export type { ExcelJS };

export async function loadExcelJs(): Promise<typeof ExcelJS> {
  const module = await import("exceljs");
  // exceljs is CommonJS: the namespace arrives as `default` under Node's ESM loader.
  return (module.default ?? module) as typeof ExcelJS;
}
