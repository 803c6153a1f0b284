"""The plausibility guard (calc/plausibility.py, addin/guard.py): impossible inputs refused with
the value in the user's unit, unusual ones refused unless ``--allow-unusual``, impossible
results never "OK", and the hostile-input reproductions of NaN and impossible values.

The ranges are common practice (no published source; calc/METHODS.md "Plausibility ranges").
The unit facts the checks lean on are exact definitions: 1 sg = 1000 kg/m³ (specific gravity
to water), 1 US gallon = 231 in³ (NIST Handbook 44, appendix C), so 1.12 ppg = 134.2 kg/m³.
"""

from __future__ import annotations

import json
import math
import re

import openpyxl
import pytest
from _report_demo import DEMO

import addin.sheets.functions  # noqa: F401  (registers the worksheet functions)
from addin.case import load_case
from addin.cli import main
from addin.sheets.framework import FUNCTIONS
from calc.cleaning.indicators import larsen_critical_velocity
from calc.errors import InputError
from calc.plausibility import RANGES, assess

TEXT = DEMO.read_text(encoding="utf-8")


def _variant(tmp_path, name, old, new, count=1):
    assert TEXT.count(old) >= count, old
    p = tmp_path / f"{name}.toml"
    p.write_text(TEXT.replace(old, new, count), encoding="utf-8")
    return p


def _run(*args):
    return main([str(a) for a in args])


# --------------------------------------------------------------------------- the ranges
def test_ranges_are_ordered_and_usual_inside_possible():
    for q, p in RANGES.items():
        lo, hi = p.possible
        assert lo < hi, q
        if p.usual is not None:
            assert lo <= p.usual[0] <= p.usual[1] <= hi, q


def test_density_bounds_from_exact_unit_definitions():
    # 1 sg = 1000 kg/m³; 1 ppg = 0.45359237 kg / 3.785411784e-3 m³ = 119.826 kg/m³ (exact)
    ppg = 0.45359237 / 3.785411784e-3
    assert RANGES["fluid_density"].possible == pytest.approx((600.0, 3000.0))
    assert assess("fluid_density", 1.12 * ppg) == "impossible"
    assert assess("fluid_density", 1.12 * 1000.0) == "ok"
    assert assess("fluid_density", 7.4 * ppg) == "unusual"
    assert assess("fluid_density", math.nan) == "impossible"
    # 5,220 gpm = 0.3293 m³/s, above the possible 4,000 gpm
    gpm = 3.785411784e-3 / 60.0
    assert assess("flow_rate", 5220 * gpm) == "impossible"
    assert assess("flow_rate", 522 * gpm) == "ok"


# --------------------------------------------------------------------------- case files
@pytest.mark.parametrize(
    ("name", "old", "new", "count", "expect"),
    [
        ("dens", "density = 11.2\n", "density = 1.12\n", 1, r"1\.12 ppg.*did you mean 1\.12 sg"),
        ("rate", "flow_rate = 522.0", "flow_rate = 5220.0", 2, r"5220 gpm"),
        (
            "metric",
            'units = "oilfield"',
            'units = "metric"',
            1,
            r"look like oilfield units but the case says metric",
        ),
    ],
)
def test_impossible_demo_variants_refused_nothing_written(
    tmp_path, capsys, name, old, new, count, expect
):
    case = _variant(tmp_path, name, old, new, count)
    out = tmp_path / "out.xlsx"
    assert _run("report", case, "-o", out) == 2
    err = capsys.readouterr().err
    assert re.search(expect, err), err
    assert "Traceback" not in err
    assert not out.exists()
    assert list(tmp_path.iterdir()) == [case]


def test_metric_variant_names_values_in_the_declared_unit(tmp_path, capsys):
    case = _variant(tmp_path, "metric", 'units = "oilfield"', 'units = "metric"')
    assert _run("report", case, "-o", tmp_path / "o.xlsx") == 2
    err = capsys.readouterr().err
    assert "check[1].density = 11 kg/m³" in err  # the number as typed, in metric's unit


def test_unusual_case_refused_then_accepted_and_recorded(tmp_path, capsys):
    # 3,900 gpm: possible, far above the usual 1,500 gpm; the SPP it gives (> 40,000 psi)
    # is beyond any rating, so no Summary row may say OK
    case = _variant(tmp_path, "big", "flow_rate = 522.0", "flow_rate = 3900.0", 2)
    out = tmp_path / "big.xlsx"
    assert _run("report", case, "-o", out) == 2
    err = capsys.readouterr().err
    assert "3900 gpm: unusual" in err and "--allow-unusual" in err
    assert not out.exists()
    assert _run("report", case, "-o", out, "--allow-unusual") == 0
    err = capsys.readouterr().err
    assert "warning" in err and "3900 gpm" in err
    ws = openpyxl.load_workbook(out)["Summary"]
    cells = [[c for c in r] for r in ws.iter_rows(values_only=True)]
    run_rows = [r for r in cells if r[0] == "unusual input (accepted: --allow-unusual)"]
    assert len(run_rows) == 2 and "3900 gpm" in run_rows[0][1]
    statuses = {c for r in cells for c in r if c in ("OK", "NEAR LIMIT", "NOT CREDIBLE")}
    assert "NOT CREDIBLE" in statuses and "OK" not in statuses and "NEAR LIMIT" not in statuses


def test_demo_has_no_unusual_value():
    assert load_case(DEMO).unusual == ()


# --------------------------------------------------------------------------- item 5
@pytest.mark.parametrize(
    ("old", "new", "key"),
    [
        ("measured_spp = 2560.0", "measured_spp = nan", "measured_spp"),
        ("measured_spp = 2560.0", "measured_spp = 0", "measured_spp"),
        ("pwd = { ecd = 11.58,", "pwd = { ecd = nan,", "pwd.ecd"),
        ("ports = 6", "ports = nan", "bit.ports"),
        ("ports = 6", "ports = 1e308", "bit.ports"),
        ("pv = [12, 22]", "pv = [nan, 22]", "program.pv"),
        ("efficiency = 0.97", "efficiency = -0.97", "pump[1].efficiency"),
        ("density = 12.5", "density = -12.5", "slurry[1].density"),
        ("stand_length = 94.5", "stand_length = -94.5", "trip.stand_length"),
        ("rpm = 140", "rpm = 1e9", "check[1].rpm"),
        (
            "dial = { 600 = 56, 300 = 37,",
            'dial = { "600" = 56, "600.0" = 57, 300 = 37,',
            "check[1].dial.600.0",
        ),
        ('label = "D1 05:30"', 'label = ""', "check[1].label"),
    ],
)
def test_nan_and_impossible_case_values_named(tmp_path, capsys, old, new, key):
    case = _variant(tmp_path, "bad", old, new)
    out = tmp_path / "o.xlsx"
    assert _run("report", case, "-o", out) == 2
    err = capsys.readouterr().err
    assert "bad.toml: " in err and key in err, err
    assert "Traceback" not in err and "RuntimeWarning" not in err and "internal" not in err
    assert not out.exists()


def test_duplicate_dial_speed_says_so(tmp_path, capsys):
    case = _variant(
        tmp_path,
        "dup",
        "dial = { 600 = 56, 300 = 37,",
        'dial = { "600" = 56, "600.0" = 57, 300 = 37,',
    )
    assert _run("report", case, "-o", tmp_path / "o.xlsx") == 2
    assert "duplicate speed" in capsys.readouterr().err


def test_efficiency_as_percent_hint(tmp_path, capsys):
    case = _variant(tmp_path, "pct", "efficiency = 0.97", "efficiency = 97")
    assert _run("report", case, "-o", tmp_path / "o.xlsx") == 2
    assert "did you mean 0.97" in capsys.readouterr().err


@pytest.mark.parametrize(
    ("args", "expect"),
    [
        (["annular-velocity", "--rate", "500", "--hole", "8", "--pipe", "10"], "pipe OD"),
        (["hydrostatic", "--density", "11", "--tvd", "-100"], "-100 ft"),
        (["annular-velocity", "--rate", "nan", "--hole", "8.5", "--pipe", "5"], "--rate"),
        (["bit", "--rate", "500", "--density", "11", "--size", "8.5", "--nozzles", "abc"], "abc"),
        (
            ["bit", "--rate", "500", "--density", "11", "--size", "8.5", "--nozzles", "121212"],
            "121212",
        ),
        (["hydrostatic", "--density", "1.12", "--tvd", "10000"], "did you mean 1.12 sg"),
        (["annular-velocity", "--rate", "1600", "--hole", "8.5", "--pipe", "5"], "unusual"),
    ],
)
def test_calc_refuses_bad_options(capsys, args, expect):
    assert _run("calc", *args) == 2
    out = capsys.readouterr()
    assert expect in out.err, out.err
    assert out.out == ""


def test_calc_nozzle_lists_read_right(capsys):
    # "12 12 12" and "3x12,3x11" are nozzle lists: TFA = n·π/4·(s/32 in)², exact geometry
    assert (
        _run(
            "calc",
            "bit",
            "--rate",
            "500",
            "--density",
            "11",
            "--size",
            "8.5",
            "--nozzles",
            "12 12 12",
            "--json",
        )
        == 0
    )
    tfa = float(json.loads(capsys.readouterr().out)["total_flow_area"]["value"])
    assert tfa == pytest.approx(3 * math.pi / 4 * (12 / 32) ** 2, rel=1e-9)
    assert (
        _run(
            "calc",
            "bit",
            "--rate",
            "500",
            "--density",
            "11",
            "--size",
            "8.5",
            "--nozzles",
            "3x12,3x11",
            "--json",
        )
        == 0
    )
    tfa = float(json.loads(capsys.readouterr().out)["total_flow_area"]["value"])
    assert tfa == pytest.approx(math.pi / 4 * (3 * (12 / 32) ** 2 + 3 * (11 / 32) ** 2), rel=1e-9)


def test_calc_unusual_accepted_with_flag(capsys):
    assert (
        _run(
            "calc",
            "annular-velocity",
            "--rate",
            "1600",
            "--hole",
            "8.5",
            "--pipe",
            "5",
            "--allow-unusual",
        )
        == 0
    )
    out = capsys.readouterr()
    assert "warning" in out.err and "1600 gpm" in out.err
    # v = Q/A: 1600 gpm in an 8.5 × 5 in annulus = 24.51·Q/(D²−d²) ft/min (exact conversion)
    v = float(out.out.split()[2])
    assert v == pytest.approx(24.51 * 1600 / (8.5**2 - 5**2), rel=1e-3)


def test_worksheet_cells_refuse_impossible_in_cell_units():
    hyd = FUNCTIONS["BF_HYDROSTATIC"].func
    out = hyd(1.12, 10000)
    assert out.startswith("#BF! density = 1.12 ppg: physically impossible")
    assert "did you mean 1.12 sg" in out
    # 11 ppg × 10,000 ft: 0.052 × 11 × 10000 = 5,720 psi (field rule); exact g gives 5,714
    assert hyd(11, 10000) == pytest.approx(5714.3, rel=1e-3)


def test_larsen_rop_zero_refused_without_warnings(recwarn):
    with pytest.raises(InputError, match="rate of penetration"):
        larsen_critical_velocity(
            0.0,
            0.2159,
            0.127,
            density=1318.0,
            k=0.02,
            tau_y=7.0,
            n=1.0,
            cuttings_size=0.00635,
            inclination=0.0,
        )
    assert not [w for w in recwarn if issubclass(w.category, RuntimeWarning)]
