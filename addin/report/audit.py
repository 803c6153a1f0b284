"""Live check formulas: boreflow's number, and beside it the same quantity as a spreadsheet formula.

openpyxl cannot store a formula together with its cached result, so every audited quantity is
written as three adjacent cells::

    | value (plain number, from calc) | live formula (native functions only) | agreement |

The live formula refers only to cells on the report (inputs, intermediate values and the
conversion-factor table built by :class:`Factors`), never to boreflow code, so an auditor can
follow it by clicking through.  The agreement cell compares the two with a relative tolerance.

Conversion factors are cells, not literals hidden in formulas: each factor row says what it
converts and where the number comes from (the unit definitions in :mod:`calc.units`).
"""

from __future__ import annotations

from dataclasses import dataclass, field

from openpyxl.utils import get_column_letter, quote_sheetname

from addin.report.style import number_format, put_number
from addin.text import unit_label
from addin.xlsx_cells import put
from calc.units import G_N, label, si_factor, unit_for

__all__ = ["AGREE_TOL", "Factors", "cell_ref", "checked_row", "input_row", "write_checked"]

#: Relative tolerance of the agreement cells (display of agreement only; tests use their own).
AGREE_TOL = 1e-6


def cell_ref(ws, row: int, col: int, *, absolute=False, sheet=True) -> str:
    """A1-style reference, with the sheet name when ``sheet`` (quoted as needed)."""
    c = get_column_letter(col)
    a = f"${c}${row}" if absolute else f"{c}{row}"
    return f"{quote_sheetname(ws.title)}!{a}" if sheet else a


@dataclass
class Factors:
    """A table of named conversion factors on a sheet; ``ref(name)`` returns an absolute ref.

    Rows appear in the order first asked for, starting at ``(row, col)``.  Columns: name,
    value, meaning, source.
    """

    ws: object
    row: int
    col: int = 1
    system: str = "oilfield"
    _rows: dict = field(default_factory=dict)

    def _add(self, name: str, value: float, meaning: str, source: str) -> str:
        if name not in self._rows:
            r = self.row + len(self._rows)
            put(self.ws, r, self.col, name, "bf_cell")
            put_number(self.ws, r, self.col + 1, value, "0.000000000E+00")
            put(self.ws, r, self.col + 2, meaning, "bf_cell")
            put(self.ws, r, self.col + 3, source, "bf_note")
            self._rows[name] = cell_ref(self.ws, r, self.col + 1, absolute=True)
        return self._rows[name]

    def unit(self, kind: str) -> str:
        """Factor taking a value of ``kind`` in the case's unit system to SI."""
        return self.unit_factor_of(unit_for(kind, self.system), kind)

    def unit_factor_of(self, unit: str, kind: str) -> str:
        """Factor taking a value in a given ``unit`` (any system) to SI."""
        return self._add(
            f"SI per {label(unit)}",
            si_factor(unit, kind),
            f"multiplies a {kind.replace('_', ' ')} in {label(unit)} to SI",
            "unit definitions, NIST SP 811 (2008) App. B (calc.units)",
        )

    def g(self) -> str:
        """Standard gravity gₙ [m/s²]."""
        return self._add(
            "g_n [m/s²]", G_N, "standard acceleration of gravity", "CGPM 1901, exact (calc.units)"
        )

    def named(self, name: str, value: float, meaning: str, source: str) -> str:
        """Any other constant (must carry its source)."""
        return self._add(name, value, meaning, source)

    @property
    def next_row(self) -> int:
        return self.row + len(self._rows)


def write_checked(
    ws, row: int, col: int, value, formula: str, *, kind: str, system: str, fmt: str | None = None
) -> tuple[str, str]:
    """Write ``value`` at (row, col), the live ``formula`` at col+1 and the agreement at col+2.

    ``formula`` is the formula text without the leading "=".  Returns the references of the
    value cell and of the formula cell (for later formulas to build on).  The unit label is not
    written here (callers place it in their own unit column).
    """
    fmt = fmt or number_format(kind, system)
    put_number(ws, row, col, value, fmt)
    fcell = ws.cell(row=row, column=col + 1, value="=" + formula)
    fcell.style = "bf_check"
    fcell.number_format = fmt
    v = cell_ref(ws, row, col, sheet=False)
    f = cell_ref(ws, row, col + 1, sheet=False)
    agree = ws.cell(
        row=row,
        column=col + 2,
        value=f'=IF(ABS({v}-{f})<={AGREE_TOL}*MAX(ABS({v}),1E-12),"agrees","DIFFERS")',
    )
    agree.style = "bf_note"
    return cell_ref(ws, row, col), cell_ref(ws, row, col + 1)


def input_row(ws, row, name, value, kind, system, fmt=None) -> str:
    """A labelled input cell (name, value, unit) for live checks to refer to; returns its
    absolute reference."""
    put(ws, row, 1, name)
    put_number(ws, row, 2, value, fmt or number_format(kind, system), "bf_input")
    put(ws, row, 3, unit_label(kind, system), "bf_unit")
    return cell_ref(ws, row, 2, absolute=True)


def checked_row(ws, row, name, value, formula, kind, system, note="", note_end=11):
    """A quantity row: name, value, live check, agreement, unit and the formula in words
    (merged up to column ``note_end``); returns the value and formula references."""
    put(ws, row, 1, name)
    v, f = write_checked(ws, row, 2, value, formula, kind=kind, system=system)
    put(ws, row, 5, unit_label(kind, system), "bf_unit")
    if note:
        put(ws, row, 6, note, "bf_note")
        ws.merge_cells(start_row=row, start_column=6, end_row=row, end_column=note_end)
    return v, f
