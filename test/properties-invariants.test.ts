// Invariants every family's functions must keep, checked through the embedded
// engine on random inputs (many checks per engine build). These are exact
// mathematical identities of the weakest-link model, not reference values:
//
// - fits: strengths x k -> characteristic strength (and its bounds, mean,
//   median, design-stress bound) x k, modulus and its bounds unchanged, fit
//   quality unchanged; the order of the specimens does not matter;
// - FAILPROB(DESIGNSTRESS(s)) = 1 - s, also with two flaw populations;
//   SIZESCALE round trips and compositions; DESIGNSTRESS at a size ratio =
//   SIZESCALE of the unit-ratio value; MATERIALSCALE = SIZESCALE to unit size;
//   mean and median conversions invert; monotonicity in stress, size,
//   survival, failure probability and lot size;
// - effective sizes: lengths x k -> volumes x k^3 and areas x k^2; a uniform
//   element table has its total size as effective size; splitting an element
//   changes nothing; stresses x k leave the effective size unchanged; risk
//   shares add up to 1; a part's failure probability equals FAILPROB at its
//   effective size (1-column tables, PIA);
// - time: TIMETOFAILURE inverts LIFETIMESTRESS, PROOFMINLIFE inverts
//   PROOFSTRESSFORLIFE; PROOFBREAKS = FAILPROB; a proof-tested part fails no
//   more often than an untested one; lifetime design stresses do not exceed
//   the inert design stress and fall with the lifetime; a constant load
//   history is its own equivalent; crack-growth fits are unit-equivariant.
//
// Every family's functions must be registered: a renamed or missing function fails, never skips.
import fc from "fast-check";
import { afterAll, describe, it, vi } from "vitest";
import { generateMetadata } from "../functions/metadata";
import { assertNone } from "./properties-policy";
import { evaluateCalls, type Arg, type Call, type Cell, type Shown } from "./properties-workbook";

const { functions: metadata } = await generateMetadata();
const registered = new Set(metadata.map((f) => f.id));
// The functions these invariants call; each must be registered (see the first test).
const EXERCISED = [
  "CHARFROMMEAN",
  "CHARFROMMEDIAN",
  "CHARSTRENGTH",
  "CHARSTRENGTHBOUNDS",
  "COMPETINGDESIGNSTRESS",
  "COMPETINGFAILPROB",
  "DESIGNSTRESS",
  "DESIGNSTRESSBOUND",
  "FAILPROB",
  "FIT",
  "FITQUALITY",
  "FLEXAREA",
  "FLEXVOLUME",
  "LIFEDESIGNSTRESS",
  "LIFETIMESTRESS",
  "LOADHISTORYSTRESS",
  "LOTFAILURES",
  "MATERIALSCALE",
  "MEANSTRENGTH",
  "MODULUS",
  "MODULUSBOUNDS",
  "MODULUSFROMCV",
  "PARTEFFSIZE",
  "PARTFAILPROB",
  "PISTONAREA",
  "PISTONVOLUME",
  "PLOTPOINTS",
  "POSTPROOFFAILPROB",
  "PROOFBREAKS",
  "PROOFMINLIFE",
  "PROOFSTRESSFORLIFE",
  "RINGAREA",
  "RINGVOLUME",
  "RISKSHARE",
  "RODFLEXAREA",
  "RODFLEXVOLUME",
  "SCGFIT",
  "SCGSTATICFIT",
  "SIZESCALE",
  "TIMETOFAILURE",

];
const scale = Number(process.env.FC_SCALE ?? 1);
const seed = process.env.FC_SEED ? { seed: Number(process.env.FC_SEED), path: process.env.FC_PATH } : {};

// ---------------------------------------------------------------------------
// A check is some calls and a verdict on their results; many checks share one engine build.

interface Check {
  calls: Call[];
  verify: (results: Shown[][][]) => string | null;
  what: string;
}

let checksRun = 0;
let callsRun = 0;
afterAll(() => console.log(`properties-invariants: ${checksRun} checks, ${callsRun} calls`));

function runChecks(checks: Check[]): string[] {
  checksRun += checks.length;
  callsRun += checks.reduce((a, c) => a + c.calls.length, 0);
  const evaluated = evaluateCalls(checks.flatMap((c) => c.calls), metadata);
  if (evaluated.crash) return [evaluated.crash];
  const problems: string[] = [];
  let at = 0;
  for (const check of checks) {
    const outcomes = evaluated.outcomes.slice(at, at + check.calls.length);
    at += check.calls.length;
    const verdict = check.verify(outcomes.map((o) => o.cells));
    if (verdict) problems.push(`${check.what}: ${verdict}\n    ${outcomes.map((o) => `${o.formula} = ${JSON.stringify(o.cells.length > 3 ? o.cells.slice(0, 3) : o.cells)}`).join("\n    ")}\n    data ${JSON.stringify(check.calls.map((c) => c.args))}`.slice(0, 2500));
  }
  return problems;
}

/**
 * A fixed number of cases, never a time budget, so the same seed always checks the same cases (the counts
 * are what the former budgets ran on a loaded two-core machine; FC_SCALE=5 runs the earlier maxima).
 */
function property(check: fc.Arbitrary<Check>, perBuild: number, runs: number) {
  fc.assert(
    fc.property(fc.array(check, { minLength: perBuild, maxLength: perBuild }), (checks) => assertNone(runChecks(checks))),
    { numRuns: Math.max(1, Math.round(runs * scale)), ...seed },
  );
}
// Generous, and never a verdict: a slow machine takes longer, it does not fail.
vi.setConfig({ testTimeout: 600_000 });

const num = (x: number): Arg => ({ kind: "cell", value: x });
const word = (w: string): Arg => ({ kind: "literal", text: JSON.stringify(w) });
const omit: Arg = { kind: "omit" };
const column = (xs: Cell[]): Arg => ({ kind: "range", cells: xs.map((x) => [x]) });
const call = (id: string, ...args: Arg[]): Call => ({ id, args });

const top = (cells: Shown[][]): Shown => cells[0][0];
const isNum = (v: Shown): v is number => typeof v === "number";
const show = (v: Shown) => JSON.stringify(v);
const relDiff = (a: number, b: number) => (a === b ? 0 : Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b)));

/** a equals b to a relative tolerance; errors must be the same error. */
function same(a: Shown, b: Shown, tol: number, label = ""): string | null {
  if (isNum(a) && isNum(b)) return relDiff(a, b) <= tol ? null : `${label}${a} vs ${b} (relative difference ${relDiff(a, b).toExponential(2)} > ${tol})`;
  return a === b ? null : `${label}${show(a)} vs ${show(b)}`;
}
/** a <= b allowing rounding at the last bits. */
function notAbove(a: Shown, b: Shown, label = ""): string | null {
  if (!isNum(a) || !isNum(b)) return null;
  return a <= b + 1e-13 * Math.abs(b) ? null : `${label}${a} > ${b}`;
}

// ---------------------------------------------------------------------------
// Plausible inputs

const logU = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true }).map((e) => 10 ** e);
const modulus = fc.double({ min: 0.5, max: 50, noNaN: true });
const charStrength = logU(-1, 4);
const sizeRatio = logU(-3, 3);
const survival = fc.oneof(fc.double({ min: 0.001, max: 0.999, noNaN: true }), logU(-9, -1).map((e) => 1 - e), logU(-9, -1));
const factor = fc.oneof(logU(-6, 6), fc.constantFrom(2, 0.5, 1024));
const unit = fc.double({ min: 1e-9, max: 1 - 1e-9, noNaN: true });

/**
 * Whether the values are distinct by at least `gap` relative to their range: shrinking drives
 * random doubles together, and data equal to the last few bits are a different (degenerate) case.
 */
function wellSpread(xs: number[], gap: number): boolean {
  const sorted = [...xs].sort((a, b) => a - b);
  const range = sorted[sorted.length - 1] - sorted[0];
  if (!(range > 1e-3 * sorted[sorted.length - 1])) return false;
  return sorted.every((x, i) => i === 0 || x - sorted[i - 1] >= gap * range);
}

/** A Weibull sample of n strengths, well spread. */
const sample = (nMin: number, nMax: number) =>
  fc
    .record({ m: fc.double({ min: 2, max: 40, noNaN: true }), c: logU(0, 3.5), us: fc.array(unit, { minLength: nMin, maxLength: nMax }) })
    .map(({ m, c, us }) => us.map((u) => c * (-Math.log(u)) ** (1 / m)))
    .filter((xs) => wellSpread(xs, 1e-6));

// ---------------------------------------------------------------------------
// Strength data and design with the fit

const FIT_METHODS = ["MLE", "MLE-RAW", "LSQ", "LSQ-MEANRANK", "LSQ-MEDIANRANK"];

describe("the functions the invariants exercise", () => {
  it("are all registered (a rename must fail a test, not skip it)", () => {
    const missing = EXERCISED.filter((id) => !registered.has(id));
    if (missing.length) throw new Error(`not registered: ${missing.join(", ")}`);
  });
});

describe("fits", () => {
  it("strengths x k: modulus unchanged, characteristic strength x k; the order of specimens does not matter (every method)", () => {
    const check = fc
      .record({ xs: sample(3, 30), k: factor, method: fc.constantFrom(...FIT_METHODS), censor: fc.oneof({ arbitrary: fc.constant(false), weight: 12 }, { arbitrary: fc.constant(true), weight: 1 }), shift: fc.nat() })
      .map(({ xs, k, method, censor, shift }): Check => {
        // Censor the largest specimen only: the sample keeps all its failures but one.
        const flags = censor ? column(xs.map((x) => x === Math.max(...xs))) : omit;
        const rotate = (a: number[]) => [...a.slice(shift % a.length), ...a.slice(0, shift % a.length)];
        const flagsRotated = censor ? column(rotate(xs).map((x) => x === Math.max(...xs))) : omit;
        const scaled = xs.map((x) => x * k);
        return {
          what: `${method}${censor ? ", censored" : ""}, k = ${k}`,
          calls: [
            call("MODULUS", column(xs), flags, word(method)),
            call("MODULUS", column(scaled), flags, word(method)),
            call("CHARSTRENGTH", column(xs), flags, word(method)),
            call("CHARSTRENGTH", column(scaled), flags, word(method)),
            call("MODULUS", column(rotate(xs)), flagsRotated, word(method)),
            call("CHARSTRENGTH", column(rotate(xs)), flagsRotated, word(method)),
          ],
          // Censored "MLE" moduli are pinned separately (a known fault, below): the rest must hold exactly.
          verify: ([m0, mk, c0, ck, mr, cr]) =>
            (censor && method === "MLE" ? null : same(top(mk), top(m0), 1e-9, "modulus ") ?? same(top(mr), top(m0), 1e-10, "reordered modulus ")) ??
            same(top(ck), isNum(top(c0)) ? (top(c0) as number) * k : top(c0), 1e-9, "characteristic strength ") ??
            same(top(cr), top(c0), 1e-10, "reordered characteristic strength "),
        };
      });
    property(check, 12, 8);
  });

  // Found by the property above: the bootstrap was once seeded by the strengths' bits in row order, so the
  // same specimens in other units or another order gave another modulus. Now drawn in strength order and
  // seeded from rounded strength ratios (src/weibull/censored-bootstrap.ts).
  it("a censored MLE modulus does not depend on the unit or the order of the strengths", () => {
    const xs = [4.552281388155439, 4.547122966411412, 2.662895451710098, 4.12707481153529];
    const flags = [true, false, false, false];
    const checks: Check[] = [
      {
        what: "censored MLE, strengths x 2 and reordered",
        calls: [
          call("MODULUS", column(xs), column(flags)),
          call("MODULUS", column(xs.map((x) => 2 * x)), column(flags)),
          call("MODULUS", column([xs[2], xs[3], xs[0], xs[1]]), column([flags[2], flags[3], flags[0], flags[1]])),
        ],
        verify: ([a, b, c]) => same(top(b), top(a), 1e-9, "x 2: ") ?? same(top(c), top(a), 1e-9, "reordered: "),
      },
    ];
    assertNone(runChecks(checks));
  });
});

describe("bounds and fit quality", () => {
  it("strengths x k: bounds on the modulus, A* and OSL unchanged; strength bounds, design-stress bound x k; plot X shifts by ln k", () => {
    const check = fc.record({ xs: sample(5, 25), k: factor, s: survival, r: sizeRatio }).map(({ xs, k, s, r }): Check => {
      const scaled = xs.map((x) => x * k);
      return {
        what: `k = ${k}`,
        calls: [
          call("MODULUSBOUNDS", column(xs)),
          call("MODULUSBOUNDS", column(scaled)),
          call("CHARSTRENGTHBOUNDS", column(xs)),
          call("CHARSTRENGTHBOUNDS", column(scaled)),
          call("FITQUALITY", column(xs)),
          call("FITQUALITY", column(scaled)),
          call("DESIGNSTRESSBOUND", num(s), column(xs), omit, omit, num(r)),
          call("DESIGNSTRESSBOUND", num(s), column(scaled), omit, omit, num(r)),
          call("PLOTPOINTS", column(xs)),
          call("PLOTPOINTS", column(scaled)),
        ],
        verify: ([mb0, mbk, cb0, cbk, q0, qk, d0, dk, p0, pk]) => {
          const times = (v: Shown) => (isNum(v) ? v * k : v);
          for (let j = 0; j < 2; j++) {
            // Labelled blocks: row j holds (label, value).
            const problem =
              same(mbk[j][1], mb0[j][1], 1e-9, "modulus bound ") ??
              same(cbk[j][1], times(cb0[j][1]), 1e-9, "strength bound ") ??
              same(qk[j][1], q0[j][1], 1e-7, "fit quality ");
            if (problem) return problem;
          }
          const d = same(top(dk), times(top(d0)), 1e-9, "design-stress bound ");
          if (d) return d;
          // Row 0 is the header; P (third column) is free of the unit like Y.
          for (let i = 1; i < p0.length; i++) {
            const x0 = p0[i][0];
            const x = same(pk[i][0], isNum(x0) ? x0 + Math.log(k) : x0, 1e-9, `plot X row ${i + 1} `);
            const y = same(pk[i][1], p0[i][1], 1e-12, `plot Y row ${i + 1} `);
            const p = same(pk[i][2], p0[i][2], 1e-15, `plot P row ${i + 1} `);
            if (x || y || p) return x ?? y ?? p;
          }
          return null;
        },
      };
    });
    property(check, 8, 6);
  });

  it("FIT: strength rows x k, every other row unchanged, when the strengths are scaled", () => {
    const check = fc.record({ xs: sample(5, 25), k: factor, method: fc.constantFrom(...FIT_METHODS) }).map(({ xs, k, method }): Check => ({
      what: `FIT ${method}, k = ${k}`,
      calls: [call("FIT", column(xs), omit, omit, word(method)), call("FIT", column(xs.map((x) => x * k)), omit, omit, word(method))],
      verify: ([a, b]) => {
        for (let i = 0; i < a.length; i++) {
          const label = String(a[i][0]);
          if (b[i][0] !== a[i][0]) return `row ${i + 1} label ${show(b[i][0])} vs ${show(a[i][0])}`;
          const [va, vb] = [a[i][1], b[i][1]];
          const strengthRow = /strength|standard deviation/i.test(label);
          const want = strengthRow && isNum(va) ? va * k : va;
          // Simulated p-values move by one replication when the observed statistic's last bits change with the
          // unit; the verdict quotes them, so it can change at a threshold (reported): compare both loosely.
          if (/, p$/.test(label) && isNum(va) && isNum(vb)) {
            if (Math.abs(va - vb) > 1e-3) return `"${label}": ${vb} vs ${va}`;
            continue;
          }
          if (label === "verdict") continue;
          const problem = same(vb, want, strengthRow || /modulus/.test(label) ? 1e-9 : 1e-7, `"${label}": `);
          if (problem) return problem;
        }
        return null;
      },
    }));
    property(check, 6, 4);
  });
});

describe("design with the fit", () => {
  it("FAILPROB(DESIGNSTRESS(s)) = 1 - s, from s = 1e-9 to 1 - 1e-9", () => {
    const check = fc.record({ s: survival, m: modulus, c: charStrength, r: sizeRatio }).map(({ s, m, c, r }): Check => ({
      what: `s = ${s}, m = ${m}, c = ${c}, r = ${r}`,
      // FAILPROB reads the stress from the DESIGNSTRESS cell, as a user would chain them.
      calls: [call("DESIGNSTRESS", num(s), num(m), num(c), num(r)), call("FAILPROB", { kind: "literal", text: "Calls!A1" }, num(m), num(c), num(r))],
      verify: ([d, p]) => (isNum(top(d)) ? same(top(p), 1 - s, 1e-12, "failure probability ") : null),
    }));
    // One check per build: the second call reads the first by its address.
    property(check, 1, 30);
  });

  it("monotone: FAILPROB rises with stress and size, DESIGNSTRESS falls with survival and size", () => {
    const check = fc
      .record({ s1: survival, s2: survival, m: modulus, c: charStrength, r1: sizeRatio, r2: sizeRatio, x1: logU(-2, 4), x2: logU(-2, 4) })
      .map(({ s1, s2, m, c, r1, r2, x1, x2 }): Check => {
        const [sLo, sHi] = s1 <= s2 ? [s1, s2] : [s2, s1];
        const [rLo, rHi] = r1 <= r2 ? [r1, r2] : [r2, r1];
        const [xLo, xHi] = x1 <= x2 ? [x1, x2] : [x2, x1];
        return {
          what: `m = ${m}, c = ${c}`,
          calls: [
            call("FAILPROB", num(xLo), num(m), num(c), num(rLo)),
            call("FAILPROB", num(xHi), num(m), num(c), num(rLo)),
            call("FAILPROB", num(xLo), num(m), num(c), num(rHi)),
            call("DESIGNSTRESS", num(sLo), num(m), num(c), num(rLo)),
            call("DESIGNSTRESS", num(sHi), num(m), num(c), num(rLo)),
            call("DESIGNSTRESS", num(sLo), num(m), num(c), num(rHi)),
          ],
          verify: ([p, pStress, pSize, d, dSurv, dSize]) =>
            notAbove(top(p), top(pStress), "FAILPROB at a higher stress: ") ??
            notAbove(top(p), top(pSize), "FAILPROB at a larger size: ") ??
            notAbove(top(dSurv), top(d), "DESIGNSTRESS at a higher survival: ") ??
            notAbove(top(dSize), top(d), "DESIGNSTRESS at a larger size: "),
        };
      });
    property(check, 25, 12);
  });

  it("SIZESCALE round trips and composes; DESIGNSTRESS at a size ratio and MATERIALSCALE agree with it; mean and median conversions invert", () => {
    const check = fc.record({ x: charStrength, m: modulus, v1: logU(-3, 4), v2: logU(-3, 4), v3: logU(-3, 4), s: survival }).map(({ x, m, v1, v2, v3, s }): Check => ({
      what: `x = ${x}, m = ${m}, sizes ${v1}, ${v2}, ${v3}`,
      calls: [
        call("SIZESCALE", num(x), num(m), num(v1), num(v2)),
        call("SIZESCALE", { kind: "literal", text: "Calls!A1" }, num(m), num(v2), num(v1)),
        call("SIZESCALE", { kind: "literal", text: "Calls!A1" }, num(m), num(v2), num(v3)),
        call("SIZESCALE", num(x), num(m), num(v1), num(v3)),
        call("DESIGNSTRESS", num(s), num(m), num(x), num(v2 / v1)),
        call("DESIGNSTRESS", num(s), num(m), num(x)),
        call("SIZESCALE", { kind: "literal", text: "Calls!F1" }, num(m), num(1), num(v2 / v1)),
        call("MATERIALSCALE", num(x), num(m), num(v1)),
        call("SIZESCALE", num(x), num(m), num(v1), num(1)),
        call("CHARFROMMEAN", { kind: "literal", text: "BRITTLE.MEANSTRENGTH(" + m + ", " + x + ")" }, num(m)),
        call("CHARFROMMEDIAN", { kind: "literal", text: "BRITTLE.DESIGNSTRESS(0.5, " + m + ", " + x + ")" }, num(m)),
      ],
      verify: ([a, back, via, direct, dr, _d1, d1scaled, ms, s1, cm, cmed]) =>
        (isNum(top(a)) ? same(top(back), x, 1e-13, "round trip ") ?? same(top(via), top(direct), 1e-13, "composition ") : null) ??
        same(top(dr), top(d1scaled), 1e-13, "DESIGNSTRESS at a size ratio vs SIZESCALE ") ??
        same(top(ms), top(s1), 1e-14, "MATERIALSCALE vs SIZESCALE to unit size ") ??
        (isNum(top(cm)) ? same(top(cm), x, 1e-13, "CHARFROMMEAN(MEANSTRENGTH) ") : null) ??
        (isNum(top(cmed)) ? same(top(cmed), x, 1e-13, "CHARFROMMEDIAN(median) ") : null),
    }));
    // One check per build: later calls read earlier cells by address.
    property(check, 1, 30);
  });

  it("LOTFAILURES rises with the failure probability, the lot size and the confidence", () => {
    const check = fc
      .record({ p1: logU(-9, -0.01), p2: logU(-9, -0.01), n1: fc.integer({ min: 1, max: 1e9 }), n2: fc.integer({ min: 1, max: 1e9 }), c1: fc.double({ min: 0.01, max: 0.999, noNaN: true }), c2: fc.double({ min: 0.01, max: 0.999, noNaN: true }) })
      .map(({ p1, p2, n1, n2, c1, c2 }): Check => {
        const [pLo, pHi] = [Math.min(p1, p2), Math.max(p1, p2)];
        const [nLo, nHi] = [Math.min(n1, n2), Math.max(n1, n2)];
        const [cLo, cHi] = [Math.min(c1, c2), Math.max(c1, c2)];
        return {
          what: `p ${pLo}..${pHi}, lots ${nLo}..${nHi}, confidence ${cLo}..${cHi}`,
          calls: [
            call("LOTFAILURES", num(pLo), num(nLo), num(cLo)),
            call("LOTFAILURES", num(pHi), num(nLo), num(cLo)),
            call("LOTFAILURES", num(pLo), num(nHi), num(cLo)),
            call("LOTFAILURES", num(pLo), num(nLo), num(cHi)),
            call("LOTFAILURES", num(pLo), num(nLo)),
            call("LOTFAILURES", num(pHi), num(nLo)),
          ],
          verify: ([b, bp, bn, bc, e, ep]) =>
            notAbove(top(b), top(bp), "bound at a higher probability: ") ??
            notAbove(top(b), top(bn), "bound for a larger lot: ") ??
            notAbove(top(b), top(bc), "bound at a higher confidence: ") ??
            notAbove(top(e), top(ep), "expected count at a higher probability: "),
        };
      });
    property(check, 25, 8);
  });

  it("MODULUSFROMCV depends on the coefficient of variation only, and falls as it rises", () => {
    const check = fc.record({ mean: logU(0, 4), cv1: logU(-2.5, 0), cv2: logU(-2.5, 0), k: factor }).map(({ mean, cv1, cv2, k }): Check => {
      const [lo, hi] = [Math.min(cv1, cv2), Math.max(cv1, cv2)];
      return {
        what: `mean ${mean}, cv ${lo}..${hi}, k = ${k}`,
        calls: [call("MODULUSFROMCV", num(mean), num(mean * lo)), call("MODULUSFROMCV", num(mean * k), num(mean * lo * k)), call("MODULUSFROMCV", num(mean), num(mean * hi))],
        verify: ([a, ak, b]) => same(top(ak), top(a), 1e-10, "scaled mean and stdev ") ?? notAbove(top(b), top(a), "modulus at a larger CV: "),
      };
    });
    property(check, 25, 8);
  });

  it("two flaw populations: COMPETINGFAILPROB(COMPETINGDESIGNSTRESS(s)) = 1 - s, and never below either population alone", () => {
    const check = fc.record({ s: survival, mA: modulus, cA: charStrength, mB: modulus, cB: charStrength, rA: sizeRatio, rB: sizeRatio }).map(({ s, mA, cA, mB, cB, rA, rB }): Check => ({
      what: `s = ${s}, A (${mA}, ${cA}, ${rA}), B (${mB}, ${cB}, ${rB})`,
      calls: [
        call("COMPETINGDESIGNSTRESS", num(s), num(mA), num(cA), num(mB), num(cB), num(rA), num(rB)),
        call("COMPETINGFAILPROB", { kind: "literal", text: "Calls!A1" }, num(mA), num(cA), num(mB), num(cB), num(rA), num(rB)),
        call("FAILPROB", { kind: "literal", text: "Calls!A1" }, num(mA), num(cA), num(rA)),
      ],
      verify: ([d, p, pA]) => (isNum(top(d)) ? same(top(p), 1 - s, 1e-11, "failure probability ") ?? notAbove(top(pA), top(p), "population A alone: ") : null),
    }));
    property(check, 1, 20);
  });
});

// ---------------------------------------------------------------------------
// Effective sizes

describe("flexure effective sizes", () => {
  it("lengths x k: volumes x k^3, areas x k^2; a larger modulus gives a smaller effective size", () => {
    const check = fc
      .record({ m: modulus, m2: modulus, L: logU(0, 2), frac: fc.oneof(fc.constant(0), fc.double({ min: 0.05, max: 0.95, noNaN: true })), b: logU(-0.5, 1), d: logU(-0.5, 1), k: logU(-3, 3) })
      .map(({ m, m2, L, frac, b, d, k }): Check => {
        const Li = frac * L;
        const [mLo, mHi] = [Math.min(m, m2), Math.max(m, m2)];
        return {
          what: `m = ${m}, L = ${L}, Li = ${Li}, b = ${b}, d = ${d}, k = ${k}`,
          calls: [
            call("FLEXVOLUME", num(m), num(L), num(Li), num(b), num(d)),
            call("FLEXVOLUME", num(m), num(L * k), num(Li * k), num(b * k), num(d * k)),
            call("FLEXAREA", num(m), num(L), num(Li), num(b), num(d)),
            call("FLEXAREA", num(m), num(L * k), num(Li * k), num(b * k), num(d * k)),
            call("RODFLEXVOLUME", num(m), num(L), num(Li), num(d)),
            call("RODFLEXVOLUME", num(m), num(L * k), num(Li * k), num(d * k)),
            call("RODFLEXAREA", num(m), num(L), num(Li), num(d)),
            call("RODFLEXAREA", num(m), num(L * k), num(Li * k), num(d * k)),
            call("FLEXVOLUME", num(mLo), num(L), num(Li), num(b), num(d)),
            call("FLEXVOLUME", num(mHi), num(L), num(Li), num(b), num(d)),
          ],
          verify: ([v, vk, a, ak, rv, rvk, ra, rak, vLo, vHi]) =>
            same(top(vk), isNum(top(v)) ? (top(v) as number) * k ** 3 : top(v), 1e-12, "bar volume ") ??
            same(top(ak), isNum(top(a)) ? (top(a) as number) * k ** 2 : top(a), 1e-12, "bar area ") ??
            same(top(rvk), isNum(top(rv)) ? (top(rv) as number) * k ** 3 : top(rv), 1e-10, "rod volume ") ??
            same(top(rak), isNum(top(ra)) ? (top(ra) as number) * k ** 2 : top(ra), 1e-10, "rod area ") ??
            notAbove(top(vHi), top(vLo), "volume at a larger modulus: "),
        };
      });
    property(check, 20, 8);
  });
});

describe("disk effective sizes", () => {
  it("lengths x k: areas x k^2, volumes x k^3, under every criterion", () => {
    const check = fc
      .record({
        m: fc.double({ min: 2, max: 40, noNaN: true }),
        D: logU(0.5, 2),
        support: fc.double({ min: 0.3, max: 1, noNaN: true }),
        load: fc.double({ min: 0.1, max: 0.8, noNaN: true }),
        h: fc.double({ min: 0.01, max: 0.1, noNaN: true }),
        nu: fc.double({ min: 0, max: 0.45, noNaN: true }),
        k: logU(-2, 2),
        criterion: fc.constantFrom("PIA", "NSA", "MAXPRINCIPAL"),
      })
      .map(({ m, D, support, load, h, nu, k, criterion }): Check => {
        const DS = support * D;
        const DL = load * DS;
        const t = h * DS;
        const c = word(criterion);
        return {
          what: `m = ${m}, D = ${D}, DS = ${DS}, DL = ${DL}, h = ${t}, nu = ${nu}, ${criterion}, k = ${k}`,
          calls: [
            call("RINGAREA", num(m), num(DL), num(DS), num(D), num(nu), c),
            call("RINGAREA", num(m), num(DL * k), num(DS * k), num(D * k), num(nu), c),
            call("RINGVOLUME", num(m), num(DL), num(DS), num(D), num(t), num(nu), c),
            call("RINGVOLUME", num(m), num(DL * k), num(DS * k), num(D * k), num(t * k), num(nu), c),
            call("PISTONAREA", num(m), num(DL), num(DS), num(D), num(nu), c),
            call("PISTONAREA", num(m), num(DL * k), num(DS * k), num(D * k), num(nu), c),
            call("PISTONVOLUME", num(m), num(DL), num(DS), num(D), num(t), num(nu), c),
            call("PISTONVOLUME", num(m), num(DL * k), num(DS * k), num(D * k), num(t * k), num(nu), c),
          ],
          verify: ([ra, rak, rv, rvk, pa, pak, pv, pvk]) => {
            const scaled = (v: Shown, p: number) => (isNum(v) ? v * k ** p : v);
            return (
              same(top(rak), scaled(top(ra), 2), 1e-9, "ring-on-ring area ") ??
              same(top(rvk), scaled(top(rv), 3), 1e-9, "ring-on-ring volume ") ??
              same(top(pak), scaled(top(pa), 2), 1e-9, "piston area ") ??
              same(top(pvk), scaled(top(pv), 3), 1e-9, "piston volume ")
            );
          },
        };
      });
    property(check, 10, 6);
  });
});

describe("element tables", () => {
  const elements = fc.array(fc.record({ s: logU(0, 3), v: logU(-3, 1) }), { minLength: 1, maxLength: 25 });
  it("stresses x k: effective size unchanged; sizes x k: x k; uniform stress: the total size; an element split in two: no change", () => {
    const check = fc.record({ els: elements, m: modulus, k: factor, criterion: fc.constantFrom("PIA", "NSA", "MAXPRINCIPAL") }).map(({ els, m, k, criterion }): Check => {
      const s = els.map((e) => e.s);
      const v = els.map((e) => e.v);
      const split = [...v.slice(0, -1), v[v.length - 1] / 2, v[v.length - 1] / 2];
      const splitS = [...s, s[s.length - 1]];
      const c = word(criterion);
      return {
        what: `${els.length} elements, m = ${m}, k = ${k}, ${criterion}`,
        calls: [
          call("PARTEFFSIZE", column(s), column(v), num(m), c),
          call("PARTEFFSIZE", column(s.map((x) => x * k)), column(v), num(m), c),
          call("PARTEFFSIZE", column(s), column(v.map((x) => x * k)), num(m), c),
          call("PARTEFFSIZE", column(s.map(() => s[0])), column(v), num(m), c),
          call("PARTEFFSIZE", column(splitS), column(split), num(m), c),
        ],
        verify: ([e, es, ev, eu, esplit]) =>
          same(top(es), top(e), 1e-12, "stresses scaled ") ??
          same(top(ev), isNum(top(e)) ? (top(e) as number) * k : top(e), 1e-12, "sizes scaled ") ??
          same(top(eu), v.reduce((a, b) => a + b, 0), 1e-12, "uniform stress ") ??
          same(top(esplit), top(e), 1e-12, "split element "),
      };
    });
    property(check, 15, 8);
  });

  it("PARTFAILPROB = FAILPROB at the part's effective size (PIA, one stress column); risk shares add up to 1; more stress, more risk", () => {
    const check = fc.record({ els: elements, m: modulus, c: charStrength, vSpec: logU(-1, 2), bump: logU(0, 0.3) }).map(({ els, m, c, vSpec, bump }): Check => {
      const s = els.map((e) => e.s);
      const v = els.map((e) => e.v);
      const peak = Math.max(...s);
      return {
        what: `${els.length} elements, m = ${m}, c = ${c}, specimen size ${vSpec}`,
        calls: [
          call("PARTFAILPROB", column(s), column(v), num(m), { kind: "literal", text: `BRITTLE.MATERIALSCALE(${c}, ${m}, ${vSpec})` }),
          call("FAILPROB", num(peak), num(m), num(c), { kind: "literal", text: `BRITTLE.PARTEFFSIZE(Data!A1:A${s.length}, Data!B1:B${s.length}, ${m}) / ${vSpec}` }),
          call("RISKSHARE", column(s), column(v), num(m)),
          call("PARTFAILPROB", column(s.map((x) => x * bump)), column(v), num(m), { kind: "literal", text: `BRITTLE.MATERIALSCALE(${c}, ${m}, ${vSpec})` }),
        ],
        verify: ([part, single, shares, more]) => {
          const values = shares.map((row) => row[0]).filter(isNum);
          const total = values.reduce((a, b) => a + b, 0);
          return (
            same(top(part), top(single), 1e-11, "part vs FAILPROB at the effective size ") ??
            (values.length === s.length && values.every((x) => x >= 0 && x <= 1) && Math.abs(total - 1) < 1e-12 ? null : `risk shares ${JSON.stringify(values)} sum to ${total}`) ??
            notAbove(top(part), top(more), "higher stresses: ")
          );
        },
      };
    });
    // One check per build: the FAILPROB formula names the first check's ranges (Data!A:B).
    property(check, 1, 24);
  });
});

// ---------------------------------------------------------------------------
// Slow crack growth, lifetime and proof testing

describe("time under load", () => {
  const n = fc.double({ min: 5, max: 80, noNaN: true });
  it("TIMETOFAILURE inverts LIFETIMESTRESS; PROOFMINLIFE inverts PROOFSTRESSFORLIFE; PROOFBREAKS = FAILPROB", () => {
    const check = fc
      .record({ S: charStrength, rate: logU(-2, 3), n, t: logU(0, 9), ss: charStrength, L: logU(0, 9), B: logU(-2, 3), m: modulus, c: charStrength, r: sizeRatio, p: charStrength })
      .map(({ S, rate, n, t, ss, L, B, m, c, r, p }): Check => ({
        what: `S = ${S}, rate = ${rate}, n = ${n}, t = ${t}, service ${ss}, life ${L}, B = ${B}`,
        calls: [
          call("LIFETIMESTRESS", num(S), num(rate), num(n), num(t)),
          call("TIMETOFAILURE", { kind: "literal", text: "Calls!A1" }, num(S), num(rate), num(n)),
          call("PROOFSTRESSFORLIFE", num(ss), num(L), num(n), num(B)),
          call("PROOFMINLIFE", { kind: "literal", text: "Calls!C1" }, num(ss), num(n), num(B)),
          call("PROOFBREAKS", num(p), num(m), num(c), num(r)),
          call("FAILPROB", num(p), num(m), num(c), num(r)),
        ],
        verify: ([ls, ttf, ps, ml, pb, fp]) =>
          (isNum(top(ls)) && isNum(top(ttf)) ? same(top(ttf), t, 1e-9, "time to failure at the lifetime stress ") : null) ??
          (isNum(top(ps)) && isNum(top(ml)) ? same(top(ml), L, 1e-8, "minimum life at the proof stress for that life ") : null) ??
          same(top(pb), top(fp), 1e-15, "PROOFBREAKS vs FAILPROB "),
      }));
    property(check, 1, 30);
  });

  it("a proof-tested part fails no more often than an untested one, never at or below the proof stress; lifetime design stresses fall with time", () => {
    const check = fc
      .record({ x: charStrength, p: charStrength, m: modulus, c: charStrength, r: sizeRatio, s: survival, n, B: logU(-2, 3), t1: logU(0, 9), t2: logU(0, 9) })
      .map(({ x, p, m, c, r, s, n, B, t1, t2 }): Check => {
        const [tLo, tHi] = [Math.min(t1, t2), Math.max(t1, t2)];
        return {
          what: `stress ${x}, proof ${p}, m = ${m}, c = ${c}, r = ${r}, s = ${s}, n = ${n}, B = ${B}, t ${tLo}..${tHi}`,
          calls: [
            call("POSTPROOFFAILPROB", num(x), num(p), num(m), num(c), num(r)),
            call("FAILPROB", num(x), num(m), num(c), num(r)),
            call("POSTPROOFFAILPROB", num(Math.min(x, p)), num(p), num(m), num(c), num(r)),
            call("LIFEDESIGNSTRESS", num(s), num(tLo), num(m), num(c), num(n), num(B), num(r)),
            call("LIFEDESIGNSTRESS", num(s), num(tHi), num(m), num(c), num(n), num(B), num(r)),
            call("DESIGNSTRESS", num(s), num(m), num(c), num(r)),
          ],
          verify: ([post, plain, below, lLo, lHi, inert]) =>
            notAbove(top(post), top(plain), "post-proof vs untested: ") ??
            (top(below) === 0 ? null : `POSTPROOFFAILPROB at or below the proof stress is ${show(top(below))}, not 0`) ??
            notAbove(top(lHi), top(lLo), "lifetime design stress at a longer life: ") ??
            notAbove(top(lLo), top(inert), "lifetime design stress vs the inert design stress: "),
        };
      });
    property(check, 20, 8);
  });

  it("a constant load history is its own equivalent; load history and crack-growth fits follow a change of units", () => {
    const check = fc
      .record({ sigma: charStrength, durations: fc.array(logU(-1, 4), { minLength: 1, maxLength: 10 }), n, k: factor, rates: fc.array(logU(-3, 3), { minLength: 4, maxLength: 20 }).filter((r) => wellSpread(r, 1e-6)), noise: fc.array(fc.double({ min: -0.02, max: 0.02, noNaN: true }), { minLength: 20, maxLength: 20 }) })
      .map(({ sigma, durations, n, k, rates, noise }): Check => {
        const stresses = durations.map((_, i) => sigma * (1 + 0.5 * Math.sin(i)));
        // Strengths that rise with the rate (strength = D rate^(1/(n+1))), with scatter.
        const strengths = rates.map((q, i) => 100 * q ** (1 / (n + 1)) * (1 + noise[i]));
        const lifetimes = strengths.map((x, i) => 1e6 * x ** -n * (1 + noise[(i + 7) % 20]));
        return {
          what: `sigma = ${sigma}, ${durations.length} blocks, n = ${n}, k = ${k}`,
          calls: [
            call("LOADHISTORYSTRESS", column(durations.map(() => sigma)), column(durations), num(n)),
            call("LOADHISTORYSTRESS", column(stresses), column(durations), num(n)),
            call("LOADHISTORYSTRESS", column(stresses.map((x) => x * k)), column(durations), num(n)),
            call("SCGFIT", column(rates), column(strengths)),
            call("SCGFIT", column(rates), column(strengths.map((x) => x * k))),
            call("SCGSTATICFIT", column(strengths), column(lifetimes)),
            call("SCGSTATICFIT", column(strengths), column(lifetimes.map((x) => x * k))),
          ],
          verify: ([constant, h, hk, f, fk, st, stk]) =>
            same(top(constant), sigma, 1e-13, "constant history ") ??
            same(top(hk), isNum(top(h)) ? (top(h) as number) * k : top(h), 1e-12, "history stresses scaled ") ??
            // Labelled blocks: row 0 (label, n), row 1 (label, D or log10 Ds).
            same(fk[0][1], f[0][1], 1e-9, "SCGFIT n ") ??
            same(fk[1][1], isNum(f[1][1]) ? f[1][1] * k : f[1][1], 1e-9, "SCGFIT D ") ??
            same(stk[0][1], st[0][1], 1e-9, "SCGSTATICFIT n ") ??
            (isNum(st[1][1]) && isNum(stk[1][1]) && Math.abs(stk[1][1] - st[1][1] - Math.log10(k)) > 1e-9 * Math.max(1, Math.abs(st[1][1]))
              ? `SCGSTATICFIT log10 Ds ${stk[1][1]} vs ${st[1][1]} + log10 k`
              : null),
        };
      });
    property(check, 15, 6);
  });
});
