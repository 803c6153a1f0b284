"""``boreflow calc QUANTITY``: one-off numbers (hydrostatic, annular velocity, bit, circulate)."""

from __future__ import annotations

from addin import text
from addin.case import load_case, parse_quantity
from addin.commands.exit_codes import EXIT_OK
from addin.commands.output import json_text
from addin.report.compute import report_fluid, scalar
from addin.report.jsonout import json_key
from calc.bit import Bit, bit_hydraulics
from calc.circulation import Margins, hydrostatic_pressure
from calc.circulation.loop import circulate
from calc.cleaning import annular_velocity
from calc.units import from_si, label, unit_for

__all__ = ["run"]


def _q(value, kind, system, name):
    """A command-line value: a number in the system's unit, or 'number unit'."""
    return parse_quantity(_num_or_text(value), kind, system, name)


def _num_or_text(v):
    try:
        return float(v)
    except ValueError:
        return v


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
    s = args.units
    if args.quantity == "hydrostatic":
        rho = _q(args.density, "density", s, "--density")
        tvd = _q(args.tvd, "depth", s, "--tvd")
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
        v = annular_velocity(
            _q(args.rate, "flow_rate", s, "--rate"),
            _q(args.hole, "diameter", s, "--hole"),
            _q(args.pipe, "diameter", s, "--pipe"),
        )
        _show({"annular velocity": (v, "velocity")}, s, args.json)
    elif args.quantity == "bit":
        nozzles = tuple(int(x) for x in args.nozzles.replace(" ", "").split(",") if x)
        bit = Bit(
            _q(args.size, "diameter", s, "--size"), nozzles=nozzles, discharge_coefficient=args.cd
        )
        bh = bit_hydraulics(
            _q(args.rate, "flow_rate", s, "--rate"),
            _q(args.density, "density", s, "--density"),
            bit,
        )
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
