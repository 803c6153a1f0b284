"""Hydraulics (pressure breakdown, per-interval table), ECD (margins, profile) and bit sheets."""

from __future__ import annotations

import numpy as np
from openpyxl.worksheet.pagebreak import Break

from addin.report.audit import Factors, cell_ref, write_checked
from addin.report.charts import depth_profile, nice_axis, pressure_breakdown
from addin.report.compute import scalar
from addin.report.style import (
    heading,
    merged_text,
    note_row,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.text import display_number as _o
from addin.text import unit_label as U
from addin.xlsx_cells import put, set_widths
from calc.flow import regime_label

__all__ = ["write_bit", "write_ecd", "write_hydraulics"]


def _input_row(ws, row, name, value, kind, system, fmt=None):
    put(ws, row, 1, name)
    put_number(ws, row, 2, value, fmt or number_format(kind, system), "bf_input")
    put(ws, row, 3, U(kind, system), "bf_unit")
    return cell_ref(ws, row, 2, absolute=True)


def _checked_row(ws, row, name, value, formula, kind, system, note="", note_end=11):
    put(ws, row, 1, name)
    v, f = write_checked(ws, row, 2, value, formula, kind=kind, system=system)
    put(ws, row, 5, U(kind, system), "bf_unit")
    if note:
        put(ws, row, 6, note, "bf_note")
        ws.merge_cells(start_row=row, start_column=6, end_row=row, end_column=note_end)
    return v, f


# ------------------------------------------------------------------------------ hydraulics


def write_hydraulics(wb, results, factors: Factors, title: str):
    case, res, system = results.case, results.circulation, results.case.unit_system
    ws = wb.create_sheet("Hydraulics")
    set_widths(ws, [40, 22, 10, 10, 9, 8, 8, 9, 9, 8, 10, 9, 9, 9, 9])
    row = heading(ws, 1, "Hydraulics: where the pump pressure goes", span=15, title=True)
    merged_text(
        ws,
        row,
        f"Check {case.checks[-1].label}. Method: {res.method}; fluid: {res.fluid_label} "
        f"({results.fluid.fits}); hydrostatic convention: {res.hydrostatic}; eccentricity "
        f"{res.eccentricity:g}; friction multiplier "
        f"{float(np.asarray(res.friction_multiplier)):g} (uncalibrated).",
        span=15,
        height=24,
    )
    row += 2
    q_ref = _input_row(ws, row, "flow rate", _o(res.q, "flow_rate", system), "flow_rate", system)
    row += 2
    # ---- breakdown
    row = heading(ws, row, "Standpipe pressure breakdown", span=3)
    row = table_header(
        ws,
        row,
        1,
        ["part of the circulating system", "pressure loss", "share"],
        ["", U("pressure", system), "% of SPP"],
    )
    first = row
    spp = scalar(res.standpipe_pressure)
    covered = tuple(getattr(res, "tool_covered", ()))
    parts = [
        (k, scalar(v))
        for k, v in res.breakdown().items()
        if not (k == "back pressure" and scalar(v) == 0.0)
    ]
    for name, v in parts:
        if name == "fixed tool drops" and covered:
            name = "fixed tool drops (incl. their bores)"
        put(ws, row, 1, name)
        put_number(ws, row, 2, _o(v, "pressure", system), number_format("pressure", system))
        put_number(ws, row, 3, 100.0 * v / spp, "0.0")
        row += 1
    last = row - 1
    put(ws, row, 1, "predicted standpipe pressure (sum)")
    spp_v, spp_f = write_checked(
        ws,
        row,
        2,
        _o(spp, "pressure", system),
        f"SUM(B{first}:B{last})",
        kind="pressure",
        system=system,
    )
    refs = {"spp": (spp_v, spp_f), "q": q_ref}
    row += 1
    meas = case.checks[-1].values.get("measured_spp")
    if meas is not None:
        put(ws, row, 1, "measured standpipe pressure")
        put_number(
            ws, row, 2, _o(meas, "pressure", system), number_format("pressure", system), "bf_input"
        )
        refs["spp_measured"] = meas
        row += 1
        put(ws, row, 1, "predicted − measured")
        put_number(ws, row, 2, 100 * (spp - meas) / meas, "+0.0;-0.0;0.0")
        put(ws, row, 3, "% of measured", "bf_unit")
        row += 1
    row += 1
    tools = list(results.well.tool_drops)
    for t in tools:
        what = (
            "includes the bore loss of " + ", ".join(t.components) + " (their bore friction is "
            "not added again: listed as 0 below)"
            if t.components
            else "is added on top of the bore friction of every string component"
        )
        ref = (
            f"{_o(t.reference_drop, 'pressure', system):,.0f} {U('pressure', system)} at "
            f"{_o(t.reference_rate, 'flow_rate', system):,.0f} {U('flow_rate', system)} and "
            f"{_o(t.reference_density, 'density', system):.2f} {U('density', system)}"
        )
        merged_text(
            ws,
            row,
            f"Fixed tool drop '{t.name}' (supplier's figure {ref}, scaled ∝ density × rate²) "
            f"{what}.",
            span=3,
            height=36,
        )
        row += 1
    chart = pressure_breakdown(
        (ws, 1, first, last), (ws, 2, first, last), pressure_unit=U("pressure", system)
    )
    ws.add_chart(chart, f"E{first - 2}")
    row = max(row + 1, first + 15)
    cal = getattr(results, "calibration", None)
    if cal is not None:
        row = _calibration_block(ws, row, cal, results, factors, system)
    ws.row_breaks.append(Break(id=row))
    row += 1
    # ---- per-interval table
    row = heading(
        ws,
        row,
        "Per-interval hydraulics (string from surface down, annulus from the bit up)",
        span=15,
    )
    heads = [
        "interval",
        "hole section",
        "top MD",
        "bottom MD",
        "length",
        "flow OD",
        "flow ID",
        "velocity",
        "velocity live",
        "agree?",
        "regime",
        "Reynolds",
        "Fanning f",
        "gradient",
        "loss",
    ]
    du, lu = U("depth", system), U("length", system)
    units = [
        "",
        "",
        du,
        du,
        lu,
        U("diameter", system),
        U("diameter", system),
        U("velocity", system),
        "formula",
        "",
        "",
        "–",
        "–",
        U("pressure_gradient", system),
        U("pressure", system),
    ]
    head_row = row
    row = table_header(ws, row, 1, heads, units)
    ws.print_title_rows = f"{head_row}:{head_row + 1}"
    iv = results.well.flow_intervals()
    fq, fd, fv = factors.unit("flow_rate"), factors.unit("diameter"), factors.unit("velocity")
    groups = [
        ("surface", None, res.surface_names, res.surface_losses, res.surface_flow),
        ("string", iv.select("string"), res.string_names, res.string_losses, res.string_flow),
        ("annulus", iv.select("annulus"), res.annulus_names, res.annulus_losses, res.annulus_flow),
    ]
    min_av = None
    for path, rows, names, losses, flow in groups:
        losses = np.atleast_1d(np.asarray(losses, dtype=float))
        for i, name in enumerate(names):
            label = f"{path}: {name.split(', MD')[0]}"
            if path == "annulus":
                label = label.rsplit(f" in {rows.section[i]}", 1)[0]
            if path == "string" and str(rows.component[i]) in covered:
                label += " (bore loss in the fixed tool drop)"
            put(ws, row, 1, label)
            if rows is not None:
                put(ws, row, 2, str(rows.section[i]) if path == "annulus" else "", "bf_cell")
                put_number(
                    ws, row, 3, _o(rows.top_md[i], "depth", system), number_format("depth", system)
                )
                put_number(
                    ws,
                    row,
                    4,
                    _o(rows.bottom_md[i], "depth", system),
                    number_format("depth", system),
                )
                put_number(
                    ws,
                    row,
                    5,
                    _o(rows.length[i], "length", system),
                    number_format("length", system),
                )
                do, di = rows.outer_diameter[i], rows.inner_diameter[i]
            else:
                line = case.surface_lines[i]
                put_number(
                    ws, row, 5, _o(line.length, "length", system), number_format("length", system)
                )
                do, di = line.id, 0.0
            put_number(ws, row, 6, _o(do, "diameter", system), number_format("diameter", system))
            put_number(ws, row, 7, _o(di, "diameter", system), number_format("diameter", system))
            vel = np.atleast_1d(np.asarray(flow.velocity, dtype=float)).reshape(-1)[i]
            formula = f"{q_ref}*{fq}/(PI()/4*((F{row}*{fd})^2-(G{row}*{fd})^2))/{fv}"
            write_checked(
                ws, row, 8, _o(vel, "velocity", system), formula, kind="velocity", system=system
            )
            reg = int(np.atleast_1d(flow.regime).reshape(-1)[i])
            put(ws, row, 11, regime_label(reg))
            put_number(ws, row, 12, np.atleast_1d(flow.reynolds).reshape(-1)[i], "#,##0")
            put_number(ws, row, 13, np.atleast_1d(flow.friction_factor).reshape(-1)[i], "0.00000")
            put_number(
                ws,
                row,
                14,
                _o(np.atleast_1d(flow.gradient).reshape(-1)[i], "pressure_gradient", system),
                number_format("pressure_gradient", system),
            )
            put_number(ws, row, 15, _o(losses.reshape(-1)[i], "pressure", system), "#,##0.0")
            if path == "annulus" and (min_av is None or vel < min_av[0]):
                min_av = (vel, name.split(", MD")[0], cell_ref(ws, row, 8), cell_ref(ws, row, 9))
            row += 1
    refs["min_av"] = min_av
    merged_text(
        ws,
        row,
        "Velocity live check: Q / (π/4·(OD² − ID²)) with the conversion factors "
        "on 'Audit'. Flow OD/ID: pipe ID in the string; hole or casing ID and pipe OD in the "
        "annulus. Tool joints are separate rows over the same depths (their share of the "
        "joint length).",
        span=15,
        height=24,
    )
    ws.freeze_panes = None
    setup_print(ws, title)
    return refs


def _calibration_block(ws, row, cal, results, factors, system):
    """The friction calibration of the latest check, labelled as such, with a live check."""
    row = heading(ws, row, "Calibration against the measured standpipe pressure", span=8)
    merged_text(
        ws,
        row,
        "CALIBRATION, not a measurement: the friction multiplier m makes the model reproduce "
        "the measured standpipe pressure at this check's rate. It applies to surface-line, "
        "drill-string and annular friction only (not to the bit or the fixed tool drops) and "
        "holds for this rate, mud and well state. Every other number in this report is "
        "uncalibrated (m = 1).",
        span=11,
        height=38,
        style="bf_text",
    )
    row += 1
    row = table_header(
        ws, row, 1, ["quantity", "boreflow", "live check", "agree?", "unit", "formula in words"]
    )
    pu = U("pressure", system)
    cells = {}
    for key, name, v in (
        ("meas", "measured standpipe pressure", cal.measured_spp),
        ("fixed", "fixed part: bit + fixed tool drops + back-pressure", cal.fixed_loss),
        ("fric", "frictional part: surface lines + string + annulus", cal.frictional_loss),
    ):
        put(ws, row, 1, name)
        put_number(ws, row, 2, _o(v, "pressure", system), number_format("pressure", system))
        put(ws, row, 5, pu, "bf_unit")
        cells[key] = cell_ref(ws, row, 2)
        row += 1
    m = scalar(cal.multiplier)
    _checked_row(
        ws,
        row,
        "friction multiplier m (calibration)",
        m,
        f"({cells['meas']}-{cells['fixed']})/{cells['fric']}",
        "dimensionless",
        system,
        "m = (measured − fixed) / frictional",
    )
    row += 1
    c = cal.calibrated
    for name, v, kind in (
        ("standpipe pressure with m", scalar(c.standpipe_pressure), "pressure"),
        ("ECD at the bit with m", scalar(c.ecd_bit), "density"),
    ):
        put(ws, row, 1, name)
        put_number(ws, row, 2, _o(v, kind, system), number_format(kind, system))
        put(ws, row, 5, U(kind, system), "bf_unit")
        row += 1
    return row + 1


# ------------------------------------------------------------------------------ ECD


def write_ecd(wb, results, factors: Factors, title: str):
    case, res, system = results.case, results.circulation, results.case.unit_system
    ws = wb.create_sheet("ECD")
    set_widths(ws, [34, 12, 12, 10, 11, 11, 11, 11, 11, 11])
    row = heading(ws, 1, "Equivalent densities and margins", span=10, title=True)
    row += 1
    rho = _input_row(
        ws, row, "mud density (static)", _o(res.density, "density", system), "density", system
    )
    tvd = _input_row(ws, row + 1, "bit TVD", _o(res.bit_tvd, "depth", system), "depth", system)
    ann = _input_row(
        ws,
        row + 2,
        "annular friction loss, surface to bit",
        _o(res.annulus_loss, "pressure", system),
        "pressure",
        system,
    )
    bp = _input_row(
        ws,
        row + 3,
        "surface back-pressure",
        _o(res.back_pressure, "pressure", system),
        "pressure",
        system,
    )
    row += 5
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
    hyd_v, hyd_f = _checked_row(
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
    row += 1
    bhp_v, _ = _checked_row(
        ws,
        row,
        "circulating pressure at the bit",
        _o(res.circulating_bhp, "pressure", system),
        f"{hyd_v}+{ann}+{bp}",
        "pressure",
        system,
        "hydrostatic + annular friction + back-pressure",
        note_end=10,
    )
    row += 1
    ecd_v, ecd_f = _checked_row(
        ws,
        row,
        "ECD at the bit",
        _o(res.ecd_bit, "density", system),
        f"{rho}+({ann}+{bp})*{fp}/({g}*{tvd}*{fdep})/{fr}",
        "density",
        system,
        "ρ + (Δp_ann + p_back)/(g·TVD)",
        note_end=10,
    )
    row += 1
    refs = {"ecd_bit": (ecd_v, ecd_f), "hydrostatic": (hyd_v, hyd_f), "bhp": bhp_v}
    pwd_md = case.checks[-1].values.get("pwd", {}).get("md")
    pwd_ecd = case.checks[-1].values.get("pwd", {}).get("ecd")
    if pwd_md is not None and pwd_ecd is not None and 0 < pwd_md <= res.bit_md:
        pred = float(res.ecd_at(pwd_md))
        put(
            ws,
            row,
            1,
            f"ECD at the downhole gauge (MD {_o(pwd_md, 'depth', system):,.0f} "
            f"{U('depth', system)})",
        )
        put_number(ws, row, 2, _o(pred, "density", system), number_format("density", system))
        put(ws, row, 5, U("density", system), "bf_unit")
        put(
            ws,
            row,
            6,
            f"gauge reads {_o(pwd_ecd, 'density', system):.2f}; predicted − gauge "
            f"{_o(pred, 'density', system) - _o(pwd_ecd, 'density', system):+.2f}",
            "bf_note",
        )
        ws.merge_cells(start_row=row, start_column=6, end_row=row, end_column=10)
        refs["pwd"] = (pred, pwd_ecd, pwd_md)
        row += 1
    row += 1
    # ---- margins
    mt = res.margins
    if mt is not None:
        row = heading(ws, row, "Margins at the exposed formation and weak points", span=10)
        du, dn = U("depth", system), U("density", system)
        row = table_header(
            ws,
            row,
            1,
            [
                "check point",
                "MD",
                "TVD",
                "pore",
                "fracture",
                "ESD",
                "ECD",
                "frac − ECD",
                "ECD − pore",
                "status",
            ],
            ["", du, du, dn, dn, dn, dn, dn, dn, ""],
        )
        req_f, req_p = mt.margins.fracture, mt.margins.pore
        named = [i for i, nm in enumerate(mt.names) if not str(nm).startswith("MD ")]
        for i in named:
            name = mt.names[i]
            vals = [mt.md[i], mt.tvd[i]]
            put(ws, row, 1, str(name))
            put_number(ws, row, 2, _o(vals[0], "depth", system), number_format("depth", system))
            put_number(ws, row, 3, _o(vals[1], "depth", system), number_format("depth", system))
            for col, arr in ((4, mt.pore), (5, mt.fracture), (6, mt.esd), (7, mt.ecd)):
                put_number(
                    ws,
                    row,
                    col,
                    _o(np.asarray(arr).reshape(-1)[i], "density", system),
                    number_format("density", system),
                )
            fm = float(np.asarray(mt.fracture_margin).reshape(-1)[i])
            pm = float(np.asarray(mt.pore_margin).reshape(-1)[i])
            for col, v in ((8, fm), (9, pm)):
                put_number(
                    ws, row, col, _o(v, "density", system) if np.isfinite(v) else None, "0.00"
                )
            status = "OK"
            if fm < 0 or pm < 0:
                status = "EXCEEDED"
            elif fm < req_f or pm < req_p:
                status = "NEAR LIMIT"
            put(ws, row, 10, status)
            row += 1
        t = mt.tightest
        row = note_row(
            ws,
            row,
            f"Tightest point: {t.name} (MD {_o(t.md, 'depth', system):,.0f} "
            f"{du}), {t.limit} margin {_o(t.margin, 'density', system):.2f} {dn} against "
            f"{_o(t.required, 'density', system):.2f} {dn} required. Margins: fracture − ECD "
            "and ECD − pore; status NEAR LIMIT below the required margin.",
            span=10,
        )
        refs["tightest"] = t
        row += 1
    # ---- chart (printed) and its data (below, outside the print range)
    prof = results.profile
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
    r0 = table_header(
        ws,
        data_row + 1,
        col0,
        ["MD", "TVD", "ESD", "ECD", "pore", "fracture"],
        [du, du, dn, dn, dn, dn],
    )
    n = len(prof.md)
    for i in range(n):
        for j, (arr, kind) in enumerate(
            (
                (prof.md, "depth"),
                (prof.tvd, "depth"),
                (prof.esd, "density"),
                (prof.ecd, "density"),
                (prof.pore, "density"),
                (prof.fracture, "density"),
            )
        ):
            v = np.asarray(arr).reshape(-1)[i]
            put_number(
                ws,
                r0 + i,
                col0 + j,
                _o(v, kind, system) if 0 < v < 1e9 else None,
                number_format(kind, system),
            )
    r1 = r0 + n - 1
    curves = [("ESD", (ws, col0 + 2, r0, r1), "esd"), ("ECD", (ws, col0 + 3, r0, r1), "ecd")]
    if case.window is not None:
        curves += [
            ("pore pressure", (ws, col0 + 4, r0, r1), "pore"),
            ("fracture pressure", (ws, col0 + 5, r0, r1), "fracture"),
        ]
    allv = [
        _o(x, "density", system)
        for x in np.concatenate(
            [np.ravel(prof.esd), np.ravel(prof.ecd), np.ravel(prof.pore), np.ravel(prof.fracture)]
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
    refs["profile_rows"] = (r0, r1)
    refs["profile_head"] = data_row + 1
    setup_print(ws, title)
    ws.print_area = f"A1:J{data_row - 2}"
    return refs


# ------------------------------------------------------------------------------ bit


def write_bit(wb, results, factors: Factors, title: str):
    case, res, system = results.case, results.circulation, results.case.unit_system
    bit, bh = case.bit, res.bit
    ws = wb.create_sheet("Bit")
    set_widths(ws, [36, 13, 13, 9, 12, 9, 9, 9, 9, 9, 9])
    row = heading(ws, 1, f"Bit hydraulics: {bit.name}", span=6, title=True)
    row += 1
    q = _input_row(ws, row, "flow rate", _o(res.q, "flow_rate", system), "flow_rate", system)
    rho = _input_row(
        ws, row + 1, "mud density", _o(res.density, "density", system), "density", system
    )
    size = _input_row(ws, row + 2, "bit size", _o(bit.size, "diameter", system), "diameter", system)
    cd = _input_row(
        ws,
        row + 3,
        "discharge coefficient",
        bit.discharge_coefficient,
        "dimensionless",
        system,
        "0.00",
    )
    row += 4
    put(ws, row, 1, "nozzle sizes (one cell each)")
    nozzles = bit.nozzles or ()
    for j, nz in enumerate(nozzles):
        put_number(ws, row, 2 + j, nz, "0", "bf_input")
    put(ws, row, 2 + max(len(nozzles), 1), "1/32 in", "bf_unit")
    noz = f"B{row}:{chr(ord('B') + max(len(nozzles), 1) - 1)}{row}"
    row += 2
    fq, fr, fa, fp = (
        factors.unit("flow_rate"),
        factors.unit("density"),
        factors.unit("area"),
        factors.unit("pressure"),
    )
    f32 = factors.unit_factor_of("in32", "nozzle")
    fd, fv = factors.unit("diameter"), factors.unit("jet_velocity")
    fw, fpd, ff = factors.unit("power"), factors.unit("power_density"), factors.unit("force")
    row = table_header(
        ws, row, 1, ["quantity", "boreflow", "live check", "agree?", "unit", "formula in words"]
    )
    ws.merge_cells(start_row=row - 1, start_column=6, end_row=row - 1, end_column=11)
    refs = {}
    if nozzles:
        tfa_v, _ = _checked_row(
            ws,
            row,
            "total flow area (TFA)",
            _o(bit.tfa, "area", system),
            f"SUMPRODUCT(PI()/4*({noz}*{f32})^2)/{fa}",
            "area",
            system,
            "Σ π/4·d²",
        )
    else:
        put(ws, row, 1, "total flow area (TFA, given)")
        put_number(ws, row, 2, _o(bit.tfa, "area", system), number_format("area", system))
        tfa_v = cell_ref(ws, row, 2)
    row += 1
    sv = scalar
    _checked_row(
        ws,
        row,
        "nozzle velocity",
        _o(sv(bh.nozzle_velocity), "jet_velocity", system),
        f"{q}*{fq}/({tfa_v}*{fa})/{fv}",
        "jet_velocity",
        system,
        "Q / TFA",
    )
    row += 1
    dp_v, dp_f = _checked_row(
        ws,
        row,
        "bit pressure drop",
        _o(sv(bh.pressure_drop), "pressure", system),
        f"{rho}*{fr}*({q}*{fq})^2/(2*{cd}^2*({tfa_v}*{fa})^2)/{fp}",
        "pressure",
        system,
        "ρQ² / (2·Cd²·TFA²)",
    )
    row += 1
    hp_v, _ = _checked_row(
        ws,
        row,
        "hydraulic power at the bit",
        _o(sv(bh.hydraulic_power), "power", system),
        f"{dp_v}*{fp}*{q}*{fq}/{fw}",
        "power",
        system,
        "ΔP_bit · Q",
    )
    row += 1
    hsi_v, hsi_f = _checked_row(
        ws,
        row,
        "HSI (power per bit area)",
        _o(sv(bh.hsi), "power_density", system),
        f"{hp_v}*{fw}/(PI()/4*({size}*{fd})^2)/{fpd}",
        "power_density",
        system,
        "P_bit / (π/4·d_bit²)",
    )
    row += 1
    _checked_row(
        ws,
        row,
        "jet impact force",
        _o(sv(bh.impact_force), "force", system),
        f"{cd}*{q}*{fq}*SQRT(2*{rho}*{fr}*{dp_v}*{fp})/{ff}",
        "force",
        system,
        "Cd·Q·√(2ρ·ΔP_bit)",
    )
    row += 1
    put(ws, row, 1, "bit share of standpipe pressure")
    put_number(ws, row, 2, 100 * sv(res.bit_share), "0.0")
    put(ws, row, 5, "%", "bf_unit")
    row += 2
    note_row(ws, row, f"Method: {bh.method}.", span=11)
    refs.update(dp=(dp_v, dp_f), hsi=(hsi_v, hsi_f))
    setup_print(ws, title)
    return refs
