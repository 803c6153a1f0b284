"""Where each flow interval lies: :class:`calc.span.Span` rows from a well's flow intervals.

A bridge until :class:`calc.geometry.FlowIntervals` gives its rows as spans itself: hole
cleaning, surge/swab and the operating window name their rows with these (never with display
text); the faces put them into words (``addin.text.span``).
"""

from __future__ import annotations

from calc.span import Span

__all__ = ["interval_spans"]


def interval_spans(intervals) -> tuple[Span, ...]:
    """One :class:`~calc.span.Span` per row of a :class:`calc.geometry.FlowIntervals`.

    Path, component (the item), hole section (annulus rows only), tool-joint flag and the MD and
    TVD span of each row [m].
    """
    return tuple(
        Span(
            path=str(path),
            item=str(comp),
            section=str(sec) if path == "annulus" else "",
            tool_joint=bool(tj),
            top_md=float(top),
            bottom_md=float(bot),
            top_tvd=float(ttop),
            bottom_tvd=float(tbot),
        )
        for path, comp, sec, tj, top, bot, ttop, tbot in zip(
            intervals.path,
            intervals.component,
            intervals.section,
            intervals.is_tool_joint,
            intervals.top_md,
            intervals.bottom_md,
            intervals.top_tvd,
            intervals.bottom_tvd,
            strict=True,
        )
    )
