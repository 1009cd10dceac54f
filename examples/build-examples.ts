/**
 * Builds the example workbooks in examples/. Everything in them is INVENTED
 * for demonstration: the supplier, the material, the strengths (drawn from a
 * seeded Weibull generator) and the part. Run: npm run examples
 */
import ExcelJS from "exceljs";
import { writeFileSync } from "node:fs";
import { SeededRandom } from "../src/numeric/random";

const SEED = 4711;
const TRUE_MODULUS = 11.5;
const TRUE_CHARACTERISTIC = 412; // MPa

export function inventedStrengths(count: number): number[] {
  const random = new SeededRandom(SEED);
  return Array.from({ length: count }, () => Math.round(10 * TRUE_CHARACTERISTIC * Math.pow(random.exponential(), 1 / TRUE_MODULUS)) / 10);
}

const NOTICE =
  "INVENTED EXAMPLE: the supplier, material, test results and part in this workbook are made up for demonstration. " +
  "Do not use these numbers for design.";

async function buildDatasheet(path: string): Promise<void> {
  const book = new ExcelJS.Workbook();
  book.creator = "brittle-design examples (invented data)";
  const ws = book.addWorksheet("Datasheet");
  ws.columns = [{ width: 16 }, { width: 14 }, { width: 4 }, { width: 52 }, { width: 18 }, { width: 14 }];
  ws.getCell("A1").value = "Supplier datasheet: Vellmar Ceramics (invented), alumina grade VC-96 (invented)";
  ws.getCell("A1").font = { bold: true, size: 13 };
  ws.getCell("A2").value = NOTICE;
  ws.getCell("A2").font = { italic: true, color: { argb: "FF9C4A00" } };
  ws.getCell("A4").value = "Strength (MPa)";
  ws.getCell("B4").value = "Specimen";
  ws.getRow(4).font = { bold: true };
  const strengths = inventedStrengths(30);
  strengths.forEach((s, i) => {
    ws.getCell(5 + i, 1).value = s;
    ws.getCell(5 + i, 2).value = `VC96-B-${String(i + 1).padStart(2, "0")}`;
  });
  const data = "A5:A34";

  const inputs: [string, number | string, string][] = [
    ["Test: four-point flexure, ASTM C1161 configuration B", "", ""],
    ["Effective volume of the test bars, mm^3", "", "live: ASTM C1161 configuration B, four-point, at the fitted modulus"],
    ["Effective volume of the part, mm^3 (typed)", 310, "from the part's stress analysis (invented)"],
    ["Required survival probability", 0.9999, "requirement"],
    ["Applied peak stress in the part, MPa", 135, "from the part's stress analysis (invented)"],
    ["Parts per production lot", 20000, "planning figure (invented)"],
  ];
  ws.getCell("D4").value = "Inputs";
  ws.getCell("E4").value = "Value";
  ws.getCell("F4").value = "Note";
  inputs.forEach(([label, value, note], i) => {
    ws.getCell(5 + i, 4).value = label;
    if (value !== "") ws.getCell(5 + i, 5).value = value;
    ws.getCell(5 + i, 6).value = note;
  });
  ws.getCell("E6").value = { formula: 'BRITTLE.SPECIMEN("C1161-B-4PT",E13)' } as ExcelJS.CellFormulaValue;

  const results: [string, string][] = [
    ["Weibull modulus m (ML, unbiased)", `BRITTLE.MODULUS(${data})`],
    ["Weibull modulus m (ML, no unbiasing)", `BRITTLE.MODULUS(${data},,"MLE-RAW")`],
    ["Characteristic strength, MPa (ML)", `BRITTLE.CHARSTRENGTH(${data})`],
    ["Mean strength, MPa", "BRITTLE.MEANSTRENGTH(E13,E15)"],
    ["Material scale sigma_0V, MPa mm^(3/m)", "BRITTLE.MATERIALSCALE(E15,E13,E6)"],
    ["Size ratio part / test bar", "E7/E6"],
    ["Design stress at the required survival, MPa", "BRITTLE.DESIGNSTRESS(E8,E13,E15,E18)"],
    ["Design stress, lower 95 % confidence bound, MPa", `BRITTLE.DESIGNSTRESSBOUND(E8,${data},,0.95,E18)`],
    ["Failure probability at the applied stress", "BRITTLE.FAILPROB(E9,E13,E15,E18)"],
    ["Expected failures per lot", "BRITTLE.LOTFAILURES(E21,E10)"],
    ["Failures per lot not exceeded at 95 %", "BRITTLE.LOTFAILURES(E21,E10,0.95)"],
    ["Applied stress within the lower-bound design stress?", 'IF(E9<=E20,"yes","NO")'],
  ];
  ws.getCell("D12").value = "Results (live formulas)";
  ws.getCell("D12").font = { bold: true };
  results.forEach(([label, formula], i) => {
    ws.getCell(13 + i, 4).value = label;
    ws.getCell(13 + i, 5).value = { formula } as ExcelJS.CellFormulaValue;
  });
  ws.getCell("H4").value = "Fit summary (spills from H5)";
  ws.getCell("H4").font = { bold: true };
  ws.getColumn(8).width = 44;
  ws.getColumn(9).width = 16;
  ws.getCell("H5").value = { formula: `BRITTLE.FIT(${data})` } as ExcelJS.CellFormulaValue;
  ws.getCell("D25").value =
    "Cautions: the design stress extrapolates far below the tested strengths and assumes one flaw population, the same surface finish and environment in bar and part, and no slow crack growth under sustained load. It supports, and does not replace, the judgement of a licensed engineer under the applicable codes.";
  ws.getCell("D25").alignment = { wrapText: true, vertical: "top" };
  ws.getRow(25).height = 75;
  await book.xlsx.writeFile(path);
}

function buildQuickCheck(path: string): void {
  const strengths = inventedStrengths(12);
  const lines = [
    "Strength (MPa; invented demo data),Quantity,Value",
    ...strengths.map((s, i) => {
      const rows: [string, string][] = [
        ["Modulus (ML unbiased)", '"=BRITTLE.MODULUS(A2:A13)"'],
        ["Characteristic strength (MPa)", '"=BRITTLE.CHARSTRENGTH(A2:A13)"'],
        ["Stress for 99.9 % survival, part 40x the bars (MPa)", '"=BRITTLE.DESIGNSTRESS(0.999,C2,C3,40)"'],
      ];
      const [label, formula] = rows[i] ?? ["", ""];
      return label ? `${s},"${label}",${formula}` : `${s},,`;
    }),
  ];
  writeFileSync(path, lines.join("\n") + "\n");
}

await buildDatasheet("examples/supplier-datasheet.xlsx");
buildQuickCheck("examples/quick-check.csv");
console.log("wrote examples/supplier-datasheet.xlsx and examples/quick-check.csv (invented data)");
