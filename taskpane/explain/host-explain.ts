/**
 * The host side of "Explain the selected cell": read the selected cell's
 * formula (or, inside a spilled table, the formula that spilled it), then
 * every range and defined name the BRITTLE call refers to, in one batch,
 * and hand the values to explainFormula. A whole-column or whole-row
 * reference is read only where the sheet is used: the cells beyond are
 * empty, and a million empty cells would not fit the host's payload.
 */
import type { FunctionMetadata } from "../../functions/metadata";
import { explainFormula, type Explanation, type ReadReference } from "./explain-call";
import { parseFormula, referenceKey, referencesOf, type Argument } from "./formula-parse";

const WHOLE_LINES = /^\$?[A-Z]{1,3}:\$?[A-Z]{1,3}$|^\$?\d+:\$?\d+$/i;

export async function explainSelectedCell(
  context: Excel.RequestContext,
  metadata: readonly FunctionMetadata[] | null,
): Promise<Explanation> {
  let cell = context.workbook.getSelectedRange().getCell(0, 0);
  cell.load("address,formulas,values");
  await context.sync();
  if (!String(cell.formulas[0][0]).startsWith("=")) {
    // A cell of a spilled table holds no formula of its own: explain the formula that spilled it.
    const parent = cell.getSpillParentOrNullObject();
    parent.load("address,formulas,values");
    await context.sync();
    if (parent.isNullObject !== true) cell = parent;
  }
  const parsed = parseFormula(String(cell.formulas[0][0]));
  const refs = referencesOf(parsed.call);
  const sheet = cell.worksheet;
  const reads = refs.map((ref) => ({ ref, range: rangeFor(context, sheet, ref) }));
  for (const r of reads) r.range.load("address,values");
  await context.sync();

  const references = new Map<string, ReadReference>();
  for (const { ref, range } of reads) {
    // Only the OrNullObject lookups (whole lines, names) can come back empty; strict: the flag is a boolean once synced.
    if (range.isNullObject === true) {
      const whole = ref.kind === "reference" && WHOLE_LINES.test(ref.address);
      references.set(referenceKey(ref), whole ? { address: ref.text, values: [[null]] } : { problem: `${ref.text} is not a range in this workbook` });
    } else {
      references.set(referenceKey(ref), { address: range.address, values: range.values as unknown[][] });
    }
  }
  return explainFormula({ address: cell.address, parsed, cellValue: cell.values[0][0], references, metadata });
}

function rangeFor(context: Excel.RequestContext, sheet: Excel.Worksheet, ref: Argument): Excel.Range {
  if (ref.kind === "name") return context.workbook.names.getItem(ref.name).getRangeOrNullObject();
  if (ref.kind !== "reference") throw new Error(`not a reference: ${ref.text}`);
  const target = ref.sheet === null ? sheet : context.workbook.worksheets.getItem(ref.sheet);
  const range = target.getRange(ref.address);
  return WHOLE_LINES.test(ref.address) ? range.getIntersectionOrNullObject(target.getUsedRange(true)) : range;
}
