"""Case-file parsing of [case], [[check]] and [[slurry]] (addin.case)."""

import tomllib
from pathlib import Path

import pytest

from addin.case import load_case, parse_case, parse_quantity
from calc.errors import InputError
from calc.rheology.viscometer import FIELD_STRESS

DEMO = Path(__file__).resolve().parents[1] / "workbooks" / "demo-case.toml"


def demo_data():
    return tomllib.loads(DEMO.read_text(encoding="utf-8"))


def test_demo_case_loads():
    case = load_case(DEMO)
    assert case.unit_system == "oilfield"
    assert [c.label for c in case.checks] == ["D1 05:30", "D2 05:30"]
    r = case.checks[0].readings
    assert r.reading(600) == 56 and r.gels["10min"] == pytest.approx(12.0)
    # 120 °F = 322.0389 K (exact: (120 − 32)·5/9 + 273.15)
    assert r.temperature == pytest.approx((120 - 32) * 5 / 9 + 273.15)
    # cuttings density "2.6 sg" carries its own unit: 2600 kg/m³
    assert case.checks[0].values["cuttings"]["density"] == pytest.approx(2600.0)
    # 11.0 ppg = 1318.09 kg/m³ (NIST SP 811: lb/gal = 119.826427 kg/m³)
    assert case.checks[0].values["density"] == pytest.approx(11.0 * 119.826427317, rel=1e-9)
    assert [s.readings.mode for s in case.slurries] == ["cement", "cement"]
    assert "survey" in case.raw and "check" not in case.raw


def test_quantities():
    assert parse_quantity("8.6 in", "diameter", "si") == pytest.approx(8.6 * 0.0254)
    assert parse_quantity(12.43, "flow_rate", "oilfield") == pytest.approx(12.43 * 6.30901964e-5)
    assert parse_quantity("12.43 bbl/min", "flow_rate", "si") == pytest.approx(
        12.43 * 0.158987294928 / 60
    )
    assert parse_quantity("1.5", "density", "metric") == 1.5
    for bad in ("abc", "2.6 furlongs", "3 psi", True, None, [1]):
        with pytest.raises(InputError):
            parse_quantity(bad, "density", "oilfield", "x.density")


def test_metric_case_gels_and_units():
    chk = demo_data()["check"][0]
    # a metric case of its own: the demo's oilfield numbers read as metric are refused by the
    # plausibility guard (tests/test_plausibility.py)
    data = {
        "case": {"units": "metric"},
        "check": [{"label": chk["label"], "dial": chk["dial"], "density": 1318.0}],
    }
    data["check"][0]["gels"] = {"10s": 3.35, "10min": "12 lbf/100ft2"}
    case = parse_case(data, "metric.toml")
    g = case.checks[0].readings.gels
    assert g["10s"] == pytest.approx(3.35 / FIELD_STRESS)  # 3.35 Pa as a field reading
    assert g["10min"] == pytest.approx(12.0)


@pytest.mark.parametrize(
    ("edit", "match"),
    [
        (lambda d: d["check"][0].update(densty=11.0), "did you mean 'density'"),
        (lambda d: d.update(chek=[]), "did you mean 'check'"),
        (lambda d: d["check"][0].update(density="heavy"), r"check\[1\]\.density"),
        (lambda d: d["check"][0].update(density="11 furlong"), "density"),
        (lambda d: d["check"][0]["dial"].update({"6": 7, "3": 8}), "6 rpm"),
        (lambda d: d["check"][0]["dial"].update({"fast": 7}), "rotor speed"),
        (lambda d: d["check"][0]["dial"].update({"600": "56"}), "a number"),
        (lambda d: d["check"][0].pop("label"), "missing"),
        (lambda d: d["check"][0].pop("dial"), "dial"),
        (lambda d: d["case"].update(units="imperial"), "units"),
        (lambda d: d["check"][0]["gels"].update({"10mins": 3}), "did you mean"),
        (lambda d: d["check"][0]["program"].update(pv=[22, 12]), "low <= high"),
    ],
)
def test_bad_case_values(edit, match):
    data = demo_data()
    edit(data)
    with pytest.raises(InputError, match=match) as exc:
        parse_case(data, "demo-case.toml")
    assert "demo-case.toml" in str(exc.value)


def test_slurry_ramps():
    data = demo_data()
    s = data["slurry"][0]
    s.pop("dial")
    s["dial_up"] = {"300": 74, "200": 60, "100": 41, "3": 9}
    s["dial_down"] = {"300": 70, "200": 56, "100": 39, "3": 9}
    case = parse_case(data, "ramps.toml")
    r = case.slurries[0].readings
    assert r.reading(300) == 72.0
    assert r.up_down_ratio[-1] == pytest.approx(74 / 70)


def test_missing_and_broken_files(tmp_path):
    with pytest.raises(InputError, match="readable"):
        load_case(tmp_path / "nope.toml")
    bad = tmp_path / "bad.toml"
    bad.write_text("[case\nunits = 'oilfield'", encoding="utf-8")
    with pytest.raises(InputError, match="TOML"):
        load_case(bad)
