/**
 * The verdict's own explanation on screen, as the core wrote it: every basis
 * line (method, bound, confidence with its sidedness, size ratio, flaw
 * population, proof credit) and, when censored specimens include the
 * weakest ones, the verdict without censoring beside it.
 */
import type { DesignCheckResult } from "../../src/design/check-result";
import { byId, el } from "./dom";

export function renderBasis(result: DesignCheckResult): void {
  byId("basis").hidden = result.basis.length === 0;
  byId("basis-list").replaceChildren(
    ...result.basis.map((b) =>
      el("li", { attrs: { "data-topic": b.topic } }, [el("span", { className: "topic", text: `${capitalise(b.topic)}: ` }), document.createTextNode(b.text)]),
    ),
  );
  const note = byId("censoring-note");
  const c = result.censoring;
  note.hidden = !(c && c.weakestCensored);
  note.textContent = c && c.weakestCensored ? c.text : "";
}

export function clearBasis(): void {
  byId("basis").hidden = true;
  byId("basis-list").replaceChildren();
  byId("censoring-note").hidden = true;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
