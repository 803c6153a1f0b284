"""The slurry lines of a case (``[[slurry_line]]``) as :class:`calc.slurry.SlurryLine` inputs.

The carrier is water (``carrier = "water"``, the default; ``carrier_density`` or 998.2 kg/m³,
1.0 mPa·s) or the Herschel-Bulkley fit (``hb_least_squares``) of a named ``[[check]]`` or
``[[slurry]]`` with its density.  The concentration is ``concentration``, or it follows from
``slurry_density``; given both, they must agree (:func:`calc.slurry.volume_concentration`).
Errors name the file and key in the case's units (:class:`addin.case.CaseInputError`).
"""

from __future__ import annotations

from addin.case import CaseInputError
from calc.errors import InputError
from calc.rheology import fit
from calc.slurry import Carrier, SlurryLine, Solids, volume_concentration

__all__ = ["carrier_of", "slurry_lines"]

#: water at about 20 °C (IAPWS-95 rounded): density [kg/m³] and viscosity [Pa·s]
WATER_DENSITY, WATER_VISCOSITY = 998.2, 1.0e-3


def _fluids(case):
    for c in case.checks:
        yield c.label, c.readings, c.values.get("density")
    for s in case.slurries:
        yield s.name, s.readings, s.values.get("density")


def carrier_of(case, item: dict, where: str) -> Carrier:
    """The carrier of one slurry line (water, or a named check or slurry's HB fit)."""
    name = str(item.get("carrier", "water")).strip()
    if name.lower() == "water":
        return Carrier.water(item.get("carrier_density", WATER_DENSITY), WATER_VISCOSITY)
    known = {label: (r, rho) for label, r, rho in _fluids(case)}
    if name not in known:
        raise InputError(
            f"{where}.carrier",
            name,
            "water, or the label of a [[check]] or the name of a "
            "[[slurry]]: " + ", ".join(["water", *known]),
            problem="unknown",
        )
    readings, density = known[name]
    if density is None:
        raise InputError(
            f"{where}.carrier", name, "a check or slurry with a density", problem="no density"
        )
    m = fit(readings, "hb_least_squares").model
    return Carrier(density, m.tau_y, m.k, m.n)


def _line(case, i: int, item: dict) -> SlurryLine:
    where = f"{case.source}: slurry_line[{i}]"
    carrier = carrier_of(case, item, where)
    cv = item.get("concentration")
    if "slurry_density" in item:
        cv = volume_concentration(
            item["slurry_density"], carrier.density, item["solids_density"], cv
        )
    if cv is None:
        raise InputError(
            f"{where}.concentration",
            None,
            "a solids concentration or a slurry density",
            problem="missing",
        )
    rates = []
    if "rate" in item:
        rates.append(item["rate"])
    if "rate_range" in item:
        rates += [r for r in item["rate_range"] if r not in rates]
    solids = Solids(item["solids_density"], cv, item["d50"], item.get("d85", item["d50"]))
    kw = {}
    if "roughness" in item:
        kw["roughness"] = item["roughness"]
    return SlurryLine(
        item["name"],
        item["id"],
        item["length"],
        solids,
        carrier,
        rates=tuple(sorted(rates)),
        inclination=item.get("inclination", 0.0),
        elevation_change=item.get("elevation_change"),
        method=str(item.get("method", "four_component_2006")).strip(),
        **kw,
    )


def slurry_lines(case) -> tuple[SlurryLine, ...]:
    """Every ``[[slurry_line]]`` of ``case`` as a calc input (empty without the section)."""
    out = []
    for i, item in enumerate(case.sections.get("slurry_line", ()), start=1):
        try:
            out.append(_line(case, i, item))
        except InputError as exc:
            if exc.name.startswith(case.source):
                raise CaseInputError.of(case.unit_system, exc) from exc
            raise CaseInputError.of(
                case.unit_system, exc, f"{case.source}: slurry_line[{i}]: {exc.name}"
            ) from exc
    return tuple(out)
