/** The caution notes next to the result: warnings first, each marked in words as well as colour. */
import type { Caution } from "../../src/design/check-result";
import { byId, el } from "./dom";

export function renderCautions(cautions: Caution[]): void {
  const ordered = [...cautions.filter((c) => c.level === "warning"), ...cautions.filter((c) => c.level === "note")];
  byId("caution-list").replaceChildren(
    ...ordered.map((c) =>
      el("li", { className: c.level, attrs: { "data-caution": c.id } }, [
        el("strong", { text: c.level === "warning" ? "Warning: " : "Note: " }),
        document.createTextNode(c.text),
      ]),
    ),
  );
}
