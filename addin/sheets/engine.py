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
import math
import os
import re
import zipfile
from collections.abc import Callable, Iterable
from dataclasses import dataclass
from typing import Any

import numpy as np
from openpyxl.utils.cell import column_index_from_string as col_index
from openpyxl.utils.cell import coordinate_from_string, get_column_letter
from openpyxl.utils.exceptions import CellCoordinatesException

import addin.sheets.functions  # noqa: F401  (defines every family)
from addin.sheets.framework import FUNCTIONS
from addin.workbook_input import MAIN_NS, REL_NS, sheet_parts

__all__ = [
    "ERROR_VALUES",
    "FORMULA_SHEET",
    "Stored",
    "calculate",
    "register",
    "stamp_sheet",
    "store_values",
]


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
        try:
            col_letter, row0 = coordinate_from_string(first)
        except (ValueError, CellCoordinatesException):  # not a cell (seen: a node "#REF!")
            continue
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


# ------------------------------------------------------------------ values stored in the file
#: Error results a spreadsheet stores as an error cell (``t="e"``), not as text.
ERROR_VALUES = ("#NULL!", "#DIV/0!", "#VALUE!", "#REF!", "#NAME?", "#NUM!", "#N/A")

_BAD_XML_CHARS = re.compile("[\x00-\x08\x0b\x0c\x0e-\x1f\ufffe\uffff]")


def _xml_text(text: str) -> str:
    text = _BAD_XML_CHARS.sub("\ufffd", text)
    return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")


def _cached(value) -> tuple[str | None, str]:
    """(``t`` attribute or None for a number, ``<v>`` text) of a computed value."""
    if isinstance(value, bool):
        return "b", "1" if value else "0"
    if isinstance(value, int | float):
        if not math.isfinite(value):
            return "e", "#NUM!"
        return None, repr(float(value)) if isinstance(value, float) else str(value)
    text = str(value)
    if text in ERROR_VALUES:
        return "e", text
    return "str", _xml_text(text)


def _cell_re(p: str) -> re.Pattern:
    return re.compile(rf"<{p}c\b(?P<a>[^>]*?)(?:/>|>(?P<b>.*?)</{p}c>)", re.S)


def _row_re(p: str) -> re.Pattern:
    return re.compile(rf"<{p}row\b(?P<a>[^>]*?)(?:/>|>(?P<b>.*?)</{p}row>)", re.S)


def _attr(attrs: str, name: str) -> str | None:
    m = re.search(rf'\s{name}="([^"]*)"', attrs)
    return m.group(1) if m else None


def _set_attr(attrs: str, name: str, value: str | None) -> str:
    attrs = re.sub(rf'\s{name}="[^"]*"', "", attrs)
    return attrs if value is None else f'{attrs} {name}="{value}"'


def _range_cells(ref: str) -> list[str]:
    first, _, last = ref.partition(":")
    c0, r0 = coordinate_from_string(first)
    c1, r1 = coordinate_from_string(last or first)
    return [
        f"{get_column_letter(c)}{r}"
        for r in range(r0, r1 + 1)
        for c in range(col_index(c0), col_index(c1) + 1)
    ]


def stamp_sheet(
    xml: str, values: dict[str, Any], *, keep_arrays: bool = False
) -> tuple[str, int, list[tuple[str, str]]]:
    """A worksheet's XML with the computed value stored in every formula cell.

    ``values`` maps ``"B7"`` to the computed value.  Formulas are kept; each formula cell gets
    its ``<v>`` (and ``t``: ``str`` text, ``b`` logical, ``e`` error), and the other cells of
    an array formula's range get their value (added where the file had no such cell).
    LibreOffice recomputes array formulas on opening whatever value is stored (it keeps the
    stored value of an ordinary formula), so unless ``keep_arrays`` an array formula is
    replaced by its values and returned as ``(range, formula text as stored in the XML)``.
    Everything else in the XML is left byte for byte.

    Returns (xml, cells given a value, array formulas replaced by values).
    """
    root = re.search(r"<(\w+:)?worksheet\b", xml)
    p = (root.group(1) or "") if root else ""
    cell_re, row_re = _cell_re(p), _row_re(p)
    array_cells: set[str] = set()
    for m in cell_re.finditer(xml):
        f = re.search(rf"<{p}f\b([^>]*)", m.group("b") or "")
        if f and _attr(f.group(1), "t") == "array" and _attr(f.group(1), "ref"):
            array_cells.update(_range_cells(_attr(f.group(1), "ref"))[1:])
    count = 0
    replaced: list[tuple[str, str]] = []

    def value_xml(attrs: str, keep: str, value) -> str:
        t, v = _cached(value)
        return f"<{p}c{_set_attr(attrs, 't', t)}>{keep}<{p}v>{v}</{p}v></{p}c>"

    def on_cell(m: re.Match) -> str:
        nonlocal count
        attrs, body = m.group("a"), m.group("b") or ""
        ref = _attr(attrs, "r")
        f = re.search(rf"<{p}f\b[^>]*/>|<{p}f\b([^>]*)>(.*?)</{p}f>", body, re.S)
        if ref is None or ref not in values or values[ref] is None:
            return m.group(0)
        if f is None and ref not in array_cells:
            return m.group(0)
        array_cells.discard(ref)
        count += 1
        keep = f.group(0) if f else ""
        if f is not None and f.group(1) is not None and _attr(f.group(1), "t") == "array":
            if not keep_arrays:
                replaced.append((_attr(f.group(1), "ref") or ref, f.group(2)))
                keep = ""
        return value_xml(attrs, keep, values[ref])

    xml = cell_re.sub(on_cell, xml)
    missing: dict[int, list[tuple[int, str]]] = {}
    for ref in array_cells:  # cells of an array range the file does not hold yet
        if values.get(ref) is None:
            continue
        col, row = coordinate_from_string(ref)
        missing.setdefault(row, []).append(
            (col_index(col), value_xml(f' r="{ref}"', "", values[ref]))
        )
        count += 1
    if not missing:
        return xml, count, replaced

    def cells_of(body: str) -> list[tuple[int, str]]:
        out = []
        for m in cell_re.finditer(body):
            col, _ = coordinate_from_string(_attr(m.group("a"), "r") or "A1")
            out.append((col_index(col), m.group(0)))
        return out

    def on_row(m: re.Match) -> str:
        r = int(_attr(m.group("a"), "r") or 0)
        if r not in missing:
            return m.group(0)
        cells = sorted(cells_of(m.group("b") or "") + missing.pop(r))
        attrs = _set_attr(m.group("a"), "spans", None)
        return f"<{p}row{attrs}>{''.join(c for _, c in cells)}</{p}row>"

    data = re.search(rf"<{p}sheetData\b[^>]*?(?:/>|>(?P<b>.*?)</{p}sheetData>)", xml, re.S)
    if data is None:
        return xml, count, replaced
    body = row_re.sub(on_row, data.group("b") or "")
    rows = [(int(_attr(m.group("a"), "r") or 0), m.group(0)) for m in row_re.finditer(body)]
    for r, cells in missing.items():
        rows.append((r, f'<{p}row r="{r}">{"".join(c for _, c in sorted(cells))}</{p}row>'))
    rows.sort(key=lambda rc: rc[0])
    new = f"<{p}sheetData>{''.join(x for _, x in rows)}</{p}sheetData>"
    return xml[: data.start()] + new + xml[data.end() :], count, replaced


@dataclass(frozen=True)
class Stored:
    """What :func:`store_values` did: cells given a value, and the array formulas it replaced
    by their values (sheet, range, formula text), listed on the sheet named ``formula_sheet``."""

    cells: int
    arrays: tuple[tuple[str, str, str], ...]
    formula_sheet: str | None
    #: parts not copied: a VBA project (macros) and external links
    dropped: tuple[str, ...] = ()


#: Title of the sheet that lists the array formulas replaced by values.
FORMULA_SHEET = "BF array formulas"

_WORKSHEET_TYPE = "application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"
_WORKSHEET_REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet"


def _formula_sheet_xml(arrays) -> str:
    def cell(ref, text):
        return f'<c r="{ref}" t="inlineStr"><is><t xml:space="preserve">{text}</t></is></c>'

    rows = [
        (
            "Array formulas of this workbook, stored as their values by `boreflow sheets "
            "compute` (LibreOffice recomputes array formulas on opening, and cannot compute "
            "the BF_ functions). To make one live again (Windows Excel with the functions "
            "imported): select the range, type = and the formula, press Ctrl+Shift+Enter.",
            None,
            None,
        ),
        ("sheet", "range", "formula"),
        *arrays,
    ]
    body = "".join(
        f'<row r="{i}">'
        + "".join(
            cell(f"{col}{i}", _xml_text(v) if i <= 2 else (v if col == "C" else _xml_text(v)))
            for col, v in zip("ABC", row, strict=True)
            if v is not None
        )
        + "</row>"
        for i, row in enumerate(rows, start=1)
    )
    return (
        '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>'
        f'<worksheet xmlns="{MAIN_NS}"><cols><col min="1" max="2" width="20" customWidth="1"/>'
        '<col min="3" max="3" width="90" customWidth="1"/></cols>'
        f"<sheetData>{body}</sheetData></worksheet>"
    )


def _add_sheet(members: dict[str, bytes], title: str, xml: str) -> None:
    """Add a worksheet part (workbook.xml, its relations and the content types updated)."""
    n = 1
    while f"xl/worksheets/sheet{n}.xml" in members:
        n += 1
    part = f"xl/worksheets/sheet{n}.xml"
    members[part] = xml.encode("utf-8")
    ct = members["[Content_Types].xml"].decode("utf-8")
    members["[Content_Types].xml"] = ct.replace(
        "</Types>", f'<Override PartName="/{part}" ContentType="{_WORKSHEET_TYPE}"/></Types>'
    ).encode("utf-8")
    rels = members["xl/_rels/workbook.xml.rels"].decode("utf-8")
    rid = "rIdBF1"
    while f'"{rid}"' in rels:
        rid += "x"
    members["xl/_rels/workbook.xml.rels"] = rels.replace(
        "</Relationships>",
        f'<Relationship Id="{rid}" Type="{_WORKSHEET_REL}" Target="worksheets/sheet{n}.xml"/>'
        "</Relationships>",
    ).encode("utf-8")
    book = members["xl/workbook.xml"].decode("utf-8")
    root = re.search(r"<(\w+:)?workbook\b", book)
    p = (root.group(1) or "") if root else ""
    r = re.search(rf'xmlns:(\w+)="{re.escape(REL_NS)}"', book)
    rp = r.group(1) if r else "r"
    ids = [int(x) for x in re.findall(r'\ssheetId="(\d+)"', book)] or [0]
    decl = "" if r else f' xmlns:r="{REL_NS}"'
    entry = f'<{p}sheet name="{_xml_text(title)}" sheetId="{max(ids) + 1}"{decl} {rp}:id="{rid}"/>'
    members["xl/workbook.xml"] = book.replace(f"</{p}sheets>", entry + f"</{p}sheets>", 1).encode(
        "utf-8"
    )


_MACRO_MAIN = b"application/vnd.ms-excel.sheet.macroEnabled.main+xml"
_PLAIN_MAIN = b"application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"


def _dropped_part(name: str) -> bool:
    low = name.lower()
    return low.startswith(("xl/vbaproject", "xl/externallinks/")) or (
        low.endswith(".bin") and ("vba" in low)
    )


def _drop_macros_and_links(members: dict[str, bytes]) -> tuple[str, ...]:
    """Remove a VBA project and external links from the package (the copy never carries
    macros or links to other files), with their relations and content types."""
    gone = tuple(n for n in members if _dropped_part(n))
    for n in gone:
        del members[n]
    if not gone:
        return gone
    for name in list(members):
        if name.endswith(".rels"):
            text = members[name].decode("utf-8")
            text = re.sub(
                r"<Relationship\b[^>]*Target=\"[^\"]*(?:vbaProject|externalLink)[^\"]*\"[^>]*/>",
                "",
                text,
                flags=re.I,
            )
            members[name] = text.encode("utf-8")
    ct = members["[Content_Types].xml"].replace(_MACRO_MAIN, _PLAIN_MAIN)
    ct = re.sub(
        rb'<Override\b[^>]*PartName="/xl/(?:vbaProject|externalLinks/)[^"]*"[^>]*/>', b"", ct
    )
    members["[Content_Types].xml"] = ct
    members["xl/workbook.xml"] = re.sub(
        rb"<(\w+:)?externalReferences\b.*?</(\w+:)?externalReferences>|<(\w+:)?externalReferences\s*/>",
        b"",
        members["xl/workbook.xml"],
        flags=re.S,
    )
    return gone


def store_values(
    src: str | os.PathLike, dst: str | os.PathLike, values, *, keep_arrays: bool = False
) -> Stored:
    """Copy workbook ``src`` to ``dst`` with the computed ``values`` stored in its cells.

    ``values`` is the result of :func:`calculate`.  Every member of the package is copied
    unchanged except the worksheets (formula cells get their cached value, see
    :func:`stamp_sheet`) and ``xl/workbook.xml``, whose ``fullCalcOnLoad`` flag is dropped so
    a program that cannot compute the functions shows the stored values.  Array formulas
    replaced by values (unless ``keep_arrays``) are listed on an added sheet
    (:data:`FORMULA_SHEET`).  openpyxl cannot write a formula together with its value
    (it writes an empty ``<v/>``), hence this copy at the XML level.  A VBA project
    (macros) and external links are not copied (:attr:`Stored.dropped`).
    """
    by_sheet: dict[str, dict[str, Any]] = {}
    for (sheet, ref), v in values.items():
        by_sheet.setdefault(sheet.upper(), {})[ref] = v
    total = 0
    arrays: list[tuple[str, str, str]] = []
    with zipfile.ZipFile(src) as zin:
        infos = {i.filename: i for i in zin.infolist()}
        members = {n: zin.read(i) for n, i in infos.items()}
        parts = {part: name for name, part in sheet_parts(zin).items()}
    for name, data in list(members.items()):
        if name in parts:
            xml, n, replaced = stamp_sheet(
                data.decode("utf-8"), by_sheet.get(parts[name].upper(), {}), keep_arrays=keep_arrays
            )
            members[name] = xml.encode("utf-8")
            total += n
            arrays += [(parts[name], ref, text) for ref, text in replaced]
        elif name == "xl/workbook.xml":
            members[name] = re.sub(rb'\sfullCalcOnLoad="(?:1|true)"', b"", data)
    dropped = _drop_macros_and_links(members)
    sheet = None
    if arrays:
        taken = {n.upper() for n in parts.values()}
        sheet, k = FORMULA_SHEET, 2
        while sheet.upper() in taken:
            sheet, k = f"{FORMULA_SHEET} {k}", k + 1
        _add_sheet(members, sheet, _formula_sheet_xml(arrays))
    with zipfile.ZipFile(dst, "w", zipfile.ZIP_DEFLATED) as zout:
        for name, data in members.items():  # same member dates as the input (added: 1980)
            info = infos.get(name) or zipfile.ZipInfo(name, date_time=(1980, 1, 1, 0, 0, 0))
            zout.writestr(info, data, compress_type=zipfile.ZIP_DEFLATED)
    return Stored(total, tuple(arrays), sheet, dropped)
