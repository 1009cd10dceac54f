// The planning panel's answer without a page: the number of specimens and the table it shows equal
// the core's (src/design/specimens-needed.ts, itself checked against the seeded pivot simulation in
// specimens-needed.test.ts), and the sentence carries both numbers and the cautions.
import { describe, expect, it } from "vitest";
import { boundRatio, specimensNeeded } from "../src/design/specimens-needed";
import { InputError } from "../src/errors";
import { planningAnswer } from "../taskpane/steps/planning";
import { fixture } from "./helpers";

const planning = fixture("specimens_needed.json");

describe("planningAnswer", () => {
  const request = { targetRatio: 0.8, shape: 10, survival: 0.999, sizeRatio: 1, confidence: 0.95 };

  it("shows the core's number of specimens and ratio, and a table that includes that number", () => {
    const answer = planningAnswer(request);
    const core = specimensNeeded(request);
    expect(answer.headline).toContain(`${core.specimens} specimens`);
    expect(answer.headline).toContain(`${(100 * core.ratio).toFixed(1)} %`);
    const row = answer.rows.find((r) => r.specimens === core.specimens);
    expect(row?.ratio).toBe(core.ratio);
    for (const r of answer.rows) expect(r.ratio).toBe(boundRatio({ ...request, specimens: r.specimens }));
    expect(answer.notes.join(" ")).toMatch(/licensed engineer/);
  });

  it("the table's ratio at 30 specimens matches the seeded pivot simulation (specimens_needed.json)", () => {
    const c = planning.cases.find((x: any) => x.specimens === 30 && x.survival === 0.999);
    const answer = planningAnswer({ ...request, targetRatio: 0.5 });
    const row = answer.rows.find((r) => r.specimens === 30)!;
    expect(Math.abs(Math.log(row.ratio) - Math.log(c.ratioAtModulus10))).toBeLessThan((5 * c.standardError) / 10);
  });

  it("says so when no sample size reaches the target", () => {
    expect(planningAnswer({ ...request, targetRatio: 0.999, shape: 5, survival: 0.999999 }).headline).toMatch(/^Even 10000 specimens/);
  });

  it("passes the core's refusal through (the panel shows its message)", () => {
    expect(() => planningAnswer({ ...request, confidence: 0.2 })).toThrow(InputError);
  });
});
