"""The report's look: one palette, named cell styles, number formats by quantity kind, print setup.

The style is boreflow's own: slate headings, a thin ochre rule under each section title, units
in a grey italic row under every table header, computed values in black, live check formulas in
blue, inputs on a pale background.  Fonts are Arial (LibreOffice substitutes the metric-compatible
Liberation Sans, so column widths hold on any machine).
"""

from __future__ import annotations

from openpyxl.styles import Alignment, Border, Font, NamedStyle, PatternFill, Side
from openpyxl.utils import get_column_letter

from addin.safe_io import set_text

__all__ = [
    "FONT",
    "PALETTE",
    "add_styles",
    "heading",
    "merged_text",
    "note_row",
    "number_format",
    "put",
    "put_number",
    "set_widths",
    "setup_print",
    "table_header",
]

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

#: Number formats by quantity kind and unit system (display only; values keep full precision).
_FORMATS = {
    "oilfield": {
        "depth": "#,##0",
        "length": "#,##0.0",
        "diameter": "0.000",
        "nozzle": "0",
        "density": "0.00",
        "pressure": "#,##0",
        "pressure_gradient": "0.0000",
        "flow_rate": "#,##0",
        "velocity": "#,##0",
        "jet_velocity": "#,##0",
        "trip_speed": "#,##0",
        "rop": "0",
        "stress": "0.0",
        "consistency": "0.000",
        "viscosity": "0.0",
        "shear_rate": "#,##0.0",
        "power": "#,##0",
        "power_density": "0.00",
        "force": "#,##0",
        "area": "0.0000",
        "volume": "#,##0.0",
        "temperature": "0",
        "angle": "0.0",
        "dimensionless": "0.000",
    },
    "metric": {
        "depth": "#,##0.0",
        "length": "#,##0.00",
        "diameter": "0.0",
        "nozzle": "0.00",
        "density": "#,##0",
        "pressure": "#,##0.0",
        "pressure_gradient": "0.000",
        "flow_rate": "#,##0",
        "velocity": "#,##0.0",
        "jet_velocity": "#,##0.0",
        "trip_speed": "#,##0.0",
        "rop": "0.0",
        "stress": "0.00",
        "consistency": "0.000",
        "viscosity": "0.0",
        "shear_rate": "#,##0.0",
        "power": "#,##0.0",
        "power_density": "0.000",
        "force": "#,##0.0",
        "area": "#,##0.0",
        "volume": "#,##0.00",
        "temperature": "0",
        "angle": "0.0",
        "dimensionless": "0.000",
    },
}
_FORMATS["si"] = {
    **_FORMATS["metric"],
    "diameter": "0.00000",
    "nozzle": "0.00000",
    "pressure": "#,##0",
    "pressure_gradient": "#,##0",
    "flow_rate": "0.00000",
    "velocity": "0.000",
    "trip_speed": "0.000",
    "rop": "0.00000",
    "viscosity": "0.0000",
    "power": "#,##0",
    "power_density": "#,##0",
    "force": "#,##0",
    "area": "0.000000",
    "temperature": "0.0",
}


def number_format(kind: str, system: str) -> str:
    """Display format for a quantity kind in a unit system ("General" for unknown kinds)."""
    return _FORMATS.get(system, _FORMATS["oilfield"]).get(kind, "General")


def add_styles(wb) -> None:
    """Register the report's named styles on a workbook (idempotent)."""
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


def put(ws, row: int, col: int, value, style: str = "bf_cell"):
    """Write a value; text always goes in as text (never as a formula)."""
    cell = ws.cell(row=row, column=col)
    if isinstance(value, str):
        set_text(cell, value)
    else:
        cell.value = value
    cell.style = style
    return cell


def put_number(ws, row, col, value, fmt="General", style="bf_cell"):
    """Write a plain number (None stays empty) with a display format."""
    cell = ws.cell(row=row, column=col)
    cell.value = None if value is None else float(value)
    cell.style = style
    cell.number_format = fmt
    return cell


def merged_text(ws, row: int, text: str, *, span: int, height: float, col=1, style="bf_note"):
    """Text merged across ``span`` columns in a row of fixed ``height`` [pt]; returns the cell."""
    cell = put(ws, row, col, text, style)
    ws.merge_cells(start_row=row, start_column=col, end_row=row, end_column=col + span - 1)
    ws.row_dimensions[row].height = height
    return cell


def heading(ws, row: int, text: str, *, col: int = 1, span: int = 6, title=False) -> int:
    """A section heading across ``span`` columns; returns the next free row."""
    style = "bf_title" if title else "bf_section"
    for c in range(col, col + span):
        ws.cell(row=row, column=c).style = style
    put(ws, row, col, text, style)
    if title:
        ws.row_dimensions[row].height = 24
    return row + 1


def table_header(ws, row: int, col: int, headers, units=None) -> int:
    """Header row (and a units row when ``units`` is given); returns the first data row."""
    for j, h in enumerate(headers):
        put(ws, row, col + j, h, "bf_head")
    ws.row_dimensions[row].height = 26
    if units is None:
        return row + 1
    for j, u in enumerate(units):
        put(ws, row + 1, col + j, u or "", "bf_unit")
    return row + 2


def set_widths(ws, widths) -> None:
    """Column widths in characters, from column A."""
    for j, w in enumerate(widths, start=1):
        ws.column_dimensions[get_column_letter(j)].width = w


def setup_print(ws, title: str, *, landscape=True, fit_height: int = 0) -> None:
    """A4, fit to one page wide, a header with the report title and a page footer."""
    ws.page_setup.paperSize = ws.PAPERSIZE_A4
    ws.page_setup.orientation = "landscape" if landscape else "portrait"
    ws.page_setup.fitToWidth = 1
    ws.page_setup.fitToHeight = fit_height
    ws.sheet_properties.pageSetUpPr.fitToPage = True
    ws.print_options.horizontalCentered = True
    ws.page_margins.left = ws.page_margins.right = 0.4
    ws.page_margins.top = ws.page_margins.bottom = 0.7
    ws.page_margins.header = ws.page_margins.footer = 0.25
    safe_title = title.replace("&", "&&")
    ws.oddHeader.left.text = safe_title
    ws.oddHeader.left.size = 8
    ws.oddHeader.right.text = "&A"
    ws.oddHeader.right.size = 8
    ws.oddFooter.left.text = "boreflow daily hydraulics report (estimates; see Cautions)"
    ws.oddFooter.left.size = 7
    ws.oddFooter.right.text = "page &P of &N"
    ws.oddFooter.right.size = 7


def note_row(
    ws, row: int, text: str, *, col: int = 1, span: int = 8, style="bf_note", font_pt=8
) -> int:
    """A note merged across ``span`` columns, its row tall enough for the wrapped text;
    returns the next row."""
    from math import ceil

    put(ws, row, col, text, style)
    if span > 1:
        ws.merge_cells(start_row=row, start_column=col, end_row=row, end_column=col + span - 1)
    width = sum(
        (ws.column_dimensions[get_column_letter(c)].width or 9.0) for c in range(col, col + span)
    )
    per_line = max(20.0, 1.35 * width * 8 / font_pt)  # characters per line at this font size
    lines = max(1, ceil(len(text) / per_line))
    ws.row_dimensions[row].height = max(12.0, 1.35 * font_pt * lines + 2)
    return row + 1
