"""Every result of a report run as plain JSON-ready data, in the case's units (units named)."""

from __future__ import annotations

import re

import numpy as np

from addin import text
from addin.report.compute import scalar
from addin.report.sheet_beds import beds_data
from addin.report.sheet_cleaning import short_name
from addin.report.sheet_downhole import downhole_data
from addin.report.sheet_slurry_line import slurry_line_data
from addin.report.sheet_trips import point_label
from addin.report.sheet_window import allowed_ecd, binding_words
from addin.report.trace import used_methods
from addin.rheology_data import rheology_data
from calc.cleaning import CLEANING_METHODS
from calc.cleaning.hole import USES_ROTATION
from calc.units import label, unit_for

__all__ = ["json_key", "results_data", "rheology_json"]


#: JSON keys of model-parameter symbols (the text output keeps the symbols).
_SYMBOL_KEYS = {"K": "k", "n": "n", "μ": "mu", "μp": "mu_p", "τy": "tau_y"}


def json_key(words: str) -> str:
    """A stable snake_case JSON key for display words or a symbol.

    >>> json_key("surface rating"), json_key("τy"), json_key("hole cleaning (max)")
    ('surface_rating', 'tau_y', 'hole_cleaning_max')
    """
    if words in _SYMBOL_KEYS:
        return _SYMBOL_KEYS[words]
    key = re.sub(r"[^a-z0-9]+", "_", str(words).lower()).strip("_") or "value"
    return key if key[0].isalpha() else f"x_{key}"


def rheology_json(data: dict) -> dict:
    """:func:`addin.rheology_data.rheology_data` with snake_case keys for JSON: fit parameters
    keyed ``k``/``n``/``tau_y``/``mu``/``mu_p`` (the symbol kept as ``symbol``), gels keyed
    ``gel_10s``/``gel_10min``/``gel_30min``, reading differences as a list of
    ``{"rpm", "difference_deg"}``.  The text output reads the original."""

    def fluid(d: dict) -> dict:
        d = dict(d)
        d["gels"] = {f"gel_{k}": v for k, v in d["gels"].items()}
        d["fits"] = [
            {
                **f,
                "parameters": {json_key(k): {**v, "symbol": k} for k, v in f["parameters"].items()},
            }
            for f in d["fits"]
        ]
        return d

    out = dict(data)
    out["checks"] = [fluid(d) for d in data["checks"]]
    out["slurries"] = [fluid(d) for d in data["slurries"]]
    out["comparisons"] = [
        {
            **c,
            "reading_differences_deg": [
                {"rpm": float(k), "difference_deg": v}
                for k, v in c["reading_differences_deg"].items()
            ],
        }
        for c in data["comparisons"]
    ]
    return out


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
        "method_status": _status_data(results),
    }
    out["rheology"] = rheology_json(rheology_data(case, s))
    out["circulation"] = _circulation_data(results, s)
    if res.margins is not None:
        out["margins"] = _margins_data(res.margins, s)
    out["bit"] = _bit_data(res, s)
    if results.cleaning:
        out["cleaning"] = _cleaning_data(results.cleaning.result, s)
    if results.loaded is not None:
        out["loaded_ecd"] = _loaded_data(results.loaded, s)
    if results.beds is not None:
        out["cuttings_beds"] = beds_data(results)
    if getattr(results, "downhole", None) is not None:
        out["downhole"] = downhole_data(results)
    if results.surge:
        out["trips"] = _trips_data(results.surge, s)
    if results.window is not None:
        out["operating_window"] = _window_data(results, s)
    if results.slurry_lines:
        out["slurry_lines"] = slurry_line_data(results)
    out["circulation"]["tool_covered"] = list(res.tools.covered)
    if results.calibration is not None:
        out["calibration"] = _calibration_data(results.calibration, s)
    if results.band is not None:
        out["ecd_band"] = _band_data(results.band, s)
    if getattr(results, "pumps", None) is not None:
        out["pumps"] = _pumps_data(results, s)
    if getattr(results, "two_part", None) is not None:
        out["two_part_calibration"] = _two_part_data(results.two_part, s)
    if results.cement is not None:
        out["cement_job"] = _cement_data(results.cement, s)
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


def _status_data(results) -> list[dict]:
    """How each method the run used has been checked: family, name, primary source, status
    kind and its words, evidence, caveats (calc.verification)."""
    return [
        {
            "family": family,
            "name": info.name,
            "source": info.source,
            "kind": info.status.kind,
            "status": text.status_label(info.status.kind),
            "evidence": info.status.evidence,
            "caveats": list(info.status.caveats),
        }
        for family, info in used_methods(results)
    ]


def _circulation_data(results, s) -> dict:
    """Rate, density, SPP breakdown (keyed by the calc keys ``surface``, ``string``, ``bit``,
    ``annulus``, ``tools``, ``back_pressure``; their words in ``breakdown_labels``), BHP, ECD
    and the per-interval table of the string and annulus."""
    res = results.circulation
    bd = {k: _c(v, "pressure", s) for k, v in res.breakdown().items()}
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
        "breakdown_labels": {k: text.BREAKDOWN_LABELS[k] for k in bd},
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


def _loaded_data(ld, s) -> dict:
    """ECD with the cuttings load beside the clean ECD (calc.cleaning.loaded_margins)."""
    return {
        "ecd_bit": _c(ld.ecd_bit, "density", s),
        "ecd_bit_clean": _c(ld.ecd_bit_clean, "density", s),
        "cuttings_increment_bit": _c(ld.increment_bit, "density", s),
        "margins": None if ld.margins is None else _margins_data(ld.margins, s),
        "margin_basis": "fracture − loaded ECD; clean ECD − pore",
        "profile": {
            "md": _c(ld.profile.md, "depth", s),
            "ecd": _c(ld.profile.ecd, "density", s),
            "ecd_loaded": _c(ld.profile.ecd_loaded, "density", s),
        },
    }


def _components_data(comp, s) -> dict | None:
    """calc.surge.TripComponents: the parts of the peak pressure change at a limit."""
    if comp is None:
        return None
    return {
        "speed": _c(comp.speed, "trip_speed", s),
        "peak_speed": _c(comp.peak_speed, "trip_speed", s),
        "steady": _c(comp.steady, "pressure", s),
        "inertia": _c(comp.inertia, "pressure", s),
        "gel": _c(comp.gel, "pressure", s),
        "peak": _c(comp.peak, "pressure", s),
        "stopping": _c(comp.stopping, "pressure", s),
        "allowance": _c(comp.allowance, "pressure", s),
        "opposite_allowance": _c(comp.opposite_allowance, "pressure", s),
        "governed_by": comp.term,
    }


def _point_data(pt, s) -> dict:
    return {
        "name": point_label(pt.name),
        "md": _c(pt.md, "depth", s),
        "tvd": _c(pt.tvd, "depth", s),
    }


def _trips_data(trip, s) -> dict:
    lim = trip.limits
    out = {
        "method": lim.method,
        "string_end": lim.string_end,
        "max_running_speed": _c(lim.max_running_speed, "trip_speed", s),
        "max_pulling_speed": _c(lim.max_pulling_speed, "trip_speed", s),
        "running_point": _point_data(lim.running_point, s),
        "pulling_point": _point_data(lim.pulling_point, s),
        "running_components": _components_data(lim.running, s),
        "pulling_components": _components_data(lim.pulling, s),
        "acceleration_time_s": trip.acceleration_time,
        "stand_gel": {"gel": trip.stand_gel[0], "value": _c(trip.stand_gel[1], "stress", s)},
        "circulation_gel": {
            "gel": trip.circulation_gel[0],
            "value": _c(trip.circulation_gel[1], "stress", s),
        },
        "speeds": _c(trip.speeds, "trip_speed", s),
        "surge_at_bit": _c(trip.running.pressure_bit, "pressure", s),
        "swab_at_bit": _c(trip.pulling.pressure_bit, "pressure", s),
    }
    sch = trip.schedule
    if sch is not None:
        out["schedule"] = {
            "method": sch.method,
            "bands": [
                {
                    "top_md": _c(b.top_md, "depth", s),
                    "bottom_md": _c(b.bottom_md, "depth", s),
                    "max_running_speed": _c(b.running_limit, "trip_speed", s),
                    "max_pulling_speed": _c(b.pulling_limit, "trip_speed", s),
                    "running_point": _point_data(b.running_point, s),
                    "pulling_point": _point_data(b.pulling_point, s),
                    "running_governed_by": b.running_term,
                    "pulling_governed_by": b.pulling_term,
                    "running_bit_md": _c(b.running_bit_md, "depth", s),
                    "pulling_bit_md": _c(b.pulling_bit_md, "depth", s),
                }
                for b in sch.bands
            ],
        }
    bc = trip.break_circulation
    if bc is not None:
        out["break_circulation"] = {
            "gel": _c(bc.gel_strength, "stress", s),
            "string": _c(bc.string_pressure, "pressure", s),
            "annulus": _c(bc.annulus_pressure, "pressure", s),
            "total": _c(bc.pressure, "pressure", s),
            "bottom_emw": _c(bc.bottom_emw, "density", s),
        }
    return out


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


def _band_quantity(qb, band, s) -> dict:
    """One quantity of the band: display values in the case's units, and an ``si`` block."""
    k = qb.kind
    lo, hi = qb.method_min, qb.method_max
    si_unit = {"density": "kg/m³", "pressure": "Pa"}[k]
    return {
        "quantity": qb.quantity,
        "label": text.band_quantity(qb, band, s),
        "text": text.band_value(qb, s),
        "unit": text.unit_label(k, s),
        "md": _c(qb.md, "depth", s),
        "nominal": _c(qb.nominal, k, s),
        "half_width": _c(qb.half_width, k, s),
        "low": _c(qb.low, k, s),
        "high": _c(qb.high, k, s),
        "worst_case": _c(qb.worst_case, k, s),
        "contributions": {n: _c(v, k, s) for n, v in qb.contributions.items()},
        "dominant": qb.dominant,
        "dominant_words": text.BAND_INPUT_WORDS.get(qb.dominant, ""),
        "dial_readings": [
            {"rpm": e.rpm, "effect": _c(e.effect, k, s)}
            for e in qb.effects
            if e.input == "dial_readings"
        ],
        "method_spread": {
            "values": {m: _c(v, k, s) for m, v in qb.method_values},
            "min": None if lo is None else {"method": lo[0], "value": _c(lo[1], k, s)},
            "max": None if hi is None else {"method": hi[0], "value": _c(hi[1], k, s)},
            "text": text.method_spread(qb, s),
        },
        "si": {
            "unit": si_unit,
            "md_m": qb.md,
            "nominal": qb.nominal,
            "half_width": qb.half_width,
            "worst_case": qb.worst_case,
            "contributions": dict(qb.contributions),
            "dial_readings": [
                {"rpm": e.rpm, "effect": e.effect} for e in qb.effects if e.input == "dial_readings"
            ],
            "method_min": None if lo is None else {"method": lo[0], "value": lo[1]},
            "method_max": None if hi is None else {"method": hi[0], "value": hi[1]},
            "method_values": dict(qb.method_values),
        },
    }


def _band_data(band, s) -> dict:
    """calc.circulation.EcdBand: inputs (SI and display), basis, method, the quantities."""
    return {
        "method": "linear propagation: central differences of circulate() per input, "
        "root-sum-square of independent inputs (calc/METHODS.md §18)",
        "basis": text.BAND_BASIS,
        "hydraulics_method": band.method,
        "inputs": {
            "dial_resolution": {"value": band.dial_resolution, "unit": "degree"},
            "balance_resolution": {
                "value": _c(band.balance_resolution, "density", s),
                "unit": text.unit_label("density", s),
                "si": band.balance_resolution,
                "si_unit": "kg/m³",
            },
            "rate_uncertainty": {"value": band.rate_uncertainty, "unit": "fraction of rate"},
        },
        "spread_methods": list(band.spread_methods),
        "tightest_limit": band.tightest_limit,
        "evaluations": band.evaluations,
        "quantities": [_band_quantity(qb, band, s) for qb in band.quantities],
    }


def _pumps_data(results, s) -> dict:
    """The pumps (calc.pumps): volume per stroke, the check's spm, the rate they give and the
    spm (the same on each running pump) at the check's rate and the window's ends."""
    pr, ow = results.pumps, results.window
    at = {"check_rate": results.case.check_value(-1, "flow_rate")}
    if ow is not None and ow.feasible:
        at.update(window_low=ow.q_low, window_high=ow.q_high)
    return {
        "pumps": [
            {
                "name": p.name,
                "kind": p.kind,
                "displacement": _c(p.displacement, "volume", s),
                "displacement_unit": label(unit_for("volume", s)) + "/stroke",
                "liner_rating": _c(p.liner_rating, "pressure", s),
                "rated_power": _c(p.rated_power, "power", s),
            }
            for p in pr.pumps
        ],
        "running": [p.name for p in pr.running],
        "spm": None if pr.spm is None else list(pr.spm),
        "rate_from_spm": _c(pr.q_from_spm, "flow_rate", s),
        "spm_each_at": {k: pr.spm_at(q) for k, q in at.items()},
    }


def _two_part_data(tp, s) -> dict:
    """calc.circulation.calibrate_two_part of the latest check (labelled CALIBRATION)."""
    return {
        "part": tp.part,
        "labels": list(tp.labels),
        "string_multiplier": tp.string_multiplier,
        "annulus_multiplier": tp.annulus_multiplier,
        "measured_spp": _c(tp.measured_spp, "pressure", s),
        "predicted_spp": _c(tp.predicted_spp, "pressure", s),
        "calibrated_spp": _c(tp.calibrated_spp, "pressure", s),
        "spp_gap_removed_by_string": _c(tp.spp_absorbed_string, "pressure", s),
        "spp_gap_removed_by_annulus": _c(tp.spp_absorbed_annulus, "pressure", s),
        "gauge_md": _c(tp.gauge_md, "depth", s),
        "gauge_ecd": _c(tp.gauge_ecd, "density", s),
        "predicted_gauge_ecd": _c(tp.predicted_gauge_ecd, "density", s),
        "calibrated_gauge_ecd": _c(tp.calibrated_gauge_ecd, "density", s),
        "gauge_cuttings_increment": _c(tp.gauge_increment, "density", s),
        "calibrated_ecd_bit_clean": _c(scalar(tp.calibrated.ecd_bit), "density", s),
    }


def _limit_key(name: str) -> str:
    """The stable JSON key of a margin curve: ``fracture``, ``pore``, ``surface_rating``,
    ``hole_cleaning``, ``tool_flow_window_min``/``_max`` (the tool's own name, which comes from
    the case, stays in the entry's ``name``)."""
    for end in ("min", "max"):
        if name.endswith(f" flow window ({end})"):
            return f"tool_flow_window_{end}"
    return json_key(name)


def _limit_kind(name: str):
    """Unit kind of a calc.rate_window margin curve, by the limit's name
    (OperatingWindow.limits)."""
    if name in ("fracture", "pore"):
        return "density"
    if name in ("surface rating", "liner rating"):
        return "pressure"
    if name == "rated hydraulic power":
        return "power"
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
        "ecd_basis": ow.ecd_basis,
        "cuttings_load_applied": ow.loaded,
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
            "ecd_clean_fracture_point": _c(ow.ecd_clean_fracture_point, "density", s),
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
            _limit_key(name): {
                "name": name,
                "unit": "relative"
                if _limit_kind(name) == "dimensionless"
                else label(unit_for(_limit_kind(name), s)),
                "values": _c(m, _limit_kind(name), s),
            }
            for name, m in ow.limits.items()
        },
    }


def _cement_data(job, s) -> dict:
    """The ``[cement_job]`` placement: timeline, check points, tightest moment, checks."""
    tl = job.timeline
    t = tl.tightest
    out = {
        "units": {
            k: label(unit_for(k, s))
            for k in ("volume", "flow_rate", "pressure", "density", "depth")
        },
        "method": tl.method,
        "steps": int(tl.pumped.size),
        "tightest": {
            "point": t.point,
            "limit": t.limit,
            "ecd": _c(t.ecd, "density", s),
            "margin": _c(t.margin, "density", s),
            "required": _c(t.required, "density", s),
            "pumped": _c(t.pumped, "volume", s),
            "time_min": t.time / 60.0,
        },
        "bump_differential": _c(tl.bump_differential, "pressure", s),
        "final_circulating_pressure": _c(tl.final_circulating_pressure, "pressure", s),
        "max_surface_pressure": _c(float(tl.surface_pressure.max()), "pressure", s),
        "key_moments": {k: _c(tl.pumped[i], "volume", s) for k, i in tl.key_moments.items()},
        "free_fall_periods": [
            {
                "from": _c(tl.pumped[a], "volume", s),
                "to": _c(tl.pumped[min(b + 1, tl.pumped.size - 1)], "volume", s),
            }
            for a, b in tl.free_fall_periods
        ],
        "points": [
            {
                "name": p.name,
                "role": p.role,
                "ecd": _c(tl.ecd[:, k], "density", s),
                "fracture": _c(tl.fracture[:, k], "density", s),
                "pore": _c(tl.pore[:, k], "density", s),
                "static_ecd": _c(tl.static_ecd[k], "density", s),
            }
            for k, p in enumerate(tl.points)
        ],
        "timeline": {
            "pumped": _c(tl.pumped, "volume", s),
            "time_min": [float(x) / 60.0 for x in tl.time],
            "pump_rate": _c(tl.pump_rate, "flow_rate", s),
            "return_rate": _c(tl.return_rate, "flow_rate", s),
            "surface_pressure": _c(tl.surface_pressure, "pressure", s),
            "free_fall": [bool(x) for x in tl.free_fall],
            "top_of_cement_md": _c(tl.toc_md, "depth", s),
        },
        "checks": [_check_data(c, s) for c in (*job.density, *job.friction, *job.contact)],
    }
    return out


def _check_data(c, s) -> dict:
    """One displacement check with its unit: density step (case unit), friction step (ratio
    − 1), contact time (min)."""
    if c.check == "density":
        val, req = _c(c.value, "density", s), _c(c.required, "density", s)
        unit = label(unit_for("density", s))
    elif c.check == "contact_time":
        val, req, unit = c.value / 60.0, c.required / 60.0, "min"
    else:
        val, req, unit = c.value, c.required, "-"
    return {
        "check": c.check,
        "ahead": c.ahead,
        "behind": c.behind,
        "value": val,
        "required": req,
        "unit": unit,
        "met": bool(c.ok),
    }
