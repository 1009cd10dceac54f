/**
 * Streaming an element table of any length: bytes in, failure probability,
 * effective size and hot spots out, in one pass and bounded memory.
 *
 * The effective size is referenced to the peak stress, which is only known
 * at the end. We keep the sum referenced to the running peak and, when a
 * batch raises the peak from p to p', multiply the sum (and the hot spots'
 * terms) by (p/p')^m. Each batch of rows is parsed from the bytes into typed
 * arrays and summed by the same kernel as partRiskSum, so the streamed and
 * in-memory results agree to rounding.
 *
 * Text: the first 200 lines (or 4 MiB) are read ahead to settle the
 * encoding (UTF-8, UTF-16 LE/BE, with or without a byte-order mark), the
 * line ends (LF, CRLF or lone CR), the delimiter and the decimal mark by the
 * rules every input shares (src/input); UTF-16 is turned into UTF-8 on the
 * way in. A line may be at most MAX_LINE_BYTES long; a longer one stops the
 * read (it is not a table line, and holding it would cost unbounded memory).
 *
 * Lines: blank lines and lines of only delimiters are skipped; lines
 * starting with '#' are comments; every skipped line is in the result. Any
 * other line must have as many fields as the first line (trailing empty
 * fields excepted) and a number in every chosen column: the first that does
 * not stops the read with its line number (a silently skipped or shifted
 * element would misstate the risk). A number that could be read two ways
 * ("1,250") is refused, never guessed. Nothing non-finite reaches the
 * result: a value too large to represent stops the read, naming the element.
 */
import { ensurePositive, InputError } from "../errors";
import { contentLines, detectDelimiter, settleDecimalMark, type TextRecord } from "../input/delimited-text";
import { type EncodingGuess, Utf16ToUtf8, detectEncoding } from "../input/encoding";
import { type DecimalMark, explainNotANumber, isSpreadsheetError, looksNumeric, quoteText, readNumber } from "../input/number-text";
import { fortranReason } from "../input/fortran-fields";
import { separatorHint } from "../input/separator-hint";
import { type Criterion, NsaEvaluator } from "./criteria";
import {
  COMMA,
  CR,
  LF,
  WHITESPACE,
  QUOTE,
  decodeAscii,
  decodeField,
  fastNumber,
  fastWholeNumber,
  fieldEnd,
  nextFieldStart,
  parseNumber,
  splitFields,
} from "./csv-bytes";
import { type ColumnChoice, type ResolvedColumns, isUnit, resolveColumns, withUnitsJoined } from "./part-columns";
import { accumulate, NO_SIZE_IN_TENSION } from "./part";
import { type CompensatedTotal, ScaledPower, newTotal, totalValue } from "./power-kernel";
import { principalStresses } from "./principal";

export interface PartStreamOptions {
  /** Weibull modulus m. */
  shape: number;
  criterion?: Criterion;
  /** Material scale parameter sigma_0 (same stress unit, per size unit^(1/m)); gives the failure probability. */
  materialScale?: number;
  columns?: ColumnChoice;
  /** "auto" (default): a first line without a single numeric field is a header. */
  header?: "auto" | "yes" | "no";
  /** Field delimiter: ",", ";", "\t", "space" (runs of blanks) or "auto" (default). */
  delimiter?: string;
  /** Decimal mark: "point", "comma" or "auto" (default: settled by the numbers, see src/input). */
  decimalMark?: DecimalMark | "auto";
  /** Number of hot spots to keep (default 10). */
  top?: number;
  /** Rows per batch (default DEFAULT_BATCH_ROWS). */
  batchRows?: number;
  /**
   * Each row is an integration point (or node) whose size is its own share of the element's
   * volume or area: rows with the same element id one after another are expected, not refused.
   */
  integrationPoints?: boolean;
  /**
   * Read a later part of a table whose beginning another reader has settled
   * (see SettledTable): no read-ahead, no header; line numbers count from the
   * start of this part.
   */
  continueFrom?: SettledTable;
}

/**
 * What the beginning of a table settled: enough for a second reader to read
 * a later part of the same file alike (src/size/part-split.ts).
 */
export interface SettledTable {
  delimiter: number;
  delimiterBasis: string;
  mark: DecimalMark | null;
  markBasis: string;
  encoding: string;
  columns: ResolvedColumns;
  fieldCount: number;
  firstLineNumber: number;
}

/** A part of a table read on its own: the result, the lines it spans and its hot spots' terms (largest first). */
export interface TablePiece {
  result: PartStreamResult;
  lines: number;
  terms: number[];
}

export interface HotSpot {
  /** Element id from the id column, or null. */
  id: string | null;
  /** 1-based line number in the file. */
  line: number;
  /** Principal stresses s1 >= s2 >= s3 (one value for a one-column table). */
  principal: number[];
  size: number;
  /** Share of the part's total risk. */
  share: number;
}

/** Lines that held no element, as runs of consecutive lines with one reason. */
export interface SkippedLines {
  from: number;
  to: number;
  reason: "header" | "blank" | "comment" | "delimiter line" | "end-of-file mark" | "repeated header" | "page title" | "text after the last element";
}

export interface PartStreamResult {
  rows: number;
  skippedLines: number;
  /** Where the skipped lines are (the first MAX_SKIPPED_RUNS runs). */
  skipped: SkippedLines[];
  columns: ResolvedColumns;
  delimiter: string;
  /** The decimal mark and how it was settled; null when only whole numbers were read. */
  decimalMark: DecimalMark | null;
  decimalBasis: string;
  encoding: string;
  criterion: Criterion;
  shape: number;
  /** Largest tensile principal stress (0 if none). */
  peak: number;
  peakLine: number;
  peakId: string | null;
  /** Effective size referenced to uniaxial tension at the peak (0 if nothing is in tension). */
  effectiveSize: number;
  /** sum V_e I_e(s/sigma_0), with a material scale. */
  risk: number | null;
  failureProbability: number | null;
  hotSpots: HotSpot[];
  /** Rows are integration points or nodes with their own sizes (stated by the caller). */
  integrationPoints: boolean;
  /** Elements whose size is 0 (they add nothing: sizes printed with too few digits?). */
  zeroSizes: number;
}

interface Held {
  id: string | null;
  line: number;
  principal: number[];
  size: number;
  term: number;
}

function delimiterByte(text: string | undefined): number | null {
  if (text === undefined || text === "auto") return null;
  if (text === "space" || text === " ") return WHITESPACE;
  if (text === "tab" || text === "\\t" || text === "\t") return 0x09;
  if (text.length === 1) return text.charCodeAt(0);
  throw new InputError("input", `delimiter must be one character, "tab", "space" or "auto" (got "${text}")`);
}

/**
 * A number written with Fortran's double-precision exponent letter D ("1.005D+02", as solvers
 * written in Fortran print), rewritten with E so the shared rules read it; other text unchanged.
 * The letter has no other meaning in a number, so 1.005D+02 is 100.5 without a guess.
 */
export function withExponentE(text: string): string {
  return /^[+-]?(\d+[.,]?\d*|[.,]\d+)[dD][+-]?\d+$/.test(text) ? text.replace(/[dD]/, "E") : text;
}

/**
 * Rows per batch: small enough that the batch's arrays (six doubles a row, about 50 KB) stay in
 * the processor's second-level cache beside the read buffer while the row is parsed and summed.
 * Measured end to end on 2e6 rows (the bench's table, medians of 9 and 11 alternating
 * processes): 1024 rows took 0.66 and 0.71 s against 0.74 and 0.79 s for 16384 on two threads,
 * 0.85 against 0.87 s on one; 512 was no better than 1024.
 */
export const DEFAULT_BATCH_ROWS = 1024;

/** The longest line an element table may have (bytes, line end excluded). */
export const MAX_LINE_BYTES = 1 << 20;
/** Lines (or bytes) read ahead to settle encoding, delimiter and decimal mark. */
const SNIFF_LINES = 200;
// Bytes: enough for a few lines of the longest kind, so an overlong first comment does not leave the sample empty.
const SNIFF_BYTES = 4 * MAX_LINE_BYTES;
const MAX_SKIPPED_RUNS = 100;
/** Text lines held while waiting for a repeated header (or, before the first, for the header). */
const MAX_HELD_TEXT = 20;

function delimiterName(b: number): string {
  return b === WHITESPACE ? "space" : b === 0x09 ? "tab" : String.fromCharCode(b);
}

export class PartTableReader {
  private readonly shape: number;
  private readonly criterion: Criterion;
  private readonly materialScale: number | undefined;
  private readonly choice: ColumnChoice;
  private readonly headerMode: "auto" | "yes" | "no";
  private delimiter: number | null;
  private readonly statedMark: DecimalMark | null;
  private readonly top: number;
  private readonly batchRows: number;
  private readonly integrationPoints: boolean;
  /** A later piece of a table (options.continueFrom). */
  private readonly continuing: boolean;

  private columns: ResolvedColumns | null = null;
  /** Field position -> slot: 0..k-1 stresses, k size, k+1 id, -1 ignored. */
  private slotOf = new Int32Array(0);
  private lastField = -1;
  /** Fields on the first line: every element line must have as many. */
  private fieldCount = 0;
  private firstLineNumber = 0;
  /** The header's fields (a repeated one is a listing's page header), or null without a header. */
  private headerFields: string[] | null = null;
  /** Text lines met among the elements, held until a repeated header shows they were a page title. */
  private pageText: { line: number; text: string; problem: string }[] = [];
  /** Text lines before the header that are no header (a listing's title), held until the header comes. */
  private titleText: { line: number; text: string; problem: string }[] = [];
  /** The last element id of the previous batch (repeats are integration-point or nodal rows). */
  private lastId: string | number | null = null;
  private lastIdLine = 0;
  private lastSize = 0;
  /** Some row so far had a numeric id. */
  private sawNumericId = false;
  private zeroSizes = 0;

  /** Read-ahead until the dialect is settled. */
  private sniffed = false;
  private pending: Uint8Array[] = [];
  private pendingBytes = 0;
  private pendingLines = 0;
  private transcoder: Utf16ToUtf8 | null = null;
  private loneCr = false;
  private encoding = "UTF-8";
  private delimiterBasis = "";
  /** Line 1 is a "sep=;" delimiter line. */
  private hintLine = false;
  private mark: DecimalMark | null = null;
  private markBasis = "";
  /** The decimal-mark byte the fast path accepts: '.' or ',' once settled, -1 before. */
  private decimalByte = -1;

  /** The unfinished last line, as the chunks it came in (joined once, when its line end arrives). */
  private carryParts: Uint8Array[] = [];
  private carryLength = 0;
  private lineNumber = 0;
  private rowsRead = 0;
  private skipped = 0;
  private skippedRuns: SkippedLines[] = [];

  private raw = new Float64Array(0);
  private principal = new Float64Array(0);
  private sizes = new Float64Array(0);
  private lines = new Float64Array(0);
  /** Numeric ids (the usual case) as numbers; text ids only where an id is not a number. */
  private idNumbers = new Float64Array(0);
  private idTexts: (string | null)[] | null = null;
  private inBatch = 0;

  private peak = 0;
  private peakLine = 0;
  private peakId: string | null = null;
  private total: CompensatedTotal = newTotal();
  private power: ScaledPower | null = null;
  private readonly nsa: NsaEvaluator | null;
  private held: Held[] = [];
  /** The hot spots' terms, largest first, as finish() listed them. */
  private heldTerms: number[] = [];

  constructor(options: PartStreamOptions) {
    ensurePositive(options.shape, "modulus");
    if (options.materialScale !== undefined) ensurePositive(options.materialScale, "material scale");
    this.shape = options.shape;
    this.criterion = options.criterion ?? "PIA";
    this.materialScale = options.materialScale;
    this.choice = options.columns ?? {};
    this.headerMode = options.header ?? "auto";
    this.delimiter = delimiterByte(options.delimiter);
    this.statedMark = options.decimalMark && options.decimalMark !== "auto" ? options.decimalMark : null;
    this.top = Math.max(0, Math.floor(options.top ?? 10));
    this.batchRows = Math.max(1, Math.floor(options.batchRows ?? DEFAULT_BATCH_ROWS));
    this.integrationPoints = options.integrationPoints ?? false;
    this.nsa = this.criterion === "NSA" ? new NsaEvaluator(this.shape) : null;
    const from = options.continueFrom;
    this.continuing = from !== undefined;
    if (from) {
      this.sniffed = true;
      this.delimiter = from.delimiter;
      this.delimiterBasis = from.delimiterBasis;
      this.encoding = from.encoding;
      this.settleMark(from.mark, from.markBasis);
      this.useColumns(from.columns, from.fieldCount, from.firstLineNumber);
    }
  }

  /**
   * The settled dialect and columns once the first element line is read, or
   * null while they are not, or where a later part could not be read alone
   * (UTF-16, lone CR line ends, a decimal mark the numbers have not settled yet).
   */
  settled(): SettledTable | null {
    if (!this.sniffed || this.columns === null || this.transcoder !== null || this.loneCr) return null;
    if (this.mark === null) return null;
    return {
      delimiter: this.delimiter as number,
      delimiterBasis: this.delimiterBasis,
      mark: this.mark,
      markBasis: this.markBasis,
      encoding: this.encoding,
      columns: this.columns,
      fieldCount: this.fieldCount,
      firstLineNumber: this.firstLineNumber,
    };
  }

  /** Whether the reader still holds on to the chunks pushed (the read-ahead): a caller must not reuse them then. */
  get keepsChunks(): boolean {
    return !this.sniffed;
  }

  /** Data rows read so far (for progress). */
  get rows(): number {
    return this.rowsRead;
  }

  /** Feeds the next chunk of bytes. */
  push(bytes: Uint8Array): void {
    // Node's Buffer is a Uint8Array subclass: a plain view keeps the byte loops monomorphic.
    const chunk = bytes.constructor === Uint8Array ? bytes : new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    if (this.sniffed) {
      this.take(chunk);
      return;
    }
    this.pending.push(chunk);
    this.pendingBytes += chunk.length;
    // Counting stops at the read-ahead's line limit: a large first chunk is not scanned twice.
    let lines = this.pendingLines;
    for (let i = 0; i < chunk.length && lines < SNIFF_LINES; i++) if (chunk[i] === LF || chunk[i] === CR) lines++;
    this.pendingLines = lines;
    if (this.pendingLines >= SNIFF_LINES || this.pendingBytes >= SNIFF_BYTES) this.sniff();
  }

  /** A chunk after the read-ahead: into UTF-8 with LF line ends, then into lines. */
  private take(chunk: Uint8Array): void {
    let bytes = this.transcoder ? this.transcoder.push(chunk) : chunk;
    if (this.loneCr) {
      bytes = bytes.slice();
      for (let i = 0; i < bytes.length; i++) if (bytes[i] === CR) bytes[i] = LF;
    }
    this.feed(bytes);
  }

  /** Settles encoding, line ends, delimiter and decimal mark from the read-ahead, then reads it. */
  private sniff(): void {
    this.sniffed = true;
    const all = new Uint8Array(this.pendingBytes);
    let at = 0;
    for (const p of this.pending) {
      all.set(p, at);
      at += p.length;
    }
    this.pending = [];
    const guess: EncodingGuess = detectEncoding(all.subarray(0, 1024));
    let text: Uint8Array;
    if (guess.encoding === "utf-8") {
      text = all.subarray(guess.bom);
      this.encoding = guess.bom ? "UTF-8 with BOM" : "UTF-8";
      const nul = text.indexOf(0);
      if (nul >= 0) throw new InputError("input", `the file holds a NUL byte (at byte ${nul + guess.bom}): not a text file`);
    } else {
      this.transcoder = new Utf16ToUtf8(guess);
      this.encoding = guess.encoding === "utf-16le" ? "UTF-16 LE" : "UTF-16 BE";
      text = this.transcoder.push(all);
    }
    if (text.indexOf(LF) < 0 && text.indexOf(CR) >= 0) {
      this.loneCr = true;
      text = text.slice();
      for (let i = 0; i < text.length; i++) if (text[i] === CR) text[i] = LF;
    }
    const lastLf = text.lastIndexOf(LF);
    const sampleEnd = lastLf >= 0 ? lastLf : Math.min(text.length, SNIFF_BYTES);
    // Only the first SNIFF_LINES content lines count: decode a prefix that ends on a line end and
    // holds them (growing it while it does not), not megabytes of read-ahead.
    let sample: { line: number; text: string }[] = [];
    for (let lines = 4 * SNIFF_LINES; ; lines *= 4) {
      let end = -1;
      for (let k = 0, at = 0; k < lines; k++, at = end + 1) {
        end = text.indexOf(LF, at);
        if (end < 0 || end >= sampleEnd) break;
      }
      const prefixEnd = end < 0 || end >= sampleEnd ? sampleEnd : end;
      sample = contentLines(decodeAscii(text, 0, prefixEnd), true, SNIFF_LINES);
      if (sample.length >= SNIFF_LINES || prefixEnd === sampleEnd) break;
    }
    // A first line "sep=;" states the delimiter (spreadsheet exports write it): skipped, not a header.
    const hint = separatorHint(decodeAscii(text, 0, Math.min(text.length, 16)));
    if (hint) {
      const named = delimiterByte(hint.delimiter) as number; // one character: never "auto"
      if (this.delimiter !== null && this.delimiter !== named) {
        throw new InputError("input", `line 1 ("${hint.text}") states the delimiter "${delimiterName(named)}", but --delimiter says "${delimiterName(this.delimiter)}": remove one`);
      }
      this.delimiter = named;
      this.hintLine = true;
      this.delimiterBasis = `stated on line 1 by "${hint.text}"`;
      sample = sample.filter((l) => l.line !== 1);
    } else if (this.delimiter === null) {
      const found = detectDelimiter(sample, { allowWhitespace: true, decimalMark: this.statedMark ?? "auto" });
      this.delimiter = found.delimiter === "space" ? WHITESPACE : found.delimiter.charCodeAt(0);
      this.delimiterBasis = found.basis;
    } else this.delimiterBasis = "stated";
    const d = this.delimiter;
    const records: TextRecord[] = sample.map((l) => ({
      line: l.line,
      fields: (d === WHITESPACE ? l.text.trim().split(/[ \t]+/) : l.text.split(String.fromCharCode(d))).map((t) => ({
        text: t.trim().replace(/^"(.*)"$/, "$1").trim(),
        quoted: false,
      })),
    }));
    const basis = this.hintLine ? "stated" : this.delimiterBasis;
    const dialect = settleDecimalMark(records, { delimiter: d === COMMA ? "," : ";", basis }, { decimalMark: this.statedMark ?? "auto" });
    this.settleMark(dialect.decimalMark, dialect.basis.decimalMark);
    this.feed(text);
  }

  private settleMark(mark: DecimalMark | null, basis: string): void {
    this.mark = mark;
    this.markBasis = basis;
    this.decimalByte = mark === "point" ? 0x2e : mark === "comma" && this.delimiter !== COMMA ? COMMA : -1;
  }

  /** Splits UTF-8 bytes with LF line ends into lines; a partial last line waits for the next chunk. */
  private feed(chunk: Uint8Array): void {
    let start = 0;
    if (this.carryLength > 0) {
      const nl = chunk.indexOf(LF);
      if (nl < 0) {
        this.addCarry(chunk);
        return;
      }
      this.addCarry(chunk.subarray(0, nl));
      const line = new Uint8Array(this.carryLength);
      let at = 0;
      for (const p of this.carryParts) {
        line.set(p, at);
        at += p.length;
      }
      this.carryParts = [];
      this.carryLength = 0;
      this.line(line, 0, line.length);
      start = nl + 1;
    }
    const last = chunk.lastIndexOf(LF);
    if (last < start) {
      this.addCarry(chunk.subarray(start));
      return;
    }
    this.lines_(chunk, start, last + 1);
    if (last + 1 < chunk.length) this.addCarry(chunk.subarray(last + 1));
  }

  /** Holds part of an unfinished line (a copy: the caller may reuse its buffer). */
  private addCarry(part: Uint8Array): void {
    if (part.length === 0) return;
    this.carryLength += part.length;
    if (this.carryLength > MAX_LINE_BYTES + 1) this.tooLong(this.lineNumber + 1);
    this.carryParts.push(part.slice());
  }

  private tooLong(line: number): never {
    throw new InputError(
      "input",
      `line ${line} is longer than ${MAX_LINE_BYTES} bytes, the most an element table line may have (is this a table, with line ends?)`,
    );
  }

  /** Processes whole lines in [start, end) (end just past a LF). */
  private lines_(buf: Uint8Array, start: number, end: number): void {
    let s = start;
    while (s < end) {
      if (this.columns !== null && this.delimiter !== WHITESPACE && this.pageText.length === 0) {
        const next = this.fastRow(buf, s, end);
        if (next >= 0) {
          s = next;
          continue;
        }
      }
      let nl = buf.indexOf(LF, s);
      if (nl < 0 || nl > end) nl = end;
      this.line(buf, s, nl);
      s = nl + 1;
    }
  }

  /**
   * One row of plain numbers, parsed in a single pass with no line search:
   * returns the index after its LF, or -1 to leave the line to the general
   * path (which handles blanks, comments, quotes, text ids, odd field counts
   * and errors).
   */
  private fastRow(buf: Uint8Array, start: number, end: number): number {
    const delimiter = this.delimiter as number;
    const decimal = this.decimalByte;
    const slotOf = this.slotOf;
    const last = this.lastField;
    const k = this.columns!.stress.length;
    const row = this.inBatch;
    const raw = this.raw;
    let i = start;
    for (let field = 0; field <= last; field++) {
      const slot = slotOf[field];
      if (slot < 0) {
        // A field we do not read: skip to its delimiter (quotes go the general way).
        while (i < end) {
          const b = buf[i];
          if (b === delimiter || b === LF || b === CR) break;
          if (b === QUOTE) return -1;
          i++;
        }
      } else {
        if (slot < k) {
          i = fastNumber(buf, i, end, delimiter, decimal, raw, row * k + slot);
          if (i < 0) return -1;
        } else if (slot === k) {
          i = fastNumber(buf, i, end, delimiter, decimal, this.sizes, row);
          if (i < 0 || !(this.sizes[row] >= 0)) return -1;
        } else {
          const next = fastWholeNumber(buf, i, end, delimiter, this.idNumbers, row);
          i = next >= 0 ? next : fastNumber(buf, i, end, delimiter, decimal, this.idNumbers, row);
          if (i < 0 || !Number.isSafeInteger(this.idNumbers[row])) return -1;
          if (this.idTexts) this.idTexts[row] = null;
        }
      }
      if (field < last) {
        if (i >= end || buf[i] !== delimiter) return -1;
        i++;
      }
    }
    // The rest of the line: count its fields (a row wider or narrower than the first goes the general way).
    let fields = last + 1;
    let nl = i;
    while (nl < end) {
      const b = buf[nl];
      if (b === LF) break;
      if (b === delimiter) fields++;
      else if (b === QUOTE) return -1;
      nl++;
    }
    if (nl >= end || fields !== this.fieldCount || nl - start > MAX_LINE_BYTES) return -1;
    this.lineNumber++;
    this.lines[row] = this.lineNumber;
    this.rowsRead++;
    this.inBatch++;
    if (this.inBatch === this.batchRows) this.flush();
    return nl + 1;
  }

  /** One line without its LF. */
  private line(buf: Uint8Array, start: number, endWithCr: number): void {
    this.lineNumber++;
    if (endWithCr - start > MAX_LINE_BYTES + 1) this.tooLong(this.lineNumber);
    const end = endWithCr > start && buf[endWithCr - 1] === CR ? endWithCr - 1 : endWithCr;
    if (this.columns === null) {
      this.firstLine(buf, start, end);
      return;
    }
    this.dataLine(buf, start, end);
  }

  private skip(reason: SkippedLines["reason"], line = this.lineNumber): void {
    this.skipped++;
    const runs = this.skippedRuns;
    const lastRun = runs[runs.length - 1];
    if (lastRun && lastRun.reason === reason && lastRun.to === line - 1) lastRun.to = line;
    else if (runs.length < MAX_SKIPPED_RUNS) runs.push({ from: line, to: line, reason });
  }

  /**
   * A line starting with a spreadsheet error value ("#DIV/0!,2.5", a sheet exported with an error in a
   * stress cell) is an element whose value is missing, not a '#' comment: skipping it would drop the element.
   */
  private refuseErrorValue(buf: Uint8Array, i: number, end: number): void {
    const text = decodeField(buf, i, Math.min(end, i + 24)).split(/[\s,;"]/)[0];
    if (isSpreadsheetError(text)) {
      throw new InputError("input", `line ${this.lineNumber}: ${quoteText(text)} ${explainNotANumber(text)} (a line that begins with a spreadsheet error value is no comment)`);
    }
  }

  private isBlank(buf: Uint8Array, start: number, end: number): boolean {
    const d = this.delimiter;
    for (let i = start; i < end; i++) {
      const b = buf[i];
      if (b !== 0x20 && b !== 0x09 && b !== d && b !== 0x22) return false;
    }
    return true;
  }

  private firstLine(buf: Uint8Array, start: number, end: number): void {
    if (this.hintLine && this.lineNumber === 1) {
      this.skip("delimiter line");
      return;
    }
    let i = start;
    while (i < end && (buf[i] === 0x20 || buf[i] === 0x09)) i++;
    if (i < end && buf[i] === 0x23) {
      this.refuseErrorValue(buf, i, end);
      this.skip("comment");
      return;
    }
    if (i >= end || this.isBlank(buf, start, end)) {
      this.skip("blank");
      return;
    }
    const delimiter = this.delimiter as number;
    const split = splitFields(buf, start, end, delimiter);
    // A data line has numbers in its stress and size fields; a header has none (ids may be text).
    const anyNumber = split.some((f) => f !== "" && looksNumeric(withExponentE(f)));
    const isHeader = this.headerMode === "yes" || (this.headerMode === "auto" && !anyNumber);
    const fields = isHeader && delimiter === WHITESPACE ? withUnitsJoined(split) : split;
    // Words and numbers ("LOAD STEP 1 TIME 1.0"): no element (an element has one word at most, its id), a listing's title if a header follows.
    const words = isHeader ? 0 : split.filter((f) => f !== "" && !looksNumeric(withExponentE(f))).length;
    if (this.headerMode === "auto" && words >= 2 && this.choice.stress === undefined && this.titleText.length < MAX_HELD_TEXT) {
      const text = split.join(" ");
      this.titleText.push({
        line: this.lineNumber,
        text,
        problem: `line ${this.lineNumber} ("${text.length > 60 ? `${text.slice(0, 57)}...` : text}") holds words and numbers: no element, and no header line follows it (a listing's title?)`,
      });
      return;
    }
    if (!isHeader && this.titleText.length > 0) throw new InputError("input", this.titleText[0].problem);
    let columns: ResolvedColumns;
    try {
      columns = resolveColumns(isHeader ? fields : null, fields.length, this.choice, this.integrationPoints);
    } catch (error) {
      // A line of words that names no columns: a listing's title, if a header follows.
      const noColumns = error instanceof InputError && /^no (stress|size) column/.test(error.message);
      if (noColumns && this.headerMode === "auto" && isHeader && this.titleText.length < MAX_HELD_TEXT) {
        this.titleText.push({ line: this.lineNumber, text: fields.join(" "), problem: (error as InputError).message });
        return;
      }
      throw error;
    }
    for (const t of this.titleText) this.skip("page title", t.line);
    this.titleText = [];
    this.useColumns(columns, fields.length, this.lineNumber);
    if (isHeader) {
      this.headerFields = fields;
      this.skip("header");
    } else this.dataLine(buf, start, end);
  }

  /** Column positions, field count and the batch buffers. */
  private useColumns(columns: ResolvedColumns, fieldCount: number, firstLineNumber: number): void {
    this.columns = columns;
    this.fieldCount = fieldCount;
    this.firstLineNumber = firstLineNumber;
    const k = this.columns.stress.length;
    this.lastField = Math.max(...this.columns.stress, this.columns.size, this.columns.id);
    this.slotOf = new Int32Array(this.lastField + 1).fill(-1);
    this.columns.stress.forEach((f, slot) => {
      if (f >= 0) this.slotOf[f] = slot;
    });
    this.slotOf[this.columns.size] = k;
    if (this.columns.id >= 0) this.slotOf[this.columns.id] = k + 1;
    const n = this.batchRows;
    this.raw = new Float64Array(n * k);
    this.principal = this.columns.kind === 6 ? new Float64Array(n * 3) : this.raw;
    this.sizes = new Float64Array(n);
    this.lines = new Float64Array(n);
    this.idNumbers = new Float64Array(this.columns.id >= 0 ? n : 0);
  }

  /** A stress or size field: bytes straight to a number, or the shared text rules where a mark is involved. */
  private numberField(buf: Uint8Array, i: number, e: number, what: string, field: number): number {
    let points = false;
    let commas = false;
    for (let k = i; k < e; k++) {
      const b = buf[k];
      if (b === 0x2e) points = true;
      else if (b === COMMA) commas = true;
    }
    // Bytes straight to a number where only the settled mark (or none) occurs; anything else goes
    // through the shared text rules, which settle or refuse ("1,250" before any mark is known).
    const direct = !commas && (!points || this.mark === "point") ? -1 : !points && this.mark === "comma" ? COMMA : -2;
    if (direct !== -2) {
      const v = parseNumber(buf, i, e, direct);
      if (v === v) return v === 0 ? 0 : v;
    }
    const text = decodeField(buf, i, e).trim().replace(/^"(.*)"$/, "$1").trim();
    const r = readNumber(withExponentE(text), this.mark);
    if (r.ok) {
      if (r.proves) this.settleMark(r.proves, `detected: "${text}" on line ${this.lineNumber}`);
      return r.value;
    }
    const why = r.reason === "is not a number" ? (fortranReason(text) ?? explainNotANumber(text)) : null;
    throw new InputError("input", `line ${this.lineNumber}: the ${what} field ${field + 1} (${quoteText(text)}) ${why ?? r.reason}`);
  }

  /**
   * A line after the first: an element, or (in a table with a header) a listing's page header
   * (title lines, then the header again: skipped and listed), or text among the elements, which
   * stops the read once an element follows it (a summary's values are no elements).
   */
  private dataLine(buf: Uint8Array, start: number, end: number): void {
    if (this.headerFields === null) {
      this.row(buf, start, end);
      return;
    }
    let read: boolean;
    try {
      read = this.row(buf, start, end);
    } catch (error) {
      if (error instanceof InputError && this.heldAsText(buf, start, end, error)) return;
      throw error;
    }
    if (read && this.pageText.length > 0) this.textAmongElements();
  }

  /** A line that is no element: a repeated header (skipped with the text lines before it) or text, held; false for neither. */
  private heldAsText(buf: Uint8Array, start: number, end: number, error: InputError): boolean {
    const split = splitFields(buf, start, end, this.delimiter as number);
    const fields = this.delimiter === WHITESPACE ? withUnitsJoined(split) : split;
    const header = this.headerFields as string[];
    if (fields.length >= header.length && fields.every((f, k) => (k < header.length ? f === header[k] : f === ""))) {
      for (const t of this.pageText) this.skip("page title", t.line);
      this.pageText = [];
      this.skip("repeated header");
      return true;
    }
    const first = fields.find((f) => f !== "") ?? "";
    // A number, or a spreadsheet's error value where a number was ("#DIV/0!"): a bad element, refused as it is.
    if (looksNumeric(withExponentE(first)) || isSpreadsheetError(first) || this.pageText.length >= MAX_HELD_TEXT) return false;
    this.pageText.push({ line: this.lineNumber, text: fields.join(" "), problem: error.message });
    return true;
  }

  /** An element after text lines that no repeated header explained. */
  private textAmongElements(): never {
    const t = this.pageText[0];
    const text = t.text.length > 60 ? `${t.text.slice(0, 57)}...` : t.text;
    throw new InputError(
      "input",
      `line ${t.line} ("${text}") is no element, and rows follow it (line ${this.lineNumber}): a summary (maximum, minimum, total) ` +
        `or a page title of a listing? Rows after such a line may be summary values, not elements, so the read stops ` +
        `(line ${t.line} as an element: ${t.problem.replace(/^line \d+: /, "")}). Delete these lines or export the table alone; ` +
        `a line repeating the header, with the title lines just before it, is skipped`,
    );
  }

  /** Reads one line into the batch; false when it holds no element (blank, comment, end-of-file mark). */
  private row(buf: Uint8Array, start: number, end: number): boolean {
    const delimiter = this.delimiter as number;
    const slotOf = this.slotOf;
    const last = this.lastField;
    const k = this.columns!.stress.length;
    const row = this.inBatch;
    const raw = this.raw;
    let field = 0;
    let i = delimiter === WHITESPACE ? nextFieldStart(buf, start, end, WHITESPACE) : start;
    // Blank lines, lines of bare delimiters and '#' comments are not elements.
    if (i < end && buf[i] === 0x23) {
      this.refuseErrorValue(buf, i, end);
      this.skip("comment");
      return false;
    }
    if (this.isBlank(buf, start, end)) {
      this.skip("blank");
      return false;
    }
    // A lone Ctrl-Z: the end-of-file mark older DOS and Windows programs write after the last line.
    if (end === start + 1 && buf[start] === 0x1a) {
      this.skip("end-of-file mark");
      return false;
    }
    let extra = false;
    for (;;) {
      const e = fieldEnd(buf, i, end, delimiter);
      const slot = field <= last ? slotOf[field] : -1;
      if (slot >= 0) {
        if (slot === k + 1) {
          const v = parseNumber(buf, i, e, -1);
          if (Number.isSafeInteger(v)) {
            this.idNumbers[row] = v;
            if (this.idTexts) this.idTexts[row] = null;
          } else {
            const text = decodeField(buf, i, e).trim().replace(/^"|"$/g, "");
            // A word where the ids were numbers: MAX, MIN, TOTAL, VALUE... a listing's summary line.
            // A later piece of a table cannot tell (its first row may follow numeric ids): one reader reads the file again.
            if (/^[A-Za-z]+$/.test(text) && (this.continuing || this.sawNumericId || (row > 0 && !(this.idTexts?.[row - 1] ?? null)))) {
              throw new InputError("input", `line ${this.lineNumber}: the id field ${field + 1} ("${text}") is a word where the ids before it were numbers (a summary line of a listing: maximum, minimum, total?)`);
            }
            this.idTexts ??= new Array<string | null>(this.batchRows).fill(null);
            this.idTexts[row] = text;
          }
        } else {
          const v = this.numberField(buf, i, e, slot === k ? "size" : "stress", field);
          if (slot === k) this.sizes[row] = v;
          else raw[row * k + slot] = v;
        }
      } else if (field >= this.fieldCount && !this.isBlank(buf, i, e)) extra = true;
      field++;
      if (e >= end) break;
      i = nextFieldStart(buf, e, end, delimiter);
      if (delimiter === WHITESPACE && i >= end) break;
    }
    if (field < this.fieldCount) {
      throw new InputError(
        "input",
        `line ${this.lineNumber}: expected at least ${this.fieldCount} fields as on line ${this.firstLineNumber}, found ${field}` +
          touchingHint(splitFields(buf, start, end, delimiter)) +
          this.unitFieldHint(),
      );
    }
    if (extra) {
      throw new InputError(
        "input",
        `line ${this.lineNumber}: found ${field} fields, more than the ${this.fieldCount} on line ${this.firstLineNumber} ` +
          `(a shifted column, or decimal commas in a comma-delimited file?)`,
      );
    }
    const size = this.sizes[row];
    if (!(size >= 0)) throw new InputError("input", `line ${this.lineNumber}: the element size must be >= 0 (got ${size})`);
    this.lines[row] = this.lineNumber;
    this.rowsRead++;
    this.inBatch++;
    if (this.inBatch === this.batchRows) this.flush();
    return true;
  }

  /** A note for a row narrower than the header: a header field that is only a unit ("EVOL, m^3" split at its comma) explains it. */
  private unitFieldHint(): string {
    const header = this.headerFields;
    const k = header === null ? -1 : header.findIndex((f) => isUnit(f));
    if (k < 0) return "";
    return ` (header field ${k + 1} is the unit "${header![k]}" alone: a header name with a unit after a comma, such as "${header![k - 1] ?? ""}, ${header![k]}", splits into two fields in a comma-delimited file; write the unit in brackets, "${header![k - 1] ?? ""} [${header![k]}]")`;
  }

  /** "element 7 (line 9)" or "line 9". */
  private elementName(row: number): string {
    const id = this.idOf(row);
    return id !== null ? `element ${id} (line ${this.lines[row]})` : `the element on line ${this.lines[row]}`;
  }

  /** Sums the rows in the batch buffers. */
  private flush(): void {
    const n = this.inBatch;
    if (n === 0) return;
    if (this.columns!.id >= 0) this.checkIds(n);
    const sizes = this.sizes;
    let zeros = 0;
    for (let r = 0; r < n; r++) if (sizes[r] === 0) zeros++;
    this.zeroSizes += zeros;
    const kind = this.columns!.kind;
    if (kind === 6) {
      const raw = this.raw;
      const out = this.principal;
      for (let r = 0; r < n; r++) {
        const b = r * 6;
        principalStresses(raw[b], raw[b + 1], raw[b + 2], raw[b + 3], raw[b + 4], raw[b + 5], out, r * 3);
        if (out[r * 3] - out[r * 3] !== 0 || out[r * 3 + 1] - out[r * 3 + 1] !== 0 || out[r * 3 + 2] - out[r * 3 + 2] !== 0) {
          throw new InputError("notRepresentable", `${this.elementName(r)}: its principal stresses are too large to represent; give the stresses in a larger unit`);
        }
      }
    }
    const stride = kind === 1 ? 1 : 3;
    const p = this.principal;
    let batchPeak = 0;
    let at = -1;
    for (let i = 0; i < n * stride; i++) {
      if (p[i] > batchPeak) {
        batchPeak = p[i];
        at = i;
      }
    }
    if (batchPeak > this.peak) {
      const row = Math.floor(at / stride);
      this.raise(batchPeak);
      this.peakLine = this.lines[row];
      this.peakId = this.idOf(row);
    }
    if (this.peak > 0) {
      const visit = this.top > 0 ? (row: number, term: number) => this.hold(row, term, stride) : null;
      accumulate(p, stride, this.sizes, 0, n, this.shape, this.criterion, this.peak, this.total, this.power!, this.nsa, visit, () =>
        this.held.length < this.top ? 0 : this.held[0].term,
      );
      if (!Number.isFinite(this.total.sum + this.total.compensation)) this.sumOverflow(n);
    }
    this.inBatch = 0;
  }

  /**
   * Rows one after another with the same element id are the rows of integration-point or nodal
   * output: refused unless the caller stated that each row's size is its own share (a size
   * repeated on every row would count the element once per row).
   */
  private checkIds(n: number): void {
    const numbers = this.idNumbers;
    const texts = this.idTexts;
    let previous = this.lastId;
    for (let r = 0; r < n; r++) {
      const id = texts !== null && texts[r] !== null ? (texts[r] as string) : numbers[r];
      if (id === previous && !this.integrationPoints) this.repeatedId(r, n);
      if (typeof id === "number") this.sawNumericId = true;
      previous = id;
    }
    this.lastId = previous;
    this.lastIdLine = this.lines[n - 1];
    this.lastSize = this.sizes[n - 1];
  }

  private repeatedId(r: number, n: number): never {
    const id = this.idOf(r) as string;
    const before = r > 0 ? this.lines[r - 1] : this.lastIdLine;
    const sizeBefore = r > 0 ? this.sizes[r - 1] : this.lastSize;
    let count = 2;
    for (let k = r + 1; k < n && this.idOf(k) === id; k++) count++;
    const size = this.sizes[r];
    const label = this.columns!.labels.size;
    const sizes =
      size === sizeBefore
        ? `The size column (${label}) holds ${size} on both rows: if that is the element's volume or area, the sum would count it once per row ` +
          `(${count} rows here, ${count} times)`
        : `The size column (${label}) holds ${sizeBefore} and ${size}`;
    throw new InputError(
      "input",
      `element ${id} is on line ${before} and again on line ${this.lines[r]}: several rows per element, as integration-point or nodal output writes them? ` +
        `${sizes}. Export one row per element (element-averaged or centroid stresses) with the element volume or area; ` +
        `if each row's size is that point's own share of the element, state --integration-points`,
    );
  }

  /** The running sum left double precision: name the largest element of the batch that overflowed it. */
  private sumOverflow(n: number): never {
    let largest = 0;
    for (let r = 1; r < n; r++) if (this.sizes[r] > this.sizes[largest]) largest = r;
    throw new InputError(
      "notRepresentable",
      `${this.elementName(largest)}: with its size ${this.sizes[largest]} the effective size is too large to represent; give the sizes in a larger unit`,
    );
  }

  private idOf(row: number): string | null {
    if (this.columns!.id < 0) return null;
    return this.idTexts?.[row] ?? String(this.idNumbers[row]);
  }

  /** A new peak: rescale the running sum and the hot spots. */
  private raise(peak: number): void {
    if (this.peak > 0) {
      const factor = Math.pow(this.peak / peak, this.shape);
      this.total.sum *= factor;
      this.total.compensation *= factor;
      for (const h of this.held) h.term *= factor;
    }
    this.peak = peak;
    this.power = new ScaledPower(this.shape, peak);
  }

  /** Keeps the `top` largest terms in a min-heap (held[0] is the smallest). */
  private hold(row: number, term: number, stride: number): void {
    const p = this.principal;
    const entry: Held = {
      id: this.idOf(row),
      line: this.lines[row],
      principal: Array.from(p.subarray(row * stride, row * stride + stride)).sort((a, b) => b - a),
      size: this.sizes[row],
      term,
    };
    const heap = this.held;
    if (heap.length < this.top) {
      heap.push(entry);
      let i = heap.length - 1;
      while (i > 0) {
        const parent = (i - 1) >> 1;
        if (heap[parent].term <= heap[i].term) break;
        [heap[parent], heap[i]] = [heap[i], heap[parent]];
        i = parent;
      }
      return;
    }
    if (term <= heap[0].term) return;
    heap[0] = entry;
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let smallest = i;
      if (l < heap.length && heap[l].term < heap[smallest].term) smallest = l;
      if (r < heap.length && heap[r].term < heap[smallest].term) smallest = r;
      if (smallest === i) break;
      [heap[smallest], heap[i]] = [heap[i], heap[smallest]];
      i = smallest;
    }
  }

  /** Ends the stream as finish() does, with what joining it to other parts needs (src/size/part-split.ts). */
  finishPiece(): TablePiece {
    // Text held at a piece's end may be followed by elements in the next piece: one reader reads the file again.
    if (this.pageText.length > 0) this.textAmongElements();
    // A later piece may hold no element (a long run of comment lines); the first one may not.
    const result = this.finish(this.continuing);
    return { result, lines: this.lineNumber, terms: this.heldTerms };
  }

  /** Ends the stream (a last line without LF counts) and returns the result. */
  finish(allowNoElement = false): PartStreamResult {
    if (!this.sniffed) this.sniff();
    if (this.carryLength > 0) this.feed(new Uint8Array([LF]));
    if (this.columns === null && this.titleText.length > 0) throw new InputError("input", this.titleText[0].problem);
    if (this.columns === null) throw new InputError("input", "the table is empty: no line holds an element");
    // Text after the last element (a listing's footer or summary) holds no element: skipped and listed.
    for (const t of this.pageText) this.skip("text after the last element", t.line);
    this.pageText = [];
    if (this.rowsRead === 0 && !allowNoElement) {
      throw new InputError("input", `the table is empty: ${this.lineNumber} line${this.lineNumber === 1 ? "" : "s"} read (header, blank or comment), no element`);
    }
    this.flush();
    const effectiveSize = this.peak > 0 ? totalValue(this.total) : 0;
    const { risk, failureProbability } = riskOfPart(effectiveSize, this.peak, this.peakLine, this.peakId, this.shape, this.materialScale);
    const held = [...this.held].sort((a, b) => b.term - a.term);
    this.heldTerms = held.map((h) => h.term);
    const hotSpots = held.map((h) => ({ id: h.id, line: h.line, principal: h.principal, size: h.size, share: effectiveSize > 0 ? h.term / effectiveSize : 0 }));
    return {
      rows: this.rowsRead,
      skippedLines: this.skipped,
      skipped: this.skippedRuns,
      columns: this.columns,
      delimiter: delimiterName(this.delimiter as number),
      decimalMark: this.mark,
      decimalBasis: this.markBasis,
      encoding: this.encoding,
      criterion: this.criterion,
      shape: this.shape,
      peak: this.peak,
      peakLine: this.peakLine,
      peakId: this.peakId,
      effectiveSize,
      risk,
      failureProbability,
      hotSpots,
      integrationPoints: this.integrationPoints,
      zeroSizes: this.zeroSizes,
    };
  }
}

/** A note for a row with too few fields: a field holding two touching numbers explains it. */
function touchingHint(fields: string[]): string {
  for (const f of fields) {
    const reason = /\d[+-][\d.]/.test(f) ? fortranReason(f) : null;
    if (reason !== null) return ` ("${f}" ${reason})`;
  }
  return "";
}

/**
 * The risk of rupture S_E (peak / sigma_0)^m and the failure probability
 * -expm1(-risk), or nulls without a material scale; a risk too large to
 * represent is an error naming the peak element.
 */
export function riskOfPart(
  effectiveSize: number,
  peak: number,
  peakLine: number,
  peakId: string | null,
  shape: number,
  materialScale: number | undefined,
): { risk: number | null; failureProbability: number | null } {
  if (peak > 0 && !(effectiveSize > 0)) {
    throw new InputError("input", NO_SIZE_IN_TENSION);
  }
  if (materialScale === undefined) return { risk: null, failureProbability: null };
  const risk = peak > 0 && effectiveSize > 0 ? Math.exp(Math.log(effectiveSize) + shape * Math.log(peak / materialScale)) : 0;
  if (!Number.isFinite(risk)) {
    const where = peakId !== null ? `element ${peakId} (line ${peakLine})` : `the element on line ${peakLine}`;
    throw new InputError(
      "notRepresentable",
      `${where}: the risk of rupture is too large to represent (peak stress ${peak} against material scale ${materialScale}, ` +
        `modulus ${shape}): failure is certain to double precision; check the stress unit and the material scale`,
    );
  }
  return { risk, failureProbability: -Math.expm1(-risk) };
}

/**
 * Reads a whole table from chunks of bytes (a file stream, or arrays in a
 * benchmark). `onProgress` is called after each chunk with the rows so far.
 */
export async function readPartTable(
  chunks: AsyncIterable<Uint8Array> | Iterable<Uint8Array>,
  options: PartStreamOptions,
  onProgress?: (rows: number, bytes: number) => void,
): Promise<PartStreamResult> {
  const reader = new PartTableReader(options);
  let bytes = 0;
  for await (const chunk of chunks as AsyncIterable<Uint8Array>) {
    reader.push(chunk);
    bytes += chunk.length;
    onProgress?.(reader.rows, bytes);
  }
  return reader.finish();
}
