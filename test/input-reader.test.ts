// The shared input reader (src/input) against independent implementations: text decoding
// against Node's WHATWG TextDecoder (Node 20, ICU), numbers against ECMAScript Number(), and
// the dialect rules on small cases whose meaning is fixed by the text itself.
import { describe, expect, it } from "vitest";
import { detectDialect, splitRecords } from "../src/input/delimited-text";
import { Utf16ToUtf8, decodeText, decodeUtf8, detectEncoding } from "../src/input/encoding";
import { classifyNumber, readNumber } from "../src/input/number-text";
import { readPartTable } from "../src/size/part-stream";
import { readCsvBytes } from "../cli/workbook-io";
import { InputError } from "../src/errors";
import { parsePasted, PasteError } from "../taskpane/app/parse-pasted";
import { parseElementTable, TableError } from "../taskpane/app/parse-table";

function seeded(seed: number) {
  return () => (seed = (seed * 16807) % 2147483647) / 2147483647;
}

// Text with ASCII, Latin-1, the euro sign, CJK and a character outside the BMP (a surrogate pair).
const SAMPLE = "id;s (µm, €);v\n1;100,5;2 — 強度 \u{1F9EA}\n";

describe("text decoding", () => {
  it("UTF-8 and UTF-16 LE/BE, with or without a mark, decode as TextDecoder does", () => {
    const utf8 = new TextEncoder().encode(SAMPLE);
    expect(decodeText(utf8)).toEqual({ text: SAMPLE, encoding: "UTF-8" });
    expect(decodeText(new Uint8Array([0xef, 0xbb, 0xbf, ...utf8]))).toEqual({ text: SAMPLE, encoding: "UTF-8 with BOM" });
    const le = new Uint8Array(Buffer.from(SAMPLE, "utf16le"));
    const be = new Uint8Array(le.length);
    for (let i = 0; i < le.length; i += 2) [be[i], be[i + 1]] = [le[i + 1], le[i]];
    // Reference: Node's WHATWG decoders.
    expect(decodeText(new Uint8Array([0xff, 0xfe, ...le])).text).toBe(new TextDecoder("utf-16le").decode(le));
    expect(decodeText(new Uint8Array([0xfe, 0xff, ...be])).text).toBe(new TextDecoder("utf-16be").decode(be));
    expect(decodeText(le)).toEqual({ text: SAMPLE, encoding: "UTF-16 LE" });
    expect(decodeText(be)).toEqual({ text: SAMPLE, encoding: "UTF-16 BE" });
  });

  it("strict UTF-8 refuses what TextDecoder({ fatal: true }) refuses, on random bytes", () => {
    const rnd = seeded(7);
    const strict = new TextDecoder("utf-8", { fatal: true });
    for (let k = 0; k < 3000; k++) {
      const n = 1 + Math.floor(rnd() * 12);
      const bytes = new Uint8Array(n);
      // Mostly high bytes, so that valid and invalid sequences both occur often.
      for (let i = 0; i < n; i++) bytes[i] = rnd() < 0.3 ? Math.floor(rnd() * 0x80) : 0x80 + Math.floor(rnd() * 0x80);
      let want: string | null;
      try {
        want = strict.decode(bytes);
      } catch {
        want = null;
      }
      expect(decodeUtf8(bytes), Array.from(bytes).join(",")).toBe(want);
    }
  });

  it("bytes that are not UTF-8 read as Windows-1252", () => {
    const bytes = new Uint8Array([0x53, 0x20, 0xb5, 0x6d, 0x20, 0x80, 0x20, 0x96, 0x20, 0xe9]);
    // Source: WHATWG Encoding Standard, index windows-1252 (0x80 euro sign, 0x96 en dash; 0xA0-0xFF as
    // Latin-1), confirmed with Python 3: bytes(...).decode("cp1252"). Node 20's TextDecoder("windows-1252")
    // decodes as Latin-1 and cannot serve as the reference here.
    expect(decodeText(bytes)).toEqual({ text: "S \u00b5m \u20ac \u2013 \u00e9", encoding: "Windows-1252" });
  });

  it("the streaming UTF-16 converter gives the same bytes as a UTF-8 encoder, whatever the chunking", () => {
    const le = new Uint8Array([0xff, 0xfe, ...Buffer.from(SAMPLE, "utf16le")]);
    const want = Array.from(new TextEncoder().encode(SAMPLE));
    for (const size of [1, 2, 3, 5, 64]) {
      const converter = new Utf16ToUtf8(detectEncoding(le));
      const got: number[] = [];
      for (let i = 0; i < le.length; i += size) got.push(...converter.push(le.subarray(i, i + size)));
      expect(got, `chunks of ${size}`).toEqual(want);
    }
  });

  it("a UTF-16 element table in one-byte chunks reads as the UTF-8 one", async () => {
    const text = "id;s;v\r\n1;100,5;2\r\n2;-40;1\r\n3;250;0,5\r\n";
    const le = new Uint8Array([0xff, 0xfe, ...Buffer.from(text, "utf16le")]);
    const chunks = Array.from(le, (b) => new Uint8Array([b]));
    const a = await readPartTable(chunks, { shape: 8 });
    const b = await readPartTable([new TextEncoder().encode(text)], { shape: 8 });
    expect(a.effectiveSize).toBe(b.effectiveSize);
    expect(a.encoding).toBe("UTF-16 LE");
  });
});

describe("numbers as text", () => {
  it("a number with one mark agrees with Number() on the same digits with a point", () => {
    const rnd = seeded(3);
    for (let k = 0; k < 5000; k++) {
      const v = (rnd() - 0.2) * 10 ** Math.floor(rnd() * 12 - 4);
      for (const point of [v.toPrecision(1 + Math.floor(rnd() * 15)), v.toExponential(Math.floor(rnd() * 10))]) {
        const comma = point.replace(".", ",");
        const want = Number(point) === 0 ? 0 : Number(point); // reference: ECMAScript Number()
        const shape = classifyNumber(comma);
        if (shape.kind === "ambiguous") expect(shape.asDecimal, comma).toBe(want);
        else expect(readNumber(comma, "comma"), comma).toEqual({ ok: true, value: want });
        expect(readNumber(point, "point"), point).toEqual({ ok: true, value: want });
      }
    }
  });

  it("classifies the forms that could be thousands separators", () => {
    expect(classifyNumber("1,250")).toEqual({ kind: "ambiguous", separator: "comma", asDecimal: 1.25, asThousands: 1250 });
    expect(classifyNumber("-1.250")).toEqual({ kind: "ambiguous", separator: "point", asDecimal: -1.25, asThousands: -1250 });
    expect(classifyNumber("0,250")).toEqual({ kind: "decimal", mark: "comma", value: 0.25 }); // no group starts with a lone 0
    expect(classifyNumber("1,2500")).toEqual({ kind: "decimal", mark: "comma", value: 1.25 });
    for (const grouped of ["1,250.5", "1.250,5", "1,250,000", "12\u00a0345,6", "1\u202f250"]) expect(classifyNumber(grouped).kind, grouped).toBe("grouped");
    for (const text of ["", "-", "1e", "1.2.3", "NaN", "Infinity", "0x10", "01.02.2024", "49S.3"]) expect(classifyNumber(text).kind, text).toBe("not-a-number");
    expect(classifyNumber("1e999").kind).toBe("too-large");
    expect(readNumber("1,250", "comma")).toEqual({ ok: true, value: 1.25 });
    expect(readNumber("1,250", "point")).toMatchObject({ ok: false, reason: expect.stringMatching(/thousands separators are not read, write 1250/) });
    expect(readNumber("445,3", "point")).toMatchObject({ ok: false, reason: expect.stringMatching(/decimal comma but the file's decimal mark is a point/) });
    expect(readNumber("445,3", null)).toEqual({ ok: true, value: 445.3, proves: "comma" });
  });
});

describe("delimiters and records", () => {
  const lines = (text: string) => text.split("\n").filter((t) => t !== "").map((t, k) => ({ line: k + 1, text: t }));

  it("prefers the delimiter that splits every line alike: tab, then semicolon, then comma", () => {
    expect(detectDialect(lines("s\tv (mm3, invented)\n100,5\t2\n")).delimiter).toBe("\t");
    expect(detectDialect(lines("Strength (MPa; invented),Result\n445.3,\n369.7,x\n")).delimiter).toBe(",");
    expect(detectDialect(lines("a;b\n445,3;1\n")).delimiter).toBe(";");
    expect(detectDialect(lines("id  s  v\n1  100.5  2\n"), { allowWhitespace: true }).delimiter).toBe("space");
    expect(detectDialect(lines("strength\n445,3\n"), { decimalMark: "comma" })).toMatchObject({ decimalMark: "comma" });
  });

  it("splits RFC 4180 records with quoted delimiters, quotes and line ends, keeping the start line", () => {
    const records = splitRecords('a;"b;c"\r\n"x\ny";"say ""hi"""\r;;\n', ";");
    expect(records.map((r) => [r.line, r.fields.map((f) => f.text)])).toEqual([
      [1, ["a", "b;c"]],
      [2, ["x\ny", 'say "hi"']],
      [4, []],
    ]);
  });
});

describe("random hostile text", () => {
  // Seeded, fixed count: texts from the characters that make CSV hard. Every reader either gives
  // finite numbers or throws its own one-line error; nothing else escapes (common practice: fuzzing).
  const ALPHABET = ["1", "2", "0", "9", ",", ".", ";", "\t", " ", '"', "\n", "\r\n", "\r", "e", "E", "-", "+", "\u00a0", "x", "#", "=", "\u00b5"];
  const texts: string[] = [];
  const rnd = seeded(2024);
  for (let k = 0; k < 400; k++) {
    let t = "";
    const n = Math.floor(rnd() * 60);
    for (let i = 0; i < n; i++) t += ALPHABET[Math.floor(rnd() * ALPHABET.length)];
    texts.push(t);
  }
  const finite = (v: unknown) => typeof v !== "number" || Number.isFinite(v);

  it("CSV sheets: values or InputError", () => {
    for (const t of texts) {
      try {
        const rows = readCsvBytes(new TextEncoder().encode(t)).rows;
        expect(rows.flat().every(finite), JSON.stringify(t)).toBe(true);
      } catch (error) {
        expect(error, JSON.stringify(t)).toBeInstanceOf(InputError);
      }
    }
  });

  it("element tables: finite results or InputError, whatever the chunking", async () => {
    for (const t of texts) {
      const bytes = new TextEncoder().encode(`s,v\n${t}`);
      try {
        const r = await readPartTable([bytes.subarray(0, 3), bytes.subarray(3)], { shape: 5, materialScale: 100 });
        expect([r.effectiveSize, r.peak, r.failureProbability, r.risk].every(finite), JSON.stringify(t)).toBe(true);
        expect(r.hotSpots.every((h) => Number.isFinite(h.share)), JSON.stringify(t)).toBe(true);
      } catch (error) {
        expect(error, JSON.stringify(t)).toBeInstanceOf(InputError);
      }
    }
  });

  it("pasted strengths and tables: values or the form's own error", () => {
    for (const t of texts) {
      for (const decimalComma of [false, true]) {
        try {
          const r = parsePasted(t, { decimalComma });
          expect(r.strengths.every(Number.isFinite), JSON.stringify(t)).toBe(true);
        } catch (error) {
          expect(error, JSON.stringify(t)).toBeInstanceOf(PasteError);
        }
        try {
          const r = parseElementTable(t, { decimalComma });
          expect([...r.stresses.flat(), ...r.sizes].every(Number.isFinite), JSON.stringify(t)).toBe(true);
        } catch (error) {
          expect(error, JSON.stringify(t)).toBeInstanceOf(TableError);
        }
      }
    }
  });
});
