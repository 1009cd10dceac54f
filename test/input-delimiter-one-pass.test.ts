// detectDelimiterOfText (src/input/delimited-text.ts) settles the delimiter of a whole text in one
// pass, for large sheets. Its definition is the line-by-line reading the streaming element reader
// still uses: detectDelimiter over contentLines(text, comments, no limit). Both must choose the same
// delimiter on the same basis for every text: the hostile corpus, and seeded texts of the characters
// the rule looks at (delimiters, quotes, '#', line ends, blanks inside and outside ASCII).
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { contentLines, detectDelimiter, detectDelimiterOfText, type DialectChoice } from "../src/input/delimited-text";
import { decodeText } from "../src/input/encoding";
import { SeededRandom } from "../src/numeric/random";

const CHOICES: DialectChoice[] = [{}, { allowWhitespace: true }, { decimalMark: "comma" }, { decimalMark: "point" }, { delimiter: ";" }];

function expectSameChoice(text: string): void {
  for (const comments of [false, true]) {
    for (const choice of CHOICES) {
      const lineByLine = detectDelimiter(contentLines(text, comments, Number.POSITIVE_INFINITY), choice);
      expect(detectDelimiterOfText(text, comments, choice), JSON.stringify({ text, comments, choice })).toEqual(lineByLine);
    }
  }
}

describe("detectDelimiterOfText", () => {
  it("chooses as the line-by-line reading on every delimited file of the hostile corpus", () => {
    const dir = "test/fixtures/hostile";
    const files = readdirSync(dir).filter((f) => /\.(csv|txt)$/.test(f));
    expect(files.length).toBeGreaterThan(30);
    for (const f of files) {
      let text: string;
      try {
        text = decodeText(new Uint8Array(readFileSync(join(dir, f)))).text;
      } catch {
        continue; // not text (a zip renamed .csv): refused before any delimiter is chosen
      }
      expectSameChoice(text);
    }
  });

  it("chooses as the line-by-line reading on seeded texts", () => {
    const random = new SeededRandom(7_2026);
    const alphabet = ["1", "4", ".", ",", ";", "\t", '"', "#", " ", "\u00a0", "\u2028", "\u3000", "\n", "\r", "\r\n", "a"];
    for (let k = 0; k < 4000; k++) {
      const length = Math.floor(random.uniform() * 40);
      let text = "";
      for (let i = 0; i < length; i++) text += alphabet[Math.floor(random.uniform() * alphabet.length)];
      expectSameChoice(text);
    }
  });

  it("sees a line that breaks the pattern at the end of a long text", () => {
    const body = "s;n\n" + "412;3\n".repeat(5000);
    expect(detectDelimiterOfText(body, false)).toEqual({ delimiter: ";", basis: "detected: splits every line alike" });
    expect(detectDelimiterOfText(body + "1;2;3\n", false)).toEqual({ delimiter: ";", basis: "detected: most frequent on the first line" });
  });
});
