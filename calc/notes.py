"""Non-fatal findings: :class:`Note` and the values it carries (:class:`Value`).

A note is structure, not display text: a level, a stable ``code``, a wording ``text`` whose
``{name}`` fields refer to :attr:`Note.values` (each an SI number or range with its quantity
kind, a name, or a :class:`~calc.span.Span`), and the ``subject`` it concerns.  The faces fill
the fields in the user's unit system (``addin.text.note``); ``str(note)`` fills them in SI, for
Python users and logs.

>>> n = Note("warning", "spp_above_rating", "standpipe pressure {spp} above the rating {rating}",
...          "standpipe", values=(Value("spp", 3.2e7, "pressure"), Value("rating", 3.0e7,
...          "pressure")))
>>> str(n)
'WARNING [standpipe]: standpipe pressure 3.2e+07 Pa above the rating 3e+07 Pa'
>>> n.value("rating").value
30000000.0
"""

from __future__ import annotations

import string
from collections.abc import Callable
from dataclasses import dataclass
from typing import Literal

from calc.span import Span
from calc.units import KINDS, label, unit_for

__all__ = ["LEVELS", "Note", "Value", "fill"]

#: Note levels, mildest first.
LEVELS = ("info", "warning", "caution")

#: What a :class:`Value` may hold: an SI number, an SI range (low, high), a text (a name, a
#: method), a span, or a sequence of texts/spans (listed together).
Content = float | tuple[float, float] | str | Span | tuple[str | Span, ...]


@dataclass(frozen=True)
class Value:
    """One value a note carries.

    ``name`` is the template field; ``value`` is SI (or a text, a :class:`Span`, a range
    ``(low, high)``, or a tuple of texts/spans); ``kind`` is a quantity kind of
    :data:`calc.units.KINDS` (e.g. ``"flow_rate"``) for numbers with a unit, ``""`` for plain
    numbers (counts, n, ratios) and text.
    """

    name: str
    value: Content
    kind: str = ""

    def __post_init__(self):
        if self.kind and self.kind not in KINDS:
            raise ValueError(f"note value {self.name!r}: unknown quantity kind {self.kind!r}")


def _fields(text: str) -> set[str]:
    return {f for _, f, _, _ in string.Formatter().parse(text) if f}


class _Filler(string.Formatter):
    def __init__(self, values: dict[str, Value], show: Callable[[Value, str], str]):
        self._values = values
        self._show = show

    def get_value(self, key, args, kwargs):
        return self._values[key]

    def format_field(self, value, format_spec):
        return self._show(value, format_spec)


def fill(text: str, values, show: Callable[[Value, str], str]) -> str:
    """``text`` with each ``{name}`` / ``{name:spec}`` replaced by ``show(value, spec)``."""
    return _Filler({v.name: v for v in values}, show).format(text)


def _si(v: Value, spec: str) -> str:
    """SI rendering (the core's own; the faces render in any unit system)."""
    x = v.value
    if isinstance(x, Span):
        md = f", MD {x.top_md:.6g}-{x.bottom_md:.6g} m" if x.has_depth else ""
        return x.pair + md
    if isinstance(x, str):
        return x
    if isinstance(x, tuple) and x and all(isinstance(e, (int, float)) for e in x):
        unit = f" {label(unit_for(v.kind, 'si'))}" if v.kind else ""
        return "-".join(format(float(e), spec or ".6g") for e in x) + unit
    if isinstance(x, tuple):
        return "; ".join(_si(Value(v.name, e), spec) for e in x)
    unit = f" {label(unit_for(v.kind, 'si'))}" if v.kind else ""
    return format(float(x), spec or ".6g") + unit


@dataclass(frozen=True)
class Note:
    """A non-fatal finding attached to a result.

    level   ``"info"`` (an interpretation made), ``"warning"`` (doubtful input or result) or
            ``"caution"`` (a safety-relevant finding: ECD near fracture, swab near pore …).
    code    stable machine identifier, e.g. ``"transitional_flow"``.
    text    the finding in one plain sentence; ``{name}`` fields are filled from ``values``.
    subject the input, point or place it concerns: a name, or a :class:`~calc.span.Span`.
    values  the numbers (SI, with their kind), names and spans the text refers to.
    """

    level: Literal["info", "warning", "caution"]
    code: str
    text: str
    subject: str | Span = ""
    values: tuple[Value, ...] = ()

    def __post_init__(self):
        if self.level not in LEVELS:
            raise ValueError(f"note {self.code!r}: level {self.level!r} not in {LEVELS}")
        missing = _fields(self.text) - {v.name for v in self.values}
        if missing:
            raise ValueError(f"note {self.code!r}: no value for field(s) {sorted(missing)}")

    def value(self, name: str) -> Value:
        """The value named ``name`` (KeyError if the note has none)."""
        for v in self.values:
            if v.name == name:
                return v
        raise KeyError(name)

    def render(self, show: Callable[[Value, str], str] = _si) -> str:
        """The text with its fields filled by ``show`` (default: SI)."""
        return fill(self.text, self.values, show)

    def __str__(self) -> str:
        subj = self.subject
        if isinstance(subj, Span):
            subj = _si(Value("subject", subj), "")
        where = f" [{subj}]" if subj else ""
        return f"{self.level.upper()}{where}: {self.render()}"
