"""Values that notes and errors carry (:class:`Value`) and the filling of ``{field}`` texts.

A text of :mod:`calc` (a note's wording, an error's "allowed" part) names its numbers as
``{field}``; each field is a :class:`Value` holding an SI number (or range, name, place) and
its quantity kind.  :func:`fill` puts them in with any renderer: the core's own SI one
(:func:`si_text`) or the faces' unit-system one (``addin.text.value``).

>>> fill("rate {q} above {limit:.0f}", [Value("q", 0.05, "flow_rate"), Value("limit", 40.0)],
...      si_text)
'rate 0.05 m³/s above 40'
"""

from __future__ import annotations

import string
from collections.abc import Callable, Iterable
from dataclasses import dataclass

from calc.kinds import KINDS, LABELS, UNIT_SYSTEMS
from calc.span import Span

__all__ = ["Content", "Value", "fields", "fill", "si_text"]

#: What a :class:`Value` may hold: an SI number, an SI range (low, high), a text (a name, a
#: method), a span, or a sequence of texts/spans (listed together).
Content = float | tuple[float, float] | str | Span | tuple[str | Span, ...]


@dataclass(frozen=True)
class Value:
    """One value a note or an error carries.

    ``name`` is the text field; ``value`` is SI (or a text, a :class:`~calc.span.Span`, a range
    ``(low, high)``, or a tuple of texts/spans); ``kind`` is a quantity kind of
    :data:`calc.kinds.KINDS` (e.g. ``"flow_rate"``) for numbers with a unit, ``""`` for plain
    numbers (counts, n, ratios) and text.
    """

    name: str
    value: Content
    kind: str = ""

    def __post_init__(self):
        if self.kind and self.kind not in KINDS:
            raise ValueError(f"value {self.name!r}: unknown quantity kind {self.kind!r}")


def fields(text: str) -> set[str]:
    """The ``{field}`` names of a text."""
    return {f for _, f, _, _ in string.Formatter().parse(text) if f}


class _Filler(string.Formatter):
    def __init__(self, values: dict[str, Value], show: Callable[[Value, str], str]):
        self._values = values
        self._show = show

    def get_value(self, key, args, kwargs):
        return self._values[key]

    def format_field(self, value, format_spec):
        return self._show(value, format_spec)


def fill(text: str, values: Iterable[Value], show: Callable[[Value, str], str]) -> str:
    """``text`` with each ``{name}`` / ``{name:spec}`` replaced by ``show(value, spec)``."""
    return _Filler({v.name: v for v in values}, show).format(text)


def _si_unit(kind: str) -> str:
    if not kind or kind == "dimensionless":
        return ""
    u = UNIT_SYSTEMS["si"][kind]
    return " " + LABELS.get(u, u)


def si_text(v: Value, spec: str = "") -> str:
    """A value in SI as text (the core's own rendering, for ``str()`` of notes and errors)."""
    x = v.value
    if isinstance(x, Span):
        md = f", MD {x.top_md:.6g}-{x.bottom_md:.6g} m" if x.has_depth else ""
        return x.pair + md
    if isinstance(x, str):
        return x
    if isinstance(x, tuple) and x and all(isinstance(e, (int, float)) for e in x):
        return "-".join(format(float(e), spec or ".6g") for e in x) + _si_unit(v.kind)
    if isinstance(x, tuple):
        return "; ".join(si_text(Value(v.name, e), spec) for e in x)
    return format(float(x), spec or ".6g") + _si_unit(v.kind)
