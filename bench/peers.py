"""Peers for `npm run bench`: the same data, fitted and summed by the tools an
engineer would otherwise use, and a 40-digit reference solution.

    python3 bench/peers.py serve WORKDIR

Answers one JSON request per line on stdin with one JSON line on stdout, so bench/run.ts
can alternate turns (ours, peer, ours, peer, ...) with one warm python process, each turn
timed here with time.perf_counter around `batch` calls (seconds per call). Requests:

  {"task": "versions"}
  {"task": "fit", "file": "fit-30.f64", "peer": "newton" | "scipy", "batch": k}
      strengths as little-endian float64 in WORKDIR; "newton" is a numpy Newton solve of
      the same ML equation as the project (the fair peer), "scipy" is
      scipy.stats.weibull_min.fit with the location fixed at 0 (a general-purpose optimiser)
  {"task": "pia", "principal": "...", "sizes": "...", "shape": m, "batch": k}
      the PIA element sum in numpy over 2^20 x 3 principal stresses
  {"task": "mpmath", "file": "...", "startShape": m0}
      the 40-digit solution of the maximum-likelihood equations (ASTM C1239 section 7,
      complete sample): sum x^m ln x / sum x^m - mean(ln x) - 1/m = 0,
      sigma_theta = (sum x^m / N)^(1/m)

Only numpy is imported at the top: bench/peer_rows.py imports ml_numpy_newton from here,
and its start-up must not pay for scipy or mpmath.
"""

import json
import os
import sys
import time

import numpy as np


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
    import mpmath

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


def pia_sum(principal, sizes, m):
    """PIA effective size as numpy users write it: sum_e V_e sum_i (max(s_i, 0) / s_peak)^m."""
    peak = principal.max()
    tension = np.clip(principal, 0.0, None) / peak
    return float(np.dot(sizes, (tension**m).sum(axis=1))), float(peak)


def scipy_fit(x):
    from scipy import stats

    shape, _loc, scale = stats.weibull_min.fit(x, floc=0)
    return float(shape), float(scale)


def versions():
    import mpmath
    import pyarrow
    import scipy

    return {
        "python": sys.version.split()[0],
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "pyarrow": pyarrow.__version__,
        "mpmath": mpmath.__version__,
        "mpmathBackend": mpmath.libmp.BACKEND,
    }


def timed_batch(calls, fn):
    """Seconds per call over `calls` calls timed together, and the last result."""
    result = None
    start = time.perf_counter()
    for _ in range(calls):
        result = fn()
    return (time.perf_counter() - start) / calls, result


def serve(workdir):
    arrays = {}

    def load(name):
        if name not in arrays:
            arrays[name] = np.fromfile(os.path.join(workdir, name), dtype="<f8")
        return arrays[name]

    for line in sys.stdin:
        request = json.loads(line)
        task = request["task"]
        try:
            if task == "versions":
                reply = versions()
            elif task == "fit":
                x = load(request["file"])
                solve = ml_numpy_newton if request["peer"] == "newton" else scipy_fit
                seconds, (shape, scale) = timed_batch(request["batch"], lambda: solve(x))
                reply = {"seconds": seconds, "shape": shape, "scale": scale}
            elif task == "pia":
                principal = load(request["principal"]).reshape(-1, 3)
                sizes = load(request["sizes"])
                seconds, (effective, peak) = timed_batch(request["batch"], lambda: pia_sum(principal, sizes, request["shape"]))
                reply = {"seconds": seconds, "effectiveSize": effective, "peak": peak}
            elif task == "mpmath":
                start = time.perf_counter()
                shape, scale = ml_mpmath(load(request["file"]), request["startShape"])
                reply = {"shape": shape, "scale": scale, "seconds": time.perf_counter() - start}
            else:
                reply = {"error": f"unknown task {task!r}"}
        except Exception as error:  # the report shows it; the bench goes on with the other rows
            reply = {"error": f"{type(error).__name__}: {error}"}
        sys.stdout.write(json.dumps(reply) + "\n")
        sys.stdout.flush()


if __name__ == "__main__":
    if len(sys.argv) != 3 or sys.argv[1] != "serve":
        sys.exit("usage: python3 bench/peers.py serve WORKDIR")
    serve(sys.argv[2])
