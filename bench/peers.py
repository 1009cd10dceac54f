"""Peers for `npm run bench`: the same data, fitted and summed by the tools an
engineer would otherwise use, and a 40-digit reference solution.

    python3 bench/peers.py WORKDIR

WORKDIR/spec.json (written by bench/run.ts) names little-endian float64 files:
  fits:  [{"n": N, "file": "fit-N.f64"}, ...]    strengths of complete samples
  pia:   {"principal": "...", "sizes": "...", "shape": m}   2^20 x 3 principal stresses
  runs:  {"small": R, "large": R}               timing repetitions (medians)
  mpmathMaxN: largest n solved at 40 digits

Every timing is a median after one warm-up call, with the fastest and slowest run.
Prints one JSON object on stdout: scipy.stats.weibull_min.fit (location fixed
at 0), a numpy Newton solve of the same ML equation (the fair peer), numpy
element-sum timings and values, and the mpmath solution of the
maximum-likelihood equations (ASTM C1239 section 7, complete sample):
  sum x^m ln x / sum x^m - mean(ln x) - 1/m = 0,  sigma_theta = (sum x^m / N)^(1/m).
"""

import json
import os
import statistics
import sys
import time

import mpmath
import numpy as np
import scipy
from scipy import stats


def timed(fn, runs):
    """Median, fastest and slowest of `runs` timings after one warm-up call (as bench/measure.ts does)."""
    fn()
    times = []
    result = None
    for _ in range(runs):
        start = time.perf_counter()
        result = fn()
        times.append(time.perf_counter() - start)
    return statistics.median(times), result, min(times), max(times)


def ml_numpy_newton(x):
    """The fair peer for the ML fit: the project's own iteration, vectorised in numpy.

    Same equation, start, step and stopping rule as src/weibull/maximum-likelihood.ts for a
    complete sample: x / max(x), moment start m0 = pi / (sqrt(6) sd(ln x)), Halley's step from
    the weighted moments of ln x (the Newton step where Halley's correction would more than halve
    or double it), stop when the step is below 1e-11 m, and the scale from the sum at the last
    iterate carried to the returned modulus by its cumulant series (no extra pass). Plain sums
    (numpy's pairwise summation), no bracket.
    """
    top = x.max()
    logs = np.log(x / top)
    mean_log = logs.mean()
    m = np.pi / np.sqrt(6.0) / logs.std(ddof=1)
    log_sum = None
    for _ in range(200):
        w = np.exp(m * logs)
        wl = w * logs
        wll = wl * logs
        s0 = w.sum()
        mean = wl.sum() / s0
        second = wll.sum() / s0
        third = np.dot(wll, logs) / s0 - mean * (3.0 * second - 2.0 * mean * mean)
        variance = max(second - mean * mean, 0.0)
        g = mean - mean_log - 1.0 / m
        slope = variance + 1.0 / (m * m)
        newton = -g / slope
        ratio = g * (third - 2.0 / (m * m * m)) / (2.0 * slope * slope)
        step = newton / (1.0 - ratio) if abs(ratio) <= 0.5 else newton
        if abs(step) <= 1e-11 * m:
            log_sum = np.log(s0) + step * (mean + 0.5 * step * variance)
            m += step
            break
        m += step
    if log_sum is None:
        log_sum = np.log(np.exp(m * logs).sum())
    scale = top * np.exp((log_sum - np.log(len(x))) / m)
    return float(m), float(scale)


def ml_mpmath(x, start_shape, digits=40):
    """Newton on the ML equation for m at `digits` digits, from a double-precision start."""
    mpmath.mp.dps = digits + 10
    logs = [mpmath.log(mpmath.mpf(float(v))) for v in x]
    n = len(logs)
    mean_log = mpmath.fsum(logs) / n
    shift = max(logs)  # x / max(x): every weight at most 1
    rel = [l - shift for l in logs]
    m = mpmath.mpf(start_shape)
    for _ in range(30):
        w = [mpmath.exp(m * r) for r in rel]
        s0 = mpmath.fsum(w)
        s1 = mpmath.fsum(wi * r for wi, r in zip(w, rel))
        s2 = mpmath.fsum(wi * r * r for wi, r in zip(w, rel))
        mean = s1 / s0
        g = mean + shift - mean_log - 1 / m
        dg = s2 / s0 - mean * mean + 1 / (m * m)
        step = g / dg
        m -= step
        if abs(step) < mpmath.mpf(10) ** (-(digits + 5)) * m:
            break
    w = [mpmath.exp(m * r) for r in rel]
    scale = mpmath.exp(shift) * (mpmath.fsum(w) / n) ** (1 / m)
    return mpmath.nstr(m, digits), mpmath.nstr(scale, digits)


def main():
    workdir = sys.argv[1]
    with open(os.path.join(workdir, "spec.json")) as f:
        spec = json.load(f)
    out = {
        "versions": {
            "python": sys.version.split()[0],
            "numpy": np.__version__,
            "scipy": scipy.__version__,
            "mpmath": mpmath.__version__,
            "mpmathBackend": mpmath.libmp.BACKEND,
        },
        "fits": [],
    }
    runs = spec["runs"]
    for item in spec["fits"]:
        x = np.fromfile(os.path.join(workdir, item["file"]), dtype="<f8")
        r = runs["small"] if len(x) < 100000 else runs["large"]
        seconds, (shape, _loc, scale), fastest, slowest = timed(lambda: stats.weibull_min.fit(x, floc=0), r)
        entry = {"n": int(len(x)), "seconds": seconds, "fastest": fastest, "slowest": slowest, "shape": float(shape), "scale": float(scale)}
        seconds, (shape, scale), fastest, slowest = timed(lambda: ml_numpy_newton(x), r)
        entry["newton"] = {"seconds": seconds, "fastest": fastest, "slowest": slowest, "shape": shape, "scale": scale}
        if len(x) <= spec["mpmathMaxN"]:
            start = time.perf_counter()
            entry["mpmathShape"], entry["mpmathScale"] = ml_mpmath(x, item["startShape"])
            entry["mpmathSeconds"] = time.perf_counter() - start
        out["fits"].append(entry)

    pia = spec.get("pia")
    if pia:
        principal = np.fromfile(os.path.join(workdir, pia["principal"]), dtype="<f8").reshape(-1, 3)
        sizes = np.fromfile(os.path.join(workdir, pia["sizes"]), dtype="<f8")
        m = pia["shape"]

        def pia_sum():
            peak = principal.max()
            tension = np.clip(principal, 0.0, None) / peak
            return float(np.dot(sizes, (tension**m).sum(axis=1))), float(peak)

        seconds, (effective, peak), fastest, slowest = timed(pia_sum, runs["large"])
        out["pia"] = {"seconds": seconds, "fastest": fastest, "slowest": slowest, "effectiveSize": effective, "peak": peak, "rows": int(len(sizes))}

    csv = spec.get("csv")
    if csv:
        path = os.path.join(workdir, csv["file"])

        def stream():
            table = np.loadtxt(path, delimiter=",", skiprows=1, usecols=(1, 2, 3, 4))
            p = table[:, :3]
            peak = p.max()
            return float(np.dot(table[:, 3], ((np.clip(p, 0.0, None) / peak) ** csv["shape"]).sum(axis=1)))

        seconds, effective, _fastest, _slowest = timed(stream, 1)
        out["csv"] = {"seconds": seconds, "effectiveSize": effective}

    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
