/**
 * The design check as CSV, for standalone use (no spreadsheet host): the
 * inputs, every result row with its basis, the cautions and the data. Text
 * cells that a spreadsheet would read as a formula are prefixed with an
 * apostrophe, so opening the file never runs anything.
 */
import type { DesignCheckResult } from "../../src/design/check-result";
import type { Caution } from "../../src/design/check-result";
import type { ResultRow } from "../app/result-table";
import { inputRows } from "./input-rows";

type Field = string | number | boolean | null;

export function designCheckCsv(result: DesignCheckResult, rows: ResultRow[], cautions: Caution[]): string {
  const lines: Field[][] = [["Brittle design check"], [], ["Inputs", "value", "unit"]];
  for (const r of inputRows(result.input)) lines.push([r.label, r.value, r.unit]);
  lines.push([], ["Result", "value", "shown as", "method and assumptions"]);
  for (const r of rows) lines.push([r.label, r.value, r.display, r.basis]);
  lines.push([], ["Verdict", result.verdict.pass ? "PASS" : "FAIL", result.verdict.text]);
  lines.push([], ["Cautions"]);
  for (const c of cautions) lines.push([c.level, c.text]);
  const m = result.input.material;
  if (m.kind === "data") {
    lines.push([], ["Strength", "censored"]);
    m.strengths.forEach((s, i) => lines.push([s, Boolean(m.censored?.[i])]));
  }
  return lines.map((line) => line.map(field).join(",")).join("\r\n") + "\r\n";
}

function field(v: Field): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "number") return Number.isFinite(v) ? String(v) : "";
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  const text = /^[=+\-@\t\r]/.test(v) ? `'${v}` : v;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
