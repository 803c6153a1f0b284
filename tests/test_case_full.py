"""The whole case file → calc inputs: conversions, per-value units, errors naming the place.

External references: unit factors NIST SP 811 (2008) App. B (ft = 0.3048 m, in = 0.0254 m,
ppg = 119.826427 kg/m³, psi = 6894.757 Pa, gpm = 6.30902e-5 m³/s).
"""

from __future__ import annotations

import tomllib

import pytest
from _report_demo import DEMO

from addin.case import load_case, parse_case
from calc.errors import InputError


def _doc():
    return tomllib.loads(DEMO.read_text(encoding="utf-8"))


def test_demo_case_converts_to_si():
    case = load_case(DEMO)
    assert case.unit_system == "oilfield"
    assert case.sections["open_hole"]["diameter"] == pytest.approx(8.6 * 0.0254)  # NIST
    c9 = case.casings[2]
    assert c9.bottom == pytest.approx(8200 * 0.3048) and c9.diameter == pytest.approx(
        8.835 * 0.0254
    )
    assert c9.shoe_test == pytest.approx(14.5 * 119.826427316897)
    assert case.limits["surface_rating"] == pytest.approx(5000 * 6894.757293168)
    assert case.check_value(-1, "flow_rate") == pytest.approx(522 * 6.30901964e-5)
    assert case.bit.nozzles == (12, 12, 12, 11, 11, 11)
    assert case.tool_drops[0].flow_window == pytest.approx(
        (400 * 6.30901964e-5, 650 * 6.30901964e-5)
    )
    assert len(case.weak_points) == 2 and case.window.tvd.size == 10
    well = case.well()
    assert well.bit_depth == pytest.approx(11880 * 0.3048)


def test_per_value_units_and_other_unit_systems():
    doc = _doc()
    doc["open_hole"]["diameter"] = "218.44 mm"  # = 8.6 in
    doc["check"][-1]["density"] = "1342.06 kg/m3"  # ≈ 11.2 ppg
    case = parse_case(doc, "x.toml")
    assert case.sections["open_hole"]["diameter"] == pytest.approx(8.6 * 0.0254)
    assert case.check_value(-1, "density") == pytest.approx(1342.06)
    doc = _doc()
    doc["case"]["units"] = "metric"
    doc["open_hole"] = {"bit_size": 215.9, "diameter": 218.44}  # mm in the metric system
    case = parse_case(doc, "m.toml")
    assert case.open_hole["bit_size"] == pytest.approx(0.2159)


@pytest.mark.parametrize(
    "mutate, needle",
    [
        (lambda d: d["bit"].update(noozles=[12]), "did you mean 'nozzles'"),
        (lambda d: d["string"][0].pop("od"), "string[1].od"),
        (lambda d: d["casing"][1].update(shoe="deep"), "casing[2].shoe"),
        (lambda d: d.pop("survey"), "survey"),
        (lambda d: d["survey"].update(stations=[[0, 0]]), "survey.stations[0]"),
        (lambda d: d["string"][-1].update(length="everything"), "string[10].length"),
        (lambda d: d["trip"].update(string_end="half"), "trip.string_end"),
        (lambda d: d["pressure_window"].update(pore=[9.0] * 9 + [20.0]), "pore"),
    ],
)
def test_errors_name_file_and_key(mutate, needle):
    doc = _doc()
    mutate(doc)
    with pytest.raises(InputError) as err:
        case = parse_case(doc, "demo.toml")
        case.well()
        _ = case.trip, case.window
    msg = str(err.value)
    assert "demo.toml" in msg and needle in msg, msg
    assert "\n" not in msg


def test_tool_pressure_covers_reaches_the_well_and_typos_are_named():
    case = parse_case(_doc(), "demo.toml")
    # demo case [tool_pressure].covers: the RSS and the MWD/LWD
    assert case.tool_drops[0].components == (
        "6-3/4 in rotary steerable",
        "6-3/4 in MWD/LWD (with PWD)",
    )
    assert case.well().tool_covered == case.tool_drops[0].components
    doc = _doc()
    doc["tool_pressure"]["covers"] = ["6-3/4 in rotary steerabel"]
    with pytest.raises(InputError, match="did you mean '6-3/4 in rotary steerable'") as exc:
        parse_case(doc, "demo.toml").well()
    assert exc.value.name.startswith("demo.toml")
    doc["tool_pressure"]["covers"] = "6-3/4 in rotary steerable"
    with pytest.raises(InputError, match=r"tool_pressure\.covers"):
        parse_case(doc, "demo.toml")
