"""Where a row of a result lies in the well: :class:`Span`.

Results and notes of :mod:`calc` say *where* with a :class:`Span` (flow path, item, hole
section, MD and TVD span in metres), never with a display string; the faces turn a span into
words in the user's unit system (``addin.text.span``).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

__all__ = ["PATHS", "Span"]

#: Flow paths of the circulating system, in flow order.
PATHS = ("surface", "string", "tools", "bit", "annulus")


@dataclass(frozen=True)
class Span:
    """One place in the circulating system.

    Attributes
    ----------
    path : {"surface", "string", "tools", "bit", "annulus"}
        Flow path.
    item : str
        The surface line, string component or tool name (the pipe item in the annulus).
    section : str
        Hole section around the item (annulus rows; ``""`` elsewhere).
    tool_joint : bool
        The row stands for the item's tool joints (a tool-joint sub-interval).
    top_md, bottom_md : float or None
        MD span [m]; ``None`` for items without depth (surface lines, tools).
    top_tvd, bottom_tvd : float or None
        TVD at the span ends [m]; ``None`` where not known.

    Examples
    --------
    >>> s = Span("annulus", "5 in DP", "9-5/8 in casing", top_md=1828.8, bottom_md=2499.36)
    >>> s.pair
    '5 in DP in 9-5/8 in casing'
    """

    path: Literal["surface", "string", "tools", "bit", "annulus"]
    item: str
    section: str = ""
    tool_joint: bool = False
    top_md: float | None = None
    bottom_md: float | None = None
    top_tvd: float | None = None
    bottom_tvd: float | None = None

    @property
    def part(self) -> str:
        """The item, with "tool joints" appended for a tool-joint row."""
        return f"{self.item} tool joints" if self.tool_joint else self.item

    @property
    def pair(self) -> str:
        """Pipe-in-hole pair ("item in section") in the annulus, the item elsewhere (names only,
        no numbers)."""
        return f"{self.item} in {self.section}" if self.section else self.item

    @property
    def has_depth(self) -> bool:
        """True where the MD span is known."""
        return self.top_md is not None and self.bottom_md is not None
