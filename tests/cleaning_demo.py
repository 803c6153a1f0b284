"""Demo-case inputs for the cleaning, surge and window tests (workbooks/demo-case.toml, invented
data).  Builds on tests/demo_well.py; adds the fluid, cuttings, ROP and trip data."""

from __future__ import annotations

from calc.circulation.fluid import HydraulicsFluid
from calc.cleaning import Cuttings
from calc.rheology import ViscometerReadings, fit
from calc.units import to_si
from tests.demo_well import (  # noqa: F401  (re-exported for the tests)
    case,
    check,
    demo_margins,
    demo_rate,
    demo_surface_rating,
    demo_weak_points,
    demo_well,
    demo_window,
    ft,
    inch,
    ppg,
)


def demo_readings(index: int = 0) -> ViscometerReadings:
    c = check(index)
    speeds = sorted(c["dial"], key=float, reverse=True)
    return ViscometerReadings(
        [float(s) for s in speeds], [float(c["dial"][s]) for s in speeds], gels=c["gels"]
    )


def demo_fluid(index: int = 0) -> HydraulicsFluid:
    """API RP 13D (2010) HB fit, both paths (what ``api13d_2010_hb`` uses)."""
    model = fit(demo_readings(index), "api13d_2010_hb").model
    return HydraulicsFluid(ppg(check(index)["density"]), model, model, label=check(index)["label"])


def demo_cuttings(index: int = 0) -> Cuttings:
    cu = check(index)["cuttings"]
    return Cuttings(
        size=inch(cu["size"]), density=to_si(2.6, "sg"), sphericity=float(cu["sphericity"])
    )


def demo_rop(index: int = 0) -> float:
    return to_si(check(index)["rop"], "ft/hour")


def demo_gel_10min(index: int = 0) -> float:
    return to_si(check(index)["gels"]["10min"], "lbf/100ft2")
