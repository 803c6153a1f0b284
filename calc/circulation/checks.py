"""Margin check points and the notes of the circulating-system calculation."""

from __future__ import annotations

import numpy as np

from calc.circulation.pressure_window import Margins, MarginTable, limits_at, tabulate_margins
from calc.notes import Note

__all__: list[str] = []


def _sweep_text(mask, q_flat, fmt=None):
    """'at all rates' / 'at 12 of 10000 sweep points (q 0.020-0.025 m³/s)'.

    ``fmt(value_si, kind)`` formats the rates in the user's units (SI m³/s without it).
    """
    n = int(mask.sum())
    if mask.size == 1:
        return ""
    if n == mask.size:
        return " at every sweep point"
    qs = q_flat[mask]
    if fmt is None:
        span = f"{qs.min():.4g}-{qs.max():.4g} m³/s"
    else:
        span = f"{fmt(qs.min(), 'flow_rate')} to {fmt(qs.max(), 'flow_rate')}"
    return f" at {n} of {mask.size} sweep points (q {span})"


def _interval_note(level, code, what, consequence, mask, names, q_flat, fmt=None):
    """One note for all intervals flagged by ``mask`` (N sweep points × I intervals)."""
    hit = mask.any(axis=0)
    if not np.any(hit):
        return None
    idx = np.flatnonzero(hit)
    listed = list(dict.fromkeys(names[i] for i in idx))
    where = "; ".join(listed)
    count = f" ({idx.size} intervals)" if idx.size > 1 else ""
    return Note(
        level,
        code,
        f"{what}{count}{_sweep_text(mask.any(axis=1), q_flat, fmt)}: {consequence}",
        where,
    )


def _dedupe(notes):
    seen, out = set(), []
    for n in notes:
        key = (n.code, n.subject, n.text, n.values)
        if key not in seen:
            seen.add(key)
            out.append(n)
    return out


def _margin_table(res, parts, window, weak_points, margins, step, notes, fmt):
    """Check points from the last shoe to the bit, the shoe, the bit and weak points."""
    top = parts.exposed_top
    names: list[str] = []
    md: list[float] = []
    grid = np.asarray(res._well.annulus_depth_grid(step).md, dtype=float)
    grid = grid[(grid >= top) & (grid > 0)]
    names += [f"MD {fmt(m, 'depth')}" for m in grid]
    md += list(grid)
    at_shoe = any(abs(wp.md - top) < 0.5 for wp in weak_points)
    if top > 0 and parts.shoe_name and not at_shoe:
        names.append(parts.shoe_name)
        md.append(top)
    names.append("bit")
    md.append(res.bit_md)
    if window is not None:
        g = res._well.annulus_depth_grid(step)
        gmd, gtvd = np.asarray(g.md, dtype=float), np.asarray(g.tvd, dtype=float)
        if np.all(np.diff(gtvd) > 0):
            lo = float(np.interp(top, gmd, gtvd))
            for t in window.tvd:
                if lo <= t <= gtvd[-1] and t > 0:
                    names.append(f"window station, TVD {fmt(t, 'depth')}")
                    md.append(float(np.interp(t, gtvd, gmd)))
    fracture_override: dict[str, float] = {}
    if parts.shoe_test is not None and parts.shoe_name:
        fracture_override[parts.shoe_name] = parts.shoe_test
    for wp in weak_points:
        if wp.md > res.bit_md or wp.md <= 0:
            notes.append(
                Note(
                    "info",
                    "weak_point_not_reached",
                    f"weak point at MD {fmt(wp.md, 'depth')} is not in the circulated annulus "
                    f"(bit at {fmt(res.bit_md, 'depth')}): not assessed",
                    wp.name,
                )
            )
            continue
        names.append(wp.name)
        md.append(wp.md)
    md_arr = np.asarray(md, dtype=float)
    tvd = np.asarray(res._well.survey.tvd_at(md_arr), dtype=float)
    usable = [wp for wp in weak_points if 0 < wp.md <= res.bit_md]
    pore, frac = limits_at(md_arr, tvd, names, window, usable)
    for name, value in fracture_override.items():
        at = np.array([n == name for n in names])
        if not any(wp.name == name for wp in usable):
            frac[at] = value
    if window is None:
        # only the weak points and the shoe test carry limits
        pass
    elif not np.all(window.covers(tvd)):
        outside = ~np.asarray(window.covers(tvd))
        notes.append(
            Note(
                "info",
                "window_extrapolated",
                f"pore/fracture window held constant beyond its stations at {int(outside.sum())}"
                " check point(s)",
                "pressure window",
            )
        )
    ecd = np.asarray(res.ecd_at(md_arr))
    esd = np.asarray(res.esd_at(md_arr))
    return tabulate_margins(names, md_arr, tvd, pore, frac, ecd, esd, margins)


def _margin_notes(table: MarginTable, margins: Margins, qf, notes, fmt):
    fm = table.fracture_margin.reshape(qf.size, -1)
    pm = table.pore_margin.reshape(qf.size, -1)
    spm = table.static_pore_margin.reshape(qf.size, -1)
    for j, name in enumerate(table.names):
        near_f = fm[:, j] < margins.fracture
        if np.any(near_f):
            notes.append(
                Note(
                    "caution",
                    "ecd_near_fracture",
                    f"ECD within {fmt(margins.fracture, 'density')} of the fracture EMW "
                    f"({fmt(table.fracture[j], 'density')}){_sweep_text(near_f, qf, fmt)}",
                    name,
                )
            )
        low_p = pm[:, j] < margins.pore
        if np.any(low_p):
            notes.append(
                Note(
                    "caution",
                    "ecd_near_pore",
                    f"ECD below the pore EMW ({fmt(table.pore[j], 'density')}) plus the margin "
                    f"{fmt(margins.pore, 'density')}{_sweep_text(low_p, qf, fmt)}",
                    name,
                )
            )
        static_low = spm[:, j] < 0
        if np.any(static_low):
            notes.append(
                Note(
                    "warning",
                    "static_below_pore",
                    f"static mud weight below the pore EMW ({fmt(table.pore[j], 'density')})"
                    f"{_sweep_text(static_low, qf, fmt)}. This tool does not assess well control; "
                    "follow your procedures.",
                    name,
                )
            )
