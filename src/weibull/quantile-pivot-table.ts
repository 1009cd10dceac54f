/**
 * Quantiles of the pivotal quantity for a Weibull strength quantile, complete
 * samples, from the seeded table tools/simulate_quantile_pivot_table.py writes.
 *
 * For the strength x_p = th exp(w/m) (w = ln(-ln S) - ln k for survival S of a
 * body k times the tested size) and raw maximum-likelihood estimates,
 *
 *   u(w) = m_hat ln(x_p_hat / x_p) = t + w (1 - q)
 *
 * has a distribution that depends on n and w only. The table holds quantiles
 * of v(a) = u(tan a) / sqrt(1 + tan^2 a) on a 5-degree grid of a in
 * [-90, 90] degrees, which stays bounded however small the failure
 * probability (1e6 replications per size up to n = 50, 5e5 above). Between
 * grid angles: Catmull-Rom cubic (the generator measured its error against
 * simulated in-between angles: within 1.3 Monte Carlo standard errors for
 * n >= 3, 4.1 at n = 2 whose tails are extreme); between probabilities:
 * linear in the normal score z_p;
 * between sample sizes: linear in 1/sqrt(n); beyond the largest n:
 * v_p(n, a) = z_p sd(a)/sqrt(n) + D_p(a)/n with the large-sample sd(a) of the
 * smallest-extreme-value law and D_p(a) taken from the last row.
 */
import { ensure } from "../errors";
import { normalQuantile } from "../numeric/normal";
import data from "./tables/quantile-pivot.json";

interface QuantilePivotData {
  probabilities: number[];
  zScores: number[];
  anglesDegrees: number[];
  asymptotic: { cT: number; cQ: number; cQT: number };
  rows: { n: number; v: number[][] }[];
}

const table = data as unknown as QuantilePivotData;
const P = table.probabilities;
const Z = table.zScores;
const ANGLE0 = table.anglesDegrees[0];
const ANGLE_STEP = table.anglesDegrees[1] - table.anglesDegrees[0];
const ROWS = table.rows;
const LAST = ROWS[ROWS.length - 1];

/** Probabilities the table covers (inclusive). */
export const QUANTILE_PIVOT_PROBABILITIES = { lowest: P[0], highest: P[P.length - 1] };

/** Largest sample size in the table; beyond it the large-sample form applies. */
export const QUANTILE_PIVOT_LARGEST_N = LAST.n;

function catmullRom(row: number[][], column: number, degrees: number): number {
  const last = row.length - 1;
  const pos = (degrees - ANGLE0) / ANGLE_STEP;
  const i = Math.min(Math.max(Math.floor(pos), 0), last - 1);
  const s = pos - i;
  const at = (k: number) =>
    k < 0 ? 2 * row[0][column] - row[1][column] : k > last ? 2 * row[last][column] - row[last - 1][column] : row[k][column];
  const p0 = at(i - 1);
  const p1 = at(i);
  const p2 = at(i + 1);
  const p3 = at(i + 2);
  const m1 = (p2 - p0) / 2;
  const m2 = (p3 - p1) / 2;
  const s2 = s * s;
  const s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * p1 + (s3 - 2 * s2 + s) * m1 + (-2 * s3 + 3 * s2) * p2 + (s3 - s2) * m2;
}

/** Index j and weight on column j+1 for probability p, interpolating in z_p. */
function probabilityWeights(p: number): [number, number] {
  let j = 0;
  while (j < P.length - 2 && p > P[j + 1]) j++;
  if (p === P[j]) return [j, 0];
  if (p === P[j + 1]) return [j, 1];
  const z = normalQuantile(p);
  return [j, (z - Z[j]) / (Z[j + 1] - Z[j])];
}

function rowValue(row: number[][], degrees: number, j: number, weight: number): number {
  const a = catmullRom(row, j, degrees);
  return weight === 0 ? a : (1 - weight) * a + weight * catmullRom(row, j + 1, degrees);
}

function asymptoticSd(radians: number): number {
  const { cT, cQ, cQT } = table.asymptotic;
  const c = Math.cos(radians);
  const s = Math.sin(radians);
  return Math.sqrt(c * c * cT + s * s * cQ + 2 * s * c * cQT);
}

/**
 * Quantile at `probability` of u(w) for a complete sample of `specimens`,
 * where w = ln(-ln S) - ln(sizeRatio) is the log cumulative hazard at the
 * strength being bounded.
 */
export function quantilePivotQuantile({
  specimens,
  logHazard,
  probability,
}: {
  specimens: number;
  logHazard: number;
  probability: number;
}): number {
  ensure(Number.isInteger(specimens) && specimens >= 2, () => `the table needs a whole number of at least 2 specimens (got ${specimens})`);
  ensure(Number.isFinite(logHazard), "the log cumulative hazard must be finite");
  ensure(
    probability >= P[0] && probability <= P[P.length - 1],
    () => `probability ${probability} is outside the simulated range ${P[0]} .. ${P[P.length - 1]}`,
  );
  const radians = Math.atan(logHazard);
  const degrees = (radians * 180) / Math.PI;
  const [j, weight] = probabilityWeights(probability);
  let v: number;
  if (specimens >= LAST.n) {
    const z = (1 - weight) * Z[j] + weight * Z[j + 1];
    const sd = asymptoticSd(radians);
    const d = LAST.n * (rowValue(LAST.v, degrees, j, weight) - (z * sd) / Math.sqrt(LAST.n));
    v = (z * sd) / Math.sqrt(specimens) + d / specimens;
  } else {
    let k = 0;
    while (ROWS[k + 1].n <= specimens && k + 1 < ROWS.length - 1) k++;
    const below = ROWS[k];
    const above = ROWS[k + 1];
    const vBelow = rowValue(below.v, degrees, j, weight);
    if (below.n === specimens) {
      v = vBelow;
    } else {
      const vAbove = rowValue(above.v, degrees, j, weight);
      const x = (1 / Math.sqrt(specimens) - 1 / Math.sqrt(below.n)) / (1 / Math.sqrt(above.n) - 1 / Math.sqrt(below.n));
      v = vBelow + x * (vAbove - vBelow);
    }
  }
  return Math.hypot(1, logHazard) * v;
}
