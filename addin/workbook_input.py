"""The input workbook: safe opening, and the block layout shared by the template and the report.

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
    * the number of sheets and of cells read is limited.

Layout
    Content is organised in *blocks*.  A block starts with a title cell in column A whose text is
    ``"§ <key>"`` followed by a human title (e.g. ``"§ limits  Operating limits"``); the block's
    rows follow until the first empty row.  Three kinds:

    ``values`` (one record)
        rows: description | key | unit | value [| more values …]
    ``table`` (list of records, one per row; or columns of arrays)
        a header row of keys, a units row, then one row per record
    ``columns`` (list of records, one per column — mud checks, slurries)
        rows: description | key | unit | record 1 | record 2 | …

    Sheets are free: a reader finds blocks wherever they are, so the template spreads them over
    several sheets and the report's ``Inputs`` sheet stacks them on one.  A unit cell that differs
    from the case's unit system makes the value ``"<value> <unit>"`` (a per-value unit, exactly
    as a case file allows).  A key written ``name[0]``/``name[1]`` builds a list; a dotted key
    ``dial.600`` builds a nested table.
"""

from __future__ import annotations

import difflib
import math
import zipfile
from dataclasses import dataclass, field
from pathlib import Path

from addin.case_schema import SECTIONS, STATION_COLUMNS
from calc.errors import InputError

__all__ = [
    "Block",
    "Field",
    "Limits",
    "WorkbookError",
    "open_workbook_safely",
    "read_blocks",
    "write_block",
]

MARK = "§"


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


class WorkbookError(InputError):
    """A problem with an input workbook; the message names the file (and sheet and cell)."""

    def __init__(self, where: str, value, allowed: str, problem: str = "not allowed"):
        super().__init__(where, value, allowed, problem)


@dataclass(frozen=True)
class Field:
    """One key of a block: ``key`` (dotted, ``[i]`` for list items), description, unit kind."""

    key: str
    label: str
    kind: str = "dimensionless"  # calc.units quantity kind; "text" for words; "flag" for true/false
    many: bool = False  # a list of values (several cells in a values block)


@dataclass(frozen=True)
class Block:
    """A block of the layout: case key, title, kind (values/table/columns) and its fields."""

    key: str
    title: str
    kind: str
    fields: tuple[Field, ...]
    #: for kind "table": True if the TOML is a dict of arrays (e.g. pressure_window), False if a
    #: list of records (e.g. [[casing]]); "survey.stations"-style keys hold a list of rows
    arrays: bool = False
    rows_key: str | None = None
    note: str = ""
    by_key: dict = field(default_factory=dict, compare=False, repr=False)

    def __post_init__(self):
        self.by_key.update({f.key: f for f in self.fields})


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


def open_workbook_safely(path, limits: Limits | None = None):
    """Open an untrusted .xlsx for reading values only; raise :class:`WorkbookError` if unsafe.

    Returns an openpyxl workbook in read-only, values-only mode.
    """
    import openpyxl
    import openpyxl.xml

    lim = limits or Limits()
    p = Path(path)
    if not p.is_file():
        raise WorkbookError(str(p), "missing", "an existing .xlsx file", "not found")
    if not openpyxl.xml.DEFUSEDXML:
        raise WorkbookError(
            str(p), "defusedxml missing", "install defusedxml (a boreflow dependency)", "unsafe"
        )
    _check_zip(p, lim)
    try:
        wb = openpyxl.load_workbook(
            p, read_only=True, data_only=True, keep_vba=False, keep_links=False
        )
    except Exception as exc:  # openpyxl raises many types on damaged or hostile content
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
    return wb


# ---------------------------------------------------------------------------- reading


def _grid(ws, name: str, lim: Limits, budget: list[int]) -> list[list]:
    """All cell values of a sheet as a list of rows (bounded)."""
    rows = []
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
        rows.append(row)
    return rows


def _empty(v) -> bool:
    return v is None or (isinstance(v, str) and not v.strip())


def _where(name, sheet, r, c) -> str:
    from openpyxl.utils import get_column_letter

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
        from calc.units import UNIT_SYSTEMS

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


def _field(block: Block, key, loc):
    base = key.split("[")[0]
    f = block.by_key.get(key) or block.by_key.get(base)
    if f is None:
        # dotted keys with free sub-keys (dial.<rpm>, properties.<name>): match by prefix
        pre = base.split(".")[0]
        f = block.by_key.get(pre + ".*")
    if f is None:
        near = difflib.get_close_matches(key, [k for k in block.by_key if "*" not in k], n=1)
        hint = f" (did you mean '{near[0]}'?)" if near else ""
        raise WorkbookError(loc, key, f"a key of block '{block.key}'{hint}", "unknown key")
    return f


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
            f = _field(block, key, loc)
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
                fields[c] = _field(block, k, _where(name, sheet, r0, c))
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
            f = _field(block, key, _where(name, sheet, r, 1))
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


# ---------------------------------------------------------------------------- writing


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


def write_block(ws, row: int, block: Block, data, unit_of, *, styles=True) -> int:
    """Write one block at ``row`` (title, rows); returns the row after the block's blank line.

    ``data`` is the block's part of a case document (dict, list of dicts, or dict of arrays).
    Text is written as text (never a formula).
    """
    from addin.report.style import put

    s_head, s_unit, s_cell, s_in, s_note = (
        ("bf_head", "bf_unit", "bf_cell", "bf_input", "bf_note") if styles else ("Normal",) * 5
    )
    put(ws, row, 1, f"{MARK} {block.key}  {block.title}", "bf_section" if styles else "Normal")
    row += 1
    if block.kind == "values":
        data = data or {}
        items = _flatten(data)
        known = [f.key for f in block.fields if "*" not in f.key]
        order = [k for k in known if any(i[0] == k for i in items)]
        order += [k for k, _ in items if k not in order]
        flat = dict(items)
        for key in order:
            f = _field(block, key, f"{block.key}.{key}")
            val = flat[key]
            vals = val if isinstance(val, list) else [val]
            unit = unit_of(f.kind) or ""
            split = [_split_unit(v) for v in vals]
            own = {u for _, u in split if u}
            if len(own) == 1:
                unit = own.pop()
                vals = [v for v, _ in split]
            put(ws, row, 1, f.label, s_cell)
            put(ws, row, 2, key, s_note)
            put(ws, row, 3, unit, s_unit)
            for j, v in enumerate(vals):
                _put_value(ws, row, 4 + j, v, s_in)
            row += 1
    elif block.kind == "table":
        if block.arrays:
            keys = [f.key for f in block.fields if f.key in (data or {})]
            n = max((len(data[k]) for k in keys), default=0)
            records = [
                {k: data[k][i] if i < len(data[k]) else None for k in keys} for i in range(n)
            ]
        elif block.rows_key:
            keys = [f.key for f in block.fields]
            records = [
                dict(zip(keys, r, strict=False)) for r in (data or {}).get(block.rows_key, [])
            ]
        else:
            records = [dict(_flatten(r)) for r in (data or [])]
            keys = [f.key for f in block.fields if any(f.key in r for r in records)]
            keys += [k for r in records for k in r if k not in keys]
        for j, k in enumerate(keys):
            f = _field(block, k, f"{block.key}.{k}")
            put(ws, row, 1 + j, k, s_head)
            put(ws, row + 1, 1 + j, unit_of(f.kind) or "", s_unit)
        row += 2
        for rec in records:
            for j, k in enumerate(keys):
                v, u = _split_unit(rec.get(k))
                if u:  # a per-value unit that differs from the column's: keep it as text
                    v = rec.get(k)
                _put_value(ws, row, 1 + j, v, s_in)
            row += 1
    elif block.kind == "columns":
        records = [dict(_flatten(r)) for r in (data or [])]
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
        for key in order:
            f = _field(block, key, f"{block.key}.{key}")
            base, idx = key[:-1].split("[", 1) if key.endswith("]") else (key, None)
            put(ws, row, 1, f.label, s_cell)
            put(ws, row, 2, key, s_note)
            put(ws, row, 3, unit_of(f.kind) or "", s_unit)
            for j, rec in enumerate(records):
                v = rec.get(base)
                if idx is not None:
                    v = v[int(idx)] if isinstance(v, list) and int(idx) < len(v) else None
                _put_value(ws, row, 4 + j, v, s_in)
            row += 1
    if block.note:
        put(ws, row, 1, block.note, s_note)
        row += 1
    return row + 1


def _put_value(ws, row, col, v, style):
    from addin.report.style import put

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


# ---------------------------------------------------------------------------- the case layout
# Keys and quantity kinds come from the case schema (addin.case_schema.SECTIONS); the workbook adds
# only what is its own: block titles and kinds (values/table/columns), block order, the row
# labels, the dial speeds given a row each, and one display unit (nozzle sizes).

_TEXT = "text"

#: case-schema kind → workbook kind (quantity kinds are kept as they are).
_KIND = {"number": "dimensionless", "bool": "flag", "length_or_fill": "length"}
#: rotor speeds [rpm] that get a labelled row of their own; other speeds use ``dial.*``.
_DIAL_SPEEDS = ("600", "300", "200", "100", "60", "30", "6", "3")
#: the two ends of a range, as label suffixes of a columns block's ``key[0]``/``key[1]`` rows.
_ENDS = ("low", "high")
#: nozzle sizes are plain numbers in the case file, shown with the nozzle unit (32nds of an inch).
_DISPLAY_KIND = {("bit", "nozzles"): "nozzle"}

_RHEOLOGY_LABELS = {
    "dial": "dial reading",
    "dial_up": "dial reading, rising ramp,",
    "dial_down": "dial reading, falling ramp,",
    "gels.10s": "gel strength 10 s",
    "gels.10min": "gel strength 10 min",
    "gels.30min": "gel strength 30 min",
    "viscometer.name": "viscometer",
    "viscometer.shear_rate_per_rpm": "viscometer shear rate per rpm [1/s]",
    "viscometer.stress_per_degree": "viscometer stress per dial degree [Pa]",
    "viscometer.spring_factor": "viscometer spring factor",
    "viscometer.full_scale": "viscometer full scale [degree]",
}

#: Row labels by block and (dotted) case key; a range in a columns block gets ", low"/", high".
LABELS: dict[str, dict[str, str]] = {
    "case": {
        "schema": "case-file format version",
        "title": "report title",
        "well": "well name",
        "operator": "operator",
        "rig": "rig",
        "location": "location",
        "report_period": "report period",
        "units": "unit system (oilfield, metric or si)",
    },
    "limits": {
        "fracture_margin": "ECD margin below fracture",
        "pore_margin": "margin above pore pressure",
        "surface_rating": "surface system pressure rating",
        "trip_fracture_margin": "surge margin below fracture",
        "trip_pore_margin": "swab margin above pore",
    },
    "survey": {"md": "measured depth", "inc": "inclination", "azi": "azimuth"},
    "casing": {
        "name": "name",
        "od": "outside diameter",
        "id": "inside diameter",
        "drift": "drift diameter",
        "top": "top (MD)",
        "shoe": "shoe (MD)",
        "shoe_test": "shoe test (LOT/FIT) EMW",
    },
    "open_hole": {
        "bit_size": "bit size",
        "diameter": "effective open-hole diameter",
        "washout_factor": "washout factor (instead of a diameter)",
    },
    "pressure_window": {
        "tvd": "true vertical depth",
        "pore": "pore pressure EMW",
        "fracture": "fracture pressure EMW",
    },
    "weak_point": {
        "name": "name",
        "md": "measured depth",
        "fracture": "fracture EMW",
        "pore": "pore EMW",
    },
    "pump": {
        "name": "name",
        "liner": "liner size",
        "stroke": "stroke length",
        "efficiency": "volumetric efficiency (fraction)",
        "rated_power": "rated power",
        "liner_rating": "liner pressure rating",
    },
    "surface_line": {"name": "name", "length": "length", "id": "inside diameter"},
    "bit": {
        "name": "description",
        "size": "bit size",
        "nozzles": "nozzle sizes",
        "tfa": "total flow area (instead of nozzles)",
        "ports": "number of ports",
        "discharge_coefficient": "nozzle discharge coefficient",
    },
    "string": {
        "name": "component",
        "od": "outside diameter",
        "id": "inside diameter",
        "length": "length (or 'fill')",
        "tool_joint_od": "tool-joint OD",
        "tool_joint_id": "tool-joint ID",
        "joint_length": "joint length",
        "tool_joint_length": "tool-joint length",
        "float_valve": "float valve (true/false)",
    },
    "tool_pressure": {
        "name": "tools (description)",
        "reference_drop": "drop at the reference conditions",
        "reference_density": "reference density",
        "reference_rate": "reference flow rate",
        "flow_window": "allowed flow range (min, max)",
        "covers": "components whose bore loss the drop includes",
    },
    "check": {
        "label": "check label",
        "date": "date",
        "time": "time",
        "sample": "sample point",
        "fluid": "fluid",
        "bit_depth": "bit depth (MD)",
        "density": "mud density",
        "cup_temperature": "rheology (cup) temperature",
        **_RHEOLOGY_LABELS,
        "program.density": "programme density",
        "program.pv": "programme PV",
        "program.yp": "programme YP",
        "program.lsyp": "programme LSYP",
        "flow_rate": "flow rate",
        "rop": "rate of penetration",
        "rpm": "string rotary speed [rpm]",
        "measured_spp": "measured standpipe pressure",
        "pwd.ecd": "downhole gauge ECD",
        "pwd.md": "downhole gauge depth (MD)",
        "cuttings.density": "cuttings density",
        "cuttings.size": "cuttings size",
        "cuttings.sphericity": "cuttings sphericity",
        "properties": "other mud property (free name)",
        "remark": "remark",
    },
    "trip": {
        "stand_length": "stand length",
        "string_end": "string end (closed or open)",
        "speeds": "average stand speeds to evaluate",
    },
    "slurry": {
        "name": "name",
        "density": "density",
        "temperature": "test temperature",
        "volume": "volume",
        **_RHEOLOGY_LABELS,
        "remark": "remark",
    },
}


def _fields(block: str, layout: str, schema, prefix: str = "") -> list[Field]:
    """The workbook fields of one case section: its schema's keys, expanded to workbook rows."""
    labels = LABELS.get(block, {})
    out: list[Field] = []
    for name, fld in schema.items():
        key = prefix + name
        label = labels.get(key, key)
        kind = fld.kind
        if kind == "table":
            out += _fields(block, layout, fld.sub, key + ".")
        elif kind == "dial":
            out += [Field(f"{key}.{s}", f"{label} {s} rpm", "dimensionless") for s in _DIAL_SPEEDS]
            out.append(Field(f"{key}.*", f"{label} (other speed)", "dimensionless"))
        elif kind == "free":
            out.append(Field(f"{key}.*", label, "dimensionless"))
        elif kind == "stations":
            out += [Field(c, labels.get(c, c), k) for c, k in STATION_COLUMNS]
        elif kind in ("range", "list"):
            item = _DISPLAY_KIND.get((block, key), _KIND.get(fld.of, fld.of))
            if layout == "columns" and kind == "range":
                out += [Field(f"{key}[{i}]", f"{label}, {e}", item) for i, e in enumerate(_ENDS)]
            else:
                out.append(Field(key, label, item, many=layout == "values"))
        else:
            out.append(Field(key, label, _DISPLAY_KIND.get((block, key), _KIND.get(kind, kind))))
    return out


def _block(key: str, title: str, kind: str, **kw) -> Block:
    return Block(key, title, kind, tuple(_fields(key, kind, SECTIONS[key][1])), **kw)


#: The case file's sections as workbook blocks, in the order the template and report show them.
LAYOUT: tuple[Block, ...] = (
    _block("case", "Case", "values"),
    _block("limits", "Operating limits and margins", "values"),
    _block("survey", "Directional survey (TVD by minimum curvature)", "table", rows_key="stations"),
    _block("casing", "Casing and liners", "table"),
    _block("open_hole", "Open hole", "values"),
    _block("pressure_window", "Pore and fracture pressure (EMW against TVD)", "table", arrays=True),
    _block("weak_point", "Named weak points", "table"),
    _block("pump", "Mud pumps", "table"),
    _block("surface_line", "Surface lines (as pipe runs)", "table"),
    _block("bit", "Bit", "values"),
    _block("string", "Drill string, bit first", "table"),
    _block("tool_pressure", "Fixed downhole tool pressure drop", "values"),
    _block("check", "Mud checks, oldest first (one column each)", "columns"),
    _block("trip", "Planned trip (surge and swab)", "values"),
    _block("slurry", "Spacer and cement slurries (one column each)", "columns"),
)

BLOCKS: dict[str, Block] = {b.key: b for b in LAYOUT}


def unit_labels(system: str):
    """``unit_of`` for :func:`read_blocks`/:func:`write_block`: the display unit of a kind."""
    from calc.units import label, unit_for

    def unit_of(kind: str):
        if kind in (_TEXT, "flag", "dimensionless"):
            return None
        if kind == "nozzle":  # sizes are whole 32nds of an inch in every unit system (trade use)
            return label("in32")
        return label(unit_for(kind, system))

    return unit_of


#: How the template spreads the blocks over sheets.
TEMPLATE_SHEETS: dict[str, tuple[str, ...]] = {
    "Well": ("case", "limits", "open_hole", "casing", "survey", "pressure_window", "weak_point"),
    "Rig and string": ("pump", "surface_line", "bit", "string", "tool_pressure"),
    "Mud checks": ("check",),
    "Plans": ("trip", "slurry"),
}


def write_case_sheets(wb, doc: dict, sheets: dict[str, tuple[str, ...]] | None = None) -> None:
    """Write a case document's blocks onto sheets of ``wb`` (created as needed)."""
    from addin.report.style import add_styles, set_widths

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
