/**
 * Evaluate a loaded workbook in the embedded engine and collect what a user
 * would see: every cell's value, errors as their code text ("#NUM!").
 */
import { CellType, DetailedCellError, type HyperFormula } from "hyperformula";
import { loadExcelJs, type ExcelJS } from "./exceljs-loader";
import { createEngine } from "./engine";
import type { FunctionMetadata } from "../functions/metadata";
import type { Contents, LoadedWorkbook } from "./workbook-io";

export type Shown = number | string | boolean | null;

export interface FormulaResult {
  sheet: string;
  address: string;
  formula: string;
  value: Shown;
  message?: string;
}

export interface Evaluation {
  engine: HyperFormula;
  grids: Record<string, Shown[][]>;
  formulas: FormulaResult[];
}

export function evaluateWorkbook(workbook: LoadedWorkbook, metadata: FunctionMetadata[]): Evaluation {
  const engine = createEngine(workbook.sheets, metadata);
  const grids: Record<string, Shown[][]> = {};
  const formulas: FormulaResult[] = [];
  for (const name of Object.keys(workbook.sheets)) {
    const sheet = engine.getSheetId(name)!;
    const values = engine.getSheetValues(sheet);
    grids[name] = values.map((row) => row.map(shown));
    workbook.sheets[name].forEach((row, r) =>
      row.forEach((contents, c) => {
        if (typeof contents === "string" && contents.startsWith("=")) {
          const v = engine.getCellValue({ sheet, row: r, col: c });
          formulas.push({
            sheet: name,
            address: columnName(c) + (r + 1),
            formula: contents,
            value: shown(v),
            ...(v instanceof DetailedCellError && v.message ? { message: v.message } : {}),
          });
        }
      }),
    );
  }
  return { engine, grids, formulas };
}

function shown(v: unknown): Shown {
  if (v instanceof DetailedCellError) return v.value;
  if (v === undefined) return null;
  return v as Shown;
}

export function columnName(index: number): string {
  let name = "";
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) name = String.fromCharCode(65 + ((n - 1) % 26)) + name;
  return name;
}

/**
 * Writes the evaluated workbook: an .xlsx keeps its own formatting and
 * formulas (as written in the file, saved add-in names included), and every
 * formula gets its computed value; a spilling formula becomes an array formula
 * over the cells it fills, so a spreadsheet opening the file shows the same.
 */
export async function writeEvaluated(workbook: LoadedWorkbook, evaluation: Evaluation, outPath: string): Promise<void> {
  const book = workbook.source ?? new (await loadExcelJs()).Workbook();
  const { engine } = evaluation;
  for (const [name, contents] of Object.entries(workbook.sheets)) {
    const ws = book.getWorksheet(name) ?? book.addWorksheet(name);
    const sheet = engine.getSheetId(name)!;
    contents.forEach((row, r) =>
      row.forEach((cellContents, c) => {
        const cell = ws.getCell(r + 1, c + 1);
        if (typeof cellContents === "string" && cellContents.startsWith("=")) {
          const original = originalFormula(cell, cellContents);
          const extent = spillExtent(engine, sheet, r, c);
          if (extent.rows > 1 || extent.cols > 1) {
            const results: (number | string)[][] = [];
            for (let i = 0; i < extent.rows; i++) {
              results.push([]);
              for (let j = 0; j < extent.cols; j++) results[i].push(resultFor(engine.getCellValue({ sheet, row: r + i, col: c + j })) as never);
            }
            const range = `${columnName(c)}${r + 1}:${columnName(c + extent.cols - 1)}${r + extent.rows}`;
            // exceljs's types omit fillFormula's fourth argument, the share type.
            (ws.fillFormula as (...a: unknown[]) => void).call(ws, range, original, results, "array");
          } else {
            cell.value = { formula: original, result: resultFor(engine.getCellValue({ sheet, row: r, col: c })) } as never;
          }
        } else if (!workbook.source) {
          cell.value = cellContents as Contents as never;
        }
      }),
    );
  }
  await book.xlsx.writeFile(outPath);
}

function originalFormula(cell: ExcelJS.Cell, contents: string): string {
  const v = cell.value as Record<string, unknown> | null;
  if (v && typeof v === "object" && ("formula" in v || "sharedFormula" in v)) return cell.formula;
  return contents.slice(1);
}

function resultFor(v: unknown): unknown {
  if (v instanceof DetailedCellError) return { error: v.value };
  return v ?? "";
}

function spillExtent(engine: HyperFormula, sheet: number, row: number, col: number): { rows: number; cols: number } {
  if (engine.getCellType({ sheet, row, col }) !== CellType.ARRAYFORMULA) return { rows: 1, cols: 1 };
  const inSpill = (r: number, c: number) => engine.getCellType({ sheet, row: r, col: c }) === CellType.ARRAY;
  let cols = 1;
  while (inSpill(row, col + cols)) cols++;
  let rows = 1;
  while (inSpill(row + rows, col)) rows++;
  return { rows, cols };
}
