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
 * A full tensor wins over principal stresses, which win over a 2-D tensor
 * (SXX SYY SXY: plane stress; SXX SYY SZZ SXY: axisymmetric or plane strain,
 * SZZ the hoop or out-of-plane stress; the other components are 0), which
 * wins over two principal stresses (S1 S2: the third is 0, as in plane
 * stress; S1 S3 without S2 is refused), which win over a single column. A unit written in a header name ("S11 (MPa)",
 * "IVOL [mm^3]", "EVOL, m^3", "S1/MPa") is no part of the name: it is kept
 * for the report, and stress columns in different units are refused.
 * Stress components named by --stress are placed by their names (S13 is
 * szx wherever it stands), and a component named where principal stresses
 * are expected (--stress SXX,SYY,SZZ) is refused: it is not a principal
 * stress.
 *
 * A header with a node or integration-point column (NODE, IP, INTPT, ...)
 * marks several rows per element; such a table is refused unless the caller
 * states that each row's size is its own share (pointSizes), and so is a
 * header with node numbers and no size column (nodal-averaged stresses).
 *
 * Without a header, by count: 2 fields = stress, size; 3 = id, stress, size;
 * 4 = s1, s2, s3, size; 5 = id, s1, s2, s3, size; 7 = six tensor components,
 * size; 8 = id, tensor, size. Other counts need an explicit choice.
 */
import { InputError } from "../errors";
import type { StressColumns } from "./part";

export interface ColumnChoice {
  /** Names or 1-based positions of 1, 3 or 6 stress columns (3 or 4 tensor components by name: a 2-D tensor). */
  stress?: readonly (string | number)[];
  /** Name or 1-based position of the size column. */
  size?: string | number;
  /** Name or 1-based position of the id column; null for none. */
  id?: string | number | null;
}

/** How the stress columns are read: 1 maximum principal, 3 principal, 6 tensor (2-D tensors have absent components). */
export type TensorForm = "3-D" | "plane stress" | "axisymmetric or plane strain";

export interface ResolvedColumns {
  /**
   * 0-based field positions of the stress columns: table order for 1 or 3 columns; for a tensor
   * sxx, syy, szz, sxy, syz, szx, with -1 for a component a 2-D table does not have (read as 0).
   */
  stress: number[];
  kind: StressColumns;
  /** For a tensor (kind 6): which one; null otherwise. */
  tensor: TensorForm | null;
  size: number;
  /** 0-based position of the id column, or -1. */
  id: number;
  /** Names for the report (header names, or "column k"); an absent tensor component is "0". */
  labels: { stress: string[]; size: string; id: string | null };
  /** Units written in the header names ("MPa", "mm^3"), null where none is written. */
  units: { stress: string | null; size: string | null };
  /** A node or integration-point column: several rows per element (its header name), or null. */
  pointColumn: string | null;
}

/** A header name without punctuation, in capitals, for matching. */
function norm(name: string): string {
  return name.toUpperCase().replace(/[\s_.\-()[\]{}/,]+/g, "");
}

const STRESS_UNIT = /^(?:[GMk]?Pa|psi|ksi|bar|MN\/m\^?2|N\/mm\^?2|N\/m\^?2|N\/mm²|N\/m²|MN\/m²)$/i;
const SIZE_UNIT = /^(?:mm|cm|m|µm|um|in|ft|inch)(?:\^?[23]|[²³])$/i;

/** Whether a text is a stress or size unit the reader knows ("MPa", "mm^3"). */
export function isUnit(text: string): boolean {
  return STRESS_UNIT.test(text) || SIZE_UNIT.test(text);
}

/**
 * A header name split into the name and a unit written after it: in brackets ("S11 (MPa)",
 * "IVOL [mm^3]", "S {psi}", any text), or a known unit after a comma, a slash, a blank or an
 * underscore ("EVOL, m^3", "S1/MPa", "S1 MPa", "S1_MPa").
 * @example splitUnit("IVOL [mm^3]") // { name: "IVOL", unit: "mm^3" }
 */
export function splitUnit(header: string): { name: string; unit: string | null } {
  const text = header.trim();
  const bracket = /^(.*?\S)\s*[([{]\s*([^()[\]{}]*?)\s*[)\]}]$/.exec(text);
  if (bracket) return { name: bracket[1], unit: bracket[2] === "" ? null : bracket[2] };
  const after = /^(.*?\S)\s*(?:,|\/|\s|_)\s*(\S+)$/.exec(text);
  if (after && isUnit(after[2])) return { name: after[1], unit: after[2] };
  return { name: text, unit: null };
}

/**
 * Header fields of a table whose columns are separated by blanks, with a unit in brackets that
 * stands apart ("S1 (MPa)" is two fields there) joined to the name before it.
 * @example withUnitsJoined(["S1", "(MPa)", "VOL"]) // ["S1 (MPa)", "VOL"]
 */
export function withUnitsJoined(fields: string[]): string[] {
  const joined: string[] = [];
  for (const f of fields) {
    if (joined.length > 0 && /^[([{][^()[\]{}]*[)\]}]$/.test(f)) joined[joined.length - 1] += ` ${f}`;
    else joined.push(f);
  }
  return joined;
}

/** The unit in a form fit to compare ("N/mm²" and "n/mm^2" alike; MPa is N/mm^2). */
function unitKey(unit: string): string {
  const key = unit.replace(/\s+/g, "").replace("²", "^2").replace("³", "^3").replace(/([A-Za-z])([23])$/, "$1^$2");
  const pascals: Record<string, string> = { pa: "Pa", kpa: "kPa", mpa: "MPa", gpa: "GPa", "n/mm^2": "MPa", "mn/m^2": "MPa", "n/m^2": "Pa" };
  return pascals[key.toLowerCase()] ?? key.toLowerCase().replace("um", "µm");
}

/**
 * Whether two unit texts name the same unit ("mm^3" and "mm³", "MPa" and "N/mm^2").
 * @example sameUnit("N/mm²", "MPa") // true
 */
export function sameUnit(a: string, b: string): boolean {
  return unitKey(a) === unitKey(b);
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
/** Size columns named as the whole element's: wrong beside integration-point rows. */
const ELEMENT_SIZE = ["EVOL", "EAREA", "ELEMENTVOLUME", "ELEMENTAREA", "ELEMVOL", "ELEMAREA"];
const ID = ["ID", "ELEMENT", "ELEM", "ELEMENTID", "ELEMID", "EID", "LABEL"];
/** Columns that number nodes or integration points: several rows per element. */
const POINT = ["NODE", "NODEID", "NODELABEL", "NID", "NODENUMBER", "IP", "INTPT", "INTEGRATIONPOINT", "GAUSSPOINT", "GP", "NP", "POINT", "SECTIONPOINT", "SECPT"];

function findName(names: string[], wanted: readonly string[]): number {
  for (const w of wanted) {
    const at = names.indexOf(w);
    if (at >= 0) return at;
  }
  return -1;
}

/** The tensor component (0..5: sxx, syy, szz, sxy, syz, szx) a name stands for, or -1. */
function tensorRole(name: string): number {
  return TENSOR.findIndex((aliases) => aliases.includes(name));
}

function pick(ref: string | number, header: string[] | null, names: string[] | null, fieldCount: number, what: string): number {
  if (typeof ref === "number" || /^\s*\d+\s*$/.test(String(ref))) {
    const k = Number(ref);
    if (!(Number.isInteger(k) && k >= 1 && k <= fieldCount)) {
      throw new InputError("input", `${what} column ${ref} is outside 1..${fieldCount}`);
    }
    return k - 1;
  }
  if (!header || !names) throw new InputError("input", `${what} column "${ref}" given by name, but the table has no header`);
  let at = header.map(norm).indexOf(norm(String(ref)));
  if (at < 0) at = names.indexOf(norm(splitUnit(String(ref)).name));
  if (at < 0) throw new InputError("input", `${what} column "${ref}" is not in the header (${header.join(", ")})`);
  return at;
}

/**
 * Stress columns named by the caller: tensor components are placed by their names; a 2-D
 * tensor (3 or 4 components) is completed with absent components; a component where principal
 * stresses are meant is refused.
 */
function namedStress(
  refs: readonly (string | number)[],
  positions: number[],
  names: string[] | null,
  header: string[] | null,
): { stress: number[]; tensor: TensorForm | null } {
  const byName = names !== null && refs.every((r) => typeof r !== "number" && !/^\s*\d+\s*$/.test(String(r)));
  const roles = byName ? positions.map((p) => tensorRole(names![p])) : positions.map(() => -1);
  const components = roles.filter((r) => r >= 0).length;
  if (components === 0) return { stress: positions, tensor: null };
  const shown = positions.map((p) => header![p]).join(", ");
  const form = tensorForm(roles);
  if (components !== positions.length || form === null || new Set(roles).size !== roles.length) {
    throw new InputError(
      "input",
      `--stress ${shown}: ${components === 1 ? "a stress component is" : "stress components are"} not principal stresses; ` +
        "give the maximum principal stress, the three principal stresses, all six components, " +
        "or a 2-D tensor (SXX,SYY,SXY for plane stress; SXX,SYY,SZZ,SXY for axisymmetric or plane strain)",
    );
  }
  const stress = [-1, -1, -1, -1, -1, -1];
  roles.forEach((role, k) => (stress[role] = positions[k]));
  return { stress, tensor: form };
}

/** Which tensor a set of components (0..5) makes, or null. */
function tensorForm(roles: number[]): TensorForm | null {
  const has = (r: number) => roles.includes(r);
  if (roles.length === 6 && [0, 1, 2, 3, 4, 5].every(has)) return "3-D";
  if (has(0) && has(1) && has(3) && !has(4) && !has(5)) {
    if (roles.length === 3) return "plane stress";
    if (roles.length === 4 && has(2)) return "axisymmetric or plane strain";
  }
  return null;
}

function kindOf(count: number, tensor: TensorForm | null): StressColumns {
  if (tensor !== null) return 6;
  if (count === 1 || count === 3 || count === 6) return count;
  throw new InputError("input", `give 1, 3 or 6 stress columns (got ${count})`);
}

/** Resolves the columns from the header (or null) and the number of fields per row. */
export function resolveColumns(header: string[] | null, fieldCount: number, choice: ColumnChoice = {}, pointSizes = false): ResolvedColumns {
  const split = header ? header.map(splitUnit) : null;
  const names = split ? split.map((h) => norm(h.name)) : null;
  let stress: number[] | null = null;
  let tensor: TensorForm | null = null;
  if (choice.stress) {
    const positions = choice.stress.map((s) => pick(s, header, names, fieldCount, "stress"));
    ({ stress, tensor } = namedStress(choice.stress, positions, names, header));
  }
  let size = choice.size !== undefined ? pick(choice.size, header, names, fieldCount, "size") : -1;
  let id = choice.id === null ? -1 : choice.id !== undefined ? pick(choice.id, header, names, fieldCount, "id") : -2;
  let pointColumn: string | null = null;

  if (names) {
    const point = findName(names, POINT);
    if (point >= 0) pointColumn = header![point];
    if (!stress) {
      const components = TENSOR.map((aliases) => findName(names, aliases));
      const principal = PRINCIPAL.map((aliases) => findName(names, aliases));
      const present = components.map((k, role) => (k >= 0 ? role : -1)).filter((r) => r >= 0);
      const form = tensorForm(present);
      if (components.every((k) => k >= 0)) {
        stress = components;
        tensor = "3-D";
      } else if (principal.every((k) => k >= 0)) stress = principal;
      else if (form !== null) {
        stress = components;
        tensor = form;
      } else if (principal[0] >= 0 && principal[1] >= 0) {
        // Two principal stresses, as plane-stress tables give them: the third is 0.
        stress = [principal[0], principal[1], -1];
      } else if (principal[0] >= 0 && principal[2] >= 0) {
        throw new InputError(
          "input",
          `the header has the largest and smallest principal stresses (${header![principal[0]]}, ${header![principal[2]]}) but not the middle one: ` +
            `give all three, or choose the largest alone with --stress ${header![principal[0]]}`,
        );
      } else {
        const single = findName(names, SINGLE);
        if (single >= 0) stress = [single];
      }
      if (!stress) {
        throw new InputError("input", `no stress columns recognised in the header (${header!.join(", ")}); name them with --stress`);
      }
    }
    if (size < 0) {
      size = findName(names, SIZE);
      if (size < 0 && pointColumn !== null) {
        throw new InputError(
          "input",
          `the header (${header!.join(", ")}) has a column "${pointColumn}" of node or integration-point numbers and no volume or area: ` +
            "nodal (averaged) stresses? The effective size needs each element's volume or area: export element stresses with the element volume (or area)",
        );
      }
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
  if (names) {
    // A name used twice: two tables side by side (the second would be left out without a word).
    const found = [
      ...(choice.stress ? [] : stress.filter((j) => j >= 0)),
      ...(choice.size !== undefined ? [] : [size]),
      ...(choice.id !== undefined || id < 0 ? [] : [id]),
    ];
    for (const k of found) {
      const again = names.indexOf(names[k], k + 1);
      const before = names.indexOf(names[k]);
      if (again >= 0 || before !== k) {
        const [a, b] = again >= 0 ? [k, again] : [before, k];
        throw new InputError(
          "input",
          `the header names "${header![k]}" twice (columns ${a + 1} and ${b + 1}): two tables side by side? Put every element on a line of its own, or choose the columns with --stress, --size and --id`,
        );
      }
    }
  }
  const kind = kindOf(stress.length, tensor);
  const all = [...stress.filter((k) => k >= 0), size, ...(id >= 0 ? [id] : [])];
  if (new Set(all).size !== all.length) throw new InputError("input", "the stress, size and id columns must all differ");
  if (pointColumn !== null && !pointSizes) {
    throw new InputError(
      "input",
      `the header has a column "${pointColumn}" (node or integration-point numbers): several rows per element. ` +
        "With the element's volume or area on every row the sum would count each element once per row: " +
        "export one row per element (element-averaged or centroid stresses) with the element volume or area instead; " +
        "if the size column holds each point's own share of the element, state --integration-points",
    );
  }
  if (pointSizes && names && ELEMENT_SIZE.includes(names[size])) {
    throw new InputError(
      "input",
      `integration points were stated, but the size column "${header![size]}" is named as the element's volume or area: ` +
        "summed over its points, each element would count once per point; export each point's own volume (or area), or one row per element",
    );
  }
  const label = (k: number) => (k < 0 ? "0" : header ? header[k] : `column ${k + 1}`);
  const stressUnits = split ? [...new Set(stress.filter((k) => k >= 0).map((k) => split[k].unit).filter((u): u is string => u !== null && isUnit(u)))] : [];
  if (new Set(stressUnits.map(unitKey)).size > 1) {
    throw new InputError("input", `the stress columns are in different units (${stressUnits.join(", ")}): export them in one unit`);
  }
  const sizeUnit = split ? split[size].unit : null;
  return {
    stress,
    kind,
    tensor,
    size,
    id,
    labels: { stress: stress.map(label), size: label(size), id: id >= 0 ? label(id) : null },
    units: { stress: stressUnits[0] ?? null, size: sizeUnit !== null && isUnit(sizeUnit) ? sizeUnit : null },
    pointColumn,
  };
}

/**
 * Why a header does not fit a table read by position (1, 3 or 6 stress columns, then the size,
 * as a selected range is read), or null when it fits or names no columns the reader knows.
 * @example positionalHeaderProblem(["VOL", "S1"]) // "the header puts VOL before ..."
 */
export function positionalHeaderProblem(header: string[]): string | null {
  let columns: ResolvedColumns;
  try {
    columns = resolveColumns(header, header.length);
  } catch (error) {
    if (error instanceof InputError && /^no (stress|size) column/.test(error.message)) return null;
    return error instanceof InputError ? error.message : String(error);
  }
  const count = header.length - 1;
  const inOrder = columns.stress.length === count && columns.stress.every((k, i) => k === i);
  if (columns.id < 0 && columns.size === count && inOrder && columns.tensor !== "plane stress" && columns.tensor !== "axisymmetric or plane strain") return null;
  const read = [...columns.stress.filter((k) => k >= 0).map((k) => header[k]), header[columns.size]].join(", ");
  return `the header names the columns ${read}${columns.id >= 0 ? ` and the id ${header[columns.id]}` : ""}, but a selected range is read by position: 1, 3 or 6 stress columns (sxx, syy, szz, sxy, syz, szx), then the size`;
}
