// Censored-sample bounds hold their confidence when the censoring comes from a competing flaw population:
// seeded samples with the truth known by construction (tools/censored-coverage.ts), the bounds computed as
// the cells compute them. The committed record test/fixtures/censored_coverage.json (tools/
// simulate_censored_coverage.ts, 1000 samples per case, n = 15, 30, 60 with 20-40 % censored) carries the
// precise measurement; the suite runs fewer samples per case to stay within a few minutes, so its tolerance
// is 3 binomial standard errors *for that count* (stated beside each case), about 4-5 points here.
import { describe, expect, it } from "vitest";
import { measureCoverage } from "../tools/censored-coverage";

// source: the nominal confidence levels (90 % two-sided, 95 % one-sided) define the target; binomial SEs.
const cases = [
  { specimens: 15, censoredFraction: 0.3, otherShape: 10, samples: 400, seed: 515 },
  { specimens: 30, censoredFraction: 0.2, otherShape: 10, samples: 200, seed: 530 },
  { specimens: 30, censoredFraction: 0.4, otherShape: 10, samples: 200, seed: 531 },
];

describe("coverage of censored-sample bounds (competing flaw populations, equal moduli)", () => {
  for (const c of cases) {
    it(`n ${c.specimens}, ${100 * c.censoredFraction} % censored: 90 % intervals and the 95 % design-stress bound within 3 SE (${c.samples} samples)`, () => {
      const r = measureCoverage(c);
      expect(r.refused).toBe(0);
      const se90 = Math.sqrt((0.9 * 0.1) / c.samples); // 400 samples: 0.015; 200: 0.021
      const se95 = Math.sqrt((0.95 * 0.05) / c.samples); // 400: 0.011; 200: 0.015
      expect(Math.abs(r.modulus.coverage - 0.9), "modulus").toBeLessThan(3 * se90);
      expect(Math.abs(r.charStrength.coverage - 0.9), "characteristic strength").toBeLessThan(3 * se90);
      expect(Math.abs(r.designStress.coverage - 0.95), "design stress").toBeLessThan(3 * se95);
      // The realised censoring is what was asked for (binomial, 3 SE of the mean fraction).
      expect(Math.abs(r.meanCensoredFraction - c.censoredFraction)).toBeLessThan(0.05);
    }, 600_000);
  }
});
