// What the property tests read from functions.json to generate arguments for
// a function they have never seen: the kind of each parameter, the domain its
// description states ("> 0", "strictly between 0 and 1", ...), the keywords a
// choice accepts, and the literal arguments of the documented example. Every
// function that lands in the registry is covered through this, with no edits.
import type { FunctionMetadata, ParameterMetadata } from "../functions/metadata";

export type ParamKind =
  | "numberRange" // a range read under the blank rule (strengths, stresses, sizes...)
  | "flagRange" // censoring flags: TRUE/1/"C" or FALSE/0/blank
  | "labelRange" // text labels (fracture origins)
  | "number"
  | "choice" // a keyword from a documented list
  | "text"
  | "boolean"
  | "any";

export function paramKind(p: ParameterMetadata): ParamKind {
  const text = p.description ?? "";
  if (p.dimensionality === "matrix") return /\bflags?\b/i.test(text) ? "flagRange" : /\blabels?\b/i.test(text) ? "labelRange" : "numberRange";
  if (p.type === "number") return "number";
  if (p.type === "boolean") return "boolean";
  if (p.type === "string") return keywords(p).length > 0 ? "choice" : "text";
  return "any";
}

/** The quoted upper-case words a keyword parameter documents ("MLE", "LSQ-MEANRANK", ...). */
export function keywords(p: ParameterMetadata): string[] {
  const found = [...(p.description ?? "").matchAll(/"([A-Z][A-Z0-9-]*)"/g)].map((m) => m[1]);
  return [...new Set(found)];
}

/** The interval a parameter's description promises, e.g. "(stress unit, > 0)". */
export interface Domain {
  lo: number;
  loOpen: boolean;
  hi: number;
  hiOpen: boolean;
  integer: boolean;
}

export function documentedDomain(p: ParameterMetadata): Domain | null {
  const text = (p.description ?? "").replace(/\s+/g, " ");
  let m: RegExpMatchArray | null;
  if (/strictly between 0 and 1/.test(text)) return { lo: 0, loOpen: true, hi: 1, hiOpen: true, integer: false };
  if (/from 0 up to \(not including\) 1/.test(text)) return { lo: 0, loOpen: false, hi: 1, hiOpen: true, integer: false };
  if ((m = text.match(/whole number, (\d[\d.e+]*) to (\d[\d.e+]*)/))) {
    return { lo: Number(m[1]), loOpen: false, hi: Number(m[2]), hiOpen: false, integer: true };
  }
  if ((m = text.match(/between (-?\d+(?:\.\d+)?) and (-?\d+(?:\.\d+)?)/))) {
    return { lo: Number(m[1]), loOpen: false, hi: Number(m[2]), hiOpen: false, integer: false };
  }
  // A condition that applies only under one option ('"RATE": ... > 0; "STATIC": ...') is not a domain.
  const firstClause = text.split(";")[0];
  if ((m = firstClause.match(/(?:^|[\s(,])>= ?(-?\d+(?:\.\d+)?)(?=[\s),;]|$)/))) {
    return { lo: Number(m[1]), loOpen: false, hi: Infinity, hiOpen: true, integer: false };
  }
  if ((m = firstClause.match(/(?:^|[\s(,])> ?(-?\d+(?:\.\d+)?)(?=[\s),;]|$)/))) {
    return { lo: Number(m[1]), loOpen: true, hi: Infinity, hiOpen: true, integer: false };
  }
  return null;
}

/**
 * Whether the policy promises #VALUE! for a negative value in this range: a
 * range of strengths (DESIGN.md), or one whose description states a domain
 * that excludes negatives. Element stresses, where compression is allowed,
 * state none.
 */
export function rejectsNegative(p: ParameterMetadata): boolean {
  const d = documentedDomain(p);
  return /strength/i.test(p.name) || /Blanks and zeros are skipped/.test(p.description ?? "") || (d !== null && d.lo >= 0);
}

/** Column counts a range may have, when its description names them ("one column", "1 column ..., 3 (...) or 6 (...)"). */
export function allowedWidths(p: ParameterMetadata): number[] | null {
  const text = p.description ?? "";
  if (!/column/.test(text)) return null;
  if (/\bone column\b/.test(text)) return [1];
  const widths = [...text.matchAll(/(?:^|[\s:,])(\d+) (?:columns?\b|\()/g)].map((m) => Number(m[1]));
  return widths.length ? widths : null;
}

/** Whether a range must pair cell by cell with another one ("same shape as stresses"). */
export function pairsWithAnother(p: ParameterMetadata): boolean {
  return /same (shape|rows)/i.test(p.description ?? "");
}

/** Argument texts of the documented example, in order; "" for an argument left empty. */
export function exampleArguments(fn: FunctionMetadata): string[] | null {
  const text = fn.description.replace(/\s+/g, " ");
  const start = text.search(new RegExp(`Example: ?=BRITTLE\\.${fn.id}\\(`, "i"));
  if (start < 0) return null;
  const open = text.indexOf("(", start);
  const args: string[] = [];
  let depth = 0;
  let quoted = false;
  let current = "";
  for (let i = open + 1; i < text.length; i++) {
    const ch = text[i];
    if (ch === '"') quoted = !quoted;
    if (!quoted && ch === "(") depth++;
    if (!quoted && ch === ")") {
      if (depth === 0) {
        args.push(current.trim());
        return args.length === 1 && args[0] === "" ? [] : args;
      }
      depth--;
    }
    if (!quoted && depth === 0 && ch === ",") {
      args.push(current.trim());
      current = "";
    } else {
      current += ch;
    }
  }
  return null;
}

export const isRangeText = (s: string) => /^\$?[A-Z]{1,3}\$?\d+:\$?[A-Z]{1,3}\$?\d+$/i.test(s);
