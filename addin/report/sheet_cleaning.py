"""The hole-cleaning sheet (the trip sheet is :mod:`addin.report.sheet_trips`)."""

from __future__ import annotations

from addin import text
from addin.report.audit import Factors, write_checked
from addin.report.sheet_beds import write_beds
from addin.report.style import (
    heading,
    merged_text,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.report.trace import slip_line, slip_method_of
from addin.text import display_number as _o
from addin.text import unit_label as U
from addin.xlsx_cells import put, set_widths
from calc.cleaning import CLEANING_METHODS
from calc.cleaning.deviated import DEVIATED_METHODS
from calc.cleaning.hole import USES_ROTATION
from calc.span import Span

__all__ = ["METHOD_WORDS", "short_name", "write_cleaning"]


def short_name(where: Span | str | None) -> str:
    """An interval in words without its MD span (MD columns show the depths): a
    :class:`~calc.span.Span` by :func:`addin.text.span`; a name text (interval names of the
    circulation results) cut before its ", MD a-b unit"; ``""`` for None (no interval)."""
    if where is None:
        return ""
    if isinstance(where, Span):
        return text.span(where, depths=False)
    return str(where).split(", MD")[0]


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
    merged_text(ws, row, f"Method: {_method_words(hc)}", span=_NCOL, height=36)
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
        "three rates governs and is the minimum rate. Notes name each "
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
    write_beds(ws, row + 2, results)  # cuttings beds and circulation before a trip
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


def _method_words(hc) -> str:
    """The cleaning methods by name and primary source (their status is on the Audit sheet)."""
    slip = slip_method_of(hc.method)
    slip_words = f"slip {slip_line(slip)}" if slip else text.keys_in_words(hc.method)
    deviated = "; ".join(
        f"{text.method_words(name)} ({DEVIATED_METHODS.get(name).source})"
        for name in DEVIATED_METHODS.names()
    )
    return f"vertical criteria: {slip_words}, CCI (Robinson); {deviated}"
