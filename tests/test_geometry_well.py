"""Hole, string and well: bad-input checks (calc/METHODS.md §16.3) and interval properties.

Expected behaviour of each check comes from common practice (calc/METHODS.md §16.3) or the
invented demo scenario's [[bad_input_example]] list; property tests check exact bookkeeping
(lengths add up to the bit depth, TVD ≤ MD).
"""

import re

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from addin import text
from calc.bit import Bit
from calc.errors import InputError
from calc.geometry import (
    DrillString,
    Hole,
    HoleSection,
    StringComponent,
    Survey,
    ToolPressureDrop,
    Well,
)

IN = 0.0254
FT = 0.3048


def _survey(depth=4000.0):
    return Survey([0.0, 1000.0, depth], [0.0, 0.0, 20.0], [0.0, 0.0, 90.0])


def _hole(depth=4000.0, **kw):
    casing = HoleSection("9-5/8 in casing", 0.0, 2500.0, 8.835 * IN, drift=8.679 * IN)
    return Hole.from_casing([casing], depth=depth, bit_size=8.5 * IN, **kw)


def _string(**dp):
    return DrillString(
        [
            StringComponent("collars", 6.5 * IN, 2.8125 * IN, 200.0),
            StringComponent(
                "drill pipe", 5.0 * IN, 4.276 * IN, "fill",
                tool_joint_od=6.625 * IN, tool_joint_id=3.25 * IN,
                joint_length=31.5 * FT, tool_joint_length=1.5 * FT, **dp,
            ),
        ]
    )  # fmt: skip


def _well(bit_depth=3800.0, hole=None, string=None, bit=None, **kw):
    return Well(
        _survey(),
        hole or _hole(),
        string or _string(),
        bit or Bit(8.5 * IN, nozzles=[12] * 6),
        bit_depth=bit_depth,
        **kw,
    )


# ------------------------------------------------------------------ components
@pytest.mark.parametrize(
    ("kwargs", "match"),
    [
        ({"od": 5 * IN, "id": 5 * IN, "length": 10.0}, "ID at or above the OD"),
        ({"od": 5 * IN, "id": 6 * IN, "length": 10.0}, "ID of 'c'"),
        ({"od": 5 * IN, "id": 4 * IN, "length": -1.0}, "length of 'c'"),
        ({"od": 5 * IN, "id": 4 * IN, "length": "rest"}, "'fill'"),
        ({"od": 5 * IN, "id": 4 * IN, "length": 9.0, "tool_joint_od": 4.5 * IN}, ">= body OD"),
        (
            {"od": 5 * IN, "id": 4 * IN, "length": 9.0, "tool_joint_od": 6 * IN,
             "tool_joint_id": 6 * IN},
            "tool-joint ID",
        ),
        (
            {"od": 5 * IN, "id": 4 * IN, "length": 9.0, "tool_joint_od": 6 * IN,
             "joint_length": 9.0, "tool_joint_length": 9.0},
            "< joint length",
        ),
        ({"od": 5 * IN, "id": 4 * IN, "length": 9.0, "joint_length": 9.0}, "tool-joint OD"),
    ],
)  # fmt: skip
def test_component_bad_input(kwargs, match):
    # common practice (calc/METHODS.md §16.3): wall 0 < ID < OD and tool-joint consistency
    with pytest.raises(InputError, match=match):
        StringComponent("c", **kwargs)


def test_component_defaults_are_noted():
    c = StringComponent("dp", 5 * IN, 4.276 * IN, 100.0, tool_joint_od=6.625 * IN)
    assert {n.code for n in c.notes} == {"default_joint_length", "default_tool_joint_length"}
    # defaults: 30 ft joint (common practice), 1.5 ft tool joint (from memory,
    # calc/METHODS.md §13.2)
    assert c.tool_joint_fraction == pytest.approx(1.5 / 30.0)
    assert c.tool_joint_id == c.id


def test_joint_length_in_metres_typed_as_feet_is_noted():
    # common practice (calc/METHODS.md §16.3): a 9.4 'ft' joint suggests metres
    c = StringComponent("dp", 5 * IN, 4.276 * IN, 100.0, tool_joint_od=6.625 * IN,
                        joint_length=9.4 * FT, tool_joint_length=0.5 * FT)  # fmt: skip
    assert "odd_joint_length" in [n.code for n in c.notes]


def test_two_fill_components_refused():
    a = StringComponent("a", 5 * IN, 4 * IN, "fill")
    with pytest.raises(InputError, match="at most one"):
        DrillString([a, a])


def test_string_longer_than_bit_depth():
    # common practice (calc/METHODS.md §16.3): components sum to bit MD, or pipe fills to surface;
    # ERROR if too long
    with pytest.raises(InputError, match="string longer than the bit depth"):
        _string().lengths_for(150.0)
    fixed = DrillString([StringComponent("a", 5 * IN, 4 * IN, 100.0)])
    with pytest.raises(InputError, match="string longer than the bit depth"):
        fixed.lengths_for(90.0)
    with pytest.raises(InputError, match="does not reach surface"):
        fixed.lengths_for(110.0)
    assert fixed.lengths_for(100.005)[0] == pytest.approx(100.005)


# ------------------------------------------------------------------ hole
def test_hole_innermost_id_governs():
    casing = HoleSection("casing", 0.0, 2000.0, 8.835 * IN)
    liner = HoleSection("liner", 1800.0, 3000.0, 6.184 * IN, "liner")
    hole = Hole.from_casing([casing, liner], depth=3500.0, bit_size=6.125 * IN)
    d = hole.diameter_at([100.0, 1850.0, 2500.0, 3200.0])
    np.testing.assert_allclose(d / IN, [8.835, 6.184, 6.184, 6.125])
    assert hole.sections[hole.section_index_at(3200.0)].kind == "open_hole"


def test_shoe_below_hole_depth():
    with pytest.raises(InputError, match="shoe below the hole depth"):
        Hole([HoleSection("c", 0.0, 3000.0, 8.835 * IN)], depth=2500.0)


def test_gap_in_hole_sections():
    with pytest.raises(InputError, match="gap in the sections"):
        Hole([HoleSection("a", 0.0, 100.0, 0.3), HoleSection("b", 200.0, 300.0, 0.3)])


@pytest.mark.parametrize(
    ("kwargs", "match"),
    [
        ({"kind": "pipe"}, "hole section kind"),
        ({"drift": 9.0 * IN}, "drift"),
        ({"od": 8.0 * IN}, "< OD"),
        ({"bit_size": 8.5 * IN}, "only for an open-hole"),
        ({"top": 600.0}, "> top"),
    ],
)
def test_hole_section_bad_input(kwargs, match):
    args = {"name": "c", "top": 0.0, "bottom": 500.0, "diameter": 8.835 * IN, **kwargs}
    with pytest.raises(InputError, match=match):
        HoleSection(**args)


def test_open_hole_notes():
    # common practice (calc/METHODS.md §16.3): open hole ≥ bit size; washout factor ≤ ~1.3 → WARN
    under = _hole(diameter=8.4 * IN)
    assert [n.code for n in under.notes] == ["open_hole_below_bit"]
    washed = _hole(washout_factor=1.4)
    assert [n.code for n in washed.notes] == ["large_washout"]
    assert washed.sections[-1].diameter == pytest.approx(1.4 * 8.5 * IN)
    assert _hole(washout_factor=1.1).notes == ()


# ------------------------------------------------------------------ well
def test_bit_below_hole_depth():
    with pytest.raises(InputError, match="string longer than the hole"):
        _well(bit_depth=4100.0)


def test_bit_larger_than_drift_is_a_warning():
    # common practice (calc/METHODS.md §16.3): an 8.75 in bit will not pass an 8.379 in drift
    casing = HoleSection("casing", 0.0, 2500.0, 8.535 * IN, drift=8.379 * IN)
    hole = Hole.from_casing([casing], depth=4000.0, bit_size=8.75 * IN)
    w = _well(hole=hole, bit=Bit(8.75 * IN, nozzles=[12] * 6))
    msgs = [text.note(n) for n in w.notes if n.code == "bit_above_drift"]
    assert msgs == ["8.75 in bit will not pass the 8.379 in drift of 'casing'"]


def test_pipe_body_od_at_hole_id():
    # common practice (calc/METHODS.md §16.3): every OD and tool joint < hole/casing ID over its
    # interval → ERROR
    fat = DrillString([
        StringComponent("8-1/2 in sub", 8.5 * IN, 3 * IN, 10.0),
        StringComponent("pipe", 5 * IN, 4 * IN, "fill"),
    ])  # fmt: skip
    hole = _hole(diameter=8.5 * IN)
    with pytest.raises(InputError, match="pipe OD at or above the open hole ID") as err:
        _well(hole=hole, string=fat)
    shown = r"= 8\.5 in: .* allowed: < open hole ID 8\.5 in of .* \(at 12,434 ft\)"
    assert re.search(shown, text.error(err.value, "oilfield"))


def test_clearance_message_in_metric_units():
    liner = HoleSection("7 in liner", 1000.0, 4000.0, 6.184 * IN, "liner")
    casing = HoleSection("casing", 0.0, 2500.0, 8.835 * IN)
    hole = Hole([casing, liner])
    with pytest.raises(InputError) as err:
        _well(hole=hole)
    msg = r"= 168\.3 mm: tool joint at or above the liner ID; allowed: < liner ID 157\.1 mm"
    msg += r" .*\(at 1,000 m\)"
    assert re.search(msg, text.error(err.value, "metric"))


def test_well_notes_collect_parts():
    w = _well(bit_depth=3800.0)
    codes = [n.code for n in w.notes]
    assert "string_filled" in codes
    w2 = Well(Survey([0.0, 1000.0], [0.0, 0.0], [0.0, 0.0]), _hole(), _string(),
              Bit(8.5 * IN, nozzles=[12] * 6), bit_depth=3800.0)  # fmt: skip
    assert "survey_projected" in [n.code for n in w2.notes]


def test_wrong_types_refused():
    with pytest.raises(InputError, match="survey"):
        Well("survey", _hole(), _string(), Bit(8.5 * IN, tfa=3e-4), bit_depth=3000.0)


def test_intervals_frozen_and_ordered():
    iv = _well().flow_intervals()
    with pytest.raises(ValueError, match="read-only"):
        iv.length[0] = 1.0
    s, a = iv.string, iv.annulus
    assert np.all(np.diff(s.top_md) >= 0) and np.all(np.diff(a.top_md) <= 0)
    # tool-joint sub-intervals carry the tool-joint ID inside, OD outside
    assert set(np.round(s.select(s.is_tool_joint).outer_diameter / IN, 4)) == {3.25}
    assert set(np.round(a.select(a.is_tool_joint).inner_diameter / IN, 4)) == {6.625}
    assert np.all(s.inner_diameter == 0.0)
    assert len(iv.to_records()) == len(iv)


# ------------------------------------------------------------------ property: bookkeeping
@st.composite
def wells(draw):
    depth = draw(st.floats(500.0, 6000.0))
    n_st = draw(st.integers(1, 5))
    steps = draw(st.lists(st.floats(50.0, 1500.0), min_size=n_st, max_size=n_st))
    md = np.cumsum([0.0, *steps])
    inc = [0.0, *draw(st.lists(st.floats(0.0, 95.0), min_size=n_st, max_size=n_st))]
    azi = [0.0, *draw(st.lists(st.floats(0.0, 359.0), min_size=n_st, max_size=n_st))]
    survey = Survey(md, np.minimum(inc, np.arange(n_st + 1) * 30.0), azi)
    shoe = draw(st.floats(0.05, 0.95)) * depth
    sections = [HoleSection("casing", 0.0, shoe, 0.25)]
    if draw(st.booleans()):
        top = draw(st.floats(0.1, 0.99)) * shoe
        sections.append(HoleSection("liner", top, min(depth, shoe + 300.0), 0.22, "liner"))
    hole = Hole.from_casing(sections, depth=depth, bit_size=0.2159, diameter=0.22)
    bit_depth = draw(st.floats(0.3, 1.0)) * depth
    n_comp = draw(st.integers(1, 5))
    comps = []
    for k in range(n_comp):
        od = draw(st.floats(0.08, 0.17))
        tj = draw(st.booleans())
        comps.append(
            StringComponent(
                f"c{k}", od, 0.5 * od, draw(st.floats(1.0, 0.2 * bit_depth / n_comp)),
                tool_joint_od=od * 1.2 if tj else None,
                joint_length=9.4 if tj else None,
                tool_joint_length=draw(st.floats(0.2, 1.0)) if tj else None,
            )
        )  # fmt: skip
    if draw(st.booleans()):
        comps[-1] = StringComponent("dp", 0.127, 0.1086, "fill", tool_joint_od=0.168,
                                    joint_length=9.6, tool_joint_length=0.46)  # fmt: skip
        string = DrillString(comps)
    else:
        total = sum(c.length for c in comps)
        comps = [
            StringComponent(c.name, c.od, c.id, c.length * bit_depth / total,
                            c.tool_joint_od, None, c.joint_length, c.tool_joint_length)
            for c in comps
        ]  # fmt: skip
        string = DrillString(comps)
    return Well(survey, hole, string, Bit(0.2159, tfa=4e-4), bit_depth=bit_depth)


@settings(max_examples=60, deadline=None)
@given(wells())
def test_property_intervals_cover_each_path_exactly_once(well):
    iv = well.flow_intervals()
    for path in ("string", "annulus"):
        sub = iv.select(path)
        # lengths sum to the bit depth; vertical extents to the bit TVD (exact bookkeeping)
        assert sub.length.sum() == pytest.approx(well.bit_depth, rel=1e-9)
        assert sub.delta_tvd.sum() == pytest.approx(well.bit_tvd, rel=1e-9, abs=1e-9)
        # the MD spans tile [0, bit depth] with no gap or overlap, shares adding to 1 per span
        spans = {}
        for t, b, sh in zip(sub.top_md, sub.bottom_md, sub.share, strict=True):
            spans[(t, b)] = spans.get((t, b), 0.0) + sh
        edges = sorted(spans)
        assert edges[0][0] == 0.0 and edges[-1][1] == pytest.approx(well.bit_depth)
        assert all(edges[i][1] == edges[i + 1][0] for i in range(len(edges) - 1))
        assert all(v == pytest.approx(1.0) for v in spans.values())
    assert np.all(iv.top_tvd <= iv.top_md + 1e-9) and np.all(iv.bottom_tvd <= iv.bottom_md + 1e-9)
    ann = iv.annulus
    assert np.all(ann.inner_diameter < ann.outer_diameter)
    # each annulus row sits in the innermost section at its midpoint
    mid = 0.5 * (ann.top_md + ann.bottom_md)
    np.testing.assert_allclose(ann.outer_diameter, well.hole.diameter_at(mid))


# ------------------------------------------------------------------ tool drops covering bores
def _tool(components, name="MWD"):
    return ToolPressureDrop(2.0e6, 1300.0, 0.03, name=name, components=components)


def test_tool_drop_components_checked_against_the_string():
    w = _well(tool_drops=[_tool(("collars",))])
    assert w.tool_covered == ("collars",)
    assert _well().tool_covered == ()
    with pytest.raises(InputError, match="did you mean 'collars'") as exc:
        _well(tool_drops=[_tool(("colars",))])
    assert exc.value.name == "component covered by 'MWD'" and exc.value.value == "colars"
    with pytest.raises(InputError, match="already by 'MWD'"):
        _well(tool_drops=[_tool(("collars",)), _tool(("collars",), name="motor")])


@pytest.mark.parametrize("bad", [(3.0,), ("collars", "collars"), ("",), 5])
def test_tool_drop_components_bad_input(bad):
    with pytest.raises(InputError, match="components of 'MWD'"):
        _tool(bad)


def test_tool_drop_single_name_is_one_component():
    assert _tool("collars").components == ("collars",)
