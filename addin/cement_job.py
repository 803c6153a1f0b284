"""The ``[cement_job]`` section of a case → the calc placement inputs and the timeline.

A thin adapter: reads the section (SI values, :mod:`addin.case`), fits the slurries and the mud
for the case's hydraulics method (:func:`calc.circulation.hydraulics_fluid_from_readings`), builds
the liner-job path (:func:`calc.placement.liner_job_geometry`) and the pump schedule, and runs
:func:`calc.placement.simulate_placement`.  No engineering formula lives here.
"""

from __future__ import annotations

from dataclasses import dataclass

from calc.circulation import Margins, hydraulics_fluid_from_readings
from calc.errors import InputError
from calc.hydraulics_method import resolve_method
from calc.placement import (
    FluidTrain,
    PlacementFluid,
    PlacementPoint,
    PlacementTimeline,
    PumpStage,
    contact_time,
    density_hierarchy,
    friction_hierarchy,
    liner_job_geometry,
    simulate_placement,
)
from calc.placement.checks import DisplacementCheck

__all__ = ["SLURRY_FIT", "CementJob", "cement_job", "slurry_fit"]

#: The fit of spacers and slurries for the placement (their readings have no 600 rpm): the
#: least-squares fit of the model the friction law takes (Herschel-Bulkley unless the law needs
#: a Bingham plastic, a power law or a Newtonian fluid).
SLURRY_FIT = "hb_least_squares"
_FIT_FOR_LAW = {
    "bingham": "bingham_least_squares",
    "power_law": "power_law_least_squares",
    "api13d_1995": "power_law_least_squares",
    "newtonian": "newtonian_least_squares",
}


def slurry_fit(friction: str) -> str:
    """The least-squares fit for spacers and slurries under friction law ``friction``."""
    return next((f for k, f in _FIT_FOR_LAW.items() if friction.startswith(k)), SLURRY_FIT)


@dataclass(frozen=True, eq=False)
class CementJob:
    """The placement timeline and the displacement checks of a case's cement job."""

    timeline: PlacementTimeline
    density: tuple[DisplacementCheck, ...]
    friction: tuple[DisplacementCheck, ...]
    contact: tuple[DisplacementCheck, ...]
    zone: str


def _fluid(readings, density, method, name, role) -> PlacementFluid:
    hf = hydraulics_fluid_from_readings(
        readings, method, density=density, label=name, fit_notes=False
    )
    return PlacementFluid(name, role, float(density), hf.pipe_parameters, hf.annulus_parameters)


def cement_job(case, method, steps: int = 2000) -> CementJob | None:
    """Run the case's ``[cement_job]`` (None when the case has none)."""
    cj = case.sections.get("cement_job")
    if not cj or case.window is None or not case.slurries:
        return None  # the placement needs the pore-fracture window and the slurries
    src = case.source
    labels = [c.label for c in case.checks]
    mud_label = cj["mud"]
    if mud_label not in labels:
        raise InputError(
            f"{src}: cement_job.mud", mud_label, f"the label of a [[check]] ({', '.join(labels)})"
        )
    ci = labels.index(mud_label)
    mud = _fluid(
        case.checks[ci].readings, case.check_value(ci, "density"), method, mud_label, "mud"
    )
    slurries = {s.name: s for s in case.slurries}
    train_fluids = [mud]
    volumes = []
    names = list(cj.get("spacers", ())) + list(cj["slurries"])
    vols = list(cj.get("spacer_volumes", ())) + list(cj["slurry_volumes"])
    if len(vols) != len(names):
        raise InputError(
            f"{src}: cement_job.slurry_volumes",
            len(vols),
            f"one volume per spacer and slurry ({len(names)})",
        )
    n_sp = len(cj.get("spacers", ()))
    for i, (nm, v) in enumerate(zip(names, vols, strict=True)):
        if nm not in slurries:
            raise InputError(
                f"{src}: cement_job fluid", nm, f"the name of a [[slurry]] ({', '.join(slurries)})"
            )
        s = slurries[nm]
        role = "spacer" if i < n_sp else "slurry"
        # cement-mode readings stop at 300 rpm (API RP 10B-2): least-squares HB over all speeds
        sf = slurry_fit(method.friction)
        sm = resolve_method(method, pipe_fit=sf, annulus_fit=sf, constants="exact")
        train_fluids.append(_fluid(s.readings, s.values["density"], sm, nm, role))
        volumes.append(v)
    train_fluids.append(
        PlacementFluid(
            f"{mud_label} (displacement)", "displacement", mud.density, mud.pipe, mud.annulus
        )
    )
    train = FluidTrain(tuple(train_fluids), tuple(volumes))
    casings = case.casings
    last = max(casings, key=lambda c: c.bottom)
    weak = case.weak_points
    td = cj.get("hole_depth", cj["shoe"])
    pts = [
        PlacementPoint("casing_shoe", last.name, last.bottom, last.shoe_test),
        PlacementPoint("liner_top", "liner top", cj["liner_top"]),
    ]
    for w in weak:
        if w.md <= cj["shoe"] and abs(w.md - last.bottom) > 1e-6:
            pts.append(PlacementPoint("weak_point", w.name, w.md, w.fracture, w.pore))
    pts.append(PlacementPoint("shoe", "liner shoe", cj["shoe"]))
    pts.append(PlacementPoint("td", "TD", td))
    pts.sort(key=lambda p: p.md)
    geom = liner_job_geometry(
        case.survey,
        case.hole(td),
        pipe_od=cj["pipe_od"],
        pipe_id=cj["pipe_id"],
        liner_od=cj["liner_od"],
        liner_id=cj["liner_id"],
        liner_top=cj["liner_top"],
        shoe=cj["shoe"],
        float_collar=cj.get("float_collar"),
        split_md=[p.md for p in pts if p.md <= cj["shoe"]],
    )
    rate = cj["pump_rate"]
    stages = [PumpStage(rate, v, label=nm) for nm, v in zip(names, vols, strict=True)]
    if cj.get("plug_drop_time"):
        stages.append(PumpStage(0.0, duration=cj["plug_drop_time"], label="drop the plug"))
    disp = cj["displacement_rate"]
    slow, slow_v = cj.get("slow_rate"), cj.get("slow_volume")
    if slow is not None and slow_v is not None:
        nominal = geom.float_collar_s - slow_v
        if nominal <= 0:
            raise InputError(
                f"{src}: cement_job.slow_volume",
                slow_v,
                "< the displacement volume to the float collar",
                kind="volume",
            )
        stages.append(PumpStage(disp, nominal, label="displacement"))
        stages.append(PumpStage(slow, label="displacement, slow"))
    else:
        stages.append(PumpStage(disp, label="displacement"))
    lim = case.limits
    tl = simulate_placement(
        geom,
        train,
        stages,
        pts,
        window=case.window,
        margins=Margins(fracture=lim["fracture_margin"], pore=lim["pore_margin"]),
        method=method.friction,
        steps=steps,
        surface_rating=lim["surface_rating"],
    )
    zone = next((p for p in pts if p.role == "weak_point"), None)
    zone = zone or next(p for p in pts if p.role == "shoe")
    contact = tuple(contact_time(tl, i, zone.md) for i in range(1, 1 + n_sp))
    return CementJob(
        tl, tuple(density_hierarchy(train)), tuple(friction_hierarchy(tl)), contact, zone.name
    )
