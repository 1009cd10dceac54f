// The pane's "One material across specimen geometries?" panel (taskpane/steps/material-fit-panel.ts, the
// pure part): the pasted lines grouped by configuration and handed to the core's pooled fit, whose numbers
// are checked against a 40-digit mpmath maximisation in test/material-fit.test.ts. Here: the panel shows
// exactly the core's fit for the invented example (examples/material-fit-and-planning.csv, bars and
// ring-on-ring disks), and a failed size-effect check becomes a caution (the checks' wording is the
// core's, material-fit-caution.ts).
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { fitMaterial } from "../src/design/material-fit";
import { parseConfiguration, sizeLaw } from "../src/design/specimen-geometry";
import { materialFitAnswer } from "../taskpane/steps/material-fit-panel";

const example = readFileSync("examples/material-fit-and-planning.csv", "utf8")
  .split("\n")
  .slice(1)
  .map((line) => line.split(","))
  .filter((f) => f[0] !== "" && f[0] !== undefined)
  .map((f) => ({ strength: Number(f[0]), configuration: f[1] }));

const text = (scaleDisks = 1) =>
  ["Strength\tConfiguration", ...example.map((e) => `${e.configuration.startsWith("RING") ? e.strength * scaleDisks : e.strength}\t${e.configuration}`)].join("\n");

describe("the pooled-fit panel", () => {
  it("shows the core's pooled modulus and material scale for the invented bars and disks", () => {
    const answer = materialFitAnswer({ text: text(), flaws: "volume", poisson: 0.22, decimalComma: false });
    const groups = ["C1161-B-4PT", "RING 10/20 25x1"].map((c) => ({
      label: c,
      law: sizeLaw({ geometry: parseConfiguration(c), flaws: "volume", poisson: 0.22, criterion: "PIA" }),
      strengths: example.filter((e) => e.configuration === c).map((e) => e.strength),
    }));
    const fit = fitMaterial({ groups });
    expect(answer.rows[0].value.startsWith(String(Number(fit.shape.toPrecision(4))))).toBe(true);
    expect(answer.rows[1].value.startsWith(String(Number(fit.materialScale.toPrecision(4))))).toBe(true);
    expect(answer.headline).toMatch(/^27 specimens in 2 configurations/);
  });

  it("says CAUTION when the disks are far stronger than the size effect allows", () => {
    const answer = materialFitAnswer({ text: text(1.6), flaws: "volume", poisson: 0.22, decimalComma: false });
    expect(answer.caution).toBe(true);
    expect(answer.checks).toMatch(/the size effect fails .*size scaling is not to be trusted for the part/);
  });

  // The case properties-cells found for the cell (see test/material-cells.test.ts): the fit exists, the simulated
  // bounds do not; the panel shows the fit and says why the checks were not run instead of failing outright.
  it("shows the fit and a caution when simulated bounds do not exist (a modulus near the end of the covered range)", () => {
    const edge = JSON.parse(readFileSync("test/fixtures/hostile/material-modulus-at-range-edge.json", "utf8"));
    const lines = edge.strengths.map((s: number, k: number) => `${s}\t${edge.configurations[k]}`);
    const answer = materialFitAnswer({ text: lines.join("\n"), flaws: "volume", poisson: edge.poisson, decimalComma: false });
    expect(answer.caution).toBe(true);
    expect(answer.checks).toMatch(/^CAUTION: the one-modulus and size-effect checks were not run \(only \d+ of 2000/);
    expect(answer.rows[0].value).toMatch(/^1\d\d(\.\d+)? \(bounds not available: /);
  }, 60_000);

  it("needs two configurations, and names a bad line", () => {
    expect(() => materialFitAnswer({ text: "412\tC1161-B-4PT\n398\tC1161-B-4PT\n", flaws: "volume", decimalComma: false })).toThrow(/at least two configurations/);
    expect(() => materialFitAnswer({ text: "412\tC1161-B-4PT\nabc\tC1161-B-4PT\n", flaws: "volume", decimalComma: false })).toThrow(/line 2: "abc" is not a strength/);
  });
});
