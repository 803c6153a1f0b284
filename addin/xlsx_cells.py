"""Workbook cell primitives shared by every face that writes .xlsx (openpyxl).

The report workbook (:mod:`addin.report`) and the input workbook's writer
(:mod:`addin.workbook_template`) write cells through these: one palette, the named cell styles
(``bf_title``, ``bf_section``, ``bf_head``, ``bf_unit``, ``bf_cell``, ``bf_input``, ``bf_check``,
``bf_note``, ``bf_text``), text that never becomes a formula, and column widths.

The look is boreflow's own: slate headings, a thin ochre rule under each section title, units
in a grey italic row under every table header, computed values in black, live check formulas in
blue, inputs on a pale background.  Fonts are Arial (LibreOffice substitutes the metric-compatible
Liberation Sans, so column widths hold on any machine).

Formula-safe text
    A spreadsheet treats text that starts with ``=``, ``+``, ``-`` or ``@`` as a formula when a
    user edits or imports it (and openpyxl stores ``"=..."`` as a formula outright).  Text that
    came from an input file is written through :func:`set_text` (and so :func:`put`), which
    stores it as a string cell with the quote-prefix flag, so it shows literally and stays text
    when edited (the trigger characters are :data:`addin.safe_io.FORMULA_TRIGGERS`).
"""

from __future__ import annotations

from openpyxl.styles import Alignment, Border, Font, NamedStyle, PatternFill, Side
from openpyxl.utils import get_column_letter

from addin.safe_io import is_formula_like

__all__ = ["FONT", "PALETTE", "add_styles", "put", "set_text", "set_widths"]

FONT = "Arial"

PALETTE = {
    "ink": "1F2A36",  # headings
    "slate": "3E5469",  # header band
    "ochre": "C08A2B",  # rule under section titles
    "paper": "F4F6F8",  # input cells
    "grid": "C9D1D9",
    "muted": "6B7785",  # units, notes
    "check": "1F5FA8",  # live formulas
    "ok": "2E7D4F",
    "warn": "B7791F",
    "bad": "B03A2E",
    "band": "E3E8EE",
}

_THIN = Side(style="thin", color=PALETTE["grid"])


def add_styles(wb) -> None:
    """Register the named styles (report and input workbook) on a workbook (idempotent)."""
    have = {s if isinstance(s, str) else s.name for s in wb.named_styles}
    styles = [
        NamedStyle(
            name="bf_title",
            font=Font(name=FONT, size=15, bold=True, color=PALETTE["ink"]),
            alignment=Alignment(vertical="center"),
        ),
        NamedStyle(
            name="bf_section",
            font=Font(name=FONT, size=11, bold=True, color=PALETTE["ink"]),
            border=Border(bottom=Side(style="medium", color=PALETTE["ochre"])),
        ),
        NamedStyle(
            name="bf_head",
            font=Font(name=FONT, size=9, bold=True, color="FFFFFF"),
            fill=PatternFill("solid", fgColor=PALETTE["slate"]),
            alignment=Alignment(horizontal="center", vertical="center", wrap_text=True),
            border=Border(left=_THIN, right=_THIN, top=_THIN, bottom=_THIN),
        ),
        NamedStyle(
            name="bf_unit",
            font=Font(name=FONT, size=8, italic=True, color=PALETTE["muted"]),
            fill=PatternFill("solid", fgColor=PALETTE["band"]),
            alignment=Alignment(horizontal="center"),
            border=Border(left=_THIN, right=_THIN, bottom=_THIN),
        ),
        NamedStyle(
            name="bf_cell",
            font=Font(name=FONT, size=9, color="000000"),
            border=Border(left=_THIN, right=_THIN, top=_THIN, bottom=_THIN),
            alignment=Alignment(vertical="center"),
        ),
        NamedStyle(
            name="bf_input",
            font=Font(name=FONT, size=9, color="000000"),
            fill=PatternFill("solid", fgColor=PALETTE["paper"]),
            border=Border(left=_THIN, right=_THIN, top=_THIN, bottom=_THIN),
        ),
        NamedStyle(
            name="bf_check",
            font=Font(name=FONT, size=9, color=PALETTE["check"]),
            border=Border(left=_THIN, right=_THIN, top=_THIN, bottom=_THIN),
        ),
        NamedStyle(
            name="bf_note",
            font=Font(name=FONT, size=8, color=PALETTE["muted"]),
            alignment=Alignment(wrap_text=True, vertical="top"),
        ),
        NamedStyle(
            name="bf_text",
            font=Font(name=FONT, size=9),
            alignment=Alignment(wrap_text=True, vertical="top"),
        ),
    ]
    for st in styles:
        if st.name not in have:
            wb.add_named_style(st)


def set_text(cell, text) -> None:
    """Store ``text`` in an openpyxl cell as literal text, never as a formula.

    The value is stored as a string cell; text that a spreadsheet would take for a formula also
    gets the quote-prefix flag, so editing the cell keeps it text.  Set the cell's named style
    *before* calling this: assigning ``cell.style`` afterwards clears the flag.
    """
    value = "" if text is None else str(text)
    cell.value = value
    cell.data_type = "s"  # openpyxl guesses "f" for text starting with "="
    if is_formula_like(value):
        cell.quotePrefix = True


def put(ws, row: int, col: int, value, style: str = "bf_cell"):
    """Write a value; text always goes in as text (never as a formula)."""
    cell = ws.cell(row=row, column=col)
    cell.style = style  # first: assigning a named style resets quotePrefix
    if isinstance(value, str):
        set_text(cell, value)
    else:
        cell.value = value
    return cell


def set_widths(ws, widths) -> None:
    """Column widths in characters, from column A."""
    for j, w in enumerate(widths, start=1):
        ws.column_dimensions[get_column_letter(j)].width = w
