// The checks the property tests assert, as plain functions returning the
// problems they find, so the harness test can show them failing on a broken
// adapter. Counters record how many cases each check ran.
import type { FunctionMetadata } from "../functions/metadata";
import type { PolicyCase } from "./properties-arbitraries";
import { describeInputs, evaluateCalls, hostViolations, safetyViolations, type Arg, type Call, type Shown } from "./properties-workbook";

export interface Counts {
  calls: number;
  strict: number; // single faults checked against the exact promised error
  loose: number; // single faults on a baseline that itself errs: only "still an error" is checked
  baselineValues: number; // documented examples (with generated ranges) that gave a value
  lastBaselineError: string;
}

export const newCounts = (): Counts => ({ calls: 0, strict: 0, loose: 0, baselineValues: 0, lastBaselineError: "" });

export function addCounts(into: Counts, from: Counts): void {
  into.calls += from.calls;
  into.strict += from.strict;
  into.loose += from.loose;
  into.baselineValues += from.baselineValues;
}

export function checkChaos(calls: Call[], metadata: FunctionMetadata[], counts: Counts): string[] {
  counts.calls += calls.length;
  return safetyViolations(evaluateCalls(calls, metadata), metadata);
}

/** What a spreadsheet host would pass for an argument: ranges as 2-D arrays, blanks and omitted arguments as null. */
export function hostValue(arg: Arg): unknown {
  const plain = (v: unknown) => (typeof v === "string" && v.startsWith("=") ? null : v);
  switch (arg.kind) {
    case "omit":
    case "empty":
      return null;
    case "cell":
      return plain(arg.value);
    case "range":
      return arg.cells.map((row) => row.map(plain));
    case "literal": {
      if (/^TRUE\(\)$/i.test(arg.text)) return true;
      if (/^FALSE\(\)$/i.test(arg.text)) return false;
      if (arg.text.startsWith('"')) return JSON.parse(arg.text) as string;
      return Number(arg.text);
    }
  }
}

export function checkHost(call: Call, fn: FunctionMetadata, adapter: (...args: unknown[]) => unknown, counts: Counts): string[] {
  counts.calls++;
  let result: unknown;
  try {
    result = adapter(...call.args.map(hostValue));
  } catch (error) {
    return [`the guarded adapter threw ${String(error)}: ${call.id}(${describeInputs(call)})`];
  }
  return hostViolations(result, fn).map((p) => `${p}: ${call.id}(${describeInputs(call)})`);
}

const sameCells = (a: Shown[][], b: Shown[][]) => JSON.stringify(a) === JSON.stringify(b);

export function checkPolicy(pc: PolicyCase, metadata: FunctionMetadata[], counts: Counts): string[] {
  const calls = [pc.baseline, ...pc.faults.map((f) => f.call)];
  counts.calls += calls.length;
  const evaluated = evaluateCalls(calls, metadata);
  const problems = safetyViolations(evaluated, metadata);
  if (evaluated.crash) return problems;
  const base = evaluated.outcomes[0];
  if (base.error) counts.lastBaselineError = `${base.formula} with ${describeInputs(base.call)} = ${base.error.code} (${base.error.message})`;
  else counts.baselineValues++;
  pc.faults.forEach((fault, i) => {
    const o = evaluated.outcomes[i + 1];
    const where = `${fault.what}: ${o.formula} with ${describeInputs(o.call)} (baseline ${base.formula} = ${JSON.stringify(base.value)})`;
    if ("same" in fault.expect) {
      counts.strict++;
      if (!sameCells(o.cells, base.cells)) problems.push(`expected the baseline's result ${JSON.stringify(base.cells)}, got ${JSON.stringify(o.cells)}: ${where}`);
    } else if (base.error) {
      counts.loose++;
      if (!o.error) problems.push(`expected an error, got ${JSON.stringify(o.value)}: ${where}`);
    } else {
      counts.strict++;
      if (o.error?.code !== fault.expect.code) problems.push(`expected ${fault.expect.code}, got ${JSON.stringify(o.value)} ${o.error?.message ?? ""}: ${where}`);
      else if (fault.expect.message && !fault.expect.message.test(o.error.message)) {
        problems.push(`the message "${o.error.message}" does not match ${fault.expect.message}: ${where}`);
      }
    }
  });
  return problems;
}

/** Throws with the first few problems, which is how fast-check learns a case failed (and shrinks it). */
export function assertNone(problems: string[]): void {
  if (problems.length) throw new Error(`${problems.length} problem(s):\n${problems.slice(0, 4).join("\n")}`);
}
