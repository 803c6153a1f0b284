"""The demo case (workbooks/demo-case.toml, invented) expressed in calc.geometry and calc.bit.

Expected TVDs and lengths come from the invented demo scenario's own hand check
(shared/demo-scenario.toml: "invented demo scenario, hand check"); they are not published data.
"""

import re

import numpy as np
import pytest

from addin import text
from calc.bit import bit_hydraulics
from calc.errors import InputError
from calc.geometry import HoleSection
from calc.units import from_si, si_factor, to_si
from tests.demo_well import demo_well, survey_td

FT = si_factor("ft")


def load_demo(bit_depth_ft=10950.0, extra_casing=()):
    """The demo well with the bit at ``bit_depth_ft`` [ft], the hole drilled to the survey TD."""
    return demo_well(
        0, bit_depth=bit_depth_ft * FT, hole_depth=survey_td(), extra_casing=extra_casing
    )


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
    with pytest.raises(InputError, match="tool joint at or above the liner ID") as err:
        load_demo(extra_casing=[liner])
    shown = r"= 6\.625 in: .* allowed: < liner ID 6\.184 in of '7 in liner' \(at 7,900 ft\)"
    assert re.search(shown, text.error(err.value, "oilfield"))


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
