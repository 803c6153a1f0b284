"""The report's own look: number formats by quantity kind, headings, tables, notes, print setup.

The palette, the named cell styles and the cell writers shared with the input workbook are in
:mod:`addin.xlsx_cells`; this module builds the report's sheet furniture on them.
"""

from __future__ import annotations

from math import ceil

from openpyxl.utils import get_column_letter

from addin.xlsx_cells import put

__all__ = [
    "heading",
    "merged_text",
    "note_row",
    "number_format",
    "put_number",
    "setup_print",
    "table_header",
]

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


# ------------------------------------------------------------------ text that fits its cell

#: Column-width units per character of the report's 9-pt Arial (a width unit is one "0" of
#: the workbook's 11-pt default font; 9-pt Arial runs at about 0.85 of it, judged on the
#: LibreOffice-rendered pages), plus one unit of cell padding.
CHAR_WIDTH = 0.85
PAD = 1.0
#: width units per character when counting the lines of wrapped text: the mean width of
#: mixed text in 9-pt Arial (about 0.7 on the rendered pages; CHAR_WIDTH errs wide on purpose)
LINE_CHAR_WIDTH = 0.7
#: points per wrapped line of 9-pt text, and the default row height [pt]
LINE_HEIGHT = 11.5
ROW_HEIGHT = 12.75


def _width(ws, col: int) -> float:
    from openpyxl.utils import get_column_letter  # lazy: only the fitting needs it

    w = ws.column_dimensions[get_column_letter(col)].width
    return float(w) if w else 8.43


def text_width(value) -> float:
    """Width units the text needs on one line (its longest line)."""
    return max(len(line) for line in str(value).split("\n")) * CHAR_WIDTH + PAD


def _merged(ws) -> set[tuple[int, int]]:
    cells = set()
    for rng in ws.merged_cells.ranges:
        for r in range(rng.min_row, rng.max_row + 1):
            for c in range(rng.min_col, rng.max_col + 1):
                cells.add((r, c))
    return cells


#: text up to this many characters (a status word, a unit, a short label) widens its column
#: rather than wrapping
SHORT_TEXT = 24


def overflowing_cells(ws) -> list:
    """Text cells (not merged, no wrap, not formulas) wider than their column that would be
    cut or run into the next cell: short texts (a status word on a filled cell is clipped at
    its edge) and longer texts with a filled right neighbour."""
    merged, out = _merged(ws), []
    for row in ws.iter_rows():
        for c in row:
            text_cell = isinstance(c.value, str) and not c.value.startswith("=")
            if not text_cell or (c.row, c.column) in merged:
                continue
            if c.alignment.wrap_text or text_width(c.value) <= _width(ws, c.column):
                continue
            short = len(c.value) <= SHORT_TEXT and "\n" not in c.value
            if short or ws.cell(c.row, c.column + 1).value is not None:
                out.append(c)
    return out


def short_rows(ws, cell) -> bool:
    """True for a cell :func:`fit_text` fits by widening its column."""
    return len(cell.value) <= SHORT_TEXT and "\n" not in cell.value


def wrapped_lines(ws, cell) -> int:
    """Lines a wrapped text cell takes in its column (words kept whole)."""
    import math  # lazy: only the fitting needs it

    width = max(_width(ws, cell.column) - PAD, LINE_CHAR_WIDTH)
    per_line = max(int(width / LINE_CHAR_WIDTH), 1)
    lines = 0
    for part in str(cell.value).split("\n"):
        n, used = 1, 0
        for word in part.split():
            need = len(word) + (1 if used else 0)
            if used and used + need > per_line:
                n, used = n + 1, len(word)
            else:
                used += need
        lines += max(n, math.ceil(len(part) / per_line) if " " not in part else n)
    return max(lines, 1)


def fit_text(ws) -> None:
    """Wrap every text cell that would run into its filled neighbour (raising its row to the
    lines it needs), and indent text that follows a number so the two do not touch."""
    from copy import copy  # lazy: only the fitting needs it

    from openpyxl.utils import get_column_letter  # lazy: only the fitting needs it

    for c in overflowing_cells(ws):
        if short_rows(ws, c):
            dim = ws.column_dimensions[get_column_letter(c.column)]
            dim.width = max(_width(ws, c.column), text_width(c.value))
            continue
        al = copy(c.alignment)
        al.wrap_text = True
        al.vertical = al.vertical or "center"
        c.alignment = al
    merged = _merged(ws)
    for row in ws.iter_rows():  # every wrapped cell's row tall enough for its lines
        for c in row:
            if (
                isinstance(c.value, str)
                and not c.value.startswith("=")
                and c.alignment.wrap_text
                and (c.row, c.column) not in merged
            ):
                need = wrapped_lines(ws, c) * LINE_HEIGHT + 1.5
                dim = ws.row_dimensions[c.row]
                if need > (dim.height or ROW_HEIGHT):
                    dim.height = need
    merged = _merged(ws)
    for row in ws.iter_rows(min_col=2):
        for c in row:
            if not isinstance(c.value, str) or (c.row, c.column) in merged:
                continue
            left = ws.cell(c.row, c.column - 1).value
            if isinstance(left, int | float) and not isinstance(left, bool):
                if c.alignment.horizontal in (None, "general", "left") and not c.alignment.indent:
                    al = copy(c.alignment)
                    al.indent = 1
                    c.alignment = al


#: Audit column widths for print: wide enough for a number in SI with its exponent, narrow
#: enough that fit-to-width keeps ~7-pt text (the long texts wrap instead)
AUDIT_MAX_WIDTH = 22.0
AUDIT_WIDE_COLUMNS = {"F": 34.0}


def audit_print_layout(ws) -> None:
    """Legible print of the Audit sheet: columns capped (:data:`AUDIT_MAX_WIDTH`) and every
    text longer than its column wrapped (rows raised by :func:`fit_text`)."""
    from copy import copy  # lazy: only the fitting needs it

    from openpyxl.utils import get_column_letter  # lazy: only the fitting needs it

    for col in range(1, ws.max_column + 1):
        letter = get_column_letter(col)
        cap = AUDIT_WIDE_COLUMNS.get(letter, AUDIT_MAX_WIDTH)
        dim = ws.column_dimensions[letter]
        dim.width = min(_width(ws, col), cap)
    merged = _merged(ws)
    for row in ws.iter_rows():
        for c in row:
            text_cell = isinstance(c.value, str) and not c.value.startswith("=")
            heading_cell = c.style in ("bf_title", "bf_section")
            if text_cell and not heading_cell and (c.row, c.column) not in merged:
                if not c.alignment.wrap_text and text_width(c.value) > _width(ws, c.column):
                    al = copy(c.alignment)
                    al.wrap_text = True
                    al.vertical = "top"
                    c.alignment = al
