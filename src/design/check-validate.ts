/**
 * Every check description is validated before it is computed, wherever it
 * came from (a file, the form, a test): a bad field is refused with its path
 * ("material.strengths[3]") and what it should be. Unknown fields are refused
 * too, so a typo ("apliedStress") cannot silently drop an input.
 *
 * The guards a reviewer expects live here as well: a survival below 0.5, or
 * an allowed failure probability above 0.1, is refused unless the description
 * confirms it, because such a value is far more often a failure probability
 * typed where the survival was meant; the size unit must be a volume for
 * volume flaws and an area for surface flaws.
 */
import { InputError } from "../errors";
import { SPECIMENS } from "../size/presets";
import { ESTIMATION_METHODS } from "../weibull/estimate";
import {
  HIGH_FAILURE_PROBABILITY,
  LOW_SURVIVAL,
  type CheckDescription,
  type ConfidenceDescription,
  type LifetimeDescription,
  type MaterialDescription,
  type PartDescription,
  type RequirementDescription,
  type SpecimenDescription,
} from "./check-description";
import { parseBUnit, parseSizeUnit, powerFor, TIME_UNITS } from "./check-units";

/** A field of a check description that cannot be used; `field` is its path. */
export class CheckFieldError extends InputError {
  readonly field: string;
  constructor(field: string, message: string) {
    super("input", field ? `${field}: ${message}` : message);
    this.name = "CheckFieldError";
    this.field = field;
  }
}

/** Most specimens or elements a check accepts (each is a number in memory and in the file). */
export const MAX_ROWS = 2_000_000;
const MAX_TEXT = 200;

type Obj = Record<string, unknown>;

function fail(field: string, message: string): never {
  throw new CheckFieldError(field, message);
}

function show(value: unknown): string {
  // Never echo "NaN" or "Infinity" into a message, even as typed.
  if (typeof value === "string" && /nan|inf/i.test(value)) return "text that is not a number";
  if (typeof value === "string") return `text "${value.length > 40 ? value.slice(0, 40) + "..." : value}"`;
  if (typeof value === "number") return Number.isNaN(value) ? "not a number" : Number.isFinite(value) ? String(value) : "a number too large to represent";
  if (value === null) return "null";
  if (value === undefined) return "nothing (the field is missing)";
  if (Array.isArray(value)) return "a list";
  return typeof value === "object" ? "an object" : String(value);
}

function object(value: unknown, field: string): Obj {
  if (typeof value !== "object" || value === null || Array.isArray(value)) fail(field, `expected an object, got ${show(value)}`);
  return value as Obj;
}

function onlyKeys(o: Obj, field: string, allowed: readonly string[]): void {
  for (const key of Object.keys(o)) {
    if (!allowed.includes(key)) {
      fail(field ? `${field}.${key}` : key, `unknown field (expected ${allowed.join(", ")})`);
    }
  }
}

function number(value: unknown, field: string): number {
  if (typeof value === "string" && /^\s*-?\d+,\d+\s*$/.test(value)) {
    fail(field, `expected a number, got ${show(value)}: write numbers without quotes and with a point as the decimal separator`);
  }
  if (typeof value !== "number" || !Number.isFinite(value)) fail(field, `expected a number, got ${show(value)}`);
  return value;
}

function finite(value: unknown): value is number {
  return typeof value === "number" && Number.isFinite(value);
}

/**
 * A list of numbers that each pass `ok`: checked in one pass, and only a
 * failing entry builds its field name and message (lists run to millions).
 */
function numbers(values: unknown[], field: string, ok: (x: number) => boolean, rule: string): number[] {
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (finite(v) && ok(v)) continue;
    const x = number(v, `${field}[${i}]`);
    fail(`${field}[${i}]`, `${rule} (got ${x})`);
  }
  return values as number[];
}

function positive(value: unknown, field: string): number {
  const x = number(value, field);
  if (!(x > 0)) fail(field, `must be greater than 0 (got ${x})`);
  return x;
}

function wholeNumber(value: unknown, field: string, lowest: number, highest: number): number {
  const x = number(value, field);
  if (!Number.isInteger(x) || x < lowest || x > highest) fail(field, `must be a whole number from ${lowest} to ${highest} (got ${x})`);
  return x;
}

function text(value: unknown, field: string): string {
  if (typeof value !== "string") fail(field, `expected text, got ${show(value)}`);
  if (value.trim() === "") fail(field, "is empty");
  if (value.length > MAX_TEXT) fail(field, `is longer than ${MAX_TEXT} characters`);
  // eslint-disable-next-line no-control-regex -- finding control characters is the point of this test
  if (/[\u0000-\u001f\u007f]/.test(value)) fail(field, "holds control characters");
  return value;
}

function oneOf<T extends string>(value: unknown, field: string, allowed: readonly T[]): T {
  if (typeof value !== "string" || !allowed.includes(value as T)) fail(field, `expected one of ${allowed.map((a) => `"${a}"`).join(", ")}, got ${show(value)}`);
  return value as T;
}

function list(value: unknown, field: string, lowest: number): unknown[] {
  if (!Array.isArray(value)) fail(field, `expected a list, got ${show(value)}`);
  if (value.length < lowest) fail(field, `needs at least ${lowest} entries (got ${value.length})`);
  if (value.length > MAX_ROWS) fail(field, `has ${value.length} entries, more than the ${MAX_ROWS} a check accepts`);
  return value;
}

/**
 * Checks a description (parsed JSON or built by the form) and returns it
 * typed, with defaults filled in. Throws CheckFieldError naming the field.
 *
 * @example validateCheckDescription(JSON.parse(text)) // throws CheckFieldError { field: "sizeUnit", ... } for mm^2 with volume flaws
 */
export function validateCheckDescription(value: unknown): CheckDescription {
  const o = object(value, "");
  onlyKeys(o, "", [
    "format", "version", "title", "material", "stressUnit", "confidence", "flaws", "sizeUnit", "criterion", "specimen", "part",
    "requirement", "confirmLowSurvival", "appliedStress", "lotSize", "lifetime", "proof",
  ]);
  const stressUnit = text(o.stressUnit, "stressUnit");
  const flaws = oneOf(o.flaws, "flaws", ["volume", "surface"] as const);
  const sizeUnit = text(o.sizeUnit, "sizeUnit");
  const unit = parseSizeUnit(sizeUnit);
  if (!unit) fail("sizeUnit", `"${sizeUnit}" is not a size unit: use mm^3, cm^3, m^3 or in^3 for volumes, mm^2, cm^2, m^2 or in^2 for areas`);
  if (unit.power !== powerFor(flaws)) {
    fail(
      "sizeUnit",
      `${unit.text} is ${unit.power === 3 ? "a volume" : "an area"}, but the flaws are ${flaws} flaws, which need ${flaws === "volume" ? "an effective volume (for example mm^3)" : "an effective area (for example mm^2)"}`,
    );
  }
  const part = partOf(o.part);
  const lotSize = wholeNumber(o.lotSize, "lotSize", 1, 1e9);
  const requirement = requirementOf(o.requirement, lotSize);
  const confirmLowSurvival = o.confirmLowSurvival === undefined ? undefined : booleanOf(o.confirmLowSurvival, "confirmLowSurvival");
  guardLowSurvival(requirement, lotSize, confirmLowSurvival === true);
  let appliedStress: number | null;
  if (o.appliedStress === null || o.appliedStress === undefined) {
    if (part.kind !== "table") fail("appliedStress", "give the applied peak stress (it may be left out only when the part is an element table, whose peak is then used)");
    appliedStress = null;
  } else {
    appliedStress = positive(o.appliedStress, "appliedStress");
  }
  const description: CheckDescription = {
    material: materialOf(o.material),
    stressUnit,
    confidence: confidenceOf(o.confidence),
    flaws,
    sizeUnit,
    criterion: oneOf(o.criterion, "criterion", ["PIA", "NSA", "MAXPRINCIPAL"] as const),
    specimen: specimenOf(o.specimen),
    part,
    requirement,
    appliedStress,
    lotSize,
    lifetime: lifetimeOf(o.lifetime, stressUnit),
    proof: proofOf(o.proof),
  };
  if (o.title !== undefined) description.title = text(o.title, "title");
  if (confirmLowSurvival !== undefined) description.confirmLowSurvival = confirmLowSurvival;
  return description;
}

function booleanOf(value: unknown, field: string): boolean {
  if (typeof value !== "boolean") fail(field, `expected true or false, got ${show(value)}`);
  return value;
}

function materialOf(value: unknown): MaterialDescription {
  const o = object(value, "material");
  const kind = oneOf(o.kind, "material.kind", ["data", "typed"] as const);
  if (kind === "typed") {
    onlyKeys(o, "material", ["kind", "shape", "scale", "specimens", "unbiased"]);
    const m: MaterialDescription = { kind, shape: positive(o.shape, "material.shape"), scale: positive(o.scale, "material.scale") };
    if (o.unbiased !== undefined) m.unbiased = booleanOf(o.unbiased, "material.unbiased");
    if (o.specimens !== undefined && o.specimens !== null) {
      // The unbiasing factor exists from 3 specimens (the ML modulus has no finite mean at 2).
      m.specimens = wholeNumber(o.specimens, "material.specimens", m.unbiased === false ? 2 : 3, 100000);
    }
    return m;
  }
  onlyKeys(o, "material", ["kind", "strengths", "censored", "method", "source"]);
  const strengths = numbers(list(o.strengths, "material.strengths", 2), "material.strengths", (x) => x > 0, "must be greater than 0");
  const m: MaterialDescription = { kind, strengths, method: oneOf(o.method ?? "MLE", "material.method", ESTIMATION_METHODS) };
  if (o.censored !== undefined && o.censored !== null) {
    const flags = list(o.censored, "material.censored", 0) as boolean[];
    for (let i = 0; i < flags.length; i++) if (typeof flags[i] !== "boolean") booleanOf(flags[i], `material.censored[${i}]`);
    if (flags.length !== strengths.length) fail("material.censored", `has ${flags.length} flags for ${strengths.length} strengths: give one per strength`);
    const failures = flags.filter((c) => !c).length;
    if (failures < 2) fail("material.censored", `leaves ${failures} failure(s): a fit needs at least two`);
    m.censored = flags;
  }
  if (o.source !== undefined) m.source = sourceOf(o.source);
  return m;
}

function sourceOf(value: unknown): NonNullable<(MaterialDescription & { kind: "data" })["source"]> {
  const o = object(value, "material.source");
  const kind = oneOf(o.kind, "material.source.kind", ["pasted", "file", "range"] as const);
  if (kind !== "range") {
    onlyKeys(o, "material.source", ["kind"]);
    return { kind };
  }
  onlyKeys(o, "material.source", ["kind", "strengthsAddress", "flagsAddress"]);
  const source: { kind: "range"; strengthsAddress: string; flagsAddress?: string } = {
    kind,
    strengthsAddress: text(o.strengthsAddress, "material.source.strengthsAddress"),
  };
  if (o.flagsAddress !== undefined) source.flagsAddress = text(o.flagsAddress, "material.source.flagsAddress");
  return source;
}

function confidenceOf(value: unknown): ConfidenceDescription {
  if (typeof value === "number") {
    fail("confidence", `a bare level (${show(value)}) does not say its sidedness: write {"level": ${value}, "sides": "one-sided"} or "two-sided"`);
  }
  const o = object(value, "confidence");
  onlyKeys(o, "confidence", ["level", "sides"]);
  const level = number(o.level, "confidence.level");
  const sides = oneOf(o.sides, "confidence.sides", ["one-sided", "two-sided"] as const);
  const oneSided = sides === "two-sided" ? (1 + level) / 2 : level;
  if (!(level > 0 && level < 1) || oneSided < 0.5 || oneSided > 0.995) {
    fail(
      "confidence.level",
      sides === "one-sided"
        ? `a one-sided lower bound needs a level from 0.5 to 0.995 (got ${level})`
        : `a two-sided level must lie above 0 and at most 0.99 (got ${level})`,
    );
  }
  return { level, sides };
}

function specimenOf(value: unknown): SpecimenDescription {
  const o = object(value, "specimen");
  const kind = oneOf(o.kind, "specimen.kind", ["typed", "preset", "bar"] as const);
  if (kind === "typed") {
    onlyKeys(o, "specimen", ["kind", "effectiveSize"]);
    return { kind, effectiveSize: positive(o.effectiveSize, "specimen.effectiveSize") };
  }
  if (kind === "preset") {
    onlyKeys(o, "specimen", ["kind", "configuration", "poisson"]);
    const configuration = text(o.configuration, "specimen.configuration");
    const preset = SPECIMENS.find((s) => s.name.toLowerCase() === configuration.trim().toLowerCase());
    if (!preset) fail("specimen.configuration", `unknown configuration "${configuration}"; use one of ${SPECIMENS.map((s) => s.name).join(", ")}`);
    if (preset.kind === "bar-flexure") return { kind, configuration: preset.name };
    const poisson = number(o.poisson, "specimen.poisson");
    if (!(poisson > -1 && poisson < 0.5)) fail("specimen.poisson", `Poisson's ratio must lie between -1 and 0.5 (got ${poisson})`);
    return { kind, configuration: preset.name, poisson };
  }
  onlyKeys(o, "specimen", ["kind", "outerSpan", "innerSpan", "width", "depth"]);
  const outerSpan = positive(o.outerSpan, "specimen.outerSpan");
  const innerSpan = number(o.innerSpan ?? 0, "specimen.innerSpan");
  if (innerSpan < 0 || innerSpan >= outerSpan) fail("specimen.innerSpan", `must be 0 (three-point) or shorter than the outer span (got ${innerSpan})`);
  return { kind, outerSpan, innerSpan, width: positive(o.width, "specimen.width"), depth: positive(o.depth, "specimen.depth") };
}

function partOf(value: unknown): PartDescription {
  const o = object(value, "part");
  const kind = oneOf(o.kind, "part.kind", ["typed", "table"] as const);
  if (kind === "typed") {
    onlyKeys(o, "part", ["kind", "effectiveSize"]);
    return { kind, effectiveSize: positive(o.effectiveSize, "part.effectiveSize") };
  }
  onlyKeys(o, "part", ["kind", "stresses", "columns", "sizes", "source"]);
  const columnCount = number(o.columns, "part.columns");
  if (columnCount !== 1 && columnCount !== 3 && columnCount !== 6) fail("part.columns", `must be 1, 3 or 6 stress columns (got ${columnCount})`);
  const columns = columnCount;
  const rows = list(o.stresses, "part.stresses", 1);
  const stresses = rows as number[][];
  for (let i = 0; i < rows.length; i++) {
    const row = rows[i];
    if (Array.isArray(row) && row.length === columns && row.every(finite)) continue;
    // Only a bad row builds its field name.
    const r = list(row, `part.stresses[${i}]`, columns);
    if (r.length !== columns) fail(`part.stresses[${i}]`, `has ${r.length} values for ${columns} stress column(s)`);
    numbers(r, `part.stresses[${i}]`, () => true, "");
  }
  const sizes = numbers(list(o.sizes, "part.sizes", 1), "part.sizes", (x) => x >= 0, "an element size cannot be negative");
  if (sizes.length !== stresses.length) fail("part.sizes", `has ${sizes.length} sizes for ${stresses.length} rows of stresses`);
  const part: PartDescription = { kind, stresses, columns, sizes };
  if (o.source !== undefined) {
    const s = object(o.source, "part.source");
    const sourceKind = oneOf(s.kind, "part.source.kind", ["pasted", "file", "range"] as const);
    if (sourceKind === "range") {
      onlyKeys(s, "part.source", ["kind", "stressesAddress", "sizesAddress"]);
      part.source = { kind: sourceKind, stressesAddress: text(s.stressesAddress, "part.source.stressesAddress"), sizesAddress: text(s.sizesAddress, "part.source.sizesAddress") };
    } else {
      onlyKeys(s, "part.source", ["kind"]);
      part.source = { kind: sourceKind };
    }
  }
  return part;
}

function requirementOf(value: unknown, lotSize: number): RequirementDescription {
  const o = object(value, "requirement");
  const kind = oneOf(o.kind, "requirement.kind", ["survival", "lot"] as const);
  if (kind === "survival") {
    onlyKeys(o, "requirement", ["kind", "survival"]);
    const survival = number(o.survival, "requirement.survival");
    if (!(survival > 0 && survival < 1)) fail("requirement.survival", `the survival probability per part must lie strictly between 0 and 1 (got ${survival})`);
    return { kind, survival };
  }
  onlyKeys(o, "requirement", ["kind", "allowedFailures"]);
  const allowedFailures = positive(o.allowedFailures, "requirement.allowedFailures");
  if (allowedFailures >= lotSize) fail("requirement.allowedFailures", `must be fewer than the ${lotSize} parts per lot (got ${allowedFailures})`);
  return { kind, allowedFailures };
}

function guardLowSurvival(requirement: RequirementDescription, lotSize: number, confirmed: boolean): void {
  if (confirmed) return;
  if (requirement.kind === "survival" && requirement.survival < LOW_SURVIVAL) {
    fail(
      "requirement.survival",
      `a required survival of ${requirement.survival} per part lets ${Number(((1 - requirement.survival) * 100).toPrecision(6))} % of parts fail, ` +
        `far above the usual design targets; a failure probability may have been typed ` +
        `where the survival was meant (survival = 1 - failure probability, so a failure probability of ${requirement.survival} is a survival of ` +
        `${1 - requirement.survival}). Set confirmLowSurvival to true if a survival below ${LOW_SURVIVAL} is intended`,
    );
  }
  if (requirement.kind === "lot" && requirement.allowedFailures / lotSize > HIGH_FAILURE_PROBABILITY) {
    fail(
      "requirement.allowedFailures",
      `${requirement.allowedFailures} failures in a lot of ${lotSize} allows a failure probability of ${requirement.allowedFailures / lotSize} per part, ` +
        `above ${HIGH_FAILURE_PROBABILITY}; check the lot size and the count. Set confirmLowSurvival to true if this is intended`,
    );
  }
}

function lifetimeOf(value: unknown, stressUnit: string): LifetimeDescription | null {
  if (value === null || value === undefined) return null;
  const o = object(value, "lifetime");
  onlyKeys(o, "lifetime", ["lifetime", "timeUnit", "n", "B", "bUnit"]);
  const lifetime = positive(o.lifetime, "lifetime.lifetime");
  const timeUnit = oneOf(o.timeUnit, "lifetime.timeUnit", TIME_UNITS);
  const n = number(o.n, "lifetime.n");
  if (!(n > 2)) fail("lifetime.n", `the crack-growth exponent must be greater than 2 (got ${n})`);
  const B = positive(o.B, "lifetime.B");
  const bUnit = text(o.bUnit, "lifetime.bUnit");
  const parsed = parseBUnit(bUnit);
  if (!parsed) fail("lifetime.bUnit", `"${bUnit}" is not a unit of B: write the stress unit squared and a time unit, for example "${stressUnit}^2 s" (s, h or years)`);
  if (parsed.stress !== stressUnit.trim()) {
    fail("lifetime.bUnit", `B is quoted in ${parsed.stress}^2 but the check's stresses are in ${stressUnit}: convert B to ${stressUnit}^2 ${parsed.time}`);
  }
  return { lifetime, timeUnit, n, B, bUnit };
}

function proofOf(value: unknown): { proofStress: number } | null {
  if (value === null || value === undefined) return null;
  const o = object(value, "proof");
  onlyKeys(o, "proof", ["proofStress"]);
  return { proofStress: positive(o.proofStress, "proof.proofStress") };
}
