"""The demo case (workbooks/demo-case.toml, invented data) as calc objects, for the tests and
benchmarks: the well, pressure window, weak points, margins, fluid and circulate() options.
The project's full case loader lives in addin/case.py; this one reads only what the
calculation tests need, in oilfield units.  Shared by the circulation, geometry, cleaning,
surge and window tests (through tests/cleaning_demo.py) and tests/benchmarks/."""

from __future__ import annotations

import tomllib
from functools import lru_cache
from pathlib import Path

import numpy as np

from calc.bit import Bit
from calc.circulation import Margins, PressureWindow, WeakPoint
from calc.geometry import (
    DrillString,
    Hole,
    HoleSection,
    StringComponent,
    SurfaceLine,
    Survey,
    ToolPressureDrop,
    Well,
)
from calc.units import to_si

CASE_FILE = Path(__file__).resolve().parents[1] / "workbooks" / "demo-case.toml"


@lru_cache(maxsize=1)
def case() -> dict:
    with CASE_FILE.open("rb") as fh:
        return tomllib.load(fh)


def ft(x):
    return to_si(x, "ft")


def inch(x):
    return to_si(x, "in")


def ppg(x):
    return to_si(x, "ppg")


def check(index: int = 0) -> dict:
    return case()["check"][index]


def survey_td() -> float:
    """Measured depth of the last survey station [m] (the planned TD)."""
    return ft(case()["survey"]["stations"][-1][0])


def demo_well(
    index: int = 0,
    *,
    bit_depth: float | None = None,
    hole_depth: float | None = None,
    extra_casing=(),
) -> Well:
    """The demo well of check ``index``.

    ``bit_depth`` [m] overrides the check's bit depth; ``hole_depth`` [m] the depth the hole is
    drilled to (default: the bit depth); ``extra_casing`` adds :class:`HoleSection` casings.
    """
    c = case()
    st = np.array(c["survey"]["stations"], dtype=float)
    survey = Survey(ft(st[:, 0]), st[:, 1], st[:, 2])
    casings = [
        HoleSection(
            k["name"],
            ft(k["top"]),
            ft(k["shoe"]),
            inch(k["id"]),
            "casing",
            drift=inch(k["drift"]),
            shoe_test=ppg(k["shoe_test"]) if "shoe_test" in k else None,
            od=inch(k["od"]),
        )
        for k in c["casing"]
    ]
    casings.extend(extra_casing)
    bit_md = ft(check(index)["bit_depth"]) if bit_depth is None else bit_depth
    oh = c["open_hole"]
    hole = Hole.from_casing(
        casings,
        depth=bit_md if hole_depth is None else hole_depth,
        bit_size=inch(oh["bit_size"]),
        diameter=inch(oh["diameter"]),
    )
    comps = []
    for k in c["string"]:
        kw = {}
        if "tool_joint_od" in k:
            kw = dict(
                tool_joint_od=inch(k["tool_joint_od"]),
                tool_joint_id=inch(k["tool_joint_id"]),
                joint_length=ft(k["joint_length"]),
                tool_joint_length=ft(k["tool_joint_length"]),
            )
        length = k["length"] if isinstance(k["length"], str) else ft(k["length"])
        comps.append(
            StringComponent(
                k["name"],
                inch(k["od"]),
                inch(k["id"]),
                length,
                float_valve=bool(k.get("float_valve", False)),
                **kw,
            )
        )
    b = c["bit"]
    bit = Bit(
        inch(b["size"]),
        nozzles=tuple(b["nozzles"]),
        discharge_coefficient=b["discharge_coefficient"],
        ports=b["ports"],
        name=b["name"],
    )
    lines = [SurfaceLine(x["name"], ft(x["length"]), inch(x["id"])) for x in c["surface_line"]]
    t = c["tool_pressure"]
    tools = [
        ToolPressureDrop(
            to_si(t["reference_drop"], "psi"),
            ppg(t["reference_density"]),
            to_si(t["reference_rate"], "gpm"),
            flow_window=tuple(to_si(np.array(t["flow_window"]), "gpm")),
            name="RSS + MWD/LWD",
            components=tuple(t.get("covers", ())),
        )
    ]
    return Well(survey, hole, DrillString(comps), bit, lines, tools, bit_md)


def demo_window() -> PressureWindow:
    w = case()["pressure_window"]
    return PressureWindow(
        ft(np.array(w["tvd"])), ppg(np.array(w["pore"])), ppg(np.array(w["fracture"]))
    )


def demo_weak_points() -> tuple[WeakPoint, ...]:
    return tuple(
        WeakPoint(
            k["name"],
            ft(k["md"]),
            ppg(k["fracture"]),
            ppg(k["pore"]) if "pore" in k else None,
        )
        for k in case()["weak_point"]
    )


def demo_margins() -> Margins:
    lim = case()["limits"]
    return Margins(fracture=ppg(lim["fracture_margin"]), pore=ppg(lim["pore_margin"]))


def demo_surface_rating() -> float:
    return to_si(case()["limits"]["surface_rating"], "psi")


def demo_rate(index: int = 0) -> float:
    return to_si(check(index)["flow_rate"], "gpm")


def demo_readings(index: int = 0):
    from calc.rheology import ViscometerReadings

    c = check(index)
    return ViscometerReadings.from_mapping(c["dial"], label=c["label"])


def demo_fluid(method: str = "api13d_2010_hb", index: int = 0):
    from calc.circulation import hydraulics_fluid_from_readings

    return hydraulics_fluid_from_readings(
        demo_readings(index), method, density=ppg(check(index)["density"])
    )


def demo_options(index: int = 0) -> dict:
    """The circulate() keywords of the demo case: window, weak points, margins, rating.  (The
    tools whose bore the fixed drop covers travel on the well: [tool_pressure].covers.)"""
    return dict(
        window=demo_window(),
        weak_points=demo_weak_points(),
        margins=demo_margins(),
        surface_rating=demo_surface_rating(),
    )


def demo_pumps():
    """The demo's [[pump]] sections as calc.pumps.Pump (oilfield units converted)."""
    from calc.pumps import Pump

    return tuple(
        Pump(
            p["name"], inch(p["liner"]), inch(p["stroke"]), p["efficiency"],
            kind=p.get("kind", "triplex"),
            rated_power=to_si(float(p["rated_power"].split()[0]), "hp"),
            liner_rating=to_si(p["liner_rating"], "psi"),
        )
        for p in case()["pump"]
    )  # fmt: skip
