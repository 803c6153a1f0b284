"""The "Rate window" sheet: the flow-rate operating window of
:func:`calc.rate_window.operating_window`.

Every number comes from the :class:`calc.rate_window.OperatingWindow` of the report run (one
vectorised sweep); this module converts units, names the binding limits in words and lays out
the table and three native charts (ECD at the tightest points against their limits, standpipe
pressure against the surface rating, cleaning indicator), all against flow rate.
"""

from __future__ import annotations

import numpy as np
from openpyxl.styles import Alignment, Font
from openpyxl.worksheet.pagebreak import Break

from addin.report.charts import nice_axis, rate_curves
from addin.report.sheet_cleaning import short_name
from addin.report.style import (
    heading,
    note_row,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.report.trace import method_line, slip_line, slip_method_of
from addin.text import check_point, pump_speed
from addin.text import display_values as _o
from addin.text import unit_label as U
from addin.xlsx_cells import PALETTE, put, set_widths

__all__ = ["SHEET", "allowed_ecd", "binding_words", "write_window"]

SHEET = "Rate window"
#: Every PRINT_EVERY-th sweep rate is printed; the whole sweep sits below the print range.
PRINT_EVERY = 10
_TOOL_MIN, _TOOL_MAX = " flow window (min)", " flow window (max)"


def allowed_ecd(ow):
    """ECD limits at the tightest points over the sweep [kg/m³], as calc.rate_window returns them:
    (fracture − required margin, pore + required margin)."""
    return np.asarray(ow.ecd_max_at_point), np.asarray(ow.ecd_min_at_point)


def _index_at(ow, q):
    """Sweep index nearest to rate ``q`` (to name the tightest point at a window end)."""
    return int(np.argmin(np.abs(np.asarray(ow.q) - q)))


def binding_words(ow, end: str, *, long: bool = False, system: str = "oilfield") -> str:
    """The limit that binds at ``end`` ("low" or "high") in words (``long``: with the place,
    in ``system``'s units)."""
    if not ow.feasible:
        return "no rate satisfies every limit at once (failing: " + ow.binding_low + ")"
    name = ow.binding_low if end == "low" else ow.binding_high
    q = ow.q_low if end == "low" else ow.q_high
    i = _index_at(ow, q)
    if name == "fracture":
        where = f" at {check_point(ow.fracture_point_name[i], system)}" if long else ""
        return "ECD reaches fracture − margin" + where
    if name == "pore":
        where = f" at {check_point(ow.pore_point_name[i], system)}" if long else ""
        return "ECD falls to pore + margin" + where
    if name == "surface rating":
        return "standpipe pressure reaches the surface rating"
    if name == "liner rating":
        return "standpipe pressure reaches the pumps' liner rating"
    if name == "rated hydraulic power":
        return "a pump reaches its rated hydraulic power"
    if name == "hole cleaning":
        if long and ow.controlling_interval:
            return f"hole cleaning no longer adequate ({short_name(ow.controlling_interval)})"
        return "hole cleaning no longer adequate"
    if name.endswith(_TOOL_MIN):
        return f"minimum of the {name[: -len(_TOOL_MIN)]} flow window"
    if name.endswith(_TOOL_MAX):
        return f"maximum of the {name[: -len(_TOOL_MAX)]} flow window"
    if name in ("lowest rate swept", "highest rate swept"):
        return f"no limit inside the sweep (its {name.split()[0]} rate)"
    return name


def _spm(results, q) -> str:
    """ "; 62.6 spm × 2 pumps" at rate ``q`` when the case has pumps ("" otherwise)."""
    words = pump_speed(getattr(results, "pumps", None), q)
    return f"; {words}" if words else ""


def _position(ow, q) -> str:
    if not ow.feasible:
        return "no window"
    if q < ow.q_low:
        return "BELOW the window"
    if q > ow.q_high:
        return "ABOVE the window"
    return "inside the window"


def _columns(ow, system):
    """(header, unit, values, number format) of the sweep table, values in the case's units."""
    dn, pu, qu = U("density", system), U("pressure", system), U("flow_rate", system)
    f_lim, p_lim = allowed_ecd(ow)
    n = np.size(ow.q)
    inside = (np.asarray(ow.q) >= ow.q_low) & (np.asarray(ow.q) <= ow.q_high) & ow.feasible
    fd, fp = number_format("density", system), number_format("pressure", system)
    cols = [
        ("flow rate", qu, _o(ow.q, "flow_rate", system), number_format("flow_rate", system)),
        ("standpipe pressure", pu, _o(ow.spp, "pressure", system), fp),
        ("surface rating", pu, _o(np.full(n, ow.surface_rating), "pressure", system), fp),
        ("ECD, fracture-tightest point", dn, _o(ow.ecd_fracture_point, "density", system), fd),
        ("max. ECD (fracture − margin)", dn, _o(f_lim, "density", system), fd),
        (
            "fracture-tightest point",
            "",
            [check_point(x, system) for x in ow.fracture_point_name],
            None,
        ),
        ("ECD, pore-tightest point", dn, _o(ow.ecd_pore_point, "density", system), fd),
        ("min. ECD (pore + margin)", dn, _o(p_lim, "density", system), fd),
        (
            "pore-tightest point",
            "",
            [check_point(x, system) for x in ow.pore_point_name],
            None,
        ),
        ("cleaning indicator", "≥ 0 cleaned", [float(x) for x in ow.cleaning_indicator], "0.000"),
        ("lowest transport ratio", "–", [float(x) for x in ow.min_transport_ratio], "0.000"),
        ("highest cuttings conc.", "%", [100.0 * float(x) for x in ow.max_concentration], "0.00"),
        ("in window", "", ["yes" if x else "no" for x in inside], None),
    ]
    if ow.loaded:  # the clean ECD beside the loaded one the fracture limit holds
        cols.append(
            ("clean ECD, fracture-tightest point", dn,
             _o(ow.ecd_clean_fracture_point, "density", system), fd)
        )  # fmt: skip
    return cols


def _table(ws, row, cols, rows) -> int:
    """Header + units, then the given sweep rows; returns the row after the table."""
    row = table_header(ws, row, 1, [c[0] for c in cols], [c[1] for c in cols])
    for i in rows:
        for j, (_, _, vals, fmt) in enumerate(cols, start=1):
            if fmt is None:
                c = put(ws, row, j, vals[i], "bf_cell")
                if cols[j - 1][0] == "in window":
                    c.alignment = Alignment(horizontal="center", vertical="center")
            else:
                put_number(ws, row, j, vals[i], fmt)
        row += 1
    return row


def _nice(values, ticks=6):
    v = [x for x in values if x is not None]
    return nice_axis(min(v), max(v), ticks)


def _intro(ws, row, results, ow, system, span) -> int:
    """The method paragraph: sweep, cuttings load and what "inside" means."""
    case = results.case
    qu, dn = U("flow_rate", system), U("density", system)
    q = np.asarray(ow.q)
    q0 = case.check_value(-1, "flow_rate")
    chk = case.checks[-1]
    rop = chk.values.get("rop")
    if ow.loaded:
        basis = (
            "ECD basis 'loaded': the cuttings-loaded ECD at each rate against fracture, clean "
            "ECD against pore"
        )
    else:
        basis = "ECD basis 'clean': clean-mud ECD against both limits"
    load = (
        f"ROP {_o(rop, 'rop', system):,.0f} {U('rop', system)} and the cuttings of {chk.label} "
        f"({basis})"
        if results.cleaning
        else f"no cuttings given (no cleaning limit; {basis})"
    )
    slip = slip_method_of(results.cleaning.result.method) if results.cleaning else None
    cleaning = f"; cleaning {slip_line(slip)}" if slip else ""
    intro = (
        f"Method: circulation {method_line(results)}{cleaning}. Sweep: {q.size} rates from "
        f"{_o(q[0], 'flow_rate', system):,.0f} "
        f"to {_o(q[-1], 'flow_rate', system):,.0f} {qu} ({q[0] / q0:.1f}–{q[-1] / q0:.1f} × the "
        f"check's rate); {load}. A rate is inside when ECD ≤ fracture − "
        f"{_o(ow.fracture_margin, 'density', system):.2f} {dn} and ≥ pore + "
        f"{_o(ow.pore_margin, 'density', system):.2f} {dn} at every check point, standpipe "
        "pressure ≤ the surface rating"
        + (", ≤ the running pumps' lowest liner rating" if "liner rating" in ow.limits else "")
        + (
            ", each pump within its rated hydraulic power at its share of the rate"
            if "rated hydraulic power" in ow.limits
            else ""
        )
        + ", every annular interval is adequately cleaned and every "
        "downhole tool's flow window holds; each end is interpolated on the limit that fails "
        "just outside it."
    )
    return note_row(ws, row, intro, span=span)


def _window_lines(ws, row, results, ow, system, span) -> int:
    """The "Window" table (ends, binding limits, the check's rate, the cleaning rate) and the
    note on the rating and margins; returns the next row."""
    qu, dn, pu = U("flow_rate", system), U("density", system), U("pressure", system)
    q0 = results.case.check_value(-1, "flow_rate")
    row = heading(ws, row, "Window", span=span)
    row = table_header(ws, row, 1, ["", "", "rate", "unit", "binding limit or remark"])
    ws.merge_cells(start_row=row - 1, start_column=1, end_row=row - 1, end_column=2)
    ws.merge_cells(start_row=row - 1, start_column=5, end_row=row - 1, end_column=span)
    lines = []
    if ow.feasible:
        lines += [
            ("lowest rate", ow.q_low, binding_words(ow, "low", long=True, system=system)
             + _spm(results, ow.q_low)),
            ("highest rate", ow.q_high, binding_words(ow, "high", long=True, system=system)
             + _spm(results, ow.q_high)),
        ]  # fmt: skip
    else:
        lines.append(("operating window", None, binding_words(ow, "low")))
    lines.append(("this check's rate", q0, _position(ow, q0)))
    if results.cleaning:
        lines.append(
            (
                "rate to clean every interval",
                ow.min_cleaning_rate,
                f"controlling interval: {short_name(ow.controlling_interval)}",
            )
        )
    for name, v, remark in lines:
        put(ws, row, 1, name, "bf_cell")
        ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=2)
        if v is None:
            put(ws, row, 3, "none", "bf_cell")
        else:
            put_number(ws, row, 3, _o(v, "flow_rate", system), "#,##0")
        put(ws, row, 4, qu, "bf_unit")
        c = put(ws, row, 5, remark, "bf_cell")
        if not ow.feasible or remark in ("BELOW the window", "ABOVE the window"):
            c.font = Font(name="Arial", size=9, bold=True, color=PALETTE["bad"])
        ws.merge_cells(start_row=row, start_column=5, end_row=row, end_column=span)
        row += 1
    rating = _o(ow.surface_rating, "pressure", system)
    pumps = getattr(results, "pumps", None)
    liners = [p.liner_rating for p in pumps.running if p.liner_rating] if pumps else []
    return note_row(
        ws,
        row,
        (f"Surface rating {rating:,.0f} {pu}; " if rating is not None else "No surface rating; ")
        + (
            f"liner rating {_o(min(liners), 'pressure', system):,.0f} {pu} (lowest of the "
            f"{len(pumps.running)} running pumps); "
            if liners
            else ""
        )
        + f"required ECD margins {_o(ow.fracture_margin, 'density', system):.2f} {dn} below "
        f"fracture and {_o(ow.pore_margin, 'density', system):.2f} {dn} above pore (the case's "
        "limits section). Charts: dashed lines are the limits, dotted verticals the window ends.",
        span=span,
    )


def _printed_sweep(ws, data_row, cols, n, span, ow) -> int:
    """Every PRINT_EVERY-th sweep rate on page 2 with its note; returns the last printed row."""
    shown = sorted(set(range(0, n, PRINT_EVERY)) | {n - 1})
    ws.row_breaks.append(Break(id=data_row - 1))
    head = f"Sweep (every {PRINT_EVERY}th rate; all {n} below the print range)"
    row = heading(ws, data_row, head, span=span)
    ws.print_title_rows = f"{row}:{row + 1}"
    head_row = row
    row = _table(ws, row, cols, shown)
    ws.row_dimensions[head_row].height = 38  # three-line headers
    row = note_row(
        ws,
        row,
        (
            "ECD at the fracture-tightest point includes the cuttings load at that rate (the "
            "clean ECD beside it); "
            if ow.loaded
            else "ECD at the fracture-tightest point is the clean-mud ECD; "
        )
        + "the tightest point can move with the rate (named per row). Cleaning indicator: "
        "smallest relative margin to the 'adequate' thresholds of calc.cleaning over the annular "
        "intervals (≥ 0: every interval cleaned). 'in window': between the two ends above.",
        span=span,
    )
    return row - 1


def _chart_specs(results, ow, system):
    """(title, y-axis title, [(series name, sweep-table column, role)]) of each chart."""
    dn, pu = U("density", system), U("pressure", system)
    charts = [
        (
            "ECD at the tightest points",
            f"equivalent density [{dn}]",
            [
                ("ECD, fracture-tightest", 4, "value"),
                ("max. (fracture − margin)", 5, "limit"),
                ("ECD, pore-tightest", 7, "value2"),
                ("min. (pore + margin)", 8, "limit2"),
            ],
        ),
        (
            "Standpipe pressure",
            f"pressure [{pu}]",
            [("standpipe pressure", 2, "value"), ("surface rating", 3, "limit")],
        ),
        (
            "Hole cleaning",
            "indicator, transport ratio [–]",
            [("cleaning indicator", 10, "value"), ("lowest transport ratio", 11, "value2")],
        ),
    ]
    if not results.cleaning:
        charts = charts[:2]
    if ow.surface_rating == float("inf"):
        charts[1] = (charts[1][0], charts[1][1], charts[1][2][:1])
    return charts


def _charts(ws, results, ow, cols, rows, chart_row, system) -> int:
    """The native charts over the whole sweep (data ``rows`` = (r0, r1)) with the window-end
    marker lines written below the data; returns the markers' first row."""
    r0, r1 = rows
    q = np.asarray(ow.q)
    # window-end marker lines: x = (low, low, gap, high, high), y = axis (min, max, gap, max, min)
    mrow = r1 + 3
    put(ws, mrow - 1, 1, "Window ends (chart marker lines)", "bf_section")
    ends = [ow.q_low, ow.q_low, None, ow.q_high, ow.q_high] if ow.feasible else []
    lo, hi, step = _nice([_o(q[0], "flow_rate", system), _o(q[-1], "flow_rate", system)], 8)
    rate_lim = (lo, hi, 2 * step if (hi - lo) / step > 6 else step)  # ≤ 6 labels on a third
    for k, (ctitle, ytitle, series) in enumerate(_chart_specs(results, ow, system)):
        vals = [v for _, c, _ in series for v in cols[c - 1][2]]
        lo, hi, step = _nice(vals)
        mc = 2 + 2 * k
        if ends:
            for i, (x, y) in enumerate(zip(ends, [lo, hi, None, hi, lo], strict=True)):
                put_number(ws, mrow + i, mc, None if x is None else _o(x, "flow_rate", system))
                put_number(ws, mrow + i, mc + 1, y)
        ch = rate_curves(
            (ws, 1, r0, r1),
            [(name, (ws, c, r0, r1), role) for name, c, role in series],
            rate_unit=U("flow_rate", system),
            y_title=ytitle,
            title=ctitle,
            y_limits=(lo, hi, step),
            x_limits=rate_lim,
            markers=[("window ends", (ws, mc, mrow, mrow + 4), (ws, mc + 1, mrow, mrow + 4))]
            if ends
            else [],
        )
        ws.add_chart(ch, f"{'AFI'[k]}{chart_row}")
    return mrow


def write_window(wb, results, title: str):
    """The sheet; returns refs for the summary (empty without a window)."""
    case, ow = results.case, results.window
    system = case.unit_system
    ws = wb.create_sheet(SHEET)
    # 3 × 48 characters: the three charts sit one per third of the page
    set_widths(ws, [9, 9, 9, 10, 11, 24, 12, 12, 16, 9, 9, 8, 6])
    span = 13
    row = heading(ws, 1, "Flow-rate operating window: every limit at once", span=span, title=True)
    if ow is None:
        put(ws, row + 1, 1, "Not evaluated: needs a pressure window (pore, fracture).", "bf_text")
        setup_print(ws, title)
        return {}
    q = np.asarray(ow.q)
    q0 = case.check_value(-1, "flow_rate")
    row = _intro(ws, row, results, ow, system, span)
    row = _window_lines(ws, row + 1, results, ow, system, span)
    # ---- charts (page 1) and the printed table (page 2)
    chart_row = row + 1
    data_row = chart_row + 25  # 11.5-cm charts
    cols = _columns(ow, system)
    print_end = _printed_sweep(ws, data_row, cols, q.size, span, ow)
    # ---- chart data: the whole sweep, below the print range
    row = print_end + 3
    put(ws, row, 1, "Chart data: the whole sweep (rows below; not printed).", "bf_note")
    ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=span)
    row += 1
    put(ws, row, 1, "Rate sweep", "bf_section")
    r0 = row + 3  # first data row, under the header and units rows
    r1 = _table(ws, row + 1, cols, range(q.size)) - 1
    mrow = _charts(ws, results, ow, cols, (r0, r1), chart_row, system)
    put(ws, mrow, 1, "x, y", "bf_note")
    setup_print(ws, title)
    ws.print_area = f"A1:M{print_end}"
    return {
        "feasible": ow.feasible,
        "low": (
            ow.q_low,
            binding_words(ow, "low") + (_spm(results, ow.q_low) if ow.feasible else ""),
        ),
        "high": (
            ow.q_high,
            binding_words(ow, "high") + (_spm(results, ow.q_high) if ow.feasible else ""),
        ),
        "check_rate": (q0, _position(ow, q0)),
        "sweep_rows": (r0, r1),
    }
