"""Rig-facing sheets speak in words, not code names (issue 14): no CamelCase class names
("PowerLaw"), no snake_case method or key names ("api13d_2010_hb", "tau_y") and no case-file
section tokens ("[limits]") in any text cell of the demo report (invented demo data).

Allowed: unit symbols written the SI way (cP, mPa·s, kPa …; BIPM SI Brochure prefixes) and
math symbols with a one-letter base and a subscript (V_crit, Q_crit, p_back, P_bit: common
practice in formula columns).  Method names go through addin.text.method_words.
"""

from __future__ import annotations

import re

import openpyxl
import pytest

from addin import text
from tests._report_demo import demo_report_path

RIG_FACING = ("Summary", "Rheology", "Hydraulics", "ECD", "Bit", "Cleaning", "Trips",
              "Rate window", "Beds", "Downhole", "Slurry line", "Cement job")  # fmt: skip
CAMEL = re.compile(r"\b[A-Za-z]*[a-z][A-Z][A-Za-z]*\b")
SNAKE = re.compile(r"\b[A-Za-z0-9]{2,}(?:_[A-Za-z0-9]+)+\b")
SECTION = re.compile(r"\[\[?[a-z_]+\]\]?")
#: unit symbols with a lower-case prefix or sub-unit (SI Brochure; cP the CGS centipoise)
ALLOWED_CAMEL = {"cP", "mPa", "kPa", "MPa", "GPa", "kN", "mN", "kW", "MW", "kJ", "mL", "dL"}


def _code_names(value: str) -> list[str]:
    hits = [w for w in CAMEL.findall(value) if w not in ALLOWED_CAMEL]
    return hits + SNAKE.findall(value) + SECTION.findall(value)


def test_no_code_names_on_rig_facing_sheets():
    wb = openpyxl.load_workbook(demo_report_path())
    bad = []
    for name in RIG_FACING:
        if name not in wb.sheetnames:
            continue
        for row in wb[name].iter_rows():
            for c in row:
                if isinstance(c.value, str) and not c.value.startswith("="):
                    if hits := _code_names(c.value):
                        bad.append(f"{name}!{c.coordinate}: {hits} in {c.value[:70]!r}")
    assert not bad, "\n".join(bad)


@pytest.mark.parametrize(
    "sample",
    ["PowerLaw", "fit api13d_2010_hb", "tau_y [Pa]", "margins from [limits]", "HerschelBulkley"],
)
def test_the_scan_catches_code_names(sample):
    assert _code_names(sample)


def test_the_scan_lets_units_and_math_symbols_pass():
    assert not _code_names("PV [cP], 12 mPa·s, Q/Q_crit ≥ 1, ρ + (Δp_ann + p_back)/(g·TVD)")


def test_method_names_read_as_words():
    # every name the method spread of the demo uses, and the fit names of the Rheology sheet
    for key in ("api13d_2010_hb", "api13d_1995_power_law", "bingham", "power_law",
                "hb_least_squares", "power_law_loglog", "newtonian_least_squares"):  # fmt: skip
        assert not _code_names(text.method_words(key)), key
