"""The slurry line at the faces: the case section, the report's Slurry line sheet, the --json
block and the worksheet functions agree with calc.slurry for the demo's invented cuttings-slurry
transfer line; bad input names the key; a case without the section gets no sheet."""

from __future__ import annotations

import copy
import tomllib

import pytest

from addin.case import parse_case
from addin.report.compute import compute
from addin.report.jsonout import results_data
from addin.sheets.functions import BF_DEPOSIT_VEL, BF_SLURRY_GRAD
from addin.slurry_case import slurry_lines
from calc.errors import InputError
from calc.slurry import Carrier, Solids, deposition_velocities, operating_curve
from calc.units import from_si, to_si
from tests._report_demo import DEMO, demo_report_path, demo_results

RAW = tomllib.loads(DEMO.read_text(encoding="utf-8"))


def test_demo_line_is_read_in_the_case_units():
    (line,) = slurry_lines(demo_results().case)
    assert line.d_pipe == pytest.approx(4.0 * 0.0254, rel=1e-12)  # 4 in (exact inch)
    assert line.length == pytest.approx(300 * 0.3048, rel=1e-12)  # 300 ft (exact foot)
    assert line.solids.d50 == pytest.approx(0.15e-3, rel=1e-12)
    assert line.rates == pytest.approx(
        tuple(float(to_si(x, "bpm_oil", "flow_rate")) for x in (4.0, 6.0, 8.0)), rel=1e-12
    )


def test_report_sheet_shows_the_calc_deposition_velocity():
    import openpyxl

    wb = openpyxl.load_workbook(demo_report_path())
    ws = wb["Slurry line"]
    curve = demo_results().slurry_lines[0]
    want = float(from_si(curve.deposition_velocity, "ft/min"))
    cells = {}
    for row in ws.iter_rows(min_row=1, max_row=ws.max_row):
        # method names in words on the rig-facing sheet (addin.text.method_words)
        if row[0].value in ("Durand (1952) deposition", "Wilson (1979) deposition"):
            cells[row[0].value] = (row[4].value, row[6].value)
    assert cells["Wilson (1979) deposition"][1] == "governs"
    assert cells["Wilson (1979) deposition"][0] == pytest.approx(want, rel=1e-12)
    assert ws._charts, "the operating-curve chart"


def test_json_block_is_the_curve():
    data = results_data(demo_results())
    (blk,) = data["slurry_lines"]
    curve = demo_results().slurry_lines[0]
    assert blk["deposition_method"] == curve.deposition.governing
    assert blk["deposition_velocity"] == pytest.approx(
        float(from_si(curve.deposition_velocity, "ft/min")), rel=1e-12
    )
    assert [p["below_deposition"] for p in blk["operating_points"]] == [True, False, False]


def test_worksheet_functions_equal_calc():
    # the demo line's numbers through the worksheet functions (oilfield units)
    rho_s = float(from_si(2600.0, "ppg"))
    v = BF_DEPOSIT_VEL(rho_s, 0.12, "0.15 mm", 4.0)
    r = deposition_velocities(0.1016, 0.15e-3, 2600.0, 998.2, 0.12)
    assert v == pytest.approx(float(from_si(r.velocity, "ft/min")), rel=1e-9)
    g = BF_SLURRY_GRAD(rho_s, 0.12, "0.15 mm", "0.35 mm", 4.0, 252.0)
    from calc.slurry import SlurryLine

    q = float(to_si(252.0, "gpm", "flow_rate"))
    line = SlurryLine("x", 0.1016, 10.0, Solids(2600.0, 0.12, 0.15e-3, 0.35e-3),
                      Carrier.water(998.2), rates=(q,))  # fmt: skip
    want = operating_curve(line).op_gradient[0]
    assert g == pytest.approx(float(from_si(want, "psi/ft")), rel=1e-9)
    assert str(BF_SLURRY_GRAD(rho_s, 0.7, "0.15 mm", "", 4.0, 252.0)).startswith("#BF!")
    assert str(BF_DEPOSIT_VEL(rho_s, 0.12, "5 in", 4.0)).startswith("#BF!")


def _with(**changes):
    data = copy.deepcopy(RAW)
    data["slurry_line"][0].update(changes)
    return parse_case(data, "x.toml")


@pytest.mark.parametrize(
    "changes, needle",
    [
        (dict(carrier="no such mud"), "slurry_line[1].carrier"),
        (dict(slurry_density="12.0 ppg"), "slurry density"),
        (dict(id=2.0, d50="3 in", d85="3.5 in"), "d50"),
        (dict(concentration=None), "concentration"),
    ],
)
def test_bad_line_names_the_key(changes, needle):
    changes = {k: v for k, v in changes.items() if v is not None}
    if "concentration" in changes or needle == "concentration":
        data = copy.deepcopy(RAW)
        del data["slurry_line"][0]["concentration"]
        case = parse_case(data, "x.toml")
    else:
        case = _with(**changes)
    with pytest.raises(InputError) as e:
        slurry_lines(case)
    assert needle in e.value.name and e.value.name.startswith("x.toml")


def test_negative_rate_is_refused_at_reading():
    with pytest.raises(InputError):
        _with(rate="-6 bbl/min")


def test_a_check_can_be_the_carrier():
    case = _with(carrier=RAW["check"][-1]["label"])
    (line,) = slurry_lines(case)
    assert not line.carrier.newtonian
    c = operating_curve(line)
    assert "slurry_non_newtonian_carrier" in {n.code for n in c.notes}


def test_no_section_no_sheet():
    data = copy.deepcopy(RAW)
    del data["slurry_line"]
    r = compute(parse_case(data, "x.toml"), run_time="2026-01-01 06:00:00 UTC")
    assert r.slurry_lines is None
    assert "slurry_lines" not in results_data(r)
