// The logic of the benchmark harness (bench/measure.ts, bench/report.ts): who takes which turn, which
// turns count, how medians, spreads and round ratios are formed, and when two results agree.
// No timing is measured or asserted: the contenders report made-up durations.
import { describe, expect, it } from "vitest";
import { alternate, lasting, roundRatios, summarize, type Contender } from "../bench/measure";
import { differencesFromNumber, digitLoopFloor, parseTableNumbers } from "../bench/number-parsing";
import { agreement, describeAgreement, markdownTable, type BenchRecord, type SoloRow } from "../bench/report";

/** A contender that logs its turns and reports the durations it is given, one per turn. */
function scripted(name: string, durations: number[], log: string[]): Contender<number> {
  let turn = 0;
  return {
    name,
    turn: async () => {
      log.push(name);
      const seconds = durations[turn];
      turn++;
      return { seconds, result: turn };
    },
  };
}

describe("alternate", () => {
  it("takes turns ours, peer, ours, peer, with the same warm-up on both sides", async () => {
    const log: string[] = [];
    await alternate([scripted("ours", [9, 1, 2, 3], log), scripted("peer", [8, 4, 5, 6], log)], 3, 1);
    expect(log).toEqual(["ours", "peer", "ours", "peer", "ours", "peer", "ours", "peer"]);
  });

  it("leaves the warm-up turns out of the figures and keeps the last result", async () => {
    const log: string[] = [];
    const [ours, peer] = await alternate([scripted("ours", [100, 200, 1, 3, 2], log), scripted("peer", [100, 200, 4, 6, 5], log)], 3, 2);
    expect(ours.times).toEqual([1, 3, 2]);
    expect(ours).toMatchObject({ name: "ours", seconds: 2, fastest: 1, slowest: 3, result: 5 });
    expect(peer).toMatchObject({ name: "peer", seconds: 5, fastest: 4, slowest: 6, result: 5 });
  });

  it("refuses zero rounds", async () => {
    await expect(alternate([scripted("ours", [1], [])], 0)).rejects.toThrow(/at least one/);
  });
});

describe("lasting", () => {
  it("makes the first (warm-up) turn with the given calls, then enough calls to fill the turn length", async () => {
    const asked: number[] = [];
    // A side that reports 10 ms a call in the warm-up, then 2 ms: turns of 0.1 s need 10 calls, then 50.
    const perCall = [0.01, 0.002, 0.002, 0.002];
    const side = lasting("peer", 0.1, 7, async (calls) => {
      asked.push(calls);
      return { seconds: perCall[asked.length - 1], result: calls };
    });
    expect(side.calls?.()).toBe(0);
    for (let i = 0; i < 4; i++) await side.turn();
    expect(asked).toEqual([7, 10, 50, 50]);
    expect(side.calls?.()).toBe(50);
  });
  it("makes at least one call when a single call outlasts the turn", async () => {
    const asked: number[] = [];
    const side = lasting("ours", 0.1, 1, async (calls) => {
      asked.push(calls);
      return { seconds: 0.4, result: 0 };
    });
    await side.turn();
    await side.turn();
    expect(asked).toEqual([1, 1]);
  });
});

describe("summarize", () => {
  // Median convention as numpy.median (from memory): the middle value, or the mean of the two middle values.
  it("takes the middle value of an odd count", () => {
    expect(summarize([5, 1, 3])).toEqual({ seconds: 3, fastest: 1, slowest: 5, times: [5, 1, 3] });
  });
  it("averages the two middle values of an even count", () => {
    expect(summarize([4, 1, 3, 2]).seconds).toBe(2.5);
  });
  it("refuses an empty list", () => {
    expect(() => summarize([])).toThrow();
  });
});

describe("roundRatios", () => {
  it("divides the peer's time by ours round by round", () => {
    expect(roundRatios([2, 9, 4], [1, 3, 1])).toEqual({ lowest: 2, median: 3, highest: 4 });
  });
  it("needs the same number of rounds on both sides", () => {
    expect(() => roundRatios([1, 2], [1])).toThrow();
  });
});

describe("agreement", () => {
  it("agrees within the tolerance and reports the largest relative difference", () => {
    // 1 + 2^-40 is exact in double precision: the relative difference is 2^-40 = 9.1e-13 to 12 digits.
    const a = agreement([[1, 1 + 2 ** -40], [400, 400]], 1e-9, "m and s_theta");
    expect(a.ok).toBe(true);
    expect(Math.abs(a.largest! / 2 ** -40 - 1)).toBeLessThan(1e-11);
    expect(describeAgreement(a)).toMatch(/^agrees: m and s_theta \(2 values\) differ by at most 9\.1e-13/);
  });
  it("flags a difference above the tolerance", () => {
    const a = agreement([[10, 10.001]], 1e-9, "m");
    expect(a.ok).toBe(false);
    expect(describeAgreement(a)).toMatch(/^DISAGREES/);
  });
  it("flags NaN on either side, even after values that agree", () => {
    expect(agreement([[1, 1], [NaN, 2], [3, 3]], 1e-9, "m").ok).toBe(false);
    expect(agreement([[1, NaN]], 1e-9, "m").ok).toBe(false);
  });
  it("does not call an empty comparison an agreement", () => {
    expect(agreement([], 1e-9, "nothing").ok).toBe(false);
  });
});

describe("number parsing alone (bench/number-parsing.ts)", () => {
  const text = (s: string) => [new TextEncoder().encode(s)];
  // Expected values: Number() of each field's text (ECMAScript 2024, 7.1.4.1.1, correctly rounded).
  it("parses every field of every line, header skipped, the same doubles as Number()", () => {
    const chunks = [
      ...text("elem,s1,s2,s3,ivol\n"),
      ...text("1,0.48064554417143296,-5.250728422979521e-12,17,1e-200\n2,0.1,0.2,0.30000000000000004,123456789012345678\n"),
    ];
    const out = new Float64Array(10);
    expect(parseTableNumbers(chunks, out)).toBe(10);
    const expected = "1 0.48064554417143296 -5.250728422979521e-12 17 1e-200 2 0.1 0.2 0.30000000000000004 123456789012345678".split(" ").map(Number);
    expect(Array.from(out)).toEqual(expected);
    expect(differencesFromNumber(chunks, out, 10)).toBe(0);
  });
  it("counts a value that differs from Number() of its text", () => {
    const chunks = text("1,2.5\n");
    const out = new Float64Array([1, 2.5000000000000004]);
    expect(differencesFromNumber(chunks, out, 2)).toBe(1);
    expect(() => differencesFromNumber(chunks, out, 3)).toThrow(/3 values parsed, 2 fields/);
  });
  it("refuses a field the fast parser leaves to the general path (the figure would not be the fast parser's)", () => {
    expect(() => parseTableNumbers(text('1,"2.5"\n'), new Float64Array(2))).toThrow(/field 2 left to the general path/);
    expect(() => parseTableNumbers(text("1,1234567890123456789012\n"), new Float64Array(2))).toThrow(/general path/);
    expect(() => parseTableNumbers(text("1,1e-300\n"), new Float64Array(2))).toThrow(/general path/);
  });
  it("the yardstick loop reads every byte of every line after the header (its checksum depends on each digit)", () => {
    // Hand-worked: line 1's digit runs 12 | 5 | 25 sum to 42, line 2's 7 | 0 | 5 to 12; 42 xor 12 = 38.
    expect(digitLoopFloor(text("a,b\n12,5.25\n7,0.5\n"))).toBe(38);
    expect(digitLoopFloor(text("12,5.25\n7,0.6\n"))).not.toBe(38);
  });
});

describe("markdownTable", () => {
  const record = (solo: SoloRow[]): BenchRecord => ({
    date: "2026-01-01T00:00:00.000Z",
    machine: { cpuModel: "cpu", cpus: 2, memoryGB: 8, platform: "linux x64", node: "20", loadAtStart: [0, 0, 0], peers: null },
    options: { only: [], quick: false, rounds: { short: 3, long: 2 }, warmUps: 1 },
    paired: [],
    solo,
    accuracy: [],
    notes: [],
    seconds: 1,
  });
  it("lists project-only rows that carry an absolute goal, met or not, and no others", () => {
    const table = markdownTable(
      record([
        { task: "parse A", note: "", goal: { text: ">= 300 MB/s", figure: "329 MB/s", met: true } },
        { task: "parse B", note: "", goal: { text: ">= 300 MB/s", figure: "202 MB/s", met: false } },
        { task: "no goal", note: "" },
      ]),
    );
    expect(table).toContain("| parse A | 329 MB/s | >= 300 MB/s met |");
    expect(table).toContain("| parse B | 202 MB/s | >= 300 MB/s not met |");
    expect(table).not.toContain("no goal");
  });
  it("adds no goal section when no row has a goal", () => {
    expect(markdownTable(record([{ task: "x", note: "" }]))).not.toContain("absolute");
  });
});
