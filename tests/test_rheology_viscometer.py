"""Viscometer readings: geometry factors, field values (API RP 13B-1), ramps, bad input."""

import math

import numpy as np
import pytest

from calc.errors import InputError
from calc.rheology import (
    STANDARD_GEOMETRY,
    ViscometerGeometry,
    ViscometerReadings,
    couette_shear_rate_per_rpm,
)
from calc.rheology.viscometer import CENTIPOISE, FIELD_STRESS

SPEEDS = [600, 300, 200, 100, 6, 3]
D1 = [56, 37, 29, 20, 8, 7]  # demo check D1 (invented demo data, workbooks/demo-case.toml)


def codes(notes):
    return [n.code for n in notes]


# ---------------------------------------------------------------- geometry (API RP 13B-1)
def test_shear_rate_factor_from_radii():
    # γ̇ = 2ωRc²/(Rc² − Rb²) with Rc = 1.8415 cm, Rb = 1.7245 cm (radii from memory, not yet
    # checked against the source — calc/METHODS.md §1.1).  Exact evaluation of the Couette formula:
    rc, rb = 1.8415, 1.7245
    expected = (2 * math.pi / 60) * 2 * rc**2 / (rc**2 - rb**2)
    assert STANDARD_GEOMETRY.shear_rate_per_rpm == pytest.approx(expected, rel=1e-12)
    assert expected == pytest.approx(1.7023, abs=5e-5)  # derived, calc/METHODS.md §1.1
    # API RP 13B-1 / field texts print 1.703 s⁻¹ per rpm (from memory, not yet checked
    # against the source — calc/METHODS.md §1.1); the radii give 1.70230, so the printed value
    # agrees to 0.04 % (not to its last digit).
    assert STANDARD_GEOMETRY.shear_rate_per_rpm == pytest.approx(1.703, rel=5e-4)


def test_standard_shear_rates_match_trade_values():
    # 600, 300 and 3 rpm are about 1022, 511 and 5.1 s⁻¹ (common practice; Saasen & Ytrehus
    # 2020, seen second-hand — calc/METHODS.md §16.1)
    r = ViscometerReadings(SPEEDS, D1)
    g = dict(zip(r.speeds, r.shear_rate, strict=True))
    assert g[600] == pytest.approx(1022, rel=1e-3)
    assert g[300] == pytest.approx(511, rel=1e-3)
    assert g[3] == pytest.approx(5.11, rel=1e-2)


def test_stress_factor_k1_k2():
    # τ = k1·k2·θ, k1 = 386 dyn·cm/deg, k2 = 0.01323 cm⁻³ (from memory, not yet checked
    # against the source — calc/METHODS.md §1.2): 5.107 dyn/cm² = 0.5107 Pa per degree; 1.0666
    # lbf/100ft² (derived, calc/METHODS.md §1.2); API RP 13D (2010) uses 1.066 (from memory, not
    # yet checked against the source — calc/METHODS.md §1.2).
    assert STANDARD_GEOMETRY.stress_per_degree == pytest.approx(386 * 0.01323 * 0.1, rel=1e-12)
    assert STANDARD_GEOMETRY.stress_per_degree == pytest.approx(0.5107, abs=5e-5)
    assert STANDARD_GEOMETRY.stress_per_degree / FIELD_STRESS == pytest.approx(1.0666, abs=5e-5)
    assert STANDARD_GEOMETRY.stress_per_degree / FIELD_STRESS == pytest.approx(1.066, abs=1e-3)


def test_newtonian_viscosity_equals_theta300():
    # μ[cP] = θ300 for R1-B1-F1 (derived, calc/METHODS.md §1.2: 5.107/510.7 = 0.01 P), to the
    # 0.003 % the rounded constants allow.
    g300 = 300 * STANDARD_GEOMETRY.shear_rate_per_rpm
    mu = 20.0 * STANDARD_GEOMETRY.stress_per_degree / g300
    assert mu / CENTIPOISE == pytest.approx(20.0, rel=1e-3)


def test_other_geometry_and_spring_factor():
    g = ViscometerGeometry.from_dimensions(0.018415, 0.017245, 386e-7, 0.01323e6)
    assert g.shear_rate_per_rpm == pytest.approx(STANDARD_GEOMETRY.shear_rate_per_rpm)
    g2 = STANDARD_GEOMETRY.with_spring_factor(2.0)
    r1 = ViscometerReadings(SPEEDS, D1)
    r2 = ViscometerReadings(SPEEDS, np.array(D1) / 2, geometry=g2)
    np.testing.assert_allclose(r2.shear_stress, r1.shear_stress, rtol=1e-12)
    assert r2.pv == pytest.approx(r1.pv)
    explicit = ViscometerGeometry("maker's table", 1.0, 0.25)
    r3 = ViscometerReadings([100, 10], [40, 8], geometry=explicit)
    np.testing.assert_allclose(r3.shear_rate, [10, 100])
    np.testing.assert_allclose(r3.shear_stress, [2.0, 10.0])
    with pytest.raises(InputError):
        couette_shear_rate_per_rpm(0.017, 0.018)
    with pytest.raises(InputError):
        ViscometerGeometry("bad", -1.0, 0.5)


# ---------------------------------------------------------------- field values (API RP 13B-1)
def test_pv_yp_lsyp_av_field_definitions():
    # PV = θ600 − θ300 cP, YP = θ300 − PV lbf/100ft², AV = θ600/2 (API RP 13B-1);
    # LSYP = 2θ3 − θ6 (Guo & Liu 2011 eq. 2.12).  Demo D1: 19 cP, 18, 28 cP, 6.
    r = ViscometerReadings(SPEEDS, D1)
    assert r.pv == pytest.approx(19 * 1e-3)
    assert r.yp == pytest.approx(18 * FIELD_STRESS)
    assert r.av == pytest.approx(28 * 1e-3)
    assert r.lsyp == pytest.approx(6 * FIELD_STRESS)
    # FIELD_STRESS is NIST SP 811: lbf/100ft² = 0.478802589803 Pa (calc/METHODS.md §0.1)
    assert FIELD_STRESS == pytest.approx(0.478802589803, rel=1e-11)


def test_gels_and_order_note():
    r = ViscometerReadings(SPEEDS, D1, gels={"10 s": 7, "10min": 12, "30 min": 15})
    assert r.gels == {"10s": 7.0, "10min": 12.0, "30min": 15.0}
    assert r.gels_si["10min"] == pytest.approx(12 * FIELD_STRESS)
    rev = ViscometerReadings(SPEEDS, D1, gels={"10s": 12, "10min": 7})
    assert "gels_reversed" in codes(rev.notes)
    with pytest.raises(InputError, match="did you mean"):
        ViscometerReadings(SPEEDS, D1, gels={"10mni": 5})
    with pytest.raises(InputError):
        ViscometerReadings(SPEEDS, D1, gels={"10s": -1})
    with pytest.raises(InputError):
        ViscometerReadings(SPEEDS, D1, gels={"10s": "seven"})


def test_cement_ramps_average_and_ratio():
    # API RP 10B-2: readings on the rising and falling ramps are averaged; ratio reported.
    speeds = [3, 6, 30, 60, 100, 200, 300]
    up = [10, 15, 34, 46, 61, 93, 120]
    down = [10, 13, 32, 44, 59, 91, 116]
    r = ViscometerReadings.from_ramps(speeds, up, down)
    np.testing.assert_allclose(r.dial, (np.array(up) + np.array(down)) / 2)
    np.testing.assert_allclose(r.up_down_ratio, np.array(up) / np.array(down))
    assert r.mode == "cement"
    # cement PV from 300/100 = 1.5(θ300 − θ100) (cement practice, from memory —
    # calc/METHODS.md §1.4)
    assert r.pv == pytest.approx(1.5 * (118 - 60) * 1e-3)
    assert "from memory" in r.pv_definition


def test_cement_above_300_note_and_two_speed_note():
    r = ViscometerReadings([600, 300, 100, 3], [90, 60, 30, 8], mode="cement")
    assert "cement_above_300" in codes(r.notes)
    two = ViscometerReadings([600, 300], [56, 37])
    assert "no_low_shear" in codes(two.notes)


# ------------------------------------------------------- bad input (issue 2; calc/METHODS.md §16.1)
@pytest.mark.parametrize(
    ("speeds", "dial", "match"),
    [
        ([600], [56], "at least two"),
        ([600, 300], [56, float("nan")], "finite"),
        ([600, 300], [56, -3], ">= 0"),
        ([600, 300], [56, None], "number"),
        ([600, 300], [56, "x"], "number"),
        ("600 300", [56, 37], "numbers"),
        ([600, 300, 3], [56, 37], "one per speed"),
        # demo-scenario bad input "low-shear readings swapped": θ6 = 7 < θ3 = 8 → ERROR
        ([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 7, 8], "must not fall"),
        ([600, 300, 200], [56, 30, 37], "must not fall"),
        # demo-scenario bad input "600 off scale": 312° beyond the 300° dial
        ([600, 300, 200, 100, 6, 3], [312, 190, 150, 101, 22, 18], "full scale"),
        ([600, 300, 300], [56, 37, 40], "duplicate"),
        ([600, 300, 3], [37, 37, 5], "PV"),
        ([600, 300], [37, 37], "rise with speed"),
        ([600, float("inf")], [37, 20], "finite"),
        ([0, 300], [0, 37], "> 0 rpm"),
    ],
)
def test_bad_readings_raise_input_error(speeds, dial, match):
    with pytest.raises(InputError, match=match):
        ViscometerReadings(speeds, dial)


def test_doubtful_readings_are_notes():
    # 3-rpm above 6-rpm within the ±0.5° resolution (common practice, calc/METHODS.md §16.1):
    # note, not error
    r = ViscometerReadings(SPEEDS, [56, 37, 29, 20, 8, 8.5])
    assert "low_shear_reversed" in codes(r.notes)
    same = ViscometerReadings([600, 300, 300, 3], [56, 37, 37, 7])
    assert same.speeds.tolist() == [3, 300, 600] and "duplicate_speed" in codes(same.notes)
    tie = ViscometerReadings([600, 300, 200, 100], [56, 37, 29, 29])
    assert "tied_readings" in codes(tie.notes)
    ratio = ViscometerReadings([600, 300], [37.5, 37])
    assert "ratio_600_300" in codes(ratio.notes)
    low = ViscometerReadings(SPEEDS, [30, 18, 13, 8, 2, 2])
    assert "low_shear_uncertain" in codes(low.notes)
    yp_neg = ViscometerReadings([600, 300], [60, 25])
    assert "yp_negative" in codes(yp_neg.notes)


def test_missing_speed_for_pv_is_input_error():
    r = ViscometerReadings([200, 100, 6], [29, 20, 8])
    with pytest.raises(InputError, match="600"):
        _ = r.pv
    assert r.reading(600) is None
