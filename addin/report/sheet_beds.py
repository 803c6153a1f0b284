"""Cuttings beds block of the Cleaning sheet, and its JSON data (calc.cleaning.well_cuttings_beds).

The bed table lists the annular intervals at or above the bed onset inclination with the
equilibrium bed at the check's rate; below it, the circulation before a trip (bottoms-up
multipliers by inclination band and hole size, common practice).
"""

from __future__ import annotations

import numpy as np

from addin import text
from addin.report.style import heading, note_row, number_format, put_number, table_header
from addin.text import display_number as _o
from addin.text import unit_label as U
from addin.xlsx_cells import put
from calc.cleaning import CIRCULATION_FACTORS

__all__ = ["beds_data", "write_beds"]

SPAN = 14


def _name(where) -> str:
    return text.span(where, depths=False)


def _bed_rows(beds) -> list[int]:
    """Indices of the intervals at or above the onset (where a bed is considered)."""
    inc = np.atleast_1d(np.asarray(beds.bed.inclination, dtype=float))
    return [int(i) for i in np.flatnonzero(inc >= beds.onset)]


def _at(arr, i) -> float:
    return float(np.atleast_1d(np.asarray(arr, dtype=float))[i])


def write_beds(ws, row: int, results) -> int:
    """The cuttings-bed block from ``row``; returns the next free row (nothing without beds)."""
    beds = results.beds
    if beds is None:
        return row
    s = results.case.unit_system
    qu, dn = U("flow_rate", s), U("density", s)
    row = heading(ws, row, "Cuttings beds at high angle (stationary bed at this rate)", span=SPAN)
    row = note_row(
        ws,
        row,
        f"Method: {text.keys_in_words(beds.bed.method)}. A bed is considered from "
        f"{beds.onset:g}° (below it cuttings "
        "slide down the low side); below the critical velocity V_crit the bed grows until the "
        "velocity over it equals V_crit; friction over the bed: the annulus law on the open "
        "area's hydraulic diameter; pipe on the low side, no rotation (its caveats: Audit sheet).",
        span=SPAN,
    )
    idx = _bed_rows(beds)
    if not idx:
        row = note_row(
            ws,
            row,
            f"No annular interval reaches {beds.onset:g}° (steepest "
            f"{beds.max_inclination:.1f}°): no stationary bed is considered in this well.",
            span=SPAN,
        )
    else:
        row = _bed_table(ws, row, beds, idx, s)
        loss = _o(beds.extra_loss, "pressure", s)
        row = note_row(
            ws,
            row,
            f"Extra annular friction from beds {loss:,.1f} {U('pressure', s)} = "
            f"{_o(beds.ecd_increment, 'density', s):.3f} {dn} of ECD at the bit (not in the "
            f"headline ECD). No stationary bed anywhere above "
            f"{_o(beds.no_bed_rate, 'flow_rate', s):,.0f} {qu}.",
            span=SPAN,
        )
    return _cleanup_block(ws, row + 1, beds, s)


def _bed_table(ws, row, beds, idx, s) -> int:
    du, vu, qu = U("depth", s), U("velocity", s), U("flow_rate", s)
    b = beds.bed
    row = table_header(
        ws,
        row,
        1,
        ["interval", "top MD", "bottom MD", "incl.", "annular velocity", "V_crit",
         "bed height", "bed area", "velocity over bed", "D_h open", "friction clean",
         "friction with bed", "no-bed rate", "bed?"],
        ["", du, du, "°", vu, vu, U("diameter", s), "% of annulus", vu, U("diameter", s),
         U("pressure_gradient", s), U("pressure_gradient", s), qu, ""],
    )  # fmt: skip
    fd, fg = number_format("diameter", s), number_format("pressure_gradient", s)
    for i in idx:
        put(ws, row, 1, _name(beds.spans[i]))
        put_number(ws, row, 2, _o(beds.top_md[i], "depth", s), number_format("depth", s))
        put_number(ws, row, 3, _o(beds.bottom_md[i], "depth", s), number_format("depth", s))
        put_number(ws, row, 4, _at(b.inclination, i), "0.0")
        for col, arr in ((5, b.velocity_clean), (6, b.critical_velocity)):
            put_number(ws, row, col, _o(_at(arr, i), "velocity", s), "#,##0.0")
        put_number(ws, row, 7, _o(_at(b.bed_height, i), "diameter", s), fd)
        put_number(ws, row, 8, 100.0 * _at(b.bed_fraction, i), "0.0")
        put_number(ws, row, 9, _o(_at(b.velocity_over_bed, i), "velocity", s), "#,##0.0")
        put_number(ws, row, 10, _o(_at(b.hydraulic_diameter, i), "diameter", s), fd)
        put_number(ws, row, 11, _o(_at(b.gradient_clean, i), "pressure_gradient", s), fg)
        put_number(ws, row, 12, _o(_at(b.gradient_bed, i), "pressure_gradient", s), fg)
        put_number(ws, row, 13, _o(_at(b.no_bed_rate, i), "flow_rate", s), "#,##0")
        put(ws, row, 14, "bed" if bool(np.atleast_1d(b.forms)[i]) else "none")
        row += 1
    return row


def _cleanup_block(ws, row, beds, s) -> int:
    """Bottoms-up count and circulating time before a trip, with the multiplier table."""
    c = beds.cleanup
    qu, vol, tu = U("flow_rate", s), U("volume", s), U("time", s)
    row = heading(ws, row, "Circulation before a trip (clean-up)", span=SPAN)
    lines = (
        ("annular volume", _o(c.annular_volume, "volume", s), vol, "#,##0.0"),
        (f"bottoms-up time at {_o(c.q, 'flow_rate', s):,.0f} {qu}", _o(c.bottoms_up_time,
         "time", s), tu, "#,##0"),
        ("bottoms-up count (volume-weighted multiplier)", c.bottoms_up_count, "×", "0.00"),
        ("circulating time to clean the hole", _o(c.circulating_time, "time", s), tu, "#,##0"),
        ("largest interval multiplier", c.worst_factor, "×", "0.0"),
    )  # fmt: skip
    for label, v, unit, fmt in lines:
        put(ws, row, 1, label)
        put_number(ws, row, 2, v, fmt)
        put(ws, row, 3, unit)
        row += 1
    bands, sizes, table = CIRCULATION_FACTORS
    lows = (0.0, *bands[:-1])
    row = table_header(
        ws,
        row + 1,
        1,
        ["inclination band", *[f"hole {_o(d, 'diameter', s):g}" for d in sizes]],
        ["°", *[U("diameter", s)] * len(sizes)],
    )
    for lo, hi, vals in zip(lows, bands, table, strict=True):
        put(ws, row, 1, f"{lo:g}–{hi:g}°" if hi < 90 else f"above {lo:g}°")
        for j, v in enumerate(vals):
            put_number(ws, row, 2 + j, v, "0.0")
        row += 1
    return note_row(
        ws,
        row,
        "Bottoms-up multipliers by inclination band and hole size (nearest column): common "
        "practice (no published source; see the Cautions sheet). Each annular "
        "interval's volume is weighted by its multiplier. Circulate until the shakers clean up; "
        "the count is a planning figure, not a replacement for observation.",
        span=SPAN,
    )


def beds_data(results) -> dict | None:
    """The "cuttings_beds" block of ``--json`` (case units; None without cleaning)."""
    beds = results.beds
    if beds is None:
        return None
    s = results.case.unit_system
    b, c = beds.bed, beds.cleanup

    def col(arr, kind, i):
        return text.display_values(_at(arr, i), kind, s)

    return {
        "method": b.method,
        "onset_inclination": beds.onset,
        "max_inclination": beds.max_inclination,
        "no_bed_rate": text.display_values(beds.no_bed_rate, "flow_rate", s),
        "extra_annular_loss": text.display_values(beds.extra_loss, "pressure", s),
        "ecd_increment_bit": text.display_values(beds.ecd_increment, "density", s),
        "intervals": [
            {
                "interval": _name(beds.spans[i]),
                "top_md": text.display_values(beds.top_md[i], "depth", s),
                "bottom_md": text.display_values(beds.bottom_md[i], "depth", s),
                "inclination": _at(b.inclination, i),
                "bed": bool(np.atleast_1d(b.forms)[i]),
                "annular_velocity": col(b.velocity_clean, "velocity", i),
                "critical_velocity": col(b.critical_velocity, "velocity", i),
                "bed_height": col(b.bed_height, "diameter", i),
                "bed_area_fraction": _at(b.bed_fraction, i),
                "velocity_over_bed": col(b.velocity_over_bed, "velocity", i),
                "hydraulic_diameter": col(b.hydraulic_diameter, "diameter", i),
                "friction_gradient_clean": col(b.gradient_clean, "pressure_gradient", i),
                "friction_gradient_bed": col(b.gradient_bed, "pressure_gradient", i),
                "no_bed_rate": col(b.no_bed_rate, "flow_rate", i),
            }
            for i in _bed_rows(beds)
        ],
        "circulation_before_trip": {
            "annular_volume": text.display_values(c.annular_volume, "volume", s),
            "bottoms_up_time": text.display_values(c.bottoms_up_time, "time", s),
            "bottoms_up_count": c.bottoms_up_count,
            "circulating_time": text.display_values(c.circulating_time, "time", s),
            "largest_multiplier": c.worst_factor,
            "source": "common practice, values from memory (calc/METHODS.md §10.16)",
        },
    }
