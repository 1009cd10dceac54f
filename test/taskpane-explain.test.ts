/**
 * "Explain the selected cell": the formula reader, and the explanation read
 * through the spreadsheet API (office-addin-mock) and re-evaluated through
 * the registered adapters. References: the 40-digit maximum-likelihood fit of
 * weibull_fits.json (mpmath, test/fixtures/generate_weibull_fits.py) for the
 * value; the counts of specimens, censored and blank cells are counted by
 * hand from the invented sheet layout written out below; the formula syntax
 * (comma between arguments, semicolon between array rows, quoted sheet names
 * with doubled quotes, $ anchors) is the spreadsheet's invariant syntax
 * (from memory).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { OfficeMockObject } from "office-addin-mock";
import jStat from "jstat";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { explainFormula, explainTypedFormula } from "../taskpane/explain/explain-call";
import { FormulaError, parseFormula, referencesOf } from "../taskpane/explain/formula-parse";
import { explainSelectedCell } from "../taskpane/explain/host-explain";
import { fixture, relativeError } from "./helpers";

let metadata: FunctionMetadata[];
beforeAll(async () => {
  metadata = (await generateMetadata()).functions;
}, 60_000);

describe("reading a cell's formula", () => {
  it("finds the function, references, constants and omitted arguments", () => {
    const p = parseFormula(`=BRITTLE.FIT($A$2:$A$31,,0.9,"MLE-RAW")`);
    expect(p.call.name).toBe("FIT");
    expect(p.wrapped).toBe(false);
    expect(p.call.args.map((a) => a.kind)).toEqual(["reference", "omitted", "constant", "constant"]);
    expect(p.call.args[0]).toMatchObject({ sheet: null, address: "$A$2:$A$31" });
    expect(p.call.args[2]).toMatchObject({ value: 0.9 });
    expect(p.call.args[3]).toMatchObject({ value: "MLE-RAW" });
  });

  it("reads quoted sheet names, whole columns, names, nested calls and array constants", () => {
    const p = parseFormula(`=brittle.designstress(0.9999, BRITTLE.MODULUS('Lot 3 (it''s)'!B2:B20), {400;"x"}, Size_ratio, C:C)`);
    expect(p.call.name).toBe("DESIGNSTRESS");
    const [survival, nested, array, name, column] = p.call.args;
    expect(survival).toMatchObject({ kind: "constant", value: 0.9999 });
    expect(nested.kind).toBe("call");
    if (nested.kind !== "call") throw new Error("unreachable");
    expect(nested.call.args[0]).toMatchObject({ kind: "reference", sheet: "Lot 3 (it's)", address: "B2:B20" });
    expect(array).toMatchObject({ kind: "array", value: [[400], ["x"]] });
    expect(name).toMatchObject({ kind: "name", name: "Size_ratio" });
    expect(column).toMatchObject({ kind: "reference", address: "C:C" });
    expect(referencesOf(p.call).map((r) => r.text)).toEqual(["'Lot 3 (it''s)'!B2:B20", "Size_ratio", "C:C"]);
  });

  it("reads the stored workbook form, percentages, and a call wrapped in other functions", () => {
    const p = parseFormula(`=IFERROR(_xldudf_BRITTLE_FAILPROB(200,10,400,5%),"n/a, see notes")`);
    expect(p.call.name).toBe("FAILPROB");
    expect(p.wrapped).toBe(true);
    expect(p.call.args[3]).toMatchObject({ kind: "constant", value: 0.05 });
    // A comma inside a text constant is not an argument separator.
    expect(parseFormula(`=BRITTLE.SPECIMEN("a,b", 10)`).call.args).toHaveLength(2);
    // An arithmetic argument is kept as an expression, not guessed at.
    expect(parseFormula("=BRITTLE.DESIGNSTRESS(1-B3,10,400)").call.args[0]).toMatchObject({ kind: "expression", text: "1-B3" });
  });

  it("says plainly what it cannot read", () => {
    expect(() => parseFormula("412.5")).toThrow(FormulaError);
    expect(() => parseFormula("412.5")).toThrow(/holds a value, not a formula/);
    expect(() => parseFormula("=SUM(A1:A3)")).toThrow(/no BRITTLE function/);
    // "NOTBRITTLE." is another name, not ours.
    expect(() => parseFormula("=XBRITTLE.FIT(A1:A3)")).toThrow(/no BRITTLE function/);
    expect(() => parseFormula("=BRITTLE.FIT(A1:A3")).toThrow(/no closing parenthesis/);
    expect(() => parseFormula(`=BRITTLE.FIT("A1:A3)`)).toThrow(/no closing quote/);
  });
});

// ---- A sheet through office-addin-mock ----

const censoredN10 = fixture("weibull_fits.json").datasets.find((d: any) => d.id === "censored-n10");

/**
 * Invented layout on sheet "Tests": strengths in A1:A13 (the 10 of the
 * fixture, with an empty string at row 3, a zero at row 7 and a null at row
 * 11: three blanks), censoring flags beside them in B1:B13, formulas in C.
 */
function sheetValues(): unknown[][] {
  const a: unknown[] = [...censoredN10.strengths];
  const b: unknown[] = censoredN10.censored.map((c: boolean) => c);
  a.splice(2, 0, "");
  b.splice(2, 0, false);
  a.splice(6, 0, 0);
  b.splice(6, 0, false);
  a.splice(10, 0, null);
  b.splice(10, 0, "");
  return a.map((v, i) => [v, b[i]]);
}

interface CellSpec {
  formula: string;
  value: unknown;
  spillParent?: CellSpec & { address: string };
}

function mockContext(selected: CellSpec & { address: string }, columns: unknown[][]): Excel.RequestContext {
  const created: any[] = [];
  const track = (o: any) => {
    created.push(o);
    return o;
  };
  const range = (address: string, values: unknown[][]) => track(new OfficeMockObject({ address, values }));
  // Only A1:B13 and whole columns resolve; anything else is not in the mock.
  const sheet = {
    getRange(address: string) {
      const a = address.replace(/\$/g, "");
      if (a === "A1:A13") return range("Tests!A1:A13", columns.map((r) => [r[0]]));
      if (a === "B1:B13") return range("Tests!B1:B13", columns.map((r) => [r[1]]));
      if (a === "A:A") {
        return { getIntersectionOrNullObject: () => range("Tests!A1:A13", columns.map((r) => [r[0]])) };
      }
      throw new Error(`the mock has no range ${address}`);
    },
    getUsedRange: () => ({}),
  };
  const cellMock = (spec: CellSpec & { address: string }): any =>
    track(
      new OfficeMockObject({
        address: spec.address,
        formulas: [[spec.formula]],
        values: [[spec.value]],
        worksheet: sheet,
        getSpillParentOrNullObject: () =>
          spec.spillParent ? cellMock(spec.spillParent) : { isNullObject: true, load: () => undefined },
      }),
    );
  const selectedMock = { getCell: () => cellMock(selected) };
  return new OfficeMockObject({
    workbook: { getSelectedRange: () => selectedMock, worksheets: { getItem: () => sheet } },
    async sync() {
      for (const o of created) await o.sync();
    },
  }) as unknown as Excel.RequestContext;
}

describe("explaining the selected cell through the spreadsheet API", () => {
  it("re-evaluates a fit, says what it read, and matches the 40-digit solution", async () => {
    const columns = sheetValues();
    const formula = `=BRITTLE.MODULUS($A$1:$A$13,B1:B13,"MLE-RAW")`;
    const e = await explainSelectedCell(mockContext({ address: "Tests!C1", formula, value: censoredN10.ml.shapeFloat }, columns), metadata);
    expect(e.address, JSON.stringify(e.call.outcome)).toBe("Tests!C1");
    expect(e.formula).toBe(formula);
    expect(e.call.outcome.kind).toBe("value");
    if (e.call.outcome.kind !== "value") throw new Error("unreachable");
    // Reference: mpmath 40-digit ML solution (weibull_fits.json, censored-n10).
    expect(relativeError(e.call.outcome.value as number, censoredN10.ml.shapeFloat)).toBeLessThan(1e-12);
    const strengths = e.call.arguments[0];
    expect(strengths.parameter).toBe("strengths");
    expect(strengths.read).toBe("Tests!A1:A13 (13 cells)");
    // Counted by hand from the layout: 10 specimens, 4 flagged censored in the fixture, 3 blank cells inserted.
    expect(strengths.sample).toEqual({ cells: 13, specimens: 10, failures: 6, censored: 4, blanks: 3 });
    expect(e.call.arguments[2]).toMatchObject({ parameter: "method", read: '"MLE-RAW"' });
    expect(e.call.basis[0]).toMatch(/^Weibull modulus/);
    expect(e.notes).toEqual([]);
  });

  it("shows the full message behind an error code the host would show bare", async () => {
    const formula = "=BRITTLE.DESIGNSTRESS(1.5,10,400)";
    const e = await explainSelectedCell(mockContext({ address: "Tests!C2", formula, value: "#VALUE!" }, sheetValues()), metadata);
    expect(e.call.outcome.kind).toBe("error");
    if (e.call.outcome.kind !== "error") throw new Error("unreachable");
    // A bad input is #VALUE!, the code whose message the host shows (cell policy, functions/cells.ts).
    expect(e.call.outcome.code).toBe("#VALUE!");
    // The message names the argument and its domain (common practice: a survival probability lies in (0, 1)).
    expect(e.call.outcome.message).toMatch(/survival/);
    expect(e.call.outcome.message).toMatch(/between 0 and 1/);
    expect(e.call.outcome.message).not.toMatch(/NaN|Infinity/);
    // An omitted optional argument is named with its default, from the function's own description.
    expect(e.call.arguments[3]).toMatchObject({ parameter: "sizeRatio", read: "omitted: the default applies" });
    expect(e.call.basis.some((b) => /^sizeRatio omitted: .*default 1/.test(b))).toBe(true);
  });

  it("explains a spilled table from any of its cells, and notes a stale cell", async () => {
    const columns = sheetValues();
    const parent = { address: "Tests!E1", formula: "=BRITTLE.FIT(A:A,B1:B13,0.9)", value: "specimens" };
    const e = await explainSelectedCell(
      mockContext({ address: "Tests!F4", formula: "", value: 123, spillParent: parent }, columns),
      metadata,
    );
    expect(e.address).toBe("Tests!E1");
    expect(e.call.outcome.kind).toBe("table");
    if (e.call.outcome.kind !== "table") throw new Error("unreachable");
    expect(e.call.outcome.rows[0]).toEqual(["specimens", 10]);
    expect(e.call.arguments[0].sample).toEqual({ cells: 13, specimens: 10, failures: 6, censored: 4, blanks: 3 });
    // The confidence typed carries the parameter's own words on sidedness.
    expect(e.call.basis.some((b) => /^confidence 0\.9: /.test(b))).toBe(true);

    const stale = await explainSelectedCell(
      mockContext({ address: "Tests!C1", formula: `=BRITTLE.MODULUS(A1:A13,B1:B13,"MLE-RAW")`, value: 7.5 }, columns),
      metadata,
    );
    expect(stale.notes.some((n) => /cell shows 7\.5, which differs/.test(n))).toBe(true);
  });

  it("re-evaluates nested calls, and stops at an expression instead of guessing", async () => {
    const columns = sheetValues();
    const nested = await explainSelectedCell(
      mockContext({ address: "Tests!C3", formula: `=BRITTLE.MEANSTRENGTH(BRITTLE.MODULUS(A1:A13,B1:B13,"MLE-RAW"),400)`, value: 0 }, columns),
      metadata,
    );
    const inner = nested.call.arguments[0].nested!;
    expect(inner.name).toBe("MODULUS");
    expect(inner.outcome.kind).toBe("value");
    if (inner.outcome.kind === "value") expect(relativeError(inner.outcome.value as number, censoredN10.ml.shapeFloat)).toBeLessThan(1e-12);
    // Reference: mean = 400 Gamma(1 + 1/m), m from the mpmath fixture, Gamma from jstat 1.9.6 (accurate to about 1e-10 relative).
    expect(nested.call.outcome.kind).toBe("value");
    if (nested.call.outcome.kind === "value") {
      expect(relativeError(nested.call.outcome.value as number, 400 * jStat.gammafn(1 + 1 / censoredN10.ml.shapeFloat))).toBeLessThan(1e-9);
    }

    const expression = await explainSelectedCell(
      mockContext({ address: "Tests!C4", formula: "=BRITTLE.DESIGNSTRESS(1-A1,10,400)", value: 1 }, columns),
      metadata,
    );
    expect(expression.call.outcome.kind).toBe("not-evaluated");
    if (expression.call.outcome.kind !== "not-evaluated") throw new Error("unreachable");
    expect(expression.call.outcome.reason).toMatch(/survival is the expression 1-A1/);
  });

  it("names a misspelt function instead of evaluating something else", () => {
    const e = explainTypedFormula(parseFormula("=BRITTLE.MODULOUS({400,410,420})"), metadata);
    expect(e.call.outcome).toEqual({ kind: "not-evaluated", reason: "BRITTLE.MODULOUS is not a function of this add-in (check the spelling)." });
  });
});

describe("explaining a typed formula (no spreadsheet)", () => {
  it("evaluates constants through the adapters and asks for values where a reference was typed", () => {
    // Reference: closed form 1 - exp(-(200/400)^10) (docs/methods.md section 1) = 0.000976085...
    const e = explainTypedFormula(parseFormula("=BRITTLE.FAILPROB(200,10,400)"), metadata);
    expect(e.call.outcome.kind).toBe("value");
    if (e.call.outcome.kind === "value") expect(relativeError(e.call.outcome.value as number, -Math.expm1(-Math.pow(0.5, 10)))).toBeLessThan(1e-15);
    const r = explainTypedFormula(parseFormula("=BRITTLE.MODULUS(A1:A10)"), metadata);
    expect(r.call.outcome.kind).toBe("not-evaluated");
    if (r.call.outcome.kind === "not-evaluated") expect(r.call.outcome.reason).toMatch(/array constant such as \{412,398,455\}/);
  });

  it("counts an array constant's specimens and blanks with the cell readers", () => {
    const e = explainFormula({
      address: "",
      parsed: parseFormula(`=BRITTLE.CHARSTRENGTH({412.5;0;398.1;"";455},{FALSE;FALSE;TRUE;FALSE;FALSE},"MLE-RAW")`),
      cellValue: undefined,
      references: new Map(),
      metadata,
    });
    // By hand: five cells, a zero and an empty text skipped, one of the three specimens censored.
    expect(e.call.arguments[0].sample).toEqual({ cells: 5, specimens: 3, failures: 2, censored: 1, blanks: 2 });
  });
});
