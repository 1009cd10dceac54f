/**
 * What the task pane's record import shows for one request, as data: the
 * record read through the shared reader, every strength (test-record.ts),
 * the sample for step 1, the notes, and each lot against the rest of the
 * record. Pure and without a page, so it runs the same on the page, on a
 * worker thread (functions/record-lots-run.ts) and in the tests.
 *
 * It comes in two parts because only the lot check simulates (40,000 seeded
 * samples per pair of lot sizes, lot-comparison.ts): recordSummary is
 * immediate, and lotVerdicts, the slow part, runs off the page thread while
 * the pane shows LOT_PENDING. importAnswer is the two together.
 */
import { recordLots, recordOrigins, recordSample, strengthsFromRecord, type Label, type Quantity, type RecordSpecimen, type TestConfiguration } from "./test-record";
import { InputError } from "../errors";
import { delimiterName } from "../input/delimited-text";
import { fieldNumber, readDelimited } from "../input/read-table";
import { compareLots } from "../weibull/lot-comparison";

export interface RecordTable {
  headers: string[];
  rows: (string | number | null)[][];
  /** How the text was read, in words ("semicolon-delimited, decimal comma"). */
  dialect: string;
}

/** Reads the record's text through the shared reader (encoding, delimiter and decimal mark as for every other input). */
export function readRecordTable(text: string, decimalComma: boolean): RecordTable {
  const table = readDelimited(text, decimalComma ? { decimalMark: "comma" } : {});
  const records = table.records.filter((r) => r.fields.length > 0);
  if (records.length < 2) throw new InputError("input", "the record needs a header line and at least one specimen");
  const [header, ...data] = records;
  const mark = table.dialect.decimalMark;
  const rows = data.map((r) =>
    r.fields.map((f, k) => {
      const t = f.text.trim();
      if (t === "") return null;
      // A quoted number is a number, as in a .csv sheet (docs/files-and-formats.md): machines that quote every field
      // export "400" for a load, which was text, so every specimen was left out as "not a number".
      const n = fieldNumber(t, mark, r.line, k + 1);
      return n === null ? t : n;
    }),
  );
  const d = table.dialect;
  const dialect = `${delimiterName(d.delimiter)}-delimited text (${d.basis.delimiter}), decimal ${d.decimalMark ?? "point"} (${d.basis.decimalMark})`;
  return { headers: header.fields.map((f) => f.text.trim()), rows, dialect };
}

export interface ImportRequest {
  table: RecordTable;
  configuration: TestConfiguration;
  columns: Partial<Record<Quantity | Label, number>>;
  fixed: Partial<Record<Quantity, number>>;
  /** The fracture origin to fit; blank: every specimen is a failure. */
  population: string;
}

/** The strengths of one lot of the record (recordLots). */
export interface RecordLot {
  lot: string;
  strengths: number[];
}

/** One lot against the rest of the record: the lot check's verdict, or why there is none. */
export interface LotLine {
  lot: string;
  specimens: number;
  text: string;
}

export interface ImportAnswer {
  specimens: RecordSpecimen[];
  /** Lines for the strengths box: strength, and "C" where a specimen is censored. */
  pasteText: string;
  origins: string[];
  /** Each lot against the rest of the record. */
  lots: LotLine[];
  notes: string[];
}

/** Everything but the lot verdicts, and the lots to compare (none when the record has fewer than two). */
export interface RecordSummary extends Omit<ImportAnswer, "lots"> {
  lots: RecordLot[];
}

/** What a lot line says until its simulated verdict arrives. */
export const LOT_PENDING = "comparing with the rest of the record ...";

/** The part of the answer that needs no simulation. */
export function recordSummary(request: ImportRequest): RecordSummary {
  const { specimens, conversions } = strengthsFromRecord({
    configuration: request.configuration,
    headers: request.table.headers,
    rows: request.table.rows,
    columns: request.columns,
    fixed: request.fixed,
  });
  const sample = recordSample({ specimens, population: request.population });
  const pasteText = sample.strengths.map((s, i) => (sample.censored?.[i] ? `${s}\tC` : String(s))).join("\n");
  const problems = specimens.filter((s) => s.strength === null);
  const notes = [
    `Read as ${request.table.dialect}; ${conversions.join("; ")}.`,
    `${sample.strengths.length} of ${specimens.length} specimens have a strength (MPa).`,
    ...problems.map((s) => `Row ${s.row} (${s.id}) left out: ${s.problem}.`),
  ];
  if (sample.censored) {
    const failures = sample.censored.filter((c) => !c).length;
    notes.push(`Fitting origin "${request.population}": ${failures} failures; the other ${sample.censored.length - failures} specimens are censored at their strength.`);
  }
  const lots = recordLots(specimens);
  return { specimens, pasteText, origins: recordOrigins(specimens), lots: lots.length < 2 ? [] : lots, notes };
}

/** The lot lines as shown while the verdicts are simulated. */
export function pendingLotLines(lots: readonly RecordLot[]): LotLine[] {
  return lots.map(({ lot, strengths }) => ({ lot, specimens: strengths.length, text: LOT_PENDING }));
}

/** Each lot against the rest of the record by the likelihood-ratio lot check (simulates; seeded, so always the same text). */
export function lotVerdicts(lots: readonly RecordLot[]): LotLine[] {
  if (lots.length < 2) return [];
  return lots.map(({ lot, strengths }) => {
    const rest = lots.filter((l) => l.lot !== lot).flatMap((l) => l.strengths);
    try {
      const c = compareLots({ lot: strengths, baseline: rest });
      return { lot, specimens: strengths.length, text: c.verdict };
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      return { lot, specimens: strengths.length, text: `no comparison: ${error.message}` };
    }
  });
}

/** Everything the panel shows for one request, computed at once (pure: tested without a browser). */
export function importAnswer(request: ImportRequest): ImportAnswer {
  const summary = recordSummary(request);
  return { ...summary, lots: lotVerdicts(summary.lots) };
}
