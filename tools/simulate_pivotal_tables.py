#!/usr/bin/env python3
"""Monte Carlo tables of the maximum-likelihood pivotal quantities for a complete Weibull sample.

For a complete sample of size n from a two-parameter Weibull distribution, the maximum-likelihood
estimates (m_hat, th_hat) give two pivotal quantities whose distributions depend on n only
(Thoman, Bain & Antle 1969, Technometrics 11:445; used by ASTM C1239 section 8 and ISO 20501):

    q = m_hat / m                 t = m_hat * ln(th_hat / th)

so they are simulated once at m = th = 1, where a specimen strength is a standard exponential
variate. This script writes, per sample size n, the unbiasing factor UF(n) = 1 / E[q] with its Monte
Carlo standard error, 1 / median(q) for comparison, and quantiles of q and t, plus a fitted
large-n form for sizes beyond the table. Output: src/weibull/tables/pivotal-quantiles.json.

Run:  python3 tools/simulate_pivotal_tables.py [--workers 2] [--out PATH]
Deterministic: every n draws from its own PCG64 stream, SeedSequence(SEED, spawn_key=(n,)), in a
fixed chunk layout, so the result does not depend on the number of workers.
"""

import argparse
import json
import math
import os
import platform
import sys
import time
from multiprocessing import Pool

import mpmath
import numpy as np
import scipy
from scipy import integrate, optimize, stats

SEED = 20251201
PROBABILITIES = [0.005, 0.01, 0.025, 0.05, 0.1, 0.2, 0.25, 0.5, 0.75, 0.8, 0.9, 0.95, 0.975, 0.99, 0.995]
SAMPLE_SIZES = (list(range(2, 51)) + list(range(55, 101, 5)) + list(range(110, 201, 10))
                + [250, 300, 400, 500])
CHUNK_ELEMENTS = 4_000_000  # values per vectorised block (32 MB per float64 array)
BATCHES = 20                # batch-quantile standard errors
REL_TOL = 1e-13             # Newton stops when the step is below this; the root is then good to ~1e-15
EULER_GAMMA = 0.57721566490153286061


def replications(n):
    """Replication counts: cheap for small n, where the spread (and the MC error) is largest."""
    if n <= 30:
        return 4_000_000
    if n <= 100:
        return 2_000_000
    return 1_000_000


def solve_shape(z):
    """ML modulus for each row of z = ln(x) - max(ln(x)) (rows are replications).

    Solves g(m) = sum(z w)/sum(w) - mean(z) - 1/m = 0 with w = exp(m z) <= 1 (data scaled by the
    row maximum, so nothing overflows). g is strictly increasing: g'(m) = var_w(z) + 1/m^2 > 0.
    Newton's method keeps a bracket [lo, hi] (g(lo) < 0 < g(hi)) and bisects, or doubles while no
    upper end is known, whenever a Newton step leaves it. Starting bracket: since sum(z w)/sum(w)
    <= 0, g(m) <= -mean(z) - 1/m, so g(1/(-mean z)) <= 0.
    Returns (m_hat, iterations, number of rows not converged).
    """
    rows = z.shape[0]
    zbar = z.mean(axis=1)
    lo = 1.0 / (-zbar)
    hi = np.full(rows, np.inf)
    sd = z.std(axis=1, ddof=1)
    # Moment start: sd(ln x) = pi / (m sqrt 6) for a Weibull variate.
    m = np.maximum(np.pi / math.sqrt(6.0) / sd, lo * (1.0 + 1e-7))
    active = np.arange(rows)
    iterations = 0
    while active.size and iterations < 200:
        iterations += 1
        za = z[active]
        ma = m[active]
        w = np.exp(ma[:, None] * za)
        s0 = w.sum(axis=1)
        zw = za * w
        a = zw.sum(axis=1) / s0
        g = a - zbar[active] - 1.0 / ma
        gp = (za * zw).sum(axis=1) / s0 - a * a + 1.0 / (ma * ma)
        below = g < 0
        lo[active] = np.where(below, ma, lo[active])
        hi[active] = np.where(below, hi[active], ma)
        newton = ma - g / gp
        l, h = lo[active], hi[active]
        # Convergence is judged on the Newton step before the safeguard: at the root, rounding noise
        # in g puts the step on the bracket edge, which must not trigger a bisection.
        done = (np.abs(newton - ma) <= REL_TOL * ma) | (g == 0) | ((h - l) <= 2 * REL_TOL * ma)
        outside = ~((newton > l) & (newton < h)) & ~done
        step = np.where(outside, np.where(np.isfinite(h), 0.5 * (l + h), 2.0 * ma), newton)
        m[active] = step
        active = active[~done]
    return m, iterations, int(active.size)


def draw_chunk(rng, rows, n):
    """ln of standard exponential variates (Weibull m=1, th=1). A row is redrawn if it holds an
    exact zero (ln = -inf) or if all its values are equal: such a sample has no finite ML modulus
    (for n = 2 that is a tie). Both events have probability zero for the continuous distribution
    and about 1e-16 per draw in double precision; redrawing conditions on the probability-one
    event and is counted."""
    y = np.log(rng.standard_exponential((rows, n)))
    redrawn = 0
    while True:
        bad = ~np.isfinite(y).all(axis=1) | (y.max(axis=1) == y.min(axis=1))
        k = int(bad.sum())
        if k == 0:
            return y, redrawn
        redrawn += k
        y[bad] = np.log(rng.standard_exponential((k, n)))


def simulate(n):
    """Simulate q and t for one sample size; returns the row of the table plus diagnostics."""
    started = time.time()
    reps = replications(n)
    rng = np.random.Generator(np.random.PCG64(np.random.SeedSequence(SEED, spawn_key=(n,))))
    rows_per_chunk = max(1, CHUNK_ELEMENTS // n)
    q = np.empty(reps)
    t = np.empty(reps)
    redrawn = 0
    max_iterations = 0
    not_converged = 0
    max_rel_error = 0.0
    for start in range(0, reps, rows_per_chunk):
        rows = min(rows_per_chunk, reps - start)
        y, k = draw_chunk(rng, rows, n)
        redrawn += k
        ymax = y.max(axis=1)
        z = y - ymax[:, None]
        m, its, nc = solve_shape(z)
        max_iterations = max(max_iterations, its)
        not_converged += nc
        # ln th_hat = ymax + ln(mean(exp(m z))) / m; the true th is 1, so t = m_hat * ln th_hat.
        w_mean = np.exp(m[:, None] * z).mean(axis=1)
        q[start:start + rows] = m
        t[start:start + rows] = m * ymax + np.log(w_mean)
        if start == 0:
            max_rel_error = check_against_mpmath(y[:8], m[:8])
    mean_q = float(np.mean(q))
    sd_q = float(np.std(q, ddof=1))
    se_mean = sd_q / math.sqrt(reps)
    qq = np.quantile(q, PROBABILITIES)
    tq = np.quantile(t, PROBABILITIES)
    bq = np.array([np.quantile(b, PROBABILITIES) for b in np.array_split(q, BATCHES)])
    bt = np.array([np.quantile(b, PROBABILITIES) for b in np.array_split(t, BATCHES)])
    q_se = bq.std(axis=0, ddof=1) / math.sqrt(BATCHES)
    t_se = bt.std(axis=0, ddof=1) / math.sqrt(BATCHES)
    return {
        "n": n,
        "replications": reps,
        "meanQ": mean_q,
        "seMeanQ": se_mean,
        "q": qq.tolist(),
        "t": tq.tolist(),
        "qSE": q_se.tolist(),
        "tSE": t_se.tolist(),
        "redrawn": redrawn,
        "maxIterations": max_iterations,
        "notConverged": not_converged,
        "maxRelErrorVsMpmath": max_rel_error,
        "seconds": time.time() - started,
    }


def check_against_mpmath(y, m):
    """Relative error of the vectorised solve against a 30-digit mpmath root for a few rows."""
    worst = 0.0
    with mpmath.workdps(30):
        for row, mh in zip(y, m):
            ys = [mpmath.mpf(float(v)) for v in row]
            ybar = mpmath.fsum(ys) / len(ys)

            def g(mm):
                w = [mpmath.exp(mm * v) for v in ys]
                return mpmath.fsum(v * wi for v, wi in zip(ys, w)) / mpmath.fsum(w) - ybar - 1 / mm

            root = mpmath.findroot(g, mpmath.mpf(float(mh)), solver="newton")
            worst = max(worst, float(abs(mpmath.mpf(float(mh)) - root) / root))
    return worst


def exact_n2():
    """n = 2 in closed form. With L = ln x2 - ln x1 (a standard logistic variate, since x2/x1 is
    F(2,2)), m_hat = u*/|L| where u* solves u tanh(u/2) = 2. Hence P(q <= x) = 2/(1 + exp(u*/x)),
    q_p = u*/ln(2/p - 1), and E[q] is infinite (|L| has positive density at 0)."""
    u = optimize.brentq(lambda v: v * math.tanh(v / 2) - 2, 0.5, 10, xtol=1e-15)
    return u, [u / math.log(2 / p - 1) for p in PROBABILITIES]


def exact_mean_q_n3():
    """E[q] for n = 3 by quadrature. Differences d = (y2 - y1, y3 - y1) of three ln-exponential
    variates have density 2 e^(d1+d2) / (1 + e^d1 + e^d2)^3 (integrate y1 out with a Gamma(3)
    integral). m_hat is homogeneous of degree -1 in d: with d = r (cos phi, sin phi),
    m_hat = c(phi)/r, so E[q] = int_0^2pi c(phi) int_0^inf f(r, phi) dr dphi (the Jacobian r
    cancels the 1/r)."""

    def c(phi):
        y = np.array([0.0, math.cos(phi), math.sin(phi)])
        z = y - y.max()
        zbar = z.mean()

        def g(mm):
            w = np.exp(mm * z)
            return float((z * w).sum() / w.sum() - zbar - 1 / mm)

        lo = 1.0 / (-zbar)
        hi = 2 * lo
        while g(hi) <= 0:
            hi *= 2
        return optimize.brentq(g, lo, hi, xtol=1e-15, rtol=1e-15)

    def radial(phi):
        a, b = math.cos(phi), math.sin(phi)

        def f(r):
            # 2 e^(r(a+b)) / (1 + e^(ra) + e^(rb))^3, evaluated in logs
            top = max(0.0, r * a, r * b)
            log_den = top + math.log(math.exp(-top) + math.exp(r * a - top) + math.exp(r * b - top))
            return 2 * math.exp(r * (a + b) - 3 * log_den)

        return integrate.quad(f, 0, np.inf, epsabs=0, epsrel=1e-12, limit=200)[0]

    breaks = [k * math.pi / 4 for k in range(9)]
    total = 0.0
    for lo, hi in zip(breaks[:-1], breaks[1:]):
        total += integrate.quad(lambda p: c(p) * radial(p), lo, hi, epsabs=0, epsrel=1e-11, limit=200)[0]
    return total


def exact_mean_q_n3_cartesian():
    """Independent check of exact_mean_q_n3: the same expectation as a 2-D integral over (d1, d2) in
    Cartesian coordinates, one quadrant at a time (the 1/|d| singularity sits at a corner), truncated
    at |d| = 40 where the density is below 1e-17."""

    def mhat(d1, d2):
        y = np.array([0.0, d1, d2])
        z = y - y.max()
        zbar = z.mean()
        if zbar == 0:
            return 0.0

        def g(mm):
            w = np.exp(mm * z)
            return float((z * w).sum() / w.sum() - zbar - 1 / mm)

        lo = 1 / (-zbar)
        hi = 2 * lo
        while g(hi) <= 0:
            hi *= 2
        return optimize.brentq(g, lo, hi, xtol=1e-14, rtol=1e-14)

    def density(d1, d2):
        top = max(0.0, d1, d2)
        log_den = top + math.log(math.exp(-top) + math.exp(d1 - top) + math.exp(d2 - top))
        return 2 * math.exp(d1 + d2 - 3 * log_den)

    total = 0.0
    for a, b in [(-40.0, 0.0), (0.0, 40.0)]:
        for c, d in [(-40.0, 0.0), (0.0, 40.0)]:
            total += integrate.dblquad(lambda d2, d1: mhat(d1, d2) * density(d1, d2), a, b, c, d,
                                       epsabs=1e-10, epsrel=1e-9)[0]
    return total


def sig(x, digits=6):
    """Round to significant digits for a compact file (the MC error is far larger)."""
    if x is None or not math.isfinite(x):
        return None
    return float(f"{x:.{digits - 1}e}")


C_Q_THEORY = 6 / math.pi ** 2
C_T_THEORY = 1 + 6 * (1 - EULER_GAMMA) ** 2 / math.pi ** 2


def fit_large_n(rows):
    """Fit large-n forms to the rows with n >= 50 (weighted least squares, weights 1/SE^2).

    UF(n) = 1 - a/n - b/n^2.
    Quantiles: value_p(n) = centre + z_p sqrt(c/n) + d_p/n + f_p/n^1.5 (d is named e for t) with c the known asymptotic
    variance (6/pi^2 for q, 1 + 6(1-gamma)^2/pi^2 for t). The d_p/n term carries the bias and the
    skewness (Cornish-Fisher), f_p/n^1.5 the next order. Two checks are reported: c fitted freely in
    the same form (it should land on the theory), and the shorter form without f_p (free c), whose c
    comes out about 4 % low because it absorbs the missing n^-1.5 term.
    """
    z = stats.norm.ppf(PROBABILITIES)
    P = len(PROBABILITIES)
    big = [r for r in rows if r["n"] >= 50]

    def fit_uf(sample):
        n = np.array([r["n"] for r in sample], float)
        uf = np.array([1 / r["meanQ"] for r in sample])
        se = np.array([r["seMeanQ"] / r["meanQ"] ** 2 for r in sample])
        design = np.column_stack([1 / n, 1 / n ** 2]) / se[:, None]
        return np.linalg.lstsq(design, (1 - uf) / se, rcond=None)[0]

    def uf_model(coef, n):
        return 1 - coef[0] / n - coef[1] / n ** 2

    def fit_quantiles(sample, key, centre, c_fixed, third):
        """Unknowns: [sqrt(c) if free] + d_1..d_P + [f_1..f_P if third]."""
        design, target = [], []
        for r in sample:
            n = r["n"]
            for j in range(P):
                row = [] if c_fixed is not None else [z[j] / math.sqrt(n)]
                d = [0.0] * P
                d[j] = 1 / n
                row += d
                if third:
                    f = [0.0] * P
                    f[j] = n ** -1.5
                    row += f
                known = centre + (z[j] * math.sqrt(c_fixed / n) if c_fixed is not None else 0.0)
                se = r[key + "SE"][j]
                design.append(np.array(row) / se)
                target.append((r[key][j] - known) / se)
        coef = np.linalg.lstsq(np.array(design), np.array(target), rcond=None)[0]
        if c_fixed is None:
            c, coef = coef[0] ** 2, coef[1:]
        else:
            c = c_fixed
        d = coef[:P]
        f = coef[P:] if third else np.zeros(P)
        return c, d, f

    def q_model(fit, n, centre):
        c, d, f = fit
        return centre + z * math.sqrt(c / n) + d / n + f / n ** 1.5

    def errors(sample, key, centre, fit):
        err = [np.abs(q_model(fit, r["n"], centre) - np.array(r[key])) for r in sample]
        in_se = [e / np.array(r[key + "SE"]) for e, r in zip(err, sample)]
        return sig(float(max(e.max() for e in err)), 3), sig(float(max(e.max() for e in in_se)), 3)

    train = [r for r in big if r["n"] <= 200]
    tail = [r for r in big if r["n"] >= 200]
    test = [r for r in big if r["n"] >= 250]
    uf_all, uf_hold = fit_uf(big), fit_uf(train)
    fits = {}
    for key, centre, c_theory in [("q", 1.0, C_Q_THEORY), ("t", 0.0, C_T_THEORY)]:
        chosen = fit_quantiles(big, key, centre, c_theory, True)
        hold = fit_quantiles(train, key, centre, c_theory, True)
        free3 = fit_quantiles(big, key, centre, None, True)
        free2 = fit_quantiles(big, key, centre, None, False)
        free2_hold = fit_quantiles(train, key, centre, None, False)
        all_abs, all_se = errors(tail, key, centre, chosen)
        hold_abs, hold_se = errors(test, key, centre, hold)
        two_abs, two_se = errors(test, key, centre, free2_hold)
        fits[key] = {
            "form": ("q_p(n) = 1 + z_p*sqrt(c/n) + d[j]/n + f[j]/n^1.5" if key == "q"
                     else "t_p(n) = z_p*sqrt(c/n) + e[j]/n + f[j]/n^1.5"),
            "c": sig(c_theory),
            "cSource": ("theory, not fitted: asymptotic variance of sqrt(n)*(m_hat/m - 1) is 6/pi^2" if key == "q"
                        else "theory, not fitted: asymptotic variance of sqrt(n)*m*ln(th_hat/th) is "
                             "1 + 6(1-gamma_Euler)^2/pi^2"),
            ("d" if key == "q" else "e"): [sig(v) for v in chosen[1]],
            "f": [sig(v) for v in chosen[2]],
            "check": {
                "cFittedFreelySameForm": sig(free3[0]),
                "cFittedFreelyWithout_f": sig(free2[0]),
                "fitAll_maxAbsError_n200to500": all_abs,
                "fitAll_maxErrorInSE_n200to500": all_se,
                "fit50to200_maxAbsError_predicting250to500": hold_abs,
                "fit50to200_maxErrorInSE_predicting250to500": hold_se,
                "without_f_fit50to200_maxAbsError_predicting250to500": two_abs,
                "without_f_fit50to200_maxErrorInSE_predicting250to500": two_se,
            },
        }
    uf_tail = [abs(uf_model(uf_all, r["n"]) - 1 / r["meanQ"]) for r in tail]
    uf_tail_se = [abs(uf_model(uf_all, r["n"]) - 1 / r["meanQ"]) / (r["seMeanQ"] / r["meanQ"] ** 2) for r in tail]
    uf_test = [abs(uf_model(uf_hold, r["n"]) - 1 / r["meanQ"]) for r in test]
    uf_test_se = [abs(uf_model(uf_hold, r["n"]) - 1 / r["meanQ"]) / (r["seMeanQ"] / r["meanQ"] ** 2) for r in test]
    return {
        "use": "for n > 500 (beyond the table). Fitted to the table rows with n >= 50 by weighted least squares "
               "(weights 1/SE^2). z_p is the standard normal quantile at probabilities[j]. 'check' entries: "
               "errors against the simulated rows, as absolute values and in units of the row's MC standard error",
        "unbiasingFactor": {
            "form": "UF(n) = 1 - a/n - b/n^2",
            "a": sig(uf_all[0]),
            "b": sig(uf_all[1]),
            "check": {
                "fitAll_maxAbsError_n200to500": sig(max(uf_tail), 3),
                "fitAll_maxErrorInSE_n200to500": sig(max(uf_tail_se), 3),
                "fit50to200_maxAbsError_predicting250to500": sig(max(uf_test), 3),
                "fit50to200_maxErrorInSE_predicting250to500": sig(max(uf_test_se), 3),
            },
        },
        "q": fits["q"],
        "t": fits["t"],
    }


def dump_lines(obj, indent=""):
    """JSON with one table row per line: compact, yet a diff shows which row changed."""
    inner = indent + " "
    if isinstance(obj, dict) and len(indent) < 2:
        items = [f"{inner}{json.dumps(k)}: {dump_lines(v, inner)}" for k, v in obj.items()]
        return "{\n" + ",\n".join(items) + "\n" + indent + "}"
    if isinstance(obj, list) and obj and all(isinstance(v, dict) for v in obj):
        items = [inner + json.dumps(v, separators=(",", ":")) for v in obj]
        return "[\n" + ",\n".join(items) + "\n" + indent + "]"
    return json.dumps(obj, separators=(",", ":"))


RECALLED = {5: 0.700, 10: 0.859, 15: 0.905, 20: 0.931, 25: 0.946, 30: 0.955, 40: 0.967, 50: 0.973,
            60: 0.978, 80: 0.984, 100: 0.987, 120: 0.989}


def comparison(rows):
    by_n = {r["n"]: r for r in rows}
    lines = ["| N | recalled ASTM C1239 table (from memory) | 1/mean(q) (this MC, +-SE) | 1/median(q) (this MC) |",
             "|---|---|---|---|"]
    closer_mean = closer_median = 0
    for n, v in RECALLED.items():
        r = by_n[n]
        uf = 1 / r["meanQ"]
        se = r["seMeanQ"] / r["meanQ"] ** 2
        med = 1 / r["q"][PROBABILITIES.index(0.5)]
        lines.append(f"| {n} | {v:.3f} | {uf:.4f} +- {se:.4f} | {med:.4f} |")
        if abs(uf - v) < abs(med - v):
            closer_mean += 1
        else:
            closer_median += 1
    lines.append("")
    lines.append(f"Recalled values closer to 1/mean(q) at {closer_mean} of {len(RECALLED)} sizes, "
                 f"closer to 1/median(q) at {closer_median}.")
    return "\n".join(lines)


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--out", default=os.path.join(os.path.dirname(__file__), "..", "src", "weibull",
                                                      "tables", "pivotal-quantiles.json"))
    parser.add_argument("--sizes", default="", help="comma-separated subset of n (testing only)")
    args = parser.parse_args()
    sizes = [int(s) for s in args.sizes.split(",")] if args.sizes else SAMPLE_SIZES
    started = time.time()
    # Largest n first so the two workers finish together.
    order = sorted(sizes, key=lambda n: -n * replications(n))
    with Pool(args.workers) as pool:
        results = {r["n"]: r for r in pool.imap_unordered(simulate, order)}
    rows = [results[n] for n in sizes]
    for r in rows:
        print(f"n={r['n']:4d} reps={r['replications']:8d} UF={1 / r['meanQ']:.5f} "
              f"1/median={1 / r['q'][7]:.5f} its={r['maxIterations']} nc={r['notConverged']} "
              f"redrawn={r['redrawn']} err={r['maxRelErrorVsMpmath']:.1e} {r['seconds']:.1f}s", flush=True)

    u_star, q_exact_n2 = exact_n2()
    checks = {"n2ClosedForm": {
        "description": "n = 2: m_hat = u*/|ln x2 - ln x1| with u* tanh(u*/2) = 2, so q_p = u*/ln(2/p - 1) "
                       "exactly; E[q] is infinite.",
        "uStar": u_star,
        "qExact": [sig(v) for v in q_exact_n2],
    }}
    if 2 in results:
        checks["n2ClosedForm"]["qSimulated"] = [sig(v) for v in results[2]["q"]]
        checks["n2ClosedForm"]["maxAbsErrorInSE"] = sig(max(
            abs(a - b) / s for a, b, s in zip(results[2]["q"], q_exact_n2, results[2]["qSE"])), 3)
    if 3 in results:
        e3 = exact_mean_q_n3()
        e3_check = exact_mean_q_n3_cartesian()
        checks["n3MeanByQuadrature"] = {
            "description": "n = 3: E[q] by 2-D quadrature over the density of the log-strength differences "
                           "(polar coordinates, nested scipy.integrate.quad, relative tolerance 1e-11), checked by "
                           "scipy.integrate.dblquad in Cartesian coordinates; E[q^2] is infinite, so the MC mean "
                           "converges slowly and its standard error is not meaningful.",
            "meanQ": e3,
            "meanQCartesianCheck": e3_check,
            "unbiasingFactor": 1 / e3,
            "simulatedMeanQ": results[3]["meanQ"],
        }
        print(f"n=3 E[q] quadrature {e3:.12f} (Cartesian {e3_check:.12f}), MC {results[3]['meanQ']:.8f}")
    checks["solverVsMpmath"] = {
        "description": "first 8 replications of every n re-solved with mpmath (30 digits): max relative error",
        "maxRelError": sig(max(r["maxRelErrorVsMpmath"] for r in rows), 2),
    }
    checks["redrawnSamples"] = sum(r["redrawn"] for r in rows)
    checks["notConverged"] = sum(r["notConverged"] for r in rows)

    table = []
    for r in rows:
        n = r["n"]
        entry = {
            "n": n,
            "replications": r["replications"],
            "unbiasingFactor": sig(1 / r["meanQ"]),
            "unbiasingFactorSE": sig(r["seMeanQ"] / r["meanQ"] ** 2, 2),
            "medianUnbiasingFactor": sig(1 / r["q"][PROBABILITIES.index(0.5)]),
            "q": [sig(v) for v in r["q"]],
            "t": [sig(v) for v in r["t"]],
            "qSE": [sig(v, 2) for v in r["qSE"]],
            "tSE": [sig(v, 2) for v in r["tSE"]],
        }
        if n == 2:
            entry["unbiasingFactor"] = None
            entry["unbiasingFactorSE"] = None
            entry["note"] = ("E[m_hat/m] is infinite for n = 2 (checks.n2ClosedForm), so no mean-unbiasing factor "
                             "exists; quantiles are valid.")
        if n == 3 and "n3MeanByQuadrature" in checks:
            entry["unbiasingFactor"] = sig(checks["n3MeanByQuadrature"]["unbiasingFactor"])
            entry["unbiasingFactorSE"] = None
            entry["note"] = ("Var(m_hat/m) is infinite for n = 3: unbiasingFactor is 1/E[q] by quadrature "
                             "(checks.n3MeanByQuadrature), not the slowly converging MC mean.")
        table.append(entry)

    large_n = fit_large_n([r for r in rows]) if max(sizes) >= 500 else None
    max_rel_q_se = max(max(s / abs(v) for s, v in zip(r["qSE"], r["q"])) for r in rows)
    max_t_se = max(max(r["tSE"]) for r in rows)
    max_rel_q_se10 = max((max(s / abs(v) for s, v in zip(r["qSE"], r["q"])) for r in rows if r["n"] >= 10),
                         default=float("nan"))
    max_t_se10 = max((max(r["tSE"]) for r in rows if r["n"] >= 10), default=float("nan"))
    max_uf_se = max((r["seMeanQ"] / r["meanQ"] ** 2 for r in rows if r["n"] >= 4), default=float("nan"))
    elapsed = time.time() - started
    out = {
        "title": "Pivotal quantities of the Weibull maximum-likelihood estimates, complete samples",
        "generator": "tools/simulate_pivotal_tables.py",
        "command": "python3 tools/simulate_pivotal_tables.py --workers 2",
        "seed": SEED,
        "rng": "numpy.random.Generator(PCG64(SeedSequence(seed, spawn_key=(n,)))), standard_exponential, "
               f"chunks of floor({CHUNK_ELEMENTS}/n) replications",
        "versions": {"python": platform.python_version(), "numpy": np.__version__, "scipy": scipy.__version__,
                     "mpmath": mpmath.__version__},
        "definition": {
            "q": "q = m_hat/m, m_hat the maximum-likelihood Weibull modulus of a complete sample of size n",
            "t": "t = m_hat*ln(th_hat/th), th_hat the maximum-likelihood characteristic strength",
            "unbiasingFactor": "UF(n) = 1/E[q]: the factor that makes UF*m_hat a mean-unbiased estimate of m "
                               "(E[UF*m_hat] = m). null for n = 2, where E[q] is infinite.",
            "unbiasingFactorSE": "Monte Carlo standard error of UF: sd(q)/sqrt(replications)/mean(q)^2",
            "medianUnbiasingFactor": "1/median(q): makes UF*m_hat median-unbiased; for comparison only",
            "q, t": "quantiles at the matching entries of 'probabilities' (numpy.quantile, method 'linear', "
                    "i.e. type 7)",
            "qSE, tSE": f"Monte Carlo standard errors of those quantiles from {BATCHES} batch quantiles "
                        "(sd/sqrt(batches)), 2 significant digits",
            "bounds": "two-sided level 1-2a: m_L = m_hat/q_(1-a), m_U = m_hat/q_a, th_L = th_hat*exp(-t_(1-a)/m_hat), "
                      "th_U = th_hat*exp(-t_a/m_hat); bounds use the raw (not unbiased) m_hat",
            "solver": "Newton on the ML shape equation with a bisection safeguard, vectorised; stops when the "
                      f"Newton step is below {REL_TOL:g} relative (root good to about 1e-15 relative)",
            "degenerate": "a sample whose values are all equal (for n = 2: a tie) has no finite ML modulus; it "
                          "has probability zero and is redrawn (count in checks.redrawnSamples)",
            "between table rows": "not part of this file; the reader chooses (e.g. linear in 1/n)",
        },
        "precision": {
            "rounding": "values rounded to 6 significant digits, beyond the Monte Carlo precision",
            "maxRelativeSEofQQuantiles": sig(max_rel_q_se, 2),
            "maxSEofTQuantiles": sig(max_t_se, 2),
            "maxRelativeSEofQQuantiles_n10up": sig(max_rel_q_se10, 2),
            "maxSEofTQuantiles_n10up": sig(max_t_se10, 2),
            "note": "the largest errors sit in the extreme tails (p = 0.005, 0.995) at n = 2; see qSE/tSE per row",
            "maxSEofUnbiasingFactor_n4up": sig(max_uf_se, 2),
        },
        "probabilities": PROBABILITIES,
        "rows": table,
        "largeN": large_n,
        "checks": checks,
        "runSeconds": round(elapsed, 1),
        "cpu": f"{os.cpu_count()} cores, {args.workers} workers",
    }
    os.makedirs(os.path.dirname(os.path.abspath(args.out)), exist_ok=True)
    with open(args.out, "w") as fh:
        fh.write(dump_lines(out) + "\n")
    print(json.dumps({k: out[k] for k in ["precision", "largeN", "checks"]}, indent=1))
    if all(n in results for n in RECALLED):
        print(comparison(rows))
    print(f"wrote {args.out} in {elapsed:.1f} s")


if __name__ == "__main__":
    sys.exit(main())
