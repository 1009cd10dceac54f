// fast-check generators of calls to any registered function, driven by its
// metadata (properties-metadata.ts):
//
// - `chaosCall`: anything a user might put in the cells: plausible values
//   from the documented domain mixed with blanks, text, booleans, zeros,
//   negatives, NaN-like strings ("NaN", "Infinity", "1e999"), huge and tiny
//   numbers, error cells and mismatched shapes.
// - `policyCase`: a valid call built from the documented example, and beside
//   it the same call with exactly one fault, each with the error the cell
//   policy promises for it (or "same result" for blanks that must not count).
import fc from "fast-check";
import type { FunctionMetadata, ParameterMetadata } from "../functions/metadata";
import { spillShapes } from "../functions/spill-shapes";
import {
  allowedWidths,
  documentedDomain,
  exampleArguments,
  isRangeText,
  keywords,
  pairsWithAnother,
  paramKind,
  rejectsNegative,
  type Domain,
} from "./properties-metadata";
import type { Arg, Call, Cell } from "./properties-workbook";

/** Numbers and texts that look like numbers to a person but not to a careful reader of cells. */
export const NAN_LIKE_TEXT = ["NaN", "Infinity", "-Infinity", "1e999", "-1e999", "inf", "#N/A", "n/a", "12 MPa", "1,5", " ", ""];
export const EXTREME_NUMBERS = [0, -0, -1, -1e-300, -1e300, 1e300, 1.7976931348623157e308, 1e-300, 5e-324, 2.2250738585072014e-308, 1e15, 1e-15];
const ERROR_FORMULAS = ["=1/0", "=NA()", "=SQRT(-1)"];
const BLANKS: Cell[] = [null, 0, "", "  "];

const logUniform = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true }).map((e) => 10 ** e);

/** A value inside a documented domain, with its edges well represented. */
export function inDomain(d: Domain | null): fc.Arbitrary<number> {
  if (!d) return fc.oneof({ arbitrary: logUniform(-3, 4), weight: 8 }, { arbitrary: fc.constantFrom(0, 1), weight: 1 });
  if (d.integer) {
    const hi = Math.min(d.hi, 1e9);
    return fc.oneof(fc.integer({ min: Math.ceil(d.lo), max: Math.min(hi, 1000) }), logUniform(Math.log10(Math.max(d.lo, 1)), Math.log10(hi)).map((x) => Math.min(Math.round(x), hi)));
  }
  if (Number.isFinite(d.hi)) {
    const width = d.hi - d.lo;
    return fc.oneof(
      { arbitrary: fc.double({ min: d.lo, max: d.hi, noNaN: true }), weight: 4 },
      { arbitrary: logUniform(-12, -1).map((e) => d.lo + e * width), weight: 2 },
      { arbitrary: logUniform(-12, -1).map((e) => d.hi - e * width), weight: 2 },
    ).filter((x) => (d.loOpen ? x > d.lo : x >= d.lo) && (d.hiOpen ? x < d.hi : x <= d.hi));
  }
  const above = d.lo === 0 ? logUniform(-3, 4) : logUniform(-4, 2.5).map((e) => d.lo + e);
  return d.loOpen ? above.filter((x) => x > d.lo) : fc.oneof({ arbitrary: above, weight: 8 }, { arbitrary: fc.constant(d.lo), weight: 1 });
}

/** A cell anyone might leave in a column of numbers. */
const wildCell: fc.Arbitrary<Cell> = fc.oneof(
  fc.constantFrom<Cell>(...NAN_LIKE_TEXT),
  fc.constantFrom<Cell>(...EXTREME_NUMBERS),
  fc.constantFrom<Cell>(true, false, "TRUE", "abc"),
  fc.constantFrom<Cell>(...ERROR_FORMULAS),
  fc.double({ min: -1e6, max: -1e-6, noNaN: true }),
);

export interface Shape {
  rows: number;
  cols: number;
}

/** Positive data of one scale and spread, with blanks sprinkled and, in some ranges, wild cells. */
export function numberRange(shape: Shape, opts: { blanks: boolean; wild: boolean }): fc.Arbitrary<Cell[][]> {
  const spread = fc.double({ min: 0.02, max: 0.6, noNaN: true });
  return fc
    .record({
      scale: logUniform(-3, 6),
      // Valid data (wild: false) always has some spread; chaos sometimes gives ties or one repeated value.
      spread: opts.wild ? fc.oneof({ arbitrary: spread, weight: 9 }, { arbitrary: fc.constant(0), weight: 1 }) : spread,
      blankRate: opts.blanks ? fc.constantFrom(0, 0, 0.1, 0.3) : fc.constant(0),
      wildRate: opts.wild ? fc.constantFrom(0, 0, 0, 0.05, 0.3) : fc.constant(0),
    })
    .chain(({ scale, spread, blankRate, wildRate }) => {
      const plausible = fc.double({ min: -1, max: 1, noNaN: true }).map((u) => scale * 10 ** (spread * u));
      const cell = fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), plausible, fc.constantFrom(...BLANKS), wildCell).map(([u, p, b, w]) =>
        u < wildRate ? w : u < wildRate + blankRate ? b : p,
      );
      return grid(shape, cell);
    });
}

function grid(shape: Shape, cell: fc.Arbitrary<Cell>): fc.Arbitrary<Cell[][]> {
  return fc.array(fc.array(cell, { minLength: shape.cols, maxLength: shape.cols }), { minLength: shape.rows, maxLength: shape.rows });
}

/**
 * Censoring flags: mostly failures only (true, false, blank), sometimes a few
 * censored, sometimes nonsense. Censored maximum-likelihood fits simulate
 * their own unbiasing factor (about a second each), so they are kept rare.
 */
export function flagRange(shape: Shape): fc.Arbitrary<Cell[][]> {
  const failure = fc.constantFrom<Cell>(null, false, 0, "F", "", "FALSE");
  const censored = fc.constantFrom<Cell>(true, 1, "C", "censored", "TRUE");
  const nonsense = fc.constantFrom<Cell>("maybe", 2, -1, 0.5, "abc", "=NA()");
  return fc.constantFrom("failures", "failures", "failures", "failures", "failures", "failures", "some", "nonsense").chain((mode) => {
    if (mode === "failures") return grid(shape, failure);
    if (mode === "some") return grid(shape, fc.oneof({ arbitrary: failure, weight: 4 }, { arbitrary: censored, weight: 1 }));
    return grid(shape, fc.oneof({ arbitrary: failure, weight: 3 }, { arbitrary: censored, weight: 1 }, { arbitrary: nonsense, weight: 1 }));
  });
}

/** The quoted words a label range's description offers ("surface", "pore", ...). */
export function labelsOf(p: ParameterMetadata): string[] {
  const words = [...(p.description ?? "").matchAll(/"([^"]+)"/g)].map((m) => m[1]);
  return words.length ? words : ["A", "B"];
}

export function labelRange(shape: Shape, labels: string[], wild: boolean): fc.Arbitrary<Cell[][]> {
  const label = fc.tuple(fc.constantFrom(...labels), fc.constantFrom("as is", "upper", "spaced")).map(([w, style]) =>
    style === "upper" ? w.toUpperCase() : style === "spaced" ? ` ${w} ` : w,
  );
  return grid(shape, wild ? fc.oneof({ arbitrary: label, weight: 8 }, { arbitrary: fc.constantFrom<Cell>(null, "", 0, 1, true), weight: 1 }, { arbitrary: wildCell, weight: 1 }) : label);
}

/** The shape of one range argument: the call's rows, and a width the description allows. */
function widthFor(p: ParameterMetadata, shared: Shape): fc.Arbitrary<Shape> {
  const widths = allowedWidths(p);
  if (!widths) return fc.constant(shared);
  return fc.constantFrom(...widths).map((cols) => ({ rows: shared.rows, cols }));
}

const numberLiteral = (x: number) => (Object.is(x, -0) ? "-0" : String(x));

function wildScalar(): fc.Arbitrary<Arg> {
  return fc.oneof(
    wildCell.map((value): Arg => ({ kind: "cell", value })),
    fc.constantFrom<Cell>(null).map((value): Arg => ({ kind: "cell", value })),
    fc.constantFrom('"abc"', '"NaN"', '"1e999"', "TRUE()", "FALSE()", "-1", "0", "1e300", "1e-300", '""').map((text): Arg => ({ kind: "literal", text })),
    fc.constant<Arg>({ kind: "empty" }),
  );
}

function scalarArg(p: ParameterMetadata): fc.Arbitrary<Arg> {
  const kind = paramKind(p);
  let good: fc.Arbitrary<Arg>;
  if (kind === "number") {
    const value = inDomain(documentedDomain(p));
    good = fc.oneof(value.map((x): Arg => ({ kind: "literal", text: numberLiteral(x) })), value.map((x): Arg => ({ kind: "cell", value: x })));
  } else if (kind === "choice") {
    const words = keywords(p);
    good = fc
      .tuple(fc.constantFrom(...words), fc.constantFrom("upper", "lower", "spaced"), fc.boolean())
      .map(([w, style, inCell]): Arg => {
        const text = style === "upper" ? w : style === "lower" ? w.toLowerCase() : ` ${w} `;
        return inCell ? { kind: "cell", value: text } : { kind: "literal", text: JSON.stringify(text) };
      });
  } else if (kind === "boolean") {
    good = fc.constantFrom<Arg>({ kind: "literal", text: "TRUE()" }, { kind: "literal", text: "FALSE()" }, { kind: "cell", value: true });
  } else {
    good = fc.oneof(inDomain(null).map((x): Arg => ({ kind: "cell", value: x })), fc.string({ maxLength: 8 }).map((s): Arg => ({ kind: "cell", value: s.startsWith("=") ? ` ${s}` : s })));
  }
  const choices = [
    { arbitrary: good, weight: 7 },
    { arbitrary: wildScalar(), weight: 2 },
  ];
  if (p.optional) choices.push({ arbitrary: fc.constant<Arg>({ kind: "omit" }), weight: 3 });
  return fc.oneof(...choices);
}

/** Any call of `fn`: ranges mostly share one shape (as paired columns do), sometimes not. */
export function chaosCall(fn: FunctionMetadata, maxRows = 24): fc.Arbitrary<Call> {
  const shapeArb = fc.record({ rows: fc.integer({ min: 1, max: maxRows }), cols: fc.constantFrom(1, 1, 1, 2, 3) });
  return fc.record({ shared: shapeArb, mismatched: fc.double({ min: 0, max: 1, noNaN: true }) }).chain(({ shared, mismatched }) => {
    const args = fn.parameters.map((p, k): fc.Arbitrary<Arg> => {
      const kind = paramKind(p);
      if (kind !== "numberRange" && kind !== "flagRange" && kind !== "labelRange") return scalarArg(p);
      const shape = k > 0 && mismatched < 0.15 ? shapeArb : widthFor(p, shared);
      const range = shape.chain((s) =>
        kind === "flagRange" ? flagRange(s) : kind === "labelRange" ? labelRange(s, labelsOf(p), true) : numberRange(s, { blanks: true, wild: true }),
      );
      const asRange = range.map((cells): Arg => ({ kind: "range", cells }));
      if (!p.optional) return fc.oneof({ arbitrary: asRange, weight: 12 }, { arbitrary: wildScalar(), weight: 1 });
      return fc.oneof({ arbitrary: asRange, weight: 2 }, { arbitrary: fc.constant<Arg>({ kind: "omit" }), weight: 3 }, { arbitrary: wildScalar(), weight: 1 });
    });
    return fc.tuple(...args).map((a) => ({ id: fn.id, args: a }));
  });
}

// ---------------------------------------------------------------------------
// One fault at a time

export type Expectation = { code: string; message?: RegExp } | { same: true };

export interface Fault {
  call: Call;
  expect: Expectation;
  what: string;
}

export interface PolicyCase {
  baseline: Call;
  faults: Fault[];
}

/** The documented example as a valid call: its literals as typed, its ranges filled with positive data of one shape. */
export function baselineCall(fn: FunctionMetadata): fc.Arbitrary<Call> | null {
  const example = exampleArguments(fn);
  if (!example) return null;
  const shapeArb = fc.record({ rows: fc.integer({ min: 4, max: 30 }), cols: fc.constantFrom(1, 1, 1, 2) });
  return shapeArb.chain((shape) => {
    const args = fn.parameters.map((p, k): fc.Arbitrary<Arg> => {
      const text = example[k];
      const kind = paramKind(p);
      if (text === undefined || text === "") {
        if (p.optional) return fc.constant<Arg>({ kind: "omit" });
        return scalarArg({ ...p, optional: false });
      }
      // A range parameter documented with a plain number (one value for every row, as the
      // load-to-strength functions take dimensions) keeps that number: random data there would
      // not be a valid specimen.
      const numberTyped = /^-?\d+(\.\d+)?(e-?\d+)?$/i.test(text.trim());
      if (isRangeText(text) || (!numberTyped && (kind === "numberRange" || kind === "flagRange" || kind === "labelRange"))) {
        return widthFor(p, shape)
          .chain((s) => (kind === "flagRange" ? flagRange(s) : kind === "labelRange" ? labelRange(s, labelsOf(p), false) : numberRange(s, { blanks: false, wild: false })))
          .map((cells): Arg => ({ kind: "range", cells }));
      }
      return fc.constant<Arg>({ kind: "literal", text });
    });
    return fc.tuple(...args).map((a) => ({ id: fn.id, args: a }));
  });
}

const withArg = (call: Call, k: number, arg: Arg): Call => ({ ...call, args: call.args.map((a, j) => (j === k ? arg : a)) });

function position(rows: number, cols: number, r: number, c: number): RegExp {
  return cols > 1 ? new RegExp(`row ${r + 1} column ${c + 1}\\b`) : new RegExp(`row ${r + 1}\\b`);
}

/** Values just outside a documented domain. */
export function outsideDomain(d: Domain): number[] {
  const out: number[] = [];
  if (Number.isFinite(d.lo)) {
    if (d.loOpen) out.push(d.lo);
    out.push(d.lo - 1, d.lo - 1e-9 * Math.max(1, Math.abs(d.lo)), -1e300);
  }
  if (Number.isFinite(d.hi)) {
    if (d.hiOpen) out.push(d.hi);
    out.push(d.hi + 0.5, 1e300);
  }
  if (d.integer) out.push(d.lo + 0.5);
  return out.filter((x) => !(x > d.lo && x < d.hi) || (d.integer && !Number.isInteger(x)));
}

/** Every single fault the policy has a promise for, applied to one baseline. */
export function faultsFor(fn: FunctionMetadata, baseline: Call): fc.Arbitrary<Fault[]> {
  const faults: fc.Arbitrary<Fault[]>[] = [];
  const rangeParams = fn.parameters.map((p, k) => ({ p, k, kind: paramKind(p) })).filter((x) => x.kind === "numberRange");
  fn.parameters.forEach((p, k) => {
    const kind = paramKind(p);
    const arg = baseline.args[k];
    if (kind === "numberRange" && arg.kind === "range") {
      const rows = arg.cells.length;
      const cols = arg.cells[0].length;
      faults.push(
        fc
          .tuple(fc.nat(rows - 1), fc.nat(cols - 1), fc.constantFrom("abc", "NaN", "Infinity", "n/a", "12 MPa"), fc.boolean())
          .map(([r, c, text, bool]) => {
            const at = (v: Cell) => withArg(baseline, k, { kind: "range", cells: arg.cells.map((row, i) => row.map((x, j) => (i === r && j === c ? v : x))) });
            const here = position(rows, cols, r, c);
            const original = arg.cells[r][c] as number;
            const list: Fault[] = [
              { call: at(text), expect: { code: "#VALUE!", message: here }, what: `text "${text}" in ${p.name} at ${r + 1},${c + 1}` },
              { call: at(bool), expect: { code: "#VALUE!", message: here }, what: `${bool} in ${p.name} at ${r + 1},${c + 1}` },
              { call: at("1e999"), expect: { code: "#VALUE!", message: here }, what: `1e999 (an infinite number) in ${p.name}` },
              { call: at("=NA()"), expect: { code: "#N/A" }, what: `an #N/A cell in ${p.name}` },
              { call: at("=1/0"), expect: { code: "#DIV/0!" }, what: `a #DIV/0! cell in ${p.name}` },
            ];
            if (rejectsNegative(p)) list.push({ call: at(-Math.abs(original || 1)), expect: { code: "#VALUE!", message: here }, what: `a negative value in ${p.name} at ${r + 1},${c + 1}` });
            if (rows > 1 && (pairsWithAnother(p) || (rangeParams.length > 1 && rangeParams.some((x) => x.k !== k && pairsWithAnother(x.p))))) {
              list.push({ call: withArg(baseline, k, { kind: "range", cells: arg.cells.slice(0, -1) }), expect: { code: "#VALUE!", message: /rows|columns|shape/ }, what: `${p.name} one row shorter than its partner` });
            }
            return list;
          }),
      );
    }
    if (kind === "labelRange" && arg.kind === "range" && pairsWithAnother(p) && arg.cells.length > 1) {
      faults.push(
        fc.constant<Fault[]>([
          { call: withArg(baseline, k, { kind: "range", cells: arg.cells.slice(0, -1) }), expect: { code: "#VALUE!", message: /rows|columns|shape/ }, what: `${p.name} one row shorter than its partner` },
        ]),
      );
    }
    if (kind === "flagRange" && rangeParams.length > 0) {
      const partner = baseline.args[rangeParams[0].k];
      if (partner.kind === "range") {
        const rows = partner.cells.length;
        const cols = partner.cells[0].length;
        const falses = (n: number): Cell[][] => Array.from({ length: n }, () => Array<Cell>(cols).fill(false));
        faults.push(
          fc.nat(rows - 1).map((r) => [
            { call: withArg(baseline, k, { kind: "range", cells: falses(rows + 1) }), expect: { code: "#VALUE!", message: /rows|columns|shape/ }, what: `${p.name} one row longer than ${rangeParams[0].p.name}` },
            {
              call: withArg(baseline, k, { kind: "range", cells: falses(rows).map((row, i) => (i === r ? row.map(() => "maybe") : row)) }),
              expect: { code: "#VALUE!" },
              what: `"maybe" in ${p.name}`,
            },
            { call: withArg(baseline, k, { kind: "range", cells: falses(rows) }), expect: { same: true }, what: `${p.name} all FALSE (no censoring) is the same as none` },
          ]),
        );
      }
    }
    if (kind === "number") {
      const list: Fault[] = [
        { call: withArg(baseline, k, { kind: "literal", text: '"abc"' }), expect: { code: "#VALUE!" }, what: `text typed as ${p.name}` },
        { call: withArg(baseline, k, { kind: "cell", value: "abc" }), expect: { code: "#VALUE!" }, what: `a text cell as ${p.name}` },
        { call: withArg(baseline, k, { kind: "cell", value: "=1/0" }), expect: { code: "#DIV/0!" }, what: `a #DIV/0! cell as ${p.name}` },
      ];
      const d = documentedDomain(p);
      // "required for the disk configurations": a value the function may rightly ignore has no promised error.
      if (d && !/required for|only for|ignored/i.test(p.description ?? "")) {
        for (const x of outsideDomain(d)) {
          list.push({ call: withArg(baseline, k, { kind: "literal", text: numberLiteral(x) }), expect: { code: "#VALUE!" }, what: `${p.name} = ${x}, outside its documented domain` });
        }
      }
      if (p.optional && arg.kind === "omit" && k === fn.parameters.length - 1) {
        list.push({ call: { ...baseline, args: [...baseline.args.slice(0, k), { kind: "empty" }] }, expect: { same: true }, what: `an empty ${p.name} takes its default` });
      }
      faults.push(fc.constant(list));
    }
    if (kind === "choice") {
      faults.push(
        fc.constant<Fault[]>([
          { call: withArg(baseline, k, { kind: "literal", text: '"NO-SUCH-OPTION"' }), expect: { code: "#VALUE!" }, what: `an unknown keyword as ${p.name}` },
          { call: withArg(baseline, k, { kind: "literal", text: "3" }), expect: { code: "#VALUE!" }, what: `a number as ${p.name}` },
        ]),
      );
    }
  });
  // Blanks inserted at the same row of every range change nothing, unless the result has a row per cell.
  const rangesAt = baseline.args.flatMap((a, k) => (a.kind === "range" ? [k] : []));
  const fixedSpill = !spillShapes[fn.id] || typeof spillShapes[fn.id].rows === "number";
  if (rangesAt.length > 0 && fixedSpill && fn.parameters.every((p, k) => p.dimensionality !== "matrix" || baseline.args[k].kind !== "cell")) {
    const first = baseline.args[rangesAt[0]] as { kind: "range"; cells: Cell[][] };
    faults.push(
      fc.tuple(fc.nat(first.cells.length), fc.constantFrom<Cell>(...BLANKS)).map(([at, blank]) => {
        let call = baseline;
        for (const k of rangesAt) {
          const cells = (baseline.args[k] as { cells: Cell[][] }).cells;
          const blanks = Array<Cell>(cells[0].length).fill(blank);
          call = withArg(call, k, { kind: "range", cells: [...cells.slice(0, at), blanks, ...cells.slice(at)] });
        }
        return [{ call, expect: { same: true } as const, what: `a row of ${JSON.stringify(blank)} inserted at row ${at + 1} of every range` }];
      }),
    );
  }
  return fc.tuple(...faults).map((lists) => lists.flat());
}

export function policyCase(fn: FunctionMetadata): fc.Arbitrary<PolicyCase> | null {
  const base = baselineCall(fn);
  if (!base) return null;
  return base.chain((baseline) => faultsFor(fn, baseline).map((faults) => ({ baseline, faults })));
}
