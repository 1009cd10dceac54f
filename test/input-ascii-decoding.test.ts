// decodeUtf8's shortcut for bytes below 0x80 (src/input/encoding.ts). Reference: US-ASCII (ANSI X3.4, and
// RFC 3629 section 3: bytes 0x00-0x7F are the code points U+0000-U+007F, one byte each), written out with
// String.fromCharCode (ECMA-262) per byte; and one 0x80 byte anywhere leaves the shortcut for the strict decoder.
import { describe, expect, it } from "vitest";
import { decodeText, decodeUtf8 } from "../src/input/encoding";

const ascii = (bytes: number[]) => bytes.map((b) => String.fromCharCode(b)).join("");

describe("ASCII bytes", () => {
  it("decode to the same code points, every byte value 0x00-0x7F", () => {
    const all = Array.from({ length: 0x80 }, (_, b) => b);
    expect(decodeUtf8(new Uint8Array(all))).toBe(ascii(all));
  });

  it("a long CSV-like text decodes to itself", () => {
    const text = Array.from({ length: 5000 }, (_, r) => `${r},${(r * 0.37).toFixed(4)},"x, y",=BRITTLE.MODULUS(A${r + 1}:B${r + 1})`).join("\r\n");
    const bytes = new Uint8Array([...text].map((c) => c.charCodeAt(0)));
    expect(decodeUtf8(bytes)).toBe(text);
    expect(decodeText(bytes)).toEqual({ text, encoding: "UTF-8" });
  });

  it("one byte at or above 0x80 goes to the strict decoder: a lone continuation byte is not UTF-8", () => {
    expect(decodeUtf8(new Uint8Array([0x41, 0x80, 0x42]))).toBeNull();
    // U+00B5 MICRO SIGN is C2 B5 in UTF-8 (RFC 3629 section 3 encoding of a two-byte code point).
    expect(decodeUtf8(new Uint8Array([0x41, 0xc2, 0xb5]))).toBe("A\u00b5");
  });
});
