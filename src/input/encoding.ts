/**
 * Which text encoding a file is in, and its text.
 *
 * Byte-order marks settle it: EF BB BF UTF-8, FF FE UTF-16 little-endian,
 * FE FF UTF-16 big-endian (Unicode Standard, sec. 23.8). Without one, text
 * that is mostly ASCII in UTF-16 has a zero byte in every other position:
 * zeros in the odd positions mean little-endian, in the even positions
 * big-endian (common practice: spreadsheet "Unicode text" exports are
 * UTF-16 LE, often without a mark when cut from a larger stream). Anything
 * else is UTF-8; bytes that are not valid UTF-8 are read as Windows-1252,
 * the usual encoding of older Western spreadsheet exports, and a note says so.
 *
 * Refused: a zip archive (an .xlsx under another name) and NUL bytes in
 * 8-bit text (a binary file).
 */
import { InputError } from "../errors";

export type TextEncodingName = "UTF-8" | "UTF-8 with BOM" | "UTF-16 LE" | "UTF-16 BE" | "Windows-1252";

export interface EncodingGuess {
  encoding: "utf-8" | "utf-16le" | "utf-16be";
  /** Bytes of byte-order mark to skip. */
  bom: number;
}

/**
 * Guesses from the first bytes of a file (a few hundred are plenty).
 * @example detectEncoding(new Uint8Array([0xff, 0xfe, 0x31, 0x00])) // { encoding: "utf-16le", bom: 2 }
 */
export function detectEncoding(prefix: Uint8Array): EncodingGuess {
  if (prefix.length >= 3 && prefix[0] === 0xef && prefix[1] === 0xbb && prefix[2] === 0xbf) return { encoding: "utf-8", bom: 3 };
  if (prefix.length >= 2 && prefix[0] === 0xff && prefix[1] === 0xfe) return { encoding: "utf-16le", bom: 2 };
  if (prefix.length >= 2 && prefix[0] === 0xfe && prefix[1] === 0xff) return { encoding: "utf-16be", bom: 2 };
  if (prefix.length >= 4 && prefix[0] === 0x50 && prefix[1] === 0x4b && prefix[2] === 0x03 && prefix[3] === 0x04) {
    throw new InputError("input", "the file is a zip archive (an .xlsx workbook?), not delimited text");
  }
  const n = Math.min(prefix.length, 1024) & ~1;
  let evenZeros = 0;
  let oddZeros = 0;
  for (let i = 0; i < n; i += 2) {
    if (prefix[i] === 0) evenZeros++;
    if (prefix[i + 1] === 0) oddZeros++;
  }
  const pairs = n / 2;
  if (pairs >= 1 && oddZeros >= 0.3 * pairs && evenZeros === 0) return { encoding: "utf-16le", bom: 0 };
  if (pairs >= 1 && evenZeros >= 0.3 * pairs && oddZeros === 0) return { encoding: "utf-16be", bom: 0 };
  return { encoding: "utf-8", bom: 0 };
}

export interface DecodedText {
  text: string;
  encoding: TextEncodingName;
}

/**
 * The text of a whole file.
 * @example decodeText(new Uint8Array([0xef, 0xbb, 0xbf, 0x61])) // { text: "a", encoding: "UTF-8 with BOM" }
 */
export function decodeText(bytes: Uint8Array): DecodedText {
  const guess = detectEncoding(bytes.subarray(0, 1024));
  if (guess.encoding !== "utf-8") {
    return { text: decodeUtf16(bytes.subarray(guess.bom), guess.encoding === "utf-16le"), encoding: guess.encoding === "utf-16le" ? "UTF-16 LE" : "UTF-16 BE" };
  }
  const body = bytes.subarray(guess.bom);
  const nul = body.indexOf(0);
  if (nul >= 0) throw new InputError("input", `the file holds a NUL byte (at byte ${nul + guess.bom}): not a text file`);
  const utf8 = decodeUtf8(body);
  if (utf8 !== null) return { text: utf8, encoding: guess.bom ? "UTF-8 with BOM" : "UTF-8" };
  return { text: decodeWindows1252(body), encoding: "Windows-1252" };
}

function decodeUtf16(bytes: Uint8Array, little: boolean): string {
  const n = bytes.length & ~1;
  const units = new Uint16Array(n / 2);
  for (let i = 0, k = 0; i < n; i += 2, k++) units[k] = little ? bytes[i] | (bytes[i + 1] << 8) : (bytes[i] << 8) | bytes[i + 1];
  let s = "";
  for (let i = 0; i < units.length; i += 8192) s += String.fromCharCode.apply(null, Array.from(units.subarray(i, i + 8192)));
  return s;
}

/**
 * Strict UTF-8 (RFC 3629): null when the bytes are not valid UTF-8.
 * @example decodeUtf8(new Uint8Array([0xc2, 0xb5])) // "µ";  decodeUtf8(new Uint8Array([0xb5])) // null
 */
export function decodeUtf8(bytes: Uint8Array): string | null {
  // Bytes below 0x80 only (most data files) read the same under every decoder: the built-in one is many times faster.
  if (isAscii(bytes)) return ASCII.decode(bytes);
  const out: number[] = [];
  let s = "";
  for (let i = 0; i < bytes.length; ) {
    const b = bytes[i];
    let cp: number;
    let need: number;
    if (b < 0x80) {
      cp = b;
      need = 0;
    } else if (b >= 0xc2 && b <= 0xdf) {
      cp = b & 0x1f;
      need = 1;
    } else if (b >= 0xe0 && b <= 0xef) {
      cp = b & 0x0f;
      need = 2;
    } else if (b >= 0xf0 && b <= 0xf4) {
      cp = b & 0x07;
      need = 3;
    } else return null;
    for (let k = 1; k <= need; k++) {
      const c = bytes[i + k];
      if (c === undefined || (c & 0xc0) !== 0x80) return null;
      cp = (cp << 6) | (c & 0x3f);
    }
    if ((need === 2 && (cp < 0x800 || (cp >= 0xd800 && cp <= 0xdfff))) || (need === 3 && (cp < 0x10000 || cp > 0x10ffff))) return null;
    if (cp >= 0x10000) {
      cp -= 0x10000;
      out.push(0xd800 + (cp >> 10), 0xdc00 + (cp & 0x3ff));
    } else out.push(cp);
    i += need + 1;
    if (out.length >= 8192) {
      s += String.fromCharCode.apply(null, out);
      out.length = 0;
    }
  }
  return s + String.fromCharCode.apply(null, out);
}

const ASCII = new TextDecoder("utf-8");

function isAscii(bytes: Uint8Array): boolean {
  for (let i = 0; i < bytes.length; i++) if (bytes[i] >= 0x80) return false;
  return true;
}

// Windows-1252 bytes 0x80..0x9F (WHATWG Encoding Standard, index windows-1252); the rest is Latin-1.
const CP1252_HIGH = [
  0x20ac, 0x81, 0x201a, 0x192, 0x201e, 0x2026, 0x2020, 0x2021, 0x2c6, 0x2030, 0x160, 0x2039, 0x152, 0x8d, 0x17d, 0x8f,
  0x90, 0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x2dc, 0x2122, 0x161, 0x203a, 0x153, 0x9d, 0x17e, 0x178,
];

function decodeWindows1252(bytes: Uint8Array): string {
  let s = "";
  const out: number[] = [];
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i];
    out.push(b >= 0x80 && b <= 0x9f ? CP1252_HIGH[b - 0x80] : b);
    if (out.length >= 8192) {
      s += String.fromCharCode.apply(null, out);
      out.length = 0;
    }
  }
  return s + String.fromCharCode.apply(null, out);
}

/**
 * UTF-16 to UTF-8, chunk by chunk, for the streaming element-table reader:
 * a code unit or a surrogate pair split across chunks is carried over.
 * @example new Utf16ToUtf8({ encoding: "utf-16le", bom: 0 }).push(new Uint8Array([0x31, 0x00])) // bytes [0x31]
 */
export class Utf16ToUtf8 {
  private readonly little: boolean;
  private oddByte = -1;
  private highSurrogate = -1;
  private skip: number;

  constructor(guess: EncodingGuess) {
    this.little = guess.encoding === "utf-16le";
    this.skip = guess.bom;
  }

  push(chunk: Uint8Array): Uint8Array {
    const out = new Uint8Array(Math.ceil((chunk.length + 1) / 2) * 3 + 4);
    let o = 0;
    let i = 0;
    while (this.skip > 0 && i < chunk.length) {
      i++;
      this.skip--;
    }
    const unit = (a: number, b: number) => (this.little ? a | (b << 8) : (a << 8) | b);
    const emit = (cp: number) => {
      if (cp < 0x80) out[o++] = cp;
      else if (cp < 0x800) {
        out[o++] = 0xc0 | (cp >> 6);
        out[o++] = 0x80 | (cp & 0x3f);
      } else if (cp < 0x10000) {
        out[o++] = 0xe0 | (cp >> 12);
        out[o++] = 0x80 | ((cp >> 6) & 0x3f);
        out[o++] = 0x80 | (cp & 0x3f);
      } else {
        out[o++] = 0xf0 | (cp >> 18);
        out[o++] = 0x80 | ((cp >> 12) & 0x3f);
        out[o++] = 0x80 | ((cp >> 6) & 0x3f);
        out[o++] = 0x80 | (cp & 0x3f);
      }
    };
    const take = (u: number) => {
      if (this.highSurrogate >= 0) {
        const high = this.highSurrogate;
        this.highSurrogate = -1;
        if (u >= 0xdc00 && u <= 0xdfff) {
          emit(0x10000 + ((high - 0xd800) << 10) + (u - 0xdc00));
          return;
        }
        emit(0xfffd);
      }
      if (u >= 0xd800 && u <= 0xdbff) this.highSurrogate = u;
      else emit(u >= 0xdc00 && u <= 0xdfff ? 0xfffd : u);
    };
    if (this.oddByte >= 0 && i < chunk.length) {
      take(unit(this.oddByte, chunk[i]));
      this.oddByte = -1;
      i++;
    }
    for (; i + 1 < chunk.length; i += 2) take(unit(chunk[i], chunk[i + 1]));
    if (i < chunk.length) this.oddByte = chunk[i];
    return out.subarray(0, o);
  }
}
