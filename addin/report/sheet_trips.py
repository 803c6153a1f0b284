"""The trip (surge/swab) sheet: speed limits with the bit at the bottom, the parts of the peak
pressure change at the limit, the schedule per depth band, the planned speeds and breaking
circulation."""

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
from calc.surge import trip_emw

__all__ = ["TERM_WORDS", "point_label", "write_trips"]

#: What governs a trip-speed limit (calc.surge.TripComponents.term), in words.
TERM_WORDS = {
    "friction": "friction (steady surge/swab)",
    "inertia": "inertia (speeding up)",
    "stopping": "stopping the stand (inertia, opposite sign)",
    "gel": "gel breaking at start-up",
    "static": "static mud outside the margin",
    "not limiting": "not limiting",
}

SPAN = 10


def point_label(name: str) -> str:
    """A trip check point in words: its name ("bit", "<casing> shoe", a weak point), or the
    exposed hole for a plain depth (no name; the MD and TVD columns say where)."""
    return name or "open hole (below the shoe)"


def write_trips(wb, results, factors: Factors, title: str):
    system = results.case.unit_system
    part = results.surge
    ws = wb.create_sheet("Trips")
    set_widths(ws, [34, 14, 14, 14, 14, 14, 14, 14, 14, 30])
    row = heading(ws, 1, "Trips: surge and swab", span=SPAN, title=True)
    if part is None:
        put(
            ws,
            row + 1,
            1,
            "Not evaluated: needs the case's trip section and a pressure window.",
            "bf_text",
        )
        return {}
    lim = part.limits
    merged_text(
        ws,
        row,
        f"Method: {text.keys_in_words(lim.method)}; string end {lim.string_end}; peak speed = "
        f"{lim.peak_factor:g} × average stand speed.",
        span=SPAN,
        height=30,
    )
    row = _assumption_rows(ws, row + 1, part, system)
    row = _limit_rows(ws, row + 1, lim, system)
    row = _component_rows(ws, row + 1, lim, system)
    row = _schedule_rows(ws, row + 1, part.schedule, system)
    row = _planned_rows(ws, row + 1, part, results.circulation, system)
    row = _break_rows(ws, row + 1, part, system)
    put(
        ws,
        row,
        1,
        "EMW at the bit = mud density ± pressure change / (g·TVD); swab is a pressure drop "
        "(negative). Peak = max(gel breaking, steady + inertia): the gel holds until the mud "
        "starts to flow, then friction and inertia act together while the pipe speeds up.",
        "bf_note",
    )
    ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=SPAN)
    setup_print(ws, title)
    return {
        "running": lim.max_running_speed,
        "pulling": lim.max_pulling_speed,
        "running_point": lim.running_point,
        "pulling_point": lim.pulling_point,
        "running_term": lim.running.term if lim.running else "",
        "pulling_term": lim.pulling.term if lim.pulling else "",
    }


def _assumption_rows(ws, row, part, system) -> int:
    """The stated assumptions: acceleration time, the gels used and why."""
    su = U("stress", system)

    def gel_text(choice):
        name, value = choice
        if value is None:
            return f"{name} gel not measured in the latest check (term left out)"
        return f"{name} gel, {_o(value, 'stress', system):.3g} {su}"

    lines = [
        f"Acceleration: the pipe reaches its peak speed in {part.acceleration_time:g} s from "
        "rest and stops in the same time (the acceleration time of the case's trip section; an "
        "assumption, use the rig's value).",
        f"Gel broken when the pipe starts at each stand: {gel_text(part.stand_gel)} (the pipe "
        "stood still only for the connection; common practice).",
        f"Gel broken when circulation starts after the trip: {gel_text(part.circulation_gel)} "
        "(the mud stood still through the trip; common practice).",
    ]
    for line in lines:
        merged_text(ws, row, line, span=SPAN, height=16)
        row += 1
    return row


def _limit_rows(ws, row, lim, system) -> int:
    """The speed limits with the bit at the bottom and their governing points."""
    tu, du = U("trip_speed", system), U("depth", system)
    row = heading(
        ws,
        row,
        "Speed limits, bit at the bottom (margins from the case's limits section)",
        span=SPAN,
    )
    row = table_header(
        ws,
        row,
        1,
        ["trip direction", "max. average speed", "governing point", "MD", "TVD", "governed by"],
        ["", tu, "", du, du, ""],
    )
    for name, v, pt, comp in (
        ("running in (surge)", lim.max_running_speed, lim.running_point, lim.running),
        ("pulling out (swab)", lim.max_pulling_speed, lim.pulling_point, lim.pulling),
    ):
        put(ws, row, 1, name)
        put_number(ws, row, 2, _o(v, "trip_speed", system), "#,##0")
        put(ws, row, 3, point_label(pt.name))
        put_number(ws, row, 4, _o(pt.md, "depth", system), number_format("depth", system))
        put_number(ws, row, 5, _o(pt.tvd, "depth", system), number_format("depth", system))
        put(ws, row, 6, TERM_WORDS.get(comp.term, comp.term) if comp else "")
        row += 1
    return row


def _component_rows(ws, row, lim, system) -> int:
    """Steady surge/swab, inertia and gel breaking at the governing point at the limit speed,
    with a live check of the peak = MAX(gel, steady + inertia)."""
    pu, tu = U("pressure", system), U("trip_speed", system)
    pf = number_format("pressure", system)
    row = heading(ws, row, "Parts of the peak pressure change at the limit", span=SPAN)
    row = table_header(
        ws,
        row,
        1,
        [
            "trip direction",
            "peak speed",
            "steady surge/swab",
            "inertia",
            "gel breaking",
            "peak",
            "live check",
            "",
            "allowance",
            "stopping (other sign)",
        ],
        ["", tu, pu, pu, pu, pu, "MAX(E, C + D)", "", pu, pu],
    )
    for name, comp in (("running in (surge)", lim.running), ("pulling out (swab)", lim.pulling)):
        if comp is None:
            continue
        put(ws, row, 1, name)
        put_number(ws, row, 2, _o(comp.peak_speed, "trip_speed", system), "#,##0")
        for col, v in ((3, comp.steady), (4, comp.inertia), (5, comp.gel)):
            put_number(ws, row, col, _o(v, "pressure", system), pf)
        write_checked(ws, row, 6, _o(comp.peak, "pressure", system), f"MAX(E{row},C{row}+D{row})",
                      kind="pressure", system=system)  # fmt: skip
        put_number(ws, row, 9, _o(comp.allowance, "pressure", system), pf)
        put_number(ws, row, 10, _o(comp.stopping, "pressure", system), pf)
        row += 1
    return row


def _schedule_rows(ws, row, schedule, system) -> int:
    """The trip schedule: speed limits per depth band of the bit."""
    if schedule is None:
        return row
    tu, du = U("trip_speed", system), U("depth", system)
    row = heading(ws, row, "Trip schedule: speed limits while the bit is in each band", span=SPAN)
    row = table_header(
        ws,
        row,
        1,
        [
            "bit depth band",
            "top MD",
            "bottom MD",
            "max. running speed",
            "governing point (running)",
            "at MD",
            "max. pulling speed",
            "governing point (pulling)",
            "at MD",
            "governed by (running / pulling)",
        ],
        ["", du, du, tu, "", du, tu, "", du, ""],
    )
    fmt_d = number_format("depth", system)
    for i, b in enumerate(schedule.bands, start=1):
        put(ws, row, 1, f"band {i}")
        put_number(ws, row, 2, _o(b.top_md, "depth", system), fmt_d)
        put_number(ws, row, 3, _o(b.bottom_md, "depth", system), fmt_d)
        put_number(ws, row, 4, _o(b.running_limit, "trip_speed", system), "#,##0")
        put(ws, row, 5, point_label(b.running_point.name))
        put_number(ws, row, 6, _o(b.running_point.md, "depth", system), fmt_d)
        put_number(ws, row, 7, _o(b.pulling_limit, "trip_speed", system), "#,##0")
        put(ws, row, 8, point_label(b.pulling_point.name))
        put_number(ws, row, 9, _o(b.pulling_point.md, "depth", system), fmt_d)
        put(ws, row, 10, f"{b.running_term} / {b.pulling_term}")
        row += 1
    put(
        ws,
        row,
        1,
        "Each band: the lowest limit with the bit at the band's edges and at any weak point "
        "inside it; the whole exposed hole is checked (below the bit the bit's pressure change).",
        "bf_note",
    )
    ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=SPAN)
    return row + 1


def _planned_rows(ws, row, part, res, system) -> int:
    """Steady surge and swab at the bit and the trip EMW for the planned speeds."""
    tu, pu = U("trip_speed", system), U("pressure", system)
    run, pull = part.running, part.pulling
    row = heading(ws, row, "Steady pressure change at the bit for the planned speeds", span=SPAN)
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


def _break_rows(ws, row, part, system) -> int:
    """Pressure to break circulation after the trip (gel in the bore and the annulus)."""
    bc = part.break_circulation
    if bc is None:
        return row
    pu, pf = U("pressure", system), number_format("pressure", system)
    row = heading(ws, row, "Breaking circulation after the trip", span=SPAN)
    row = table_header(
        ws,
        row,
        1,
        ["gel", "string (bore)", "annulus", "total", "bottom EMW"],
        [U("stress", system), pu, pu, pu, U("density", system)],
    )
    put_number(ws, row, 1, _o(bc.gel_strength, "stress", system), "0.0")
    put_number(ws, row, 2, _o(bc.string_pressure, "pressure", system), pf)
    put_number(ws, row, 3, _o(bc.annulus_pressure, "pressure", system), pf)
    put_number(ws, row, 4, _o(bc.pressure, "pressure", system), pf)
    put_number(ws, row, 5, _o(bc.bottom_emw, "density", system), number_format("density", system))
    return row + 2
