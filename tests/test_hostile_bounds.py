"""Bounded inputs: long unit texts and many repeated viscometer rows are refused by their size
before any parsing (so their cost cannot grow with the input), with a message naming the input
and its length; calc inputs are refused in the user's unit.  No test asserts a time (timings are
noisy); the before/after times are in the closing note and the benchmarks.

External reference: the Excel specifications and limits (a cell holds at most 32,767
characters).
"""

from __future__ import annotations

import pytest

from addin.sheets.fn_units import BF_CONVERT
from calc import units
from calc.errors import InputError

EXCEL_CELL_MAX = 32_767  # Excel specifications and limits: characters in one cell


# ------------------------------------------------------------------ unit text length


@pytest.mark.parametrize("text", ["a" * 40_000, "x" * EXCEL_CELL_MAX, "m/" * 16_383 + "s"])
def test_long_unit_text_is_refused_naming_its_length(text):
    units.parse_unit.cache_clear()
    with pytest.raises(InputError) as exc:  # refused by its length, before any parsing
        units.parse_unit(text)
    msg = str(exc.value)
    assert msg.startswith("unit = ") and "too long" in msg
    assert f"{len(text):,} characters" in msg and f"at most {units.MAX_UNIT_TEXT}" in msg
    assert len(msg) < 300  # the text is not repeated whole


def test_every_unit_the_program_names_fits_the_bound():
    from calc.kinds import LABELS, UNIT_SYSTEMS

    names = {u for system in UNIT_SYSTEMS.values() for u in system.values()} | set(LABELS)
    assert max(len(n) for n in names) <= units.MAX_UNIT_TEXT
    for n in names - {""}:
        units.parse_unit(n)  # all still parse


@pytest.mark.parametrize(
    "args",
    [
        (1.0, "x" * EXCEL_CELL_MAX, "gpm"),
        (1.0, "gpm", "x" * EXCEL_CELL_MAX),
        ("1 " + "x" * (EXCEL_CELL_MAX - 2), "", "gpm"),
    ],
)
def test_bf_convert_with_a_cell_sized_unit_names_the_argument(args):
    units.parse_unit.cache_clear()
    out = BF_CONVERT(*args)
    assert out.startswith("#BF! unit") and "too long" in out
    assert f"{EXCEL_CELL_MAX - (2 if args[1] == '' else 0):,} characters" in out


# ------------------------------------------------------------------ viscometer rows

# One six-speed reading set; PV = θ600 − θ300 = 56 − 37 = 19 cP (API RP 13B-1 definition).
_SIX = [[600, 56], [300, 37], [200, 29], [100, 20], [6, 8], [3, 7]]


def _repeated(n):
    return [list(_SIX[i % 6]) for i in range(n)]


def test_bf_pv_of_a_million_repeated_rows_is_refused():
    from addin.sheets.fn_rheology import BF_PV

    out = BF_PV(_repeated(1_000_000))
    assert out.startswith("#BF! readings = ") and "too many" in out
    assert "at most 1,000" in out


def test_bf_pv_of_two_rows_a_million_wide_is_refused():
    from addin.sheets.fn_rheology import BF_PV

    grid = [[r[0] for r in _repeated(1_000_000)], [r[1] for r in _repeated(1_000_000)]]
    out = BF_PV(grid)
    assert "too many" in out


def test_repeated_speeds_within_the_bound_still_give_pv():
    from addin.sheets import cells
    from addin.sheets.fn_rheology import BF_PV

    assert BF_PV(_repeated(cells.MAX_READINGS)) == pytest.approx(19.0, rel=1e-12)
    assert "1,001 readings" in BF_PV(_repeated(cells.MAX_READINGS + 1))


def test_an_over_selected_whole_column_still_reads():
    from addin.sheets.fn_rheology import BF_PV

    grid = [["rpm", "dial"], *_SIX] + [[None, None]] * 1_048_569  # A1:B1048576
    out = BF_PV(grid)
    assert out == pytest.approx(19.0, rel=1e-12)
