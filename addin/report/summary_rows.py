"""The key-results rows of the summary page (values SI; live checks point at detail sheets)."""

from __future__ import annotations

import numpy as np

from addin import text
from addin.report.compute import scalar
from addin.report.sheet_trips import TERM_WORDS, point_label
from calc.circulation import (
    BAND_INPUTS,
    ecd_deviation,
    fracture_margin,
    margin_status,
    spp_deviation_percent,
)
from calc.plausibility import assess

__all__ = ["summary_rows"]


def _status_margin(margin, required):
    """Status words of a margin (calc.circulation.margin_status); "" without one."""
    return "" if margin is None else text.STATUS_WORDS[margin_status(margin, required)]


def _at(arr, i):
    return float(np.asarray(arr).reshape(-1)[i])


def summary_rows(results, refs) -> list[dict]:
    """Rows: name, kind (calc.units kind or None), value [SI], check (formula), limit, margin,
    required, status; ``bound`` (text over the limit…required columns) names a binding limit."""
    rows: list[dict] = []
    rows += _pressure_rows(results, refs)
    rows += _ecd_rows(results, refs)
    rows += _downhole_rows(results, refs)
    rows += _band_rows(results)
    rows += _bit_rows(results, refs)
    rows += _other_rows(refs)
    rows += programme_rows(results)
    return _credible(results, rows)


#: The status of every row of a run whose results are physically impossible: no row of it
#: may say "OK" (or a mere "MARGINAL") then.
NOT_CREDIBLE = "NOT CREDIBLE"


def _impossible_results(results) -> list[str]:
    """Why the results cannot describe a real well ([] when they can): a standpipe pressure
    beyond every rating (calc/plausibility.py ``spp_result``), or an ECD above the fracture
    gradient at every check point."""
    why = []
    if assess("spp_result", scalar(results.circulation.standpipe_pressure)) == "impossible":
        why.append("the standpipe pressure is beyond any pump or rating")
    ld = results.loaded
    mt = ld.margins if ld is not None and ld.margins is not None else results.circulation.margins
    if mt is not None:
        fm = np.asarray(mt.fracture_margin, dtype=float).reshape(-1)
        if fm.size and np.all(fm < 0):
            why.append("the ECD is above the fracture gradient at every check point")
    return why


def _credible(results, rows: list[dict]) -> list[dict]:
    """Rows unchanged for credible results; else every OK/MARGINAL status replaced by
    :data:`NOT_CREDIBLE` and a first row saying why (check the inputs)."""
    why = _impossible_results(results)
    if not why:
        return rows
    for r in rows:
        if r.get("status") in ("OK", "MARGINAL"):
            r["status"] = NOT_CREDIBLE
    head = dict(
        name="results credible?",
        kind=None,
        text="no: " + "; ".join(why) + " (check the inputs)",
        unit="",
        status=NOT_CREDIBLE,
    )
    return [head, *rows]


def programme_values(results) -> dict[str, float | None]:
    """The latest check's programme properties [SI] (density, PV, YP, LSYP, gels as
    ``gels.10s`` …; None if unknown)."""
    rd = results.checks[-1].readings
    out = {"density": results.case.checks[-1].values.get("density")}
    for key in ("pv", "yp", "lsyp"):
        try:
            out[key] = float(getattr(rd, key))
        except Exception:  # readings lack the speeds this property needs
            out[key] = None
    gels = rd.gels_si if rd.gels else {}
    for key in ("10s", "10min", "30min"):
        out[f"gels.{key}"] = gels.get(key)
    return out


def programme_range(chk, key: str):
    """The ``[low, high]`` of ``key`` (``pv``, ``gels.10min`` …) in a check's ``program``
    table [SI], or None."""
    rng = chk.values.get("program") or {}
    for part in key.split("."):
        rng = rng.get(part) if isinstance(rng, dict) else None
    return rng if isinstance(rng, (list, tuple)) and len(rng) == 2 else None


def programme_rows(results) -> list[dict]:
    """The latest check's density, PV, YP, LSYP and gels against the case's mud programme."""
    chk = results.case.checks[-1]
    system = results.case.unit_system
    vals = programme_values(results)
    rows = []
    for key, (label, kind) in text.PROGRAMME_PROPERTIES.items():
        rng = programme_range(chk, key)
        if rng is None or vals.get(key) is None:
            continue
        lo, hi = (text.quantity(x, kind, system) for x in rng)
        rows.append(
            dict(
                name=f"{label} against the mud programme ({chk.label})",
                kind=kind,
                value=vals[key],
                bound=f"programme {lo} – {hi}",
                status=text.programme_status(vals[key], rng[0], rng[1], kind, system),
            )
        )
    return rows


def _pressure_rows(results, refs) -> list[dict]:
    """Predicted standpipe pressure against the rating, and the measurement."""
    case, res = results.case, results.circulation
    lim = case.limits
    hyd = refs["hydraulics"]
    rows = []
    spp = scalar(res.standpipe_pressure)
    rating = lim["surface_rating"]
    spare = None if rating is None else rating - spp
    rows.append(
        dict(
            name="standpipe pressure, predicted",
            kind="pressure",
            value=spp,
            check=hyd["spp"][1],
            limit=rating,
            margin=spare,
            status=_status_margin(spare, 0.1 * rating if rating else None),
        )
    )
    meas = case.checks[-1].values.get("measured_spp")
    if meas is not None:
        gap = float(spp_deviation_percent(spp, meas))
        rows.append(
            dict(
                name=f"standpipe pressure, measured (predicted {gap:+.1f} %)",
                kind="pressure",
                value=meas,
                status="OK" if abs(gap) <= 10 else "CHECK",
            )
        )
    return rows


def _ecd_rows(results, refs) -> list[dict]:
    """ECD at the shoe and the bit against fracture, the tightest margin, ESD and PWD.

    With a cuttings load (``results.loaded``) the shoe, bit and tightest rows hold the loaded
    ECD and its margins, the clean ECD at the bit stays beside it (with its live check).
    """
    case, res = results.case, results.circulation
    ecd = refs["ecd"]
    rows = []
    ld = results.loaded
    loaded = ld is not None and ld.margins is not None
    mt = ld.margins if loaded else res.margins
    tag = ", cuttings-loaded" if loaded else ""
    req_f = mt.margins.fracture if mt is not None else None
    shoe = mt.index("shoe") if mt is not None else None
    if shoe is not None:
        e, f, m = _at(mt.ecd, shoe), _at(mt.fracture, shoe), _at(mt.fracture_margin, shoe)
        rows.append(
            dict(
                name=f"ECD at the {text.check_point(mt.points[shoe], case.unit_system)}{tag}",
                kind="density",
                value=e,
                limit=f,
                margin=m,
                required=req_f,
                status=_status_margin(m, req_f),
            )
        )
    at_bit = mt.index("bit") if mt is not None else None
    f_bit = None if at_bit is None else _at(mt.fracture, at_bit)
    for e_bit, name, check in (
        ((ld.ecd_bit, "ECD at the bit, cuttings-loaded", None),) if ld is not None else ()
    ) + ((scalar(res.ecd_bit), "ECD at the bit, clean mud" if ld else "ECD at the bit",
          ecd["ecd_bit"][1]),):  # fmt: skip
        m_bit = None if f_bit is None else float(fracture_margin(f_bit, e_bit))
        rows.append(
            dict(
                name=name,
                kind="density",
                value=e_bit,
                check=check,
                limit=f_bit,
                margin=m_bit,
                required=req_f,
                status=_status_margin(m_bit, req_f),
            )
        )
    t = ecd.get("tightest")
    if t is not None:
        m = float(np.asarray(t.margin))
        mts = ecd.get("tightest_margins")
        where = (
            text.tightest_where(mts, case.unit_system, tight=t)
            if mts is not None
            else text.check_point(t.point, case.unit_system)
        )
        rows.append(
            dict(
                name=f"tightest margin: {where} ({t.limit}{', loaded ECD' if loaded else ''})",
                kind="density",
                value=m,
                required=float(t.required),
                status=_status_margin(m, float(t.required)),
            )
        )
    tp = getattr(results, "two_part", None)
    if tp is not None:  # the two-part calibration's ECD at the bit (with the load when shown)
        e_cal = scalar(tp.calibrated.ecd_bit) + (ld.increment_bit if ld is not None else 0.0)
        m_cal = None if f_bit is None else float(fracture_margin(f_bit, e_cal))
        rows.append(
            dict(
                name=f"ECD at the bit{tag}, CALIBRATED ({tp.part}; string × "
                f"{tp.string_multiplier:.3f}, annulus × {tp.annulus_multiplier:.3f})",
                kind="density",
                value=e_cal,
                limit=f_bit,
                margin=m_cal,
                required=req_f,
                status=_status_margin(m_cal, req_f),
            )
        )
    rows.append(dict(name="static mud weight (ESD)", kind="density", value=scalar(res.esd_bit)))
    if "pwd" in ecd:
        pred, gauge, _ = ecd["pwd"]
        rows.append(
            dict(
                name="downhole gauge (PWD) ECD; margin = gauge − predicted",
                kind="density",
                value=gauge,
                margin=-float(ecd_deviation(pred, gauge)),
                status="INFO",
            )
        )
    return rows


def _band_rows(results) -> list[dict]:
    """The input-uncertainty band (calc.circulation.ecd_band) of ECD at the bit, the shoe, the
    tightest point and of the SPP: value = the band's half-width; the text over the limit…
    required columns gives value ± band and the method spread; the name the dominant input.
    The band is on the clean circulating mud (no cuttings), as the label says."""
    band = results.band
    if band is None:
        return []
    system = results.case.unit_system
    inputs = ", ".join(text.band_input(k, band, system) for k in BAND_INPUTS)
    rows = [
        dict(
            name="input-uncertainty band (method and checks: Audit sheet)",
            kind=None,
            unit="",
            bound=f"root-sum-square of {inputs}; {text.BAND_BASIS}; method spread apart",
            status="INFO",
        )
    ]
    for qb in band.quantities:
        what = text.band_quantity(qb, band, system)
        clean = ", clean mud" if qb.kind == "density" else ""
        dom = text.BAND_INPUT_WORDS.get(qb.dominant, "none")
        spread = text.method_spread(qb, system)
        rows.append(
            dict(
                name=f"± band: {what}{clean}; dominant: {dom}",
                kind=qb.kind,
                value=qb.half_width,
                bound=text.band_value(qb, system) + (f"; {spread}" if spread else ""),
                status="INFO",
            )
        )
    return rows


def _bit_rows(results, refs) -> list[dict]:
    """Hydrostatic pressure, bit pressure drop, HSI and the lowest annular velocity."""
    res = results.circulation
    ecd, bit, hyd = refs["ecd"], refs["bit"], refs["hydraulics"]
    rows = []
    rows.append(
        dict(
            name="hydrostatic pressure at the bit",
            kind="pressure",
            value=scalar(res.static_bhp),
            check=ecd["hydrostatic"][1],
        )
    )
    rows.append(
        dict(
            name="bit pressure drop",
            kind="pressure",
            value=scalar(res.bit.pressure_drop),
            check=bit["dp"][1],
        )
    )
    rows.append(
        dict(name="HSI", kind="power_density", value=scalar(res.bit.hsi), check=bit["hsi"][1])
    )
    av = hyd.get("min_av")
    if av is not None:
        rows.append(
            dict(
                name="lowest annular velocity (see Hydraulics)",
                kind="velocity",
                value=float(av[0]),
                check=av[3],
            )
        )
    return rows


def _downhole_rows(results, refs) -> list[dict]:
    """ECD at the bit with the mud's density at downhole T and p (with ``[temperature]``);
    the surface-mud ECD row stays the headline, this row sits beside it."""
    run = results.downhole
    if run is None:
        return []
    mt = results.circulation.margins
    at_bit = mt.index("bit") if mt is not None else None
    f_bit = None if at_bit is None else _at(mt.fracture, at_bit)
    req = mt.margins.fracture if mt is not None else None
    e = run.profile.ecd_bit
    m = None if f_bit is None else float(fracture_margin(f_bit, e))
    return [
        dict(
            name="ECD at the bit, at downhole temperature and pressure",
            kind="density",
            value=e,
            limit=f_bit,
            margin=m,
            required=req,
            status=_status_margin(m, req),
        )
    ]


def _other_rows(refs) -> list[dict]:
    """Hole cleaning, operating window and trip-speed rows (where those sheets exist)."""
    rows = []
    cl = refs.get("cleaning") or {}
    if cl:
        status = text.CLEANING_STATUS[cl["verdict"]]
        rows.append(
            dict(
                name="hole cleaning verdict (worst interval)",
                kind=None,
                text=cl["verdict"],
                unit="",
                status=status,
            )
        )
    wr = refs.get("window") or {}
    if wr:
        q0 = wr["check_rate"][0]
        if wr["feasible"]:
            for end, label in (("low", "lowest"), ("high", "highest")):
                q_end, words = wr[end]
                ok = q0 >= q_end if end == "low" else q0 <= q_end
                rows.append(
                    dict(
                        name=f"operating window, {label} rate",
                        kind="flow_rate",
                        value=q_end,
                        bound=f"bound by: {words}",
                        status="OK" if ok else text.STATUS_WORDS["exceeded"],
                    )
                )
        else:
            rows.append(
                dict(
                    name="operating window (see 'Rate window')",
                    kind=None,
                    text="none",
                    unit="",
                    bound=wr["low"][1],
                    status=text.STATUS_WORDS["exceeded"],
                )
            )
    tr = refs.get("trips") or {}
    if tr:
        for key, name in (
            ("running", "max. running speed (surge limit)"),
            ("pulling", "max. pulling speed (swab limit)"),
        ):
            term = TERM_WORDS.get(tr.get(f"{key}_term", ""), "")
            where = point_label(tr[f"{key}_point"].name)
            rows.append(
                dict(
                    name=name,
                    kind="trip_speed",
                    value=tr[key],
                    bound=f"governing: {where}, bit at the bottom" + (f"; {term}" if term else ""),
                )
            )
    return rows
