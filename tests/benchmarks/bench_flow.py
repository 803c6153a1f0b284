"""Benchmark: pipe and annulus gradients over 10,000 flow rates × a well-like set of intervals.

Run:  python -m tests.benchmarks.bench_flow  [--rates 10000] [--loop-rates 200]

Reports interval-evaluations per second of the vectorised calls, their peak traced memory
(tracemalloc), and the speed ratio against a scalar per-element Python loop over the same
functions in the same process.  Prints figures only; nothing is asserted (timings vary).
The geometry and fluid are invented demo values.
"""

from __future__ import annotations

import argparse
import time
import tracemalloc

import numpy as np

from calc.flow import annulus_flow, pipe_flow
from calc.units import to_si

# Invented well-like intervals (inches): five inside the string, five annular.
PIPE_ID_IN = [4.276, 4.276, 3.0, 2.8125, 3.25]  # drill pipe (two sections), HWDP, collars, MWD
ANNULUS_IN = [  # (hole or casing ID, pipe OD)
    (8.681, 5.0),  # casing × drill pipe
    (8.5, 5.0),  # open hole × drill pipe
    (8.5, 5.0),  # open hole × heavy-weight
    (8.5, 6.5),  # open hole × collars
    (8.5, 6.75),  # open hole × MWD
]

FLUIDS = {  # method → (tau_y Pa, k Pa·sⁿ, n), invented
    "api13d_2010_hb": (5.0, 0.4, 0.65),
    "api13d_1995_power_law": (0.0, 0.6, 0.6),
    "power_law": (0.0, 0.6, 0.6),
    "bingham": (7.0, 0.025, 1.0),
    "newtonian": (0.0, 0.02, 1.0),
    "exact_laminar": (5.0, 0.4, 0.65),
}
DENSITY = 1300.0


def _vector_run(method, q):
    ty, k, n = FLUIDS[method]
    d_pipe = to_si(np.array(PIPE_ID_IN), "in")
    d_hole = to_si(np.array([a for a, _ in ANNULUS_IN]), "in")
    d_od = to_si(np.array([b for _, b in ANNULUS_IN]), "in")
    qq = q[:, None]
    a = dict(density=DENSITY, tau_y=ty, k=k, n=n, method=method)
    rp = pipe_flow(qq, d_pipe[None, :], **a)
    ra = annulus_flow(qq, d_hole[None, :], d_od[None, :], eccentricity=0.3, **a)
    return rp.gradient, ra.gradient


def _scalar_run(method, q):
    ty, k, n = FLUIDS[method]
    a = dict(density=DENSITY, tau_y=ty, k=k, n=n, method=method)
    out_p = np.empty((q.size, len(PIPE_ID_IN)))
    out_a = np.empty((q.size, len(ANNULUS_IN)))
    for i, qi in enumerate(q):
        for j, d in enumerate(PIPE_ID_IN):
            out_p[i, j] = pipe_flow(float(qi), d * 0.0254, **a).gradient
        for j, (dh, dp) in enumerate(ANNULUS_IN):
            out_a[i, j] = annulus_flow(
                float(qi), dh * 0.0254, dp * 0.0254, eccentricity=0.3, **a
            ).gradient
    return out_p, out_a


def bench(method, n_rates, n_loop):
    q = to_si(np.linspace(100.0, 1000.0, n_rates), "gpm")
    n_int = len(PIPE_ID_IN) + len(ANNULUS_IN)
    _vector_run(method, q[:10])  # warm-up
    t0 = time.perf_counter()
    gp, ga = _vector_run(method, q)
    t_vec = time.perf_counter() - t0
    tracemalloc.start()
    _vector_run(method, q)
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    ql = q[:: max(1, n_rates // n_loop)][:n_loop]
    t0 = time.perf_counter()
    sp, sa = _scalar_run(method, ql)
    t_loop = time.perf_counter() - t0
    idx = np.searchsorted(q, ql)
    agree = max(float(np.max(np.abs(sp / gp[idx] - 1))), float(np.max(np.abs(sa / ga[idx] - 1))))
    vec_rate = n_rates * n_int / t_vec
    loop_rate = ql.size * n_int / t_loop
    return dict(
        method=method,
        evals=n_rates * n_int,
        t_vec=t_vec,
        vec_rate=vec_rate,
        peak_mb=peak / 1e6,
        loop_evals=ql.size * n_int,
        loop_rate=loop_rate,
        ratio=vec_rate / loop_rate,
        agree=agree,
    )


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--rates", type=int, default=10_000)
    p.add_argument("--loop-rates", type=int, default=200)
    p.add_argument("--exact-rates", type=int, default=1_000)
    args = p.parse_args(argv)
    print(
        f"{'method':24s} {'evals':>8s} {'time s':>8s} {'evals/s':>11s} {'peak MB':>8s} "
        f"{'loop evals/s':>13s} {'ratio':>7s} {'max |vec/loop-1|':>17s}"
    )
    for method in FLUIDS:
        n_rates = args.exact_rates if method == "exact_laminar" else args.rates
        n_loop = min(args.loop_rates, 20) if method == "exact_laminar" else args.loop_rates
        r = bench(method, n_rates, n_loop)
        print(
            f"{r['method']:24s} {r['evals']:8d} {r['t_vec']:8.3f} {r['vec_rate']:11.4g} "
            f"{r['peak_mb']:8.1f} {r['loop_rate']:13.4g} {r['ratio']:7.0f} {r['agree']:17.2e}"
        )


if __name__ == "__main__":
    main()
