"""Every result of a report run as plain JSON-ready data, in the case's units (units named)."""

from __future__ import annotations

import numpy as np

from addin import text
from addin.report.compute import scalar
from addin.report.sheet_cleaning import short_name
from addin.report.sheet_window import allowed_ecd, binding_words
from addin.rheology_data import rheology_data
from calc.cleaning import CLEANING_METHODS
from calc.cleaning.hole import USES_ROTATION
from calc.units import label, unit_for

__all__ = ["results_data"]


def _c(v, kind, system):
    """SI → the case's unit (JSON numbers; non-finite → null): :func:`addin.text.display_values`."""
    return text.display_values(v, kind, system)


def results_data(results) -> dict:
    """The whole run: run info, summary rows, rheology, circulation, ECD, bit, cleaning, trips."""
    case, res = results.case, results.circulation
    s = case.unit_system
    kinds = (
        "depth",
        "length",
        "diameter",
        "density",
        "pressure",
        "pressure_gradient",
        "flow_rate",
        "velocity",
        "jet_velocity",
        "trip_speed",
        "stress",
        "power",
        "power_density",
        "force",
        "area",
    )
    out: dict = {
        "run": {
            "boreflow_version": results.version,
            "run_time": results.run_time,
            "inputs_sha256": case.hash,
            "source": case.source,
            "unit_system": s,
            "method": results.method,
            "fluid_fits": results.fluid.fits,
        },
        "units": {k: label(unit_for(k, s)) for k in kinds},
    }
    out["rheology"] = rheology_data(case, s)
    out["circulation"] = _circulation_data(results, s)
    if res.margins is not None:
        out["margins"] = _margins_data(res.margins, s)
    out["bit"] = _bit_data(res, s)
    if results.cleaning:
        out["cleaning"] = _cleaning_data(results.cleaning.result, s)
    if results.surge:
        out["trips"] = _trips_data(results.surge, s)
    if results.window is not None:
        out["operating_window"] = _window_data(results, s)
    out["circulation"]["tool_covered"] = list(res.tools.covered)
    if results.calibration is not None:
        out["calibration"] = _calibration_data(results.calibration, s)
    out["trend"] = [_trend_data(t, s) for t in results.trend]
    out["notes"] = [
        {
            "level": n.level,
            "code": n.code,
            "subject": text.subject(n, s),
            "message": text.note(n, s),
        }
        for n in results.notes
    ]
    return out


def _circulation_data(results, s) -> dict:
    """Rate, density, SPP breakdown (keyed by their words, as the --json output always was),
    BHP, ECD and the per-interval table of the string and annulus."""
    res = results.circulation
    bd = {text.BREAKDOWN_LABELS[k]: _c(v, "pressure", s) for k, v in res.breakdown().items()}
    iv = results.well.flow_intervals()
    intervals = []
    for path, rows, group in (
        ("string", iv.select("string"), res.string),
        ("annulus", iv.select("annulus"), res.annulus),
    ):
        flow, losses = group.flow, group.losses
        vel = np.atleast_1d(flow.velocity).reshape(-1)
        for i, span in enumerate(group.spans):
            intervals.append(
                {
                    "path": path,
                    "name": text.span(span, s, depths=False),
                    "top_md": _c(rows.top_md[i], "depth", s),
                    "bottom_md": _c(rows.bottom_md[i], "depth", s),
                    "outer_diameter": _c(rows.outer_diameter[i], "diameter", s),
                    "inner_diameter": _c(rows.inner_diameter[i], "diameter", s),
                    "velocity": _c(vel[i], "velocity", s),
                    "regime": int(np.atleast_1d(flow.regime).reshape(-1)[i]),
                    "reynolds": float(np.atleast_1d(flow.reynolds).reshape(-1)[i]),
                    "fanning_friction_factor": float(
                        np.atleast_1d(flow.friction_factor).reshape(-1)[i]
                    ),
                    "gradient": _c(
                        np.atleast_1d(flow.gradient).reshape(-1)[i], "pressure_gradient", s
                    ),
                    "loss": _c(np.atleast_1d(losses).reshape(-1)[i], "pressure", s),
                }
            )
    return {
        "flow_rate": _c(res.q, "flow_rate", s),
        "density": _c(res.density, "density", s),
        "standpipe_pressure": _c(res.standpipe_pressure, "pressure", s),
        "breakdown": bd,
        "static_bhp": _c(res.static_bhp, "pressure", s),
        "circulating_bhp": _c(res.circulating_bhp, "pressure", s),
        "esd_bit": _c(res.esd_bit, "density", s),
        "ecd_bit": _c(res.ecd_bit, "density", s),
        "pump_power": _c(res.pump_power, "power", s),
        "intervals": intervals,
    }


def _margins_data(mt, s) -> dict:
    """The named check points and the tightest point."""
    named = [i for i, p in enumerate(mt.points) if p.role != "depth"]
    return {
        "points": [
            {
                "name": text.check_point(mt.points[i], s),
                "md": _c(mt.md[i], "depth", s),
                "tvd": _c(mt.tvd[i], "depth", s),
                "pore": _c(mt.pore[i], "density", s),
                "fracture": _c(mt.fracture[i], "density", s),
                "ecd": _c(mt.ecd[i], "density", s),
                "fracture_margin": _c(mt.fracture_margin[i], "density", s),
                "pore_margin": _c(mt.pore_margin[i], "density", s),
            }
            for i in named
        ],
        "tightest": {
            "name": text.check_point(mt.tightest.point, s),
            "md": _c(mt.tightest.md, "depth", s),
            "limit": str(mt.tightest.limit),
            "margin": _c(mt.tightest.margin, "density", s),
            "required": _c(mt.tightest.required, "density", s),
        },
    }


def _bit_data(res, s) -> dict:
    bh = res.bit
    return {
        "tfa": _c(bh.tfa, "area", s),
        "nozzle_velocity": _c(bh.nozzle_velocity, "jet_velocity", s),
        "pressure_drop": _c(bh.pressure_drop, "pressure", s),
        "hydraulic_power": _c(bh.hydraulic_power, "power", s),
        "hsi": _c(bh.hsi, "power_density", s),
        "impact_force": _c(bh.impact_force, "force", s),
        "share_of_standpipe": scalar(res.bit_share),
        "method": bh.method,
    }


def _cleaning_data(hc, s) -> dict:
    ctrl = hc.spans.index(hc.controlling_interval)
    return {
        "method": hc.method,
        "criteria": hc.criteria_text,
        "rpm": hc.rpm,
        "methods": list(CLEANING_METHODS),
        "uses_rotation": dict(USES_ROTATION),
        "controlling_interval": short_name(hc.controlling_interval),
        "controlling_top_md": _c(float(hc.top_md[ctrl]), "depth", s),
        "controlling_bottom_md": _c(float(hc.bottom_md[ctrl]), "depth", s),
        "controlling_rate": _c(hc.controlling_rate, "flow_rate", s),
        "controlling_governing": str(hc.governing[ctrl]),
        "controlling_method_rates": {
            m: _c(float(hc.method_rates[m][ctrl]), "flow_rate", s) for m in CLEANING_METHODS
        },
        "intervals": [
            {
                **{k: v for k, v in r.items() if not isinstance(v, float)},
                "interval": short_name(r["interval"]),
                "top_md": _c(r["top_md"], "depth", s),
                "bottom_md": _c(r["bottom_md"], "depth", s),
                "inclination": r["inclination"],
                "annular_velocity": _c(r["annular_velocity"], "velocity", s),
                "slip_velocity": _c(r["slip_velocity"], "velocity", s),
                "transport_ratio": r["transport_ratio"],
                "concentration": r["concentration"],
                "cci": r["cci"],
                "critical_rate": _c(r["critical_rate"], "flow_rate", s),
                "rubiandini_critical_rate": _c(r["rubiandini_critical_rate"], "flow_rate", s),
                "rubiandini_factor": r["rubiandini_factor"],
                "larsen_angle_factor": r["larsen_angle_factor"],
                "method_rates": {m: _c(r[f"{m}_rate"], "flow_rate", s) for m in CLEANING_METHODS},
                "minimum_rate": _c(r["minimum_rate"], "flow_rate", s),
                "rate_slope_bound_per_degree": _c(r["rate_slope_bound"], "flow_rate", s),
            }
            for r in hc.table()
        ],
    }


def _trips_data(trip, s) -> dict:
    lim = trip.limits
    return {
        "method": lim.method,
        "string_end": lim.string_end,
        "max_running_speed": _c(lim.max_running_speed, "trip_speed", s),
        "max_pulling_speed": _c(lim.max_pulling_speed, "trip_speed", s),
        "speeds": _c(trip.speeds, "trip_speed", s),
        "surge_at_bit": _c(trip.running.pressure_bit, "pressure", s),
        "swab_at_bit": _c(trip.pulling.pressure_bit, "pressure", s),
    }


def _calibration_data(cal, s) -> dict:
    return {
        "label": cal.label,
        "friction_multiplier": scalar(cal.multiplier),
        "measured_spp": _c(cal.measured_spp, "pressure", s),
        "fixed_loss": _c(cal.fixed_loss, "pressure", s),
        "frictional_loss": _c(cal.frictional_loss, "pressure", s),
        "calibrated_ecd_bit": _c(scalar(cal.calibrated.ecd_bit), "density", s),
    }


def _trend_data(t, s) -> dict:
    return {
        "check": t.label,
        "bit_md": _c(t.bit_md, "depth", s),
        "density": _c(t.density, "density", s),
        "flow_rate": _c(t.q, "flow_rate", s),
        "pv": _c(t.pv, "viscosity", s),
        "yp": _c(t.yp, "stress", s),
        "spp_predicted": _c(t.spp, "pressure", s),
        "spp_measured": _c(t.measured_spp, "pressure", s),
        "spp_deviation_percent": t.spp_deviation_percent,
        "ecd_model_at_pwd": _c(t.model_ecd_at_pwd, "density", s),
        "ecd_pwd": _c(t.pwd_ecd, "density", s),
        "tightest": None
        if t.tightest is None
        else {
            "name": text.check_point(t.tightest.point, s),
            "limit": str(t.tightest.limit),
            "margin": _c(float(t.tightest.margin), "density", s),
        },
        "missing": list(t.missing),
    }


def _limit_kind(name: str):
    """Unit kind of a calc.rate_window margin curve, by the limit's name
    (OperatingWindow.limits)."""
    if name in ("fracture", "pore"):
        return "density"
    if name == "surface rating":
        return "pressure"
    if "flow window" in name:
        return "flow_rate"
    return "dimensionless"  # hole cleaning: relative margin


def _window_data(results, s) -> dict:
    """calc.rate_window.OperatingWindow of the run: ends, binding limits (names and words),
    curves."""
    ow = results.window
    f_lim, p_lim = allowed_ecd(ow)
    return {
        "method": ow.method,
        "feasible": ow.feasible,
        "low_rate": _c(ow.q_low, "flow_rate", s) if ow.feasible else None,
        "high_rate": _c(ow.q_high, "flow_rate", s) if ow.feasible else None,
        "binding_low": ow.binding_low,
        "binding_high": ow.binding_high,
        "binding_low_words": binding_words(ow, "low", long=True, system=s),
        "binding_high_words": binding_words(ow, "high", long=True, system=s),
        "check_rate": _c(results.case.check_value(-1, "flow_rate"), "flow_rate", s),
        "min_cleaning_rate": _c(ow.min_cleaning_rate, "flow_rate", s) if results.cleaning else None,
        "controlling_interval": short_name(ow.controlling_interval),
        "fracture_margin": _c(ow.fracture_margin, "density", s),
        "pore_margin": _c(ow.pore_margin, "density", s),
        "surface_rating": _c(ow.surface_rating, "pressure", s),
        "curves": {
            "flow_rate": _c(ow.q, "flow_rate", s),
            "standpipe_pressure": _c(ow.spp, "pressure", s),
            "ecd_fracture_point": _c(ow.ecd_fracture_point, "density", s),
            "fracture_at_point": _c(ow.fracture_at_point, "density", s),
            "max_ecd_fracture_point": _c(f_lim, "density", s),
            "fracture_point_name": [text.check_point(x, s) for x in ow.fracture_point_name],
            "ecd_pore_point": _c(ow.ecd_pore_point, "density", s),
            "pore_at_point": _c(ow.pore_at_point, "density", s),
            "min_ecd_pore_point": _c(p_lim, "density", s),
            "pore_point_name": [text.check_point(x, s) for x in ow.pore_point_name],
            "cleaning_indicator": _c(ow.cleaning_indicator, None, s),
            "min_transport_ratio": _c(ow.min_transport_ratio, None, s),
            "max_concentration": _c(ow.max_concentration, None, s),
        },
        "limit_margins": {
            name: {
                "unit": "relative"
                if _limit_kind(name) == "dimensionless"
                else label(unit_for(_limit_kind(name), s)),
                "values": _c(m, _limit_kind(name), s),
            }
            for name, m in ow.limits.items()
        },
    }
