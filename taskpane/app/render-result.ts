/** Step 5 on screen: the verdict line, the labelled results with their basis, and the plot legend. */
import type { DesignCheckResult } from "../../src/design/check-result";
import { byId, el } from "./dom";
import type { ResultRow } from "./result-table";
import type { PlotData } from "../plot/plot-data";
import { formatPercent } from "./format";

export function renderResult(result: DesignCheckResult, rows: ResultRow[]): void {
  const verdict = byId("verdict");
  verdict.textContent = result.verdict.text;
  verdict.className = `verdict ${result.verdict.pass ? "pass" : "fail"}${result.verdict.onLowerBound ? "" : " provisional"}`;
  verdict.dataset.verdict = result.verdict.pass ? "pass" : "fail";

  const list = byId("result-list");
  list.replaceChildren(
    ...rows.flatMap((row) => [
      el("dt", { text: row.label, attrs: { id: `label-${row.id}` } }),
      // data-value keeps the full-precision number for exports and tests; the text shows four figures.
      el("dd", { attrs: { "data-row": row.id, "data-value": row.value === null ? "" : String(row.value) } }, [
        el("span", { className: row.value === null ? "value missing" : "value", text: row.display }),
        el("span", { className: "basis", text: row.basis }),
      ]),
    ]),
  );
}

/** Clear the result when an input is missing or wrong, saying which step to fix. */
export function renderIncomplete(message: string): void {
  const verdict = byId("verdict");
  verdict.textContent = message;
  verdict.className = "verdict incomplete";
  delete verdict.dataset.verdict;
  byId("result-list").replaceChildren();
  byId("plot-figure").hidden = true;
}

export function renderLegend(data: PlotData): void {
  const items: [string, string][] = [
    ["failures", "specimen failures (plotting positions (i - 0.5)/N, adjusted ranks when censored)"],
    ["fit-line", "fitted Weibull line, specimen size"],
  ];
  if (data.partLine) items.push(["part-line", "the same line at the part's size"]);
  if (data.band) items.push(["band", data.bandLabel]);
  else items.push(["no-band", data.bandMissing]);
  if (data.censored.length) items.push(["censored", "censored specimens (strength only)"]);
  items.push(["design-point", "design point: inert allowable stress (point estimate) at the allowed failure probability"]);
  if (data.designLower) items.push(["design-point-lower", `the same at the ${formatPercent(data.confidence)} one-sided lower bound`]);
  items.push(["applied", "applied peak stress"]);
  byId("plot-legend").replaceChildren(
    ...items.map(([cls, text]) => el("li", { className: `key-${cls}` }, [el("span", { className: "swatch", attrs: { "aria-hidden": "true" } }), document.createTextNode(text)])),
  );
}
