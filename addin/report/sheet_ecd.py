"""ECD sheet: equivalent densities at the bit with live checks, margins at the exposed
formation and weak points, and the ESD/ECD profile chart."""

from __future__ import annotations

import numpy as np
from openpyxl.worksheet.pagebreak import Break

from addin import text
from addin.report.audit import Factors, checked_row, input_row
from addin.report.charts import depth_profile, nice_axis
from addin.report.style import (
    heading,
    note_row,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.text import display_number as _o
from addin.text import unit_label as U
from addin.xlsx_cells import put, set_widths
from calc.circulation import ecd_deviation, margin_status, worst_status

__all__ = ["write_ecd"]


def write_ecd(wb, results, factors: Factors, title: str):
    """The ECD sheet; returns the references the summary uses."""
    ws = wb.create_sheet("ECD")
    set_widths(ws, [34, 12, 12, 10, 11, 11, 11, 11, 11, 11])
    row = heading(ws, 1, "Equivalent densities and margins", span=10, title=True)
    row, refs = _bit_block(ws, row + 1, results, factors)
    loaded = results.loaded
    if loaded is not None:
        row = _loaded_block(ws, row, results)
    if results.circulation.margins is not None:
        row = _margins_block(ws, row, results)
        refs["tightest"] = results.circulation.margins.tightest
        refs["tightest_margins"] = results.circulation.margins
        if loaded is not None and loaded.margins is not None:
            refs["tightest_clean"] = refs["tightest"]
            refs["tightest"] = loaded.margins.tightest
            refs["tightest_margins"] = loaded.margins
        row += 1
    refs.update(_profile_block(ws, row, results, title))
    return refs


def _bit_block(ws, row, results, factors):
    """Inputs and live checks of the hydrostatic and circulating pressure and ECD at the bit,
    and the ECD at the downhole gauge.  Returns the next row and the references."""
    row, inputs = _ecd_inputs(ws, row, results)
    row, refs = _ecd_checks(ws, row, results, factors, inputs)
    row, pwd = _gauge_row(ws, row, results)
    if pwd is not None:
        refs["pwd"] = pwd
    return row + 1, refs


def _ecd_inputs(ws, row, results):
    """Static density, bit TVD, annular friction and back-pressure cells; returns the next row
    and their references."""
    res, system = results.circulation, results.case.unit_system
    rho = input_row(
        ws, row, "mud density (static)", _o(res.density, "density", system), "density", system
    )
    tvd = input_row(ws, row + 1, "bit TVD", _o(res.bit_tvd, "depth", system), "depth", system)
    ann = input_row(
        ws,
        row + 2,
        "annular friction loss, surface to bit",
        _o(res.annulus.total, "pressure", system),
        "pressure",
        system,
    )
    bp = input_row(
        ws,
        row + 3,
        "surface back-pressure",
        _o(res.back_pressure, "pressure", system),
        "pressure",
        system,
    )
    return row + 5, (rho, tvd, ann, bp)


def _ecd_checks(ws, row, results, factors, inputs):
    """The checked rows at the bit: hydrostatic pressure, circulating pressure and ECD.
    Returns the next row and the references the summary uses."""
    res, system = results.circulation, results.case.unit_system
    rho, tvd, ann, bp = inputs
    fr, fdep, fp, g = (
        factors.unit("density"),
        factors.unit("depth"),
        factors.unit("pressure"),
        factors.g(),
    )
    g_note = "g = gₙ (exact)" if res.hydrostatic == "exact" else "0.052 convention"
    row = table_header(
        ws, row, 1, ["quantity", "boreflow", "live check", "agree?", "unit", "formula in words"]
    )
    hyd_v, hyd_f = checked_row(
        ws,
        row,
        "hydrostatic pressure at the bit",
        _o(res.static_bhp, "pressure", system),
        f"{rho}*{fr}*{g}*{tvd}*{fdep}/{fp}",
        "pressure",
        system,
        f"ρ·g·TVD ({g_note})",
        note_end=10,
    )
    bhp_v, _ = checked_row(
        ws,
        row + 1,
        "circulating pressure at the bit",
        _o(res.circulating_bhp, "pressure", system),
        f"{hyd_v}+{ann}+{bp}",
        "pressure",
        system,
        "hydrostatic + annular friction + back-pressure",
        note_end=10,
    )
    ecd_v, ecd_f = checked_row(
        ws,
        row + 2,
        "ECD at the bit",
        _o(res.ecd_bit, "density", system),
        f"{rho}+({ann}+{bp})*{fp}/({g}*{tvd}*{fdep})/{fr}",
        "density",
        system,
        "ρ + (Δp_ann + p_back)/(g·TVD)",
        note_end=10,
    )
    return row + 3, {"ecd_bit": (ecd_v, ecd_f), "hydrostatic": (hyd_v, hyd_f), "bhp": bhp_v}


def _gauge_row(ws, row, results):
    """The predicted ECD at the downhole gauge of the latest mud check beside the gauge's
    reading, when the check has one inside the hole.  Returns the next row and
    (predicted, gauge, gauge MD), or None when no row was written."""
    res, system = results.circulation, results.case.unit_system
    pwd = results.case.checks[-1].values.get("pwd", {})
    pwd_md, pwd_ecd = pwd.get("md"), pwd.get("ecd")
    if pwd_md is None or pwd_ecd is None or not 0 < pwd_md <= res.bit_md:
        return row, None
    pred = float(res.ecd_at(pwd_md))
    put(
        ws,
        row,
        1,
        f"ECD at the downhole gauge (MD {_o(pwd_md, 'depth', system):,.0f} {U('depth', system)})",
    )
    put_number(ws, row, 2, _o(pred, "density", system), number_format("density", system))
    put(ws, row, 5, U("density", system), "bf_unit")
    put(
        ws,
        row,
        6,
        f"gauge reads {_o(pwd_ecd, 'density', system):.2f}; predicted − gauge "
        f"{_o(ecd_deviation(pred, pwd_ecd), 'density', system):+.2f}",
        "bf_note",
    )
    ws.merge_cells(start_row=row, start_column=6, end_row=row, end_column=10)
    return row + 1, (pred, pwd_ecd, pwd_md)


def _loaded_block(ws, row, results) -> int:
    """ECD at the bit with the annular cuttings load beside the clean ECD (calc.cleaning)."""
    ld, system = results.loaded, results.case.unit_system
    dn = U("density", system)
    row = heading(ws, row, "ECD with the cuttings load (at the check's rate)", span=10)
    for label, v in (
        ("ECD at the bit, cuttings-loaded", ld.ecd_bit),
        ("ECD at the bit, clean mud", ld.ecd_bit_clean),
        ("cuttings load (loaded − clean)", ld.increment_bit),
    ):
        put(ws, row, 1, label)
        put_number(ws, row, 2, _o(v, "density", system), number_format("density", system))
        put(ws, row, 3, dn)
        row += 1
    return (
        note_row(
            ws,
            row,
            "Loaded ECD = clean ECD + the hydrostatic of the cuttings in the annulus (loaded "
            "density from the transport ratio and ROP). The margins "
            "below, the Summary and the operating window use it against fracture; the pore "
            "margin keeps the clean ECD (the lower value).",
            span=10,
        )
        + 1
    )


def _margins_block(ws, row, results) -> int:
    """Margins at the named check points (shoe, bit, window stations, weak points) with their
    status, and the tightest point in words (cuttings-loaded ECD where the run has it)."""
    clean_mt, system = results.circulation.margins, results.case.unit_system
    loaded = results.loaded is not None and results.loaded.margins is not None
    mt = results.loaded.margins if loaded else clean_mt
    row = heading(ws, row, "Margins at the exposed formation and weak points", span=10)
    du, dn = U("depth", system), U("density", system)
    # with a cuttings load the clean ECD takes the ESD column (ESD: the Summary and the profile)
    heads = [
        "check point",
        "MD",
        "TVD",
        "pore",
        "fracture",
        "ECD, clean" if loaded else "ESD",
        "ECD, loaded" if loaded else "ECD",
        "frac − ECD",
        "ECD − pore",
        "status",
    ]
    units = ["", du, du, dn, dn, dn, dn, dn, dn, ""]
    row = table_header(ws, row, 1, heads, units)  # fmt: skip
    req_f, req_p = mt.margins.fracture, mt.margins.pore

    def at(arr, i):
        return np.asarray(arr).reshape(-1)[i]

    for i, point in enumerate(mt.points):
        if point.role == "depth":
            continue
        put(ws, row, 1, text.check_point(point, system))
        put_number(ws, row, 2, _o(mt.md[i], "depth", system), number_format("depth", system))
        put_number(ws, row, 3, _o(mt.tvd[i], "depth", system), number_format("depth", system))
        col6 = clean_mt.ecd if loaded else mt.esd
        for col, arr in ((4, mt.pore), (5, mt.fracture), (6, col6), (7, mt.ecd)):
            put_number(
                ws, row, col, _o(at(arr, i), "density", system), number_format("density", system)
            )
        fm, pm = float(at(mt.fracture_margin, i)), float(at(mt.pore_margin, i))
        for col, v in ((8, fm), (9, pm)):
            put_number(ws, row, col, _o(v, "density", system) if np.isfinite(v) else None, "0.00")
        status = worst_status(margin_status(fm, req_f), margin_status(pm, req_p))
        put(ws, row, 10, text.STATUS_WORDS[status])
        row += 1
    t = mt.tightest
    where = text.tightest_where(mt, system)
    basis = (
        "Margins: fracture − loaded ECD and clean ECD − pore"
        if loaded
        else "Margins: fracture − ECD and ECD − pore"
    )
    return note_row(
        ws,
        row,
        f"Tightest point: {where} (MD {_o(t.md, 'depth', system):,.0f} "
        f"{du}), {t.limit} margin {_o(t.margin, 'density', system):.2f} {dn} against "
        f"{_o(t.required, 'density', system):.2f} {dn} required. {basis}; status "
        f"{text.STATUS_WORDS['near_limit']} below the required margin, "
        f"{text.STATUS_WORDS['exceeded']} below zero.",
        span=10,
    )


_PROFILE_COLUMNS = (
    ("md", "depth"),
    ("tvd", "depth"),
    ("esd", "density"),
    ("ecd", "density"),
    ("pore", "density"),
    ("fracture", "density"),
)
_LOADED_COLUMN = ("ecd_loaded", "density")


def _profile_block(ws, row, results, title) -> dict:
    """The printed ESD/ECD/pore/fracture chart and its data rows below the print range."""
    prof, system = results.profile, results.case.unit_system
    du, dn = U("depth", system), U("density", system)
    chart_row = row + 1
    chart_rows = 28  # the 14-cm chart
    data_row = chart_row + chart_rows + 2
    put(
        ws,
        data_row - 1,
        1,
        f"Chart data: the profile along the annulus every "
        f"{_o(results.profile_step, 'depth', system):,.0f} {du} (rows below; not printed).",
        "bf_note",
    )
    ws.merge_cells(start_row=data_row - 1, start_column=1, end_row=data_row - 1, end_column=10)
    put(ws, data_row, 1, "Profile along the annulus", "bf_section")
    col0 = 1
    loaded = results.loaded.profile if results.loaded is not None else None
    columns = _PROFILE_COLUMNS + ((_LOADED_COLUMN,) if loaded is not None else ())
    heads = ["MD", "TVD", "ESD", "ECD", "pore", "fracture"]
    r0 = table_header(
        ws,
        data_row + 1,
        col0,
        heads + (["ECD, loaded"] if loaded is not None else []),
        [du, du, dn, dn, dn, dn] + ([dn] if loaded is not None else []),
    )
    n = len(prof.md)
    for i in range(n):
        for j, (attr, kind) in enumerate(columns):
            src = loaded if attr == "ecd_loaded" else prof
            v = np.asarray(getattr(src, attr)).reshape(-1)[i]
            put_number(
                ws,
                r0 + i,
                col0 + j,
                _o(v, kind, system) if 0 < v < 1e9 else None,
                number_format(kind, system),
            )
    r1 = r0 + n - 1
    curves = [("ESD", (ws, col0 + 2, r0, r1), "esd"), ("ECD", (ws, col0 + 3, r0, r1), "ecd")]
    if loaded is not None:
        curves.append(("ECD with cuttings", (ws, col0 + 6, r0, r1), "ecd_loaded"))
    if results.case.window is not None:
        curves += [
            ("pore pressure", (ws, col0 + 4, r0, r1), "pore"),
            ("fracture pressure", (ws, col0 + 5, r0, r1), "fracture"),
        ]
    allv = [
        _o(x, "density", system)
        for x in np.concatenate(
            [np.ravel(prof.esd), np.ravel(prof.ecd), np.ravel(prof.pore), np.ravel(prof.fracture)]
            + ([np.ravel(loaded.ecd_loaded)] if loaded is not None else [])
        )
        if 0 < x < 1e9
    ]
    lo, hi, step = nice_axis(min(allv), max(allv))
    ch = depth_profile(
        (ws, col0 + 1, r0, r1),
        curves,
        density_unit=dn,
        depth_unit=du,
        x_limits=(lo, hi),
        title="ESD, ECD, pore and fracture EMW",
    )
    ch.x_axis.majorUnit = step
    ch.width = 24.0
    ws.add_chart(ch, f"A{chart_row}")
    ws.row_breaks.append(Break(id=chart_row - 1))
    setup_print(ws, title)
    ws.print_area = f"A1:J{data_row - 2}"
    return {"profile_rows": (r0, r1), "profile_head": data_row + 1}
