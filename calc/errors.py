"""Input errors and non-fatal notes.

:class:`InputError` is raised for impossible input; its message names the input, the value
and what is allowed.  Doubtful-but-possible findings travel on results as :class:`calc.notes.Note`
objects (never as printed warnings), so every face of the program can show them.
"""

from __future__ import annotations

import difflib

import numpy as np

from calc.values import Value, fill, si_text

__all__ = [
    "InputError",
    "as_float_array",
    "check_choice",
    "check_finite",
    "check_less",
    "check_nonnegative",
    "check_order",
    "check_positive",
    "check_range",
]


#: Longest text an error message repeats whole; longer text is shown by its start and length.
_TEXT_SHOWN = 80


def _fmt(value) -> str:
    """The value as an error message shows it.

    >>> _fmt("x" * 100)
    "'xxxxxxxxxxxxxxxxxxxx…' (a text of 100 characters)"
    """
    if isinstance(value, str) and len(value) > _TEXT_SHOWN:
        return f"{value[:20]!r}… (a text of {len(value):,} characters)".replace("'…", "…'", 1)
    if isinstance(value, float):
        return f"{value:.6g}"
    if isinstance(value, np.ndarray) and value.size > 6:
        return f"array of {value.size} values"
    return repr(value)


class InputError(ValueError):
    """Impossible input.  ``name``: which input; ``value``: what was given; ``allowed``: what is.

    ``kind`` (a quantity kind) says that ``value`` is an SI number of that kind, and
    ``allowed`` may name SI numbers as ``{field}`` from ``values``
    (:class:`~calc.values.Value`), so that a face can say both in the user's units
    (``addin.text.error``); ``str()`` says them in SI.

    >>> str(InputError("flow rate", -5.0, "> 0 gpm"))
    'flow rate = -5: not allowed; allowed: > 0 gpm'
    >>> str(InputError("pipe OD", 0.254, "< the hole diameter {hole}", kind="diameter",
    ...                values=(Value("hole", 0.2159, "diameter"),)))
    'pipe OD = 0.254 m: not allowed; allowed: < the hole diameter 0.2159 m'
    """

    def __init__(
        self,
        name: str,
        value,
        allowed: str,
        problem: str = "not allowed",
        *,
        kind: str = "",
        values: tuple[Value, ...] = (),
    ):
        self.name = name
        self.value = value
        self.allowed = allowed
        self.problem = problem
        self.kind = kind
        self.values = tuple(values)
        scalar = kind and np.ndim(value) == 0 and not isinstance(value, str)
        #: the value as ``str()`` shows it (SI)
        self.shown = si_text(Value("value", float(value), kind)) if scalar else _fmt(value)
        text = fill(allowed, self.values, si_text) if self.values else allowed
        super().__init__(f"{name} = {self.shown}: {problem}; allowed: {text}")


def as_float_array(name: str, value) -> np.ndarray:
    """``value`` as a float array; text or other non-numbers raise :class:`InputError`."""
    if isinstance(value, str):
        raise InputError(name, value, "a number")
    try:
        arr = np.asarray(value, dtype=float)
    except (TypeError, ValueError) as exc:
        raise InputError(name, value, "a number or an array of numbers") from exc
    return arr


def _first_bad(arr: np.ndarray, bad: np.ndarray):
    idx = np.flatnonzero(bad)[0]
    return float(arr.ravel()[idx]) if arr.ndim else float(arr)


def check_finite(name: str, value, unit: str = "") -> np.ndarray:
    """Reject NaN and infinities; return the float array."""
    arr = as_float_array(name, value)
    bad = ~np.isfinite(arr)
    if np.any(bad):
        raise InputError(
            name, _first_bad(arr, bad), f"a finite number{' in ' + unit if unit else ''}"
        )
    return arr


def check_positive(name: str, value, unit: str = "") -> np.ndarray:
    """Require finite values > 0."""
    arr = check_finite(name, value, unit)
    bad = arr <= 0
    if np.any(bad):
        raise InputError(name, _first_bad(arr, bad), f"> 0{' ' + unit if unit else ''}")
    return arr


def check_nonnegative(name: str, value, unit: str = "") -> np.ndarray:
    """Require finite values ≥ 0."""
    arr = check_finite(name, value, unit)
    bad = arr < 0
    if np.any(bad):
        raise InputError(name, _first_bad(arr, bad), f">= 0{' ' + unit if unit else ''}")
    return arr


def check_range(
    name: str, value, lo: float, hi: float, unit: str = "", *, lo_open=False, hi_open=False
) -> np.ndarray:
    """Require lo ≤ value ≤ hi (``lo_open``/``hi_open`` make a bound strict)."""
    arr = check_finite(name, value, unit)
    bad = (arr <= lo if lo_open else arr < lo) | (arr >= hi if hi_open else arr > hi)
    if np.any(bad):
        lb = "(" if lo_open else "["
        rb = ")" if hi_open else "]"
        raise InputError(
            name, _first_bad(arr, bad), f"in {lb}{lo:g}, {hi:g}{rb}{' ' + unit if unit else ''}"
        )
    return arr


def check_choice(name: str, value, choices) -> str:
    """Require ``value`` to be one of ``choices``; suggest the nearest one if not.

    >>> check_choice("method", "api13d_2010", ["api13d_2010", "exact_laminar"])
    'api13d_2010'
    """
    choices = list(choices)
    if isinstance(value, str) and value in choices:
        return value
    near = difflib.get_close_matches(str(value), choices, n=1)
    hint = f" (did you mean '{near[0]}'?)" if near else ""
    raise InputError(name, value, "one of " + ", ".join(choices) + hint, problem="unknown")


_ORDER = {"<": np.less, "<=": np.less_equal, ">": np.greater, ">=": np.greater_equal}


def check_order(
    name: str, value: float, op: str, bound: float, what: str, kind: str, problem: str = ""
) -> float:
    """Require ``value op bound`` for two SI values of one quantity ``kind`` (``op`` one of
    ``<``, ``<=``, ``>``, ``>=``); ``what`` names the bound ("the OD", "top").  The error
    carries both values with their kind, so a face can say them in the user's units.

    >>> check_order("drift", 0.2, "<=", 0.22, "the inside diameter", "diameter")
    0.2
    >>> try:
    ...     check_order("ID", 0.13, "<", 0.127, "the OD", "diameter")
    ... except InputError as e:
    ...     print(e)
    ID = 0.13 m: not allowed; allowed: < the OD 0.127 m
    """
    value, bound = float(value), float(bound)
    if not _ORDER[op](value, bound):
        raise InputError(
            name,
            value,
            f"{op} {what} {{bound}}",
            problem or "not allowed",
            kind=kind,
            values=(Value("bound", bound, kind),),
        )
    return value


def check_less(name, value, bound, what: str, kind: str) -> None:
    """Require ``value < bound`` element by element (arrays broadcast; SI values of one
    quantity ``kind``), e.g. every pipe smaller than its hole.  The error names the first
    element that is not, with both values carrying their kind, so a face can say them in the
    user's units.  ``name`` is the input's name, or a callable giving it from the element's
    index (to name an interval).

    >>> check_less("pipe OD", [0.127, 0.127], [0.2159, 0.3], "the hole diameter", "diameter")
    >>> try:
    ...     check_less(lambda i: f"pipe OD (interval {i + 1})", [0.127, 0.25], 0.2159,
    ...                "the hole diameter", "diameter")
    ... except InputError as e:
    ...     print(e)
    pipe OD (interval 2) = 0.25 m: not allowed; allowed: < the hole diameter (0.2159 m)
    """
    v, b = np.broadcast_arrays(np.asarray(value, dtype=float), np.asarray(bound, dtype=float))
    bad = (v >= b).ravel()
    if np.any(bad):
        i = int(np.flatnonzero(bad)[0])
        raise InputError(
            name(i) if callable(name) else name,
            float(v.ravel()[i]),
            f"< {what} ({{bound}})",
            kind=kind,
            values=(Value("bound", float(b.ravel()[i]), kind),),
        )
