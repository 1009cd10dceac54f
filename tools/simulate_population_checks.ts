/**
 * Size and power of the single-population checks, measured by seeded
 * simulation with the truth known by construction, and written to
 * test/fixtures/population_checks_power.json (committed).
 *
 *   nice node bin/run-ts.js tools/simulate_population_checks.ts [samples]
 *
 * Under one population (m 10, th 300; the checks are free of m and th) the
 * share of samples flagged at the 5 % level is the size; under a 50/50
 * mixture of two populations of the same modulus (m 10, th 300 and 450) it
 * is the power against that alternative, for the mixture check
 * (mixture-check.ts), the plot-bend check (bilinear-check.ts) and the
 * Anderson-Darling OSL (anderson-darling.ts), each on the same samples; and
 * under a mixture of different moduli (m 5, th 300 with m 20, th 400, 50/50)
 * for contrast.
 */
import { writeFileSync } from "node:fs";
import { SeededRandom } from "../src/numeric/random";
import { fitQuality } from "../src/weibull/anderson-darling";
import { mixtureCheck, MIXTURE_REPLICATIONS } from "../src/weibull/mixture-check";
import { CHECK_REPLICATIONS, singlePopulationChecks } from "../src/weibull/single-population-checks";

const OUT = "test/fixtures/population_checks_power.json";
const samples = Number(process.argv[2] ?? 2000);
const LEVEL = 0.05;

interface Component {
  share: number;
  shape: number;
  scale: number;
}

const SCENARIOS: { id: string; components: Component[] }[] = [
  { id: "one population (m 10, th 300)", components: [{ share: 1, shape: 10, scale: 300 }] },
  { id: "same modulus: m 10, th 300 and 450, 50/50", components: [{ share: 0.5, shape: 10, scale: 300 }, { share: 0.5, shape: 10, scale: 450 }] },
  { id: "different moduli: m 5, th 300 and m 20, th 400, 50/50", components: [{ share: 0.5, shape: 5, scale: 300 }, { share: 0.5, shape: 20, scale: 400 }] },
];

function draw(random: SeededRandom, n: number, components: Component[]): number[] {
  return Array.from({ length: n }, () => {
    let u = random.uniform();
    let c = components[components.length - 1];
    for (const k of components) {
      if (u < k.share) {
        c = k;
        break;
      }
      u -= k.share;
    }
    return c.scale * Math.pow(random.exponential(), 1 / c.shape);
  });
}

const rate = (hits: number) => ({ flagged: hits / samples, se: Math.sqrt(((hits / samples) * (1 - hits / samples)) / samples) });
const results = [];
for (const specimens of [20, 40, 80]) {
  for (const [k, scenario] of SCENARIOS.entries()) {
    const random = new SeededRandom(7000 + 10 * specimens + k);
    let mixture = 0;
    let bend = 0;
    let osl = 0;
    for (let i = 0; i < samples; i++) {
      const strengths = draw(random, specimens, scenario.components);
      if (mixtureCheck(strengths).pValue <= LEVEL) mixture++;
      const b = singlePopulationChecks({ strengths }).bilinear;
      if (b && b.pValue <= LEVEL) bend++;
      if (fitQuality({ strengths }).osl <= LEVEL) osl++;
    }
    const row = { specimens, scenario: scenario.id, mixtureCheck: rate(mixture), plotBendCheck: rate(bend), andersonDarlingOsl: rate(osl) };
    console.log(JSON.stringify(row));
    results.push(row);
  }
}
writeFileSync(
  OUT,
  JSON.stringify(
    {
      generator: "tools/simulate_population_checks.ts (the project's own TypeScript via node bin/run-ts.js)",
      command: `nice node bin/run-ts.js tools/simulate_population_checks.ts ${samples}`,
      level: LEVEL,
      samplesPerRow: samples,
      referenceReplications: { mixtureCheck: MIXTURE_REPLICATIONS, plotBendCheck: CHECK_REPLICATIONS },
      flagged: "share of samples with p <= 0.05 (OSL <= 0.05 for Anderson-Darling); se binomial",
      rows: results,
    },
    null,
    1,
  ) + "\n",
);
