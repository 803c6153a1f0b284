"""The key-results rows of the summary page (values SI; live checks point at detail sheets)."""

from __future__ import annotations

import numpy as np

from addin.report.compute import scalar

__all__ = ["summary_rows"]


def _status_margin(margin, required):
    if margin is None:
        return ""
    if margin < 0:
        return "EXCEEDED"
    if required is not None and margin < required:
        return "NEAR LIMIT"
    return "OK"


def summary_rows(results, refs) -> list[dict]:
    case, res = results.case, results.circulation
    lim = case.limits
    hyd, ecd, bit = refs["hydraulics"], refs["ecd"], refs["bit"]
    rows = []
    spp = scalar(res.standpipe_pressure)
    rating = lim["surface_rating"]
    rows.append(
        dict(
            name="standpipe pressure, predicted",
            kind="pressure",
            value=spp,
            check=hyd["spp"][1],
            limit=rating,
            margin=None if rating is None else rating - spp,
            status=_status_margin(
                None if rating is None else rating - spp, 0.1 * rating if rating else None
            ),
        )
    )
    meas = case.checks[-1].values.get("measured_spp")
    if meas is not None:
        gap = 100.0 * (spp - meas) / meas
        rows.append(
            dict(
                name=f"standpipe pressure, measured (predicted {gap:+.1f} %)",
                kind="pressure",
                value=meas,
                status="OK" if abs(gap) <= 10 else "CHECK",
            )
        )
    mt = res.margins
    if mt is not None:
        names = list(mt.names)
        shoe = next((i for i, n in enumerate(names) if "shoe" in str(n).lower()), None)
        if shoe is not None:
            e = float(np.asarray(mt.ecd).reshape(-1)[shoe])
            f = float(np.asarray(mt.fracture).reshape(-1)[shoe])
            rows.append(
                dict(
                    name=f"ECD at {names[shoe]}",
                    kind="density",
                    value=e,
                    limit=f,
                    margin=f - e,
                    required=mt.margins.fracture,
                    status=_status_margin(f - e, mt.margins.fracture),
                )
            )
    f_bit = None
    if mt is not None:
        f_bit = float(np.asarray(mt.fracture).reshape(-1)[-1])
    e_bit = scalar(res.ecd_bit)
    rows.append(
        dict(
            name="ECD at the bit",
            kind="density",
            value=e_bit,
            check=ecd["ecd_bit"][1],
            limit=f_bit,
            margin=None if f_bit is None else f_bit - e_bit,
            required=None if mt is None else mt.margins.fracture,
            status=_status_margin(
                None if f_bit is None else f_bit - e_bit,
                None if mt is None else mt.margins.fracture,
            ),
        )
    )
    rows.append(dict(name="static mud weight (ESD)", kind="density", value=scalar(res.esd_bit)))
    if "pwd" in ecd:
        pred, gauge, _ = ecd["pwd"]
        rows.append(
            dict(
                name="downhole gauge ECD (predicted − gauge shown as margin)",
                kind="density",
                value=gauge,
                limit=None,
                margin=gauge - pred,
                status="INFO",
            )
        )
    t = ecd.get("tightest")
    if t is not None:
        rows.append(
            dict(
                name=f"tightest margin: {t.name} ({t.limit})",
                kind="density",
                value=float(np.asarray(t.margin)),
                required=float(t.required),
                status=_status_margin(float(np.asarray(t.margin)), float(t.required)),
            )
        )
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
            value=scalar(res.bit_loss),
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
                name=f"lowest annular velocity: {av[1]}",
                kind="velocity",
                value=float(av[0]),
                check=av[3],
            )
        )
    return rows
