/**
 * Joining the results of an element table read in parts (one part per
 * processor core, `brittle part` on a large file): the first part is read
 * as a whole table, every later part with the first part's settled dialect
 * and columns (PartTableReader option continueFrom), starting on a line
 * boundary, with line numbers counted from its own start.
 *
 * Each part's effective size is referenced to its own peak p_k; at the
 * table's peak p = max p_k,
 *   S_E = sum_k S_k (p_k / p)^m,
 * and a hot spot's term scales the same way (the streaming reader does the
 * same whenever a batch raises the peak). The sum over parts is in another
 * order than one reader's, so the result agrees with it to rounding, not
 * bit for bit. Errors are not joined: a part that fails is read again by
 * one reader from the start, whose first error is the file's first error.
 */
import { riskOfPart, type PartStreamResult, type SkippedLines, type TablePiece } from "./part-stream";
import { additionError } from "./power-kernel";

/** As the streaming reader keeps them. */
const MAX_SKIPPED_RUNS = 100;

/** The result of the whole table from its parts, in file order. */
export function joinPieces(pieces: TablePiece[], shape: number, top: number, materialScale: number | undefined): PartStreamResult {
  const first = pieces[0].result;
  let peak = 0;
  let peakLine = 0;
  let peakId: string | null = null;
  let offset = 0;
  const offsets: number[] = [];
  for (const piece of pieces) {
    offsets.push(offset);
    if (piece.result.peak > peak) {
      peak = piece.result.peak;
      peakLine = piece.result.peakLine + offset;
      peakId = piece.result.peakId;
    }
    offset += piece.lines;
  }
  let sum = 0;
  let compensation = 0;
  const spots: { term: number; spot: PartStreamResult["hotSpots"][number] }[] = [];
  const skipped: SkippedLines[] = [];
  let rows = 0;
  let skippedLines = 0;
  let zeroSizes = 0;
  pieces.forEach((piece, k) => {
    const r = piece.result;
    rows += r.rows;
    skippedLines += r.skippedLines;
    zeroSizes += r.zeroSizes;
    for (const run of r.skipped) {
      const moved = { from: run.from + offsets[k], to: run.to + offsets[k], reason: run.reason };
      const last = skipped[skipped.length - 1];
      if (last && last.reason === moved.reason && last.to === moved.from - 1) last.to = moved.to;
      else if (skipped.length < MAX_SKIPPED_RUNS) skipped.push(moved);
    }
    if (r.peak === 0) return;
    const factor = r.peak === peak ? 1 : Math.pow(r.peak / peak, shape);
    const term = r.effectiveSize * factor;
    const t = sum + term;
    compensation += additionError(sum, term, t);
    sum = t;
    r.hotSpots.forEach((h, i) => spots.push({ term: piece.terms[i] * factor, spot: { ...h, line: h.line + offsets[k] } }));
  });
  const effectiveSize = peak > 0 ? sum + compensation : 0;
  const hotSpots = spots
    .sort((a, b) => b.term - a.term)
    .slice(0, top)
    .map(({ term, spot }) => ({ ...spot, share: effectiveSize > 0 ? term / effectiveSize : 0 }));
  const { risk, failureProbability } = riskOfPart(effectiveSize, peak, peakLine, peakId, shape, materialScale);
  return { ...first, rows, skippedLines, skipped, zeroSizes, peak, peakLine, peakId, effectiveSize, risk, failureProbability, hotSpots };
}
