/**
 * Paired rows of `npm run bench` that time whole processes, start-up included: `brittle part`
 * against pyarrow + numpy, `brittle calc` against `node -e 0` and against a numpy script. The
 * command line runs compiled (lib/), as users run it.
 */
import { writeFileSync } from "node:fs";
import { join } from "node:path";
import { elementTable, strengthSheet, weibullSample, writeElementCsv, writeFloat64 } from "./datasets";
import type { Contender, Turn } from "./measure";
import { timeProcess } from "./processes";
import { contender, race, SAME_EQUATION, SAME_SUM, type BenchContext, type Fit } from "./race";
import { agreement, type PairedRow } from "./report";

const NODE = process.execPath;
const BRITTLE = ["bin/brittle.js"];

const PART_ROWS = 2_000_000;

/** `brittle part` on 2e6 rows of full doubles, as a process, against pyarrow's CSV reader + numpy, as a process. */
export async function partRow(ctx: BenchContext): Promise<PairedRow> {
  const { principal, sizes } = elementTable(PART_ROWS, 11);
  const file = join(ctx.work, "elements-2e6.csv");
  const bytes = writeElementCsv(file, principal, sizes);
  const shape = "10";
  interface Part {
    effectiveSize: number;
    peak: number;
    rows: number;
  }
  const read = (t: Turn<string>): Turn<Part> => {
    const parsed = JSON.parse(t.result) as Part;
    return { seconds: t.seconds, result: { effectiveSize: parsed.effectiveSize, peak: parsed.peak, rows: parsed.rows } };
  };
  const contenders: Contender<Part>[] = [contender("brittle", () => timeProcess(NODE, [...BRITTLE, "part", file, "--modulus", shape, "--json", "--quiet"]).then(read))];
  if (ctx.peers) contenders.push(contender("pyarrow CSV + numpy", () => timeProcess("python3", ["bench/peer_part.py", file, shape]).then(read)));
  return race(
    ctx,
    {
      id: "part",
      path: `brittle part, 2e6 rows (${(bytes / 1e6).toFixed(0)} MB), full doubles`,
      how: "whole processes, start-up included: node bin/brittle.js part FILE --modulus 10 --json --quiet; python3 bench/peer_part.py FILE 10",
    },
    ctx.rounds.long,
    contenders,
    (a, b) => {
      const result = agreement([[a.effectiveSize, b.effectiveSize], [a.peak, b.peak]], SAME_SUM, "effective size and peak stress");
      return a.rows === b.rows ? result : { ...result, ok: false, compared: `${result.compared}; rows read ${a.rows} against ${b.rows}` };
    },
  );
}

/** The modulus of every line of `brittle calc --json` output for a strength sheet (sheet name from the file name). */
function calcValues(stdout: string): unknown[][] {
  const sheets = JSON.parse(stdout) as Record<string, unknown[][]>;
  return Object.values(sheets)[0].slice(1);
}

/** `brittle calc` on a one-formula CSV against `node -e 0`: what start-up costs above the bare runtime. */
export async function calcStartRow(ctx: BenchContext): Promise<PairedRow> {
  const set = Float64Array.from(weibullSample(30, 3030), (x) => Number(x.toFixed(1)));
  const file = join(ctx.work, "one-formula.csv");
  writeFileSync(file, strengthSheet([set], ["modulus"]));
  // The peer computes nothing, so the agreement is with a numpy Newton solve of the same strengths.
  let reference: Fit | null = null;
  if (ctx.peers) reference = await ctx.peers.ask<Fit>({ task: "fit", file: writeFloat64(ctx.work, "one-formula.f64", set), peer: "newton", batch: 1 });
  const contenders: Contender<number>[] = [
    contender("brittle", () => timeProcess(NODE, [...BRITTLE, "calc", file, "--json"]).then((t) => ({ seconds: t.seconds, result: Number(calcValues(t.result)[0][30]) }))),
    contender("node -e 0", () => timeProcess(NODE, ["-e", "0"]).then((t) => ({ seconds: t.seconds, result: NaN }))),
  ];
  return race(
    ctx,
    { id: "calc-start", path: "brittle calc, one formula", how: "whole processes: node bin/brittle.js calc FILE --json; node -e 0" },
    ctx.rounds.short,
    contenders,
    (ours) => (reference ? agreement([[ours, reference.shape]], SAME_EQUATION, "m against numpy Newton") : { ok: null, compared: "no python peer" }),
  );
}

const SHEET_LINES = 1000;
const SHEET_SPECIMENS = 30;

/** `brittle calc` on 1000 lines x 30 strengths with two formulas a line, against a numpy script doing the 1000 fits. */
export async function calcSheetRow(ctx: BenchContext): Promise<PairedRow> {
  const sets = Array.from({ length: SHEET_LINES }, (_, i) => weibullSample(SHEET_SPECIMENS, 5000 + i));
  const file = join(ctx.work, "strength-sheet.csv");
  writeFileSync(file, strengthSheet(sets, ["modulus", "charstrength"]));
  const contenders: Contender<number[][]>[] = [
    contender("brittle", () =>
      timeProcess(NODE, [...BRITTLE, "calc", file, "--json"]).then((t) => ({
        seconds: t.seconds,
        result: calcValues(t.result).map((line) => [Number(line[SHEET_SPECIMENS]), Number(line[SHEET_SPECIMENS + 1])]),
      })),
    ),
  ];
  if (ctx.peers) {
    contenders.push(contender("numpy script", () => timeProcess("python3", ["bench/peer_rows.py", file, String(SHEET_SPECIMENS)]).then((t) => ({ seconds: t.seconds, result: JSON.parse(t.result) as number[][] }))));
  }
  return race(
    ctx,
    {
      id: "calc-sheet",
      path: `brittle calc, ${SHEET_LINES} x ${SHEET_SPECIMENS} (${2 * SHEET_LINES} fits)`,
      how: "whole processes: node bin/brittle.js calc FILE --json; python3 bench/peer_rows.py FILE 30",
    },
    ctx.rounds.long,
    contenders,
    (a, b) => {
      if (a.length !== b.length) return { ok: false, compared: `lines: ${a.length} against ${b.length}` };
      return agreement(a.flatMap((line, i) => [[line[0], b[i][0]] as const, [line[1], b[i][1]] as const]), SAME_EQUATION, "m and s_theta of every line");
    },
  );
}
