/**
 * The units a design check converts: effective sizes (a length squared or
 * cubed) and times. Stresses are never converted (every stress of one check
 * shares its unit), so the only stress-unit rule is that B is quoted in the
 * check's stress unit squared.
 *
 * Conversion factors are exact by definition: 1 in = 25.4 mm (international
 * inch, 1959); 1 h = 3600 s; 1 year = 365.25 days = 31 557 600 s (the Julian
 * year, the astronomers' and IUPAC's "a"; common practice in lifetime design).
 */
import type { FlawKind, TimeUnit } from "./check-description";

const LENGTH_MM: Record<string, number> = { mm: 1, cm: 10, m: 1000, in: 25.4 };

export interface SizeUnit {
  /** As written in the check: "mm^3". */
  text: string;
  length: string;
  power: 2 | 3;
  /** Size of one unit in mm^power. */
  inMillimetres: number;
}

/**
 * Reads "mm^3", "mm3", "mm³", "in^2", ... Returns null for anything else, so
 * the caller can say which field is wrong.
 *
 * @example parseSizeUnit("in³") // { text: "in^3", length: "in", power: 3, inMillimetres: 16387.064 }
 */
export function parseSizeUnit(text: string): SizeUnit | null {
  if (typeof text !== "string") return null;
  const m = /^\s*(mm|cm|m|in)\s*(?:\^\s*([23])|([23])|(²)|(³))\s*$/.exec(text);
  if (!m) return null;
  const power = (m[2] ?? m[3] ?? (m[4] ? "2" : "3")) === "2" ? 2 : 3;
  const length = m[1];
  return { text: `${length}^${power}`, length, power, inMillimetres: LENGTH_MM[length] ** power };
}

/** The power a flaw kind needs: volumes for volume flaws, areas for surface flaws. */
export function powerFor(flaws: FlawKind): 2 | 3 {
  return flaws === "surface" ? 2 : 3;
}

export const SECONDS_PER: Record<TimeUnit, number> = { s: 1, h: 3600, years: 365.25 * 86400 };

export const TIME_UNITS: readonly TimeUnit[] = ["s", "h", "years"];

export function isTimeUnit(text: unknown): text is TimeUnit {
  return text === "s" || text === "h" || text === "years";
}

/**
 * Converts a duration between the three time units.
 *
 * @example convertTime(10, "years", "h") // 87660
 */
export function convertTime(value: number, from: TimeUnit, to: TimeUnit): number {
  return from === to ? value : (value * SECONDS_PER[from]) / SECONDS_PER[to];
}

/**
 * Reads the unit of B, "<stress unit>^2 <time unit>" ("MPa^2 s", "MPa² h",
 * "MPa2 years"). Returns the stress and time parts, or null when the text has
 * another form.
 *
 * @example parseBUnit("MPa^2 s") // { stress: "MPa", time: "s" }
 */
export function parseBUnit(text: string): { stress: string; time: TimeUnit } | null {
  if (typeof text !== "string") return null;
  const m = /^\s*(\S+?)\s*(?:\^\s*2|²|2)\s*[ ·.*]?\s*(s|h|years)\s*$/.exec(text);
  if (!m || !isTimeUnit(m[2])) return null;
  return { stress: m[1], time: m[2] };
}

/** "MPa^2 s" for a stress unit and a time unit: the form the check file writes. */
export function bUnitText(stressUnit: string, time: TimeUnit): string {
  return `${stressUnit}^2 ${time}`;
}
