"""Two-part friction calibration (calc.circulation.calibrate_two_part) on the demo well.

External check: exact recovery — 'measured' standpipe pressure and gauge ECD are synthesised
by calc.circulation.circulate with known string and annulus multipliers, and the calibration
must return those multipliers; the calibrated result must then reproduce both measurements
(to 1e-9 relative).  The linearity used is exact for the model: every friction row is its
gradient × length × multiplier, and ECD = ρ + (Δp_ann + p_s)/(g·TVD) (API RP 13D 2010, ECD
definition; from memory).
"""

from __future__ import annotations

import pytest

from calc.circulation import calibrate_friction, calibrate_two_part, circulate
from calc.errors import InputError
from calc.units import to_si
from tests.demo_well import check, demo_fluid, demo_options, demo_rate, demo_well, ft, ppg


@pytest.fixture(scope="module")
def demo():
    return demo_well(-1), demo_fluid(index=-1), demo_rate(-1), demo_options(-1)


@pytest.mark.parametrize("m_s, m_a", [(1.0, 1.0), (1.18, 1.25), (0.9, 1.4), (1.3, 0.7)])
def test_exact_recovery_of_known_multipliers(demo, m_s, m_a):
    well, fluid, q, opts = demo
    md = ft(check(-1)["pwd"]["md"])
    truth = circulate(well, fluid, q, friction_multiplier=m_s, annulus_multiplier=m_a, **opts)
    spp, ecd = float(truth.standpipe_pressure), float(truth.ecd_at(md))
    cal = calibrate_two_part(well, fluid, q, measured_spp=spp, gauge_ecd=ecd, gauge_md=md, **opts)
    assert cal.part == "string and annulus"
    assert cal.string_multiplier == pytest.approx(m_s, rel=1e-9)
    assert cal.annulus_multiplier == pytest.approx(m_a, rel=1e-9)
    assert cal.calibrated_spp == pytest.approx(spp, rel=1e-9)
    assert cal.calibrated_gauge_ecd == pytest.approx(ecd, rel=1e-9)
    gap = cal.predicted_spp - spp
    assert cal.spp_absorbed_string + cal.spp_absorbed_annulus == pytest.approx(gap, abs=1e-6)


def test_demo_measurements_are_both_reproduced(demo):
    """Issue 12: the D2 check's measured SPP (2,860 psi) and PWD (11.95 ppg at 11,818 ft)."""
    well, fluid, q, opts = demo
    c = check(-1)
    spp, ecd, md = to_si(c["measured_spp"], "psi"), ppg(c["pwd"]["ecd"]), ft(c["pwd"]["md"])
    cal = calibrate_two_part(well, fluid, q, measured_spp=spp, gauge_ecd=ecd, gauge_md=md, **opts)
    assert cal.calibrated_spp == pytest.approx(spp, rel=1e-9)
    assert cal.calibrated_gauge_ecd == pytest.approx(ecd, rel=1e-9)
    # the gauge reads heavier than the model: the annulus needs more friction; a single
    # whole-loop multiplier fitted to the SPP lowers it instead (issue 12: 11.79 ppg)
    assert cal.predicted_gauge_ecd < ecd and cal.annulus_multiplier > 1.0
    whole = calibrate_friction(well, fluid, q, spp, **opts)
    assert float(whole.calibrated.ecd_at(md)) < cal.predicted_gauge_ecd


def test_with_a_cuttings_increment_the_loaded_model_matches_the_gauge(demo):
    well, fluid, q, opts = demo
    md, ecd = ft(check(-1)["pwd"]["md"]), ppg(check(-1)["pwd"]["ecd"])
    inc = ppg(0.06)
    cal = calibrate_two_part(well, fluid, q, gauge_ecd=ecd, gauge_md=md, gauge_increment=inc,
                             **opts)  # fmt: skip
    plain = calibrate_two_part(well, fluid, q, gauge_ecd=ecd, gauge_md=md, **opts)
    assert cal.calibrated_gauge_ecd == pytest.approx(ecd, rel=1e-12)
    assert float(cal.calibrated.ecd_at(md)) == pytest.approx(ecd - inc, rel=1e-12)
    assert 1.0 < cal.annulus_multiplier < plain.annulus_multiplier


def test_one_measurement_says_which_part(demo):
    well, fluid, q, opts = demo
    c = check(-1)
    spp, ecd, md = to_si(c["measured_spp"], "psi"), ppg(c["pwd"]["ecd"]), ft(c["pwd"]["md"])
    only_spp = calibrate_two_part(well, fluid, q, measured_spp=spp, **opts)
    assert only_spp.part == "whole loop"
    assert only_spp.string_multiplier == only_spp.annulus_multiplier
    assert only_spp.string_multiplier == pytest.approx(
        calibrate_friction(well, fluid, q, spp, **opts).multiplier, rel=1e-12
    )
    only_gauge = calibrate_two_part(well, fluid, q, gauge_ecd=ecd, gauge_md=md, **opts)
    assert only_gauge.part == "annulus" and only_gauge.string_multiplier == 1.0
    assert only_gauge.calibrated_gauge_ecd == pytest.approx(ecd, rel=1e-12)
    assert only_gauge.spp_absorbed_string is None
    assert {n.code for n in only_gauge.notes} >= {"calibrated_part"}


def test_absurd_multiplier_is_flagged_not_silent(demo):
    well, fluid, q, opts = demo
    md = ft(check(-1)["pwd"]["md"])
    truth = circulate(well, fluid, q, friction_multiplier=1.0, annulus_multiplier=3.0, **opts)
    cal = calibrate_two_part(well, fluid, q, gauge_ecd=float(truth.ecd_at(md)), gauge_md=md,
                             **opts)  # fmt: skip
    assert cal.annulus_multiplier == pytest.approx(3.0, rel=1e-9)
    assert "calibration_multiplier_unusual" in {n.code for n in cal.notes}


@pytest.mark.parametrize(
    "kw, name",
    [
        ({}, "calibration measurements"),
        ({"gauge_ecd": 1400.0}, "gauge"),
        ({"gauge_ecd": 1000.0, "gauge_md": 3000.0}, "gauge ECD"),  # below the mud density
        ({"gauge_ecd": 1450.0, "gauge_md": 9000.0}, "gauge MD"),  # below the bit
        ({"measured_spp": 1.0e5}, "measured standpipe pressure"),
        ({"friction_multiplier": 1.1, "measured_spp": 2e7}, "friction_multiplier"),
    ],
)
def test_bad_input(demo, kw, name):
    well, fluid, q, opts = demo
    with pytest.raises(InputError) as exc:
        calibrate_two_part(well, fluid, q, **kw, **opts)
    assert exc.value.name == name
