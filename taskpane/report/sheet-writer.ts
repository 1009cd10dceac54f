/**
 * Writes a planned design check into the workbook through the spreadsheet
 * JavaScript API: a new worksheet under a fresh name, the cells of the plan,
 * and a native scatter chart. It never touches an existing sheet: the name is
 * chosen against the workbook's current sheets, a name taken meanwhile makes
 * it try the next one, and it refuses to write unless the new sheet is empty.
 */
import type { Block, BlockStyle, SheetPlan } from "./sheet-plan";

const MAX_NAME = 31;
const ATTEMPTS = 5;

/** "Design check", then "Design check 2", 3, ...: the first name no sheet has (names compare case-insensitively). */
export function freshSheetName(base: string, existing: readonly string[]): string {
  const taken = new Set(existing.map((n) => n.toLowerCase()));
  if (!taken.has(base.toLowerCase())) return base;
  for (let i = 2; ; i++) {
    const suffix = ` ${i}`;
    const name = base.slice(0, MAX_NAME - suffix.length) + suffix;
    if (!taken.has(name.toLowerCase())) return name;
  }
}

export class SheetNotEmptyError extends Error {}

export async function writeReportSheet(context: Excel.RequestContext, plan: SheetPlan): Promise<{ sheetName: string }> {
  const sheet = await addFreshSheet(context, plan.baseName);
  const used = sheet.getUsedRangeOrNullObject(false);
  // The host knows isNullObject after the sync without a load; the load is kept because office-addin-mock, which the
  // tests run this against, answers only loaded properties. It adds nothing to the round trip.
  // eslint-disable-next-line office-addins/no-navigational-load
  used.load("isNullObject");
  await context.sync();
  if (!used.isNullObject) {
    throw new SheetNotEmptyError(`the new sheet "${sheet.name}" is not empty: nothing was written`);
  }

  for (const block of plan.blocks) writeBlock(sheet, block);
  sheet.getRange("A:A").format.columnWidth = 220;
  sheet.getRange("B:B").format.columnWidth = 90;
  sheet.getRange("D:D").format.columnWidth = 260;
  await context.sync();

  addChart(sheet, plan);
  sheet.activate();
  await context.sync();
  return { sheetName: sheet.name };
}

async function addFreshSheet(context: Excel.RequestContext, base: string): Promise<Excel.Worksheet> {
  let lastError: unknown;
  for (let attempt = 0; attempt < ATTEMPTS; attempt++) {
    const sheets = context.workbook.worksheets;
    sheets.load("items");
    // A retry, not a batch: each attempt must see the names the previous one collided with.
    // eslint-disable-next-line office-addins/no-context-sync-in-loop
    await context.sync();
    const name = freshSheetName(base, sheets.items.map((s) => s.name));
    try {
      const sheet = sheets.add(name);
      sheet.load("name");
      // eslint-disable-next-line office-addins/no-context-sync-in-loop -- the add's success is known only after a sync
      await context.sync();
      return sheet;
    } catch (error) {
      // Another user or macro took the name between our look and our add: look again.
      lastError = error;
    }
  }
  throw new Error(`could not add a new sheet: ${lastError instanceof Error ? lastError.message : String(lastError)}`);
}

function writeBlock(sheet: Excel.Worksheet, block: Block): void {
  const range = sheet.getRange(block.address);
  if (block.formulas) range.formulas = block.cells as never;
  else range.values = block.cells as never;
  if (block.numberFormat) range.numberFormat = block.cells.map((r) => r.map(() => block.numberFormat)) as never;
  style(range, block.style);
}

// Our own restrained palette: dark slate text, teal headings, a pale tint on inputs.
const PALETTE = { ink: "#1D2430", accent: "#0F6E6A", input: "#E6F2F1", warn: "#7A3E00", heading: "#DDEBEA" };

function style(range: Excel.Range, kind: BlockStyle): void {
  const font = range.format.font;
  switch (kind) {
    case "title":
      font.bold = true;
      font.size = 14;
      font.color = PALETTE.accent;
      break;
    case "heading":
      font.bold = true;
      font.color = PALETTE.ink;
      range.format.fill.color = PALETTE.heading;
      break;
    case "input":
      range.format.fill.color = PALETTE.input;
      break;
    case "result":
      font.bold = true;
      break;
    case "warning":
      font.color = PALETTE.warn;
      font.bold = true;
      break;
    case "note":
      font.italic = true;
      break;
    default:
      break;
  }
}

/**
 * The manifest requires ExcelApi 1.4 (everything else here); adding series, their chart type and a logarithmic axis
 * need 1.7. Outside a host (the tests' mock) there is no requirement check to ask, and the mock supports them.
 */
export function chartExtrasSupported(): boolean {
  if (typeof Office === "undefined" || !Office.context?.requirements) return true;
  return Office.context.requirements.isSetSupported("ExcelApi", "1.7");
}

function addChart(sheet: Excel.Worksheet, plan: SheetPlan): void {
  const { chart: spec } = plan;
  const [first, ...rest] = spec.series;
  const chart = sheet.charts.add("XYScatter", sheet.getRange(`${firstCell(first.x)}:${lastCell(first.y)}`), "Columns");
  chart.title.text = spec.title;
  chart.setPosition(spec.from, spec.to);
  chart.series.getItemAt(0).name = first.name;
  chart.axes.valueAxis.title.text = spec.yTitle;
  chart.legend.position = "Bottom";
  // An older host gets the data points only: no fitted line, and a linear stress axis.
  if (!chartExtrasSupported()) {
    chart.axes.categoryAxis.title.text = spec.xTitle.replace(/, log scale$/, ""); // the axis stays linear here
    return;
  }
  for (const s of rest) {
    const series = chart.series.add(s.name);
    series.setXAxisValues(sheet.getRange(s.x));
    series.setValues(sheet.getRange(s.y));
    if (s.lines) series.chartType = "XYScatterLinesNoMarkers";
  }
  const x = chart.axes.categoryAxis;
  x.scaleType = "Logarithmic";
  x.title.text = spec.xTitle;
}

/** "$J$5:$J$28" -> "$J$5". */
function firstCell(range: string): string {
  return range.split(":")[0];
}

/** "$J$5:$J$28" -> "$J$28". */
function lastCell(range: string): string {
  const parts = range.split(":");
  return parts[parts.length - 1];
}
