/**
 * The explanation on screen: the formula, each argument with what it read
 * (specimens, failures, censored, blanks skipped), the result or the full
 * message of its error, and the basis. Text reaches the page only through
 * textContent: a formula or a cell's text is never parsed as HTML.
 */
import { el } from "../app/dom";
import { sig } from "../app/format";
import type { ArgumentReport, CallExplanation, Explanation, Outcome } from "./explain-call";

export function renderExplanation(container: HTMLElement, explanation: Explanation): void {
  const call = explanation.call;
  container.replaceChildren(
    el("p", { className: "explain-head" }, [
      el("strong", { text: `BRITTLE.${call.name}` }),
      document.createTextNode(explanation.address ? ` in ${explanation.address}` : ""),
    ]),
    el("p", { className: "explain-formula" }, [el("code", { text: explanation.formula })]),
    ...callParts(call, "explain"),
    ...(explanation.notes.length
      ? [el("ul", { className: "explain-notes" }, explanation.notes.map((n) => el("li", { text: n })))]
      : []),
  );
}

export function renderExplainProblem(container: HTMLElement, message: string): void {
  container.replaceChildren(el("p", { className: "step-error explain-problem", text: message }));
}

function callParts(call: CallExplanation, idPrefix: string): HTMLElement[] {
  const parts: HTMLElement[] = [];
  if (call.description) parts.push(el("p", { className: "help explain-description", text: call.description.replace(/\s*Example:.*$/s, "") }));
  parts.push(el("h3", { text: "Arguments and what they read" }));
  parts.push(
    el(
      "dl",
      { className: "explain-args" },
      call.arguments.flatMap((a) => [
        el("dt", { text: `${a.position}. ${a.parameter}` }),
        el("dd", { attrs: { "data-argument": a.parameter } }, [
          el("span", { className: "explain-read", text: !a.written || a.written === a.read ? a.read : `${a.written}: ${a.read}` }),
          ...countLine(a),
          ...(a.nested ? [el("div", { className: "explain-nested" }, callParts(a.nested, `${idPrefix}-${a.position}`))] : []),
        ]),
      ]),
    ),
  );
  parts.push(el("h3", { text: "Result" }));
  parts.push(outcomeNode(call.outcome, idPrefix));
  if (call.basis.length) {
    parts.push(el("h3", { text: "Basis" }));
    parts.push(el("ul", { className: "explain-basis" }, call.basis.map((b) => el("li", { text: b }))));
  }
  return parts;
}

function countLine(a: ArgumentReport): HTMLElement[] {
  if (a.sample) {
    const s = a.sample;
    const censored = s.censored > 0 ? `${s.failures} failures and ${s.censored} censored` : `${s.failures} failures, none censored`;
    return [
      el("span", {
        className: "explain-counts",
        attrs: { "data-specimens": String(s.specimens), "data-censored": String(s.censored), "data-blanks": String(s.blanks) },
        text: `${s.specimens} specimens read (${censored}); ${s.blanks} blank or zero cell${s.blanks === 1 ? "" : "s"} skipped, of ${s.cells}`,
      }),
    ];
  }
  if (a.numbers) {
    const n = a.numbers;
    return [el("span", { className: "explain-counts", text: `${n.numbers} numbers read; ${n.blanks} blank or zero cell${n.blanks === 1 ? "" : "s"} skipped, of ${n.cells}` })];
  }
  return [];
}

function outcomeNode(o: Outcome, idPrefix: string): HTMLElement {
  switch (o.kind) {
    case "value":
      return el("p", {
        className: "explain-result",
        attrs: { id: `${idPrefix}-result`, "data-value": String(o.value) },
        text: typeof o.value === "number" ? `${sig(o.value, 6)} (full precision ${o.value})` : String(o.value),
      });
    case "error":
      return el("p", {
        className: "explain-result explain-error",
        attrs: { id: `${idPrefix}-result`, "data-code": o.code },
        text: `${o.code} ${o.message}`,
      });
    case "not-evaluated":
      return el("p", { className: "explain-result explain-missing", attrs: { id: `${idPrefix}-result` }, text: `Not re-evaluated: ${o.reason}` });
    case "table":
      return el("table", { className: "explain-table", attrs: { id: `${idPrefix}-result` } }, [
        el(
          "tbody",
          {},
          o.rows.map((row) =>
            el("tr", {}, (row as unknown[]).map((v) => el("td", { text: typeof v === "number" ? sig(v, 6) : v === null || v === undefined ? "" : String(v) }))),
          ),
        ),
      ]);
  }
}
