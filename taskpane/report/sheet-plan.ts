/**
 * The layout of the report sheet, as plain data: which cells hold inputs,
 * which hold live BRITTLE formulas that recompute when an input or the test
 * data change, the plot points and lines for a native scatter chart, and the
 * cautions. The writer (sheet-writer.ts) only copies this into the workbook,
 * so the layout can be checked without a spreadsheet.
 *
 * Columns A-D: label, value, unit, what the value rests on. Columns F-G: the
 * strengths when they were pasted into the form (a selected range is referred
 * to where it is). Columns I-L: chart data.
 */
import type { DesignCheckResult } from "../../src/design/check-result";
import type { Caution } from "../../src/design/check-result";
import { formatPercent } from "../app/format";
import { METHOD_LABELS } from "../../src/design/check-description";
import { weibullY } from "../plot/plot-data";
import { reportContent } from "../export/report-content";
import { absolute, absoluteRange, rangeAddress } from "./a1";

export type Cell = string | number | boolean;

export type BlockStyle = "title" | "note" | "heading" | "label" | "input" | "result" | "text" | "data" | "warning";

export interface Block {
  /** A1 range on the new sheet. */
  address: string;
  cells: Cell[][];
  /** True: strings starting with "=" are formulas. False: every string is text. */
  formulas: boolean;
  style: BlockStyle;
  numberFormat?: string;
}

export interface ChartSeriesPlan {
  name: string;
  x: string;
  y: string;
  lines: boolean;
}

export interface ChartPlan {
  title: string;
  xTitle: string;
  yTitle: string;
  series: ChartSeriesPlan[];
  /** Cells the chart covers. */
  from: string;
  to: string;
}

export interface SheetPlan {
  baseName: string;
  blocks: Block[];
  chart: ChartPlan;
  /** Where the check's main numbers live, for the test and for selecting after writing. */
  refs: Record<string, string>;
}

const A = 0;
const B = 1;
const C = 2;
const F = 5;
const I = 8;
// Spill area of PLOTPOINTS, right of a pasted element table (W to AC at most).
const AG = 32;

// Number formats: four significant figures read well for stresses; probabilities in scientific notation.
const STRESS = "0.0";
const PROBABILITY = "0.00E+00";
const RATIO = "0.000";
/**
 * The reserve factor and the margin beside the verdict: three decimals, but more where three would
 * round a FAIL up to look like a pass (0.9996 shown "1.000", -0.0004 shown "0.000"). Spreadsheet
 * number-format conditions (ECMA-376 Part 1, number format codes) pick the longer form only near the
 * edge; the sheet's formulas stay live, so the format must follow whatever value they give.
 * Checked with numfmt, an implementation of the spreadsheet format codes (test/taskpane-report-sheet.test.ts).
 */
const RESERVE_FACTOR = "[>=1]0.000;[>=0.9995]0.000###########;0.000";
const MARGIN = "[>=0]0.000;[>-0.0005]0.000###########;0.000";

export interface PlanOptions {
  /** BRITTLE functions registered in this build. */
  functions: ReadonlySet<string>;
  cautions: Caution[];
  written: Date;
}

/**
 * Every function the sheet's formulas call must be registered in this build: a renamed or removed
 * one fails here (and in the report-sheet test), never drops its row from the sheet silently.
 */
function registered(fns: ReadonlySet<string>, name: string): true {
  if (!fns.has(name)) throw new Error(`the report sheet calls BRITTLE.${name}, which this build does not register`);
  return true;
}

export function planReportSheet(result: DesignCheckResult, options: PlanOptions): SheetPlan {
  const input = result.input;
  const blocks: Block[] = [];
  const refs: Record<string, string> = {};
  const put = (row: number, col: number, cells: Cell[][], style: BlockStyle, formulas = false, numberFormat?: string) =>
    blocks.push({ address: rangeAddress(row, col, cells.length, cells[0].length), cells, formulas, style, numberFormat });

  put(0, A, [["Brittle design check"]], "title");
  put(1, A, [[
    `Written ${options.written.toISOString().slice(0, 16).replace("T", " ")} UTC by the design-check form. ` +
      "Column B recomputes with BRITTLE formulas: change an input (shaded) or the test data and the results follow.",
  ]], "note");

  // ---- Inputs ----
  let row = 3;
  put(row++, A, [["Inputs", "Value", "Unit", "Notes"]], "heading");
  const input1 = (key: string, label: string, value: Cell, unit: string, note: string, format?: string) => {
    put(row, A, [[label]], "label");
    put(row, B, [[value]], "input", false, format);
    put(row, C, [[unit, note]], "text");
    refs[key] = absolute(row, B);
    row++;
  };
  const stressUnit = safeText(input.stressUnit);
  const sizeUnit = safeText(input.sizeUnit);
  input1("confidence", "Confidence level", result.confidence.oneSided, "", `${result.confidence.boundLabel}, for the allowables and the lot count`);

  // Data: pasted strengths go to F:G of this sheet; a selected range stays where it is.
  let strengths = "";
  let flags = "";
  const material = input.material;
  if (material.kind === "data") {
    input1("method", "Estimation method", material.method, "", METHOD_LABELS[material.method]);
    if (material.source?.kind === "range") {
      strengths = material.source.strengthsAddress;
      flags = material.source.flagsAddress ?? "";
      put(row++, A, [["Strength data", strengths, stressUnit, flags ? `censoring flags in ${flags}` : "no censoring flags"]], "text");
    } else {
      const n = material.strengths.length;
      put(3, F, [[`Strength (${stressUnit})`, "Censored"]], "heading");
      put(4, F, material.strengths.map((s, i) => [s, Boolean(material.censored?.[i])]), "data");
      strengths = absoluteRange(4, F, n);
      flags = absoluteRange(4, F + 1, n);
      put(row++, A, [["Strength data", `${n} specimens in F5:G${4 + n}`, stressUnit, "pasted into the form; edit them there"]], "text");
    }
    refs.strengths = strengths;
  } else {
    input1("typedModulus", "Weibull modulus (typed)", material.shape, "", "typed: not estimated from data");
    input1("typedScale", "Characteristic strength (typed)", material.scale, stressUnit, "typed: specimen size", STRESS);
  }
  // Specimen and part: typed sizes are inputs; configurations, dimensions and tables become formulas below.
  const word = input.flaws === "volume" ? "volume" : "area";
  const sp = input.specimen;
  if (sp.kind === "typed") {
    input1("specimenSizeTyped", `Specimen effective ${word}`, sp.effectiveSize, sizeUnit, "typed");
  } else if (sp.kind === "preset") {
    input1("configuration", "Specimen configuration", safeText(sp.configuration), "", result.specimenSize.basis);
    if (sp.poisson !== undefined) input1("poisson", "Poisson's ratio", sp.poisson, "", "disk specimens");
  } else {
    input1("outerSpan", "Outer span", sp.outerSpan, "mm", "");
    input1("innerSpan", "Inner span", sp.innerSpan, "mm", "0 for three-point flexure");
    input1("barWidth", "Bar width (tensile face)", sp.width, "mm", "");
    input1("barDepth", "Bar depth", sp.depth, "mm", "");
  }
  if (sp.kind !== "typed" || input.part.kind === "table") input1("criterion", "Multiaxial criterion", input.criterion, "", "disks and element tables");
  const pt = input.part;
  let table: { stresses: string; sizes: string } | null = null;
  if (pt.kind === "typed") {
    input1("partSizeTyped", `Part effective ${word}`, pt.effectiveSize, sizeUnit, "typed");
  } else if (pt.source?.kind === "range") {
    table = { stresses: pt.source.stressesAddress, sizes: pt.source.sizesAddress };
    put(row++, A, [["Element table", `${table.stresses} with sizes ${table.sizes}`, "", "stresses and element sizes where they are"]], "text");
  } else {
    // Pasted tables go beside the chart data, from column W.
    const W = 22;
    put(3, W, [[...Array.from({ length: pt.columns }, (_, j) => `Stress ${j + 1} (${stressUnit})`), `Element ${word} (${sizeUnit})`]], "heading");
    put(4, W, pt.stresses.map((r, i) => [...r, pt.sizes[i]]), "data");
    table = { stresses: absoluteRange(4, W, pt.sizes.length, pt.columns), sizes: absoluteRange(4, W + pt.columns, pt.sizes.length) };
    put(row++, A, [["Element table", `${pt.sizes.length} rows from column W`, "", "pasted into the form"]], "text");
  }
  if (input.requirement.kind === "survival") {
    input1("survival", "Required survival per part", input.requirement.survival, "", "probability", "0.0000000");
  } else {
    input1("allowedFailures", "Expected failures allowed per lot", input.requirement.allowedFailures, "", "");
  }
  if (input.appliedStress !== null) {
    input1("applied", "Applied peak stress", input.appliedStress, stressUnit, "");
  }
  input1("lotSize", "Parts per lot", input.lotSize, "", "");
  const life = input.lifetime;
  if (life) {
    input1("lifetime", "Required life at the applied stress", life.lifetime, safeText(life.timeUnit), "constant stress");
    input1("scgN", "Crack-growth exponent n", life.n, "", "service environment");
    input1("scgB", "Crack-growth parameter B", life.B, safeText(life.bUnit), "service environment");
  }
  if (input.proof) input1("proofStress", "Proof stress", input.proof.proofStress, stressUnit, "every part, inert unloading");

  // ---- Results ----
  row++;
  put(row++, A, [["Results", "Value", "Unit", "Method and assumptions"]], "heading");
  const result1 = (key: string, label: string, formula: string, unit: string, note: string, format?: string) => {
    put(row, A, [[label]], "label");
    put(row, B, [[formula]], "result", true, format);
    put(row, C, [[unit, note]], "text");
    refs[key] = absolute(row, B);
    row++;
  };
  const args = material.kind === "data" ? `${strengths},${flags},${refs.method}` : "";
  if (material.kind === "data") {
    result1("modulus", "Weibull modulus m", `=BRITTLE.MODULUS(${args})`, "", result.parameters.basis, RATIO);
    result1("scale", "Characteristic strength", `=BRITTLE.CHARSTRENGTH(${args})`, stressUnit, "specimen size", STRESS);
  } else {
    result1("modulus", "Weibull modulus m", `=${refs.typedModulus}`, "", "typed", RATIO);
    result1("scale", "Characteristic strength", `=${refs.typedScale}`, stressUnit, "typed, specimen size", STRESS);
  }
  const m = refs.modulus;
  const th = refs.scale;
  result1("mean", "Mean strength", `=BRITTLE.MEANSTRENGTH(${m},${th})`, stressUnit, "specimen size", STRESS);
  const fns = options.functions;
  const size = (key: string, label: string, formula: string | null, typedRef: string | undefined, value: number, note: string, unit = sizeUnit) => {
    if (typedRef) refs[key] = typedRef;
    else if (formula) result1(key, label, formula, unit, note);
    else {
      // The cell function is not in this build: the value at the time of writing, said plainly.
      put(row, A, [[label]], "label");
      put(row, B, [[value]], "data");
      put(row, C, [[unit, `${note} (value when written: recompute in the form)`]], "text");
      refs[key] = absolute(row, B);
      row++;
    }
  };
  const flawsWord = input.flaws === "volume" ? "VOLUME" : "SURFACE";
  const specimenFormula =
    sp.kind === "preset" && registered(fns, "SPECIMEN")
      ? `=BRITTLE.SPECIMEN(${refs.configuration},${m},"${flawsWord}"${refs.poisson ? `,${refs.poisson},${refs.criterion}` : ""})`
      : sp.kind === "bar" && registered(fns, input.flaws === "volume" ? "FLEXVOLUME" : "FLEXAREA")
        ? `=BRITTLE.${input.flaws === "volume" ? "FLEXVOLUME" : "FLEXAREA"}(${m},${refs.outerSpan},${refs.innerSpan},${refs.barWidth},${refs.barDepth})`
        : null;
  size("specimenSize", `Specimen effective ${word}`, specimenFormula, refs.specimenSizeTyped, result.specimenSize.value, result.specimenSize.basis);
  const partFormula = table && registered(fns, "PARTEFFSIZE") ? `=BRITTLE.PARTEFFSIZE(${table.stresses},${table.sizes},${m},${refs.criterion})` : null;
  size("partSize", `Part effective ${word}`, partFormula, refs.partSizeTyped, result.partSize.value, result.partSize.basis);
  if (!refs.applied) {
    // The table's peak: MAX over principal stresses is live; tensors need the core's principal stresses.
    const live = table && pt.kind === "table" && pt.columns !== 6;
    if (live) result1("applied", "Applied peak stress", `=MAX(${table!.stresses})`, stressUnit, "peak of the element table", STRESS);
    else size("applied", "Applied peak stress", null, undefined, result.appliedStress.value, "peak of the element table", stressUnit);
  }
  result1("sizeRatio", "Size ratio, part / specimen", `=${refs.partSize}/${refs.specimenSize}`, "", result.sizeRatio.basis, RATIO);
  if (input.requirement.kind === "survival") {
    result1("targetPf", "Allowed failure probability per part", `=1-${refs.survival}`, "", "1 - required survival", PROBABILITY);
    refs.survivalUsed = refs.survival;
  } else {
    result1("targetPf", "Allowed failure probability per part", `=${refs.allowedFailures}/${refs.lotSize}`, "", "failures allowed / parts per lot", PROBABILITY);
    result1("survivalUsed", "Required survival per part", `=1-${refs.targetPf}`, "", "from the failures allowed per lot", "0.0000000");
  }
  const k = refs.sizeRatio;
  result1("allowablePoint", "Allowable stress, point estimate", `=BRITTLE.DESIGNSTRESS(${refs.survivalUsed},${m},${th},${k})`, stressUnit, "two-parameter Weibull, size-scaled", STRESS);

  const conf = formatPercent(result.confidence.oneSided);
  // Only where the form itself has the bound, so the sheet and the form never disagree on the verdict's basis.
  const boundsFormula = registered(options.functions, "DESIGNSTRESSBOUND") && material.kind === "data" && result.allowableLower !== null;
  if (boundsFormula) {
    result1(
      "allowableLower",
      `Allowable stress, ${conf} lower bound`,
      `=BRITTLE.DESIGNSTRESSBOUND(${refs.survivalUsed},${strengths},${flags},${refs.confidence},${k})`,
      stressUnit,
      "one-sided lower confidence bound, pivotal quantities (ASTM C1239)",
      STRESS,
    );
  } else {
    put(row, A, [[`Allowable stress, ${conf} lower bound`]], "label");
    put(row, B, [["not available"]], "text");
    put(row, C, [["", result.allowableLowerMissing ?? ""]], "text");
    row++;
  }
  const shortTerm = refs.allowableLower ?? refs.allowablePoint;
  result1("pfApplied", "Failure probability at the applied stress", `=BRITTLE.FAILPROB(${refs.applied},${m},${th},${k})`, "", "point estimate", PROBABILITY);
  result1("expected", "Expected failures per lot", `=BRITTLE.LOTFAILURES(${refs.pfApplied},${refs.lotSize})`, "", "point estimate x parts per lot", "0.000");
  result1("upperCount", `Failures per lot, ${conf} upper count`, `=BRITTLE.LOTFAILURES(${refs.pfApplied},${refs.lotSize},${refs.confidence})`, "", "binomial lot chance only, not fit uncertainty", "0");

  // Time under load: the same relations as the form, live where the build registers them.
  const derived = (key: string, label: string, fn: string, formula: string, value: number | null, unit: string, note: string, format?: string) => {
    if (registered(fns, fn)) result1(key, label, formula, unit, note, format);
    else {
      put(row, A, [[label]], "label");
      put(row, B, [[value ?? "not available"]], value === null ? "text" : "data", false, format);
      put(row, C, [[unit, `${note} (value when written: ${fn} is not in this build)`]], "text");
      refs[key] = absolute(row, B);
      row++;
    }
  };
  // The design flaw's inert strength on the verdict's basis, floored by the proof stress (src/design/check-time.ts).
  const inertBasis = input.proof ? `MAX(${shortTerm},${refs.proofStress})` : shortTerm;
  if (life) {
    // LIFEDESIGNSTRESS at survival e^-1, m = 1, size ratio 1 starts from an inert strength equal to its scale argument.
    derived("lifetimeAllowable", "Allowable stress over the lifetime", "LIFEDESIGNSTRESS",
      `=BRITTLE.LIFEDESIGNSTRESS(EXP(-1),${refs.lifetime},1,${inertBasis},${refs.scgN},${refs.scgB},1)`,
      result.lifetimeAllowable?.value ?? null, stressUnit,
      `slow crack growth from the design flaw's inert strength (${refs.allowableLower ? "lower bound" : "point estimate"}${input.proof ? ", at least the proof stress" : ""})`, STRESS);
  }
  if (input.proof) {
    derived("proofBreaks", "Parts broken by the proof test", "PROOFBREAKS", `=BRITTLE.PROOFBREAKS(${refs.proofStress},${m},${th},${k})`,
      result.proof?.breaks.pointEstimate ?? null, "", "point estimate", PROBABILITY);
    derived("postProofPf", "Failure probability of survivors at the applied stress", "POSTPROOFFAILPROB",
      `=BRITTLE.POSTPROOFFAILPROB(${refs.applied},${refs.proofStress},${m},${th},${k})`,
      result.proof?.survivorsFailureProbability.value ?? null, "", "inert loading; 0 at or below the proof stress", PROBABILITY);
    if (life) {
      derived("proofMinLife", "Minimum life guaranteed by the proof test", "PROOFMINLIFE",
        `=BRITTLE.PROOFMINLIFE(${refs.proofStress},${refs.applied},${refs.scgN},${refs.scgB})`,
        result.proof?.minimumLife?.value ?? null, safeText(life.timeUnit), "#VALUE! when the applied stress exceeds the proof stress");
    }
  }
  let governing = shortTerm;
  if (life) {
    governing = refs.lifetimeAllowable;
  } else if (input.proof) {
    result1("governing", "Governing allowable stress", `=${inertBasis}`, stressUnit, "the inert allowable, at least the proof stress", STRESS);
    governing = refs.governing;
  }
  result1("reserveFactor", "Reserve factor (allowable / applied)", `=${governing}/${refs.applied}`, "", refs.allowableLower ? "on the lower-bound allowable" : "on the point estimate: no confidence bound", RESERVE_FACTOR);
  result1("marginOfSafety", "Margin of safety (reserve factor - 1)", `=${refs.reserveFactor}-1`, "", "negative when the applied stress exceeds the allowable", MARGIN);
  result1(
    "verdict",
    "Verdict",
    `=IF(${refs.applied}<=${governing},"PASS","FAIL")`,
    "",
    (refs.allowableLower
      ? "PASS when the applied stress is at or below the lower-bound allowable stress"
      : "PASS when the applied stress is at or below the point-estimate allowable stress (provisional: no confidence bound)") +
      (life ? ", and over the lifetime" : ""),
  );

  // ---- Cautions ----
  row++;
  put(row++, A, [["Cautions"]], "heading");
  for (const c of options.cautions) {
    put(row++, A, [[c.level === "warning" ? "Warning" : "Note", c.text]], c.level === "warning" ? "warning" : "text");
  }

  // ---- For the review: what the verdict rests on, the methods, and the fields a reviewer fills ----
  // The same content as the printed report (export/report-content.ts), below the live part of the sheet.
  const report = reportContent(result, options.written);
  row++;
  put(row++, A, [["What the verdict rests on (when written)"]], "heading");
  for (const b of report.basis) put(row++, A, [[safeText(b.topic), safeText(b.text)]], "text");
  row++;
  put(row++, A, [["Methods and references"]], "heading");
  for (const m of report.methods) put(row++, A, [[safeText(m)]], "text");
  row++;
  put(row++, A, [["Identification and sign-off", "Fill in"]], "heading");
  for (const f of [...report.identification, ...report.signatures.map((label) => ({ label, value: "" }))]) {
    put(row, A, [[f.label]], "label");
    put(row, B, [[safeText(f.value)]], "input");
    row++;
  }

  const chart = planChart(result, refs, blocks, strengths, flags, stressUnit, registered(fns, "PLOTPOINTS"));
  return { baseName: "Design check", blocks, chart, refs };
}

/**
 * Chart data in I:L: the plotted failures, two points each of the fitted line
 * at specimen and part size (straight on these axes), and the design point.
 * The y values are the Weibull variate ln(-ln(1 - P)), which the native chart
 * cannot label in percent; column L gives P beside each.
 */
function planChart(
  result: DesignCheckResult,
  refs: Record<string, string>,
  blocks: Block[],
  strengths: string,
  flags: string,
  stressUnit: string,
  plotPoints: boolean,
): ChartPlan {
  const put = (row: number, col: number, cells: Cell[][], style: BlockStyle, formulas = false, numberFormat?: string) =>
    blocks.push({ address: rangeAddress(row, col, cells.length, cells[0].length), cells, formulas, style, numberFormat });
  const series: ChartSeriesPlan[] = [];
  let row = 3;
  put(row++, I, [["Chart data", `Stress (${stressUnit})`, "ln(-ln(1-P))", "P"]], "heading");

  const points = result.points;
  const complete = result.censoredStrengths.length === 0;
  if (points.length > 0) {
    const first = row;
    if (complete && strengths) {
      // Live: the i-th smallest positive strength and its (i - 0.5)/N position.
      put(row, I, points.map((_, i) => {
        const r = row + i + 1;
        return [
          i + 1,
          `=SMALL(${strengths},COUNTIF(${strengths},"<=0")+I${r})`,
          `=LN(-LN(1-L${r}))`,
          `=(I${r}-0.5)/COUNTIF(${strengths},">0")`,
        ];
      }), "data", true);
    } else if (strengths && plotPoints) {
      // Adjusted ranks have no native formula: PLOTPOINTS spills its header row, then ln(strength), Y and P
      // from column AG, failures first.
      put(3, AG, [[`=BRITTLE.PLOTPOINTS(${strengths}${flags ? `,${flags}` : ""})`]], "data", true);
      put(row, I, points.map((_, i) => {
        const r = row + i + 1;
        return [i + 1, `=EXP(AG${r})`, `=AH${r}`, `=1-EXP(-EXP(K${r}))`];
      }), "data", true);
    } else {
      // No live source for adjusted ranks in this build: values at the time of writing.
      put(row, I, points.map((p, i) => [i + 1, p.strength, p.y, p.failureProbability]), "data");
    }
    row += points.length;
    series.push({ name: "Failures", x: absoluteRange(first, I + 1, points.length), y: absoluteRange(first, I + 2, points.length), lines: false });
    const live = complete ? "plot points follow the data (specimens present when written)"
      : plotPoints && strengths ? "censored sample: adjusted ranks from PLOTPOINTS in AG:AH, live"
        : "censored sample: plot points are values at the time of writing";
    put(row++, I, [[live]], "note");
  }

  const pMin = Math.min(result.targetFailureProbability.value, points[0]?.failureProbability ?? 0.5, 0.01) / 3;
  const yLow = weibullY(Math.max(pMin, 1e-12));
  const yHigh = weibullY(0.999);
  const line = (name: string, sizeRatio: string) => {
    put(row++, I, [[name]], "label");
    const first = row;
    put(row, I, [yLow, yHigh].map((y, j) => {
      const r = row + j + 1;
      return ["", `=BRITTLE.DESIGNSTRESS(EXP(-EXP(K${r})),${refs.modulus},${refs.scale}${sizeRatio})`, y, `=1-EXP(-EXP(K${r}))`];
    }), "data", true);
    row += 2;
    series.push({ name, x: absoluteRange(first, I + 1, 2), y: absoluteRange(first, I + 2, 2), lines: true });
  };
  line("Fitted line, specimen size", "");
  line("Fitted line, part size", `,${refs.sizeRatio}`);

  put(row++, I, [["Design point"]], "label");
  put(row, I, [["", `=${refs.allowablePoint}`, `=LN(-LN(${refs.survivalUsed}))`, `=1-${refs.survivalUsed}`]], "data", true);
  series.push({ name: "Design point (point estimate)", x: absolute(row, I + 1), y: absolute(row, I + 2), lines: false });

  return {
    title: "Weibull probability plot",
    xTitle: `Stress (${stressUnit}), log scale`,
    yTitle: "ln(-ln(1 - failure probability))",
    series,
    from: `N4`,
    to: `U24`,
  };
}

/** Units are free text: never let one start a formula in the sheet. */
export function safeText(text: string): string {
  return text.replace(/^[=+\-@\s]+/, "");
}
