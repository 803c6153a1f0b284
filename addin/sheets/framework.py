"""The worksheet-function convention: one decorator, one error marker, argument hints.

Every boreflow worksheet function is a plain Python function decorated with
:func:`sheet_function`.  The decorator

* registers the function in :data:`FUNCTIONS` (name → callable) for the reference generator,
  the formula-engine harness and the tests;
* wraps it so that **no exception escapes**: an :class:`calc.errors.InputError` becomes an
  error text ``"#BF! <what is wrong>"``; any other exception becomes
  ``"#BF! internal error (<type>): <message>"`` — never a traceback in a cell;
* cleans the result: numpy scalars become Python floats, 2-D tables become lists of lists,
  and a NaN or an infinity is never returned (xlwings would write NaN as an empty cell);
* finally applies ``xlwings.func`` so that xlwings registers the function on Windows or macOS.
  On Linux ``xlwings.func`` returns the function unchanged, so the wrapped function behaves
  the same under pytest as in a spreadsheet: each function normalises its own arguments
  (see :mod:`addin.sheets.cells`) instead of relying on xlwings converters.

The error marker
----------------
A failed call returns a short text that starts with :data:`MARK` (``"#BF!"``), for example
``#BF! reading 3 rpm = 9: above the 6 rpm reading (8); allowed: ...``.  Because it is text,
any arithmetic that depends on it fails visibly with ``#VALUE!`` in the spreadsheet, and
``=ISTEXT(cell)`` or ``=LEFT(cell, 4) = "#BF!"`` detects it.  (Classic xlwings cannot return
native error values such as ``#N/A``.)

Argument hints
--------------
Type hints on worksheet functions are read by xlwings as converters.  Only hints xlwings can
convert are used: :func:`Num` (``float``), :func:`Text` (``str``), :func:`Cells` (``list``
with ``ndim=2``, for ranges) and ``typing.Any`` for results.  Each hint carries the argument's
description (``doc``), which xlwings shows in the function wizard and the reference generator
prints.  ``err_to_str`` makes xlwings hand error cells over as text such as ``"#N/A"`` so the
normaliser can name them.
"""

import functools
import inspect
import math
import warnings
from collections.abc import Callable
from dataclasses import dataclass
from typing import Annotated, Any

import numpy as np
import xlwings as xw

from addin import text
from addin.guard import check as guard_check
from addin.sheets.cells import number, unit_set
from calc.errors import InputError

__all__ = [
    "FUNCTIONS",
    "MARK",
    "Cells",
    "Num",
    "SheetFunction",
    "Text",
    "error_text",
    "is_error_text",
    "sheet_function",
]

#: The fixed marker that starts every error text returned to a cell.
MARK = "#BF!"

#: Longest error text returned (Excel's function wizard and narrow cells favour short text).
_MAX_ERROR = 250


def Num(doc: str) -> Any:
    """Hint for a single-cell numeric argument (a number, a blank, or a number with a unit)."""
    return Annotated[float, {"doc": doc, "err_to_str": True}]


def Text(doc: str) -> Any:
    """Hint for a single-cell text argument (a name, a unit, a method)."""
    return Annotated[str, {"doc": doc, "err_to_str": True}]


def Cells(doc: str) -> Any:
    """Hint for a range argument: xlwings passes a 2-D list (``ndim=2``) even for one cell."""
    return Annotated[list, {"doc": doc, "ndim": 2, "err_to_str": True}]


@dataclass(frozen=True)
class SheetFunction:
    """A registered worksheet function: its name, family, the raw and the wrapped callable."""

    name: str
    family: str
    func: Callable[..., Any]
    raw: Callable[..., Any]


#: Registered worksheet functions, name → :class:`SheetFunction`, in definition order.
FUNCTIONS: dict[str, SheetFunction] = {}


def error_text(reason: str) -> str:
    """The error value for a cell: the marker, a space and a one-line reason.

    >>> error_text("flow rate = -5: not allowed; allowed: > 0 gpm")
    '#BF! flow rate = -5: not allowed; allowed: > 0 gpm'
    """
    one_line = " ".join(str(reason).split())
    text = f"{MARK} {one_line}"
    return text if len(text) <= _MAX_ERROR else text[: _MAX_ERROR - 1] + "…"


def is_error_text(value) -> bool:
    """True for a boreflow error text (``"#BF! …"``)."""
    return isinstance(value, str) and value.startswith(MARK)


def _clean_scalar(value, where: str = ""):
    if value is None or isinstance(value, str):
        return value
    if isinstance(value, bool | np.bool_):
        return bool(value)
    try:
        x = float(value)
    except (TypeError, ValueError):
        return str(value)
    if not math.isfinite(x):
        return error_text(f"result{where} is not a finite number ({x!r}); check the inputs")
    return x


def clean_result(out):
    """Make a function result safe for a cell: floats, text, or a 2-D list of them.

    A 0-d array or numpy scalar becomes a float; a 1-D array becomes one column; a 2-D
    array or list of lists stays 2-D.  A non-finite scalar result becomes an error text; in a
    table, a non-finite entry becomes an error text in that entry only.
    """
    if isinstance(out, np.ndarray):
        if out.ndim == 0:
            return _clean_scalar(out.item())
        if out.ndim == 1:
            out = out.reshape(-1, 1)
        if out.dtype.kind == "f" and np.all(np.isfinite(out)):
            return out.tolist()  # fast path: a finite numeric table, no per-cell work
        out = out.tolist()
    if isinstance(out, list | tuple):
        rows = [list(r) if isinstance(r, list | tuple | np.ndarray) else [r] for r in out]
        return [
            [_clean_scalar(v, f" in row {i + 1}, column {j + 1}") for j, v in enumerate(row)]
            for i, row in enumerate(rows)
        ]
    return _clean_scalar(out)


def _units_of_call(raw, args, kwargs):
    """The call's ``units`` argument as a unit set (oilfield, every function's default, where
    the function has none or it cannot be read)."""
    try:
        bound = inspect.signature(raw).bind_partial(*args, **kwargs)
        return unit_set(bound.arguments.get("units"))
    except (TypeError, InputError):
        return unit_set(None)


#: Worksheet arguments checked against their physically possible range before the call
#: (calc/plausibility.py): argument name → (quantity kind of its unit, plausibility quantity).
#: An impossible value gives ``#BF! <argument> = <value in the cell's unit>: physically
#: impossible; allowed: <range> …``; an unusual one is computed (a cell cannot warn).
ARG_GUARDS: dict[str, tuple[str | None, str]] = {
    "density": ("density", "fluid_density"),
    "q": ("flow_rate", "flow_rate"),
    "d_hole": ("diameter", "hole_diameter"),
    "bit_size": ("diameter", "hole_diameter"),
    "d_pipe": ("diameter", "pipe_diameter"),
    "cuttings_size": ("diameter", "cuttings_size"),
    "cuttings_density": ("density", "cuttings_density"),
    "tvd": ("depth", "depth"),
    "rop": ("rop", "rop"),
    "rpm": (None, "rpm"),
    "discharge_coefficient": (None, "discharge_coefficient"),
    "accel_time": (None, "accel_time"),
}


_LABELS = {
    "q": "flow rate",
    "d_hole": "hole diameter",
    "d_pipe": "pipe OD",
    "bit_size": "bit size",
    "cuttings_size": "cuttings size",
    "cuttings_density": "cuttings density",
    "tvd": "TVD",
    "rop": "ROP",
    "discharge_coefficient": "discharge coefficient",
    "accel_time": "acceleration time",
}


def _cell_numbers(value):
    """The single numbers (or 'number unit' texts) of an argument: a cell or a range."""
    if isinstance(value, list | tuple):
        for item in value:
            yield from _cell_numbers(item)
    elif isinstance(value, bool) or value is None:
        return
    elif isinstance(value, int | float | str):
        yield value


def _check_arguments(raw, args, kwargs) -> None:
    """Refuse physically impossible arguments (:data:`ARG_GUARDS`) with the value in the
    unit of the call; values the function would refuse anyway (text, blanks) are left to it."""
    try:
        bound = inspect.signature(raw).bind_partial(*args, **kwargs).arguments
    except TypeError:
        return
    if not any(k in ARG_GUARDS for k in bound):
        return
    uset = _units_of_call(raw, args, kwargs)
    for name, (kind, quantity) in ARG_GUARDS.items():
        if name not in bound:
            continue
        for v in _cell_numbers(bound[name]):
            try:
                si = number(v, name, kind, uset)
            except InputError:
                continue  # not a number: the function's own message says so
            if si <= 0 and name != "tvd":
                continue  # zero and negative values: the function's own checks word them
            if isinstance(v, str):
                num_text, _, unit = v.strip().partition(" ")
                try:
                    shown_number, unit = float(num_text), unit.strip()
                except ValueError:
                    continue
            else:
                shown_number = float(v)
                unit = uset.unit(kind) if kind else ""
            guard_check(si, quantity, _LABELS.get(name, name), shown_number, unit, True)


def _call_guarded(raw, args, kwargs):
    try:
        with warnings.catch_warnings(), np.errstate(all="ignore"):
            warnings.simplefilter("ignore", RuntimeWarning)
            _check_arguments(raw, args, kwargs)
            out = raw(*args, **kwargs)
        return clean_result(out)
    except InputError as exc:
        return error_text(text.error(exc, _units_of_call(raw, args, kwargs)))
    except Exception as exc:  # no exception may reach a cell
        try:
            message = str(exc)
        except Exception:
            message = ""
        return error_text(f"internal error ({type(exc).__name__}): {message}")


def sheet_function(family: str) -> Callable[[Callable[..., Any]], Callable[..., Any]]:
    """Register and guard a worksheet function (see the module docstring).

    ``family`` names the group the function is listed under in the reference and in the
    spreadsheet's function wizard (category ``"boreflow <family>"``).
    """

    def deco(raw: Callable[..., Any]) -> Callable[..., Any]:
        @functools.wraps(raw)
        def wrapper(*args, **kwargs):
            return _call_guarded(raw, args, kwargs)

        name = raw.__name__
        if name in FUNCTIONS:
            raise ValueError(f"worksheet function {name} defined twice")
        FUNCTIONS[name] = SheetFunction(name=name, family=family, func=wrapper, raw=raw)
        return xw.func(category=f"boreflow {family}")(wrapper)

    return deco
