"""Hydraulics sheet: where the pump pressure goes (breakdown, calibration, per-interval table).

The ECD and bit sheets are :mod:`addin.report.sheet_ecd` and :mod:`addin.report.sheet_bit`.
"""

from __future__ import annotations

import numpy as np
from openpyxl.utils import get_column_letter
from openpyxl.worksheet.pagebreak import Break

from addin import text
from addin.report.audit import Factors, cell_ref, checked_row, input_row, write_checked
from addin.report.charts import pressure_breakdown
from addin.report.compute import scalar
from addin.report.sections import section_rows
from addin.report.style import (
    heading,
    merged_text,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.report.trace import method_line
from addin.text import display_number as _o
from addin.text import unit_label as U
from addin.xlsx_cells import put, set_widths
from calc.circulation import spp_deviation_percent
from calc.flow import regime_label

__all__ = ["N_COLS", "section_table", "write_hydraulics"]


def write_hydraulics(wb, results, factors: Factors, title: str):
    case, res, system = results.case, results.circulation, results.case.unit_system
    ws = wb.create_sheet("Hydraulics")
    set_widths(ws, [46, 26, 9, 9, 9, 8, 8, 9, 9, 8, 9, 11, 9, 9, 10, 9])
    row = heading(ws, 1, "Hydraulics: where the pump pressure goes", span=N_COLS, title=True)
    merged_text(
        ws,
        row,
        f"Check {case.checks[-1].label}. Method: {method_line(results)}; fluid: "
        f"{res.fluid_label}; hydrostatic convention: {res.hydrostatic}; "
        f"{_eccentricity_text(res)}; {_rotation_text(res)}; {_joint_text(res)}; friction "
        f"multiplier {float(np.asarray(res.friction_multiplier)):g} (uncalibrated).",
        span=N_COLS,
        height=36,
    )
    row += 2
    q_ref = input_row(ws, row, "flow rate", _o(res.q, "flow_rate", system), "flow_rate", system)
    spm = text.pump_speed(results.pumps) or text.pump_speed(results.pumps, scalar(res.q))
    if spm:  # strokes per minute beside the rate (the case has pumps)
        put(ws, row, 4, spm, "bf_cell")
        ws.merge_cells(start_row=row, start_column=4, end_row=row, end_column=6)
    row += 2
    row, first, refs = _breakdown_block(ws, row, results, system)
    refs["q"] = q_ref
    row = _tool_texts(ws, row + 1, results, system)
    row = max(row + 1, first + 15)
    cal = results.calibration
    if cal is not None:
        row = _calibration_block(ws, row, cal, results, factors, system)
    if results.two_part is not None:
        row = _two_part_block(ws, row, results.two_part, system)
    ws.row_breaks.append(Break(id=row))
    _, print_end, refs["min_av"] = _interval_table(ws, row + 1, results, factors, system, q_ref)
    ws.freeze_panes = None
    setup_print(ws, title)
    ws.print_area = f"A1:{get_column_letter(N_COLS)}{print_end}"
    return refs


def _eccentricity_text(res) -> str:
    if res.annulus_eccentricity is not None:
        return (
            "eccentricity per annular interval from the string's stand-off and the "
            "inclination (column 'ecc. e')"
        )
    return f"eccentricity {res.eccentricity:g}"


def _rotation_text(res) -> str:
    if res.rpm:
        return (
            f"string rotation {res.rpm:g} rpm applied to annular friction (laminar helical-flow "
            "factor, column 'rotation factor'; it lowers the loss of a shear-thinning mud, "
            "while field data often show rotation raising it in an eccentric hole)"
        )
    return "no string rotation applied"


def _joint_text(res) -> str:
    if res.joint_losses == "bore_change_k":
        return (
            "tool joints: bore friction plus a contraction and an expansion loss per joint "
            "(in the joint rows' loss, not in their gradient)"
        )
    return "tool joints: bore friction only"


def _applied_columns(res) -> tuple[bool, bool]:
    """(eccentricity column, rotation column) shown."""
    return (res.annulus_eccentricity is not None or res.eccentricity > 0), bool(res.rpm)


def _breakdown_block(ws, row, results, system):
    """The SPP breakdown table with its live sum, the measurement and the chart.

    Returns the next row, the table's first row and the references ``spp`` (and
    ``spp_measured``)."""
    case, res = results.case, results.circulation
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
    shares = res.shares()
    for key, v in res.breakdown().items():
        if key == "back_pressure" and scalar(v) == 0.0:
            continue
        name = text.BREAKDOWN_LABELS[key]
        if key == "tools" and res.tools.covered:
            name = "fixed tool drops (incl. their bores)"
        put(ws, row, 1, name)
        put_number(ws, row, 2, _o(v, "pressure", system), number_format("pressure", system))
        put_number(ws, row, 3, 100.0 * scalar(shares[key]), "0.0")
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
    refs = {"spp": (spp_v, spp_f)}
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
        put_number(ws, row, 2, spp_deviation_percent(spp, meas), "+0.0;-0.0;0.0")
        put(ws, row, 3, "% of measured", "bf_unit")
        row += 1
    chart = pressure_breakdown(
        (ws, 1, first, last), (ws, 2, first, last), pressure_unit=U("pressure", system)
    )
    ws.add_chart(chart, f"E{first - 2}")
    return row, first, refs


def _tool_texts(ws, row, results, system) -> int:
    """One line per fixed tool drop: the supplier's figure and what it includes."""
    for t in results.well.tool_drops:
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
    return row


_INTERVAL_HEADS = (
    "interval",
    "hole section",
    "MD from",
    "MD to",
    "length",
    "flow OD",
    "flow ID",
    "velocity",
    "velocity live",
    "agree?",
    "critical velocity",
    "regime",
    "Reynolds",
    "Fanning f",
    "gradient",
    "loss",
)
#: columns of the interval table (16): the last is the loss
N_COLS = len(_INTERVAL_HEADS)


def _interval_table(ws, row, results, factors, system, q_ref):
    """Section table (one row per string section and per pipe/hole pair in the annulus; surface
    lines one row each), then the per-station detail below the print range.

    Returns the next row after the detail, the last row of the print range and the lowest
    annular velocity (value [m/s], where, value cell, live-check cell)."""
    row = heading(
        ws,
        row,
        "Hydraulics per section (string from surface down, annulus from the bit up; one row per "
        "pipe-in-hole section)",
        span=N_COLS,
    )
    du, lu, dd, vu = (
        U("depth", system),
        U("length", system),
        U("diameter", system),
        U("velocity", system),
    )
    units = ["", "", du, du, lu, dd, dd, vu, "formula", "", vu, "", "–", "–",
             U("pressure_gradient", system), U("pressure", system)]  # fmt: skip
    head_row = row
    heads = list(_INTERVAL_HEADS)
    show_e, show_r = _applied_columns(results.circulation)
    if show_e:
        heads.append("ecc. e")
        units.append("–")
    if show_r:
        heads.append("rotation factor")
        units.append("–")
    row = table_header(ws, row, 1, heads, units)
    ws.print_title_rows = f"{head_row}:{head_row + 1}"
    min_av = None
    for path, sec in _sections(results, per_station=False):
        vel = _interval_row(ws, row, results, factors, system, q_ref, path, sec)
        if path == "annulus" and (min_av is None or vel < min_av[0]):
            where = text.span(sec.span, system, depths=False)
            min_av = (vel, where, cell_ref(ws, row, 8), cell_ref(ws, row, 9))
        row += 1
    merged_text(
        ws,
        row,
        "Section rows: MD from the shallowest to the deepest station of the section, length and "
        "loss summed over its stations, gradient the length-weighted mean (= loss / length); "
        "velocity, critical velocity, Reynolds number and friction factor are the same at every "
        "station of a section. Velocity live check: Q / (π/4·(OD² − ID²)) with the conversion "
        "factors on 'Audit'. Flow OD/ID: pipe ID in the string; hole or casing ID and pipe OD in "
        "the annulus. Tool joints are separate rows over the same depths (their share of the "
        "joint length). The per-station rows are below the print range.",
        span=N_COLS,
        height=40,
    )
    print_end = row
    row = heading(
        ws,
        row + 3,
        "Per-station detail (one row per flow interval between survey stations, shoes and "
        "component tops; not printed)",
        span=N_COLS,
    )
    row = table_header(ws, row, 1, heads, units)
    for path, sec in _sections(results, per_station=True):
        _interval_row(ws, row, results, factors, system, q_ref, path, sec)
        row += 1
    return row, print_end, min_av


def section_table(results, *, per_station: bool = False) -> list:
    """``(path, Section)`` for the surface lines, the string and the annulus of the latest
    check, aggregated by :func:`addin.report.sections.section_rows` (SI values)."""
    return list(_sections(results, per_station=per_station))


def _sections(results, *, per_station: bool):
    res = results.circulation
    iv = results.well.flow_intervals()
    lines = results.case.surface_lines
    for path, group in (("surface", res.surface), ("string", res.string), ("annulus", res.annulus)):
        flow, n = group.flow, len(group.spans)
        if flow is None or n == 0:  # a path without rows (a case without surface lines)
            continue

        def per(a, n=n):
            return np.broadcast_to(np.asarray(a, dtype=float).reshape(-1), (n,))

        if path == "surface":
            length = np.array([ln.length for ln in lines], dtype=float)
            do = np.array([ln.id for ln in lines], dtype=float)
            di = np.zeros(n)
        else:
            rows = iv.select(path)
            length, do, di = rows.length, rows.outer_diameter, rows.inner_diameter
        columns = {
            "length": (length, "sum"),
            "outer": (do, "same"),
            "inner": (di, "same"),
            "velocity": (per(flow.velocity), "mean"),
            "critical": (per(flow.critical_velocity), "mean"),
            "regime": (np.broadcast_to(np.asarray(flow.regime).reshape(-1), (n,)), "same"),
            "reynolds": (per(flow.reynolds), "mean"),
            "fanning": (per(flow.friction_factor), "mean"),
            "gradient": (per(flow.gradient), "mean"),
            "loss": (per(group.losses), "sum"),
        }
        if path == "annulus":  # where applied (calc/METHODS.md §22), the same along a section
            ecc = res.eccentricity if res.annulus_eccentricity is None else res.annulus_eccentricity
            columns["eccentricity"] = (per(ecc), "mean")
            rot = getattr(flow, "rotation_factor", None)
            columns["rotation"] = (per(1.0 if rot is None else rot), "mean")
        for sec in section_rows(group.spans, columns, length, per_station=per_station):
            yield path, sec


def _interval_row(ws, row, results, factors, system, q_ref, path, sec) -> float:
    """One row of the section (or per-station) table; returns its velocity [m/s]."""
    span, v = sec.span, sec.values
    label = f"{path}: {span.part}"
    if path == "string" and span.item in results.circulation.tools.covered:
        label += " (bore loss in the fixed tool drop)"
    put(ws, row, 1, label)
    if span.top_md is not None:
        put(ws, row, 2, span.section if path == "annulus" else "", "bf_cell")
        for col, x, kind in ((3, span.top_md, "depth"), (4, span.bottom_md, "depth")):
            put_number(ws, row, col, _o(x, kind, system), number_format(kind, system))
    put_number(ws, row, 5, _o(v["length"], "length", system), number_format("length", system))
    for col, key in ((6, "outer"), (7, "inner")):
        put_number(ws, row, col, _o(v[key], "diameter", system), number_format("diameter", system))
    vel = v["velocity"]
    fq, fd, fv = factors.unit("flow_rate"), factors.unit("diameter"), factors.unit("velocity")
    formula = f"{q_ref}*{fq}/(PI()/4*((F{row}*{fd})^2-(G{row}*{fd})^2))/{fv}"
    write_checked(ws, row, 8, _o(vel, "velocity", system), formula, kind="velocity", system=system)
    put_number(
        ws, row, 11, _o(v["critical"], "velocity", system), number_format("velocity", system)
    )
    put(ws, row, 12, "mixed" if v["regime"] is None else regime_label(int(v["regime"])))
    put_number(ws, row, 13, v["reynolds"], "#,##0")
    put_number(ws, row, 14, v["fanning"], "0.00000")
    put_number(
        ws,
        row,
        15,
        _o(v["gradient"], "pressure_gradient", system),
        number_format("pressure_gradient", system),
    )
    put_number(ws, row, 16, _o(v["loss"], "pressure", system), "#,##0.0")
    show_e, show_r = _applied_columns(results.circulation)
    col = N_COLS + 1
    if show_e:
        if path == "annulus":
            put_number(ws, row, col, float(v["eccentricity"]), "0.000")
        col += 1
    if show_r and path == "annulus":
        put_number(ws, row, col, float(v["rotation"]), "0.000")
    return vel


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
    checked_row(
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


def _two_part_block(ws, row, tp, system):
    """The two-part calibration (calc.circulation.calibrate_two_part): string and annulus
    multipliers, each labelled a calibration, with the share of each mismatch it absorbs."""
    row = heading(ws, row, "Calibration of string and annulus separately", span=8)
    what = {
        "string and annulus": "the annular multiplier makes the predicted ECD at the downhole "
        "gauge equal its reading; the string multiplier (surface lines and drill string) then "
        "makes the standpipe pressure equal the measured one",
        "whole loop": "only the standpipe pressure is measured: one multiplier for string and "
        "annulus together (the two parts cannot be told apart)",
        "annulus": "only the downhole gauge is given: the annular multiplier is calibrated, the "
        "string is not (multiplier 1)",
    }[tp.part]
    load = (
        " The gauge is compared with the cuttings-loaded ECD (the load is not scaled)."
        if tp.gauge_increment > 0
        else ""
    )
    merged_text(
        ws, row,
        f"CALIBRATION, not a measurement ({tp.part}): {what}. The multipliers hold for this "
        f"rate, mud and well state; every other number in this report is uncalibrated.{load}",
        span=11, height=38, style="bf_text",
    )  # fmt: skip
    row += 1
    row = table_header(ws, row, 1, ["quantity", "value", "", "", "unit", "remark"])
    pu, dn = U("pressure", system), U("density", system)
    lines = [
        ("string friction multiplier (calibration)", tp.string_multiplier, "dimensionless", ""),
        ("annular friction multiplier (calibration)", tp.annulus_multiplier, "dimensionless", ""),
    ]
    if tp.measured_spp is not None:
        gap = tp.predicted_spp - tp.measured_spp
        lines += [
            ("standpipe pressure: measured", tp.measured_spp, "pressure", ""),
            ("standpipe pressure: predicted, uncalibrated", tp.predicted_spp, "pressure",
             f"gap {_o(gap, 'pressure', system):+,.0f} {pu}"),
            ("   gap removed by the string multiplier", tp.spp_absorbed_string, "pressure",
             _share(tp.spp_absorbed_string, gap)),
            ("   gap removed by the annular multiplier", tp.spp_absorbed_annulus, "pressure",
             _share(tp.spp_absorbed_annulus, gap)),
            ("standpipe pressure, calibrated", tp.calibrated_spp, "pressure", ""),
        ]  # fmt: skip
    if tp.gauge_ecd is not None:
        lines += [
            ("downhole gauge ECD: read", tp.gauge_ecd, "density",
             f"at {_o(tp.gauge_md, 'depth', system):,.0f} {U('depth', system)} MD"),
            ("downhole gauge ECD: predicted, uncalibrated", tp.predicted_gauge_ecd, "density",
             f"gap {_o(tp.gauge_absorbed_annulus, 'density', system):+.3f} {dn}, all removed by "
             "the annular multiplier"),
            ("downhole gauge ECD, calibrated", tp.calibrated_gauge_ecd, "density", ""),
        ]  # fmt: skip
    lines.append(
        ("ECD at the bit, calibrated (clean mud)", scalar(tp.calibrated.ecd_bit), "density", "")
    )
    for name, v, kind, remark in lines:
        put(ws, row, 1, name)
        fmt = "0.000" if kind == "dimensionless" else number_format(kind, system)
        put_number(ws, row, 2, v if kind == "dimensionless" else _o(v, kind, system), fmt)
        put(ws, row, 5, U(kind, system) if kind != "dimensionless" else "–", "bf_unit")
        if remark:
            put(ws, row, 6, remark, "bf_note")
            ws.merge_cells(start_row=row, start_column=6, end_row=row, end_column=11)
        row += 1
    return row + 1


def _share(part, gap) -> str:
    """ "62 % of the gap" (or "" when the gap is 0)."""
    return f"{100.0 * part / gap:.0f} % of the gap" if gap else ""
