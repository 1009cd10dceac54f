/**
 * "Import a test-machine record": a pasted or opened table with a header (id,
 * breaking load, dimensions, fracture origin, lot) turned into strengths for
 * step 1. The columns are mapped once (a guess from the header is offered,
 * and the mapping is remembered for the next record with the same header);
 * the core reads the units from the header and computes every strength
 * (src/design/test-record.ts); the fracture origins choose the flaw
 * population to fit (the others are censored) and the lots are compared with
 * the rest of the record. This file only gathers, asks the core and presents:
 * everything but the lot verdicts comes at once (recordSummary); the lot
 * lines say "comparing ..." until the simulated verdicts arrive from a run off
 * the page thread (functions/record-lots-run.ts). A newer update drops the
 * run under way, and its answer is never shown.
 */
import { guessColumns, type Label, QUANTITIES, type Quantity, type TestConfiguration } from "../../src/design/test-record";
import { type ImportAnswer, type LotLine, pendingLotLines, type RecordLot, type RecordTable, readRecordTable, recordSummary } from "../../src/design/record-import-answer";
import { InputError } from "../../src/errors";
import { decodeText } from "../../src/input/encoding";
import { quoteText, readTypedNumber, trimInvisible } from "../../src/input/number-text";
import { RecordLotRuns } from "../../functions/record-lots-run";
import { CANCELED } from "../../functions/sliced-run";
import { byId, el } from "../app/dom";

const QUANTITY_NAMES: Record<Quantity, string> = {
  load: "Breaking load",
  outerSpan: "Outer (support) span",
  innerSpan: "Inner (load) span, 0 for three-point",
  width: "Width",
  depth: "Depth",
  diameter: "Diameter",
  loadDiameter: "Load ring diameter",
  pistonDiameter: "Piston diameter",
  supportDiameter: "Support diameter",
  diskDiameter: "Disk diameter",
  thickness: "Thickness",
  poisson: "Poisson's ratio",
};
const LABELS: Label[] = ["id", "origin", "lot"];
const STORE = "brittle.record-columns";

let table: RecordTable | null = null;
let answer: ImportAnswer | null = null;
const lotRuns = new RecordLotRuns();

function configuration(): TestConfiguration {
  return byId<HTMLSelectElement>("record-config").value as TestConfiguration;
}

function headerKey(t: RecordTable, config: TestConfiguration): string {
  return `${config}|${t.headers.join("\u241f")}`;
}

function remembered(t: RecordTable, config: TestConfiguration): Partial<Record<Quantity | Label, number>> | null {
  try {
    const all = JSON.parse(localStorage.getItem(STORE) ?? "{}") as Record<string, Partial<Record<Quantity | Label, number>>>;
    return all[headerKey(t, config)] ?? null;
  } catch {
    return null;
  }
}

function remember(t: RecordTable, config: TestConfiguration, columns: Partial<Record<Quantity | Label, number>>): void {
  try {
    const all = JSON.parse(localStorage.getItem(STORE) ?? "{}") as Record<string, unknown>;
    all[headerKey(t, config)] = columns;
    localStorage.setItem(STORE, JSON.stringify(all));
  } catch {
    // Storage may be unavailable (private windows): the mapping is then asked again next time.
  }
}

/** One row of the mapping form per quantity: a column of the record, or one value typed for all. */
function renderMapping(t: RecordTable, config: TestConfiguration): void {
  const columns = remembered(t, config) ?? guessColumns(t.headers, config);
  const rows: Node[] = [];
  const options = (selected: number | undefined, typed: boolean) => [
    ...(typed ? [el("option", { text: "one value for all", attrs: { value: "" } })] : [el("option", { text: "(none)", attrs: { value: "" } })]),
    ...t.headers.map((h, i) => {
      const o = el("option", { text: h, attrs: { value: String(i) } });
      if (selected === i) o.selected = true;
      return o;
    }),
  ];
  for (const q of QUANTITIES[config]) {
    const select = el("select", { attrs: { id: `record-col-${q}`, "data-quantity": q } }, options(columns[q], true));
    const value = el("input", { attrs: { id: `record-val-${q}`, type: "text", inputmode: "decimal", autocomplete: "off", "aria-label": `${QUANTITY_NAMES[q]}, one value for all` } });
    rows.push(el("div", { className: "record-map-row" }, [el("label", { text: QUANTITY_NAMES[q], attrs: { for: `record-col-${q}` } }), select, value]));
  }
  for (const l of LABELS) {
    const select = el("select", { attrs: { id: `record-col-${l}`, "data-label": l } }, options(columns[l], false));
    rows.push(el("div", { className: "record-map-row" }, [el("label", { text: l === "id" ? "Specimen id" : l === "origin" ? "Fracture origin" : "Lot", attrs: { for: `record-col-${l}` } }), select]));
  }
  byId("record-mapping").replaceChildren(...rows);
}

function readMapping(config: TestConfiguration): { columns: Partial<Record<Quantity | Label, number>>; fixed: Partial<Record<Quantity, number>> } {
  const columns: Partial<Record<Quantity | Label, number>> = {};
  const fixed: Partial<Record<Quantity, number>> = {};
  for (const what of [...QUANTITIES[config], ...LABELS]) {
    const v = byId<HTMLSelectElement>(`record-col-${what}`).value;
    if (v !== "") columns[what] = Number(v);
  }
  for (const q of QUANTITIES[config]) {
    if (columns[q] !== undefined) continue;
    // A decimal point or comma, whichever the value shows (or the switch states); "1,250" and "40 mm" are refused with the reason.
    const text = trimInvisible(byId<HTMLInputElement>(`record-val-${q}`).value);
    if (text === "") continue;
    const r = readTypedNumber(text, { decimalMark: byId<HTMLInputElement>("decimal-comma").checked ? "comma" : "either" });
    if (!r.ok) throw new InputError("input", `${QUANTITY_NAMES[q]} (one value for all) ${quoteText(text)} ${r.reason}`);
    fixed[q] = r.value;
  }
  return { columns, fixed };
}

function show(message: string): void {
  byId("record-error").textContent = message;
}

function renderLots(lines: readonly LotLine[]): void {
  byId("record-lots").replaceChildren(...lines.map((l) => el("li", { text: `Lot ${l.lot} (${l.specimens} specimens) against the rest: ${l.text}` })));
}

function render(a: ImportAnswer | null): void {
  byId("record-notes").replaceChildren(...(a?.notes ?? []).map((n) => el("li", { text: n })));
  byId("record-preview-body").replaceChildren(
    ...(a?.specimens ?? []).map((s) =>
      el("tr", {}, [
        el("td", { text: s.id }),
        el("td", { text: s.strength === null ? "-" : s.strength.toFixed(1) }),
        el("td", { text: s.origin ?? "" }),
        el("td", { text: s.lot ?? "" }),
        el("td", { text: s.problem ?? "" }),
      ]),
    ),
  );
  byId("record-preview").hidden = !a;
  renderLots(a?.lots ?? []);
  const population = byId<HTMLSelectElement>("record-population");
  const current = population.value;
  population.replaceChildren(
    el("option", { text: "all specimens (one population)", attrs: { value: "" } }),
    ...(a?.origins ?? []).map((o) => el("option", { text: o, attrs: { value: o } })),
  );
  population.value = a?.origins.includes(current) ? current : "";
  byId<HTMLButtonElement>("record-use").disabled = !a;
}

function update(): void {
  answer = null;
  if (!table) {
    lotRuns.cancel();
    return render(null);
  }
  const config = configuration();
  let lots: readonly RecordLot[] = [];
  try {
    const { columns, fixed } = readMapping(config);
    const summary = recordSummary({ table, configuration: config, columns, fixed, population: byId<HTMLSelectElement>("record-population").value });
    lots = summary.lots;
    answer = { ...summary, lots: pendingLotLines(lots) };
    remember(table, config, columns);
    show("");
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    show(error.message.charAt(0).toUpperCase() + error.message.slice(1) + ".");
  }
  render(answer);
  if (answer && lots.length > 0) void showVerdicts(answer, lots);
  else lotRuns.cancel(); // nothing to compare now: a run still under way is stale
}

/** Replaces the pending lot lines of `shown` by the simulated verdicts, unless a newer update came first. */
async function showVerdicts(shown: ImportAnswer, lots: readonly RecordLot[]): Promise<void> {
  const outcome = await lotRuns.verdicts(lots);
  if (outcome === CANCELED || answer !== shown) return; // dropped, or the panel shows a newer request
  if ("error" in outcome) {
    renderLots([]);
    show(outcome.error.charAt(0).toUpperCase() + outcome.error.slice(1) + ".");
    return;
  }
  shown.lots = outcome.lines;
  renderLots(outcome.lines);
}

function load(text: string): void {
  try {
    table = readRecordTable(text, byId<HTMLInputElement>("decimal-comma").checked);
    renderMapping(table, configuration());
    show("");
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    table = null;
    byId("record-mapping").replaceChildren();
    show(error.message.charAt(0).toUpperCase() + error.message.slice(1) + ".");
  }
  update();
}

/** Wires the panel; `use` receives the strengths text for step 1. */
export function setupRecordImport(use: (text: string, description: string) => void): void {
  byId("record-read").addEventListener("click", () => load(byId<HTMLTextAreaElement>("record-text").value));
  byId<HTMLInputElement>("record-file").addEventListener("change", async (event) => {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    // Bytes, not text: the shared reader detects UTF-16 and a byte-order mark as for the command line.
    const { text } = decodeText(new Uint8Array(await file.arrayBuffer()));
    byId<HTMLTextAreaElement>("record-text").value = text;
    load(text);
  });
  byId("record-config").addEventListener("change", () => {
    if (table) renderMapping(table, configuration());
    update();
  });
  byId("record-mapping").addEventListener("change", update);
  byId("record-mapping").addEventListener("input", update);
  byId("record-population").addEventListener("change", update);
  byId("record-use").addEventListener("click", () => {
    if (!answer) return;
    const population = byId<HTMLSelectElement>("record-population").value;
    use(answer.pasteText, `From a test-machine record: ${answer.specimens.filter((s) => s.strength !== null).length} strengths${population ? `, fitting origin "${population}"` : ""}.`);
  });
  render(null);
}
