// The simulating cell functions as the spreadsheet host runs them: declared cancelable in functions.json,
// run in slices where the runtime has no worker thread (or on a thread where it has), with the same values as
// the synchronous adapters the command line uses, and stopping when canceled.
//
// What is checked against what: the sliced and threaded runs against the synchronous guarded adapter on the same
// inputs (that adapter is itself checked against mpmath, scipy and the standards in the other suites); the input
// samples are the committed mpmath/numpy fixtures (weibull_fits.json from generate_weibull_fits.py,
// material_fit.json from generate_material_fit.py). Cancellation is counted in slices, never timed.
import fc from "fast-check";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { adapters, guarded } from "../functions/registry";
import { IN_THE_BACKGROUND, SIMULATING } from "../functions/simulating";
import { spillShapes } from "../functions/spill-shapes";
import { withSliceHost } from "../src/numeric/replication-slices";
import { countDraws, fixture } from "./helpers";
import { baselineCall, chaosCall } from "./properties-arbitraries";
import { hostValue } from "./properties-policy";

vi.setConfig({ testTimeout: 600_000 }); // generous, never a verdict: a busy machine takes longer, it does not fail

const fits = fixture("weibull_fits.json").datasets;
const sample = (id: string) => fits.find((d: any) => d.id === id);
const column = (xs: readonly unknown[]) => xs.map((x) => [x]);
const strengthsOf = (id: string) => column(sample(id).strengths);
const flagsOf = (id: string) => column(sample(id).censored);
const complete = (n: number, k = 0) => column(fits.filter((d: any) => d.kind === "complete" && d.strengths.length === n)[k].strengths);

function materialColumns() {
  const disk = fixture("material_fit.json").cases.find((c: any) => c.poisson === 0.25);
  const strengths: unknown[][] = [];
  const configs: unknown[][] = [];
  for (const g of disk.groups) {
    for (const s of g.strengths) {
      strengths.push([s]);
      configs.push([g.configuration]);
    }
  }
  return [strengths, configs, "VOLUME", null, "PIA", 0.25];
}

// One case per simulating function, each with its own sample size: the core keeps simulations of the same size
// (mixture and check statistics, lot null distributions) between calls, and every sliced run here must simulate.
const CASES: Record<string, () => unknown[]> = {
  MODULUS: () => [strengthsOf("censored-n20"), flagsOf("censored-n20"), null],
  FIT: () => [complete(20, 1), null, null, null],
  ORIGINFIT: () => [strengthsOf("censored-n10"), column(sample("censored-n10").censored.map((c: boolean) => (c ? "pore" : "surface"))), "surface", null, null],
  MODULUSBOUNDS: () => [strengthsOf("censored-n30-small-scale"), flagsOf("censored-n30-small-scale"), 0.95, null],
  CHARSTRENGTHBOUNDS: () => [strengthsOf("censored-n12-few-failures"), flagsOf("censored-n12-few-failures"), null, 1],
  DESIGNSTRESSBOUND: () => [0.999, strengthsOf("censored-n8-two-failures"), flagsOf("censored-n8-two-failures"), null, 10],
  LOTCHECK: () => [complete(10, 2), complete(100, 0), null],
  MATERIALFIT: materialColumns,
};

let metadata: FunctionMetadata[];
beforeAll(async () => {
  metadata = (await generateMetadata()).functions;
});

/** Counts the random draws of the current module graph's generator (after freshModules: the graph under test). */
async function drawsOfCurrentGraph(): Promise<{ count: () => number; restore: () => void }> {
  return countDraws((await import("../src/numeric/random")).SeededRandom);
}

/** A module graph of its own (vi.resetModules): its simulations share no cache with the one under test. */
async function freshModules() {
  vi.resetModules();
  return {
    registry: await import("../functions/registry"),
    cancelable: await import("../functions/cancelable"),
    sliced: await import("../functions/sliced-run"),
    threads: await import("../functions/simulation-threads"),
  };
}

describe("functions.json", () => {
  it("declares exactly the simulating functions cancelable, with their parameters and result shapes unchanged", () => {
    for (const f of metadata) {
      expect(f.options?.cancelable === true, f.id).toBe(SIMULATING.includes(f.id));
      // The host passes the invocation after the declared parameters; office.ts finds it at the adapter's arity.
      if (SIMULATING.includes(f.id)) expect(adapters[f.id].length, f.id).toBe(f.parameters.length);
      expect(f.result.dimensionality === "matrix", f.id).toBe(f.id in spillShapes);
    }
    expect(Object.keys(CASES).sort()).toEqual([...SIMULATING].sort());
  });

  it("the function reference and the help page say which functions run in the background", async () => {
    const { renderReference } = await import("../scripts/functions-reference");
    const { renderHelpPage } = await import("../scripts/help-page");
    const { families } = await import("../functions/registry");
    const count = (text: string, part: string) => text.split(part).length - 1;
    expect(count(renderReference(metadata), IN_THE_BACKGROUND)).toBe(SIMULATING.length);
    const helpFamilies = families.map((f) => ({ title: f.title, ids: metadata.filter((m) => m.id in f.adapters).map((m) => m.id) }));
    expect(count(renderHelpPage(metadata, helpFamilies, {}), "Simulates: in the spreadsheet")).toBe(SIMULATING.length);
  });
});

describe("which functions simulate", () => {
  /** Whether a call asks for a simulation: the first request stops the call (the guarded adapter turns that into a failure). */
  function simulationsOf(fn: (...args: unknown[]) => unknown, args: unknown[], host = withSliceHost): number {
    let asked = 0;
    host(
      {
        simulation: () => {
          asked++;
          throw new Error("a simulation was asked for");
        },
      },
      () => fn(...args),
    );
    return asked;
  }

  it("no function outside the list simulates, on its documented example and on seeded random cells", () => {
    for (const f of metadata.filter((m) => !SIMULATING.includes(m.id))) {
      const calls = [
        ...(baselineCall(f) ? fc.sample(baselineCall(f)!, { seed: 15, numRuns: 4 }) : []),
        ...fc.sample(chaosCall(f, 12), { seed: 15, numRuns: 8 }),
      ];
      for (const call of calls) expect(simulationsOf(guarded[f.id], call.args.map(hostValue)), f.id).toBe(0);
    }
  });

  it("every function on the list simulates for its case", async () => {
    // A fresh module graph: the simulations' caches start empty, whatever ran before in this worker
    // (`npm run test:fast` shares modules between test files).
    const { registry } = await freshModules();
    const { withSliceHost: freshHost } = await import("../src/numeric/replication-slices");
    for (const id of SIMULATING) expect(simulationsOf(registry.guarded[id], CASES[id](), freshHost), id).toBeGreaterThan(0);
  });
});

describe("in slices (the runtime without worker threads)", () => {
  it("resolves to exactly the synchronous adapter's value, and pauses between slices", async () => {
    const reference = (await freshModules()).registry.guarded;
    const expected = Object.fromEntries(SIMULATING.map((id) => [id, reference[id](...CASES[id]())]));
    const { cancelable } = await freshModules();
    const draws = await drawsOfCurrentGraph(); // the same module graph as the run: every random draw passes here
    for (const id of SIMULATING) {
      const atPause: number[] = [];
      const environment = { threads: null, pause: async () => void atPause.push(draws.count()) };
      const value = await cancelable.runCancelable(id, CASES[id](), {}, environment);
      expect(value, id).toEqual(expected[id]);
      atPause.push(draws.count());
      const slicesThatDrew = atPause.slice(1).filter((n, k) => n > atPause[k]).length;
      expect(slicesThatDrew, `${id}: its draws were not split into slices`).toBeGreaterThanOrEqual(2);
    }
    draws.restore();
  });

  it("errors keep their code and message", async () => {
    const { cancelable } = await freshModules();
    const environment = { threads: null, pause: async () => {} };
    const bad = await cancelable.runCancelable("MODULUS", [[[300], ["oops"], [320]], null, null], {}, environment);
    expect(bad).toEqual({ cellError: "#VALUE!", message: 'strengths, row 2 is not a number: it holds the text "oops"' });
    const tooMany = Array.from({ length: 1001 }, (_, i) => [300 + i]);
    const flags = tooMany.map((_, i) => [i % 3 === 0]);
    const limit = await cancelable.runCancelable("MODULUS", [tooMany, flags, null], {}, environment);
    expect(limit).toMatchObject({ cellError: "#VALUE!", message: expect.stringMatching(/at most 1000 specimens/) });
  });

  it("a canceled invocation draws no further random number and gives no value", async () => {
    const { cancelable, sliced } = await freshModules();
    const draws = await drawsOfCurrentGraph(); // the same module graph as the run
    const invocation: { onCanceled?: () => void } = {};
    let pauses = 0;
    let drawsWhenCanceled = -1;
    const environment = {
      threads: null,
      pause: async () => {
        pauses++;
        if (pauses === 3) {
          invocation.onCanceled!(); // the host cancels while the third pause lets it run
          drawsWhenCanceled = draws.count();
        }
      },
    };
    const args = [strengthsOf("censored-n100-large-scale"), flagsOf("censored-n100-large-scale"), null, null];
    const result = await cancelable.runCancelable("MODULUSBOUNDS", args, invocation, environment);
    expect(result).toBe(sliced.CANCELED);
    expect(drawsWhenCanceled).toBeGreaterThan(0); // two slices ran
    expect(draws.count()).toBe(drawsWhenCanceled);
    expect(pauses).toBe(3);

    // Canceled as soon as it is called: not one draw.
    const before = draws.count();
    const early: { onCanceled?: () => void } = {};
    const start = cancelable.runCancelable("LOTCHECK", [complete(20, 3), complete(30, 3), null], early, { threads: null, pause: async () => {} });
    early.onCanceled!();
    expect(await start).toBe(sliced.CANCELED);
    expect(draws.count()).toBe(before);
    draws.restore();
  });
});

/** A worker stand-in: runs the guarded adapter when the test says so (`reply`), records termination. */
class FakeThread {
  onmessage: ((event: { data: any }) => void) | null = null;
  onerror: ((event: unknown) => void) | null = null;
  received: { name: string; args: unknown[] }[] = [];
  terminated = false;
  constructor(private readonly run: Record<string, (...args: any[]) => unknown>) {}
  postMessage(message: { name: string; args: unknown[] }) {
    this.received.push(structuredClone(message)); // what a real worker gets: a copy
  }
  reply() {
    const { name, args } = this.received[this.received.length - 1];
    this.onmessage!({ data: structuredClone({ result: this.run[name](...args) }) });
  }
  terminate() {
    this.terminated = true;
  }
}

/** A pool of one stand-in thread at a time, in a fresh module graph; `started` lists the threads it started. */
function poolOfOne(registry: Modules["registry"], t: Modules["threads"]) {
  const started: FakeThread[] = [];
  const pool = new t.SimulationThreads(() => {
    const thread = new FakeThread(registry.guarded);
    started.push(thread);
    return thread;
  }, 1);
  return { started, environment: { threads: pool, pause: async () => {} } };
}

type Modules = Awaited<ReturnType<typeof freshModules>>;

describe("on worker threads (the shared runtime)", () => {
  it("resolves to the synchronous adapter's value; a queued invocation waits for a free thread", async () => {
    const { registry, cancelable, threads: t } = await freshModules();
    const { started, environment } = poolOfOne(registry, t);
    const first = cancelable.runCancelable("FIT", CASES.FIT(), {}, environment);
    const second = cancelable.runCancelable("LOTCHECK", CASES.LOTCHECK(), {}, environment);
    await Promise.resolve();
    expect(started).toHaveLength(1);
    expect(started[0].received.map((m) => m.name)).toEqual(["FIT"]);
    started[0].reply();
    expect(await first).toEqual(guarded.FIT(...CASES.FIT()));
    expect(started[0].received.map((m) => m.name)).toEqual(["FIT", "LOTCHECK"]); // the same thread, reused
    started[0].reply();
    expect(await second).toEqual(guarded.LOTCHECK(...CASES.LOTCHECK()));
  });

  it("canceling terminates the running thread and drops a queued invocation unsent", async () => {
    const { registry, cancelable, sliced, threads: t } = await freshModules();
    const { started, environment } = poolOfOne(registry, t);
    const running: { onCanceled?: () => void } = {};
    const queued: { onCanceled?: () => void } = {};
    const a = cancelable.runCancelable("MODULUS", CASES.MODULUS(), running, environment);
    const b = cancelable.runCancelable("FIT", CASES.FIT(), queued, environment);
    const c = cancelable.runCancelable("LOTCHECK", CASES.LOTCHECK(), {}, environment);
    queued.onCanceled!();
    expect(await b).toBe(sliced.CANCELED);
    running.onCanceled!();
    expect(await a).toBe(sliced.CANCELED);
    expect(started[0].terminated).toBe(true);
    expect(started[0].received.map((m) => m.name)).toEqual(["MODULUS"]);
    // The next invocation gets a new thread; the canceled FIT was never sent to any.
    expect(started).toHaveLength(2);
    expect(started[1].received.map((m) => m.name)).toEqual(["LOTCHECK"]);
    started[1].reply();
    expect(await c).toEqual(guarded.LOTCHECK(...CASES.LOTCHECK()));
  });

  it("a worker that cannot start (file not deployed) leaves the invocation to the slices, with the same value", async () => {
    const { cancelable, threads: t } = await freshModules();
    const pool = new t.SimulationThreads(() => {
      throw new Error("simulation-worker.js: 404");
    }, 2);
    let pauses = 0;
    const value = await cancelable.runCancelable("CHARSTRENGTHBOUNDS", CASES.CHARSTRENGTHBOUNDS(), {}, { threads: pool, pause: async () => void pauses++ });
    expect(value).toEqual(guarded.CHARSTRENGTHBOUNDS(...CASES.CHARSTRENGTHBOUNDS()));
    expect(pauses).toBeGreaterThan(0);
    expect(pool.available).toBe(false);
  });

  it("a worker that fails after starting does the same", async () => {
    const { cancelable, threads: t } = await freshModules();
    const thread = new FakeThread({});
    const pool = new t.SimulationThreads(() => thread, 1);
    const pending = cancelable.runCancelable("DESIGNSTRESSBOUND", CASES.DESIGNSTRESSBOUND(), {}, { threads: pool, pause: async () => {} });
    await Promise.resolve();
    thread.onerror!({ message: "script error" });
    expect(await pending).toBe(guarded.DESIGNSTRESSBOUND(...CASES.DESIGNSTRESSBOUND()));
    expect(thread.terminated).toBe(true);
  });
});
