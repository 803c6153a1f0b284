"""Overhead of the worksheet-function layer against calling calc directly (prints only).

    python tests/benchmarks/bench_sheets.py

For each pair: the worksheet function called as a spreadsheet would call it (oilfield
numbers, a nozzle text, a readings range, a 10,000-row column of rates as a list of lists),
and calc called with SI values prepared beforehand.  Times are medians of repeated runs on
this machine; the ratio is what the adapter (normalising cells, units, guard, output
cleaning) costs.  Nothing is asserted.
"""

import statistics
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from addin.sheets.functions import BF_ANN_GRAD, BF_BIT_DP
from calc import bit as cb
from calc import circulation as cc
from calc import flow as cf
from calc import rheology as cr
from calc import units as cu

READINGS = [[600, 56], [300, 37], [200, 29], [100, 20], [6, 8], [3, 7]]
GPM, PPG, INCH = cu.si_factor("gpm"), cu.si_factor("ppg"), cu.si_factor("in")


def timeit(fn, repeat=7, number=None):
    if number is None:
        t0 = time.perf_counter()
        fn()
        one = time.perf_counter() - t0
        number = max(1, int(0.2 / max(one, 1e-7)))
    runs = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        for _ in range(number):
            fn()
        runs.append((time.perf_counter() - t0) / number)
    return statistics.median(runs)


def report(label, sheet_fn, calc_fn):
    ts, tc = timeit(sheet_fn), timeit(calc_fn)
    print(
        f"{label:52s} sheet {ts * 1e6:10.1f} µs   calc {tc * 1e6:10.1f} µs   "
        f"overhead {ts - tc:+.2e} s   ratio {ts / tc:6.2f}"
    )


def main():
    tfa = cb.total_flow_area("3x12 3x11")
    rho = 11.0 * PPG
    r = cr.ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7])
    fluid = cc.hydraulics_fluid_from_readings(r, density=rho)
    ta, ka, na = fluid.annulus_parameters
    rates_gpm = np.linspace(200.0, 900.0, 10_000)
    column = [[float(x)] for x in rates_gpm]
    rates_si = rates_gpm * GPM

    print("boreflow worksheet-function overhead (median of 7 runs)")
    report(
        "BF_BIT_DP scalar vs calc.bit.bit_pressure_drop",
        lambda: BF_BIT_DP(11.0, "3x12 3x11", 522.0),
        lambda: cb.bit_pressure_drop(522.0 * GPM, rho, tfa),
    )
    report(
        "BF_BIT_DP 10,000 rows vs calc (array)",
        lambda: BF_BIT_DP(11.0, "3x12 3x11", column),
        lambda: cb.bit_pressure_drop(rates_si, rho, tfa),
    )
    report(
        "BF_ANN_GRAD scalar vs calc.flow.annulus_flow",
        lambda: BF_ANN_GRAD(11.0, READINGS, 8.6, 5.0, 522.0),
        lambda: cf.annulus_flow(
            522.0 * GPM, 8.6 * INCH, 5 * INCH, density=rho, tau_y=ta, k=ka, n=na
        ),
    )
    report(
        "BF_ANN_GRAD scalar vs calc incl. readings + fit",
        lambda: BF_ANN_GRAD(11.0, READINGS, 8.6, 5.0, 522.0),
        lambda: cf.annulus_flow(
            522.0 * GPM,
            8.6 * INCH,
            5 * INCH,
            density=rho,
            tau_y=cc.hydraulics_fluid_from_readings(
                cr.ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7]),
                density=rho,
            ).annulus_parameters[0],
            k=ka,
            n=na,
        ),
    )
    report(
        "BF_ANN_GRAD 10,000 rows vs calc (array)",
        lambda: BF_ANN_GRAD(11.0, READINGS, 8.6, 5.0, column),
        lambda: cf.annulus_flow(rates_si, 8.6 * INCH, 5 * INCH, density=rho, tau_y=ta, k=ka, n=na),
    )


if __name__ == "__main__":
    main()
