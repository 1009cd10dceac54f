/**
 * Task pane entry. With the shared runtime this page also hosts the custom
 * functions, so it registers them first; outside a spreadsheet host (a plain
 * browser) Office.onReady resolves with host null and the form runs
 * standalone, with CSV and print exports instead of a report sheet.
 */
import { registerInHost } from "../functions/office";
import { adapters } from "../functions/registry";
import { generalCautions } from "../src/design/check-cautions";
import type { Caution, DesignCheckResult } from "../src/design/check-result";
import { runDesignCheck } from "../src/design/design-check";
import { DEMO_DESIGN } from "./app/demo-data";
import { byId, FieldError, showStepError } from "./app/dom";
import { readSelection, readTableSelection } from "./app/host-selection";
import type { CheckDescription } from "../src/design/check-description";
import { clearBasis, renderBasis } from "./app/render-basis";
import { renderCautions } from "./app/render-cautions";
import { renderIncomplete, renderLegend, renderResult } from "./app/render-result";
import { resultRows, type ResultRow } from "./app/result-table";
import { explainTypedFormula } from "./explain/explain-call";
import { FormulaError, parseFormula } from "./explain/formula-parse";
import { explainSelectedCell } from "./explain/host-explain";
import { loadMetadata } from "./explain/load-metadata";
import { renderExplainProblem, renderExplanation } from "./explain/render-explain";
import { designCheckCsv } from "./export/csv";
import { openCheckFile, saveCheckFile } from "./export/check-file-ui";
import { downloadText } from "./export/download";
import { printReport } from "./export/print";
import { drawProbabilityPlot } from "./plot/probability-plot";
import { plotData } from "./plot/plot-data";
import { planReportSheet } from "./report/sheet-plan";
import { writeReportSheet } from "./report/sheet-writer";
import { fillStrengths, MATERIAL_FIELDS, readMaterial, setupMaterial } from "./steps/material";
import { fillElementTable, PART_FIELDS, readPart, setupPart } from "./steps/part";
import { readRequirement, REQUIREMENT_FIELDS, setupRequirement } from "./steps/requirement";
import { readSpecimen, setupSpecimen, SPECIMEN_FIELDS } from "./steps/specimen";
import { setupMaterialFitPanel } from "./steps/material-fit-panel";
import { setupPlanning } from "./steps/planning";
import { setupRecordImport } from "./steps/record-import";

registerInHost();

interface Step {
  name: string;
  section: string;
  error: string;
  fields: string[];
}
const STEPS: Step[] = [
  { name: "1, material data", section: "step-material", error: "material-error", fields: MATERIAL_FIELDS },
  { name: "2, test specimen", section: "step-specimen", error: "specimen-error", fields: SPECIMEN_FIELDS },
  { name: "3, part", section: "step-part", error: "part-error", fields: PART_FIELDS },
  { name: "4, requirement", section: "step-requirement", error: "requirement-error", fields: REQUIREMENT_FIELDS },
];

/** Steps the user has typed in: only those show field errors, so an untouched form is not a wall of red. */
const touched = new Set<string>();
let current: { description: CheckDescription; result: DesignCheckResult; rows: ResultRow[]; cautions: Caution[] } | null = null;

function show(text: string): void {
  byId("status").textContent = text;
}

/** The form as the core's check description, or null (with the first problem shown) while a step is incomplete. */
function collect(): CheckDescription | null {
  const readers = [readMaterial, readSpecimen, () => ({ part: readPart() }), readRequirement];
  const parts: object[] = [];
  let firstProblem: string | null = null;
  STEPS.forEach((step, i) => {
    try {
      parts.push(readers[i]());
      showStepError(step.error, null, step.fields);
    } catch (error) {
      if (!(error instanceof FieldError)) throw error;
      showStepError(step.error, touched.has(step.section) ? error : null, step.fields);
      firstProblem ??= `Complete step ${step.name}: ${error.message}`;
    }
  });
  if (firstProblem) {
    renderIncomplete(firstProblem);
    return null;
  }
  const title = byId<HTMLInputElement>("check-title").value.trim();
  return Object.assign(title ? { title } : {}, ...parts) as CheckDescription;
}

function update(): void {
  current = null;
  setActions(false);
  const description = collect();
  if (!description) {
    clearBasis();
    renderCautions(generalCautions());
    return;
  }
  let result: DesignCheckResult;
  try {
    result = runDesignCheck(description);
  } catch (error) {
    clearBasis();
    renderIncomplete(`The check could not be computed: ${error instanceof Error ? error.message : String(error)}.`);
    renderCautions(generalCautions());
    return;
  }
  const rows = resultRows(result);
  const cautions = result.cautions;
  renderResult(result, rows);
  renderBasis(result);
  renderCautions(cautions);
  const data = plotData(result);
  drawProbabilityPlot(byId("plot"), data, result.input.stressUnit);
  renderLegend(data);
  byId("plot-figure").hidden = false;
  current = { description, result, rows, cautions };
  setActions(true);
}

function setActions(enabled: boolean): void {
  for (const id of ["write-sheet", "save-check", "export-csv", "print-report"]) byId<HTMLButtonElement>(id).disabled = !enabled;
}

let pending: ReturnType<typeof setTimeout> | undefined;
function scheduleUpdate(): void {
  clearTimeout(pending);
  pending = setTimeout(update, 150);
}

function fillDemoDesign(): void {
  const fill = (id: string, value: string) => {
    const input = byId<HTMLInputElement>(id);
    if (input.value.trim() === "") input.value = value;
  };
  fill("specimen-size", DEMO_DESIGN.specimenSize);
  fill("part-size", DEMO_DESIGN.partSize);
  fill("applied-stress", DEMO_DESIGN.appliedStress);
  fill("survival", DEMO_DESIGN.survival);
  fill("lot-size", DEMO_DESIGN.lotSize);
}

function info(text: string): void {
  byId("action-info").textContent = text;
}

function wireForm(): void {
  setupMaterial(scheduleUpdate);
  setupSpecimen(scheduleUpdate);
  setupPart(scheduleUpdate);
  setupRequirement(scheduleUpdate);
  const form = byId<HTMLFormElement>("check-form");
  form.addEventListener("input", (event) => {
    const section = (event.target as HTMLElement).closest("section.step");
    if (section) touched.add(section.id);
    scheduleUpdate();
  });
  form.addEventListener("submit", (event) => event.preventDefault());
  byId("load-demo").addEventListener("click", fillDemoDesign);

  byId("export-csv").addEventListener("click", () => {
    if (!current) return;
    downloadText("design-check.csv", designCheckCsv(current.result, current.rows, current.cautions), "text/csv;charset=utf-8");
    info("CSV saved as design-check.csv.");
  });
  byId("print-report").addEventListener("click", () => {
    if (current) printReport(current.result);
  });
  byId("save-check").addEventListener("click", () => {
    if (!current) return;
    const name = saveCheckFile(current.description);
    info(`Check saved as ${name}: every input, data included. Reopen it here, or run brittle check ${name}.`);
  });
  const open = byId<HTMLInputElement>("open-check");
  open.addEventListener("change", async () => {
    const file = open.files?.[0];
    if (!file) return;
    const outcome = await openCheckFile(file);
    // Clear the chooser so the same file can be chosen again after a fix.
    open.value = "";
    if (outcome.ok) {
      for (const step of STEPS) touched.add(step.section);
      clearTimeout(pending);
      update();
      byId("open-info").textContent = `Opened ${outcome.name}.`;
    } else {
      byId("open-info").textContent = outcome.message;
      if (outcome.fieldId) document.getElementById(outcome.fieldId)?.focus();
    }
  });
  renderCautions(generalCautions());
  update();
  wireExplainTyped();
}

function wireExplainTyped(): void {
  const output = byId("explain-output");
  const run = async () => {
    const text = byId<HTMLInputElement>("explain-formula").value;
    try {
      renderExplanation(output, explainTypedFormula(parseFormula(text.trim().startsWith("=") ? text : `=${text}`), await loadMetadata()));
    } catch (error) {
      renderExplainProblem(output, error instanceof FormulaError ? error.message : `Could not explain: ${String(error)}`);
    }
  };
  byId("explain-typed").addEventListener("click", () => void run());
  byId("explain-formula").addEventListener("keydown", (event) => {
    if (event.key === "Enter") void run();
  });
}

function wireExplainSelected(): void {
  const button = byId<HTMLButtonElement>("explain-selected");
  button.hidden = false;
  button.addEventListener("click", async () => {
    const output = byId("explain-output");
    try {
      const metadata = await loadMetadata();
      renderExplanation(output, await Excel.run((context) => explainSelectedCell(context, metadata)));
    } catch (error) {
      renderExplainProblem(output, error instanceof FormulaError ? error.message : `Could not explain the selected cell: ${error instanceof Error ? error.message : String(error)}`);
    }
  });
}

function wireHost(): void {
  const useSelection = byId<HTMLButtonElement>("use-selection");
  const writeSheet = byId<HTMLButtonElement>("write-sheet");
  useSelection.hidden = false;
  writeSheet.hidden = false;
  useSelection.addEventListener("click", async () => {
    try {
      const selection = await Excel.run((context) => readSelection(context));
      fillStrengths(selection.text, selection.source);
      byId("selection-info").textContent = selection.description;
      touched.add("step-material");
      update();
    } catch (error) {
      byId("selection-info").textContent = `Could not read the selection: ${error instanceof Error ? error.message : String(error)}`;
    }
  });
  const useTable = byId<HTMLButtonElement>("use-table-selection");
  useTable.hidden = false;
  useTable.addEventListener("click", async () => {
    try {
      const selection = await Excel.run((context) => readTableSelection(context));
      fillElementTable(selection.text, selection.source);
      byId("table-info").textContent = selection.description;
      touched.add("step-part");
      update();
    } catch (error) {
      byId("table-info").textContent = `Could not read the selection: ${error instanceof Error ? error.message : String(error)}`;
    }
  });
  writeSheet.addEventListener("click", async () => {
    if (!current) return;
    const plan = planReportSheet(current.result, { functions: new Set(Object.keys(adapters)), cautions: current.cautions, written: new Date() });
    writeSheet.disabled = true;
    try {
      const { sheetName } = await Excel.run((context) => writeReportSheet(context, plan));
      info(`Written to the new sheet "${sheetName}"; its results recompute with the data.`);
    } catch (error) {
      info(`Nothing was written: ${error instanceof Error ? error.message : String(error)}`);
    } finally {
      writeSheet.disabled = current === null;
    }
  });
}

wireForm();
setupPlanning();
setupMaterialFitPanel();
setupRecordImport((text, description) => {
  fillStrengths(text, null);
  byId("selection-info").textContent = description;
  scheduleUpdate();
});

if (typeof Office !== "undefined") {
  Office.onReady((hostInfo) => {
    if (hostInfo.host === Office.HostType.Excel) {
      wireHost();
      wireExplainSelected();
      show("Ready in the spreadsheet: BRITTLE functions are registered.");
    } else {
      show("Standalone: paste data, then export the check as CSV or print it.");
    }
    document.body.dataset.ready = "true";
  });
} else {
  show("Standalone (office.js not loaded): paste data, then export the check as CSV or print it.");
  document.body.dataset.ready = "true";
}
