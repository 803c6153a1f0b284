"""Margin check points and the notes of the circulating-system calculation.

Notes carry their numbers as :class:`~calc.values.Value` (SI, with kinds) and their places as
:class:`~calc.span.Span` or names; the faces word them in the user's units.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence

import numpy as np

from calc.circulation.pore_fracture import (
    CheckPoint,
    Margins,
    MarginTable,
    PressureWindow,
    WeakPoint,
    limits_at,
    tabulate_margins,
)
from calc.circulation.well_parts import WellParts
from calc.notes import Note
from calc.span import Span
from calc.values import Value

__all__ = [
    "check_points",
    "dedupe_notes",
    "interval_note",
    "margin_notes",
    "margin_table",
    "sweep_part",
]


def sweep_part(mask: np.ndarray, q_flat: np.ndarray) -> tuple[str, tuple[Value, ...]]:
    """Where in a sweep a finding holds: a text piece and its values.

    ``""`` for a single rate, " at every sweep point", or " at {count} of {points} sweep points
    (q {rates})" with ``rates`` the range (low, high) of the flagged rates [m³/s].
    """
    n = int(mask.sum())
    if mask.size == 1:
        return "", ()
    if n == mask.size:
        return " at every sweep point", ()
    qs = q_flat[mask]
    return " at {count} of {points} sweep points (q {rates})", (
        Value("count", float(n)),
        Value("points", float(mask.size)),
        Value("rates", (float(qs.min()), float(qs.max())), "flow_rate"),
    )


def interval_note(
    level, code, what, consequence, mask, spans: Sequence[Span], q_flat
) -> Note | None:
    """One note for all intervals flagged by ``mask`` (N sweep points × I intervals).

    The subject names the flagged intervals (pipe-in-hole pairs, without depths), the text
    says how many and where in the sweep.
    """
    hit = mask.any(axis=0)
    if not np.any(hit):
        return None
    idx = np.flatnonzero(hit)
    listed = list(dict.fromkeys(spans[i].pair for i in idx))
    count = f" ({idx.size} intervals)" if idx.size > 1 else ""
    where, values = sweep_part(mask.any(axis=1), q_flat)
    return Note(
        level, code, f"{what}{count}{where}: {consequence}", "; ".join(listed), values=values
    )


def dedupe_notes(notes: Iterable[Note]) -> list[Note]:
    """The notes in order, each once."""
    return list(dict.fromkeys(notes))


def check_points(
    parts: WellParts,
    well,
    window: PressureWindow | None,
    weak_points: tuple[WeakPoint, ...],
    step: float,
    notes: list[Note],
) -> list[CheckPoint]:
    """Check points from the last shoe to the bit, the shoe, the bit, the window stations and
    the weak points above the bit (a note for each weak point below it).  A weak point at the
    shoe (within 0.5 m) replaces the shoe's own point and takes the role "shoe"."""
    top, bit_md = parts.exposed_top, parts.bit_md
    grid = well.annulus_depth_grid(step)
    gmd, gtvd = np.asarray(grid.md, dtype=float), np.asarray(grid.tvd, dtype=float)
    out: list[tuple[str, str, float]] = [
        ("depth", "", float(m)) for m in gmd[(gmd >= top) & (gmd > 0)]
    ]
    at_shoe = any(abs(wp.md - top) < 0.5 for wp in weak_points)
    if top > 0 and parts.shoe_name and not at_shoe:
        out.append(("shoe", parts.shoe_name, top))
    out.append(("bit", "bit", bit_md))
    if window is not None and np.all(np.diff(gtvd) > 0):
        lo = float(np.interp(top, gmd, gtvd))
        for t in window.tvd:
            if lo <= t <= gtvd[-1] and t > 0:
                out.append(("window_station", "", float(np.interp(t, gtvd, gmd))))
    for wp in weak_points:
        if wp.md > bit_md or wp.md <= 0:
            notes.append(
                Note(
                    "info",
                    "weak_point_not_reached",
                    "weak point at {md} is not in the circulated annulus (bit at {bit}): "
                    "not assessed",
                    wp.name,
                    values=(Value("md", wp.md, "depth"), Value("bit", bit_md, "depth")),
                )
            )
            continue
        # a weak point at the last shoe (its shoe test) stands for the shoe
        role = "shoe" if top > 0 and abs(wp.md - top) < 0.5 else "weak_point"
        out.append((role, wp.name, wp.md))
    md = np.array([m for _, _, m in out], dtype=float)
    tvd = np.asarray(well.survey.tvd_at(md), dtype=float)
    return [
        CheckPoint(role, name, float(m), float(t))
        for (role, name, _), m, t in zip(out, md, tvd, strict=True)
    ]


def margin_table(
    res, parts: WellParts, window, weak_points, margins: Margins, step: float, notes: list[Note]
) -> MarginTable:
    """Pore and fracture limits, ECD, ESD and the margins at the check points."""
    well = res.context.well
    points = check_points(parts, well, window, weak_points, step, notes)
    names = [p.name for p in points]
    md_arr = np.array([p.md for p in points], dtype=float)
    tvd = np.array([p.tvd for p in points], dtype=float)
    usable = [wp for wp in weak_points if 0 < wp.md <= res.bit_md]
    pore, frac = limits_at(md_arr, tvd, names, window, usable)
    if parts.shoe_test is not None and parts.shoe_name:
        if not any(wp.name == parts.shoe_name for wp in usable):
            frac[np.array([n == parts.shoe_name for n in names])] = parts.shoe_test
    if window is not None and not np.all(window.covers(tvd)):
        outside = ~np.asarray(window.covers(tvd))
        notes.append(
            Note(
                "info",
                "window_extrapolated",
                "pore/fracture window held constant beyond its stations at {count:.0f} check "
                "point(s)",
                "pressure window",
                values=(Value("count", float(outside.sum())),),
            )
        )
    ecd = np.asarray(res.ecd_at(md_arr))
    esd = np.asarray(res.esd_at(md_arr))
    return tabulate_margins(points, md_arr, tvd, pore, frac, ecd, esd, margins)


def margin_notes(table: MarginTable, margins: Margins, qf: np.ndarray, notes: list[Note]):
    """Caution where the ECD comes within the required margin of the fracture or pore EMW, and
    a warning where the static mud weight is below the pore EMW (per check point)."""
    fm = table.fracture_margin.reshape(qf.size, -1)
    pm = table.pore_margin.reshape(qf.size, -1)
    spm = table.static_pore_margin.reshape(qf.size, -1)
    for j, point in enumerate(table.points):
        pore = Value("pore", float(table.pore[j]), "density")
        for level, code, text, mask, vals in (
            (
                "caution",
                "ecd_near_fracture",
                "ECD within {margin} of the fracture EMW ({fracture})",
                fm[:, j] < margins.fracture,
                (
                    Value("margin", margins.fracture, "density"),
                    Value("fracture", float(table.fracture[j]), "density"),
                ),
            ),
            (
                "caution",
                "ecd_near_pore",
                "ECD below the pore EMW ({pore}) plus the margin {margin}",
                pm[:, j] < margins.pore,
                (pore, Value("margin", margins.pore, "density")),
            ),
            (
                "warning",
                "static_below_pore",
                "static mud weight below the pore EMW ({pore})",
                spm[:, j] < 0,
                (pore,),
            ),
        ):
            if not np.any(mask):
                continue
            where, sweep = sweep_part(mask, qf)
            tail = (
                ". This tool does not assess well control; follow your procedures."
                if code == "static_below_pore"
                else ""
            )
            subject = point.name if point.role in ("shoe", "bit", "weak_point") else point.place
            notes.append(Note(level, code, text + where + tail, subject, values=vals + sweep))
