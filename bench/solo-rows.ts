/**
 * Rows of `npm run bench` with no peer: the project's own paths a user waits for (bounds, table
 * cells, in-memory element streaming, the demo workbook, a full spreadsheet column), timed alone
 * as a median after one warm-up. Each section has a name BENCH_ONLY can pick.
 */
import { HyperFormula } from "hyperformula";
import { createEngine, LICENSE_KEY, registerFunctions } from "../cli/engine";
import { evaluateWorkbook } from "../cli/evaluate-workbook";
import { loadWorkbook } from "../cli/workbook-io";
import { DEMO_INPUT, runDemo } from "../examples/demo";
import { generateMetadata } from "../functions/metadata";
import { guarded } from "../functions/registry";
import { readPartTable } from "../src/size/part-stream";
import { parameterBounds } from "../src/weibull/confidence-bounds";
import { elementCsv, elementTable, weibullSample } from "./datasets";
import { differencesFromNumber, digitLoopFloor, parseTableNumbers } from "./number-parsing";
import { median, type Spread } from "./measure";
import type { SoloRow } from "./report";

type Section = (quick: boolean) => Promise<SoloRow[]>;

/** Number parsing alone, in MB of table text per second (issue goal for the element reader). */
const PARSING_GOAL_MB_S = 300;

/** The timing without the task's result (a workbook or an engine is no figure, and may not even serialise). */
function figures({ seconds, fastest, slowest, times }: Spread): Spread {
  return { seconds, fastest, slowest, times };
}

const count = (n: number) => n.toLocaleString("en-US");

async function bounds(): Promise<SoloRow[]> {
  const rows: SoloRow[] = [];
  for (const n of [30, 1000, 1_000_000]) {
    const strengths = Array.from(weibullSample(n, n));
    const t = await median(n < 100_000 ? 7 : 3, () => parameterBounds({ strengths, confidence: 0.9 }));
    rows.push({ task: `bounds on m and s_theta (90 %), n = ${count(n)}`, ours: figures(t), note: `pivotal ${t.result.source.kind}` });
  }
  // Simulations keep their results for the same data: every run gets a new sample, as a new data set would.
  let seed = 100;
  const fresh = () => Array.from(weibullSample(30, seed++));
  const censoredFlags = Array.from({ length: 30 }, (_, i) => i % 5 === 0);
  const c = await median(5, () => parameterBounds({ strengths: fresh(), censored: censoredFlags, confidence: 0.9 }));
  rows.push({ task: "bounds, n = 30 with 6 censored", ours: figures(c), note: `pivotal ${c.result.source.kind}${c.result.source.replications ? `, ${c.result.source.replications} replications` : ""}` });
  // The single-population checks simulate once per sample size and censoring pattern, then reuse it.
  const first = await median(1, () => guarded.FIT(Array.from(weibullSample(31, 31), (x) => [x])), false);
  rows.push({ task: "FIT table cell, first call at n = 31", ours: figures(first), note: "bounds, A*, simulated single-population checks" });
  const fit = await median(5, () => guarded.FIT(fresh().map((x) => [x])));
  rows.push({ task: "FIT table cell, n = 30, new data each run", ours: figures(fit), note: "simulation reused for the same n" });
  const cm = await median(5, () => guarded.MODULUS(fresh().map((x) => [x]), censoredFlags.map((f) => [f])));
  rows.push({ task: "MODULUS cell, n = 30 with 6 censored (default MLE)", ours: figures(cm), note: "simulated unbiasing factor" });
  const column = Array.from(weibullSample(1000, 1000), (x) => [x]);
  const cell = await median(50, () => guarded.MODULUS(column, null, "MLE-RAW"));
  rows.push({ task: "MODULUS cell (guarded adapter), n = 1,000", ours: figures(cell), note: "range reading + fit" });
  return rows;
}

async function streaming(): Promise<SoloRow[]> {
  const elements = 2 ** 20;
  const { principal, sizes } = elementTable(elements, 7);
  const rows: SoloRow[] = [];
  // Full doubles (the slowest case for a parser), then 7 significant digits as post-processors write.
  for (const digits of [undefined, 7]) {
    const chunks = elementCsv(principal, sizes, digits);
    const bytes = chunks.reduce((a, c) => a + c.length, 0);
    const t = await median(3, () => readPartTable(chunks, { shape: 10 }));
    rows.push({
      task: `stream a 2^20-row element CSV from memory, ${digits ? `${digits} digits` : "full doubles"} (${(bytes / 1e6).toFixed(0)} MB)`,
      ours: figures(t),
      note: `${(elements / t.seconds / 1e6).toFixed(1)} M rows/s, ${(bytes / 1e6 / t.seconds).toFixed(0)} MB/s, parse + PIA sum`,
    });
    // The same bytes through the number parser alone (bench/number-parsing.ts): the issue's goal is 300 MB/s.
    const values = new Float64Array(elements * 5);
    const p = await median(5, () => parseTableNumbers(chunks, values));
    const differ = differencesFromNumber(chunks, values, p.result);
    const rate = bytes / 1e6 / p.seconds;
    rows.push({
      task: `number parsing alone, same table, ${digits ? `${digits} digits` : "full doubles"}`,
      ours: figures(p),
      note: `${rate.toFixed(0)} MB/s (goal >= ${PARSING_GOAL_MB_S}: ${rate >= PARSING_GOAL_MB_S ? "met" : "not met"}), ${count(p.result)} numbers; ${differ === 0 ? "every value equals Number() of its text" : `${count(differ)} values DIFFER from Number() of their text`}`,
      goal: { text: `>= ${PARSING_GOAL_MB_S} MB/s`, figure: `${rate.toFixed(0)} MB/s`, met: rate >= PARSING_GOAL_MB_S && differ === 0 },
    });
    // A yardstick for the parser: the simplest byte loop over the same bytes (not a parser; see digitLoopFloor).
    const floor = await median(5, () => digitLoopFloor(chunks));
    const floorRate = bytes / 1e6 / floor.seconds;
    rows.push({
      task: `simplest byte loop over the same bytes, ${digits ? `${digits} digits` : "full doubles"} (not a parser)`,
      ours: figures(floor),
      note: `${floorRate.toFixed(0)} MB/s: one load, compare and multiply-add a byte; the parser above runs at ${((100 * rate) / floorRate).toFixed(0)} % of its speed`,
    });
  }
  return rows;
}

async function demo(): Promise<SoloRow[]> {
  const quiet = { out: () => {}, err: () => {} };
  const whole = await median(3, () => runDemo(quiet));
  const { functions } = await generateMetadata();
  const workbook = await loadWorkbook(DEMO_INPUT);
  const evaluate = await median(5, () => evaluateWorkbook(structuredClone(workbook), functions));
  return [
    { task: "demo workbook end to end (load, metadata, write)", ours: figures(whole), note: DEMO_INPUT },
    { task: "demo workbook, evaluation only", ours: figures(evaluate), note: `${evaluate.result.formulas.length} formulas` },
  ];
}

async function fullColumn(quick: boolean): Promise<SoloRow[]> {
  if (quick) return [{ task: "1,048,576 rows through MODULUS", note: "skipped (BENCH_QUICK=1)" }];
  const rows = 1_048_576;
  const { functions } = await generateMetadata();
  const data: unknown[][] = Array.from({ length: rows }, (_, i) => [200 + ((i * 7919) % 2003) / 10]);
  data[0].push('=BRITTLE.MODULUS(A:A, , "MLE-RAW")');
  try {
    const t = await median(1, () => createEngine({ Column: data }, functions).getCellValue({ sheet: 0, row: 0, col: 1 }), false);
    return [{ task: `${count(rows)} rows through MODULUS (engine, 1 run)`, ours: figures(t), note: `m = ${String(t.result)}; ${rss()}` }];
  } catch (error) {
    // What the engine does once its sheet limit is raised: the same registration and options plus maxRows.
    registerFunctions(functions);
    const options = { licenseKey: LICENSE_KEY, useArrayArithmetic: false, smartRounding: false, precisionRounding: 0, maxRows: rows };
    const t = await median(1, () => {
      const engine = HyperFormula.buildFromSheets({ Column: data } as never, options as never);
      const value = engine.getCellValue({ sheet: 0, row: 0, col: 1 });
      engine.destroy();
      return value;
    }, false);
    const m = typeof t.result === "number" ? t.result.toPrecision(10) : String(t.result);
    return [{ task: `${count(rows)} rows, MODULUS, engine + maxRows (1 run)`, ours: figures(t), note: `m = ${m}; ${rss()}; createEngine: ${(error as Error).message.split("\n")[0]}` }];
  }
}

const rss = () => `resident memory ${(process.memoryUsage().rss / 1e9).toFixed(1)} GB`;

export const SOLO_SECTIONS: Record<string, Section> = { bounds, streaming, demo, "full-column": fullColumn };
