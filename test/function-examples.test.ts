// The worked examples in the cell functions' descriptions ("Example: =BRITTLE.X(...) is about V"), checked against
// the formulas of docs/methods.md evaluated by mpmath at 40 digits, independently of the code:
// test/fixtures/generate_function_examples.py (function_examples.json; LOTFAILURES from scipy's binom.ppf).
// engine-workbook.test.ts checks that each example's V is what the code returns; this checks both against the formulas.
import { beforeAll, describe, expect, it } from "vitest";
import { evaluateWorkbook } from "../cli/evaluate-workbook";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { fixture, relativeError } from "./helpers";

interface Example {
  formula: string;
  expected: number;
  quadrature: boolean;
}
const ref = fixture<{ examples: Example[]; isoPrinted: { formula: string; expected: number } }>("function_examples.json");

let metadata: FunctionMetadata[];
beforeAll(async () => {
  metadata = (await generateMetadata()).functions;
});

function evaluate(formulas: string[]): unknown[] {
  const { formulas: out } = evaluateWorkbook({ kind: "csv", sheets: { Docs: formulas.map((f) => [f]) } }, metadata);
  return out.map((f) => f.value);
}

/** The value a description states for its example ("is about V" or "is V"), with its digits. */
function stated(formula: string): { value: number; digits: number } | null {
  const name = formula.slice("=BRITTLE.".length, formula.indexOf("("));
  const description = metadata.find((f) => f.id === name)?.description.replace(/\s+/g, " ") ?? "";
  const at = description.indexOf(`Example: ${formula} is `);
  if (at < 0) return null;
  const m = /^is (?:about )?(-?[\d.]+(?:[eE][+-]?\d+)?)/.exec(description.slice(at + `Example: ${formula} `.length));
  if (!m) return null;
  const text = m[1].replace(/\.$/, "");
  return { value: Number(text), digits: text.replace(/[eE].*$/, "").replace(/^-?0\.0*|[.-]/g, "").length };
}

describe("worked examples in the function descriptions, against the formulas (mpmath)", () => {
  it("every example in the fixture still stands in its description, with a stated value", () => {
    for (const e of ref.examples) expect(stated(e.formula), e.formula).not.toBeNull();
    expect(ref.examples.length).toBeGreaterThanOrEqual(30);
  });

  it("the code returns the formula's value: 1e-12 relative (1e-9 where the reference is a quadrature)", () => {
    const values = evaluate(ref.examples.map((e) => e.formula));
    ref.examples.forEach((e, i) => {
      expect(typeof values[i], e.formula).toBe("number");
      expect(relativeError(values[i] as number, e.expected), e.formula).toBeLessThan(e.quadrature ? 1e-9 : 1e-12);
    });
  });

  it("the value each description states is the formula's value rounded to the digits shown", () => {
    for (const e of ref.examples) {
      const { value, digits } = stated(e.formula)!;
      expect(relativeError(value, e.expected), e.formula).toBeLessThan(Math.max(5 * 10 ** -digits, 1e-15));
    }
  });

  it("PISTONSTRENGTH is 1.000136 times ISO 6872's printed formula (3/(4 pi) for 0.2387; docs/methods.md section 9)", () => {
    const [value] = evaluate([ref.isoPrinted.formula]);
    const ratio = (value as number) / ref.isoPrinted.expected;
    expect(Math.abs(ratio - 3 / (4 * Math.PI) / 0.2387)).toBeLessThan(1e-13);
    // The doc's rounded figures: 1.000136, 0.0136 %, 108.494 against 108.479 MPa.
    expect(ratio.toFixed(6)).toBe("1.000136");
    expect((value as number).toFixed(3)).toBe("108.494");
    expect(ref.isoPrinted.expected.toFixed(3)).toBe("108.479");
  });
});
