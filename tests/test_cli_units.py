"""Units on the command line: help names each option's unit and the choices of --units and
--method; errors quote the value in the unit the user gave; the batch summary has one unit
per column, named in its header.

External references: conversion factors of NIST SP 811 (2008), Appendix B (1 lbm/gal =
119.826 4 kg/m³; 1 psi = 6 894.757 Pa; 1 bar = 100 000 Pa, exact); the method names come from
the registry (calc.hydraulics_method.HYDRAULICS_METHODS), the systems from calc.units.
"""

from __future__ import annotations

import csv
import shutil

import pytest
from _report_demo import DEMO

from addin.cli import build_parser, main
from calc.hydraulics_method import HYDRAULICS_METHODS
from calc.units import UNIT_SYSTEMS


def run(*args):
    return main([str(a) for a in args])


def _help(capsys, *cmd) -> str:
    with pytest.raises(SystemExit):
        build_parser().parse_args([*cmd, "--help"])
    return " ".join(capsys.readouterr().out.split())


@pytest.mark.parametrize(
    "cmd, units",
    [
        (("calc", "hydrostatic"), {"--density": "ppg", "--tvd": "ft"}),
        (("calc", "annular-velocity"), {"--rate": "gpm", "--hole": "in", "--pipe": "in"}),
        (("calc", "bit"), {"--rate": "gpm", "--density": "ppg", "--size": "in"}),
    ],
)
def test_help_names_the_unit_of_every_quantity_option(capsys, cmd, units):
    text = _help(capsys, *cmd)
    for option, unit in units.items():
        part = text.split(option.upper().lstrip("-") + " ", 2)[-1]
        assert f"{unit} (oilfield)" in part.split(" --")[0], (option, part[:200])
    assert "kg/m³" in text or "m³/s" in text or "mm" in text  # the other systems' units too


@pytest.mark.parametrize(
    "cmd",
    [("report",), ("batch",), ("calc", "circulate")],
)
def test_method_help_lists_the_registry(capsys, cmd):
    text = _help(capsys, *cmd)
    for name in HYDRAULICS_METHODS.names():
        assert name in text


@pytest.mark.parametrize(
    "cmd",
    [
        ("rheology",),
        ("batch",),
        ("calc", "hydrostatic"),
        ("calc", "annular-velocity"),
        ("calc", "bit"),
        ("calc", "circulate"),
    ],
)
def test_units_help_lists_the_systems(capsys, cmd):
    text = _help(capsys, *cmd)
    assert "--units" in text
    assert all(s in text for s in UNIT_SYSTEMS)


def test_unknown_method_is_bad_input(capsys, tmp_path):
    assert run("report", DEMO, "-o", tmp_path / "r.xlsx", "--method", "nonsense") == 2
    err = capsys.readouterr().err
    assert "nonsense" in err and all(n in err for n in HYDRAULICS_METHODS.names())


@pytest.mark.parametrize(
    "args, needle",
    [
        (("--density", -11, "--tvd", 1000), "--density = -11 ppg"),
        (("--density", "-1.3 sg", "--tvd", 1000), "--density = -1.3 sg"),
        (("--density", -1318, "--tvd", 1000, "--units", "metric"), "--density = -1318 kg/m³"),
    ],
)
def test_errors_quote_the_value_in_the_users_unit(capsys, args, needle):
    assert run("calc", "hydrostatic", *args) == 2
    err = capsys.readouterr().err
    assert needle in err
    assert "1318.09" not in err  # not the SI conversion of -11 ppg (11 × 119.8264 kg/m³)


def test_bit_size_error_in_inches(capsys):
    code = run("calc", "bit", "--rate", 500, "--density", 12, "--size", -8.5, "--nozzles", "12")
    assert code == 2
    err = capsys.readouterr().err
    assert "--size = -8.5 in" in err and "0.2159" not in err


def test_batch_summary_has_one_unit_per_column(tmp_path, capsys):
    """Every row in the batch's --units (default oilfield), the unit in the header, the case's
    own system in case_units; the same run in psi and in bar agree (NIST SP 811 factors)."""
    cases = tmp_path / "cases"
    cases.mkdir()
    shutil.copy(DEMO, cases / "field.toml")
    summary = tmp_path / "s.csv"
    assert run("batch", cases, "-o", tmp_path / "o1", "--summary", summary, "-q") == 0
    field = next(csv.DictReader(summary.open()))
    assert "standpipe_pressure [psi]" in field and "ecd_bit [ppg]" in field
    summary2 = tmp_path / "s2.csv"
    code = run(
        "batch", cases, "-o", tmp_path / "o2", "--summary", summary2, "-q", "--units", "metric"
    )
    assert code == 0
    metric = next(csv.DictReader(summary2.open()))
    assert "standpipe_pressure [bar]" in metric and "ecd_bit [kg/m³]" in metric
    assert metric["case_units"] == field["case_units"] == "oilfield"
    spp_psi = float(field["standpipe_pressure [psi]"])
    spp_bar = float(metric["standpipe_pressure [bar]"])
    assert spp_bar * 100000 / 6894.757 == pytest.approx(spp_psi, abs=1.0)
    assert "." in metric["standpipe_pressure [bar]"]  # four significant digits, not 204
    ecd_ppg = float(field["ecd_bit [ppg]"])
    assert float(metric["ecd_bit [kg/m³]"]) / 119.8264 == pytest.approx(ecd_ppg, abs=1e-3)


def test_batch_unknown_method_is_refused_before_any_case(tmp_path, capsys):
    assert run("batch", DEMO, "-o", tmp_path / "o", "--method", "nonsense", "-q") == 2
    assert not (tmp_path / "o").exists()
