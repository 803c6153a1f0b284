"""The case's downhole conditions (``[temperature]`` and a check's composition) → calc.downhole.

Parse → call calc → no formula: the mud's retort and base fluid come from the latest mud check,
the temperatures from the ``[temperature]`` section (calc/METHODS.md §20).  Without a
``[temperature]`` section nothing is computed and the report is today's.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from addin.case import Case, CaseInputError
from calc.circulation import CirculationResult
from calc.downhole import (
    BASE_FLUIDS,
    CirculatingInputs,
    DownholeConditions,
    DownholeProfile,
    MudComposition,
    TemperatureTable,
    downhole_profile,
)
from calc.errors import InputError

__all__ = ["DownholeRun", "compute_downhole", "conditions_of", "tightest"]


@dataclass(frozen=True)
class DownholeRun:
    """The downhole profile of the report's circulation, with the weak points' values.

    ``weak_points``: (name, md [m], ECD with T/p [kg/m³], ECD with the surface mud [kg/m³]).
    ``tightest``: the weak point (or shoe) with the least fracture margin on the surface mud.
    """

    conditions: DownholeConditions
    profile: DownholeProfile
    weak_points: tuple[tuple[str, float, float, float], ...]
    base_fluid: str


def _composition(case: Case, index: int) -> tuple[MudComposition, str]:
    chk = case.checks[index]
    v = chk.values
    where = f"{case.source}: check '{chk.label}'"
    base = v.get("base_fluid") or "water"
    if base not in BASE_FLUIDS:
        raise CaseInputError(case.unit_system, f"{where}.base_fluid", base, ", ".join(BASE_FLUIDS))
    phase = BASE_FLUIDS[base][0]
    water_base = v.get("water_phase") or ("brine" if base == "brine" else "water")
    oil_base = base if phase == "oil" else "diesel"
    try:
        if v.get("oil_water_ratio") is not None:
            solids = float(v.get("solids") or 0.0) / 100.0
            comp = MudComposition.from_ratio(
                v["oil_water_ratio"], solids, oil_base=oil_base, water_base=water_base
            )
        else:
            solids = float(v.get("solids") or 0.0)
            oil = float(v.get("oil") or 0.0)
            water = v.get("water")
            water = 100.0 - solids - oil if water is None else float(water)
            if phase == "water" and oil > 0.0 and base != "brine":
                base = "water"
            comp = MudComposition(
                oil / 100.0, water / 100.0, solids / 100.0, oil_base=oil_base, water_base=water_base
            )
    except InputError as exc:
        raise CaseInputError.of(case.unit_system, exc, f"{where}.{exc.name}") from exc
    return comp, base


def conditions_of(case: Case, index: int = -1) -> DownholeConditions | None:
    """The downhole conditions of the case (None without a ``[temperature]`` section)."""
    t = case.sections.get("temperature")
    if not t:
        return None
    comp, _ = _composition(case, index)
    where = f"{case.source}: temperature"
    try:
        table = None
        if t.get("table_tvd") is not None or t.get("table_temperature") is not None:
            table = TemperatureTable(
                tuple(t.get("table_tvd") or ()), tuple(t.get("table_temperature") or ())
            )
        circ = None
        if t.get("inlet_temperature") is not None:
            circ = CirculatingInputs(
                t["inlet_temperature"],
                t.get("heat_capacity", 1675.0),
                t.get("u_pipe", 570.0),
                t.get("u_annulus", 57.0),
            )
        ref = t.get("mud_weight_temperature", t.get("inlet_temperature"))
        cond = DownholeConditions(
            comp,
            t.get("surface_temperature"),
            t.get("geothermal_gradient"),
            table,
            reference_temperature=ref,
            circulating=circ,
        )
        cond.static_at(0.0)  # checks the gradient now, with the case's key in the message
    except InputError as exc:
        raise CaseInputError.of(case.unit_system, exc, f"{where}.{exc.name}") from exc
    return cond


def compute_downhole(case: Case, res: CirculationResult, step: float) -> DownholeRun | None:
    """The downhole profile of ``res`` (None without a ``[temperature]`` section)."""
    cond = conditions_of(case)
    if cond is None:
        return None
    _, base = _composition(case, -1)
    bit = float(res.bit_md)
    wps = [(w.name, float(w.md)) for w in case.weak_points if 0.0 < float(w.md) <= bit]
    try:
        prof = downhole_profile(res, cond, step=step, at=[md for _, md in wps])
    except InputError as exc:
        raise CaseInputError.of(case.unit_system, exc, f"{case.source}: temperature") from exc
    rows = tuple(
        (name, md, float(prof.at("ecd", md)), float(prof.at("ecd_surface", md))) for name, md in wps
    )
    return DownholeRun(cond, prof, rows, base)


def tightest(run: DownholeRun, case: Case) -> tuple[str, float, float, float] | None:
    """The weak point with the least fracture margin on the T/p-corrected ECD."""
    best, margin = None, np.inf
    limits = {w.name: float(w.fracture) for w in case.weak_points}
    for row in run.weak_points:
        m = limits[row[0]] - row[2]
        if m < margin:
            best, margin = row, m
    return best
