/**
 * `npm run demo`: evaluates the invented supplier datasheet with no
 * spreadsheet application, writes the filled copy, and prints the results.
 */
import { mkdir } from "node:fs/promises";
import { dirname } from "node:path";
import { fileURLToPath } from "node:url";
import { formatNumber, type Io } from "../cli/cli";
import { evaluateWorkbook } from "../cli/evaluate-workbook";
import { writeEvaluated } from "../cli/write-workbook";
import { generateMetadata } from "../functions/metadata";
import { loadWorkbook } from "../cli/workbook-io";

// Beside this module in the repository, and one level above the compiled lib/ in an installed
// package (which ships the datasheet): both resolve to <package>/examples/.
export const DEMO_INPUT = fileURLToPath(new URL("../examples/supplier-datasheet.xlsx", import.meta.url));
// Written under the current folder, never into the installed package.
export const DEMO_OUTPUT = "examples/out/supplier-datasheet.filled.xlsx";

export async function runDemo(io: Io): Promise<void> {
  const workbook = await loadWorkbook(DEMO_INPUT);
  const { functions } = await generateMetadata();
  const evaluation = evaluateWorkbook(workbook, functions);
  await mkdir(dirname(DEMO_OUTPUT), { recursive: true });
  await writeEvaluated(workbook, evaluation, DEMO_OUTPUT);

  const sheet = workbook.sheets.Datasheet;
  io.out(`${String(sheet[0][0])}\n${String(sheet[1][0])}\n\n`);
  const isFitTable = (f: { formula: string }) => f.formula.toUpperCase().includes("BRITTLE.FIT(");
  const singles = evaluation.formulas.filter((f) => !isFitTable(f));
  const labelWidth = Math.max(...singles.map((f) => labelFor(sheet, f.address).length));
  for (const f of singles) {
    const value = typeof f.value === "number" ? formatNumber(f.value) : String(f.value);
    io.out(`  ${labelFor(sheet, f.address).padEnd(labelWidth)}  ${value.padStart(12)}${f.message ? `  (${f.message})` : ""}\n`);
  }
  const fit = evaluation.formulas.find(isFitTable);
  if (fit) {
    io.out(`\n  Fit summary (BRITTLE.FIT at ${fit.address}):\n`);
    const grid = evaluation.grids.Datasheet;
    const row0 = Number(fit.address.replace(/^[A-Z]+/, "")) - 1;
    const col0 = fit.address.replace(/\d+$/, "").charCodeAt(0) - 65;
    for (let r = row0; r < grid.length && grid[r][col0] !== null && grid[r][col0] !== undefined; r++) {
      const v = grid[r][col0 + 1];
      io.out(`    ${String(grid[r][col0]).padEnd(56)} ${typeof v === "number" ? formatNumber(v) : String(v)}\n`);
    }
  }
  const errors = evaluation.formulas.filter((f) => typeof f.value === "string" && f.value.startsWith("#"));
  io.out(`\n${evaluation.formulas.length} formulas evaluated, ${errors.length} errors; filled copy: ${DEMO_OUTPUT}\n`);
  io.out("Cautions: invented data; the design stress extrapolates below the tested strengths and rests on one flaw population,\n");
  io.out("the same surface and environment, and no slow crack growth. A licensed engineer decides, under the applicable codes.\n");
  if (errors.length) throw new Error(`${errors.length} formulas in the demo workbook returned errors`);
}

/** The label users read: the text cell to the left of the formula. */
function labelFor(sheet: unknown[][], address: string): string {
  const row = Number(address.replace(/^[A-Z]+/, "")) - 1;
  const col = address.replace(/\d+$/, "").charCodeAt(0) - 65;
  const label = sheet[row]?.[col - 1];
  return typeof label === "string" ? label : address;
}
