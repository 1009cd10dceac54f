/**
 * The printable page: the browser's own print (or save as PDF) of the result
 * step, with the inputs summarised above it; the print stylesheet hides the
 * form controls.
 */
import type { DesignCheckResult } from "../../src/design/check-result";
import { byId, el } from "../app/dom";
import { inputRows } from "./input-rows";

export function preparePrintout(result: DesignCheckResult, written: Date): void {
  const rows = inputRows(result.input);
  const summary = el("section", { className: "print-only print-inputs", attrs: { "aria-hidden": "true", id: "print-inputs" } }, [
    el("h2", { text: "Inputs" }),
    el("dl", {}, rows.flatMap((r) => [el("dt", { text: r.label }), el("dd", { text: `${r.value}${r.unit ? ` ${r.unit}` : ""}` })])),
  ]);
  document.getElementById("print-inputs")?.remove();
  const resultStep = byId("step-result");
  resultStep.parentElement?.insertBefore(summary, resultStep);
  byId("print-footer").textContent =
    `Printed ${written.toISOString().slice(0, 16).replace("T", " ")} UTC from the brittle-design add-in's design-check form.`;
}

export function printReport(result: DesignCheckResult): void {
  preparePrintout(result, new Date());
  window.print();
}
