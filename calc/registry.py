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
from dataclasses import dataclass, is_dataclass, replace
from typing import Any

from calc.errors import check_choice

__all__ = ["NOT_ASSESSED", "STATUS_KINDS", "MethodInfo", "MethodRegistry", "Verification"]

#: How a method's implementation has been checked, strongest first.  ``kind`` of
#: :class:`Verification` is one of these words; the faces word them for users.
STATUS_KINDS = (
    "exact_solution",  # agrees with an exact analytical solution
    "published_example",  # reproduces a published worked example, table or chart
    "reference_library",  # agrees with a general-purpose reference library (e.g. fluids)
    "independent_reimplementation",  # agrees with a second implementation written apart
    "field_form_only",  # the SI code equals the printed field formula; formula itself unchecked
    "common_practice",  # a fact of the trade with no single published source
    "self_consistency",  # only properties, regression values or self-consistency are tested
    "from_memory",  # coefficients or structure recalled, not yet checked against the source
    "not_assessed",  # nobody has said yet
)


@dataclass(frozen=True)
class Verification:
    """How one registered method has been checked.

    kind      one of :data:`STATUS_KINDS`
    evidence  what was compared, against what, and how close (one or two sentences; names the
              published source, example or test)
    caveats   limits a user must know (validity ranges, unchecked constants), one text each
    """

    kind: str = "not_assessed"
    evidence: str = ""
    caveats: tuple[str, ...] = ()

    def __post_init__(self):
        if self.kind not in STATUS_KINDS:
            raise ValueError(f"verification kind '{self.kind}' is not one of {STATUS_KINDS}")


#: The status of an entry nobody has assessed yet.
NOT_ASSESSED = Verification()


@dataclass(frozen=True)
class MethodInfo:
    name: str
    func: Callable[..., Any]
    description: str
    source: str
    status: Verification = NOT_ASSESSED


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

    def register(
        self, name: str, description: str, source: str, status: Verification | None = None
    ):
        def deco(func):
            if name in self._entries:
                raise ValueError(f"{self.what} '{name}' registered twice")
            info = MethodInfo(name, func, description, source, status or NOT_ASSESSED)
            self._entries[name] = info
            return func

        return deco

    def set_status(self, name: str, status: Verification) -> None:
        """Record how ``name`` has been checked (for entries registered before the evidence).

        An entry whose implementation is a frozen dataclass with a ``status`` field (a
        hydraulics-method preset) gets the same status on it, so the two never disagree.  A
        status declared at registration is not replaced (one declaration per method).

        >>> reg = MethodRegistry("demo method")
        >>> _ = reg.register("double", "twice the input", "arithmetic")(lambda x: 2 * x)
        >>> reg.set_status("double", Verification("exact_solution", "2·x by hand"))
        >>> reg.get("double").status.kind
        'exact_solution'
        >>> reg.set_status("double", Verification("from_memory"))
        Traceback (most recent call last):
        ...
        ValueError: demo method 'double': status already declared (exact_solution)
        """
        info = self.get(name)
        if info.status != NOT_ASSESSED:
            raise ValueError(
                f"{self.what} '{info.name}': status already declared ({info.status.kind})"
            )
        func = info.func
        if is_dataclass(func) and not isinstance(func, type) and hasattr(func, "status"):
            func = replace(func, status=status)
        info = MethodInfo(info.name, func, info.description, info.source, status)
        self._entries[info.name] = info

    def get(self, name: str) -> MethodInfo:
        return self._entries[check_choice(self.what, name, self._entries)]

    def names(self) -> list[str]:
        return list(self._entries)

    def describe(self) -> list[MethodInfo]:
        return list(self._entries.values())
