/**
 * Which columns of an element table hold the stresses, the element sizes and
 * (optionally) the element ids.
 *
 * Explicit choice: names from the header or 1-based positions, e.g.
 * stress ["S1", "S2", "S3"], size "IVOL", id "ELEM" (or none).
 *
 * With a header and no explicit choice, names are matched ignoring case,
 * spaces, underscores and dots:
 *   tensor     SXX SYY SZZ SXY SYZ SZX (also S11 S22 S33 S12 S23 S13/S31, SXZ)
 *   principal  S1 S2 S3, SP1 SP2 SP3, SMAX SMID SMIN, MAXPRINCIPAL MIDPRINCIPAL MINPRINCIPAL
 *   single     S, STRESS, SMAX, MAXPRINCIPAL, S1 (when only one stress column is found)
 *   size       SIZE, VOLUME, VOL, IVOL, EVOL, AREA, IAREA, EAREA, V, A, DV, DA
 *   id         ID, ELEMENT, ELEM, ELEMENTID, ELEMID, EID, LABEL
 * A full tensor wins over principal stresses, which win over a single column.
 *
 * Without a header, by count: 2 fields = stress, size; 3 = id, stress, size;
 * 4 = s1, s2, s3, size; 5 = id, s1, s2, s3, size; 7 = six tensor components,
 * size; 8 = id, tensor, size. Other counts need an explicit choice.
 */
import { InputError } from "../errors";
import type { StressColumns } from "./part";

export interface ColumnChoice {
  /** Names or 1-based positions of 1, 3 or 6 stress columns. */
  stress?: readonly (string | number)[];
  /** Name or 1-based position of the size column. */
  size?: string | number;
  /** Name or 1-based position of the id column; null for none. */
  id?: string | number | null;
}

export interface ResolvedColumns {
  /** 0-based field positions of the stress columns, in table order. */
  stress: number[];
  kind: StressColumns;
  size: number;
  /** 0-based position of the id column, or -1. */
  id: number;
  /** Names for the report (header names, or "column k"). */
  labels: { stress: string[]; size: string; id: string | null };
}

function norm(name: string): string {
  return name.toUpperCase().replace(/[\s_.\-()[\]]+/g, "");
}

const TENSOR: string[][] = [
  ["SXX", "S11"],
  ["SYY", "S22"],
  ["SZZ", "S33"],
  ["SXY", "S12", "SYX", "S21"],
  ["SYZ", "S23", "SZY", "S32"],
  ["SZX", "S31", "SXZ", "S13"],
];
const PRINCIPAL: string[][] = [
  ["S1", "SP1", "SMAX", "MAXPRINCIPAL", "SMAXPRINCIPAL"],
  ["S2", "SP2", "SMID", "MIDPRINCIPAL", "SMIDPRINCIPAL"],
  ["S3", "SP3", "SMIN", "MINPRINCIPAL", "SMINPRINCIPAL"],
];
const SINGLE = ["S", "STRESS", "SMAX", "MAXPRINCIPAL", "SMAXPRINCIPAL", "S1", "SP1"];
const SIZE = ["SIZE", "VOLUME", "VOL", "IVOL", "EVOL", "AREA", "IAREA", "EAREA", "V", "A", "DV", "DA"];
const ID = ["ID", "ELEMENT", "ELEM", "ELEMENTID", "ELEMID", "EID", "LABEL"];

function findName(names: string[], wanted: readonly string[]): number {
  for (const w of wanted) {
    const at = names.indexOf(w);
    if (at >= 0) return at;
  }
  return -1;
}

function pick(ref: string | number, header: string[] | null, fieldCount: number, what: string): number {
  if (typeof ref === "number" || /^\s*\d+\s*$/.test(String(ref))) {
    const k = Number(ref);
    if (!(Number.isInteger(k) && k >= 1 && k <= fieldCount)) {
      throw new InputError("input", `${what} column ${ref} is outside 1..${fieldCount}`);
    }
    return k - 1;
  }
  if (!header) throw new InputError("input", `${what} column "${ref}" given by name, but the table has no header`);
  const at = header.map(norm).indexOf(norm(ref));
  if (at < 0) throw new InputError("input", `${what} column "${ref}" is not in the header (${header.join(", ")})`);
  return at;
}

function kindOf(count: number): StressColumns {
  if (count === 1 || count === 3 || count === 6) return count;
  throw new InputError("input", `give 1, 3 or 6 stress columns (got ${count})`);
}

/** Resolves the columns from the header (or null) and the number of fields per row. */
export function resolveColumns(header: string[] | null, fieldCount: number, choice: ColumnChoice = {}): ResolvedColumns {
  const names = header ? header.map(norm) : null;
  let stress: number[] | null = choice.stress ? choice.stress.map((s) => pick(s, header, fieldCount, "stress")) : null;
  let size = choice.size !== undefined ? pick(choice.size, header, fieldCount, "size") : -1;
  let id = choice.id === null ? -1 : choice.id !== undefined ? pick(choice.id, header, fieldCount, "id") : -2;

  if (names) {
    if (!stress) {
      const tensor = TENSOR.map((aliases) => findName(names, aliases));
      const principal = PRINCIPAL.map((aliases) => findName(names, aliases));
      if (tensor.every((k) => k >= 0)) stress = tensor;
      else if (principal.every((k) => k >= 0)) stress = principal;
      else {
        const single = findName(names, SINGLE);
        if (single >= 0) stress = [single];
      }
      if (!stress) {
        throw new InputError("input", `no stress columns recognised in the header (${header!.join(", ")}); name them with --stress`);
      }
    }
    if (size < 0) {
      size = findName(names, SIZE);
      if (size < 0) throw new InputError("input", `no size column recognised in the header (${header!.join(", ")}); name it with --size`);
    }
    if (id === -2) id = findName(names, ID);
  } else if (!stress || size < 0) {
    const layouts: Record<number, [number, number[], number]> = {
      2: [-1, [0], 1],
      3: [0, [1], 2],
      4: [-1, [0, 1, 2], 3],
      5: [0, [1, 2, 3], 4],
      7: [-1, [0, 1, 2, 3, 4, 5], 6],
      8: [0, [1, 2, 3, 4, 5, 6], 7],
    };
    const layout = layouts[fieldCount];
    if (!layout) {
      throw new InputError(
        "input",
        `a table without a header and with ${fieldCount} fields per row needs --stress and --size column choices`,
      );
    }
    if (!stress) stress = layout[1];
    if (size < 0) size = layout[2];
    if (id === -2) id = layout[0];
  }
  if (id === -2) id = -1;
  const kind = kindOf(stress.length);
  const all = [...stress, size, ...(id >= 0 ? [id] : [])];
  if (new Set(all).size !== all.length) throw new InputError("input", "the stress, size and id columns must all differ");
  const label = (k: number) => (header ? header[k] : `column ${k + 1}`);
  return {
    stress,
    kind,
    size,
    id,
    labels: { stress: stress.map(label), size: label(size), id: id >= 0 ? label(id) : null },
  };
}
