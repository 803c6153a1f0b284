"""The rheology of a case as plain, JSON-ready data, in a chosen unit system (units named).

What ``boreflow rheology --json`` prints and what the report's JSON carries under ``rheology``:
for every mud check and slurry the readings, PV/YP/LSYP/gels, every fit with its quality, the
ranking and the notes; the comparison of consecutive checks; the one-line caution.
"""

from __future__ import annotations

from addin import text
from calc import cautions
from calc.errors import InputError
from calc.rheology import compare_series, fit_all
from calc.units import from_si, label, unit_for

__all__ = ["rheology_data"]


def _conv(value, kind, system):
    if kind == "dimensionless":
        return value
    return from_si(value, unit_for(kind, system), kind)


def _fit_dict(f, system):
    su = text.parameter_unit("stress", system)
    q = f.quality
    lo, hi = f.shear_rate_range
    return {
        "method": f.method,
        "model": f.model.name,
        "description": f.description,
        "parameters": {
            k: {"value": v, "unit": u}
            for k, (v, u) in text.model_parameters(f.model, system).items()
        },
        "quality": {
            "space": q.space,
            "rmse": _conv(q.rmse, "stress", system),
            "rmse_unit": su,
            "r2": q.r2,
            "n_points": q.n_points,
            "residuals": [_conv(x, "stress", system) for x in q.residuals.tolist()],
        },
        "shear_rate_range": [lo, hi],
        "notes": [text.note_line(n, system) for n in f.notes],
        "source": f.source,
    }


def _field(r, attr):
    try:
        return getattr(r, attr)
    except InputError:
        return None


def _fluid_dict(name, r, system):
    fits = fit_all(r)
    su = text.parameter_unit("stress", system)
    vu = text.parameter_unit("viscosity", system)
    out = {
        "label": name,
        "mode": r.mode,
        "instrument": r.geometry.name,
        "temperature": None
        if r.temperature is None
        else _conv(r.temperature, "temperature", system),
        "temperature_unit": label(unit_for("temperature", system)),
        "speeds_rpm": r.speeds.tolist(),
        "dial_deg": r.dial.tolist(),
        "shear_rate_1_s": r.shear_rate.tolist(),
        "shear_stress": [_conv(x, "stress", system) for x in r.shear_stress.tolist()],
        "stress_unit": su,
        "viscosity_unit": vu,
        "pv": None if (v := _field(r, "pv")) is None else _conv(v, "viscosity", system),
        "pv_definition": r.pv_definition,
        "yp": None if (v := _field(r, "yp")) is None else _conv(v, "stress", system),
        "lsyp": None if (v := _field(r, "lsyp")) is None else _conv(v, "stress", system),
        "gels": {k: _conv(v, "stress", system) for k, v in r.gels_si.items()},
        "fits": [_fit_dict(f, system) for f in fits.results],
        "ranking": [
            {
                "rank": e.rank,
                "method": e.method,
                "model": e.model_name,
                "std_error": None if e.std_error is None else _conv(e.std_error, "stress", system),
                "r2": e.r2,
            }
            for e in fits.ranking
        ],
        "notes": [text.note_line(n, system) for n in (*r.notes, *fits.notes)],
    }
    if r.ramp_up is not None:
        out["up_down_ratio"] = r.up_down_ratio.tolist()
    return out


def _comparison_dict(c, system):
    rows = []
    for ch in c.changes:
        rows.append(
            {
                "parameter": ch.name,
                "a": _conv(ch.a, ch.kind, system),
                "b": _conv(ch.b, ch.kind, system),
                "change": _conv(ch.change, ch.kind, system)
                if ch.kind == "dimensionless"
                else _conv(ch.change, ch.kind, system) - _conv(0.0, ch.kind, system),
                "relative": ch.relative,
                "unit": text.parameter_unit(ch.kind, system),
                "flagged": ch.flagged,
            }
        )
    return {
        "a": c.label_a,
        "b": c.label_b,
        "method": c.method,
        "changes": rows,
        "curves_differ": c.curves_differ,
        "max_curve_difference_deg": c.max_curve_difference,
        "at_shear_rate_1_s": c.max_difference_at,
        "threshold_deg": c.threshold,
        "reading_differences_deg": {f"{k:g}": v for k, v in c.reading_differences.items()},
        "notes": [text.note_line(n, system) for n in c.notes],
    }


def rheology_data(case, system: str) -> dict:
    """Everything ``boreflow rheology`` prints, as plain JSON-ready data in ``system`` units."""
    return {
        "case": case.source,
        "title": case.header.get("title", ""),
        "units": system,
        "checks": [_fluid_dict(c.label, c.readings, system) for c in case.checks],
        "slurries": [_fluid_dict(s.name, s.readings, system) for s in case.slurries],
        "comparisons": [
            _comparison_dict(c, system) for c in compare_series([c.readings for c in case.checks])
        ],
        "caution": cautions.CELL,
    }
