"""Pipe-in-hole section rows: the per-station rows of a flow path aggregated exactly.

The circulation splits each flow path at every survey station, shoe and component top, so a
table with one row per interval repeats the same pipe-in-hole pair many times.  The rig-facing
tables show one row per *section* instead: in the string one per string component (body and
tool joints apart), in the annulus one per pipe/hole pair (string component × casing or open
hole).  :func:`section_rows` groups the rows and aggregates every column by a rule
(:data:`RULES`); a new column joins by naming its values and its rule.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass, replace

import numpy as np

from calc.span import Span

__all__ = ["RULES", "Section", "section_groups", "section_rows"]


def _mean(v: np.ndarray, w: np.ndarray) -> float:
    """Length-weighted mean (the plain mean where the lengths sum to 0)."""
    total = float(np.sum(w))
    return float(np.sum(v * w) / total) if total > 0.0 else float(np.mean(v))


def _same(v: np.ndarray, w: np.ndarray):
    """The common value of the rows, or ``None`` where they differ (e.g. mixed regimes)."""
    first = v[0]
    return first.item() if all(x == first for x in v) else None


#: Aggregation rules, ``rule(values, lengths) -> value``: ``sum`` for extensive columns (length,
#: loss, volume); ``min``/``max`` for depth bounds and worst cases; ``mean`` the length-weighted
#: mean of an intensive column (exact where the rows share the value, as rows of one section do
#: at one flow rate); ``same`` the common value or None (regime, labels).
RULES: dict[str, Callable] = {
    "sum": lambda v, w: float(np.sum(v)),
    "min": lambda v, w: float(np.min(v)),
    "max": lambda v, w: float(np.max(v)),
    "mean": _mean,
    "same": _same,
}


@dataclass(frozen=True)
class Section:
    """One pipe-in-hole section: its merged span, the station rows it stands for and the
    aggregated values by column name."""

    span: Span
    rows: tuple[int, ...]
    values: dict


def section_groups(spans: Sequence[Span]) -> list[tuple[int, ...]]:
    """Row indices of each section, in order of first appearance: rows with the same path,
    item, hole section and tool-joint flag.

    >>> a = Span("annulus", "DP", "open hole", top_md=900.0, bottom_md=1000.0)
    >>> b = Span("annulus", "DP", "casing", top_md=0.0, bottom_md=900.0)
    >>> section_groups([a, a, b, b])
    [(0, 1), (2, 3)]
    """
    groups: dict[tuple, list[int]] = {}
    for i, s in enumerate(spans):
        groups.setdefault((s.path, s.item, s.section, s.tool_joint), []).append(i)
    return [tuple(ix) for ix in groups.values()]


def section_rows(
    spans: Sequence[Span],
    columns: Mapping[str, tuple[Sequence, str]],
    lengths: Sequence[float],
    *,
    per_station: bool = False,
) -> list[Section]:
    """One :class:`Section` per pipe-in-hole section (or per row with ``per_station``).

    ``columns`` maps a column name to ``(values per row, rule)`` with ``rule`` a key of
    :data:`RULES`; ``lengths`` [m] weight the ``mean`` rule.  The merged span runs from the
    shallowest top to the deepest bottom of its rows.

    >>> s = [Span("annulus", "DP", "open hole", top_md=900.0, bottom_md=950.0),
    ...      Span("annulus", "DP", "open hole", top_md=950.0, bottom_md=1000.0)]
    >>> sec = section_rows(s, {"loss": ([10.0, 20.0], "sum"), "v": ([2.0, 2.0], "mean")},
    ...                    [50.0, 50.0])[0]
    >>> (sec.span.top_md, sec.span.bottom_md, sec.values)
    (900.0, 1000.0, {'loss': 30.0, 'v': 2.0})
    """
    w = np.asarray(lengths, dtype=float).reshape(-1)
    cols = {k: (np.asarray(v).reshape(-1), RULES[rule]) for k, (v, rule) in columns.items()}
    groups = [(i,) for i in range(len(spans))] if per_station else section_groups(spans)
    out = []
    for ix in groups:
        idx = np.asarray(ix)
        values = {k: rule(v[idx], w[idx]) for k, (v, rule) in cols.items()}
        out.append(Section(_merged(spans, ix), ix, values))
    return out


def _merged(spans: Sequence[Span], ix: tuple[int, ...]) -> Span:
    first = spans[ix[0]]
    if len(ix) == 1 or first.top_md is None:
        return first
    tops = [spans[i].top_md for i in ix]
    bottoms = [spans[i].bottom_md for i in ix]
    top, bottom = min(tops), max(bottoms)
    tvd = {spans[i].top_md: spans[i].top_tvd for i in ix}
    tvd_b = {spans[i].bottom_md: spans[i].bottom_tvd for i in ix}
    return replace(first, top_md=top, bottom_md=bottom, top_tvd=tvd[top], bottom_tvd=tvd_b[bottom])
