// The logic of the benchmark harness (bench/measure.ts, bench/report.ts): who takes which turn, which
// turns count, how medians, spreads and round ratios are formed, and when two results agree.
// No timing is measured or asserted: the contenders report made-up durations.
import { describe, expect, it } from "vitest";
import { alternate, lasting, roundRatios, summarize, type Contender } from "../bench/measure";
import { agreement, describeAgreement } from "../bench/report";

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
