"""Benchmark: the demo well swept over 10,000 flow rates in one numpy pass (prints only).

Run:  python3 tests/benchmarks/bench_circulation.py [--method api13d_2010_hb] [--loop-rates 500]

Reports interval-evaluations per second (rates × flow intervals incl. surface lines), peak
memory of the vectorised call (tracemalloc), and the ratio against a scalar per-rate Python
loop of the same :func:`calc.circulation.circulate` in the same process (the loop runs over
``--loop-rates`` evenly spaced rates of the sweep and its per-rate time is scaled to 10,000;
``--loop-rates 10000`` runs the whole loop).  Nothing is asserted; timings depend on the machine.
"""

from __future__ import annotations

import argparse
import sys
import time
import tracemalloc
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))
sys.path.insert(0, str(Path(__file__).resolve().parents[2]))


from calc.circulation import circulate
from calc.units import to_si
from tests import demo_well as demo


def best_of(fn, repeat):
    best = np.inf
    out = None
    for _ in range(repeat):
        t0 = time.perf_counter()
        out = fn()
        best = min(best, time.perf_counter() - t0)
    return best, out


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--method", default="api13d_2010_hb")
    ap.add_argument("--rates", type=int, default=10_000)
    ap.add_argument("--loop-rates", type=int, default=500)
    ap.add_argument("--repeat", type=int, default=3)
    args = ap.parse_args(argv)

    well = demo.demo_well(0)
    fluid = demo.demo_fluid(args.method, 0)
    opts = demo.demo_options(0)
    q = to_si(np.linspace(300.0, 700.0, args.rates), "gpm")
    n_iv = len(well.flow_intervals()) + len(well.surface_lines)

    circulate(well, fluid, q[:10], method=args.method, **opts)  # warm-up (imports, caches)
    t_vec, res = best_of(lambda: circulate(well, fluid, q, method=args.method, **opts), args.repeat)
    tracemalloc.start()
    circulate(well, fluid, q, method=args.method, **opts)
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()

    t_nomargin, _ = best_of(lambda: circulate(well, fluid, q, method=args.method), args.repeat)
    t_prof, prof = best_of(lambda: res.profile(10.0), args.repeat)

    idx = np.unique(np.linspace(0, args.rates - 1, min(args.loop_rates, args.rates)).astype(int))
    t0 = time.perf_counter()
    loop_spp = [circulate(well, fluid, float(q[i]), method=args.method, **opts).standpipe_pressure
                for i in idx]  # fmt: skip
    t_loop = time.perf_counter() - t0
    per_rate = t_loop / idx.size
    t_loop_full = per_rate * args.rates
    agree = np.max(np.abs(np.asarray(loop_spp) / res.standpipe_pressure[idx] - 1.0))

    rho = to_si(np.linspace(10.0, 12.0, 100), "ppg")[:, None]
    from calc.circulation import HydraulicsFluid

    dens = HydraulicsFluid(rho, fluid.pipe_model, fluid.annulus_model)
    q2 = to_si(np.linspace(300.0, 700.0, 100), "gpm")[None, :]
    t_dens, _ = best_of(lambda: circulate(well, dens, q2, method=args.method, **opts), args.repeat)

    evals = args.rates * n_iv
    print(f"method: {args.method}; demo well day 1, bit at {well.bit_depth:.1f} m")
    print(f"flow intervals incl. surface lines: {n_iv}; rates: {args.rates}")
    print(f"vectorised sweep (margins + notes):   {t_vec * 1e3:9.1f} ms  "
          f"= {evals / t_vec:,.0f} interval-evaluations/s")  # fmt: skip
    print(f"vectorised sweep (no window/margins): {t_nomargin * 1e3:9.1f} ms  "
          f"= {evals / t_nomargin:,.0f} interval-evaluations/s")  # fmt: skip
    print(f"peak traced memory of the sweep:      {peak / 2**20:9.1f} MiB")
    print(f"ECD profile, 10 m grid ({prof.md.size} depths x {args.rates} rates): "
          f"{t_prof * 1e3:.1f} ms")  # fmt: skip
    print(f"scalar loop: {idx.size} rates in {t_loop:.2f} s = {per_rate * 1e3:.2f} ms/rate "
          f"-> {t_loop_full:.1f} s for {args.rates} rates")  # fmt: skip
    print(f"speed-up of the vectorised sweep over the scalar loop: {t_loop_full / t_vec:,.0f}x")
    print(f"largest relative SPP difference loop vs sweep: {agree:.2e}")
    print(f"density x rate sweep 100 x 100: {t_dens * 1e3:.1f} ms")


if __name__ == "__main__":
    main()
