/**
 * Measures how often the censored-sample bounds contain the truth, for
 * samples censored by a competing flaw population, and writes the record
 * test/fixtures/censored_coverage.json (committed).
 *
 *   nice node bin/run-ts.js tools/simulate_censored_coverage.ts [samples] [case,case,...]
 *   nice node bin/run-ts.js tools/simulate_censored_coverage.ts merge
 *
 * Default 1000 samples per case; each case has its own seed, so cases can run
 * in separate processes (the second argument lists case indices; each run
 * writes a part file) and `merge` joins the parts into the record. The
 * truth: population A with m 10, th 400; population B as listed; see
 * tools/censored-coverage.ts for the experiment.
 */
import { readdirSync, readFileSync, unlinkSync, writeFileSync } from "node:fs";
import { measureCoverage, TRUE_DESIGN_STRESS, DESIGN, TRUTH, type CoverageCase, type CoverageResult } from "./censored-coverage";
import { censoredReplications } from "../src/weibull/unbiasing";

const OUT = "test/fixtures/censored_coverage.json";

export const CASES: Omit<CoverageCase, "samples">[] = [];
for (const otherShape of [10, 5]) {
  for (const specimens of [15, 30, 60]) {
    for (const censoredFraction of [0.2, 0.3, 0.4]) {
      if (otherShape !== 10 && censoredFraction !== 0.3) continue; // different moduli: the middle fraction only
      CASES.push({ specimens, censoredFraction, otherShape, seed: 1000 * specimens + Math.round(100 * censoredFraction) + otherShape });
    }
  }
}

function record(results: CoverageResult[], samplesPerCase: number): string {
  return (
    JSON.stringify(
      {
        generator: "tools/simulate_censored_coverage.ts (uses the project's own TypeScript via node bin/run-ts.js)",
        command: `nice node bin/run-ts.js tools/simulate_censored_coverage.ts ${samplesPerCase}`,
        truth: { populationA: TRUTH, design: DESIGN, trueDesignStress: TRUE_DESIGN_STRESS },
        experiment:
          "each specimen: a ~ Weibull(10, 400), b ~ Weibull(m_B, th_B); strength min(a, b), censored for A when b < a; th_B set so " +
          "that P(b < a) = censoredFraction. Samples with no censored specimen (they use the exact complete-sample table) or fewer " +
          "than 2 A-failures (no fit) are redrawn. Bounds as the cells compute them: parameterBounds 90 % two-sided, " +
          "designStressBound 95 % one-sided at survival 0.999 and size ratio 10.",
        bootstrapReplications: Object.fromEntries([15, 30, 60].map((n) => [n, censoredReplications(n)])),
        standardError: "binomial, sqrt(C (1 - C) / samples) at the nominal C",
        cases: results,
      },
      null,
      1,
    ) + "\n"
  );
}

if (process.argv[2] === "merge") {
  const parts = readdirSync("test/fixtures").filter((f) => f.startsWith("censored_coverage.part-"));
  const results = parts.flatMap((f) => JSON.parse(readFileSync(`test/fixtures/${f}`, "utf8")) as CoverageResult[]);
  results.sort((a, b) => CASES.findIndex((c) => c.seed === a.seed) - CASES.findIndex((c) => c.seed === b.seed));
  writeFileSync(OUT, record(results, results[0].samples));
  for (const f of parts) unlinkSync(`test/fixtures/${f}`);
} else {
  const samples = Number(process.argv[2] ?? 1000);
  const only = process.argv[3] === undefined ? CASES.map((_, i) => i) : process.argv[3].split(",").map(Number);
  const results: CoverageResult[] = [];
  for (const i of only) {
    const c = CASES[i];
    const started = Date.now();
    const r = measureCoverage({ ...c, samples });
    results.push(r);
    console.log(
      `n ${c.specimens}, ${Math.round(100 * c.censoredFraction)} % censored, m_B ${c.otherShape}: modulus ${r.modulus.coverage.toFixed(3)}, ` +
        `char. strength ${r.charStrength.coverage.toFixed(3)}, design stress ${r.designStress.coverage.toFixed(3)} ` +
        `(se ${r.modulus.se.toFixed(4)} / ${r.designStress.se.toFixed(4)}; ${((Date.now() - started) / 1000).toFixed(0)} s)`,
    );
    writeFileSync(`test/fixtures/censored_coverage.part-${only.join("-")}.json`, JSON.stringify(results));
  }
  if (process.argv[3] === undefined) writeFileSync(OUT, record(results, samples));
}
