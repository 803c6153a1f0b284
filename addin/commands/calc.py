"""``boreflow calc QUANTITY``: one-off numbers (hydrostatic, annular velocity, bit, circulate)."""

from __future__ import annotations

import sys

from addin import text
from addin.case import CaseInputError, load_case, parse_quantity
from addin.commands.exit_codes import EXIT_OK
from addin.commands.output import json_text
from addin.guard import case_verdict, collecting, finding_text, unusual_error
from addin.guard import check as guard_check
from addin.report.compute import report_fluid, scalar
from addin.report.jsonout import json_key
from calc.bit import Bit, bit_hydraulics, parse_nozzles
from calc.circulation import Margins, hydrostatic_pressure
from calc.circulation.loop import circulate
from calc.cleaning import annular_velocity
from calc.errors import InputError, check_order
from calc.units import from_si, label, unit_for

__all__ = ["run"]


#: The plausibility quantity (calc/plausibility.py) of each option, by option name.
_GUARD = {
    "--density": "fluid_density",
    "--tvd": "depth",
    "--rate": "flow_rate",
    "--hole": "hole_diameter",
    "--pipe": "pipe_diameter",
    "--size": "hole_diameter",
}


def _q(value, kind, system, name):
    """A command-line value: a number in the system's unit, or 'number unit', checked against
    the option's plausibility ranges (impossible: error; unusual: noted in ``_UNUSUAL``)."""
    with collecting() as found:
        si = parse_quantity(_num_or_text(value), kind, system, name, _GUARD.get(name, ""))
    _FOUND.extend(case_verdict(found, system, "command line"))
    return si


#: unusual values of this run (refused unless --allow-unusual)
_FOUND: list = []


def _num_or_text(v):
    try:
        return float(v)
    except ValueError:
        return v


def _nozzles(text_in: str) -> tuple[int, ...]:
    sizes = parse_nozzles(text_in).sizes
    for i, n in enumerate(sizes, start=1):
        if n:  # 0 is a blanked port
            _FOUND.extend(
                f for f in [guard_check(n, "nozzle_32nds", f"--nozzles (nozzle {i}, 1/32 in)")] if f
            )
    return sizes


def _unusual(args) -> None:
    found, _FOUND[:] = list(_FOUND), []
    if not found:
        return
    if not getattr(args, "allow_unusual", False):
        raise unusual_error(found)
    for f in found:
        print(f"boreflow: warning: {finding_text(f)} (accepted: --allow-unusual)", file=sys.stderr)


def _show(d: dict, system: str, as_json: bool) -> None:
    rows = dict(d)
    if as_json:
        print(
            json_text(
                {
                    json_key(k.split(" (")[0]): {  # cli: snake_case key, the words in "label"
                        "label": k,
                        "value": None
                        if v is None
                        else (float(from_si(v, unit_for(kind, system), kind)) if kind else v),
                        "unit": label(unit_for(kind, system)) if kind else "",
                    }
                    for k, (v, kind) in rows.items()
                }
            )
        )
        return
    for k, (v, kind) in rows.items():
        if kind:
            val = float(from_si(v, unit_for(kind, system), kind))
            print(f"{k:34s} {val:12.4g} {label(unit_for(kind, system))}")
        else:
            print(f"{k:34s} {v}")


def run(args) -> int:
    """Print the quantities of ``args.quantity`` in ``args.units`` (text or JSON)."""
    _FOUND.clear()
    s = args.units
    if args.quantity == "hydrostatic":
        rho = _q(args.density, "density", s, "--density")
        tvd = _q(args.tvd, "depth", s, "--tvd")
        try:  # TVD 0 is the surface: 0 psi (legal)
            check_order("--tvd", tvd, ">=", 0.0, "the surface", "depth")
        except InputError as exc:
            raise CaseInputError.of(s, exc) from exc
        _unusual(args)
        p = hydrostatic_pressure(rho, tvd, hydrostatic=args.hydrostatic)
        _show(
            {
                "hydrostatic pressure": (p, "pressure"),
                "gradient": (  # per unit depth: defined at TVD 0 too (cli)
                    hydrostatic_pressure(rho, 1.0, hydrostatic=args.hydrostatic),
                    "pressure_gradient",
                ),
            },
            s,
            args.json,
        )
    elif args.quantity == "annular-velocity":
        q = _q(args.rate, "flow_rate", s, "--rate")
        hole = _q(args.hole, "diameter", s, "--hole")
        pipe = _q(args.pipe, "diameter", s, "--pipe")
        try:
            check_order("--pipe (pipe OD)", pipe, "<", hole, "the hole diameter --hole", "diameter")
        except InputError as exc:
            raise CaseInputError.of(s, exc) from exc
        _unusual(args)
        v = annular_velocity(q, hole, pipe)
        _show({"annular velocity": (v, "velocity")}, s, args.json)
    elif args.quantity == "bit":
        try:
            nozzles = _nozzles(args.nozzles)
        except InputError as exc:
            raise InputError(
                f"--nozzles {args.nozzles!r}: {exc.name}",
                exc.value,
                exc.allowed + " (e.g. 12,12,12,11,11,11 or 3x12,3x11)",
                exc.problem,
            ) from exc
        size = _q(args.size, "diameter", s, "--size")
        cd = guard_check(args.cd, "discharge_coefficient", "--cd", args.cd)
        _FOUND.extend([cd] if cd else [])
        rate = _q(args.rate, "flow_rate", s, "--rate")
        rho = _q(args.density, "density", s, "--density")
        _unusual(args)
        bit = Bit(size, nozzles=nozzles, discharge_coefficient=args.cd)
        bh = bit_hydraulics(rate, rho, bit)
        _show(
            {
                "total flow area": (bh.tfa, "area"),
                "nozzle velocity": (bh.nozzle_velocity, "jet_velocity"),
                "bit pressure drop": (bh.pressure_drop, "pressure"),
                "hydraulic power": (bh.hydraulic_power, "power"),
                "HSI": (bh.hsi, "power_density"),
                "impact force": (bh.impact_force, "force"),
            },
            s,
            args.json,
        )
    elif args.quantity == "circulate":
        case = load_case(args.case)
        s = args.units_given or case.unit_system
        q = (
            _q(args.rate, "flow_rate", case.unit_system, "--rate")
            if args.rate
            else case.check_value(-1, "flow_rate")
        )
        _FOUND.extend(case.unusual)
        _unusual(args)
        chk = case.checks[-1]
        method = case.hydraulics_method(args.method, args.constants)
        fluid = report_fluid(chk.readings, case.check_value(-1, "density"), method, chk.label)
        lim = case.limits
        res = circulate(
            case.well(-1),
            fluid,
            q,
            method=method,
            window=case.window,
            weak_points=case.weak_points,
            margins=Margins(lim["fracture_margin"], lim["pore_margin"]),
            surface_rating=lim["surface_rating"],
            **case.loss_options(-1, getattr(args, "joint_losses", None)),
        )
        d = {"flow rate": (scalar(res.q), "flow_rate")}
        d.update(
            {
                f"loss: {text.BREAKDOWN_LABELS[k]}": (scalar(v), "pressure")
                for k, v in res.breakdown().items()
            }
        )
        d["standpipe pressure"] = (scalar(res.standpipe_pressure), "pressure")
        d["ECD at the bit"] = (scalar(res.ecd_bit), "density")
        if res.margins is not None:
            t = res.margins.tightest
            where = text.check_point(t.point, s)
            d[f"tightest margin ({where}, {t.limit})"] = (float(t.margin), "density")
        _show(d, s, args.json)
    return EXIT_OK
