"""The whole case file → calc inputs: conversions, per-value units, errors naming the place.

External references: the unit factors are built below from their exact definitions in NIST
SP 811 (2008), Appendix B (B.8 and B.9): in = 0.0254 m, ft = 0.3048 m, lb = 0.45359237 kg,
US gallon = 231 in³, lbf = lb·gₙ with gₙ = 9.80665 m/s² (CGPM 1901), psi = lbf/in²; and each is
cross-checked against a fresh pint registry (pint's own definitions file, not calc.units).
"""

from __future__ import annotations

import tomllib

import pytest
from _report_demo import DEMO

from addin.case import load_case, parse_case
from calc.errors import InputError

# Exact definitions (NIST SP 811 (2008) App. B); derived factors, no rounded numbers.
IN = 0.0254  # m, exact
FT = 12 * IN  # m (= 0.3048, exact)
LB = 0.45359237  # kg, exact
GN = 9.80665  # m/s², standard gravity, exact
GAL = 231 * IN**3  # m³, US gallon, exact
PPG = LB / GAL  # kg/m³ per lb/gal
GPM = GAL / 60  # m³/s per US gal/min
PSI = LB * GN / IN**2  # Pa per lbf/in²
TIGHT = 1e-12  # both sides are the same exact product in double precision


def test_exact_definitions_agree_with_pint():
    # pint (a general-purpose units library) with its own definitions, independent of calc.units
    pint = pytest.importorskip("pint")
    u = pint.UnitRegistry()
    for ours, theirs in [
        (IN, u.inch), (FT, u.foot), (PPG, u.pound / u.gallon),
        (GPM, u.gallon / u.minute), (PSI, u.psi),
    ]:  # fmt: skip
        assert ours == pytest.approx((1 * theirs).to_base_units().magnitude, rel=TIGHT)


def _doc():
    return tomllib.loads(DEMO.read_text(encoding="utf-8"))


def test_demo_case_converts_to_si():
    case = load_case(DEMO)
    assert case.unit_system == "oilfield"
    assert case.sections["open_hole"]["diameter"] == pytest.approx(8.6 * IN, rel=TIGHT)
    c9 = case.casings[2]
    assert c9.bottom == pytest.approx(8200 * FT, rel=TIGHT)
    assert c9.diameter == pytest.approx(8.835 * IN, rel=TIGHT)
    assert c9.shoe_test == pytest.approx(14.5 * PPG, rel=TIGHT)
    assert case.limits["surface_rating"] == pytest.approx(5000 * PSI, rel=TIGHT)
    assert case.check_value(-1, "flow_rate") == pytest.approx(522 * GPM, rel=TIGHT)
    assert case.bit.nozzles == (12, 12, 12, 11, 11, 11)
    assert case.tool_drops[0].flow_window == pytest.approx((400 * GPM, 650 * GPM), rel=TIGHT)
    assert len(case.weak_points) == 2 and case.window.tvd.size == 10
    well = case.well()
    assert well.bit_depth == pytest.approx(11880 * FT, rel=TIGHT)


def test_per_value_units_and_other_unit_systems():
    doc = _doc()
    doc["open_hole"]["diameter"] = "218.44 mm"  # = 8.6 in exactly (8.6 × 25.4 mm)
    doc["check"][-1]["density"] = "1342.06 kg/m3"  # ≈ 11.2 ppg
    case = parse_case(doc, "x.toml")
    assert case.sections["open_hole"]["diameter"] == pytest.approx(8.6 * IN, rel=TIGHT)
    assert case.check_value(-1, "density") == pytest.approx(1342.06, rel=TIGHT)
    # a metric case of its own (the demo's oilfield numbers read as metric are refused by the
    # plausibility guard, tests/test_plausibility.py)
    doc = {"case": {"units": "metric"}, "open_hole": {"bit_size": 215.9, "diameter": 218.44}}
    case = parse_case(doc, "m.toml")  # mm in the metric system
    assert case.open_hole["bit_size"] == pytest.approx(215.9e-3, rel=TIGHT)  # mm = 1e-3 m (SI)


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
