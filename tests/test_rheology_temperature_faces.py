"""Rheology at temperature and the viscometer corrections through the case file, the report,
the command line and the worksheet functions (calc/METHODS.md §21).

References: the laws reproduce each check's own fit at its own temperature exactly (by
construction of a two-point law, analytical); 150 °F = 338.706 K and 120 °F = 322.039 K by the
definition of the Fahrenheit scale; the gap-plug test τ_bob/s² < τy (Couette torque balance,
Reiner & Riwlin 1927) is recomputed here from the dial readings.
"""

from __future__ import annotations

import copy
import tomllib

import openpyxl
import pytest
from _report_demo import DEMO, demo_report_path, demo_results

from addin.case import load_case, parse_case
from addin.cli import main
from addin.report import compute
from addin.sheets.fn_rheology_temperature import BF_PARAM_AT_T, BF_SHEAR_RATE_KRIEGER
from calc.errors import InputError
from calc.rheology import fit
from calc.rheology.viscometer import STANDARD_GEOMETRY, krieger_shear_rate, radius_ratio
from calc.units import si_factor

DOC = tomllib.loads(DEMO.read_text(encoding="utf-8"))
F_TO_K = lambda f: (f - 32.0) * 5.0 / 9.0 + 273.15  # noqa: E731 - definition of °F


def _with(edit) -> dict:
    doc = copy.deepcopy(DOC)
    edit(doc)
    return doc


def test_demo_d2_read_again_hot():
    case = load_case(DEMO)
    d2 = case.checks[-1]
    assert [r.temperature for r in d2.all_readings] == pytest.approx([F_TO_K(120), F_TO_K(150)])
    assert d2.readings_at[0].reading(600) == 55.0
    assert d2.pressures == (None, None)


def test_temperature_table_reproduces_each_fit_at_its_temperature():
    res = demo_results()
    tt = res.temperature_table
    assert tt is not None and tt.fits == "api13d_2010_hb" and tt.same_models
    assert [round(t - 273.15, 6) for t in tt.temperatures] == pytest.approx(
        [round((f - 32) * 5 / 9, 6) for f in (120, 130, 140, 150)]
    )
    assert tt.measured == (True, False, False, True)
    for r in res.case.checks[-1].all_readings:
        i = min(range(len(tt.temperatures)), key=lambda j: abs(tt.temperatures[j] - r.temperature))
        ref = fit(r, "api13d_2010_hb").model
        got = tt.annulus[i]
        assert (got.tau_y, got.k, got.n) == pytest.approx((ref.tau_y, ref.k, ref.n), rel=1e-12)
    # the hydraulics stay at the cup rheology of D2 (no per-interval conditions yet)
    ref = fit(res.case.checks[-1].readings, "api13d_2010_hb").model
    assert res.fluid.annulus_parameters == pytest.approx((ref.tau_y, ref.k, ref.n), rel=1e-15)


def test_demo_gap_plug_note_at_3_rpm():
    """D2: θ3 = 9, θ6 = 10, τy = 2τ3 − τ6 (API HB): τ3/s² < τy at 3 rpm, not at 6 rpm."""
    res = demo_results()
    per, s2 = STANDARD_GEOMETRY.stress_per_reading, radius_ratio() ** 2
    ty = (2 * 9 - 10) * per
    assert 9 * per / s2 < ty < 10 * per / s2  # recomputed by hand from the readings
    plug = [n for n in res.notes if n.code == "gap_plug"]
    assert [n.subject for n in plug] == ["3 rpm"]
    assert plug[0].value("tau_y").value == pytest.approx(ty, rel=1e-12)
    assert not any(n.code == "rheology_as_measured" for n in res.notes)


def test_one_temperature_note():
    doc = _with(lambda d: d["check"][-1].pop("reading_2"))
    res = compute(parse_case(doc, "one-temp.toml"))
    assert res.temperature_table is None
    assert [n.code for n in res.notes].count("rheology_as_measured") == 1


@pytest.mark.parametrize(
    ("value", "needle"),
    [(20.0, "reading_2.temperature"), (600.0, "reading_2.temperature")],
)
def test_reading_temperature_outside_range_refused_in_user_units(value, needle):
    doc = _with(lambda d: d["check"][-1]["reading_2"].update(temperature=value))
    with pytest.raises(InputError) as e:
        parse_case(doc, "bad.toml")
    assert needle in str(e.value) and "°F" in str(e.value)


def test_reading_without_cup_temperature_refused():
    doc = _with(lambda d: d["check"][-1].pop("cup_temperature"))
    with pytest.raises(InputError, match="cup_temperature"):
        parse_case(doc, "bad.toml")


def test_shear_rate_correction_key_and_override():
    case = load_case(DEMO)
    assert case.checks[-1].readings.shear_rate_correction == "newtonian"
    k = case.with_shear_rate_correction("krieger")
    r0, r1 = case.checks[-1].readings, k.checks[-1].readings
    want, _ = krieger_shear_rate(r0.speeds, r0.dial)
    assert r1.shear_rate == pytest.approx(want, rel=1e-15)
    assert k.checks[-1].readings_at[0].shear_rate_correction == "krieger"
    # the API field estimate keeps its printed Newtonian shear rates; least squares moves
    assert fit(r1, "api13d_2010_hb").model == fit(r0, "api13d_2010_hb").model
    assert fit(r1, "hb_least_squares").model != fit(r0, "hb_least_squares").model
    doc = _with(lambda d: d["case"].update(shear_rate_correction="krieger"))
    assert parse_case(doc, "k.toml").checks[0].readings.shear_rate_correction == "krieger"
    bad = _with(lambda d: d["case"].update(shear_rate_correction="exact"))
    with pytest.raises(InputError, match="shear_rate_correction"):
        parse_case(bad, "bad.toml")
    with pytest.raises(InputError, match="--shear-rate-correction"):
        case.with_shear_rate_correction("bogus")


def test_cli_rheology_option(capsys):
    assert main(["rheology", str(DEMO), "--json", "--shear-rate-correction", "krieger"]) == 0
    out = capsys.readouterr().out
    assert main(["rheology", str(DEMO), "--json"]) == 0
    assert capsys.readouterr().out != out
    assert main(["rheology", str(DEMO), "--shear-rate-correction", "bogus"]) == 2


def test_rheology_sheet_shows_the_temperature_table():
    wb = openpyxl.load_workbook(demo_report_path(), read_only=True)
    ws = wb["Rheology"]
    rows = [[c for c in r if c is not None] for r in ws.iter_rows(values_only=True)]
    i = next(k for k, r in enumerate(rows) if r and "at its cup temperatures" in str(r[0]))
    assert rows[i + 3][:7] == pytest.approx([120.0, 68.0, 44.0, 35.0, 25.0, 10.0, 9.0])
    assert rows[i + 4][:7] == pytest.approx([150.0, 55.0, 37.0, 29.0, 21.0, 9.0, 8.0])
    wb.close()


def test_worksheet_functions_match_calc():
    cool = [[600, 68], [300, 44], [200, 35], [100, 25], [6, 10], [3, 9]]
    hot = [[600, 55], [300, 37], [200, 29], [100, 21], [6, 9], [3, 8]]
    case = load_case(DEMO)
    ref = fit(case.checks[-1].readings_at[0], "hb_least_squares").model
    k_field = si_factor("lbf/100ft2", "stress")  # K shown in lbf·sⁿ/100ft²
    got = BF_PARAM_AT_T(cool, 120, hot, 150, 150, "k", "hb_least_squares")
    assert got == pytest.approx(ref.k / k_field, rel=1e-9)
    assert BF_PARAM_AT_T(cool, 120, hot, 150, 20, "k").startswith("#BF!")
    g = BF_SHEAR_RATE_KRIEGER(cool)
    want, _ = krieger_shear_rate([3, 6, 100, 200, 300, 600], [9, 10, 25, 35, 44, 68])
    assert [x[0] for x in g] == pytest.approx(list(want), rel=1e-15)
