"""How far the exact constants are from the printed ones (API RP 13D 1995; calc/METHODS.md §7.9).

Run:  python -m tests.benchmarks.printed_constants

Prints, for each field constant, printed/exact − 1; for fixed K, n the gradient difference the
friction-law constants make (laminar and turbulent, pipe and annulus); the fits' n and K
differences; and the demo circuit's components, SPP and ECD at the bit with both sets.  Prints
figures only; nothing is asserted (tests/test_constants_as_printed.py and
tests/test_circulation_demo.py hold the checks).  The well and mud are the invented demo data.
"""

from __future__ import annotations

import numpy as np

from calc.circulation import circulate, hydraulics_fluid_from_readings
from calc.flow import annulus_flow, pipe_flow
from calc.flow.methods_api import api95_constants
from calc.hydraulics_method import resolve_method
from calc.rheology import ViscometerReadings, fit
from calc.units import from_si, to_si
from tests import demo_well as demo

FIELDS = ("n_pipe", "n_annulus", "dial_stress", "rate_600", "rate_100", "velocity", "reynolds",
          "gradient", "bit")  # fmt: skip


def constants() -> None:
    e, p = api95_constants("exact"), api95_constants("as_printed")
    for f in FIELDS:
        print(f"{f:12s} printed {getattr(p, f):10.5g}  exact {getattr(e, f):12.7g}  "
              f"printed/exact - 1 = {100 * (p.ratio(f) - 1):+.4f} %")  # fmt: skip


def gradients() -> None:
    q = to_si(np.geomspace(20, 1200, 300), "gpm")
    rho = to_si(12.0, "ppg")
    for n in (0.3, 0.5, 0.7, 0.9, 1.0):
        for geo in ("pipe", "annulus"):
            res = {}
            for c in ("exact", "as_printed"):
                kw = dict(density=rho, tau_y=0.0, k=0.05, n=n, method="api13d_1995_power_law")
                if geo == "pipe":
                    res[c] = pipe_flow(q, to_si(4.276, "in"), constants=c, **kw)
                else:
                    res[c] = annulus_flow(q, to_si(8.5, "in"), to_si(5, "in"), constants=c, **kw)
            e, p = res["exact"], res["as_printed"]
            same = e.regime == p.regime
            rel = 100 * (p.gradient / e.gradient - 1)
            lam, tur = same & (e.regime == 0), same & (e.regime == 2)
            print(f"n={n} {geo:7s} laminar {rel[lam].min():+.3f}..{rel[lam].max():+.3f} %  "
                  f"turbulent {rel[tur].min():+.3f}..{rel[tur].max():+.3f} %  "
                  f"regime differs at {np.sum(~same)} of {q.size} rates")  # fmt: skip


def fits() -> None:
    for speeds, dial in (([3, 6, 100, 200, 300, 600], [7, 8, 20, 29, 37, 56]),
                         ([3, 100, 300, 600], [3, 20, 39, 65])):  # fmt: skip
        r = ViscometerReadings(speeds, dial)
        for name in ("api13d_1995_pipe", "api13d_1995_annulus"):
            fe, fp = fit(r, name).model, fit(r, name, constants="as_printed").model
            dn, dk = 100 * (fp.n / fe.n - 1), 100 * (fp.k / fe.k - 1)
            print(f"{dial} {name}: n {dn:+.3f} %, K {dk:+.3f} %")


def circuit() -> None:
    for day in (0, 1):
        out = {}
        for c in ("exact", "as_printed"):
            m = resolve_method("api13d_1995_power_law", constants=c)
            fl = hydraulics_fluid_from_readings(
                demo.demo_readings(day), m, density=demo.ppg(demo.check(day)["density"])
            )
            out[c] = circulate(
                demo.demo_well(day), fl, demo.demo_rate(day), method=m, **demo.demo_options(day)
            )
        e, p = out["exact"], out["as_printed"]
        print(f"demo check {day + 1}:")
        be, bp = e.breakdown(), p.breakdown()
        for k in be:
            if be[k]:
                print(
                    f"  {k:9s} exact {from_si(be[k], 'psi'):9.2f} psi  printed "
                    f"{from_si(bp[k], 'psi'):9.2f}  {100 * (bp[k] / be[k] - 1):+.3f} %"
                )
        se, sp = e.standpipe_pressure, p.standpipe_pressure
        print(f"  SPP       exact {from_si(se, 'psi'):9.2f} psi  printed {from_si(sp, 'psi'):9.2f}"
              f"  {100 * (sp / se - 1):+.3f} %")  # fmt: skip
        ee, ep = from_si(e.ecd_bit, "ppg"), from_si(p.ecd_bit, "ppg")
        print(f"  ECD bit   exact {ee:.4f} ppg  printed {ep:.4f}  {ep - ee:+.4f} ppg")


if __name__ == "__main__":
    constants()
    gradients()
    fits()
    circuit()
