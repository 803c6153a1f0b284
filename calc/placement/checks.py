"""Displacement checks of a placement (calc/METHODS.md §24.4) — common practice.

* **density hierarchy**: each fluid heavier than the one it displaces in the annulus, by at
  least a margin (common practice; 10 % of the lighter density is the figure given in Nelson &
  Guillot 2006, ch. 5 — value from memory, not checked against the source);
* **friction-pressure hierarchy**: each fluid's frictional pressure gradient in the annulus
  at least 20 % above that of the fluid ahead (same source and status);
* **contact time**: time the spacer (or any fluid) covers a depth of interest; ≥ 10 min is a
  customary target (common practice, from memory).

The pair behind the top plug (the displacement behind the last slurry) is separated by the
plug and is not checked.  A published displacement-efficiency criterion for an eccentric
annulus is not implemented here (calc/METHODS.md §24.4 says why).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.errors import InputError, check_nonnegative
from calc.placement.simulate import PlacementTimeline
from calc.placement.train import FluidTrain

__all__ = ["DisplacementCheck", "contact_time", "density_hierarchy", "friction_hierarchy"]

#: Density step required between successive fluids, as a fraction of the lighter one
#: (common practice; Nelson & Guillot 2006 ch. 5 — from memory, not checked against the source).
DENSITY_STEP = 0.10
#: Friction-gradient step required between successive fluids (same source and status).
FRICTION_STEP = 0.20
#: Customary spacer contact time across the zone of interest [s] (common practice, 10 min).
CONTACT_TIME = 600.0


@dataclass(frozen=True)
class DisplacementCheck:
    """One check between the fluid ahead and the fluid behind: ``value`` (behind − ahead, or a
    ratio/time as ``quantity`` says), ``required`` and ``ok``."""

    check: str
    ahead: str
    behind: str
    value: float
    required: float
    ok: bool


def _pairs(train: FluidTrain):
    fl = train.fluids
    return [(i, i + 1) for i in range(len(fl) - 1) if fl[i + 1].role != "displacement"]


def density_hierarchy(train: FluidTrain, step: float = DENSITY_STEP) -> list[DisplacementCheck]:
    """ρ_behind − ρ_ahead [kg/m³] against ``step`` × ρ_ahead for each displacing pair.

    Examples
    --------
    >>> from calc.placement.train import PlacementFluid
    >>> w = (0.0, 0.001, 1.0)
    >>> t = FluidTrain((PlacementFluid("mud", "mud", 1300.0, w, w),
    ...                 PlacementFluid("spacer", "spacer", 1500.0, w, w),
    ...                 PlacementFluid("cement", "slurry", 1600.0, w, w),
    ...                 PlacementFluid("mud", "displacement", 1300.0, w, w)), (5.0, 10.0))
    >>> [(c.behind, round(c.value), round(c.required), c.ok) for c in density_hierarchy(t)]
    [('spacer', 200, 130, True), ('cement', 100, 150, False)]
    """
    step = float(check_nonnegative("density step", step))
    out = []
    for a, b in _pairs(train):
        fa, fb = train.fluids[a], train.fluids[b]
        diff = fb.density - fa.density
        req = step * fa.density
        out.append(DisplacementCheck("density", fa.name, fb.name, diff, req, diff >= req))
    return out


def friction_hierarchy(
    timeline: PlacementTimeline, segment: int | None = None, step: float = FRICTION_STEP
) -> list[DisplacementCheck]:
    """Ratio of annular friction gradients behind/ahead − 1 at the final job rate in one annulus
    segment (default: the deepest), against ``step``.

    Examples
    --------
    >>> from calc.placement.train import PlacementFluid
    >>> import numpy as np
    >>> from types import SimpleNamespace
    >>> w = (0.0, 0.001, 1.0)
    >>> t = FluidTrain((PlacementFluid("mud", "mud", 1300.0, w, w),
    ...                 PlacementFluid("cement", "slurry", 1600.0, w, w),
    ...                 PlacementFluid("mud", "displacement", 1300.0, w, w)), (5.0,))
    >>> tl = SimpleNamespace(train=t, annulus_gradient=np.array([[[100.0], [130.0], [100.0]]]),
    ...                      return_rate=np.array([0.01]))
    >>> [(c.behind, round(c.value, 2), c.ok) for c in friction_hierarchy(tl)]
    [('cement', 0.3, True)]
    """
    step = float(check_nonnegative("friction step", step))
    g = np.asarray(timeline.annulus_gradient)
    moving = np.flatnonzero(np.asarray(timeline.return_rate) > 0)
    if moving.size == 0:
        raise InputError("placement", "no flow", "a timeline with flow in the annulus")
    row = g[moving[-1]]
    j = 0 if segment is None else int(segment)
    out = []
    for a, b in _pairs(timeline.train):
        ga, gb = row[a, j], row[b, j]
        ratio = gb / ga - 1.0 if ga > 0 else np.inf
        out.append(
            DisplacementCheck(
                "friction",
                timeline.train.fluids[a].name,
                timeline.train.fluids[b].name,
                float(ratio),
                step,
                bool(ratio >= step),
            )
        )
    return out


def contact_time(
    timeline: PlacementTimeline, fluid: int, md: float, required: float = CONTACT_TIME
) -> DisplacementCheck:
    """Time [s] fluid ``fluid`` (index in the train) is across annulus depth ``md`` [m].

    Examples
    --------
    The 2 m³ spacer passes the shoe in 2 m³ ÷ 0.01 m³/s = 200 s (to one volume step); 5 m³
    of cement behind it in a vertical 1,000 m well at 0.01 m³/s:

    >>> from calc.geometry import Survey
    >>> from calc.circulation import PressureWindow
    >>> from calc.placement import (FluidTrain, PlacementFluid, PlacementGeometry,
    ...                             PlacementPoint, PumpStage, simulate_placement)
    >>> w = (0.0, 50.0, 1.0)  # viscous: no free fall, returns at the pump rate
    >>> g = PlacementGeometry(Survey([0.0, 1000.0], [0.0, 0.0], [0.0, 0.0]),
    ...     [("string", 0.0, 1000.0, 0.1, 0.0), ("annulus", 1000.0, 0.0, 0.2, 0.12)], 1000.0)
    >>> t = FluidTrain((PlacementFluid("water", "mud", 1000.0, w, w),
    ...                 PlacementFluid("spacer", "spacer", 1100.0, w, w),
    ...                 PlacementFluid("cement", "slurry", 1900.0, w, w),
    ...                 PlacementFluid("water", "displacement", 1000.0, w, w)), (2.0, 5.0))
    >>> win = PressureWindow([0.0, 1000.0], [900.0, 900.0], [2500.0, 2500.0])
    >>> tl = simulate_placement(g, t, [PumpStage(0.01)], [PlacementPoint("shoe", "shoe", 1000.0)],
    ...                         window=win, method="newtonian", steps=200)
    >>> c = contact_time(tl, 1, 1000.0)
    >>> round(c.value), c.ok
    (201, False)
    """
    geom = timeline.geometry
    s_x = float(geom.s_at("annulus", md))
    lo = timeline.fluid_top_s[:, fluid]
    hi = timeline.fluid_bottom_s[:, fluid]
    across = (lo <= s_x) & (hi >= s_x) & (hi > lo)
    dt = np.diff(timeline.time)
    t = float(np.sum(dt[across[:-1]]))
    name = timeline.train.fluids[fluid].name
    return DisplacementCheck("contact_time", name, name, t, float(required), t >= required)
