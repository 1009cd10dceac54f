/**
 * Writing the evaluated workbook: an .xlsx keeps its own formatting and
 * formulas (as written in the file, saved add-in names included), and every
 * formula gets its computed value; a spilling formula becomes an array formula
 * over the cells it fills, so a spreadsheet opening the file shows the same.
 *
 * Only formulas on the safe list stay formulas (formula-safety.ts); the rest,
 * and text that could pass for a formula, are written as text. Errors are the
 * file format's standard values. The file appears whole or not at all
 * (atomic-write.ts).
 */
import { loadExcelJs, type ExcelJS } from "./exceljs-loader";
import { writeAtomically } from "./atomic-write";
import { readCell, columnName, spillExtent, type Evaluation, type ShownCell } from "./evaluate-workbook";
import { judgeFormula, writtenText } from "./formula-safety";
import { restoreDefinedNames } from "./xlsx-parts";
import type { Contents, LoadedWorkbook } from "./workbook-io";

export interface WriteReport {
  /** Formulas written as text because they are not on the safe list: "Sheet1!B3: it calls HYPERLINK, ...". */
  asText: string[];
  /** Defined names left out of the copy for the same reason. */
  namesLeftOut: string[];
}

export async function writeEvaluated(workbook: LoadedWorkbook, evaluation: Evaluation, outPath: string): Promise<WriteReport> {
  const book = workbook.source ?? new (await loadExcelJs()).Workbook();
  const { engine, addInNames } = evaluation;
  const report: WriteReport = { asText: [], namesLeftOut: [] };
  for (const [name, contents] of Object.entries(workbook.sheets)) {
    const ws = book.getWorksheet(name) ?? book.addWorksheet(name);
    const sheet = engine.getSheetId(name)!;
    const resultAt = (row: number, col: number) => fileValue(readCell(engine, { sheet, row, col }));
    contents.forEach((row, r) =>
      row.forEach((cellContents, c) => {
        const cell = ws.getCell(r + 1, c + 1);
        if (typeof cellContents === "string" && cellContents.startsWith("=")) {
          const verdict = judgeFormula(cellContents, addInNames);
          if (!verdict.safe) {
            report.asText.push(`${name}!${columnName(c)}${r + 1}: ${verdict.reason}`);
            cell.value = writtenText(cellContents);
            return;
          }
          const original = originalFormula(cell, cellContents);
          const extent = spillExtent(engine, sheet, r, c);
          if (extent.rows > 1 || extent.cols > 1) {
            const results: unknown[][] = [];
            for (let i = 0; i < extent.rows; i++) {
              results.push([]);
              for (let j = 0; j < extent.cols; j++) results[i].push(resultAt(r + i, c + j));
            }
            const range = `${columnName(c)}${r + 1}:${columnName(c + extent.cols - 1)}${r + extent.rows}`;
            // exceljs's types omit fillFormula's fourth argument, the share type.
            (ws.fillFormula as (...a: unknown[]) => void).call(ws, range, original, results, "array");
          } else {
            cell.value = { formula: original, result: resultAt(r, c) } as never;
          }
        } else if (!workbook.source) {
          cell.value = plainValue(cellContents) as never;
        }
      }),
    );
  }
  const names = (workbook.names ?? []).filter((n) => {
    const verdict = judgeFormula(`=${n.formula}`, addInNames);
    if (!verdict.safe) report.namesLeftOut.push(`${n.name}: ${verdict.reason}`);
    return verdict.safe;
  });
  const bytes = await restoreDefinedNames(new Uint8Array(await book.xlsx.writeBuffer()), names);
  await writeAtomically(outPath, bytes);
  return report;
}

/** A computed value as the file stores it: errors and non-finite numbers as standard error values. */
function fileValue(shown: ShownCell): unknown {
  return shown.error ? { error: shown.error } : (shown.value ?? "");
}

/** A CSV cell as written: text that could pass for a formula gets its apostrophe; a non-finite number is #NUM!. */
function plainValue(contents: Contents): unknown {
  if (typeof contents === "string") return writtenText(contents);
  if (typeof contents === "number" && !Number.isFinite(contents)) return { error: "#NUM!" };
  return contents;
}

function originalFormula(cell: ExcelJS.Cell, contents: string): string {
  const v = cell.value as Record<string, unknown> | null;
  if (v && typeof v === "object" && ("formula" in v || "sharedFormula" in v)) return cell.formula;
  return contents.slice(1);
}
