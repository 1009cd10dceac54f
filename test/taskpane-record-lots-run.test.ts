// The record import's lot verdicts run off the page thread (functions/record-lots-run.ts): on a worker thread (here a
// stand-in that runs the worker's own task table, pane-tasks.ts, when the test says so, as in
// test/taskpane-material-fit-run.test.ts), else in slices between the page's events. What is checked against what:
// every line against importAnswer on the same request, the synchronous answer the panel used to compute on the page,
// whose verdicts are in turn compareLots' own for each lot against the rest of the record (the lot check's null
// distribution is checked against a numpy simulation in test/fixtures/lot_pvalue.json). Stale runs and cancellation
// are counted in replies, slices and random draws, never timed. The records are the invented bar record in examples/
// (two lots), and the same record with its rows relabelled into three lots: strengths from committed data, and no
// reference value other than what the synchronous functions compute.
import { readFileSync } from "node:fs";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { RECORD_LOTS_TASK } from "../functions/pane-tasks";
import { RecordLotRuns } from "../functions/record-lots-run";
import { CANCELED } from "../functions/sliced-run";
import { importAnswer, LOT_PENDING, lotVerdicts, pendingLotLines, readRecordTable, recordSummary, type ImportAnswer, type ImportRequest } from "../src/design/record-import-answer";
import { decodeText } from "../src/input/encoding";
import { compareLots } from "../src/weibull/lot-comparison";
import { countDraws } from "./helpers";
import { withStandIns } from "./pane-task-stand-ins";

vi.setConfig({ testTimeout: 120_000 }); // generous, never a verdict: a busy machine takes longer, it does not fail

const table = readRecordTable(decodeText(new Uint8Array(readFileSync("examples/machine-export-bars.csv"))).text, false);
const TWO_LOTS: ImportRequest = {
  table,
  configuration: "bar-flexure",
  columns: { id: 0, width: 1, depth: 2, load: 3, origin: 4, lot: 5 },
  fixed: { outerSpan: 40, innerSpan: 20 },
  population: "",
};
// The same specimens in three lots (rows relabelled by thirds): three pairs of sizes, so three simulated references.
const THREE_LOTS: ImportRequest = {
  ...TWO_LOTS,
  table: { ...table, rows: table.rows.map((row, i) => row.map((field, k) => (k === 5 ? ["A", "B", "C"][Math.floor((3 * i) / table.rows.length)] : field))) },
};
const lotsOf = (request: ImportRequest) => recordSummary(request).lots;

let two: ImportAnswer;
let three: ImportAnswer;
beforeAll(() => {
  two = importAnswer(TWO_LOTS);
  three = importAnswer(THREE_LOTS);
});

describe("the record's answer in two parts", () => {
  it("the summary is the answer without the lot verdicts; the verdicts are the lot check's own, each lot against the rest", () => {
    for (const [request, answer] of [
      [TWO_LOTS, two],
      [THREE_LOTS, three],
    ] as const) {
      const summary = recordSummary(request);
      expect({ ...summary, lots: answer.lots }).toEqual(answer);
      expect(lotVerdicts(summary.lots)).toEqual(answer.lots);
      for (const { lot, strengths } of summary.lots) {
        const rest = summary.lots.filter((l) => l.lot !== lot).flatMap((l) => l.strengths);
        expect(answer.lots.find((l) => l.lot === lot)).toEqual({ lot, specimens: strengths.length, text: compareLots({ lot: strengths, baseline: rest }).verdict });
      }
    }
    expect(three.lots.map((l) => [l.lot, l.specimens])).toEqual([
      ["A", 7],
      ["B", 5],
      ["C", 6],
    ]);
  });

  it("while they are simulated, each lot line names its lot and size and says it is comparing", () => {
    expect(pendingLotLines(lotsOf(THREE_LOTS))).toEqual(three.lots.map((l) => ({ ...l, text: LOT_PENDING })));
  });

  it("a record with one lot has nothing to compare, and nothing to simulate", () => {
    const oneLot: ImportRequest = { ...TWO_LOTS, columns: { ...TWO_LOTS.columns, lot: undefined } };
    expect(recordSummary(oneLot).lots).toEqual([]);
    expect(importAnswer(oneLot).lots).toEqual([]);
  });
});

describe("the lot verdicts on a worker thread", () => {
  it("sends the lots to the worker and shows exactly importAnswer's lines", async () => {
    const { started, environment } = withStandIns();
    const runs = new RecordLotRuns(environment);
    const pending = runs.verdicts(lotsOf(THREE_LOTS));
    expect(runs.running).toBe(true);
    expect(started[0].received).toEqual([{ name: RECORD_LOTS_TASK, args: [lotsOf(THREE_LOTS)] }]);
    started[0].reply();
    expect(await pending).toEqual({ lines: three.lots });
    expect(runs.running).toBe(false);
  });

  it("other lots drop the run under way: it resolves CANCELED, its thread stops, its late reply is ignored", async () => {
    const { started, environment } = withStandIns();
    const runs = new RecordLotRuns(environment);
    const first = runs.verdicts(lotsOf(TWO_LOTS));
    const second = runs.verdicts(lotsOf(THREE_LOTS)); // another lot column, file or configuration
    expect(started[0].terminated).toBe(true);
    expect(await first).toBe(CANCELED);
    started[0].reply(); // the old worker answers anyway (a reply already on its way): it must not count
    expect(started).toHaveLength(2);
    started[1].reply();
    const answer = await second;
    expect(answer).toEqual({ lines: three.lots });
    expect(answer).not.toEqual({ lines: two.lots });
  });

  it("the same lots asked again while they run (another fracture origin) join that run instead of restarting it", async () => {
    const { started, environment } = withStandIns();
    const runs = new RecordLotRuns(environment);
    const first = runs.verdicts(lotsOf(TWO_LOTS));
    const again = runs.verdicts(lotsOf({ ...TWO_LOTS, population: "surface" }));
    expect(started).toHaveLength(1);
    expect(started[0].terminated).toBe(false);
    started[0].reply();
    expect(await again).toEqual({ lines: two.lots });
    expect(await first).toEqual({ lines: two.lots });
  });

  it("a run canceled before its answer arrives gives no answer (nothing left to compare after an edit)", async () => {
    const { started, environment } = withStandIns();
    const runs = new RecordLotRuns(environment);
    const pending = runs.verdicts(lotsOf(TWO_LOTS));
    runs.cancel();
    expect(await pending).toBe(CANCELED);
    expect(started[0].terminated).toBe(true);
    expect(runs.running).toBe(false);
    // Asked again after the cancel: a new run, not the dropped one.
    const fresh = runs.verdicts(lotsOf(TWO_LOTS));
    expect(started).toHaveLength(2);
    started[1].reply();
    expect(await fresh).toEqual({ lines: two.lots });
  });
});

/** A module graph of its own (vi.resetModules): its lot-check cache starts empty, so its runs really simulate. */
async function freshModules() {
  vi.resetModules();
  return {
    runs: await import("../functions/record-lots-run"),
    sliced: await import("../functions/sliced-run"),
    threads: await import("../functions/simulation-threads"),
    random: await import("../src/numeric/random"),
  };
}

describe("the lot verdicts where no worker can run", () => {
  it("a worker that cannot start (file not deployed) leaves the run to slices on the page, with the same lines", async () => {
    const { runs: r, threads: t } = await freshModules();
    const pool = new t.SimulationThreads(() => {
      throw new Error("simulation-worker.js: 404");
    }, 1);
    let pauses = 0;
    const runs = new r.RecordLotRuns(() => ({ threads: pool, pause: async () => void pauses++ }));
    expect(await runs.verdicts(lotsOf(THREE_LOTS))).toEqual({ lines: three.lots });
    expect(pauses).toBeGreaterThan(3); // three simulations, each in several slices, the page's events between them
    expect(pool.available).toBe(false);
  });

  it("a runtime without Worker runs them in slices too, with the same lines", async () => {
    const { runs: r } = await freshModules();
    let pauses = 0;
    const runs = new r.RecordLotRuns(() => ({ threads: null, pause: async () => void pauses++ }));
    expect(await runs.verdicts(lotsOf(TWO_LOTS))).toEqual({ lines: two.lots });
    expect(pauses).toBeGreaterThan(1);
  });

  it("other lots while the first wait between slices: the first gives no answer, the second its own lines", async () => {
    const { runs: r, sliced, random } = await freshModules();
    const draws = countDraws(random.SeededRandom);
    try {
      let pauses = 0;
      let second: Promise<unknown> | null = null;
      let drawsWhenSuperseded = -1;
      const runs: InstanceType<typeof r.RecordLotRuns> = new r.RecordLotRuns(() => ({
        threads: null,
        pause: async () => {
          pauses++;
          if (pauses === 3 && second === null) {
            drawsWhenSuperseded = draws.count();
            second = runs.verdicts(lotsOf(THREE_LOTS)); // the user maps another lot column while the page runs its events
          }
        },
      }));
      expect(await runs.verdicts(lotsOf(TWO_LOTS))).toBe(sliced.CANCELED);
      expect(drawsWhenSuperseded).toBeGreaterThan(0); // two slices of the first run had drawn
      expect(await second).toEqual({ lines: three.lots });
    } finally {
      draws.restore();
    }
  });

  it("canceled between slices: no further slice runs (no more random draws), and no answer", async () => {
    const { runs: r, sliced, random } = await freshModules();
    const draws = countDraws(random.SeededRandom);
    try {
      let pauses = 0;
      let drawsWhenCanceled = -1;
      const runs: InstanceType<typeof r.RecordLotRuns> = new r.RecordLotRuns(() => ({
        threads: null,
        pause: async () => {
          pauses++;
          if (pauses === 3) {
            runs.cancel(); // the record is cleared while the page runs its events
            drawsWhenCanceled = draws.count();
          }
        },
      }));
      expect(await runs.verdicts(lotsOf(THREE_LOTS))).toBe(sliced.CANCELED);
      expect(drawsWhenCanceled).toBeGreaterThan(0);
      expect(draws.count()).toBe(drawsWhenCanceled);
      expect(pauses).toBe(3);
    } finally {
      draws.restore();
    }
  });
});
