/**
 * Step 3, the part: its effective size typed in the specimen's unit, or from
 * a table of element stresses and sizes exported from a finite-element model
 * (pasted, or the selected range in a spreadsheet).
 */
import { byId, FieldError, radioValue, requiredNumber } from "../app/dom";
import type { PartDescription, TableSource } from "../../src/design/check-description";
import { setRadio } from "./fill";
import { readElementTable, TableError } from "../app/parse-table";

export const PART_FIELDS = ["part-size", "element-table"];

/** The range the table box was last filled from; editing the text by hand drops it. */
let fromRange: { text: string; source: TableSource & { kind: "range" } } | null = null;

export function setupPart(onChange: () => void): void {
  for (const radio of document.querySelectorAll<HTMLInputElement>('input[name="part-source"]')) {
    radio.addEventListener("change", () => {
      const table = radioValue("part-source") === "table";
      byId("part-typed").hidden = table;
      byId("part-table").hidden = !table;
      onChange();
    });
  }
}

export function fillElementTable(text: string, source: (TableSource & { kind: "range" }) | null): void {
  byId<HTMLTextAreaElement>("element-table").value = text;
  fromRange = source ? { text, source } : null;
}

export function readPart(): PartDescription {
  if (radioValue("part-source") === "table") {
    const text = byId<HTMLTextAreaElement>("element-table").value;
    const note = byId("element-table-note");
    note.textContent = "";
    try {
      const { table, notes } = readElementTable(text, {
        decimalComma: byId<HTMLInputElement>("decimal-comma").checked,
        stressUnit: byId<HTMLInputElement>("stress-unit").value.trim() || undefined,
        sizeUnit: byId<HTMLSelectElement>("size-unit").value,
      });
      note.textContent = notes.join(" ");
      const source: TableSource = fromRange && fromRange.text === text ? fromRange.source : { kind: "pasted" };
      return { kind: "table", ...table, source };
    } catch (error) {
      if (error instanceof TableError) throw new FieldError("element-table", error.message);
      throw error;
    }
  }
  const word = radioValue("flaws") === "surface" ? "area" : "volume";
  return { kind: "typed", effectiveSize: requiredNumber("part-size", `part's effective ${word}`, { positive: true }) };
}

/** Put a saved check's part into the form (reopening a check file). */
export function fillPart(part: PartDescription): void {
  setRadio("part-source", part.kind);
  if (part.kind === "typed") {
    byId<HTMLInputElement>("part-size").value = String(part.effectiveSize);
  } else {
    fillElementTable(part.stresses.map((row, i) => [...row, part.sizes[i]].join("\t")).join("\n"), null);
  }
}
