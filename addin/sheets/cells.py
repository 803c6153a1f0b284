"""Argument normalisation: from what cells hold to SI values for :mod:`calc`.

A spreadsheet hands a worksheet function ``None`` for a blank cell, ``str`` for text (and,
with ``err_to_str``, error cells as text such as ``"#N/A"``), ``float``/``int``/``bool`` for
numbers and logicals, and lists (1-D or 2-D) for ranges.  The formula-engine harness and the
tests hand over the same kinds of values.  Every function here turns them into SI floats or
numpy arrays, or raises :class:`calc.errors.InputError` naming the argument — never returns a
silent NaN.

Rules a spreadsheet user would expect
-------------------------------------
* A blank optional argument takes its default; a blank required argument is an error.
* A number may be typed as text, and may carry its own unit: ``"12.43 bbl/min"``, ``"2.6 sg"``.
  A bare number is in the unit of the ``units`` argument (oilfield by default).
* TRUE/FALSE is not a number here (Excel would silently use 1/0).
* A cell holding an error (``#N/A``, ``#DIV/0!`` or a boreflow ``#BF!`` text) is reported by
  name: ``"bit depth refers to an error cell (#N/A)"``.
* A one-cell range counts as a single value.

The ``units`` argument
----------------------
Blank → ``"oilfield"``.  A unit-system name (``"oilfield"``, ``"metric"``, ``"si"``), optionally
followed by overrides ``kind=unit`` separated by ``;`` or ``,``: ``"oilfield; flow_rate=bbl/min;
density=sg"``.  Or a two-column range of ``kind | unit`` rows (a units block on a config
sheet), where a ``system | metric`` row picks the base system.  Inputs *and* outputs use it.
"""

import math
import re
from dataclasses import dataclass, field
from itertools import chain

import numpy as np

from calc import units as cu
from calc.errors import InputError, check_choice

__all__ = [
    "STANDARD_SPEEDS",
    "UnitSet",
    "as_grid",
    "blank",
    "number",
    "numbers",
    "optional_number",
    "readings",
    "text",
    "unit_set",
]

_ERROR_CELL = re.compile(
    r"^#(?:N/A|NULL!|DIV/0!|VALUE!|REF!|NAME\?|NUM!|GETTING_DATA|SPILL!|CALC!)"
)
_NUMBER_WITH_UNIT = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")


def blank(value) -> bool:
    """True for what a spreadsheet treats as an empty cell: ``None`` or empty/space text."""
    return value is None or (isinstance(value, str) and not value.strip())


def _unwrap_single(value, name: str):
    """A one-cell range (``[[x]]`` or ``[x]``) → ``x``; a bigger range is an error."""
    if isinstance(value, np.ndarray):
        value = value.tolist()
    while isinstance(value, list | tuple):
        flat = value
        if len(flat) == 1:
            value = flat[0]
            continue
        shape = _shape_text(value)
        raise InputError(name, f"a {shape} range", "a single cell or a single value")
    return value


def _shape_text(value) -> str:
    rows = len(value)
    cols = max((len(r) if isinstance(r, list | tuple) else 1) for r in value) if rows else 0
    return f"{rows}×{cols}"


def _is_error_cell(value) -> bool:
    return isinstance(value, str) and (
        value.startswith("#BF!") or bool(_ERROR_CELL.match(value.strip()))
    )


def _scalar_to_si(value, name: str, kind: str | None, uset: "UnitSet | None") -> float:
    """One cell value (not blank) → SI float."""
    if isinstance(value, bool | np.bool_):
        raise InputError(name, value, "a number (TRUE/FALSE is not a number here)")
    if _is_error_cell(value):
        raise InputError(name, value.strip()[:40], "a number", problem="refers to an error cell")
    unit_text = ""
    if isinstance(value, str):
        m = _NUMBER_WITH_UNIT.match(value)
        if not m:
            raise InputError(name, value, "a number, optionally with a unit such as '12.4 ppg'")
        x = float(m.group(1))
        unit_text = m.group(2)
        if unit_text and kind is None:
            raise InputError(name, value, "a plain number (no unit)")
    else:
        try:
            x = float(value)
        except (TypeError, ValueError, OverflowError) as exc:
            raise InputError(name, value, "a number") from exc
    if not math.isfinite(x):
        raise InputError(name, x, "a finite number")
    if kind is None or kind == "dimensionless":
        return x
    unit = unit_text or (uset or UnitSet()).unit(kind)
    try:
        si = cu.to_si(x, unit, kind=kind, name=name)
    except InputError as exc:
        if exc.name.startswith("unit"):
            raise InputError(f"unit of {name}", unit, exc.allowed, exc.problem) from exc
        raise
    if not math.isfinite(si):
        raise InputError(name, value, "a number small enough to convert to SI")
    return si


def number(value, name: str, kind: str | None = None, uset: "UnitSet | None" = None) -> float:
    """A required single value → SI float (``kind`` picks the unit from ``uset``).

    >>> round(number("12.43 bbl/min", "flow rate", "flow_rate"), 7)
    0.0329369
    >>> number(None, "flow rate", "flow_rate")
    Traceback (most recent call last):
    ...
    calc.errors.InputError: flow rate = None: is blank; allowed: a number
    """
    value = _unwrap_single(value, name)
    if blank(value):
        raise InputError(name, None, "a number", problem="is blank")
    return _scalar_to_si(value, name, kind, uset)


def optional_number(
    value, name: str, default: float | None, kind: str | None = None, uset=None
) -> float | None:
    """Like :func:`number`, but a blank gives ``default`` (already in SI)."""
    value = _unwrap_single(value, name)
    if blank(value):
        return default
    return _scalar_to_si(value, name, kind, uset)


def text(value, name: str, default: str | None = None, choices=None) -> str:
    """A single text argument (blank → ``default``); with ``choices``, matched case-blind."""
    value = _unwrap_single(value, name)
    if blank(value):
        if default is None:
            raise InputError(name, None, "a text value", problem="is blank")
        return default
    if _is_error_cell(value):
        raise InputError(
            name, value.strip()[:40], "a text value", problem="refers to an error cell"
        )
    if isinstance(value, bool | np.bool_) or not isinstance(value, str):
        if isinstance(value, float) and value.is_integer():
            value = str(int(value))
        else:
            value = str(value)
    out = value.strip()
    if choices is not None:
        by_lower = {c.lower(): c for c in choices}
        if out.lower() in by_lower:
            return by_lower[out.lower()]
        return check_choice(name, out, list(choices))
    return out


def as_grid(value) -> list[list]:
    """Any cell value → a rectangular 2-D list (scalar → 1×1; 1-D → one row)."""
    if isinstance(value, np.ndarray):
        value = value.tolist()
    if not isinstance(value, list | tuple):
        return [[value]]
    if not value:
        return [[None]]
    if set(map(type, value)) == {list} and len(set(map(len, value))) == 1 and value[0]:
        return value  # already a rectangular 2-D list (what xlwings passes with ndim=2)
    if not any(isinstance(r, list | tuple) for r in value):
        return [list(value)]
    rows = [list(r) if isinstance(r, list | tuple) else [r] for r in value]
    width = max(len(r) for r in rows)
    return [r + [None] * (width - len(r)) for r in rows]


def numbers(value, name: str, kind: str | None = None, uset=None) -> np.ndarray:
    """A range (or one cell) of numbers → SI array of the range's 2-D shape.

    Every cell must hold a number: a blank or a text cell is an error naming its position,
    so a result table never silently skips a row.
    """
    grid = as_grid(value)
    rows, cols = len(grid), len(grid[0])
    if set(map(type, chain.from_iterable(grid))) <= {float, int}:
        # fast path: plain numbers only (the usual case for a long column)
        arr = np.array(grid, dtype=float)
        bad = ~np.isfinite(arr)
        if bad.any():
            i, j = (int(k[0]) for k in np.nonzero(bad))
            where = f"{name} (row {i + 1}, column {j + 1})" if rows * cols > 1 else name
            raise InputError(where, arr[i, j], "a finite number")
        if kind is None or kind == "dimensionless":
            return arr
        out = (uset or UnitSet()).to_si(arr, kind)
        if not np.all(np.isfinite(out)):
            raise InputError(name, "values too large", "numbers small enough to convert to SI")
        return out
    out = np.empty((rows, cols))
    for i, row in enumerate(grid):
        for j, v in enumerate(row):
            where = f"{name} (row {i + 1}, column {j + 1})" if rows * cols > 1 else name
            if blank(v):
                raise InputError(where, None, "a number", problem="is blank")
            out[i, j] = _scalar_to_si(v, where, kind, uset)
    return out


# ----------------------------------------------------------------- viscometer readings

#: Rotor speeds assumed for a one-row or one-column range of dial readings with no speeds
#: beside them, by count: the six-speed mud check, the seven-speed cement/spacer check (to
#: 300 rpm, as API RP 10B-2 practice), the API 600/300 pair (common practice).
STANDARD_SPEEDS: dict[int, tuple[float, ...]] = {
    6: (600.0, 300.0, 200.0, 100.0, 6.0, 3.0),
    7: (300.0, 200.0, 100.0, 60.0, 30.0, 6.0, 3.0),
    2: (600.0, 300.0),
}


def _all_text(cells) -> bool:
    return all(
        isinstance(v, str) and not _is_error_cell(v) and not _looks_numeric(v) for v in cells
    )


def _looks_numeric(v) -> bool:
    return isinstance(v, str) and bool(
        re.fullmatch(r"\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s*", v)
    )


#: Most speed and dial pairs one readings range may hold.  A rotational viscometer test reads
#: 6 to 12 speeds, a ramp up and down twice that (common practice); the bound is far above
#: that and keeps a mistaken whole-sheet range (a million rows took 143 s) from running long.
MAX_READINGS = 1_000


def _filled_lines(lines, stop: int) -> int:
    """How many of ``lines`` (rows or columns) hold a non-blank cell, counting up to
    ``stop + 1`` at the most (so that a huge range is not read through)."""
    n = 0
    for line in lines:
        if not all(blank(v) for v in line):
            n += 1
            if n > stop:
                break
    return n


def _too_many_readings(name: str, shown: str):
    raise InputError(
        name,
        shown,
        f"at most {MAX_READINGS:,} speed and dial pairs (one viscometer test: a few speeds, "
        "each read once or on a ramp up and down)",
        problem="too many",
    )


def readings(value, name: str = "readings") -> tuple[np.ndarray, np.ndarray]:
    """A range of viscometer readings → (rotor speeds [rpm], dial readings [degrees]).

    Layouts accepted:

    * two columns ``speed | dial`` (any number of rows), or two rows ``speeds`` / ``dials``
      with three or more columns; a header row or column of text is skipped;
    * one column or one row of dial readings alone, taken at :data:`STANDARD_SPEEDS` by count
      (6 → 600, 300, 200, 100, 6, 3; 7 → 300 … 3; 2 → 600, 300).

    A pair whose dial cell is blank is left out (a speed not measured).  Order, sign and
    other checks are made by :mod:`calc.rheology`.

    >>> readings([[600, 56], [300, 37], [3, None]])
    (array([600., 300.]), array([56., 37.]))
    """
    grid = as_grid(value)
    # refuse a range with too many filled rows or columns before reading all of it (a header
    # line may come on top of the readings)
    wide = len(grid[0]) > MAX_READINGS + 1
    for lines in (grid, zip(*grid, strict=True)) if wide else (grid,):
        if _filled_lines(lines, MAX_READINGS + 1) > MAX_READINGS + 1:
            _too_many_readings(name, f"more than {MAX_READINGS:,} readings")
    if not set(map(type, chain.from_iterable(grid))) <= {float, int}:
        # drop rows and columns that are entirely blank (an over-selected range)
        grid = [r for r in grid if not all(blank(v) for v in r)]
        if grid:
            keep = [j for j in range(len(grid[0])) if not all(blank(r[j]) for r in grid)]
            if len(keep) < len(grid[0]):
                grid = [[r[j] for j in keep] for r in grid]
    if not grid or not grid[0]:
        raise InputError(name, None, "a range of dial readings", problem="is blank")
    # skip a header row / column made of text labels
    if len(grid) > 1 and _all_text(v for v in grid[0] if not blank(v)):
        grid = grid[1:]
    if grid and len(grid[0]) > 1 and _all_text(r[0] for r in grid if not blank(r[0])):
        grid = [r[1:] for r in grid]
    rows, cols = len(grid), len(grid[0]) if grid else 0
    if rows == 0 or cols == 0:
        raise InputError(name, "only labels", "a range of dial readings")
    if cols == 2 and rows >= 2:
        pairs = [(r[0], r[1]) for r in grid]
    elif rows == 2 and cols >= 3:
        pairs = list(zip(grid[0], grid[1], strict=True))
    elif rows == 1 or cols == 1:
        dials = grid[0] if rows == 1 else [r[0] for r in grid]
        speeds = STANDARD_SPEEDS.get(len(dials))
        if speeds is None:
            raise InputError(
                name,
                f"{len(dials)} readings without speeds",
                "6 readings (600…3 rpm), 7 (300…3 rpm) or 2 (600, 300 rpm), "
                "or speeds in a column beside the readings",
            )
        pairs = list(zip(speeds, dials, strict=True))
    else:
        raise InputError(
            name,
            f"a {rows}×{cols} range",
            "one row or column of readings, or two columns (rpm | dial), or two rows",
        )
    if len(pairs) > MAX_READINGS:
        _too_many_readings(name, f"{len(pairs):,} readings")
    speed_out, dial_out = [], []
    for k, (s, d) in enumerate(pairs):
        if blank(d):
            continue
        label = f"{name}: speed in pair {k + 1}"
        speed = number(s, label)
        dial = number(d, f"{name}: dial reading at {speed:g} rpm")
        speed_out.append(speed)
        dial_out.append(dial)
    if len(dial_out) < 2:
        raise InputError(name, f"{len(dial_out)} reading(s)", "at least two dial readings")
    return np.array(speed_out), np.array(dial_out)


# ----------------------------------------------------------------- units argument


@dataclass(frozen=True)
class UnitSet:
    """The unit of each quantity kind for one call: a named system plus overrides."""

    system: str = "oilfield"
    overrides: dict[str, str] = field(default_factory=dict)

    def unit(self, kind: str) -> str:
        if kind in self.overrides:
            return self.overrides[kind]
        return cu.unit_for(kind, self.system)

    def label(self, kind: str) -> str:
        return cu.label(self.unit(kind))

    def to_si(self, value, kind: str):
        return cu.to_si(value, self.unit(kind), kind=kind)

    def from_si(self, value, kind: str):
        return cu.from_si(value, self.unit(kind), kind=kind)


_KIND_ALIASES = {
    "rate": "flow_rate",
    "flow": "flow_rate",
    "q": "flow_rate",
    "mud_weight": "density",
}


def _override(kind_text, unit_text, overrides: dict[str, str], name: str) -> None:
    kind = text(kind_text, f"{name}: quantity kind").lower().replace(" ", "_")
    kind = _KIND_ALIASES.get(kind, kind)
    if kind not in cu.KINDS:
        check_choice(f"{name}: quantity kind", kind, sorted(cu.KINDS))
    unit = text(unit_text, f"{name}: unit for {kind}")
    cu.parse_unit(unit, kind)  # raises InputError naming the unit
    overrides[kind] = unit


def unit_set(value, name: str = "units") -> UnitSet:
    """The ``units`` argument → :class:`UnitSet` (see the module docstring).

    >>> unit_set("metric; flow_rate=gpm").unit("flow_rate")
    'gpm'
    >>> unit_set(None).unit("density")
    'ppg'
    """
    grid = as_grid(value)
    if len(grid) == 1 and len(grid[0]) == 1:
        cell = grid[0][0]
        if blank(cell):
            return UnitSet()
        spec = text(cell, name)
        parts = [p.strip() for p in re.split(r"[;,]", spec) if p.strip()]
        system = "oilfield"
        overrides: dict[str, str] = {}
        for k, part in enumerate(parts):
            if "=" in part:
                kind_text, unit_text = part.split("=", 1)
                _override(kind_text, unit_text, overrides, name)
            elif k == 0:
                system = _system(part, name)
            else:
                raise InputError(
                    name, part, "'kind=unit' after the system name, e.g. 'flow_rate=bbl/min'"
                )
        return UnitSet(system, overrides)
    if len(grid[0]) != 2:
        raise InputError(
            name, f"a {len(grid)}×{len(grid[0])} range", "one cell, or two columns: kind | unit"
        )
    system = "oilfield"
    overrides = {}
    for row in grid:
        if all(blank(v) for v in row):
            continue
        if isinstance(row[0], str) and row[0].strip().lower() in ("system", "unit system", "units"):
            system = _system(text(row[1], name), name)
        else:
            _override(row[0], row[1], overrides, name)
    return UnitSet(system, overrides)


def _system(part: str, name: str) -> str:
    low = part.strip().lower()
    if low not in cu.UNIT_SYSTEMS:
        check_choice(f"{name}: unit system", low, list(cu.UNIT_SYSTEMS))
    return low


def values(value, name: str, kind: str | None = None, uset=None):
    """One cell → SI float; a range → SI 2-D array (every cell a number).

    Used for the arguments that may be swept over a column (rates, depths): a single value
    gives a single result, a range gives a range of results of the same shape.
    """
    grid = as_grid(value)
    if len(grid) == 1 and len(grid[0]) == 1:
        return number(grid[0][0], name, kind, uset)
    return numbers(grid, name, kind, uset)


def broadcast(**arrays):
    """Check that range arguments fit together (same shape, or single cells); return shape."""
    shapes = {k: np.shape(v) for k, v in arrays.items() if np.ndim(v) > 0}
    try:
        return np.broadcast_shapes(*shapes.values())
    except ValueError as exc:
        text_ = ", ".join(f"{k} {'×'.join(map(str, s))}" for k, s in shapes.items())
        raise InputError("ranges", text_, "ranges of the same shape, or single cells") from exc


def nozzle_sizes(value, name: str = "nozzles"):
    """Nozzle sizes in 32nds of an inch → what :func:`calc.bit.parse_nozzles` accepts.

    A text cell (``"3x12 3x11"``, ``"12, 12, 11"``) is passed through; a range of numbers is
    read cell by cell, blank cells (unused ports) left out.
    """
    grid = as_grid(value)
    if len(grid) == 1 and len(grid[0]) == 1 and isinstance(grid[0][0], str):
        cell = grid[0][0]
        if _is_error_cell(cell):
            raise InputError(name, cell[:40], "nozzle sizes", problem="refers to an error cell")
        if not cell.strip():
            raise InputError(name, None, "nozzle sizes in 32nds", problem="is blank")
        return cell
    sizes = [v for row in grid for v in row if not blank(v)]
    if not sizes:
        raise InputError(name, None, "nozzle sizes in 32nds", problem="is blank")
    return [number(v, f"{name}: size {k + 1}") for k, v in enumerate(sizes)]


def positive(value_si, name: str, kind: str | None = None, uset=None, *, allow_zero=False):
    """Require value > 0 (or ≥ 0); the error shows the value in the user's unit.

    >>> positive(-0.0378541, "flow rate", "flow_rate")
    Traceback (most recent call last):
    ...
    calc.errors.InputError: flow rate = -600: not allowed; allowed: > 0 gpm
    """
    arr = np.asarray(value_si, dtype=float)
    bad = arr < 0 if allow_zero else arr <= 0
    if np.any(bad):
        first = float(arr[bad].ravel()[0])
        uset = uset or UnitSet()
        shown = uset.from_si(first, kind) if kind else first
        unit = f" {uset.label(kind)}" if kind and uset.label(kind) else ""
        raise InputError(name, round(float(shown), 6), f"{'>=' if allow_zero else '>'} 0{unit}")
    return value_si


def positive_number(value, name: str, kind: str | None = None, uset=None, *, allow_zero=False):
    """One cell → SI float, required > 0 (or ≥ 0): :func:`number` then :func:`positive`.

    >>> round(positive_number(10.0, "density", "density"), 4)
    1198.2643
    """
    return positive(number(value, name, kind, uset), name, kind, uset, allow_zero=allow_zero)


def positive_values(value, name: str, kind: str | None = None, uset=None, *, allow_zero=False):
    """One cell or a range → SI, every value > 0 (or ≥ 0): :func:`values` then :func:`positive`.

    >>> positive_values([[1.0, 2.0]], "flow rate").tolist()
    [[1.0, 2.0]]
    """
    return positive(values(value, name, kind, uset), name, kind, uset, allow_zero=allow_zero)


def flow_rates(q, uset=None):
    """The flow-rate argument (one cell or a range) → SI [m³/s], every rate > 0."""
    return positive_values(q, "flow rate", "flow_rate", uset)
