// plainNumberValue (src/input/number-text.ts), the quick read of the commonest CSV tokens: wherever it
// answers, the answer is Number(text) as the ECMAScript specification defines it (StringToNumber, with
// -0 shown as 0), and readNumber, the full rule, reads the same token to the same value under the same
// mark; every token the full rule refuses or reads through a pattern it leaves alone (undefined).
import { describe, expect, it } from "vitest";
import { type DecimalMark, plainNumberValue, readNumber } from "../src/input/number-text";
import { fieldNumber } from "../src/input/read-table";
import { SeededRandom } from "../src/numeric/random";

const MARKS: (DecimalMark | null)[] = [null, "point", "comma"];

function agrees(text: string): void {
  for (const mark of MARKS) {
    const quick = plainNumberValue(text, mark);
    if (quick === undefined) continue;
    const number = Number(text); // ECMAScript StringToNumber
    expect(quick).toBe(number === 0 ? 0 : number);
    const full = readNumber(text, mark);
    expect(full.ok && full.value).toBe(quick);
  }
}

describe("plainNumberValue", () => {
  it("reads sign, digits and one decimal point as Number() does", () => {
    for (const t of ["413.6", "-12", "+7", ".5", "-.5", "5.", "0", "-0", "-0.0", "007", "0.250", "00.250", "1234.567", "12345"]) {
      expect(plainNumberValue(t, null)).toBe(Number(t) === 0 ? 0 : Number(t));
      agrees(t);
    }
  });

  it("leaves to the full rule: ambiguous marks, commas, exponents, blanks, signs alone, text", () => {
    const left = ["1.250", "-999.000", "1,250", "445,3", "1e3", "1E+03", " 5", "5 ", "+", "-", ".", "", "1.2.3", "1 250", "0x10", "Infinity", "NaN", "4O5", "1_000"];
    for (const t of left) expect(plainNumberValue(t, null)).toBeUndefined();
    // A decimal point in a decimal-comma file is refused by the full rule, with its reason.
    expect(plainNumberValue("445.3", "comma")).toBeUndefined();
    expect(() => fieldNumber("445.3", "comma", 4, 2)).toThrow(/line 4, field 2: "445.3" has a decimal point/);
    // Beyond double range: the full rule says so.
    expect(plainNumberValue("9".repeat(400), null)).toBeUndefined();
    expect(() => fieldNumber("9".repeat(400), null, 1, 1)).toThrow(/too large/);
  });

  it("agrees with Number() and readNumber on seeded tokens of digits, signs, points, commas and exponents", () => {
    const random = new SeededRandom(20261202);
    const alphabet = ["0", "1", "5", "9", ".", ",", "-", "+", "e", "E", " "];
    let answered = 0;
    for (let k = 0; k < 20000; k++) {
      const length = 1 + Math.floor(random.uniform() * 8);
      let t = "";
      for (let i = 0; i < length; i++) t += alphabet[Math.floor(random.uniform() * alphabet.length)];
      agrees(t);
      if (plainNumberValue(t, null) !== undefined) answered++;
    }
    expect(answered).toBeGreaterThan(100); // the generator does reach the quick path
  });
});
