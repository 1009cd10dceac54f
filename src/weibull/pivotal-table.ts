/**
 * The Monte Carlo table of the maximum-likelihood pivotal quantities for
 * complete samples (tools/simulate_pivotal_tables.py, seeded; output in
 * tables/pivotal-quantiles.json):
 *
 *   q = m_hat / m            t = m_hat ln(th_hat / th)
 *
 * whose distributions depend on the sample size only (Thoman, Bain & Antle
 * 1969). Between tabulated sizes we interpolate linearly in 1/n (the leading
 * behaviour of bias and spread); between tabulated probabilities, linearly
 * in the normal score z_p; beyond n = 500, the fitted asymptotic forms
 * q_p = 1 + z_p sqrt(c/n) + d_p/n + f_p/n^1.5 and t_p = z_p sqrt(c/n) + e_p/n
 * + f_p/n^1.5, with c the theoretical asymptotic variances (6/pi^2 for q,
 * 1 + 6(1 - Euler's gamma)^2/pi^2 for t), and UF = 1 - a/n - b/n^2.
 */
import { ensure, ensureApplicable, InputError } from "../errors";
import { normalQuantile } from "../numeric/normal";
import table from "./tables/pivotal-quantiles.json";

interface Row {
  n: number;
  unbiasingFactor: number | null;
  q: number[];
  t: number[];
}

interface TableFile {
  probabilities: number[];
  rows: Row[];
  largeN: {
    unbiasingFactor: { a: number; b: number };
    q: { c: number; d: number[]; f: number[] };
    t: { c: number; e: number[]; f: number[] };
  };
}

export interface PivotalTable {
  /** Largest tabulated sample size; beyond it the asymptotic forms apply. */
  maxTabulated: number;
  /** Smallest and largest tabulated probability of the quantiles. */
  probabilityRange: [number, number];
  /** UF(n) = 1/E[m_hat/m]; throws for n = 2, where E[m_hat/m] is infinite. */
  unbiasingFactor(n: number): number;
  /** p-quantile of q = m_hat/m for complete samples of size n. */
  shapeQuantile(n: number, p: number): number;
  /** p-quantile of t = m_hat ln(th_hat/th) for complete samples of size n. */
  scaleQuantile(n: number, p: number): number;
}

let cached: PivotalTable | null = null;

export function pivotalTable(): PivotalTable {
  cached ??= buildTable(table as unknown as TableFile);
  return cached;
}

function buildTable(file: TableFile): PivotalTable {
  const rows = [...file.rows].sort((a, b) => a.n - b.n);
  const sizes = rows.map((r) => r.n);
  const maxTabulated = sizes[sizes.length - 1];
  const z = file.probabilities.map(normalQuantile);
  const { largeN } = file;

  /** Index i and weight w such that n lies between rows i and i+1, weight on row i+1, linear in 1/n. */
  const bracketSize = (n: number): [number, number] => {
    let i = 0;
    while (i < sizes.length - 2 && sizes[i + 1] < n) i++;
    const a = 1 / sizes[i];
    const b = 1 / sizes[i + 1];
    return [i, (a - 1 / n) / (a - b)];
  };

  /** Interpolate a quantile vector at probability p, linear in z_p. */
  const atProbability = (values: number[], p: number): number => {
    const [lo, hi] = [file.probabilities[0], file.probabilities[file.probabilities.length - 1]];
    if (!(p >= lo && p <= hi)) {
      throw new InputError("input", `quantiles are tabulated for probabilities from ${lo} to ${hi} (asked for ${p}): use a confidence of at most ${1 - 2 * lo}`);
    }
    const zp = normalQuantile(p);
    let j = 0;
    while (j < z.length - 2 && z[j + 1] < zp) j++;
    const w = (zp - z[j]) / (z[j + 1] - z[j]);
    return values[j] + w * (values[j + 1] - values[j]);
  };

  const checkSize = (n: number) => ensure(Number.isInteger(n) && n >= 2, () => `pivotal quantities need a whole number of at least 2 specimens (got ${n})`);

  const quantile = (n: number, p: number, key: "q" | "t"): number => {
    checkSize(n);
    if (n > maxTabulated) {
      const model = key === "q" ? largeN.q : largeN.t;
      const first = key === "q" ? largeN.q.d : largeN.t.e;
      return (
        (key === "q" ? 1 : 0) +
        normalQuantile(p) * Math.sqrt(model.c / n) +
        atProbability(first, p) / n +
        atProbability(model.f, p) / (n * Math.sqrt(n))
      );
    }
    const [i, w] = bracketSize(n);
    const a = atProbability(rows[i][key], p);
    const b = atProbability(rows[i + 1][key], p);
    return a + w * (b - a);
  };

  return {
    maxTabulated,
    probabilityRange: [file.probabilities[0], file.probabilities[file.probabilities.length - 1]],
    unbiasingFactor(n: number): number {
      checkSize(n);
      ensureApplicable(n >= 3, "no unbiasing factor exists for 2 specimens (the mean of the ML modulus is infinite): use \"MLE-RAW\" or test more specimens");
      if (n > maxTabulated) {
        const { a, b } = largeN.unbiasingFactor;
        return 1 - a / n - b / (n * n);
      }
      const exact = rows.find((r) => r.n === n);
      if (exact?.unbiasingFactor != null) return exact.unbiasingFactor;
      const [i, w] = bracketSize(n);
      const a = rows[i].unbiasingFactor;
      const b = rows[i + 1].unbiasingFactor;
      if (a == null || b == null) throw new InputError("input", `no unbiasing factor is tabulated near ${n} specimens`);
      return a + w * (b - a);
    },
    shapeQuantile: (n, p) => quantile(n, p, "q"),
    scaleQuantile: (n, p) => quantile(n, p, "t"),
  };
}
