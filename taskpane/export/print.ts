/**
 * The printable report: the browser's own print (or save as PDF) of the
 * result step, framed by a report a reviewer can sign: above it the
 * identification block (fields left to fill by hand) and the inputs; below
 * it the specimen table, the methods with their publications, and the
 * signature lines. The print stylesheet hides the form controls. Everything
 * printed comes from the core's result (report-content.ts).
 */
import type { DesignCheckResult } from "../../src/design/check-result";
import { byId, el } from "../app/dom";
import { inputRows } from "./input-rows";
import { reportContent } from "./report-content";

export function preparePrintout(result: DesignCheckResult, written: Date): void {
  const content = reportContent(result, written);
  const rows = inputRows(result.input);
  const head = el("section", { className: "print-only print-inputs", attrs: { id: "print-inputs" } }, [
    el("h2", { text: "Design check report" }),
    el(
      "dl",
      { className: "print-ident", attrs: { id: "print-ident" } },
      content.identification.flatMap((f) => [
        el("dt", { text: f.label }),
        el("dd", { className: f.value ? "" : "fill-in", text: f.value || " " }),
      ]),
    ),
    el("h2", { text: "Inputs" }),
    el("dl", {}, rows.flatMap((r) => [el("dt", { text: r.label }), el("dd", { text: `${r.value}${r.unit ? ` ${r.unit}` : ""}` })])),
  ]);
  const tail = el("section", { className: "print-only print-appendix", attrs: { id: "print-appendix" } }, [
    el("h2", { text: "Specimens" }),
    content.specimens.length
      ? el("table", { className: "print-specimens" }, [
          el("thead", {}, [el("tr", {}, ["Rank", `Strength (${result.input.stressUnit})`, "Censored"].map((h) => el("th", { text: h })))]),
          el(
            "tbody",
            {},
            content.specimens.map((s) =>
              el("tr", {}, [el("td", { text: String(s.rank) }), el("td", { text: String(s.strength) }), el("td", { text: s.censored ? "yes" : "" })]),
            ),
          ),
        ])
      : el("p", { text: content.specimensMissing ?? "" }),
    el("h2", { text: "Methods and references" }),
    el("ul", { attrs: { id: "print-methods" } }, content.methods.map((m) => el("li", { text: m }))),
    el("h2", { text: "Signatures" }),
    el("dl", { className: "print-ident print-signatures" }, content.signatures.flatMap((s) => [el("dt", { text: s }), el("dd", { className: "fill-in", text: " " })])),
  ]);
  document.getElementById("print-inputs")?.remove();
  document.getElementById("print-appendix")?.remove();
  const resultStep = byId("step-result");
  resultStep.parentElement?.insertBefore(head, resultStep);
  resultStep.after(tail);
  byId("print-footer").textContent =
    `Printed ${written.toISOString().slice(0, 16).replace("T", " ")} UTC from the brittle-design add-in's design-check form. ` +
    "This result supports, and does not replace, the judgement of a licensed engineer under the codes that govern the application.";
}

export function printReport(result: DesignCheckResult): void {
  preparePrintout(result, new Date());
  window.print();
}
