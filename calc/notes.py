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

from collections.abc import Callable
from dataclasses import dataclass
from typing import Literal

from calc.span import Span
from calc.values import Value, fields, fill, si_text

__all__ = ["LEVELS", "Note"]

#: Note levels, mildest first.
LEVELS = ("info", "warning", "caution")


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
        missing = fields(self.text) - {v.name for v in self.values}
        if missing:
            raise ValueError(f"note {self.code!r}: no value for field(s) {sorted(missing)}")

    def value(self, name: str) -> Value:
        """The value named ``name`` (KeyError if the note has none)."""
        for v in self.values:
            if v.name == name:
                return v
        raise KeyError(name)

    def render(self, show: Callable[[Value, str], str] = si_text) -> str:
        """The text with its fields filled by ``show`` (default: SI)."""
        return fill(self.text, self.values, show)

    def __str__(self) -> str:
        subj = self.subject
        if isinstance(subj, Span):
            subj = si_text(Value("subject", subj))
        where = f" [{subj}]" if subj else ""
        return f"{self.level.upper()}{where}: {self.render()}"
