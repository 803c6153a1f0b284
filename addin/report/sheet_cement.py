"""The "Cement job" sheet: the placement timeline of the case's ``[cement_job]``
(:func:`addin.cement_job.cement_job` → :func:`calc.placement.simulate_placement`).

Every number comes from the :class:`calc.placement.PlacementTimeline` of the report run; this
module converts units, names the moments in words and lays out the tables and two native charts
(ECD at the check points against their fracture limits, and surface pressure with the pump and
return rates, both against pumped volume).
"""

from __future__ import annotations

import numpy as np

from addin import text
from addin.report.charts import nice_axis, rate_curves
from addin.report.style import (
    heading,
    note_row,
    number_format,
    put_number,
    setup_print,
    table_header,
)
from addin.text import display_values as _o
from addin.text import unit_label as U
from addin.xlsx_cells import put, set_widths
from calc.cautions import CELL

__all__ = ["MOMENT_WORDS", "SHEET", "write_cement"]

SHEET = "Cement job"
#: Rows of the printed timeline (the whole timeline sits below the print range, for the charts).
PRINTED_ROWS = 40
#: The key moments of the job in words (calc.placement key_moments names).
MOMENT_WORDS = {
    "cement_at_shoe": "lead slurry at the shoe",
    "spacer_at_liner_top": "spacer at the liner top",
    "cement_at_liner_top": "cement at the liner top",
    "tightest": "tightest moment",
    "bump": "plug bumped",
}
_LIMIT_WORDS = {"fracture": "fracture − margin", "pore": "pore + margin"}


def _limit_line(t, system) -> str:
    dn = U("density", system)
    lim = "fracture" if t.limit == "fracture" else "pore"
    return (
        f"{t.point}: ECD {_o(t.ecd, 'density', system):.2f} {dn}, margin to {lim} "
        f"{_o(t.margin, 'density', system):+.2f} {dn} (required "
        f"{_o(t.required, 'density', system):.2f} {dn}) after "
        f"{_o(t.pumped, 'volume', system):,.1f} {U('volume', system)} pumped"
    )


def tightest_words(job, system: str) -> str:
    """The tightest moment of the job in one line (report, README tour, JSON)."""
    return _limit_line(job.timeline.tightest, system)


def _columns(tl, system):
    """(header, unit, values, format) of the timeline table in the case's units."""
    dn, pu, qu, vu = (U(k, system) for k in ("density", "pressure", "flow_rate", "volume"))
    fd, fp, fq = (number_format(k, system) for k in ("density", "pressure", "flow_rate"))
    cols = [
        ("pumped", vu, _o(tl.pumped, "volume", system), number_format("volume", system)),
        ("time", "min", list(tl.time / 60.0), "0.0"),
        ("pump rate", qu, _o(tl.pump_rate, "flow_rate", system), fq),
        ("return rate", qu, _o(tl.return_rate, "flow_rate", system), fq),
        ("surface pressure", pu, _o(tl.surface_pressure, "pressure", system), fp),
        ("free fall", "", ["yes" if x else "" for x in tl.free_fall], None),
    ]
    for k, pt in enumerate(tl.points):
        cols.append((f"ECD {pt.name}", dn, _o(tl.ecd[:, k], "density", system), fd))
    for k, pt in enumerate(tl.points):
        if pt.role in ("weak_point", "casing_shoe", "td"):
            cols.append((f"fracture {pt.name}", dn, _o(tl.fracture[:, k], "density", system), fd))
    return cols


def _table(ws, row, cols, rows) -> int:
    row = table_header(ws, row, 1, [c[0] for c in cols], [c[1] for c in cols])
    for i in rows:
        for j, (_, _, vals, fmt) in enumerate(cols, start=1):
            if fmt is None:
                put(ws, row, j, vals[i], "bf_cell")
            else:
                put_number(ws, row, j, vals[i], fmt)
        row += 1
    return row


def _positions(ws, row, tl, system, span) -> int:
    """The fluid train at the key moments: each fluid's top and bottom (leg, MD)."""
    du, vu = U("depth", system), U("volume", system)
    row = heading(ws, row, "Fluid train at key moments (positions by volume, no mixing)", span=span)
    row = table_header(
        ws,
        row,
        1,
        ["moment", "pumped", "fluid", "from", "MD", "to", "MD"],
        ["", vu, "", "", du, "", du],
    )
    for name, i in tl.key_moments.items():
        first = True
        for f, fl in enumerate(tl.train.fluids):
            lo, hi = tl.fluid_top_s[i, f], tl.fluid_bottom_s[i, f]
            if hi - lo <= 1e-9 * tl.geometry.total_volume:
                continue
            (leg_a, leg_b), (md_a, md_b) = tl.position(np.array([lo, hi]))
            put(ws, row, 1, MOMENT_WORDS.get(name, name) if first else "", "bf_cell")
            put_number(
                ws,
                row,
                2,
                _o(tl.pumped[i], "volume", system) if first else None,
                number_format("volume", system),
            )
            put(ws, row, 3, fl.name, "bf_cell")
            put(ws, row, 4, str(leg_a), "bf_cell")
            put_number(ws, row, 5, _o(md_a, "depth", system), number_format("depth", system))
            put(ws, row, 6, str(leg_b), "bf_cell")
            put_number(ws, row, 7, _o(md_b, "depth", system), number_format("depth", system))
            first = False
            row += 1
    return row


def _results(ws, row, job, system, span) -> int:
    tl = job.timeline
    dn, pu = U("density", system), U("pressure", system)
    row = heading(ws, row, "Margins against the pore–fracture window", span=span)
    t = tl.tightest
    ok = t.margin >= t.required
    lines = [
        (
            "tightest moment",
            _limit_line(t, system) + ("" if ok else " — BELOW the required margin"),
        ),
    ]
    if tl.surface_tightest is not None:
        s = tl.surface_tightest
        lines.append(
            (
                "highest surface pressure",
                f"{_o(s.ecd, 'pressure', system):,.0f} {pu} against the rating "
                f"{_o(tl.surface_rating, 'pressure', system):,.0f} {pu} after "
                f"{_o(s.pumped, 'volume', system):,.1f} {U('volume', system)}",
            )
        )
    lines += [
        (
            "final circulating pressure",
            f"{_o(tl.final_circulating_pressure, 'pressure', system):,.0f} {pu} at the last rate "
            "(the plug bumps above it)",
        ),
        (
            "differential at bump",
            f"{_o(tl.bump_differential, 'pressure', system):,.0f} {pu} (annulus over string "
            "column, static: what the float holds)",
        ),
    ]
    ffp = tl.free_fall_periods
    if ffp:
        last = tl.pumped.size - 1
        words = "; ".join(
            f"{_o(tl.pumped[a], 'volume', system):,.1f}–"
            f"{_o(tl.pumped[min(b + 1, last)], 'volume', system):,.1f} "
            f"{U('volume', system)} (returns up to "
            f"{_o(tl.return_rate[a : b + 1].max(), 'flow_rate', system):,.0f} "
            f"{U('flow_rate', system)})"
            for a, b in ffp
        )
        lines.append(("free fall (string not full)", words))
    else:
        lines.append(("free fall (string not full)", "none"))
    for name, txt in lines:
        put(ws, row, 1, name, "bf_cell")
        ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=2)
        row = note_row(ws, row, txt, col=3, span=span - 2, style="bf_cell")
    row += 1
    row = heading(ws, row, "Static pressures when the pumps stop (waiting on cement)", span=span)
    row = table_header(
        ws,
        row,
        1,
        ["check point", "", "ESD", "pore", "fracture", "ESD − pore", "fracture − ESD"],
        ["", "", dn, dn, dn, dn, dn],
    )
    fd = number_format("density", system)
    for k, pt in enumerate(tl.points):
        put(ws, row, 1, pt.name, "bf_cell")
        ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=2)
        for j, v in enumerate(
            (
                tl.static_ecd[k],
                tl.pore[-1, k],
                tl.fracture[-1, k],
                tl.static_pore_margin[k],
                tl.static_fracture_margin[k],
            )
        ):
            put_number(ws, row, 3 + j, _o(v, "density", system), fd)
        row += 1
    return row


def _checks(ws, row, job, system, span) -> int:
    dn = U("density", system)
    row = heading(ws, row, "Displacement checks (common practice)", span=span)
    row = table_header(
        ws,
        row,
        1,
        ["check", "", "ahead", "behind", "value", "required", "met"],
        ["", "", "", "", "", "", ""],
    )
    items = []
    for c in job.density:
        items.append(
            (
                "density hierarchy",
                c.ahead,
                c.behind,
                f"{_o(c.value, 'density', system):+.2f} {dn}",
                f"≥ {_o(c.required, 'density', system):.2f} {dn}",
                c.ok,
            )
        )
    for c in job.friction:
        items.append(
            (
                "friction hierarchy",
                c.ahead,
                c.behind,
                f"{100 * c.value:+.0f} %",
                f"≥ {100 * c.required:.0f} %",
                c.ok,
            )
        )
    for c in job.contact:
        items.append(
            (
                f"contact time at {job.zone}",
                c.ahead,
                "",
                f"{c.value / 60:.1f} min",
                f"≥ {c.required / 60:.0f} min",
                c.ok,
            )
        )
    for name, a, b, v, req, ok in items:
        put(ws, row, 1, name, "bf_cell")
        ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=2)
        for j, x in enumerate((a, b, v, req, "yes" if ok else "NO")):
            put(ws, row, 3 + j, x, "bf_cell")
        row += 1
    tl = job.timeline
    row += 1
    row = heading(
        ws, row, "Annular velocity and regime of each fluid (deepest interval)", span=span
    )
    vu = U("velocity", system)
    row = table_header(
        ws, row, 1, ["fluid", "", "highest velocity", "regime there"], ["", "", vu, ""]
    )
    regimes = ("laminar", "transitional", "turbulent")
    for f, fl in enumerate(tl.train.fluids):
        inside = (
            (tl.fluid_bottom_s[:, f] > tl.geometry.string_volume)
            & (tl.fluid_top_s[:, f] < tl.fluid_bottom_s[:, f])
            & (tl.return_rate > 0)
        )
        if not inside.any():
            continue
        i = int(np.flatnonzero(inside)[np.argmax(tl.annulus_velocity[inside, 0])])
        put(ws, row, 1, fl.name, "bf_cell")
        ws.merge_cells(start_row=row, start_column=1, end_row=row, end_column=2)
        put_number(
            ws,
            row,
            3,
            _o(tl.annulus_velocity[i, 0], "velocity", system),
            number_format("velocity", system),
        )
        put(ws, row, 4, regimes[int(tl.annulus_regime[i, f, 0])], "bf_cell")
        row += 1
    return row


def _charts(ws, tl, cols, rows, chart_row, system):
    r0, r1 = rows
    x = cols[0][2]
    lo, hi, step = nice_axis(min(x), max(x), 8)
    xl = (lo, hi, 2 * step if (hi - lo) / step > 6 else step)
    xt = f"pumped volume [{U('volume', system)}]"
    names = [c[0] for c in cols]
    ecd = [
        (n[4:], names.index(n) + 1, "value")
        for n in names
        if n.startswith("ECD ") and not n.endswith("top of cement")
    ]
    roles = ["value", "value2"]
    ecd = [(n, c, roles[i % 2]) for i, (n, c, _) in enumerate(ecd)]
    frac = [(n, names.index(n) + 1, "limit") for n in names if n.startswith("fracture ")]
    vals = [v for _, c, _ in ecd + frac for v in cols[c - 1][2]]
    ylo, yhi, ystep = nice_axis(min(vals), max(vals), 6)
    ch = rate_curves(
        (ws, 1, r0, r1),
        [(n, (ws, c, r0, r1), r) for n, c, r in ecd + frac],
        rate_unit="",
        y_title=f"ECD [{U('density', system)}]",
        title="ECD at the check points",
        y_limits=(ylo, yhi, ystep),
        x_limits=xl,
        x_title=xt,
    )
    ch.width = 14.0
    ws.add_chart(ch, f"A{chart_row}")
    sp = names.index("surface pressure") + 1
    svals = cols[sp - 1][2]
    ylo, yhi, ystep = nice_axis(0.0, max(max(svals), 1.0), 6)
    ch2 = rate_curves(
        (ws, 1, r0, r1),
        [("surface pressure", (ws, sp, r0, r1), "value")],
        rate_unit="",
        y_title=f"pressure [{U('pressure', system)}]",
        title="Surface pressure",
        y_limits=(ylo, yhi, ystep),
        x_limits=xl,
        x_title=xt,
    )
    ch2.width = 14.0
    ws.add_chart(ch2, f"H{chart_row}")
    qv = cols[2][2] + cols[3][2]
    ylo, yhi, ystep = nice_axis(0.0, max(qv), 6)
    ch3 = rate_curves(
        (ws, 1, r0, r1),
        [("pump rate", (ws, 3, r0, r1), "value"), ("return rate", (ws, 4, r0, r1), "value2")],
        rate_unit="",
        y_title=f"rate [{U('flow_rate', system)}]",
        title="Pump and return rate (free fall: returns above the pumps)",
        y_limits=(ylo, yhi, ystep),
        x_limits=xl,
        x_title=xt,
    )
    ch3.width = 14.0
    ws.add_chart(ch3, f"A{chart_row + 24}")


def write_cement(wb, results, title: str) -> dict:
    """The sheet (only when the case has a ``[cement_job]``); returns refs for the summary."""
    job = results.cement
    if job is None:
        return {}
    system = results.case.unit_system
    tl = job.timeline
    ws = wb.create_sheet(SHEET)
    cols = _columns(tl, system)
    span = max(len(cols), 14)
    set_widths(ws, [14, 9, 22, 10, 10, 10, 10] + [10] * (span - 7))
    row = heading(
        ws,
        1,
        "Cement job: placement timeline against the pore–fracture window",
        span=span,
        title=True,
    )
    vu = U("volume", system)
    train = ", ".join(
        f"{f.name} {_o(f.density, 'density', system):.2f} {U('density', system)}"
        + (f" {_o(v, 'volume', system):,.0f} {vu}" if v is not None else "")
        for f, v in zip(tl.train.fluids, (None, *tl.train.volumes, None), strict=True)
    )
    intro = (
        f"Fluid train (mud in the well first): {train}. Spacers and slurries: least squares of the "
        "friction law's model (Herschel-Bulkley for the default) over their readings at test "
        "temperature; the mud: the case's method. "
        f"Friction law {text.method_words(tl.method)} in every leg. Model: incompressible fluids "
        "moving as plugs "
        "(no mixing), quasi-steady friction at each volume step, returns open at surface; "
        "where the string side is heavier than friction can hold, the string top stands at "
        "atmospheric pressure and the return rate follows from the balance of the two legs "
        "(free fall, a U-tube), refilled later by the pumps. Static pressures after the pumps "
        "stop take no account of the cement's loss of hydrostatic pressure while it sets. "
        "Steps: " + f"{tl.pumped.size}."
    )
    row = note_row(ws, row, intro, span=span)
    row = note_row(ws, row, CELL, span=span)
    row = _results(ws, row + 1, job, system, span)
    row = _positions(ws, row + 1, tl, system, span)
    row = _checks(ws, row + 1, job, system, span)
    chart_row = row + 2
    row = chart_row + 48
    row = heading(ws, row, "Timeline (every n-th step; the whole timeline below)", span=span)
    n = tl.pumped.size
    idx = sorted(
        set(np.linspace(0, n - 1, PRINTED_ROWS).round().astype(int).tolist())
        | set(tl.key_moments.values())
    )
    print_end = _table(ws, row, cols, idx)
    ws.print_area = f"A1:{ws.cell(row=print_end - 1, column=span).column_letter}{print_end - 1}"
    row = print_end + 2
    put(ws, row, 1, "Chart data: the whole timeline (not printed).", "bf_note")
    r0 = row + 3
    r1 = _table(ws, row + 1, cols, range(n)) - 1
    _charts(ws, tl, cols, (r0, r1), chart_row, system)
    setup_print(ws, title)
    return {"sheet": SHEET}
