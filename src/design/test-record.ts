/**
 * A test machine's record (one row per specimen: id, breaking load,
 * dimensions, fracture origin, lot, temperature) turned into strengths.
 *
 * The columns are mapped once by the user (a guess from the header is
 * offered); units are read from the header ("Load [kN]", "Width (in)",
 * "F / lbf") and everything is converted to N and mm, so strengths come out
 * in MPa. Values the record does not hold (spans of the fixture, Poisson's
 * ratio) are typed once for the whole record. Every row either becomes a
 * specimen with a strength or is reported with the reason it has none:
 * nothing is dropped silently.
 *
 * Unit factors are exact by definition: 1 in = 25.4 mm (international inch,
 * 1959), 1 lbf = 4.4482216152605 N (the pound-force as defined from the
 * avoirdupois pound and standard gravity 9.80665 m/s^2; NIST SP 811).
 */
import { InputError } from "../errors";
import { explainNotANumber, quoteText } from "../input/number-text";
import {
  flexureStrength,
  type LoadStrength,
  pistonOnBallsStrength,
  ringOnRingStrength,
  rodFlexureStrength,
} from "./strength-from-load";

export type TestConfiguration = "bar-flexure" | "rod-flexure" | "ring-on-ring" | "piston-on-balls";

/** The quantities a record may hold, per configuration, in the order the strength formula takes them. */
export const QUANTITIES: Record<TestConfiguration, readonly Quantity[]> = {
  "bar-flexure": ["load", "outerSpan", "innerSpan", "width", "depth"],
  "rod-flexure": ["load", "outerSpan", "innerSpan", "diameter"],
  "ring-on-ring": ["load", "loadDiameter", "supportDiameter", "diskDiameter", "thickness", "poisson"],
  "piston-on-balls": ["load", "pistonDiameter", "supportDiameter", "diskDiameter", "thickness", "poisson"],
};

export type Quantity =
  | "load"
  | "outerSpan"
  | "innerSpan"
  | "width"
  | "depth"
  | "diameter"
  | "loadDiameter"
  | "pistonDiameter"
  | "supportDiameter"
  | "diskDiameter"
  | "thickness"
  | "poisson";

/** Descriptive columns carried through to the specimens. */
export type Label = "id" | "origin" | "lot" | "temperature";

export type Unit = "N" | "kN" | "lbf" | "mm" | "in" | "";

const TO_NEWTON: Record<string, number> = { N: 1, kN: 1000, lbf: 4.4482216152605 };
const TO_MM: Record<string, number> = { mm: 1, in: 25.4 };

/** The unit a header names, in brackets, parentheses or after a slash; "" when it names none. */
export function unitInHeader(header: string): Unit | "unknown" {
  const match = /[[(]\s*([^\])]+?)\s*[\])]\s*$|\/\s*([A-Za-z]+)\s*$|\bin\s+([A-Za-z]+)\s*$/.exec(header.trim());
  if (!match) return "";
  const word = (match[1] ?? match[2] ?? match[3]).trim();
  const known: Record<string, Unit> = { n: "N", kn: "kN", lbf: "lbf", lb: "lbf", mm: "mm", in: "in", inch: "in", inches: "in", '"': "in" };
  return known[word.toLowerCase()] ?? "unknown";
}

const GUESS: [Quantity | Label, RegExp][] = [
  ["id", /^(specimen|sample|id|no\.?|nr\.?|#|name)\b|\bid\b/i],
  ["origin", /origin|fracture|flaw/i],
  ["lot", /\b(lot|batch|charge)\b/i],
  ["temperature", /temp/i],
  ["load", /load|force|\bf\s*max\b|^f\b|^p\b|^fmax/i],
  ["innerSpan", /inner|load span/i],
  ["outerSpan", /outer|support span|^span|^l\b/i],
  ["width", /width|^b\b/i],
  ["depth", /depth|height|^d\b|^h\b/i],
  ["pistonDiameter", /piston/i],
  ["loadDiameter", /load ring|loading ring|^d_?l\b/i],
  ["supportDiameter", /support/i],
  ["diskDiameter", /disk|disc|specimen diameter|^d\b/i],
  ["diameter", /diameter|^d\b/i],
  ["thickness", /thick|^t\b|^h\b/i],
  ["poisson", /poisson|\bnu\b/i],
];

/**
 * A first guess at which column holds what, from the header words: the user
 * confirms or corrects it. Each quantity takes the first unclaimed column
 * that matches; quantities the configuration does not use are not guessed.
 */
export function guessColumns(headers: readonly string[], configuration: TestConfiguration): Partial<Record<Quantity | Label, number>> {
  const wanted = new Set<string>([...QUANTITIES[configuration], "id", "origin", "lot", "temperature"]);
  const taken = new Set<number>();
  const mapping: Partial<Record<Quantity | Label, number>> = {};
  for (const [what, pattern] of GUESS) {
    if (!wanted.has(what) || mapping[what] !== undefined) continue;
    const column = headers.findIndex((h, i) => !taken.has(i) && pattern.test(h.replace(/[[(].*$/, "").trim()));
    if (column >= 0) {
      mapping[what] = column;
      taken.add(column);
    }
  }
  return mapping;
}

export interface RecordSpecimen {
  /** Row of the record (1-based, counting the header as row 1) the specimen came from. */
  row: number;
  id: string;
  /** Strength in MPa, or null with `problem` saying why there is none. */
  strength: number | null;
  problem?: string;
  origin?: string;
  lot?: string;
  temperature?: string;
}

export interface RecordInput {
  configuration: TestConfiguration;
  headers: readonly string[];
  /** Data rows, cells as read (numbers, text, or null for blank). */
  rows: readonly (readonly (string | number | null)[])[];
  /** Which column holds each quantity or label. */
  columns: Partial<Record<Quantity | Label, number>>;
  /** Quantities typed once for the whole record, in N, mm or dimensionless. */
  fixed?: Partial<Record<Quantity, number>>;
  /** Units for columns whose header names none: the user says. */
  units?: Partial<Record<Quantity, Unit>>;
}

export interface RecordResult {
  specimens: RecordSpecimen[];
  /** Unit and scale applied to each mapped quantity, for the user to check ("load: kN x 1000 -> N"). */
  conversions: string[];
}

function factorFor(quantity: Quantity, unit: Unit | "unknown", header: string): number {
  if (quantity === "poisson") {
    if (unit !== "" && unit !== "unknown") throw new InputError("input", `column "${header}": Poisson's ratio has no unit`);
    return 1;
  }
  const table = quantity === "load" ? TO_NEWTON : TO_MM;
  if (unit === "unknown") {
    throw new InputError("input", `column "${header}": unknown unit; use ${Object.keys(table).join(", ")} in the header, e.g. "${quantity === "load" ? "Load [kN]" : "Width [mm]"}"`);
  }
  if (unit === "") {
    throw new InputError("input", `column "${header}" names no unit: add one to the header (${Object.keys(table).join(", ")}) or choose it`);
  }
  const factor = table[unit];
  if (factor === undefined) throw new InputError("input", `column "${header}": ${unit} is not a unit of ${quantity === "load" ? "force" : "length"}`);
  return factor;
}

function compute(configuration: TestConfiguration, v: Record<Quantity, number>): LoadStrength {
  switch (configuration) {
    case "bar-flexure":
      return flexureStrength({ load: v.load, outerSpan: v.outerSpan, innerSpan: v.innerSpan, width: v.width, depth: v.depth });
    case "rod-flexure":
      return rodFlexureStrength({ load: v.load, outerSpan: v.outerSpan, innerSpan: v.innerSpan, diameter: v.diameter });
    case "ring-on-ring":
      return ringOnRingStrength({
        load: v.load,
        loadDiameter: v.loadDiameter,
        supportDiameter: v.supportDiameter,
        diskDiameter: v.diskDiameter,
        thickness: v.thickness,
        poisson: v.poisson,
      });
    case "piston-on-balls":
      return pistonOnBallsStrength({
        load: v.load,
        pistonDiameter: v.pistonDiameter,
        supportDiameter: v.supportDiameter,
        diskDiameter: v.diskDiameter,
        thickness: v.thickness,
        poisson: v.poisson,
      });
  }
}

function text(cell: string | number | null | undefined): string | undefined {
  if (cell === null || cell === undefined) return undefined;
  const s = String(cell).trim();
  return s === "" ? undefined : s;
}

/**
 * Strengths of every specimen in a record.
 * @example strengthsFromRecord({ configuration: "bar-flexure", headers: ["Id", "Load [kN]"], rows: [["A1", 0.4]],
 *   columns: { id: 0, load: 1 }, fixed: { outerSpan: 40, innerSpan: 20, width: 4, depth: 3 } }).specimens[0].strength // 333.33
 */
export function strengthsFromRecord({ configuration, headers, rows, columns, fixed = {}, units = {} }: RecordInput): RecordResult {
  const needed = QUANTITIES[configuration];
  const factors = new Map<Quantity, number>();
  const conversions: string[] = [];
  for (const q of needed) {
    const column = columns[q];
    if (column === undefined) {
      const value = fixed[q];
      if (value === undefined || !Number.isFinite(value)) throw new InputError("input", `${q}: map a column of the record or type one value for every specimen`);
      continue;
    }
    if (column < 0 || column >= headers.length) throw new InputError("input", `${q}: column ${column + 1} is not in the record (it has ${headers.length})`);
    const header = headers[column];
    const named = unitInHeader(header);
    const unit = named === "" && units[q] !== undefined ? (units[q] as Unit) : named;
    const factor = factorFor(q, unit, header);
    factors.set(q, factor);
    conversions.push(q === "poisson" ? `${q}: "${header}" (no unit)` : `${q}: "${header}" in ${unit}${factor === 1 ? "" : ` x ${factor}`} -> ${q === "load" ? "N" : "mm"}`);
  }

  const specimens: RecordSpecimen[] = rows.map((cells, r) => {
    const label = (what: Label) => (columns[what] === undefined ? undefined : text(cells[columns[what]!]));
    const specimen: RecordSpecimen = {
      row: r + 2,
      id: label("id") ?? `row ${r + 2}`,
      strength: null,
      origin: label("origin"),
      lot: label("lot"),
      temperature: label("temperature"),
    };
    const values = {} as Record<Quantity, number>;
    for (const q of needed) {
      const factor = factors.get(q);
      if (factor === undefined) {
        values[q] = fixed[q]!;
        continue;
      }
      const cell = cells[columns[q]!];
      if (cell === null || cell === undefined || (typeof cell === "string" && cell.trim() === "")) {
        specimen.problem = `${headers[columns[q]!]} is blank`;
        return specimen;
      }
      if (typeof cell !== "number" || !Number.isFinite(cell)) {
        const why = typeof cell === "string" ? explainNotANumber(cell) : null;
        specimen.problem = `${headers[columns[q]!]} ${quoteText(String(cell))} ${why ?? "is not a number"}`;
        return specimen;
      }
      values[q] = cell * factor;
    }
    try {
      const { strength, outsideLimits } = compute(configuration, values);
      if (outsideLimits.length > 0) specimen.problem = `outside the formula's limits: ${outsideLimits.join("; ")}`;
      else specimen.strength = strength;
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      specimen.problem = error.message;
    }
    return specimen;
  });
  return { specimens, conversions };
}

/**
 * The sample the fit takes from a record: the specimens with a strength,
 * those whose fracture origin is `population` (case and spaces ignored) as
 * failures and every other one censored at its strength, as competing flaw
 * populations require (ASTM C1239 sec. 7; the same rule as ORIGINFIT). With
 * no population named, every specimen is a failure.
 * @example recordSample({ specimens, population: "surface" }).censored // [false, true, ...]
 */
export function recordSample({ specimens, population }: { specimens: readonly RecordSpecimen[]; population?: string }): {
  strengths: number[];
  censored?: boolean[];
  ids: string[];
} {
  const used = specimens.filter((s) => s.strength !== null);
  const strengths = used.map((s) => s.strength!);
  const ids = used.map((s) => s.id);
  if (population === undefined || population.trim() === "") return { strengths, ids };
  const wanted = population.trim().toLowerCase();
  const missing = used.filter((s) => s.origin === undefined).map((s) => s.id);
  if (missing.length > 0) {
    throw new InputError("input", `no fracture origin for ${missing.slice(0, 5).join(", ")}${missing.length > 5 ? ` and ${missing.length - 5} more` : ""}: every specimen needs one to fit one population`);
  }
  const censored = used.map((s) => s.origin!.trim().toLowerCase() !== wanted);
  if (censored.every((c) => c)) throw new InputError("input", `no specimen broke from "${population}"`);
  return { strengths, censored, ids };
}

/** The fracture origins named in a record, in the order they first appear. */
export function recordOrigins(specimens: readonly RecordSpecimen[]): string[] {
  const seen = new Map<string, string>();
  for (const s of specimens) {
    if (s.strength === null || s.origin === undefined) continue;
    const key = s.origin.trim().toLowerCase();
    if (!seen.has(key)) seen.set(key, s.origin.trim());
  }
  return [...seen.values()];
}

/** Strengths by lot, in the order lots first appear; specimens without a strength or a lot are left out. */
export function recordLots(specimens: readonly RecordSpecimen[]): { lot: string; strengths: number[] }[] {
  const lots = new Map<string, number[]>();
  for (const s of specimens) {
    if (s.strength === null || s.lot === undefined) continue;
    if (!lots.has(s.lot)) lots.set(s.lot, []);
    lots.get(s.lot)!.push(s.strength);
  }
  return [...lots].map(([lot, strengths]) => ({ lot, strengths }));
}
