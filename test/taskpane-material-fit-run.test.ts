// The pane's pooled material fit run off the page thread (functions/material-fit-run.ts): on a worker thread (here a
// stand-in that runs the worker's own task table, pane-tasks.ts, when the test says so, as in
// test/cancelable-cells.test.ts), else in slices between the page's events. What is checked against what: every
// answer against materialFitAnswer on the same request (the pure function the pane used to call, whose fit is
// checked against a 40-digit mpmath maximisation in test/material-fit.test.ts), and refused input against the
// message materialFitAnswer throws. Stale runs and cancellation are counted in replies, slices and random draws,
// never timed. The request is the invented example the pane's help points to (examples/material-fit-and-planning.csv).
import { readFileSync } from "node:fs";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { MaterialFitRuns } from "../functions/material-fit-run";
import { guardedPaneTasks, MATERIAL_FIT_TASK } from "../functions/pane-tasks";
import { SimulationThreads } from "../functions/simulation-threads";
import { CANCELED } from "../functions/sliced-run";
import { materialFitAnswer, type MaterialFitAnswer, type MaterialFitRequest } from "../src/design/material-fit-answer";
import { SeededRandom } from "../src/numeric/random";
import { withStandIns } from "./pane-task-stand-ins";

vi.setConfig({ testTimeout: 120_000 }); // generous, never a verdict: a busy machine takes longer, it does not fail

const lines = readFileSync("examples/material-fit-and-planning.csv", "utf8")
  .split("\n")
  .slice(1)
  .map((line) => line.split(","))
  .filter((f) => f[0] !== "" && f[0] !== undefined);
const text = (scaleDisks: number) => lines.map((f) => `${f[1].startsWith("RING") ? Number(f[0]) * scaleDisks : f[0]}\t${f[1]}`).join("\n");
const REQUEST: MaterialFitRequest = { text: text(1), flaws: "volume", poisson: 0.22, decimalComma: false };
// The disks made far stronger than the size effect allows: a different answer (a caution), to tell runs apart.
const STRONGER_DISKS: MaterialFitRequest = { ...REQUEST, text: text(1.6) };

let reference: MaterialFitAnswer;
let strongerReference: MaterialFitAnswer;
beforeAll(() => {
  reference = materialFitAnswer(REQUEST);
  strongerReference = materialFitAnswer(STRONGER_DISKS);
});

describe("the pane's material fit on a worker thread", () => {
  it("sends the request to the worker and shows exactly materialFitAnswer's answer", async () => {
    const { started, environment } = withStandIns();
    const runs = new MaterialFitRuns(environment);
    const pending = runs.run(REQUEST);
    expect(runs.running).toBe(true);
    expect(started).toHaveLength(1);
    expect(started[0].received).toEqual([{ name: MATERIAL_FIT_TASK, args: [REQUEST] }]);
    started[0].reply();
    expect(await pending).toEqual({ answer: reference });
    expect(runs.running).toBe(false);
  });

  it("a refused input comes back with materialFitAnswer's own message", async () => {
    const oneConfiguration: MaterialFitRequest = { ...REQUEST, text: "412\tC1161-B-4PT\n398\tC1161-B-4PT\n" };
    let message = "";
    try {
      materialFitAnswer(oneConfiguration);
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message).toMatch(/at least two configurations/);
    const { started, environment } = withStandIns();
    const pending = new MaterialFitRuns(environment).run(oneConfiguration);
    started[0].reply();
    expect(await pending).toEqual({ error: message });
  });

  it("a new run drops the one under way: it resolves CANCELED, its thread stops, its late reply is ignored", async () => {
    const { started, environment } = withStandIns();
    const runs = new MaterialFitRuns(environment);
    const first = runs.run(REQUEST);
    const second = runs.run(STRONGER_DISKS);
    expect(started[0].terminated).toBe(true);
    expect(await first).toBe(CANCELED);
    started[0].reply(); // the old worker answers anyway (a reply already on its way): it must not count
    expect(started).toHaveLength(2);
    expect(started[1].received).toEqual([{ name: MATERIAL_FIT_TASK, args: [STRONGER_DISKS] }]);
    started[1].reply();
    const answer = await second;
    expect(answer).toEqual({ answer: strongerReference });
    expect(answer).not.toEqual({ answer: reference });
  });

  it("a run whose answer arrives after it was canceled still gives no answer (a thread that cannot be stopped in time)", async () => {
    // A pool that ignores cancel and answers later, as a reply already posted would: only the run's own check stands.
    let answer: (result: unknown) => void = () => {};
    const stubborn = {
      available: true,
      run: (_request: unknown, onCancel: (cancel: () => void) => void) => {
        onCancel(() => {});
        return new Promise((settle) => (answer = settle));
      },
    } as unknown as SimulationThreads;
    const runs = new MaterialFitRuns(() => ({ threads: stubborn, pause: async () => {} }));
    const pending = runs.run(REQUEST);
    runs.cancel();
    answer(guardedPaneTasks[MATERIAL_FIT_TASK](REQUEST));
    expect(await pending).toBe(CANCELED);
  });

  it("cancel stops the run under way and leaves nothing running", async () => {
    const { started, environment } = withStandIns();
    const runs = new MaterialFitRuns(environment);
    const pending = runs.run(REQUEST);
    runs.cancel();
    expect(await pending).toBe(CANCELED);
    expect(started[0].terminated).toBe(true);
    expect(runs.running).toBe(false);
    runs.cancel(); // nothing to cancel: no effect
    expect(runs.running).toBe(false);
  });
});

describe("the pane's material fit where no worker can run", () => {
  it("a worker that cannot start (file not deployed) leaves the run to slices on the page, with the same answer", async () => {
    const pool = new SimulationThreads(() => {
      throw new Error("simulation-worker.js: 404");
    }, 1);
    let pauses = 0;
    const runs = new MaterialFitRuns(() => ({ threads: pool, pause: async () => void pauses++ }));
    expect(await runs.run(REQUEST)).toEqual({ answer: reference });
    expect(pauses).toBeGreaterThan(1); // the simulation ran in several slices, the page's events between them
    expect(pool.available).toBe(false);
  });

  it("a runtime without Worker runs it in slices too, with the same answer", async () => {
    let pauses = 0;
    const runs = new MaterialFitRuns(() => ({ threads: null, pause: async () => void pauses++ }));
    expect(await runs.run(REQUEST)).toEqual({ answer: reference });
    expect(pauses).toBeGreaterThan(1);
  });

  it("canceled between slices: no further slice runs (no more random draws), and no answer", async () => {
    const original = SeededRandom.prototype.uniform;
    let draws = 0;
    SeededRandom.prototype.uniform = function (this: SeededRandom) {
      draws++;
      return original.call(this);
    };
    try {
      let pauses = 0;
      let drawsWhenCanceled = -1;
      const runs: MaterialFitRuns = new MaterialFitRuns(() => ({
        threads: null,
        pause: async () => {
          pauses++;
          if (pauses === 3) {
            runs.cancel(); // the user clicks Cancel while the page runs its events
            drawsWhenCanceled = draws;
          }
        },
      }));
      expect(await runs.run(REQUEST)).toBe(CANCELED);
      expect(drawsWhenCanceled).toBeGreaterThan(0); // two slices ran
      expect(draws).toBe(drawsWhenCanceled);
      expect(pauses).toBe(3);
    } finally {
      SeededRandom.prototype.uniform = original;
    }
  });

  it("a second run started while the first waits between slices wins; the first gives no answer", async () => {
    let pauses = 0;
    const runs = new MaterialFitRuns(() => ({ threads: null, pause: async () => void pauses++ }));
    const first = runs.run(REQUEST);
    const second = runs.run(STRONGER_DISKS);
    expect(await first).toBe(CANCELED);
    expect(await second).toEqual({ answer: strongerReference });
    expect(pauses).toBeGreaterThan(1);
  });
});

