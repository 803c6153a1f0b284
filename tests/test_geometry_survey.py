"""Minimum-curvature survey against exact geometry.

Minimum curvature joins stations by circular arcs, so it is exact for a path that *is* made of
circular arcs and straight lines: the checks below build such paths analytically (exact
solution: position on a circle of radius R = 1/curvature) and compare at and between stations.
"""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from addin import text
from calc.errors import InputError
from calc.geometry import Survey
from calc.units import from_si, to_si


def _tangent_to_angles(t):
    inc = np.degrees(np.arccos(np.clip(t[..., 2], -1, 1)))
    azi = np.degrees(np.arctan2(t[..., 1], t[..., 0])) % 360.0
    return inc, azi


def test_vertical_plane_build_section_is_exact():
    # exact solution: build from vertical at KOP with constant build rate B (rad/m):
    # I = B·(MD - KOP), TVD = KOP + sin(I)/B, horizontal = (1 - cos I)/B, along azimuth A.
    kop, build, azi = 300.0, np.radians(3.0) / 30.0, 45.0
    md = np.concatenate([[0.0], np.linspace(kop, kop + np.radians(90.0) / build, 13)])
    inc = np.degrees(np.clip(md - kop, 0, None) * build)
    s = Survey(md, inc, np.full(md.size, azi))
    probe = np.linspace(0.0, md[-1], 401)  # stations and points between them
    i = np.clip(probe - kop, 0, None) * build
    tvd = np.where(probe < kop, probe, kop + np.sin(i) / build)
    horiz = np.where(probe < kop, 0.0, (1 - np.cos(i)) / build)
    pos = s.position_at(probe)
    np.testing.assert_allclose(pos[:, 2], tvd, rtol=0, atol=1e-9)
    np.testing.assert_allclose(pos[:, 0], horiz * np.cos(np.radians(azi)), atol=1e-9)
    np.testing.assert_allclose(pos[:, 1], horiz * np.sin(np.radians(azi)), atol=1e-9)
    np.testing.assert_allclose(s.inclination_at(probe), np.degrees(i), atol=1e-9)
    # dogleg severity equals the build rate on every build segment (exact)
    np.testing.assert_allclose(s.dogleg_severity[1:], build, rtol=1e-12)
    assert from_si(s.dogleg_severity[1], "deg_per_30m") == pytest.approx(3.0, rel=1e-12)


@pytest.mark.parametrize("seed", [0, 1, 2])
def test_arc_in_tilted_plane_is_exact(seed):
    # exact solution: circle of radius R in the plane of t0 and n (unit, orthogonal):
    # t(s) = cos(s/R)·t0 + sin(s/R)·n;  r(s) = R·sin(s/R)·t0 + R·(1 - cos(s/R))·n.
    rng = np.random.default_rng(seed)
    inc0, azi0 = np.radians(rng.uniform(10, 60)), np.radians(rng.uniform(0, 360))
    t0 = np.array([np.sin(inc0) * np.cos(azi0), np.sin(inc0) * np.sin(azi0), np.cos(inc0)])
    v = rng.normal(size=3)
    n = v - v.dot(t0) * t0
    n /= np.linalg.norm(n)
    radius = rng.uniform(300, 1500)
    s_max = radius * np.radians(rng.uniform(20, 60))
    md = np.sort(np.concatenate([[0.0, s_max], rng.uniform(0, s_max, 6)]))
    md = md[np.concatenate([[True], np.diff(md) > 1.0])]
    tan = np.cos(md / radius)[:, None] * t0 + np.sin(md / radius)[:, None] * n
    inc, azi = _tangent_to_angles(tan)
    s = Survey(md, inc, azi, tie_in_tvd=0.0)
    probe = np.linspace(0, md[-1], 97)
    exact = (radius * np.sin(probe / radius))[:, None] * t0 + (
        radius * (1 - np.cos(probe / radius))
    )[:, None] * n
    np.testing.assert_allclose(s.position_at(probe), exact, atol=1e-8)
    exact_inc, _ = _tangent_to_angles(
        np.cos(probe / radius)[:, None] * t0 + np.sin(probe / radius)[:, None] * n
    )
    np.testing.assert_allclose(s.inclination_at(probe), exact_inc, atol=1e-8)


def test_straight_slant_and_hold_projection():
    # exact: a straight hole at inclination I has TVD = MD·cos I and north = MD·sin I·cos A
    inc, azi = 40.0, 100.0
    s = Survey([0.0, 500.0, 1200.0], [inc] * 3, [azi] * 3)
    md = np.array([0.0, 250.0, 1200.0, 1500.0])  # the last is projected below the survey
    pos = s.position_at(md)
    np.testing.assert_allclose(pos[:, 2], md * np.cos(np.radians(inc)), atol=1e-9)
    np.testing.assert_allclose(pos[:, 0], md * np.sin(np.radians(inc)) * np.cos(np.radians(azi)))
    np.testing.assert_allclose(s.dogleg, 0.0, atol=1e-12)
    assert s.inclination_at(1500.0) == pytest.approx(inc)


def test_scalar_in_scalar_out_and_shapes():
    s = Survey([0.0, 1000.0], [0.0, 30.0], [0.0, 0.0])
    assert isinstance(s.tvd_at(500.0), float)
    assert isinstance(s.inclination_at(500.0), float)
    assert s.tvd_at(np.zeros((3, 4))).shape == (3, 4)
    assert s.position_at([1.0, 2.0]).shape == (2, 3)


def test_tiny_doglegs_take_the_straight_limit_without_warnings():
    # straight-line limit (exact): stations differing by 1e-9 degree
    md = np.array([0.0, 100.0, 200.0])
    s = Survey(md, [20.0, 20.0 + 1e-9, 20.0], [10.0, 10.0, 10.0 + 1e-9])
    np.testing.assert_allclose(s.tvd, md * np.cos(np.radians(20.0)), atol=1e-9)
    assert s.inclination_at(150.0) == pytest.approx(20.0, abs=1e-6)


def test_high_dogleg_gives_note_only_above_10_deg_per_100ft():
    # 10°/100 ft threshold: common practice (calc/METHODS.md §16.3)
    ft = 0.3048
    steep = Survey(np.array([0, 1000, 1100]) * ft, [0.0, 0.0, 15.0], [0.0, 0.0, 0.0])
    mild = Survey(np.array([0, 1000, 1100]) * ft, [0.0, 0.0, 5.0], [0.0, 0.0, 0.0])
    assert [n.code for n in steep.notes] == ["high_dogleg"]
    assert "15.0 °/100ft" in text.note(steep.notes[0])
    assert mild.notes == ()


@pytest.mark.parametrize(
    ("md", "inc", "azi", "match"),
    [
        ([0, 100, 100], [0, 1, 2], [0, 0, 0], "survey MD at station 3"),
        ([0, 100, 50], [0, 1, 2], [0, 0, 0], "strictly increasing"),
        ([0, 100], [0, 181], [0, 0], "inclination"),
        ([0, 100], [0, -1], [0, 0], "inclination"),
        ([0, 100], [0, 10], [0, 360], "azimuth"),
        ([0, 100], [0, 10], [0], "same length"),
        ([0, np.nan], [0, 10], [0, 0], "survey MD"),
        ([-5, 100], [0, 10], [0, 0], "survey MD"),
        ([0, 100], [0, 180], [0, 0], "dogleg between stations 1 and 2"),
    ],
)
def test_bad_survey_input(md, inc, azi, match):
    # common practice (calc/METHODS.md §16.3): survey MD increasing, inclination 0–180 (issue 3),
    # azimuth 0–360
    with pytest.raises(InputError, match=match):
        Survey(md, inc, azi)


def test_reported_tvd_checks():
    md = to_si([0.0, 1000.0, 2000.0], "ft")
    with pytest.raises(InputError, match="TVD greater than MD"):
        Survey(md, [0, 0, 0], [0, 0, 0], reported_tvd=md + to_si([0, 0, 5.0], "ft"))
    s = Survey(md, [0, 0, 0], [0, 0, 0], reported_tvd=md - to_si([0, 0, 50.0], "ft"))
    assert [n.code for n in s.notes] == ["tvd_mismatch"]
    ok = Survey(md, [0, 0, 0], [0, 0, 0], reported_tvd=md)
    assert ok.notes == ()


def test_inclination_above_120_gets_note():
    # common practice (calc/METHODS.md §16.3): 0–~120° usual
    s = Survey([0, 100, 200], [0, 60, 130], [0, 0, 0])
    assert "unusual_inclination" in [n.code for n in s.notes]


stations = st.lists(
    st.tuples(
        st.floats(1.0, 300.0),  # MD step
        st.floats(0.0, 180.0),
        st.floats(0.0, 359.99),
    ),
    min_size=1,
    max_size=8,
)


@settings(max_examples=60, deadline=None)
@given(stations)
def test_property_tvd_le_md_and_chord_le_arc(rows):
    # exact geometric facts: TVD ≤ MD from a vertical tie-in; a chord never exceeds its arc
    md = np.cumsum([0.0] + [r[0] for r in rows])
    inc = np.array([0.0] + [r[1] for r in rows])
    azi = np.array([0.0] + [r[2] for r in rows])
    try:
        s = Survey(md, inc, azi)
    except InputError as exc:  # a 180° dogleg between two stations has no defined arc
        assert "dogleg" in str(exc)
        return
    probe = np.linspace(0, md[-1], 50)
    pos = s.position_at(probe)
    assert np.all(pos[:, 2] <= probe + 1e-9)
    chord = np.linalg.norm(np.diff(pos, axis=0), axis=1)
    assert np.all(chord <= np.diff(probe) + 1e-9)
    np.testing.assert_allclose(s.position_at(md)[:, 2], s.tvd, atol=1e-9)
