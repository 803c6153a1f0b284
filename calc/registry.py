"""A small registry of named implementations, so a name resolves in one place.

Each calculation family keeps one :class:`MethodRegistry`, named by its own word: friction laws
(:data:`calc.flow.FRICTION_LAWS`), viscometer and rheometer-table fits
(:data:`calc.rheology.VISCOMETER_FITS`, :data:`calc.rheology.TABLE_FITS`), slip-velocity
correlations, and the hydraulics methods users name with ``method="..."``
(:data:`calc.hydraulics_method.HYDRAULICS_METHODS`, presets over the others).  Entries carry a
one-line description and the published source, which ``describe()`` lists for users choosing.
An unknown name raises :class:`~calc.errors.InputError` naming the registry's word, the
registered names and the nearest one.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

from calc.errors import check_choice

__all__ = ["MethodInfo", "MethodRegistry"]


@dataclass(frozen=True)
class MethodInfo:
    name: str
    func: Callable[..., Any]
    description: str
    source: str


class MethodRegistry:
    """Name → implementation, with descriptions and sources.

    >>> reg = MethodRegistry("demo method")
    >>> @reg.register("double", "twice the input", "arithmetic")
    ... def _double(x):
    ...     return 2 * x
    >>> reg.get("double").func(2)
    4
    """

    def __init__(self, what: str):
        self.what = what
        self._entries: dict[str, MethodInfo] = {}

    def register(self, name: str, description: str, source: str):
        def deco(func):
            if name in self._entries:
                raise ValueError(f"{self.what} '{name}' registered twice")
            self._entries[name] = MethodInfo(name, func, description, source)
            return func

        return deco

    def get(self, name: str) -> MethodInfo:
        return self._entries[check_choice(self.what, name, self._entries)]

    def names(self) -> list[str]:
        return list(self._entries)

    def describe(self) -> list[MethodInfo]:
        return list(self._entries.values())
