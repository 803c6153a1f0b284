"""The input workbook's writer: a case document as ``§`` blocks on worksheets.

Used for the input template (``workbooks/build_input_template.py``) and the report's
``Inputs`` sheet (the case echoed so that the report reads back as the same case).  The block
layout is :mod:`addin.workbook_layout`; the reader is :mod:`addin.workbook_input`.  Text is
written as text, never as a formula (:func:`addin.xlsx_cells.put`).
"""

from __future__ import annotations

from typing import NamedTuple

from openpyxl.utils import get_column_letter

from addin.workbook_layout import BLOCKS, MARK, Block, unit_labels
from addin.xlsx_cells import add_styles, put, set_widths

__all__ = [
    "TEMPLATE_SHEETS",
    "page_setup",
    "write_block",
    "write_case_sheets",
]


def _flatten(value, prefix: str = "") -> list[tuple[str, object]]:
    """Nested dict → [(dotted key, leaf)], lists of scalars kept whole."""
    out = []
    if isinstance(value, dict):
        for k, v in value.items():
            out.extend(_flatten(v, f"{prefix}.{k}" if prefix else str(k)))
    else:
        out.append((prefix, value))
    return out


def _split_unit(v):
    """``"2.6 sg"`` → (2.6, "sg"); numbers and plain text unchanged (unit None)."""
    if isinstance(v, str):
        head, _, tail = v.strip().partition(" ")
        try:
            return float(head), tail.strip() or None
        except ValueError:
            return v, None
    return v, None


class _Styles(NamedTuple):
    """The cell styles of a block's rows."""

    head: str
    unit: str
    cell: str
    input: str
    note: str


_STYLED = _Styles("bf_head", "bf_unit", "bf_cell", "bf_input", "bf_note")
_PLAIN = _Styles(*("Normal",) * 5)


def write_block(ws, row: int, block: Block, data, unit_of, *, styles=True) -> int:
    """Write one block at ``row`` (title, rows); returns the row after the block's blank line.

    ``data`` is the block's part of a case document (dict, list of dicts, or dict of arrays).
    Text is written as text (never a formula).
    """
    st = _STYLED if styles else _PLAIN
    put(ws, row, 1, f"{MARK} {block.key}  {block.title}", "bf_section" if styles else "Normal")
    row += 1
    if block.kind == "values":
        row = _values_rows(ws, row, block, data, unit_of, st)
    elif block.kind == "table":
        row = _table_rows(ws, row, block, data, unit_of, st)
    elif block.kind == "columns":
        row = _columns_rows(ws, row, block, data, unit_of, st)
    if block.note:
        put(ws, row, 1, block.note, st.note)
        row += 1
    return row + 1


def _values_rows(ws, row, block, data, unit_of, st: _Styles) -> int:
    """A values block: one row per key (label, key, unit, value or values); the known keys
    first in the layout's order, then any others.  Returns the next row."""
    items = _flatten(data or {})
    known = [f.key for f in block.fields if "*" not in f.key]
    order = [k for k in known if any(i[0] == k for i in items)]
    order += [k for k, _ in items if k not in order]
    flat = dict(items)
    for key in order:
        f = block.lookup(key, f"{block.key}.{key}")
        val = flat[key]
        vals = val if isinstance(val, list) else [val]
        unit = unit_of(f.kind) or ""
        split = [_split_unit(v) for v in vals]
        own = {u for _, u in split if u}
        if len(own) == 1:
            unit = own.pop()
            vals = [v for v, _ in split]
        put(ws, row, 1, f.label, st.cell)
        put(ws, row, 2, key, st.note)
        put(ws, row, 3, unit, st.unit)
        for j, v in enumerate(vals):
            _put_value(ws, row, 4 + j, v, st.input)
        row += 1
    return row


def _table_records(block, data) -> tuple[list[str], list[dict]]:
    """A table block's column keys and its rows as records, from any of its three shapes: a
    dict of arrays, a dict holding a list of rows (``block.rows_key``), or a list of dicts."""
    if block.arrays:
        keys = [f.key for f in block.fields if f.key in (data or {})]
        n = max((len(data[k]) for k in keys), default=0)
        records = [{k: data[k][i] if i < len(data[k]) else None for k in keys} for i in range(n)]
    elif block.rows_key:
        keys = [f.key for f in block.fields]
        records = [dict(zip(keys, r, strict=False)) for r in (data or {}).get(block.rows_key, [])]
    else:
        records = [dict(_flatten(r)) for r in (data or [])]
        keys = [f.key for f in block.fields if any(f.key in r for r in records)]
        keys += [k for r in records for k in r if k not in keys]
    return keys, records


def _table_rows(ws, row, block, data, unit_of, st: _Styles) -> int:
    """A table block: a key row, a unit row, then one row per item.  Returns the next row."""
    keys, records = _table_records(block, data)
    for j, k in enumerate(keys):
        f = block.lookup(k, f"{block.key}.{k}")
        put(ws, row, 1 + j, k, st.head)
        put(ws, row + 1, 1 + j, unit_of(f.kind) or "", st.unit)
    row += 2
    for rec in records:
        for j, k in enumerate(keys):
            v, u = _split_unit(rec.get(k))
            if u:  # a per-value unit that differs from the column's: keep it as text
                v = rec.get(k)
            _put_value(ws, row, 1 + j, v, st.input)
        row += 1
    return row


def _column_keys(block, records) -> list[str]:
    """The row keys of a columns block: the layout's known keys that any record has (an
    indexed key ``name[i]`` when a record holds a list ``name``), then the records' others."""
    known = [f.key for f in block.fields if "*" not in f.key]
    order = []
    for k in known:
        if any(k in r for r in records):
            order.append(k)
        elif k.endswith("]") and any(isinstance(r.get(k.split("[")[0]), list) for r in records):
            order.append(k)
    extra = [
        k
        for r in records
        for k in r
        if k not in order and k.split("[")[0] not in {o.split("[")[0] for o in order}
    ]
    for k in extra:
        if k not in order:
            order.append(k)
    return order


def _columns_rows(ws, row, block, data, unit_of, st: _Styles) -> int:
    """A columns block: one row per key (label, key, unit), one column per record (D, E, ...).
    Returns the next row."""
    records = [dict(_flatten(r)) for r in (data or [])]
    for key in _column_keys(block, records):
        f = block.lookup(key, f"{block.key}.{key}")
        base, idx = key[:-1].split("[", 1) if key.endswith("]") else (key, None)
        put(ws, row, 1, f.label, st.cell)
        put(ws, row, 2, key, st.note)
        put(ws, row, 3, unit_of(f.kind) or "", st.unit)
        for j, rec in enumerate(records):
            v = rec.get(base)
            if idx is not None:
                v = v[int(idx)] if isinstance(v, list) and int(idx) < len(v) else None
            _put_value(ws, row, 4 + j, v, st.input)
        row += 1
    return row


def _put_value(ws, row, col, v, style):
    if isinstance(v, bool):
        cell = ws.cell(row=row, column=col, value=v)
        cell.style = style
    elif isinstance(v, int | float):
        cell = ws.cell(row=row, column=col, value=v)
        cell.style = style
    elif v is None:
        ws.cell(row=row, column=col).style = style
    else:
        put(ws, row, col, str(v), style)


#: How the template spreads the blocks over sheets.
_WELL_BLOCKS = ("case", "limits", "open_hole", "casing", "survey", "pressure_window", "weak_point")
TEMPLATE_SHEETS: dict[str, tuple[str, ...]] = {
    "Well": (*_WELL_BLOCKS, "temperature"),
    "Rig and string": ("pump", "surface_line", "bit", "string", "tool_pressure"),
    "Mud checks": ("check",),
    "Plans": ("trip", "slurry", "slurry_line", "cement_job"),
}


def write_case_sheets(wb, doc: dict, sheets: dict[str, tuple[str, ...]] | None = None) -> None:
    """Write a case document's blocks onto sheets of ``wb`` (created as needed)."""
    add_styles(wb)
    system = str(doc.get("case", {}).get("units", "oilfield")).strip().lower()
    unit_of = unit_labels(system)
    for title, keys in (sheets or TEMPLATE_SHEETS).items():
        ws = wb[title] if title in wb.sheetnames else wb.create_sheet(title)
        row = ws.max_row + 2 if ws.max_row > 1 else 1
        for key in keys:
            if key in doc:
                row = write_block(ws, row, BLOCKS[key], doc[key], unit_of)
        set_widths(ws, [30, 22, 12] + [14] * 10)


def page_setup(ws, title: str, *, header_rows: str | None = None, footer: str = "") -> None:
    """Print set-up of a generated worksheet: print area = the used range, A4, fit to one page
    wide (as many pages tall as needed), landscape where wider than 8 columns, ``header_rows``
    (e.g. "1:1") repeated on every page, the title and sheet name in the header, page numbers
    in the footer."""
    last = ws.max_column
    ws.print_area = f"A1:{get_column_letter(last)}{max(ws.max_row, 1)}"
    ws.page_setup.paperSize = ws.PAPERSIZE_A4
    ws.page_setup.orientation = "landscape" if last > 8 else "portrait"
    ws.page_setup.fitToWidth = 1
    ws.page_setup.fitToHeight = 0
    ws.sheet_properties.pageSetUpPr.fitToPage = True
    ws.page_margins.left = ws.page_margins.right = 0.4
    ws.page_margins.top = ws.page_margins.bottom = 0.7
    if header_rows:
        ws.print_title_rows = header_rows
    ws.oddHeader.left.text = title.replace("&", "&&")
    ws.oddHeader.left.size = 8
    ws.oddHeader.right.text = "&A"
    ws.oddHeader.right.size = 8
    ws.oddFooter.left.text = footer.replace("&", "&&")
    ws.oddFooter.left.size = 7
    ws.oddFooter.right.text = "page &P of &N"
    ws.oddFooter.right.size = 7
