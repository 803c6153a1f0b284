"""The plausibility guard at the faces: every typed value against :mod:`calc.plausibility`.

:func:`check` takes a value as the user typed it (the number, its unit, whether the unit came
from the unit system) and its SI value.  Outside the *possible* range it raises
:class:`ImplausibleInput` (exit 2, ``#BF!``) naming the input, the value in the user's unit,
the range in that unit and a likely cause ("1.12 ppg looks like a specific gravity; did you
mean 1.12 sg?"); outside the *usual* range it returns a :class:`Finding` the caller keeps
(the report refuses the case unless ``--allow-unusual``).

While :func:`collecting` is active (a whole case being read) impossible values are collected
too, so that :func:`case_verdict` can see several at once and say "these numbers look like
oilfield units but the case says metric".
"""

from __future__ import annotations

import contextlib
import contextvars
import dataclasses
from dataclasses import dataclass

from calc.errors import InputError
from calc.plausibility import RANGES, assess
from calc.units import UNIT_SYSTEMS, from_si, label, to_si, unit_for

__all__ = [
    "Finding",
    "ImplausibleInput",
    "accept_unusual",
    "case_verdict",
    "check",
    "collecting",
    "finding_text",
    "unusual_error",
]


class ImplausibleInput(InputError):
    """A value outside the physically possible range; ``value`` is the text as the user gave
    it (number and unit), so the message is in the user's unit."""

    def __init__(self, name, value, allowed, problem="physically impossible", **kwargs):
        super().__init__(name, str(value), allowed, problem)
        self.args = (f"{name} = {value}: {problem}; allowed: {allowed}",)

    def __str__(self):
        return self.args[0]


@dataclass(frozen=True)
class Finding:
    """One value outside its usual (or possible) range, as the user typed it."""

    where: str
    quantity: str
    level: str  # "unusual" or "impossible"
    value: float  # SI (plain numbers as given)
    number: float
    unit: str  # unit text ("" for a plain number)
    from_system: bool  # the unit was the case's unit system's, not typed

    @property
    def shown(self) -> str:
        u = label(self.unit) if self.unit else ""
        return f"{self.number:g}{' ' + u if u else ''}"


_COLLECT: contextvars.ContextVar[list | None] = contextvars.ContextVar("bf_guard", default=None)


@contextlib.contextmanager
def collecting():
    """Collect the findings of the values checked inside the block (yields the list)."""
    found: list[Finding] = []
    token = _COLLECT.set(found)
    try:
        yield found
    finally:
        _COLLECT.reset(token)


def _in(x_si: float, kind: str, unit: str) -> float:
    if not unit or kind == "number":
        return x_si
    return float(from_si(x_si, unit, kind))


def range_text(quantity: str, unit: str, which: str = "possible") -> str:
    """The possible (or usual) range of ``quantity`` in ``unit``."""
    p = RANGES[quantity]
    lo, hi = p.possible if which == "possible" else p.usual
    a, b = _in(lo, p.kind, unit), _in(hi, p.kind, unit)
    u = f" {label(unit)}" if unit and p.kind != "number" else ""
    low = f"> {_num(a)}" if (which == "possible" and p.low_open) else _num(a)
    whole = ", a whole number" if p.whole else ""
    return f"{low} to {_num(b)}{u}{whole} ({which}; {p.source})"


def _num(x: float) -> str:
    return f"{x:,.0f}" if abs(x) >= 1000 else f"{x:.4g}"


#: Units a number may have been meant in, per kind (tried for "did you mean" hints).
_ALTERNATIVES = {
    "density": ("sg", "ppg", "kg/m**3", "lb/ft**3"),
    "flow_rate": ("gpm", "L/min", "bbl/min", "m**3/hour"),
    "depth": ("ft", "m"),
    "length": ("ft", "m"),
    "diameter": ("in", "mm", "in32"),
    "pressure": ("psi", "bar", "kPa", "MPa"),
    "temperature": ("degF", "degC"),
}
_NAMES = {"sg": "a specific gravity", "in32": "32nds of an inch", "kg/m**3": "kg/m³"}


def _hint(quantity: str, number: float, unit: str) -> str:
    p = RANGES[quantity]
    if p.kind == "number":
        if quantity == "efficiency" and 1 < number <= 100:
            return f"; {number:g} looks like a percentage: did you mean {number / 100:g}?"
        return ""
    for alt in _ALTERNATIVES.get(p.kind, ()):
        if alt == unit:
            continue
        try:
            si = float(to_si(number, alt, p.kind))
        except InputError:
            continue
        if assess(quantity, si) == "ok":
            what = _NAMES.get(alt, label(alt))
            return (
                f"; {number:g} {label(unit)} looks like {what}: "
                f"did you mean {number:g} {label(alt)}?"
            )
    return ""


def _error(f: Finding, extra: str = "") -> ImplausibleInput:
    hint = extra or _hint(f.quantity, f.number, f.unit)
    return ImplausibleInput(f.where, f.shown, range_text(f.quantity, f.unit) + hint)


def check(value_si, quantity: str, where: str, number=None, unit: str = "", from_system=False):
    """Check one value of ``quantity`` (SI ``value_si``; ``number``/``unit`` as typed).

    Returns a :class:`Finding` for an unusual value, None for a usual one; an impossible one
    raises :class:`ImplausibleInput` unless :func:`collecting` is active (then it is kept).
    """
    if not quantity:
        return None
    x = float(value_si)
    level = assess(quantity, x)
    if level == "ok":
        return None
    num = x if number is None else float(number)
    f = Finding(where, quantity, level, x, num, unit, from_system)
    found = _COLLECT.get()
    if found is not None:
        found.append(f)
        return f
    if level == "impossible":
        raise _error(f)
    return f


def _other_system(found: list[Finding], system: str) -> str:
    """A unit system in which every system-unit number of ``found`` is possible and at least
    two are usual (the numbers were probably typed in it), or ""."""
    typed = [f for f in found if f.from_system and RANGES[f.quantity].kind != "number"]
    if len({RANGES[f.quantity].kind for f in typed}) < 2:  # several kinds, not one value twice
        return ""
    for other in UNIT_SYSTEMS:
        if other == system:
            continue
        levels = []
        for f in typed:
            k = RANGES[f.quantity].kind
            si = float(to_si(f.number, unit_for(k, other), k))
            levels.append(assess(f.quantity, si))
        if "impossible" not in levels and levels.count("ok") >= 2:
            return other
    return ""


def case_verdict(found: list[Finding], system: str, source: str) -> list[Finding]:
    """After reading a case: raise for its impossible values (with a unit-system hint when
    several fit another system); return the unusual ones."""
    bad = [f for f in found if f.level == "impossible"]
    if bad:
        other = _other_system([f for f in found if f.from_system], system)
        if other:
            listed = ", ".join(f"{f.where.split(': ', 1)[-1]} = {f.shown}" for f in bad[:4])
            raise ImplausibleInput(
                f"{source}: case.units",
                f'"{system}"',
                f"units that fit the numbers: these numbers look like {other} units but the "
                f'case says {system} ({listed}); set [case] units = "{other}" or give each '
                "value with its unit",
                problem="does not fit the numbers",
            )
        raise _error(bad[0])
    return [f for f in found if f.level == "unusual"]


def finding_text(f: Finding) -> str:
    """'where = value (usual range)' of an unusual value."""
    return f"{f.where} = {f.shown}: unusual; usual {range_text(f.quantity, f.unit, 'usual')}"


def accept_unusual(case, allow: bool, warn=None):
    """The case to run: refused (:func:`unusual_error`) when it has unusual values and
    ``allow`` is false; else the case marked as accepted, each value told to ``warn`` (a
    callable taking a line, e.g. printing to stderr)."""
    if not case.unusual:
        return case
    if not allow:
        raise unusual_error(case.unusual)
    for f in case.unusual:
        if warn is not None:
            warn(f"boreflow: warning: {finding_text(f)} (accepted: --allow-unusual)")
    return dataclasses.replace(case, unusual_allowed=True)


def unusual_error(found) -> InputError:
    """The refusal of a case with unusual values when ``--allow-unusual`` was not given."""
    first = found[0]
    more = f" (and {len(found) - 1} more)" if len(found) > 1 else ""
    return ImplausibleInput(
        first.where,
        first.shown,
        f"usual {range_text(first.quantity, first.unit, 'usual')}{more}; check the value, "
        "or give --allow-unusual to go on (a report records it in its Run section)",
        problem="unusual",
    )
