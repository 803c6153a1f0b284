"""Benchmark: the demo liner cement job (workbooks/demo-case.toml [cement_job], invented),
about 2,000 volume steps × the placement path's segments × the fluids (prints only).

Run:  python3 tests/benchmarks/placement.py [--steps 2000] [--loop-steps 200]

Reports the whole simulation (the sequential state integration plus the vectorised evaluation),
then the vectorised evaluation of every step at once (calc.placement.simulate.evaluate_states)
against a scalar Python loop of the same function one step at a time, in the same process
(``--loop-steps`` evenly spaced steps, the per-step time scaled to all steps), with the peak
memory of each (tracemalloc) and the largest ECD difference between the two.  Nothing is
asserted; timings depend on the machine.
"""

from __future__ import annotations

import argparse
import sys
import time
import tracemalloc
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from addin.case import load_case
from addin.cement_job import cement_job
from calc.circulation.hydrostatics import gravity_for
from calc.placement.simulate import evaluate_states
from tests.demo_well import CASE_FILE


def _peak(fn):
    tracemalloc.start()
    t0 = time.perf_counter()
    out = fn()
    dt = time.perf_counter() - t0
    peak = tracemalloc.get_traced_memory()[1]
    tracemalloc.stop()
    return dt, peak, out


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--steps", type=int, default=2000)
    ap.add_argument("--loop-steps", type=int, default=200)
    a = ap.parse_args(argv)
    case = load_case(CASE_FILE)
    method = case.hydraulics_method()
    t0 = time.perf_counter()
    job = cement_job(case, method, steps=a.steps)
    t_sim = time.perf_counter() - t0
    tl = job.timeline
    g, tr = tl.geometry, tl.train
    n, s, f = tl.pumped.size, g.leg.size, len(tr.fluids)
    args = (
        g,
        tr,
        [p for p in tl.points if p.role != "toc"],
        None,
        tl.margins,
        tl.method,
        0.0,
        tl.surface_rating,
        gravity_for("exact"),
    )
    win = case.window
    args = (*args[:3], win, *args[4:])
    states = (tl.time, tl.pumped, tl.returned, tl.pump_rate, tl.return_rate, tl.free_fall)
    t_vec, m_vec, vec = _peak(lambda: evaluate_states(*args, *states))
    idx = np.unique(np.linspace(0, n - 1, min(a.loop_steps, n)).round().astype(int))

    def loop():
        return [evaluate_states(*args, *(x[i : i + 1] for x in states)).ecd[0] for i in idx]

    t_loop, m_loop, rows = _peak(loop)
    diff = float(np.max(np.abs(np.array(rows) - vec.ecd[idx])))
    per_step_loop = t_loop / idx.size
    print(f"demo liner job: {n} steps x {s} segments x {f} fluids = {n * s * f:,} cells")
    print(f"whole simulation (integration + evaluation): {t_sim:.2f} s")
    print(f"vectorised evaluation, all steps: {t_vec:.3f} s, peak {m_vec / 2**20:.1f} MiB")
    print(
        f"scalar loop, {idx.size} steps: {t_loop:.3f} s ({per_step_loop * 1e3:.2f} ms/step), "
        f"peak {m_loop / 2**20:.1f} MiB; scaled to {n} steps: {per_step_loop * n:.2f} s"
    )
    print(
        f"loop / vectorised: {per_step_loop * n / t_vec:.1f} x; largest ECD difference "
        f"{diff:.3g} kg/m3"
    )
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
