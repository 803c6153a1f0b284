"""The "Slurry line" sheet: the operating curve of each ``[[slurry_line]]`` (calc.slurry).

Per line: the inputs, the deposition velocity by each method with the governing one, the
operating points, a native chart of frictional gradient against velocity (slurry and carrier,
the deposition velocity and the curve's minimum marked) and the curve's table.  Written only
when the case has the section; its JSON block is :func:`slurry_line_data`.
"""

from __future__ import annotations

import numpy as np

from addin import text
from addin.report.charts import nice_axis, operating_curve
from addin.report.style import heading, note_row, number_format, put_number, table_header
from addin.text import display_number as _o
from addin.text import unit_label as U
from addin.workbook_template import page_setup
from addin.xlsx_cells import put, set_widths
from calc import cautions
from calc.slurry import SLURRY_METHODS, size_fractions

__all__ = ["SHEET", "slurry_line_data", "write_slurry_line"]

SHEET = "Slurry line"
SPAN = 8
_FOOTER = "boreflow daily hydraulics report (estimates; see Cautions)"


def _source(name: str) -> str:
    return f"{text.method_words(name)} ({SLURRY_METHODS.get(name).source})"


def _carrier_words(c, s) -> str:
    if c.newtonian:
        return (
            f"Newtonian, {_o(c.density, 'density', s):.2f} {U('density', s)}, "
            f"{_o(c.k, 'viscosity', s):.2f} {U('viscosity', s)}"
        )
    return (
        f"Herschel-Bulkley, {_o(c.density, 'density', s):.2f} {U('density', s)}, τy "
        f"{_o(c.tau_y, 'stress', s):.2f} {U('stress', s)}, K {c.k:.4g} Pa·sⁿ, n {c.n:.3f}"
    )


def _regime(curve, i) -> str:
    words = []
    if curve.below_deposition[i]:
        words.append("below deposition: bed forms")
    if curve.laminar[i]:
        words.append("carrier laminar")
    return "; ".join(words) or "solids suspended"


def _inputs(ws, row, curve, s) -> int:
    line, sol = curve.line, curve.line.solids
    fr = curve_fractions(curve)
    rows = [
        ("pipe inside diameter", _o(line.d_pipe, "diameter", s), U("diameter", s), "0.000"),
        ("wall roughness", line.roughness * 1e3, "mm", "0.000"),
        ("length", _o(line.length, "length", s), U("length", s), "#,##0"),
        ("inclination (+ uphill)", line.inclination, "°", "0.0"),
        ("outlet above inlet", _o(line.rise, "length", s), U("length", s), "#,##0.0"),
        ("solids density", _o(sol.density, "density", s), U("density", s), "0.00"),
        ("solids volume concentration", 100.0 * sol.cv, "%", "0.0"),
        ("slurry density", _o(curve.mixture_density, "density", s), U("density", s), "0.00"),
        ("particle size d50", sol.d50 * 1e3, "mm", "0.000"),
        ("particle size d85", sol.d85 * 1e3, "mm", "0.000"),
        ("solids < 40 µm (with the carrier)", 100.0 * fr.fine, "%", "0.0"),
        ("solids 40–200 µm (pseudo-homogeneous)", 100.0 * fr.pseudo, "%", "0.0"),
        ("solids 200 µm–0.015 D (heterogeneous)", 100.0 * fr.heterogeneous, "%", "0.0"),
        ("solids > 0.015 D (stratified)", 100.0 * fr.stratified, "%", "0.0"),
    ]
    for label, v, unit, fmt in rows:
        put(ws, row, 1, label)
        ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=3)
        put_number(ws, row, 4, v, fmt)
        put(ws, row, 5, unit)
        row += 1
    put(ws, row, 1, "carrier")
    ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=3)
    put(ws, row, 4, _carrier_words(line.carrier, s))
    ws.merge_cells(start_row=row, start_column=4, end_row=row, end_column=SPAN)
    return row + 1


def curve_fractions(curve):
    """The size fractions of the four-component split of the curve's solids."""
    sol = curve.line.solids
    return size_fractions(sol.d50, sol.d85, curve.line.d_pipe)


def _deposition(ws, row, curve, s) -> int:
    vu, qu = U("velocity", s), U("flow_rate", s)
    row = table_header(ws, row, 1, ["method", "", "", "", "deposition velocity", "rate", ""],
                       ["", "", "", "", vu, qu, ""])  # fmt: skip
    area = curve.line.area
    for name, v in curve.deposition.by_method.items():
        put(ws, row, 1, text.method_words(name), "bf_cell")
        ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=4)
        put_number(ws, row, 5, _o(v, "velocity", s), "#,##0.0")
        put_number(ws, row, 6, _o(v * area, "flow_rate", s), "#,##0")
        put(ws, row, 7, "governs" if name == curve.deposition.governing else "", "bf_cell")
        row += 1
    return row


def _op_points(ws, row, curve, s) -> int:
    vu, qu, gu, pu = (U(k, s) for k in ("velocity", "flow_rate", "pressure_gradient", "pressure"))
    row = table_header(
        ws, row, 1,
        ["rate", "velocity", "gradient", "pressure over line", "status", "", "", ""],
        [qu, vu, gu, pu, "", "", "", ""],
    )  # fmt: skip
    fg = number_format("pressure_gradient", s)
    for i in range(curve.op_rate.size):
        put_number(ws, row, 1, _o(curve.op_rate[i], "flow_rate", s), "#,##0")
        put_number(ws, row, 2, _o(curve.op_velocity[i], "velocity", s), "#,##0.0")
        put_number(ws, row, 3, _o(curve.op_gradient[i], "pressure_gradient", s), fg)
        put_number(ws, row, 4, _o(curve.op_pressure[i], "pressure", s), "#,##0.0")
        status = (
            "BELOW the deposition velocity: solids settle"
            if curve.op_below[i]
            else f"{curve.op_velocity[i] / curve.deposition_velocity:.2f} × the deposition velocity"
        )
        put(ws, row, 5, status, "bf_cell")
        ws.merge_cells(start_row=row, start_column=5, end_row=row, end_column=SPAN)
        row += 1
    return row


def _curve_table(ws, row, curve, s) -> tuple[int, int, int]:
    vu, qu, gu, pu = (U(k, s) for k in ("velocity", "flow_rate", "pressure_gradient", "pressure"))
    row = table_header(
        ws, row, 1,
        ["velocity", "rate", "slurry gradient", "carrier gradient", "pressure over line",
         "regime", "", ""],
        [vu, qu, gu, gu, pu, "", "", ""],
    )  # fmt: skip
    fg = number_format("pressure_gradient", s)
    r0 = row
    for i in range(curve.velocity.size):
        put_number(ws, row, 1, _o(curve.velocity[i], "velocity", s), "#,##0.0")
        put_number(ws, row, 2, _o(curve.rate[i], "flow_rate", s), "#,##0")
        put_number(ws, row, 3, _o(curve.gradient[i], "pressure_gradient", s), fg)
        put_number(ws, row, 4, _o(curve.carrier_gradient[i], "pressure_gradient", s), fg)
        put_number(ws, row, 5, _o(curve.pressure[i], "pressure", s), "#,##0.0")
        put(ws, row, 6, _regime(curve, i), "bf_cell")
        ws.merge_cells(start_row=row, start_column=6, end_row=row, end_column=SPAN)
        row += 1
    return row, r0, row - 1


def _chart(ws, anchor_row, curve, s, rows, marker_col) -> None:
    r0, r1 = rows
    vd, vmin = curve.deposition_velocity, curve.minimum_velocity
    g = np.concatenate([curve.gradient, curve.carrier_gradient])
    y_lo, y_hi, y_step = nice_axis(0.0, float(_o(float(g.max()), "pressure_gradient", s)), 6)
    x_lo, x_hi, x_step = nice_axis(0.0, float(_o(float(curve.velocity[-1]), "velocity", s)), 8)
    # marker lines: two points each (x, y) in the columns right of the print range
    c = marker_col
    marks = (
        ("deposition velocity", vd),
        ("minimum of the curve", vmin),
    )
    put(ws, r0 - 1, c, "chart marks (x, y)", "bf_note")
    for j, (_, v) in enumerate(marks):
        for k, y in enumerate((y_lo, y_hi)):
            put_number(ws, r0 + 2 * j + k, c, _o(v, "velocity", s), "0.000")
            put_number(ws, r0 + 2 * j + k, c + 1, y, "0.000")
    op0 = r0 + 4
    for i in range(curve.op_rate.size):
        put_number(ws, op0 + i, c, _o(curve.op_velocity[i], "velocity", s), "0.000")
        put_number(ws, op0 + i, c + 1, _o(curve.op_gradient[i], "pressure_gradient", s), "0.000")
    markers = [
        (name, (ws, c, r0 + 2 * j, r0 + 2 * j + 1), (ws, c + 1, r0 + 2 * j, r0 + 2 * j + 1))
        for j, (name, _) in enumerate(marks)
    ]
    points = None
    if curve.op_rate.size:
        op1 = op0 + curve.op_rate.size - 1
        points = ("operating rates", (ws, c, op0, op1), (ws, c + 1, op0, op1))
    ch = operating_curve(
        (ws, 1, r0, r1),
        (ws, 3, r0, r1),
        (ws, 4, r0, r1),
        markers=markers,
        points=points,
        velocity_unit=U("velocity", s),
        gradient_unit=U("pressure_gradient", s),
        title=f"Operating curve: {curve.line.name}",
        x_limits=(x_lo, x_hi, x_step),
        y_limits=(y_lo, y_hi, y_step),
    )
    ws.add_chart(ch, f"A{anchor_row}")


def _one_line(ws, row, curve, s) -> int:
    line = curve.line
    vu, qu, gu = U("velocity", s), U("flow_rate", s), U("pressure_gradient", s)
    row = heading(ws, row, f"{line.name}", span=SPAN)
    dep = curve.deposition
    row = note_row(
        ws,
        row,
        f"Gradient: {_source(line.method)}; carrier friction: {_source('wilson_thomas_1985')}. "
        f"Deposition velocity {_o(dep.velocity, 'velocity', s):,.1f} {vu} "
        f"({_o(curve.deposition_rate, 'flow_rate', s):,.0f} {qu}) by "
        f"{text.method_words(dep.governing)}, the "
        f"larger of the methods; run the line above it. Minimum of the curve "
        f"{_o(curve.minimum_gradient, 'pressure_gradient', s):.4f} {gu} at "
        f"{_o(curve.minimum_velocity, 'velocity', s):,.1f} {vu}. Pressure over the line = "
        "frictional gradient × length + weight of the slurry column over the rise.",
        span=SPAN,
    )
    row = _inputs(ws, row + 1, curve, s)
    row = heading(ws, row + 1, "Deposition (limit) velocity, horizontal pipe", span=SPAN)
    row = _deposition(ws, row, curve, s)
    if curve.op_rate.size:
        row = heading(ws, row + 1, "Operating rates", span=SPAN)
        row = _op_points(ws, row, curve, s)
    for n in curve.notes:
        row = note_row(ws, row, text.keys_in_words(text.note_line(n, s)), span=SPAN)
    chart_row = row + 1
    row = chart_row + 24
    row = heading(ws, row, "Operating curve", span=SPAN)
    row, r0, r1 = _curve_table(ws, row, curve, s)
    _chart(ws, chart_row, curve, s, (r0, r1), SPAN + 2)
    return row + 1


def write_slurry_line(wb, results, title: str) -> dict:
    """The sheet (only when the case has slurry lines); returns {} (no Summary rows)."""
    curves = results.slurry_lines
    if not curves:
        return {}
    s = results.case.unit_system
    ws = wb.create_sheet(SHEET)
    set_widths(ws, [12, 12, 14, 14, 16, 12, 12, 12, 3, 10, 10])
    row = heading(ws, 1, "Slurry line: deposition velocity and operating curve", span=SPAN,
                  title=True)  # fmt: skip
    row = note_row(ws, row, cautions.CELL, span=SPAN)
    for curve in curves:
        row = _one_line(ws, row + 1, curve, s)
    page_setup(ws, title, footer=_FOOTER)
    ws.print_area = f"A1:H{row}"
    return {}


def slurry_line_data(results) -> list | None:
    """The "slurry_lines" block of ``--json`` (case units; None without slurry lines)."""
    curves = results.slurry_lines
    if not curves:
        return None
    s = results.case.unit_system

    def dv(x, kind):
        return text.display_values(x, kind, s)

    out = []
    for c in curves:
        line = c.line
        out.append(
            {
                "name": line.name,
                "method": line.method,
                "carrier_method": "wilson_thomas_1985",
                "pipe_id": dv(line.d_pipe, "diameter"),
                "length": dv(line.length, "length"),
                "inclination": line.inclination,
                "solids_concentration": line.solids.cv,
                "slurry_density": dv(c.mixture_density, "density"),
                "d50_mm": line.solids.d50 * 1e3,
                "d85_mm": line.solids.d85 * 1e3,
                "deposition_velocity": dv(c.deposition_velocity, "velocity"),
                "deposition_rate": dv(c.deposition_rate, "flow_rate"),
                "deposition_method": c.deposition.governing,
                "deposition_by_method": {
                    k: dv(v, "velocity") for k, v in c.deposition.by_method.items()
                },
                "minimum_velocity": dv(c.minimum_velocity, "velocity"),
                "minimum_gradient": dv(c.minimum_gradient, "pressure_gradient"),
                "operating_points": [
                    {
                        "rate": dv(c.op_rate[i], "flow_rate"),
                        "velocity": dv(c.op_velocity[i], "velocity"),
                        "gradient": dv(c.op_gradient[i], "pressure_gradient"),
                        "pressure": dv(c.op_pressure[i], "pressure"),
                        "below_deposition": bool(c.op_below[i]),
                    }
                    for i in range(c.op_rate.size)
                ],
                "curve": {
                    "velocity": dv(c.velocity, "velocity"),
                    "rate": dv(c.rate, "flow_rate"),
                    "gradient": dv(c.gradient, "pressure_gradient"),
                    "carrier_gradient": dv(c.carrier_gradient, "pressure_gradient"),
                    "pressure": dv(c.pressure, "pressure"),
                    "below_deposition": [bool(x) for x in c.below_deposition],
                },
            }
        )
    return out
