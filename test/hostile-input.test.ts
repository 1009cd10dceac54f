// The hostile-input corpus for delimited text (test/fixtures/hostile/csv-*, part-*, paste-*):
// files and pastes as ordinary machines and people produce them. Each case names the failure it
// guards against and checks either the correct value or the exact error and exit code.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { main } from "../cli/cli";
import { evaluateWorkbook } from "../cli/evaluate-workbook";
import { runPartCommand } from "../cli/part-command";
import { loadWorkbook, readCsvBytes } from "../cli/workbook-io";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { MAX_LINE_BYTES, PartTableReader, readPartTable } from "../src/size/part-stream";
import { parsePasted, PasteError } from "../taskpane/app/parse-pasted";
import { parseElementTable } from "../taskpane/app/parse-table";
import { fixture, relativeError } from "./helpers";

const HOSTILE = "test/fixtures/hostile";
const at = (name: string) => join(HOSTILE, name);
const bytesOf = (name: string) => new Uint8Array(readFileSync(at(name)));

// The strengths in the csv-* files are dataset complete-n10-m10-s350; its maximum-likelihood
// modulus and characteristic strength are 40-digit mpmath solutions
// (test/fixtures/generate_weibull_fits.py -> weibull_fits.json).
const data = fixture("weibull_fits.json").datasets.find((d: { id: string }) => d.id === "complete-n10-m10-s350");

function capture() {
  const io = { stdout: "", stderr: "", out: (t: string) => (io.stdout += t), err: (t: string) => (io.stderr += t), errIsTTY: false };
  return io;
}

/** Nothing the user sees may say NaN or Infinity. */
function expectNoNonFinite(text: string): void {
  expect(text).not.toMatch(/NaN|Infinity/);
}

describe("CSV sheets for brittle calc", () => {
  let metadata: FunctionMetadata[];
  beforeAll(async () => {
    metadata = (await generateMetadata()).functions;
  }, 120_000);

  async function modulusOf(name: string, cell: [number, number] = [1, 1]): Promise<number> {
    const book = await loadWorkbook(at(name));
    const grid = Object.values(evaluateWorkbook(book, metadata).grids)[0];
    return grid[cell[0]][cell[1]] as number;
  }

  it(
    "a European CSV (semicolons, decimal commas) is read, not 'no formulas found' with exit 0",
    async () => {
      const io = capture();
      expect(await main(["calc", at("csv-european-semicolon-decimal-comma.csv"), "--json"], io)).toBe(0);
      const grid = Object.values(JSON.parse(io.stdout))[0] as (number | string | null)[][];
      expect(relativeError(grid[1][1] as number, data.ml.shapeFloat)).toBeLessThan(1e-12); // mpmath, weibull_fits.json
      expect(relativeError(grid[2][1] as number, data.ml.scaleFloat)).toBeLessThan(1e-12); // mpmath, weibull_fits.json
      expect(io.stderr).toMatch(/semicolon-delimited, decimal comma \(detected: "367,1" on line 8\)/); // "373,763" alone could be 373763
    },
    120_000,
  );

  it(
    "encodings, byte-order marks and line ends do not change the numbers (UTF-16 gave 'no formulas found')",
    async () => {
      for (const name of [
        "csv-utf8-bom.csv",
        "csv-utf16le-bom.csv",
        "csv-utf16be-bom.csv",
        "csv-utf16le-no-bom.csv",
        "csv-crlf.csv",
        "csv-lone-cr.csv",
        "csv-windows-1252.csv",
        "csv-trailing-delimiters.csv",
        "csv-exponent-decimal-comma.csv",
      ]) {
        expect(relativeError(await modulusOf(name), data.ml.shapeFloat), name).toBeLessThan(1e-12); // mpmath, weibull_fits.json
      }
      // No byte-order mark left in the first cell; the micro sign survives Windows-1252.
      expect(readCsvBytes(bytesOf("csv-utf16le-bom.csv")).rows[0][0]).toBe("Strength (MPa; invented test data)");
      const latin = readCsvBytes(bytesOf("csv-windows-1252.csv"));
      expect(latin.encoding).toBe("Windows-1252");
      expect(latin.rows[0][0]).toBe("Strength (\u00b5-test; invented)");
    },
    120_000,
  );

  it(
    "blank lines stay empty rows, so references keep pointing at the lines the user sees",
    async () => {
      expect(relativeError(await modulusOf("csv-blank-lines.csv"), data.ml.shapeFloat)).toBeLessThan(1e-12); // mpmath, weibull_fits.json
    },
    120_000,
  );

  it("a comma CSV with unquoted decimal commas is refused (was a modulus of 10.807 instead of 10.853, exit 0)", async () => {
    const io = capture();
    expect(await main(["calc", at("csv-comma-split-decimals.csv"), "--json"], io)).toBe(1);
    expect(io.stdout).toBe("");
    expect(io.stderr.trim().split("\n")).toHaveLength(1);
    expect(io.stderr).toMatch(/csv-comma-split-decimals\.csv: line 2 has 3 fields, but line 1 has 2 \(delimiter: comma\)/);
  });

  it("a headerless one-column file of decimal commas is refused, and --decimal-comma / --decimal-point settle it", () => {
    expect(() => readCsvBytes(bytesOf("csv-comma-decimals-no-header.csv"))).toThrow(
      /^line 1: "373,763" may hold numbers with decimal commas split apart by the comma delimiter/,
    );
    // Source for the values: the digits of the file itself, read with a decimal comma (common practice).
    const asComma = readCsvBytes(bytesOf("csv-comma-decimals-no-header.csv"), { decimalMark: "comma" }).rows;
    expect(asComma.map((r) => r[0])).toEqual(data.strengths);
    const asFields = readCsvBytes(bytesOf("csv-comma-decimals-no-header.csv"), { decimalMark: "point" }).rows;
    expect(asFields[0]).toEqual([373, 763]);
  });

  it("thousands separators, mixed decimal marks and ragged rows are refused with the line", async () => {
    const cases: [string, RegExp][] = [
      ["csv-thousands-grouped.csv", /line 2, field 1: "1\.250,5" has thousands separators, which are not read/],
      ["csv-nbsp-thousands.csv", /line 2, field 1: "1\u00a0250,5" has thousands separators/],
      ["csv-mixed-decimal-marks.csv", /mixed decimal marks: line 3 has "445\.3", line 2 has "445,3"/],
      ["csv-extra-field.csv", /line 3 has 3 fields, but line 1 has 2/],
      ["csv-missing-field.csv", /line 3 has 1 field, but line 1 has 3/],
      ["csv-unclosed-quote.csv", /line 2: a quoted field is not closed/],
      ["csv-zip-renamed.csv", /zip archive \(an \.xlsx workbook\?\), not delimited text/],
    ];
    for (const [name, message] of cases) {
      const io = capture();
      expect(await main(["calc", at(name)], io), name).toBe(1);
      expect(io.stderr, name).toMatch(message);
      expect(io.stderr.trim().split("\n"), name).toHaveLength(1);
      expect(io.stdout, name).toBe("");
    }
  });

  it("quoted delimiters, quotes and line ends stay inside their field; no-break spaces are padding; -0 is 0", () => {
    expect(readCsvBytes(bytesOf("csv-quoted-delimiters.csv")).rows).toEqual([
      ["Label", "Value"],
      ["a, b; c", 1.5],
      ['say "hi"', 2.5],
      ["two\nlines", 3.5],
    ]);
    expect(readCsvBytes(bytesOf("csv-nbsp-padding.csv")).rows[1]).toEqual([445.3, "x"]);
    expect(Object.is(readCsvBytes(bytesOf("csv-negative-zero.csv")).rows[1][0], 0)).toBe(true);
  });

  it("--decimal-comma and --decimal-point are options of calc, and only one at a time", async () => {
    const io = capture();
    expect(await main(["calc", at("csv-comma-decimals-no-header.csv"), "--decimal-comma", "--decimal-point"], io)).toBe(2);
    expect(io.stderr).toMatch(/not both/);
  });
});

describe("element tables for brittle part", () => {
  const dir = mkdtempSync(join(tmpdir(), "brittle-hostile-"));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  async function part(args: string[]) {
    const io = capture();
    const code = await runPartCommand(args, io);
    expectNoNonFinite(io.stdout + io.stderr);
    return { code, ...io };
  }

  // The table in part-european.csv and its re-encodings: stresses 100.5, -40, 250 with sizes 2, 1, 0.5.
  // Source: the definitions S_E = sum V_e (s_e / s_max)^m and Pf = 1 - exp(-S_E (s_max / sigma_0)^m)
  // (ASTM C1683, Annex A3; one stress column counts as uniaxial, compression as nothing).
  const S = 2 * (100.5 / 250) ** 8 + 0.5;
  const Pf = -Math.expm1(-S * (250 / 400) ** 8);

  it("semicolons with decimal commas (and a decimal-comma exponent), UTF-16, lone CR, padding and mixed blanks read alike", async () => {
    for (const name of [
      "part-european.csv",
      "part-utf16le-bom.csv",
      "part-utf16be-no-bom.csv",
      "part-lone-cr.csv",
      "part-trailing-delimiters.csv",
      "part-tabs-and-spaces.txt",
    ]) {
      const r = await part([at(name), "--modulus", "8", "--scale", "400", "--json"]);
      expect(r.code, `${name}: ${r.stderr}`).toBe(0);
      const result = JSON.parse(r.stdout);
      expect(relativeError(result.effectiveSize, S), name).toBeLessThan(1e-14);
      expect(relativeError(result.failureProbability, Pf), name).toBeLessThan(1e-13);
    }
  });

  it("every skipped line other than the header is named on stderr", async () => {
    const r = await part([at("part-european.csv"), "--modulus", "8", "--quiet"]);
    expect(r.code).toBe(0);
    expect(r.stderr).toBe("brittle part: skipped line 1 (comment), line 4 (blank)\n");
    expect(r.stdout).toMatch(/3 elements, header on line 2; 2 blank or comment lines skipped \(listed on stderr\)/);
    expect(r.stdout).toMatch(/read as\s+UTF-8, delimiter ";", decimal comma \(detected: "1,005E\+02" on line 3\)/);
  });

  it("numbers in every form a program writes are read exactly as Number() reads them (full doubles were 2 ulp off)", async () => {
    // '+' signs, E and e, leading and trailing zeros, 17 to 54 significant digits, a decimal exactly
    // between two doubles (9007199254740993e-14), tiny and huge exponents. Reference: ECMAScript
    // Number() on each field's text (StringToNumber rounds correctly to nearest, ties to even).
    const r = await part([at("part-number-forms.csv"), "--modulus", "8", "--top", "100", "--json"]);
    expect(r.code, r.stderr).toBe(0);
    const result = JSON.parse(r.stdout);
    const rows = readFileSync(at("part-number-forms.csv"), "latin1").trim().split("\n").slice(1).map((l) => l.split(","));
    expect(result.rows).toBe(rows.length);
    for (const h of result.hotSpots) {
      const fields = rows[h.line - 2];
      expect(h.id).toBe(fields[0]);
      // "-0 reads as 0" (docs/files-and-formats.md): the same on the fast and the general path.
      const want = fields.slice(1, 4).map((f) => Number(f) || 0);
      expect(h.principal, `line ${h.line}`).toEqual(want.sort((a, b) => b - a));
      h.principal.forEach((v: number) => expect(Object.is(v, -0)).toBe(false));
      expect(h.size, `line ${h.line}`).toBe(Number(fields[4]));
    }
    expect(result.hotSpots).toHaveLength(rows.length); // every row has a tensile stress
  });

  it("words and malformed numbers stop the read with line and field (never a silent 0 or NaN)", async () => {
    // Each refusal says what the text is, where the reader can tell (src/input/number-text.ts, explainNotANumber).
    for (const [name, text, reason] of [
      ["part-inf-text.csv", "inf", "is infinite, not a number: type a finite value"],
      ["part-nan-text.csv", "NaN", "marks a missing value: leave the value (or its line) out, or type the number"],
      ["part-infinity-word.csv", "-Infinity", "is infinite, not a number: type a finite value"],
      ["part-space-inside-number.csv", "1 5", "is not a number"],
      ["part-hex-number.csv", "0x1A", "is written in another base (0x, 0b or 0o): type the decimal number"],
    ]) {
      const io = capture(); // not part(): the message quotes the field, "NaN" and "Infinity" included
      expect(await runPartCommand([at(name), "--modulus", "8"], io), name).toBe(1);
      expect(io.stderr, name).toBe(`brittle part: line 3: the stress field 2 ("${text}") ${reason}\n`);
      expect(io.stdout).toBe("");
    }
  });

  it("a header with no elements is an error (was 'failure probability 0', exit 0)", async () => {
    const r = await part([at("part-header-only.csv"), "--modulus", "10", "--scale", "400"]);
    expect(r.code).toBe(1);
    expect(r.stderr).toBe("brittle part: the table is empty: 1 line read (header, blank or comment), no element\n");
  });

  it("values too large to represent name the element (sizes of 1e308 printed 'effective size NaN')", async () => {
    const cases: [string, RegExp][] = [
      ["part-huge-sizes.csv", /^brittle part: element 1 \(line 2\): with its size 1e\+308 the effective size is too large to represent/],
      ["part-huge-risk.csv", /^brittle part: element 1 \(line 2\): the risk of rupture is too large to represent/],
      ["part-huge-tensor.csv", /^brittle part: the element on line 2: its principal stresses are too large to represent/],
    ];
    for (const [name, message] of cases) {
      const r = await part([at(name), "--modulus", "8", "--scale", "400"]);
      expect(r.code, name).toBe(1);
      expect(r.stderr, name).toMatch(message);
    }
    const overflow = join(dir, "overflow.csv");
    writeFileSync(overflow, "s,vol\n1e999,1\n");
    const r = await part([overflow, "--modulus", "8"]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/line 2: the stress field 1 \("1e999"\) is too large to represent/);
  });

  it("'1,250' in a tab or space table is never read as 1.25 unless the decimal comma is stated", async () => {
    const space = await part([at("part-thousands-space.txt"), "--modulus", "8"]);
    expect(space.code).toBe(1);
    expect(space.stderr).toMatch(/line 2: the stress field 2 \("1,250"\) could be 1250 \(thousands separator\) or 1\.25 \(decimal comma\)/);
    const tab = await part([at("part-thousands-tab.txt"), "--modulus", "8"]);
    expect(tab.code).toBe(1);
    expect(tab.stderr).toMatch(/line 2: the stress field 2 \("1,250"\) looks like 1250 with a thousands separator: thousands separators are not read/);
    const point = await part([at("part-thousands-space.txt"), "--modulus", "8", "--decimal-point"]);
    expect(point.code).toBe(1);
    expect(point.stderr).toMatch(/thousands separators are not read, write 1250/);
    const comma = await part([at("part-thousands-space.txt"), "--modulus", "8", "--decimal-comma", "--json"]);
    expect(comma.code).toBe(0);
    // Stated decimal comma: stresses 1.25 and 900, sizes 2 and 1 (definition of S_E, as above).
    expect(relativeError(JSON.parse(comma.stdout).effectiveSize, 2 * (1.25 / 900) ** 8 + 1)).toBeLessThan(1e-14);
  });

  it("rows wider or narrower than the first line stop the read with the line (a wider row used to shift its columns)", async () => {
    const extra = await part([at("part-extra-field.csv"), "--modulus", "8"]);
    expect(extra.code).toBe(1);
    expect(extra.stderr).toMatch(/line 3: found 4 fields, more than the 3 on line 1/);
    const missing = await part([at("part-missing-field.csv"), "--modulus", "8"]);
    expect(missing.code).toBe(1);
    expect(missing.stderr).toMatch(/line 3: expected at least 3 fields as on line 1, found 2/);
  });

  it("a headerless comma table of whole numbers may be split decimals: refused unless stated", async () => {
    const auto = await part([at("part-comma-split-decimals.csv"), "--modulus", "8"]);
    expect(auto.code).toBe(1);
    expect(auto.stderr).toMatch(/line 1: "100,5" may hold numbers with decimal commas/);
    const fields = await part([at("part-comma-split-decimals.csv"), "--modulus", "8", "--decimal-point", "--json"]);
    expect(fields.code).toBe(0);
    // Two columns, stress then size: 100 with size 5, 250 with size 3 (definition of S_E).
    expect(relativeError(JSON.parse(fields.stdout).effectiveSize, 5 * (100 / 250) ** 8 + 3)).toBeLessThan(1e-14);
  });

  it(
    "one 20 MB line is refused at the stated maximum line length, not copied again for every chunk",
    async () => {
      const chunk = new Uint8Array(1 << 16).fill(0x31); // "1111..."
      const reader = new PartTableReader({ shape: 10 });
      let error: unknown = null;
      try {
        for (let sent = 0; sent < 20 * (1 << 20); sent += chunk.length) reader.push(chunk);
        reader.finish();
      } catch (e) {
        error = e;
      }
      expect((error as Error).message).toBe(
        `line 1 is longer than ${MAX_LINE_BYTES} bytes, the most an element table line may have (is this a table, with line ends?)`,
      );
    },
    60_000,
  );

  it(
    "a line just under the maximum, arriving in small chunks, is joined once and read",
    async () => {
      const long = `#${"x".repeat(MAX_LINE_BYTES - 10)}\ns,vol\n100.5,2\n-40,1\n250,0.5\n`;
      const bytes = new TextEncoder().encode(long);
      const chunks: Uint8Array[] = [];
      for (let i = 0; i < bytes.length; i += 4096) chunks.push(bytes.subarray(i, i + 4096));
      const r = await readPartTable(chunks, { shape: 8 });
      expect(r.skipped[0]).toEqual({ from: 1, to: 1, reason: "comment" });
      expect(relativeError(r.effectiveSize, S)).toBeLessThan(1e-14); // definition of S_E, as above
    },
    60_000,
  );
});

describe("strengths pasted into the task pane", () => {
  const paste = (name: string, options = {}) => parsePasted(readFileSync(at(name), "utf8"), options);

  it("'412,0 / 398,1 / ...' is refused as ambiguous (was read as integers with censoring flags), and the switch reads decimals", () => {
    expect(() => paste("paste-decimal-comma-ambiguous.txt")).toThrow(
      new PasteError(
        'Line 1: "412,0" could be a strength with a decimal comma or a strength and a censoring flag. ' +
          'Turn on "decimal comma" if the comma is a decimal mark, or separate flags with a tab.',
      ),
    );
    // Source for the values: the digits typed, read with a decimal comma (common practice).
    const r = paste("paste-decimal-comma-ambiguous.txt", { decimalComma: true });
    expect(r.strengths).toEqual([412, 398.1, 455, 430.1]);
    expect(r.censored).toBeUndefined();
    expect(r.notes).toEqual(["Read with decimal commas."]);
  });

  it("decimal commas that cannot be flags are read as decimals, and the note says so", () => {
    const r = paste("paste-decimal-comma.txt");
    expect(r.strengths).toEqual([412, 398.1, 455.7, 430.25]);
    expect(r.notes).toEqual(["Read with decimal commas."]);
    const s = paste("paste-semicolon-decimal-comma.txt");
    expect(s.strengths).toEqual([412.5, 398.1, 455]);
    expect(s.censored).toEqual([false, true, true]);
  });

  it("a typo in the first line is an error at that line, not a silently skipped header", () => {
    expect(() => paste("paste-typo-first-line.txt")).toThrow(new PasteError('Line 1: "49S.3" is not a number (use a point as the decimal separator).'));
  });

  it("only the documented flags mark censoring (any non-zero token used to)", () => {
    expect(() => paste("paste-bad-flag.txt")).toThrow(
      new PasteError('Line 1 (flag) must be TRUE, 1, C or CENSORED (censored) or FALSE, 0, F or blank (failed); found "2".'),
    );
    expect(parsePasted("410\tcensored\n420\tF\n430\ttrue\n440\t0").censored).toEqual([true, false, true, false]);
  });

  it("the header line and blank lines are named in the note under the field", () => {
    const r = paste("paste-header-and-blank.txt");
    expect(r.strengths).toEqual([412.5, 398.1, 455]);
    expect(r.censored).toEqual([false, true, false]);
    expect(r.notes).toEqual(['Line 1 skipped as a header: "Strength (MPa)\tcensored".', "Blank line 3 skipped."]);
  });

  it("'1,250' pasted alone is refused, never read as 1.25", () => {
    expect(() => paste("paste-thousands.txt")).toThrow(/Line 1: "1,250" could be 1250 \(thousands separator\) or 1\.25 \(decimal comma\)/);
  });

  it("a pasted element table follows the same rules", () => {
    expect(() => parseElementTable("s\tV\n1,250\t2\n")).toThrow(/Line 2: "1,250" could be 1250/);
    expect(parseElementTable("s\tV\n1,250\t2\n", { decimalComma: true }).stresses).toEqual([[1.25]]);
    expect(() => parseElementTable("1,2\n3,4\n")).toThrow(/"1,2" may hold numbers with decimal commas/);
  });
});
