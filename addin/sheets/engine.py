"""Headless workbook calculation: the boreflow functions registered with PyPI ``formulas``.

Used by the tests and by anyone who wants a boreflow workbook's numbers without a
spreadsheet program.  ``formulas`` (a test dependency) hands custom functions numpy object
arrays for ranges, its ``EMPTY`` token for blank cells and ``XlError`` objects for error
cells; :func:`register` adapts each worksheet function so it receives exactly what xlwings
would hand it (``None``, text such as ``"#N/A"``, numbers, 2-D lists) and gives back what
``formulas`` expects (a scalar, or a 2-D array for an array formula).

>>> from addin.sheets.engine import register
>>> names = register()
>>> "BF_CONVERT" in names
True
"""

import functools
import os
from collections.abc import Callable, Iterable
from typing import Any

import numpy as np
from openpyxl.utils.cell import column_index_from_string as col_index
from openpyxl.utils.cell import coordinate_from_string, get_column_letter

import addin.sheets.functions  # noqa: F401  (defines every family)
from addin.sheets.framework import FUNCTIONS

__all__ = ["calculate", "register"]


def _from_engine(value):
    # lazy: formulas and schedula are optional (test extra); importing this module needs neither
    import schedula as sh
    from formulas.tokens.operand import XlError

    def cell(v):
        if v is sh.EMPTY:
            return None
        if isinstance(v, XlError):
            return str(v)
        if isinstance(v, np.generic):
            return v.item()
        return v

    if isinstance(value, np.ndarray):
        return [[cell(v) for v in row] for row in np.atleast_2d(value).tolist()]
    return cell(value)


def _to_engine(out):
    # lazy: optional formula engine (test extra)
    from formulas.functions import Array

    if isinstance(out, list):
        return np.array(out, dtype=object).view(Array)
    return out


def _adapt(func: Callable[..., Any]) -> Callable[..., Any]:
    @functools.wraps(func)
    def call(*args):
        return _to_engine(func(*(_from_engine(a) for a in args)))

    return call


def register(names: Iterable[str] | None = None) -> list[str]:
    """Register boreflow worksheet functions with ``formulas``; return the names registered."""
    # lazy: optional formula engine (test extra)
    import formulas
    from formulas.functions import wrap_func

    table = formulas.get_functions()
    chosen = list(FUNCTIONS) if names is None else list(names)
    for name in chosen:
        table[name] = wrap_func(_adapt(FUNCTIONS[name].func))
    return chosen


def calculate(path: str | os.PathLike) -> dict[tuple[str, str], Any]:
    """Compute a workbook headlessly; return ``{(SHEET, "B7"): value}`` for every cell.

    Sheet names are upper-cased (as ``formulas`` reports them); a range result (array
    formula) is split into its cells.  Error values come back as their text (``"#VALUE!"``).
    """
    # lazy: optional formula engine (test extra)
    import formulas
    import schedula as sh
    from formulas.tokens.operand import XlError

    register()
    model = formulas.ExcelModel().loads(str(path)).finish()
    solution = model.calculate()
    out: dict[tuple[str, str], Any] = {}
    for key, ranges in solution.items():
        ref = str(key)
        if "!" not in ref:
            continue  # not a cell: formulas can list helper nodes (seen: "self")
        sheet_part, _, cells = ref.rpartition("!")
        sheet = sheet_part.strip("'").split("]", 1)[-1]
        values = np.atleast_2d(np.asarray(getattr(ranges, "value", ranges), dtype=object))
        first = cells.split(":")[0]
        col_letter, row0 = coordinate_from_string(first)
        col0 = col_index(col_letter)
        for i, row in enumerate(values):
            for j, v in enumerate(row):
                if v is sh.EMPTY:
                    v = None
                elif isinstance(v, XlError):
                    v = str(v)
                elif isinstance(v, np.generic):
                    v = v.item()
                out[(sheet, f"{get_column_letter(col0 + j)}{row0 + i}")] = v
    return out
