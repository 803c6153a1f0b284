"""The demo case (workbooks/demo-case.toml, invented) expressed in calc.geometry and calc.bit.

Expected TVDs and lengths come from the invented demo scenario's own hand check
(shared/demo-scenario.toml: "invented demo scenario, hand check"); they are not published data.
"""

import tomllib
from pathlib import Path

import numpy as np
import pytest

from calc.bit import Bit, bit_hydraulics
from calc.errors import InputError
from calc.geometry import (
    DrillString,
    Hole,
    HoleSection,
    StringComponent,
    SurfaceLine,
    Survey,
    ToolPressureDrop,
    Well,
)
from calc.units import from_si, to_si

CASE = Path(__file__).resolve().parents[1] / "workbooks" / "demo-case.toml"
FT = 0.3048


def _si(value, kind):
    """A case value in oilfield units (or as "number unit" text) → SI."""
    unit = {"depth": "ft", "diameter": "in", "density": "ppg", "pressure": "psi", "rate": "gpm"}
    if isinstance(value, str):
        num, _, text = value.strip().partition(" ")
        return to_si(float(num), text)
    return to_si(value, unit[kind])


def load_demo(bit_depth_ft=10950.0, extra_casing=()):
    case = tomllib.loads(CASE.read_text())
    st = np.array(case["survey"]["stations"], dtype=float)
    survey = Survey(_si(st[:, 0], "depth"), st[:, 1], st[:, 2])
    casings = [
        HoleSection(
            c["name"],
            _si(c["top"], "depth"),
            _si(c["shoe"], "depth"),
            _si(c["id"], "diameter"),
            "casing",
            drift=_si(c["drift"], "diameter"),
            shoe_test=_si(c["shoe_test"], "density") if "shoe_test" in c else None,
            od=_si(c["od"], "diameter"),
        )
        for c in case["casing"]
    ]
    casings.extend(extra_casing)
    oh = case["open_hole"]
    hole = Hole.from_casing(
        casings,
        depth=_si(case["survey"]["stations"][-1][0], "depth"),
        bit_size=_si(oh["bit_size"], "diameter"),
        diameter=_si(oh["diameter"], "diameter"),
    )
    comps = []
    for c in case["string"]:
        opt = {}
        for key in ("tool_joint_od", "tool_joint_id"):
            if key in c:
                opt[key] = _si(c[key], "diameter")
        for key in ("joint_length", "tool_joint_length"):
            if key in c:
                opt[key] = _si(c[key], "depth")
        length = c["length"] if c["length"] == "fill" else _si(c["length"], "depth")
        comps.append(
            StringComponent(
                c["name"],
                _si(c["od"], "diameter"),
                _si(c["id"], "diameter"),
                length,
                float_valve=c.get("float_valve", False),
                **opt,
            )
        )
    b = case["bit"]
    bit = Bit(
        _si(b["size"], "diameter"),
        nozzles=b["nozzles"],
        ports=b["ports"],
        discharge_coefficient=b["discharge_coefficient"],
        name=b["name"],
    )
    lines = [
        SurfaceLine(s["name"], _si(s["length"], "depth"), _si(s["id"], "diameter"))
        for s in case["surface_line"]
    ]
    tp = case["tool_pressure"]
    tools = ToolPressureDrop(
        _si(tp["reference_drop"], "pressure"),
        _si(tp["reference_density"], "density"),
        _si(tp["reference_rate"], "rate"),
        tuple(_si(x, "rate") for x in tp["flow_window"]),
        name="RSS + MWD/LWD",
    )
    return Well(survey, hole, DrillString(comps), bit, lines, [tools], bit_depth=bit_depth_ft * FT)


# invented demo scenario, hand check (shared/demo-scenario.toml [survey] tvd column)
SCENARIO_TVD_FT = [
    (0.0, 0.0), (500.0, 500.0), (1500.0, 1500.0), (2500.0, 2500.0), (3000.0, 3000.0),
    (3500.0, 3497.0), (4000.0, 3978.2), (4500.0, 4429.9), (6000.0, 5728.3), (8200.0, 7634.5),
    (9500.0, 8760.4), (10950.0, 10014.8), (11880.0, 10820.6), (12400.0, 11271.2),
]  # fmt: skip


def test_demo_survey_tvd_matches_scenario_hand_check():
    well = load_demo()
    md = np.array([m for m, _ in SCENARIO_TVD_FT]) * FT
    want = np.array([t for _, t in SCENARIO_TVD_FT])
    got = from_si(well.survey.tvd_at(md), "ft")
    # invented demo scenario, hand check: listed to 0.1 ft; "within a few ft" is the brief
    np.testing.assert_allclose(got, want, atol=1.0)
    assert well.bit_tvd / FT == pytest.approx(10014.8, abs=1.0)
    # build section ~2°/100 ft (scenario consistency note)
    dls = from_si(well.survey.dogleg_severity, "deg_per_100ft")
    assert dls[4:6] == pytest.approx([2.0, 2.0], abs=0.05)


def test_demo_string_fill_and_bha_length():
    well = load_demo()
    lengths = well.component_lengths / FT
    # scenario comment: BHA (bit to top of HWDP) 708 ft; DP 10,242 ft on day 1, 11,172 ft on day 2
    assert lengths[:-1].sum() == pytest.approx(708.0)
    assert lengths[-1] == pytest.approx(10242.0)
    assert any(n.code == "string_filled" for n in well.notes)
    day2 = load_demo(11880.0)
    assert day2.component_lengths[-1] / FT == pytest.approx(11172.0)
    assert well.string.components[3].float_valve


def test_demo_intervals_cover_well_and_name_parts():
    well = load_demo()
    iv = well.flow_intervals()
    depth = well.bit_depth
    for path in ("string", "annulus"):
        sub = iv.select(path)
        assert sub.length.sum() == pytest.approx(depth, rel=1e-12)
        assert sub.delta_tvd.sum() == pytest.approx(well.bit_tvd, rel=1e-12)
    s, a = iv.string, iv.annulus
    assert s.top_md[0] == 0.0 and s.bottom_md[-1] == pytest.approx(depth)
    assert a.bottom_md[0] == pytest.approx(depth) and a.top_md[-1] == 0.0
    # drill pipe in the open hole: 5 in body and 6.625 in tool joints inside 8.6 in
    oh = a.select((a.section == "open hole") & (a.component == "5 in drill pipe 19.5 ppf"))
    assert set(np.round(from_si(oh.inner_diameter, "in"), 4)) == {5.0, 6.625}
    assert set(np.round(from_si(oh.outer_diameter, "in"), 4)) == {8.6}
    tj = oh.select(oh.is_tool_joint)
    assert tj.tool_joint_fraction[0] == pytest.approx(1.5 / 31.5)
    # inside casing, the innermost ID governs: 8.835 in above the 8,200 ft shoe
    cased = a.select(a.bottom_md <= 8200 * FT)
    assert np.all(np.isin(np.round(from_si(cased.outer_diameter, "in"), 3), [8.835]))
    assert np.all(iv.top_tvd <= iv.top_md + 1e-9)
    assert set(a.section_kind) == {"casing", "open_hole"}
    assert set(a.select(a.section_kind == "open_hole").section) == {"open hole"}


def test_demo_bit_tfa_and_tools():
    well = load_demo()
    # invented demo scenario [expected_approx]: TFA 0.610 in², nozzle velocity ~275 ft/s
    assert from_si(well.bit.tfa, "in**2") == pytest.approx(0.610, abs=0.001)
    h = bit_hydraulics(to_si(522.0, "gpm"), to_si(11.0, "ppg"), well.bit)
    assert from_si(h.nozzle_velocity, "ft/s") == pytest.approx(275, rel=0.02)
    tool = well.tool_drops[0]
    assert from_si(tool.pressure_drop(to_si(520.0, "gpm"), to_si(11.0, "ppg")), "psi") == (
        pytest.approx(320.0)
    )
    assert tool.rate_notes(to_si(700.0, "gpm"))[0].code == "tool_flow_window"
    assert tool.rate_notes(to_si(522.0, "gpm")) == ()


def test_demo_bad_input_liner_tool_joint_does_not_fit():
    # demo scenario [[bad_input_example]] "pipe OD >= hole ID": 5 in HWDP/DP tool joint 6.625 in
    # inside the planned 7 in liner (ID 6.184 in, top 7,900 ft); expect ERROR
    liner = HoleSection("7 in liner", 7900 * FT, 12400 * FT, to_si(6.184, "in"), "liner",
                        drift=to_si(6.059, "in"))  # fmt: skip
    with pytest.raises(InputError, match=r"tool joint 6\.625 in ≥ liner ID 6\.184 in at 7,900 ft"):
        load_demo(extra_casing=[liner])


def test_demo_depth_grid_includes_boundaries_and_weak_points():
    well = load_demo()
    grid = well.annulus_depth_grid(30 * FT, extra_md=[10680 * FT, 10888 * FT])
    for md in (8200 * FT, 2500 * FT, 10680 * FT, well.bit_depth):
        assert np.any(np.isclose(grid.md, md))
    assert np.all(np.diff(grid.md) > 0)
    assert np.all(grid.tvd <= grid.md + 1e-9)
    np.testing.assert_array_equal(
        well.string_depth_grid(30 * FT).md, well.annulus_depth_grid(30 * FT).md
    )
    k = np.flatnonzero(np.isclose(grid.md, 10680 * FT))[0]
    # invented demo scenario: Sand B top at 10,680 ft MD is 9,780 ft TVD (hand check)
    assert grid.tvd[k] / FT == pytest.approx(9780.0, abs=5.0)
