"""Hole-cleaning and trip (surge/swab) sheets."""

from __future__ import annotations

import numpy as np

from addin import text
from addin.report.audit import Factors, write_checked
from addin.report.style import (
    heading,
    merged_text,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.text import display_number as _o
from addin.text import unit_label as U
from addin.xlsx_cells import put, set_widths
from calc.cleaning import CLEANING_METHODS
from calc.cleaning.hole import USES_ROTATION
from calc.span import Span
from calc.surge import trip_emw

__all__ = ["METHOD_WORDS", "point_label", "short_name", "write_cleaning", "write_trips"]


def short_name(where: Span | str | None) -> str:
    """An interval in words without its MD span (MD columns show the depths): a
    :class:`~calc.span.Span` by :func:`addin.text.span`; a name text (interval names of the
    circulation results) cut before its ", MD a-b unit"; ``""`` for None (no interval)."""
    if where is None:
        return ""
    if isinstance(where, Span):
        return text.span(where, depths=False)
    return str(where).split(", MD")[0]


def point_label(name: str) -> str:
    """A trip check point in words: its name ("bit", "<casing> shoe", a weak point), or the
    exposed hole for a plain depth (no name; the MD and TVD columns say where)."""
    return name or "open hole (below the shoe)"


#: How the Cleaning sheet names each method of calc.cleaning.CLEANING_METHODS.
METHOD_WORDS = {
    "vertical_criteria": "vertical criteria",
    "rubiandini_1999": "Rubiandini 1999",
    "larsen_1997": "Larsen 1997",
}
_NCOL = 18


def write_cleaning(wb, results, factors: Factors, title: str, q_ref: str):
    system = results.case.unit_system
    part = results.cleaning
    ws = wb.create_sheet("Cleaning")
    set_widths(ws, [46, 9, 9, 7, 10, 10, 9, 8, 9, 9, 8, 8, 10, 10, 10, 16, 11, 11])
    row = heading(ws, 1, "Hole cleaning (annulus, bit upwards)", span=_NCOL, title=True)
    if part is None:
        put(
            ws,
            row + 1,
            1,
            "Not evaluated: the latest check needs rop and cuttings (density, size).",
            "bf_text",
        )
        return {}
    hc = part.result
    merged_text(ws, row, f"Method: {hc.method}", span=_NCOL, height=36)
    merged_text(ws, row + 1, f"Criteria: {hc.criteria_text}", span=_NCOL, height=24)
    rot = ", ".join(METHOD_WORDS[m] for m in CLEANING_METHODS if USES_ROTATION[m])
    no_rot = ", ".join(METHOD_WORDS[m] for m in CLEANING_METHODS if not USES_ROTATION[m])
    merged_text(
        ws,
        row + 2,
        f"String rotary speed {hc.rpm:g} rpm: used by {rot}; {no_rot} have no rotation term.",
        span=_NCOL,
        height=16,
    )
    row += 4
    du, vu, qu = U("depth", system), U("velocity", system), U("flow_rate", system)
    ws.print_title_rows = f"{row}:{row + 1}"
    row = table_header(
        ws,
        row,
        1,
        [
            "interval",
            "top MD",
            "bottom MD",
            "incl.",
            "annular velocity",
            "slip velocity",
            "transport ratio",
            "TR live",
            "agree?",
            "cuttings conc.",
            "loaded density",
            "CCI",
            "rate: vertical criteria",
            "rate: Rubiandini 1999",
            "rate: Larsen 1997",
            "governs",
            "min. rate",
            "verdict",
        ],
        [
            "",
            du,
            du,
            "°",
            vu,
            vu,
            "–",
            "1 − Vs/Va",
            "",
            "%",
            U("density", system),
            "–",
            qu,
            qu,
            qu,
            "",
            qu,
            "",
        ],
    )
    row = _interval_rows(ws, row, hc.table(), system)
    put(
        ws,
        row,
        1,
        "Transport ratio live check: 1 − slip / annular velocity from the two columns on its "
        "left. Every method is applied at every inclination (no switch); the largest of its "
        "three rates governs and is the minimum rate (calc/METHODS.md §10.13). Notes name each "
        "method used outside its published inclination range.",
        "bf_note",
    )
    ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=_NCOL)
    row += 2
    worst = (
        "poor" if "poor" in hc.verdict else "marginal" if "marginal" in hc.verdict else ("adequate")
    )
    ctrl = hc.spans.index(hc.controlling_interval)
    gov = METHOD_WORDS[str(hc.governing[ctrl])]
    refs = {"verdict": worst, "controlling": (short_name(hc.controlling_interval),
                                              hc.controlling_rate),
            "governing": gov}  # fmt: skip
    put(
        ws,
        row,
        1,
        f"Overall: {worst}. Rate needed for '{hc.require}' cleaning everywhere: "
        f"{_o(hc.controlling_rate, 'flow_rate', system):,.0f} {qu} "
        f"(controlled by {short_name(hc.controlling_interval)}, "
        f"{text.span(hc.controlling_interval, system).split(', ')[-1]}; {gov} governs).",
        "bf_text",
    )
    setup_print(ws, title)
    return refs


def _interval_rows(ws, row, rows, system) -> int:
    """One row per annular interval of :meth:`HoleCleaningResult.table`; returns the next row."""
    for r in rows:
        put(ws, row, 1, short_name(r["interval"]))
        put_number(ws, row, 2, _o(r["top_md"], "depth", system), number_format("depth", system))
        put_number(ws, row, 3, _o(r["bottom_md"], "depth", system), number_format("depth", system))
        put_number(ws, row, 4, r["inclination"], "0.0")
        put_number(ws, row, 5, _o(r["annular_velocity"], "velocity", system), "#,##0.0")
        put_number(ws, row, 6, _o(r["slip_velocity"], "velocity", system), "#,##0.0")
        write_checked(
            ws,
            row,
            7,
            r["transport_ratio"],
            f"1-F{row}/E{row}",
            kind="dimensionless",
            system=system,
        )
        put_number(ws, row, 10, 100 * r["concentration"], "0.00")
        put_number(
            ws,
            row,
            11,
            _o(r["loaded_density"], "density", system),
            number_format("density", system),
        )
        put_number(ws, row, 12, r["cci"], "0.00")
        for j, m in enumerate(CLEANING_METHODS):
            put_number(ws, row, 13 + j, _o(r[f"{m}_rate"], "flow_rate", system), "#,##0")
        put(ws, row, 16, METHOD_WORDS[r["governing"]])
        put_number(ws, row, 17, _o(r["minimum_rate"], "flow_rate", system), "#,##0")
        put(ws, row, 18, r["verdict"])
        row += 1
    return row


def write_trips(wb, results, factors: Factors, title: str):
    system = results.case.unit_system
    part = results.surge
    ws = wb.create_sheet("Trips")
    set_widths(ws, [34, 16, 16, 14, 14, 14])
    row = heading(ws, 1, "Trips: surge and swab", span=6, title=True)
    if part is None:
        put(
            ws,
            row + 1,
            1,
            "Not evaluated: needs a [trip] section and a pressure window.",
            "bf_text",
        )
        return {}
    lim = part.limits
    merged_text(
        ws,
        row,
        f"Method: {lim.method}; string end {lim.string_end}; peak speed = "
        f"{lim.peak_factor:g} × average stand speed.",
        span=6,
        height=24,
    )
    row = _limit_rows(ws, row + 2, lim, system)
    row = _planned_rows(ws, row + 1, part, results.circulation, system)
    put(
        ws,
        row,
        1,
        "EMW at the bit = mud density ± pressure change / (g·TVD); swab is a pressure drop "
        "(negative).",
        "bf_note",
    )
    ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=6)
    setup_print(ws, title)
    return {
        "running": lim.max_running_speed,
        "pulling": lim.max_pulling_speed,
        "running_point": lim.running_point,
        "pulling_point": lim.pulling_point,
    }


def _limit_rows(ws, row, lim, system) -> int:
    """The speed limits and their governing points; returns the next row."""
    tu, du = U("trip_speed", system), U("depth", system)
    row = heading(ws, row, "Speed limits (margins from [limits])", span=6)
    row = table_header(
        ws,
        row,
        1,
        ["trip direction", "max. average speed", "governing point", "MD", "TVD"],
        ["", tu, "", du, du],
    )
    for name, v, pt in (
        ("running in (surge)", lim.max_running_speed, lim.running_point),
        ("pulling out (swab)", lim.max_pulling_speed, lim.pulling_point),
    ):
        put(ws, row, 1, name)
        put_number(ws, row, 2, _o(v, "trip_speed", system), "#,##0")
        put(ws, row, 3, point_label(pt.name))
        put_number(ws, row, 4, _o(pt.md, "depth", system), number_format("depth", system))
        put_number(ws, row, 5, _o(pt.tvd, "depth", system), number_format("depth", system))
        row += 1
    return row


def _planned_rows(ws, row, part, res, system) -> int:
    """Surge and swab at the bit and the trip EMW for the planned speeds; returns the next row."""
    tu, pu = U("trip_speed", system), U("pressure", system)
    run, pull = part.running, part.pulling
    row = heading(ws, row, "Pressure change at the bit for the planned speeds", span=6)
    row = table_header(
        ws,
        row,
        1,
        ["average stand speed", "surge (running)", "swab (pulling)", "surge EMW", "swab EMW"],
        [tu, pu, pu, U("density", system), U("density", system)],
    )
    for i, sp in enumerate(part.speeds):
        s_up = float(np.asarray(run.pressure_bit).reshape(-1)[i])
        s_dn = float(np.asarray(pull.pressure_bit).reshape(-1)[i])
        put_number(ws, row, 1, _o(sp, "trip_speed", system), "#,##0")
        put_number(ws, row, 2, _o(s_up, "pressure", system), number_format("pressure", system))
        put_number(ws, row, 3, _o(s_dn, "pressure", system), number_format("pressure", system))
        for col, dp in ((4, s_up), (5, s_dn)):
            emw = trip_emw(res.density, dp, res.bit_tvd)
            put_number(ws, row, col, _o(emw, "density", system), number_format("density", system))
        row += 1
    return row
