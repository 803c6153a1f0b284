"""The input workbook's reader: safe opening, and the ``§`` blocks read into a case document.

The block layout is :mod:`addin.workbook_layout`; the writer is :mod:`addin.workbook_template`.

Safety (a workbook from e-mail is untrusted input)
    * the file must be a zip archive of modest size; the summed uncompressed size, the number of
      members and each member's compression ratio are limited before any XML is parsed
      (zip-bomb guard);
    * XML is parsed by openpyxl through ``defusedxml`` (entity-expansion and external-entity
      attacks refused); we refuse to open workbooks at all if defusedxml is missing;
    * macros are never run: openpyxl does not execute anything, and ``keep_vba=False`` drops any
      VBA project; external links are not followed (``keep_links=False``);
    * cells are read as stored values (``data_only=True``); formulas are not evaluated, and a
      formula cell without a stored value is reported, not guessed;
    * the number of sheets and of cells read is limited; the cells a sheet stores are counted
      in its XML before openpyxl loads it (a sheet of millions of cells in one row is refused
      in a second, not read for half a minute);
    * the ``<dimension>`` tag a file declares is not trusted: the reader resets it and reads
      every row the sheet holds (read-only openpyxl would otherwise stop at the declared range
      and silently drop the rest);
    * a sheet whose XML is broken (invalid characters, undefined entities) or a cell holding a
      non-finite number is refused naming the sheet and the last cell read.
"""

from __future__ import annotations

import difflib
import math
import re
import zipfile
from dataclasses import dataclass
from pathlib import Path

import openpyxl
import openpyxl.xml
from openpyxl.utils import get_column_letter

from addin.workbook_layout import BLOCKS, MARK, Block, WorkbookError, unit_labels
from calc.units import UNIT_SYSTEMS

__all__ = [
    "MAIN_NS",
    "REL_NS",
    "Limits",
    "check_workbook",
    "count_stored_cells",
    "open_workbook_safely",
    "read_blocks",
    "sheet_parts",
]


@dataclass(frozen=True)
class Limits:
    """Size limits for untrusted workbooks (defaults suit any real daily input)."""

    max_file_bytes: int = 20 * 2**20
    max_uncompressed_bytes: int = 200 * 2**20
    max_members: int = 2000
    max_ratio: float = 200.0
    max_sheets: int = 40
    max_cells: int = 200_000
    max_rows: int = 5000
    max_cols: int = 60
    #: cells stored in all sheets' XML together (counted before loading; see
    #: :func:`count_stored_cells`)
    max_stored_cells: int = 1_000_000


# ---------------------------------------------------------------------------- safe opening


def _check_zip(path: Path, lim: Limits) -> None:
    size = path.stat().st_size
    if size > lim.max_file_bytes:
        raise WorkbookError(str(path), f"{size} bytes", f"at most {lim.max_file_bytes} bytes")
    if not zipfile.is_zipfile(path):
        raise WorkbookError(
            str(path), "not a zip archive", "an .xlsx workbook (Office Open XML)", "not a workbook"
        )
    try:
        with zipfile.ZipFile(path) as z:
            infos = z.infolist()
    except (zipfile.BadZipFile, OSError) as exc:
        raise WorkbookError(str(path), str(exc), "a readable .xlsx", "damaged") from exc
    if len(infos) > lim.max_members:
        raise WorkbookError(str(path), f"{len(infos)} parts", f"at most {lim.max_members}")
    total = 0
    for info in infos:
        total += info.file_size
        ratio = info.file_size / max(info.compress_size, 1)
        if info.file_size > 1_000_000 and ratio > lim.max_ratio:
            raise WorkbookError(
                f"{path} part {info.filename}",
                f"compression ratio {ratio:.0f}",
                f"at most {lim.max_ratio:.0f} (zip-bomb guard)",
                "suspicious",
            )
    if total > lim.max_uncompressed_bytes:
        raise WorkbookError(
            str(path),
            f"{total} bytes uncompressed",
            f"at most {lim.max_uncompressed_bytes} (zip-bomb guard)",
            "too large",
        )
    names = {i.filename for i in infos}
    if "xl/workbook.xml" not in names:
        raise WorkbookError(
            str(path), "no xl/workbook.xml", "an .xlsx workbook (Office Open XML)", "not a workbook"
        )


MAIN_NS = "http://schemas.openxmlformats.org/spreadsheetml/2006/main"
REL_NS = "http://schemas.openxmlformats.org/officeDocument/2006/relationships"
PKG_REL_NS = "http://schemas.openxmlformats.org/package/2006/relationships"
_CELL_TAG = re.compile(rb"<(?:\w+:)?c[\s/>]")


def sheet_parts(zf: zipfile.ZipFile) -> dict[str, str]:
    """``{sheet name: zip member of its XML}`` from ``xl/workbook.xml`` and its relations
    (parsed with defusedxml)."""
    # lazy: defusedxml may be absent (open_workbook_safely refuses then, with a clear error)
    from defusedxml.ElementTree import fromstring

    book = fromstring(zf.read("xl/workbook.xml"))
    try:
        rels = fromstring(zf.read("xl/_rels/workbook.xml.rels"))
    except KeyError:
        return {}
    target = {r.get("Id"): r.get("Target", "") for r in rels.iter(f"{{{PKG_REL_NS}}}Relationship")}
    out = {}
    for sh in book.iter(f"{{{MAIN_NS}}}sheet"):
        t = target.get(sh.get(f"{{{REL_NS}}}id"), "")
        out[sh.get("name")] = t.lstrip("/") if t.startswith("/") else "xl/" + t
    return out


def count_stored_cells(path, limits: Limits | None = None) -> int:
    """The number of cells the sheets of an .xlsx store (``<c>`` elements), counted by
    streaming each sheet's XML; :class:`WorkbookError` naming the sheet once the count passes
    ``limits.max_stored_cells`` (before openpyxl loads anything)."""
    lim = limits or Limits()
    p = Path(path)
    total = 0
    try:
        with zipfile.ZipFile(p) as z:
            names = {part: name for name, part in sheet_parts(z).items()}
            for info in z.infolist():
                if not (
                    info.filename.startswith("xl/worksheets/") and info.filename.endswith(".xml")
                ):
                    continue
                tail = b""
                with z.open(info) as fh:
                    while chunk := fh.read(1 << 20):
                        buf = tail + chunk
                        total += len(_CELL_TAG.findall(buf))
                        tail = buf[-8:] if not _CELL_TAG.search(buf[-8:]) else b""
                        if total > lim.max_stored_cells:
                            sheet = names.get(info.filename, info.filename)
                            raise WorkbookError(
                                f"{p.name}: sheet '{sheet}'",
                                f"more than {lim.max_stored_cells:,} stored cells",
                                f"at most {lim.max_stored_cells:,} cells in the workbook",
                                "too large",
                            )
    except WorkbookError:
        raise
    except Exception as exc:  # damaged zip or hostile workbook.xml
        raise WorkbookError(
            str(p), f"{type(exc).__name__}: {exc}"[:160], "a valid .xlsx", "unreadable"
        ) from exc
    return total


def open_workbook_safely(path, limits: Limits | None = None):
    """Open an untrusted .xlsx for reading values only; raise :class:`WorkbookError` if unsafe.

    Returns an openpyxl workbook in read-only, values-only mode, every sheet's declared
    dimensions reset (so all its rows are read, whatever its ``<dimension>`` tag says).
    """
    lim = limits or Limits()
    p = Path(path)
    if not p.is_file():
        raise WorkbookError(str(p), "missing", "an existing .xlsx file", "not found")
    if not openpyxl.xml.DEFUSEDXML:
        raise WorkbookError(
            str(p), "defusedxml missing", "install defusedxml (a boreflow dependency)", "unsafe"
        )
    _check_zip(p, lim)
    count_stored_cells(p, lim)
    try:
        wb = openpyxl.load_workbook(
            p, read_only=True, data_only=True, keep_vba=False, keep_links=False
        )
    except Exception as exc:  # openpyxl raises many types on damaged or hostile content
        # lazy: defusedxml may be absent (then refused above with a clear error), and importing
        # the reader (so addin.case, for TOML cases) must not need it
        from defusedxml import DefusedXmlException

        chain, e = [], exc
        while e is not None and len(chain) < 10:
            chain.append(e)
            e = e.__cause__ or e.__context__
        hostile = next((c for c in chain if isinstance(c, DefusedXmlException)), None)
        if hostile is not None:
            raise WorkbookError(
                str(p),
                type(hostile).__name__,
                "plain XML without entity or DTD declarations",
                "unreadable (hostile XML refused by defusedxml)",
            ) from exc
        first = str(exc).splitlines()[0][:120] if str(exc) else ""
        raise WorkbookError(
            str(p), f"{type(exc).__name__}: {first}", "a valid .xlsx", "unreadable"
        ) from exc
    if len(wb.sheetnames) > lim.max_sheets:
        wb.close()
        raise WorkbookError(str(p), f"{len(wb.sheetnames)} sheets", f"at most {lim.max_sheets}")
    for ws in wb.worksheets:
        ws.reset_dimensions()  # never trust the file's <dimension> tag (it may understate)
    return wb


# ---------------------------------------------------------------------------- reading


def _grid(ws, name: str, lim: Limits, budget: list[int]) -> list[list]:
    """All cell values of a sheet as a list of rows (bounded)."""
    rows = []
    try:
        for row in _rows(ws, name, lim, budget):
            rows.append(row)
    except WorkbookError:
        raise
    except Exception as exc:  # broken sheet XML: invalid characters, undefined entities, ...
        last = f"row {len(rows) + 1}"  # rows are read in order, gaps included
        first = str(exc).splitlines()[0][:120] if str(exc) else type(exc).__name__
        raise WorkbookError(
            f"{name}: sheet '{ws.title}' {last}",
            first,
            "well-formed sheet XML (no control characters, no undefined entities)",
            "unreadable",
        ) from exc
    return rows


def _rows(ws, name: str, lim: Limits, budget: list[int]):
    for r, row in enumerate(ws.iter_rows(values_only=True), start=1):
        if r > lim.max_rows:
            raise WorkbookError(
                f"{name}: sheet '{ws.title}'",
                f"> {lim.max_rows} rows",
                f"at most {lim.max_rows} rows",
                "too large",
            )
        row = list(row[: lim.max_cols])
        budget[0] += len(row)
        if budget[0] > lim.max_cells:
            raise WorkbookError(
                name, f"> {lim.max_cells} cells", f"at most {lim.max_cells}", "too large"
            )
        for c, v in enumerate(row):
            if isinstance(v, float) and not math.isfinite(v):
                raise WorkbookError(_where(name, ws.title, r - 1, c), v, "a finite number")
        yield row


def check_workbook(path, limits: Limits | None = None) -> int:
    """Open an untrusted .xlsx safely and read every cell of every sheet once (bounded); raise
    :class:`WorkbookError` naming file, sheet and cell on anything broken or too large.
    Returns the number of cells read."""
    lim = limits or Limits()
    name = Path(path).name
    wb = open_workbook_safely(path, lim)
    budget = [0]
    try:
        for ws in wb.worksheets:
            _grid(ws, name, lim, budget)
    finally:
        wb.close()
    return budget[0]


def _empty(v) -> bool:
    return v is None or (isinstance(v, str) and not v.strip())


def _where(name, sheet, r, c) -> str:
    return f"{name}: {sheet}!{get_column_letter(c + 1)}{r + 1}"


def _assign(doc: dict, key: str, value, where: str) -> None:
    """Put ``value`` at dotted ``key`` (``a.b[1]``) into nested dict ``doc``."""
    parts = key.split(".")
    cur = doc
    for p in parts[:-1]:
        nxt = cur.setdefault(p, {})
        if not isinstance(nxt, dict):
            raise WorkbookError(where, key, "each key once", "conflicting key")
        cur = nxt
    last = parts[-1]
    if last.endswith("]") and "[" in last:
        base, idx = last[:-1].split("[", 1)
        if not idx.isdigit():
            raise WorkbookError(where, key, "an index like name[0]", "bad key")
        lst = cur.setdefault(base, [])
        i = int(idx)
        while len(lst) <= i:
            lst.append(None)
        lst[i] = value
    else:
        cur[last] = value


def _with_unit(value, unit, default_unit: str | None):
    if _empty(unit) or isinstance(value, str) or value is None:
        return value
    u = str(unit).strip()
    if default_unit is not None and u == default_unit:
        return value
    if u in ("–", "-", ""):
        return value
    return f"{_num_text(value)} {u}"


def _num_text(v) -> str:
    if isinstance(v, bool):
        return str(v).lower()
    if isinstance(v, float) and v.is_integer():
        return str(int(v))
    return repr(v) if isinstance(v, float) else str(v)


def _clean(v, where):
    if isinstance(v, float) and not math.isfinite(v):
        raise WorkbookError(where, v, "a finite number")
    if isinstance(v, str):
        s = v.strip()
        if s.startswith("#") and s.endswith(("!", "?", "A")):
            raise WorkbookError(where, s, "a number or text (not a spreadsheet error)")
        return s
    if hasattr(v, "isoformat"):  # dates/times typed into cells
        return v.isoformat()
    return v


def read_blocks(
    path, blocks: dict[str, Block] | None = None, unit_of=None, limits: Limits | None = None
):
    """Read every ``§`` block of a workbook into a case document (the same dict as the TOML).

    Parameters
    ----------
    blocks : dict, optional
        block key → :class:`Block`, the layout (default :data:`BLOCKS`).
    unit_of : callable, optional
        ``unit_of(kind) -> str | None``: display label of the default unit of a kind.  Default:
        the unit system the workbook's ``§ case`` block declares (``units``; "oilfield" if none).

    Returns
    -------
    doc : dict
        the case document.
    where : dict
        dotted path (``"check[1].dial.600"``) → ``"file: Sheet!D12"`` for error messages.
    """
    lim = limits or Limits()
    blocks = BLOCKS if blocks is None else blocks
    name = Path(path).name
    wb = open_workbook_safely(path, lim)
    budget = [0]
    try:
        grids = [(ws.title, _grid(ws, name, lim, budget)) for ws in wb.worksheets]
    finally:
        wb.close()
    starts = []
    seen: dict[str, str] = {}
    for title, grid in grids:
        for r, row in enumerate(grid):
            head = row[0] if row else None
            if not (isinstance(head, str) and head.strip().startswith(MARK)):
                continue
            words = head.strip()[len(MARK) :].split()
            key = words[0] if words else ""
            loc = _where(name, title, r, 0)
            if key not in blocks:
                near = difflib.get_close_matches(key, list(blocks), n=1)
                hint = f" (did you mean '{near[0]}'?)" if near else ""
                raise WorkbookError(loc, key, "one of " + ", ".join(blocks) + hint, "unknown block")
            if key in seen:
                raise WorkbookError(loc, key, f"once (first at {seen[key]})", "repeated block")
            seen[key] = loc
            starts.append((key, title, grid, r))
    if not starts:
        raise WorkbookError(
            name, "no blocks", f"sheets with block titles such as '{MARK} case'", "not a case"
        )
    doc: dict = {}
    where: dict[str, str] = {}
    if unit_of is None:
        system = "oilfield"
        for key, title, grid, r in starts:
            if key == "case":
                tmp: dict = {}
                _read_block(grid, r + 1, blocks[key], title, name, lambda k: None, tmp, {})
                system = str(tmp["case"].get("units", "oilfield")).strip().lower()
        if system not in UNIT_SYSTEMS:
            raise WorkbookError(
                where.get("case.units", f"{name}: case.units"), system, ", ".join(UNIT_SYSTEMS)
            )
        unit_of = unit_labels(system)
    for key, title, grid, r in starts:
        _read_block(grid, r + 1, blocks[key], title, name, unit_of, doc, where)
    return doc, where


def _end(grid, r) -> int:
    while r < len(grid) and not all(_empty(v) for v in grid[r]):
        r += 1
    return r


def _read_block(grid, r0, block: Block, sheet, name, unit_of, doc, where) -> int:
    r1 = _end(grid, r0)
    if block.kind == "values":
        rec: dict = {}
        for r in range(r0, r1):
            row = grid[r] + [None] * 4
            key = row[1]
            if _empty(key):
                continue
            key = str(key).strip()
            loc = _where(name, sheet, r, 1)
            f = block.lookup(key, loc)
            vals = [(c, _clean(v, _where(name, sheet, r, c))) for c, v in enumerate(row) if c >= 3]
            vals = [(c, v) for c, v in vals if not _empty(v)]
            if not vals:
                continue
            unit = row[2]
            du = unit_of(f.kind)
            conv = [_with_unit(v, unit, du) for _, v in vals]
            value = conv if f.many or len(conv) > 1 else conv[0]
            _assign(rec, key, value, loc)
            where[f"{block.key}.{key}"] = _where(name, sheet, r, vals[0][0])
        doc[block.key] = rec
    elif block.kind == "table":
        keys = [None if _empty(k) else str(k).strip() for k in grid[r0]]
        units = grid[r0 + 1] if r0 + 1 < r1 else []
        fields = {}
        for c, k in enumerate(keys):
            if k is not None:
                fields[c] = block.lookup(k, _where(name, sheet, r0, c))
        records = []
        for r in range(r0 + 2, r1):
            rec = {}
            for c, f in fields.items():
                v = grid[r][c] if c < len(grid[r]) else None
                loc = _where(name, sheet, r, c)
                v = _clean(v, loc)
                if _empty(v):
                    continue
                u = units[c] if c < len(units) else None
                _assign(rec, keys[c], _with_unit(v, u, unit_of(f.kind)), loc)
                i = len(records)
                if block.arrays:
                    where[f"{block.key}.{keys[c]}[{i}]"] = loc
                elif block.rows_key:
                    where[f"{block.key}.{block.rows_key}[{i}]"] = loc
                else:  # records are numbered from 1, as in the case-file messages
                    where[f"{block.key}[{i + 1}].{keys[c]}"] = loc
            if rec:
                records.append(rec)
        if block.arrays:
            doc[block.key] = {k: [rec.get(k) for rec in records] for k in keys if k is not None}
        elif block.rows_key:
            cols = [k for k in keys if k is not None]
            doc[block.key] = {block.rows_key: [[rec.get(k) for k in cols] for rec in records]}
        else:
            doc[block.key] = records
    elif block.kind == "columns":
        ncol = max((len(grid[r]) for r in range(r0, r1)), default=0)
        records: dict[int, dict] = {}
        for r in range(r0, r1):
            row = grid[r] + [None] * (ncol - len(grid[r]))
            key = row[1]
            if _empty(key):
                continue
            key = str(key).strip()
            f = block.lookup(key, _where(name, sheet, r, 1))
            for c in range(3, ncol):
                v = _clean(row[c], _where(name, sheet, r, c))
                if _empty(v):
                    continue
                rec = records.setdefault(c, {})
                _assign(rec, key, _with_unit(v, row[2], unit_of(f.kind)), _where(name, sheet, r, c))
                where[f"{block.key}[{c - 2}].{key}"] = _where(name, sheet, r, c)
        doc[block.key] = [records[c] for c in sorted(records)]
    else:  # pragma: no cover - layout definition error
        raise ValueError(block.kind)
    return r1
