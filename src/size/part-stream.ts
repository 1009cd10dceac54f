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
 * Lines: LF or CRLF; blank lines and lines of only delimiters are skipped;
 * lines starting with '#' are comments. Any other line must have a number in
 * every chosen column: the first that does not stops the read with its line
 * number (a silently skipped element would understate the risk).
 */
import { ensurePositive, InputError } from "../errors";
import { type Criterion, NsaEvaluator } from "./criteria";
import {
  COMMA,
  CR,
  LF,
  WHITESPACE,
  QUOTE,
  decodeAscii,
  detectDelimiter,
  fastNumber,
  fastStop,
  fieldEnd,
  nextFieldStart,
  parseNumber,
  splitFields,
} from "./csv-bytes";
import { type ColumnChoice, type ResolvedColumns, resolveColumns } from "./part-columns";
import { accumulate } from "./part";
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
  /** Number of hot spots to keep (default 10). */
  top?: number;
  /** Rows per batch (default 16384). */
  batchRows?: number;
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

export interface PartStreamResult {
  rows: number;
  skippedLines: number;
  columns: ResolvedColumns;
  delimiter: string;
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
  private readonly top: number;
  private readonly batchRows: number;

  private columns: ResolvedColumns | null = null;
  /** Field position -> slot: 0..k-1 stresses, k size, k+1 id, -1 ignored. */
  private slotOf = new Int32Array(0);
  private lastField = -1;
  private altDecimal = -1;

  private carry = new Uint8Array(0);
  private lineNumber = 0;
  private rowsRead = 0;
  private skipped = 0;

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

  constructor(options: PartStreamOptions) {
    ensurePositive(options.shape, "modulus");
    if (options.materialScale !== undefined) ensurePositive(options.materialScale, "material scale");
    this.shape = options.shape;
    this.criterion = options.criterion ?? "PIA";
    this.materialScale = options.materialScale;
    this.choice = options.columns ?? {};
    this.headerMode = options.header ?? "auto";
    this.delimiter = delimiterByte(options.delimiter);
    this.top = Math.max(0, Math.floor(options.top ?? 10));
    this.batchRows = Math.max(1, Math.floor(options.batchRows ?? 16384));
    this.nsa = this.criterion === "NSA" ? new NsaEvaluator(this.shape) : null;
  }

  /** Data rows read so far (for progress). */
  get rows(): number {
    return this.rowsRead;
  }

  /** Feeds the next chunk of bytes. */
  push(bytes: Uint8Array): void {
    // Node's Buffer is a Uint8Array subclass: a plain view keeps the byte loops monomorphic.
    const chunk = bytes.constructor === Uint8Array ? bytes : new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    let start = 0;
    if (this.carry.length > 0) {
      const nl = chunk.indexOf(LF);
      if (nl < 0) {
        const joined = new Uint8Array(this.carry.length + chunk.length);
        joined.set(this.carry);
        joined.set(chunk, this.carry.length);
        this.carry = joined;
        return;
      }
      const line = new Uint8Array(this.carry.length + nl);
      line.set(this.carry);
      line.set(chunk.subarray(0, nl), this.carry.length);
      this.carry = new Uint8Array(0);
      this.line(line, 0, line.length);
      start = nl + 1;
    }
    const last = chunk.lastIndexOf(LF);
    if (last < start) {
      this.carry = chunk.slice(start);
      return;
    }
    this.lines_(chunk, start, last + 1);
    if (last + 1 < chunk.length) this.carry = chunk.slice(last + 1);
  }

  /** Processes whole lines in [start, end) (end just past a LF). */
  private lines_(buf: Uint8Array, start: number, end: number): void {
    let s = start;
    while (s < end) {
      if (this.columns !== null && this.delimiter !== WHITESPACE) {
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
   * path (which handles blanks, comments, quotes, text ids and errors).
   */
  private fastRow(buf: Uint8Array, start: number, end: number): number {
    const delimiter = this.delimiter as number;
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
        const v = fastNumber(buf, i, end, delimiter);
        if (v !== v) return -1;
        i = fastStop;
        if (slot < k) raw[row * k + slot] = v;
        else if (slot === k) {
          if (!(v >= 0)) return -1;
          this.sizes[row] = v;
        } else {
          if (!Number.isSafeInteger(v)) return -1;
          this.idNumbers[row] = v;
          if (this.idTexts) this.idTexts[row] = null;
        }
      }
      if (field < last) {
        if (i >= end || buf[i] !== delimiter) return -1;
        i++;
      }
    }
    let nl = i;
    while (nl < end && buf[nl] !== LF) nl++;
    if (nl >= end) return -1;
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
    const end = endWithCr > start && buf[endWithCr - 1] === CR ? endWithCr - 1 : endWithCr;
    if (this.columns === null) {
      this.firstLine(buf, start, end);
      return;
    }
    this.dataLine(buf, start, end);
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
    // A UTF-8 byte-order mark is not part of the first name.
    if (this.lineNumber === 1 && end - start >= 3 && buf[start] === 0xef && buf[start + 1] === 0xbb && buf[start + 2] === 0xbf) {
      start += 3;
    }
    let i = start;
    while (i < end && (buf[i] === 0x20 || buf[i] === 0x09)) i++;
    if (i >= end || buf[i] === 0x23) {
      this.skipped++;
      return;
    }
    if (this.delimiter === null) this.delimiter = detectDelimiter(buf, start, end);
    if (this.isBlank(buf, start, end)) {
      this.skipped++;
      return;
    }
    this.altDecimal = this.delimiter === COMMA ? -1 : COMMA;
    const fields = splitFields(buf, start, end, this.delimiter);
    // A data line has numbers in its stress and size fields; a header has none (ids may be text).
    const anyNumber = fields.some((f) => f !== "" && Number.isFinite(Number(f.replace(",", "."))));
    const isHeader = this.headerMode === "yes" || (this.headerMode === "auto" && !anyNumber);
    this.columns = resolveColumns(isHeader ? fields : null, fields.length, this.choice);
    const k = this.columns.stress.length;
    this.lastField = Math.max(...this.columns.stress, this.columns.size, this.columns.id);
    this.slotOf = new Int32Array(this.lastField + 1).fill(-1);
    this.columns.stress.forEach((f, slot) => (this.slotOf[f] = slot));
    this.slotOf[this.columns.size] = k;
    if (this.columns.id >= 0) this.slotOf[this.columns.id] = k + 1;
    const n = this.batchRows;
    this.raw = new Float64Array(n * k);
    this.principal = this.columns.kind === 6 ? new Float64Array(n * 3) : this.raw;
    this.sizes = new Float64Array(n);
    this.lines = new Float64Array(n);
    this.idNumbers = new Float64Array(this.columns.id >= 0 ? n : 0);
    if (isHeader) this.skipped++;
    else this.dataLine(buf, start, end);
  }

  private dataLine(buf: Uint8Array, start: number, end: number): void {
    const delimiter = this.delimiter as number;
    const slotOf = this.slotOf;
    const last = this.lastField;
    const k = this.columns!.stress.length;
    const row = this.inBatch;
    const raw = this.raw;
    let field = 0;
    let i = delimiter === WHITESPACE ? nextFieldStart(buf, start, end, WHITESPACE) : start;
    // Blank lines, lines of bare delimiters and '#' comments are not elements.
    if ((i < end && buf[i] === 0x23) || this.isBlank(buf, start, end)) {
      this.skipped++;
      return;
    }
    while (field <= last) {
      const e = fieldEnd(buf, i, end, delimiter);
      const slot = slotOf[field];
      if (slot >= 0) {
        if (slot === k + 1) {
          const v = parseNumber(buf, i, e, -1);
          if (Number.isSafeInteger(v)) {
            this.idNumbers[row] = v;
            if (this.idTexts) this.idTexts[row] = null;
          } else {
            this.idTexts ??= new Array<string | null>(this.batchRows).fill(null);
            this.idTexts[row] = decodeAscii(buf, i, e).trim().replace(/^"|"$/g, "");
          }
        } else {
          const v = parseNumber(buf, i, e, this.altDecimal);
          if (v !== v) {
            const what = slot === k ? "size" : "stress";
            const text = decodeAscii(buf, i, e).trim();
            throw new InputError("input", `line ${this.lineNumber}: the ${what} field ${field + 1} ("${text}") is not a number`);
          }
          if (slot === k) this.sizes[row] = v;
          else raw[row * k + slot] = v;
        }
      }
      field++;
      if (e >= end) break;
      i = nextFieldStart(buf, e, end, delimiter);
    }
    if (field <= last) {
      throw new InputError("input", `line ${this.lineNumber}: expected at least ${last + 1} fields, found ${field}`);
    }
    const size = this.sizes[row];
    if (!(size >= 0)) throw new InputError("input", `line ${this.lineNumber}: the element size must be >= 0 (got ${size})`);
    this.lines[row] = this.lineNumber;
    this.rowsRead++;
    this.inBatch++;
    if (this.inBatch === this.batchRows) this.flush();
  }

  /** Sums the rows in the batch buffers. */
  private flush(): void {
    const n = this.inBatch;
    if (n === 0) return;
    const kind = this.columns!.kind;
    if (kind === 6) {
      const raw = this.raw;
      const out = this.principal;
      for (let r = 0; r < n; r++) {
        const b = r * 6;
        principalStresses(raw[b], raw[b + 1], raw[b + 2], raw[b + 3], raw[b + 4], raw[b + 5], out, r * 3);
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
    }
    this.inBatch = 0;
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

  /** Ends the stream (a last line without LF counts) and returns the result. */
  finish(): PartStreamResult {
    if (this.carry.length > 0) {
      const last = this.carry;
      this.carry = new Uint8Array(0);
      this.line(last, 0, last.length);
    }
    if (this.columns === null) throw new InputError("input", "the table is empty");
    this.flush();
    const effectiveSize = this.peak > 0 ? totalValue(this.total) : 0;
    let risk: number | null = null;
    let failureProbability: number | null = null;
    if (this.materialScale !== undefined) {
      risk = this.peak > 0 && effectiveSize > 0 ? Math.exp(Math.log(effectiveSize) + this.shape * Math.log(this.peak / this.materialScale)) : 0;
      failureProbability = -Math.expm1(-risk);
    }
    const hotSpots = [...this.held]
      .sort((a, b) => b.term - a.term)
      .map((h) => ({ id: h.id, line: h.line, principal: h.principal, size: h.size, share: h.term / effectiveSize }));
    return {
      rows: this.rowsRead,
      skippedLines: this.skipped,
      columns: this.columns,
      delimiter: delimiterName(this.delimiter as number),
      criterion: this.criterion,
      shape: this.shape,
      peak: this.peak,
      peakLine: this.peakLine,
      peakId: this.peakId,
      effectiveSize,
      risk,
      failureProbability,
      hotSpots,
    };
  }
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
