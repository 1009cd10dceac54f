#!/usr/bin/env python3
"""Monte Carlo table of the pivotal quantity for a Weibull strength quantile, complete samples.

For a complete sample of size n the maximum-likelihood estimates (m_hat, th_hat) give, for the
strength x_p = th * exp(w / m) at which the cumulative hazard is exp(w) (w = ln(-ln S) - ln k for
survival S of a body k times the tested size), the pivotal quantity

    u(w) = m_hat * ln(x_p_hat / x_p) = t + w * (1 - q),    q = m_hat/m,  t = m_hat ln(th_hat/th)

whose distribution depends on n and w only (Thoman, Bain & Antle 1969; Lawless 1982 sec. 4.1).
A lower confidence bound on x_p at confidence C is x_p_hat * exp(-u_C / m_hat).

u is linear in w, so with w = tan(a), a in [-90, 90] degrees,

    u(w) = sqrt(1 + w^2) * v(a),    v(a) = cos(a) * t + sin(a) * (1 - q)

and the quantiles of v are smooth, bounded functions of a on a closed interval (at a = +-90 degrees
they are the quantiles of +-(1 - q)). This script writes quantiles of v for every n of the complete-
sample table, on an angle grid, at the probabilities of the pivotal-quantile table.
Output: src/weibull/tables/quantile-pivot.json.

Run:  python3 tools/simulate_quantile_pivot_table.py [--out PATH] [--sizes 5,10]
Deterministic: each n draws from its own PCG64 stream, SeedSequence(SEED, spawn_key=(n,)), in a fixed
chunk layout. The ML solve here is written independently of tools/simulate_pivotal_tables.py, so the
column at a = 0 (v = t) is an independent check of that table's t quantiles.
"""

import argparse
import json
import math
import os
import platform
import sys
import time

import mpmath
import numpy as np
import scipy
from scipy import stats

SEED = 20251202
PROBABILITIES = [0.005, 0.01, 0.025, 0.05, 0.1, 0.2, 0.25, 0.5, 0.75, 0.8, 0.9, 0.95, 0.975, 0.99, 0.995]
SAMPLE_SIZES = (list(range(2, 51)) + list(range(55, 101, 5)) + list(range(110, 201, 10))
                + [250, 300, 400, 500])
STEP_DEGREES = 5
FINE_STEP_DEGREES = 2.5  # simulated too, to measure the interpolation error between grid angles
CHUNK_ELEMENTS = 4_000_000
BATCHES = 20
EULER_GAMMA = 0.57721566490153286061


def replications(n):
    return 1_000_000 if n <= 50 else 500_000


def ml_shape(y):
    """ML modulus per row of y = ln(x) (complete samples), Newton with a bisection safeguard.

    With z = y - max(y) <= 0 and w = exp(m z), the equation is h(m) = sum(z w)/sum(w) - mean(z) - 1/m = 0;
    h increases strictly (h' = var_w(z) + 1/m^2), h(1/(-mean z)) <= 0, and Newton from the left of the
    root of a convex-from-the-left function is kept inside the bracket by bisection.
    """
    z = y - y.max(axis=1, keepdims=True)
    zbar = z.mean(axis=1)
    lo = 1.0 / (-zbar)
    hi = np.full(z.shape[0], np.inf)
    m = np.maximum(math.pi / math.sqrt(6.0) / z.std(axis=1, ddof=1), lo)
    active = np.arange(z.shape[0])
    for _ in range(100):
        if active.size == 0:
            break
        za, ma = z[active], m[active]
        w = np.exp(ma[:, None] * za)
        s0 = w.sum(axis=1)
        s1 = (za * w).sum(axis=1) / s0
        s2 = (za * za * w).sum(axis=1) / s0
        h = s1 - zbar[active] - 1.0 / ma
        slope = s2 - s1 * s1 + 1.0 / (ma * ma)
        lo[active] = np.where(h < 0, ma, lo[active])
        hi[active] = np.where(h < 0, hi[active], ma)
        nxt = ma - h / slope
        done = np.abs(nxt - ma) <= 1e-13 * ma
        bad = ~((nxt > lo[active]) & (nxt < hi[active]))
        nxt = np.where(bad & ~done, np.where(np.isfinite(hi[active]), 0.5 * (lo[active] + hi[active]), 2 * ma), nxt)
        m[active] = np.where(done, ma, nxt)
        active = active[~done]
    if active.size:
        raise RuntimeError(f"{active.size} ML solves did not converge")
    ln_scale = y.max(axis=1) + np.log(np.exp(m[:, None] * z).mean(axis=1)) / m
    return m, ln_scale


def mpmath_check(y, m):
    """Relative error of a few solves against 30-digit roots."""
    worst = 0.0
    with mpmath.workdps(30):
        for row, mh in zip(y, m):
            ys = [mpmath.mpf(float(v)) for v in row]
            ybar = mpmath.fsum(ys) / len(ys)

            def h(mm):
                w = [mpmath.exp(mm * v) for v in ys]
                return mpmath.fsum(v * wi for v, wi in zip(ys, w)) / mpmath.fsum(w) - ybar - 1 / mm

            root = mpmath.findroot(h, mpmath.mpf(float(mh)))
            worst = max(worst, float(abs(mpmath.mpf(float(mh)) - root) / root))
    return worst


def draw_pivots(n):
    reps = replications(n)
    rng = np.random.Generator(np.random.PCG64(np.random.SeedSequence(SEED, spawn_key=(n,))))
    rows = max(1, CHUNK_ELEMENTS // n)
    q = np.empty(reps)
    t = np.empty(reps)
    check = 0.0
    for start in range(0, reps, rows):
        k = min(rows, reps - start)
        y = np.log(rng.standard_exponential((k, n)))
        # Probability-zero events (a zero draw, or all values equal) have no finite ML modulus: redraw.
        while True:
            bad = ~np.isfinite(y).all(axis=1) | (y.max(axis=1) == y.min(axis=1))
            if not bad.any():
                break
            y[bad] = np.log(rng.standard_exponential((int(bad.sum()), n)))
        m, ln_scale = ml_shape(y)
        q[start:start + k] = m
        t[start:start + k] = m * ln_scale
        if start == 0:
            check = mpmath_check(y[:4], m[:4])
    return q, t, check


def angle_quantiles(q, t, degrees):
    """Quantiles of v(a) at each angle; and batch standard errors."""
    out = np.empty((len(degrees), len(PROBABILITIES)))
    se = np.empty_like(out)
    one_minus_q = 1.0 - q
    for i, d in enumerate(degrees):
        a = math.radians(d)
        v = math.cos(a) * t + math.sin(a) * one_minus_q
        out[i] = np.quantile(v, PROBABILITIES)
        batches = np.quantile(v[: (v.size // BATCHES) * BATCHES].reshape(BATCHES, -1), PROBABILITIES, axis=1)
        se[i] = batches.std(axis=1, ddof=1) / math.sqrt(BATCHES)
    return out, se


def catmull_rom(grid_values, step, x, origin):
    """Cubic Catmull-Rom interpolation on a uniform grid (ends extended linearly); mirrors the TS reader."""
    last = len(grid_values) - 1
    pos = (x - origin) / step
    i = min(max(int(math.floor(pos)), 0), last - 1)
    s = pos - i

    def at(k):
        if k < 0:
            return 2 * grid_values[0] - grid_values[1]
        if k > last:
            return 2 * grid_values[last] - grid_values[last - 1]
        return grid_values[k]

    p0, p1, p2, p3 = at(i - 1), at(i), at(i + 1), at(i + 2)
    m1 = (p2 - p0) / 2
    m2 = (p3 - p1) / 2
    s2, s3 = s * s, s * s * s
    return (2 * s3 - 3 * s2 + 1) * p1 + (s3 - 2 * s2 + s) * m1 + (-2 * s3 + 3 * s2) * p2 + (s3 - s2) * m2


def sig(x, digits=5):
    return float(f"{x:.{digits - 1}e}")


def asymptotic_sd(a):
    """sd of sqrt(n) v(a) as n -> infinity, from the ML covariance of the smallest-extreme-value law:
    var sqrt(n) t = 1 + 6(1-g)^2/pi^2, var sqrt(n)(1-q) = 6/pi^2, cov = -6(1-g)/pi^2 (g Euler's constant;
    the covariance of location and scale estimates is negative for the smallest extreme value law)."""
    c_t = 1 + 6 * (1 - EULER_GAMMA) ** 2 / math.pi ** 2
    c_q = 6 / math.pi ** 2
    c_qt = -6 * (1 - EULER_GAMMA) / math.pi ** 2
    return math.sqrt(math.cos(a) ** 2 * c_t + math.sin(a) ** 2 * c_q + 2 * math.sin(a) * math.cos(a) * c_qt)


def dump_lines(obj, indent=""):
    inner = indent + " "
    if isinstance(obj, dict) and len(indent) < 2:
        items = [f"{inner}{json.dumps(k)}: {dump_lines(v, inner)}" for k, v in obj.items()]
        return "{\n" + ",\n".join(items) + "\n" + indent + "}"
    if isinstance(obj, list) and obj and all(isinstance(v, dict) for v in obj):
        items = [inner + json.dumps(v, separators=(",", ":")) for v in obj]
        return "[\n" + ",\n".join(items) + "\n" + indent + "]"
    return json.dumps(obj, separators=(",", ":"))


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--out", default=os.path.join(os.path.dirname(__file__), "..", "src", "weibull", "tables",
                                                      "quantile-pivot.json"))
    parser.add_argument("--sizes", default="", help="comma-separated subset of n (testing only)")
    args = parser.parse_args()
    sizes = [int(s) for s in args.sizes.split(",")] if args.sizes else SAMPLE_SIZES
    started = time.time()
    coarse = list(np.arange(-90, 90 + 1e-9, STEP_DEGREES))
    fine = list(np.arange(-90, 90 + 1e-9, FINE_STEP_DEGREES))
    rows = []
    interp_worst_abs = 0.0
    interp_worst_se = 0.0
    solver_worst = 0.0
    t_at_zero = {}
    covariance = {}
    for n in sizes:
        t0 = time.time()
        row_worst_se = 0.0
        q, t, check = draw_pivots(n)
        solver_worst = max(solver_worst, check)
        values, se = angle_quantiles(q, t, fine)
        coarse_idx = [fine.index(d) for d in coarse]
        grid = values[coarse_idx]
        # Interpolation error at the in-between angles, per probability.
        for j in range(len(PROBABILITIES)):
            col = [sig(v) for v in grid[:, j]]
            for i, d in enumerate(fine):
                if i in coarse_idx:
                    continue
                est = catmull_rom(col, STEP_DEGREES, d, -90)
                err = abs(est - values[i, j])
                interp_worst_abs = max(interp_worst_abs, err)
                interp_worst_se = max(interp_worst_se, err / se[i, j])
                row_worst_se = max(row_worst_se, err / se[i, j])
        t_at_zero[n] = grid[coarse.index(0)].tolist()
        if n == max(sizes):
            c = np.cov(np.vstack([t, 1 - q]))
            covariance = {"n": n, "var_t_times_n": sig(c[0, 0] * n), "var_1mq_times_n": sig(c[1, 1] * n),
                          "cov_times_n": sig(c[0, 1] * n)}
        rows.append({"n": n, "replications": int(q.size),
                     "v": [[sig(v) for v in grid[i]] for i in range(len(coarse))],
                     "maxSE": sig(float(se[coarse_idx].max()), 2),
                     "angleInterpolationErrorInSE": sig(row_worst_se, 2)})
        print(f"n={n:4d} reps={q.size} {time.time() - t0:.1f}s", flush=True)

    z = stats.norm.ppf(PROBABILITIES)
    checks = {
        "solverVsMpmath": {"description": "first 4 replications of every n re-solved with mpmath at 30 digits: "
                                          "max relative error of m_hat", "maxRelError": sig(solver_worst, 2)},
        "angleInterpolation": {
            "description": f"Catmull-Rom interpolation of the {STEP_DEGREES}-degree grid (values as stored) at the "
                           f"simulated {FINE_STEP_DEGREES}-degree angles in between, all n and probabilities",
            "maxAbsError": sig(interp_worst_abs, 2), "maxErrorInSE": sig(interp_worst_se, 2)},
        "covarianceAtLargestN": covariance,
    }
    by_n = {r["n"]: r for r in rows}
    if all(k in by_n for k in (300, 400, 500)):
        # Large-n form v_p(n) = z_p sd(a)/sqrt(n) + D_p(a)/n with D from one row; hold-out: D from 300 predicts 400, 500.
        worst = 0.0
        for target in (400, 500):
            for i, d in enumerate(coarse):
                a = math.radians(d)
                for j in range(len(PROBABILITIES)):
                    base = by_n[300]["v"][i][j]
                    dcoef = 300 * (base - z[j] * asymptotic_sd(a) / math.sqrt(300))
                    pred = z[j] * asymptotic_sd(a) / math.sqrt(target) + dcoef / target
                    worst = max(worst, abs(pred - by_n[target]["v"][i][j]))
        checks["largeNHoldOut"] = {"description": "D_p(a) taken from the n = 300 row predicts the n = 400 and 500 rows: "
                                                  "max abs error in v", "maxAbsError": sig(worst, 2)}
    out = {
        "title": "Quantiles of the pivotal quantity for a Weibull strength quantile, complete samples",
        "generator": "tools/simulate_quantile_pivot_table.py",
        "command": "python3 tools/simulate_quantile_pivot_table.py",
        "seed": SEED,
        "rng": "numpy.random.Generator(PCG64(SeedSequence(seed, spawn_key=(n,)))), standard_exponential, "
               f"chunks of floor({CHUNK_ELEMENTS}/n) replications",
        "versions": {"python": platform.python_version(), "numpy": np.__version__, "scipy": scipy.__version__,
                     "mpmath": mpmath.__version__},
        "definition": {
            "u": "u(w) = m_hat*ln(x_p_hat/x_p) = t + w*(1 - q), q = m_hat/m, t = m_hat*ln(th_hat/th), "
                 "x_p = th*exp(w/m), w = ln(-ln S) - ln(sizeRatio); m_hat, th_hat raw maximum likelihood",
            "v": "v(a) = cos(a)*t + sin(a)*(1 - q) = u(tan a)/sqrt(1 + tan(a)^2); rows[k].v[i][j] is the quantile "
                 "of v at angle anglesDegrees[i] and probability probabilities[j] (numpy.quantile 'linear', type 7)",
            "bound": "lower confidence bound at confidence C on x_p: x_p_hat*exp(-u_C/m_hat), "
                     "u_C = sqrt(1 + w^2)*v_C(atan w)",
            "between angles": "Catmull-Rom cubic on the uniform angle grid, ends extended linearly",
            "between sizes": "linear in 1/sqrt(n) (the reader's choice)",
            "beyond n = 500": "v_p(n, a) = z_p*sd(a)/sqrt(n) + D_p(a)/n, D_p(a) = 500*(v_p(500, a) - z_p*sd(a)/sqrt(500)), "
                              "sd(a)^2 = cT cos^2 a + cQ sin^2 a + 2 cQT sin a cos a",
            "maxSE": "largest batch-quantile Monte Carlo standard error in the row (20 batches)",
            "angleInterpolationErrorInSE": "largest |Catmull-Rom value - simulated value| at the in-between angles "
                                           "of the row, in units of that value's Monte Carlo standard error",
        },
        "asymptotic": {"cT": 1 + 6 * (1 - EULER_GAMMA) ** 2 / math.pi ** 2, "cQ": 6 / math.pi ** 2,
                       "cQT": -6 * (1 - EULER_GAMMA) / math.pi ** 2,
                       "note": "ML covariance of the smallest-extreme-value (log-Weibull) law per observation"},
        "probabilities": PROBABILITIES,
        "zScores": [float(v) for v in z],
        "anglesDegrees": [float(d) for d in coarse],
        "rows": rows,
        "checks": checks,
        "runSeconds": round(time.time() - started, 1),
    }
    os.makedirs(os.path.dirname(os.path.abspath(args.out)), exist_ok=True)
    with open(args.out, "w") as fh:
        fh.write(dump_lines(out) + "\n")
    print(json.dumps(checks, indent=1))
    print(f"wrote {args.out} in {time.time() - started:.1f} s")


if __name__ == "__main__":
    sys.exit(main())
