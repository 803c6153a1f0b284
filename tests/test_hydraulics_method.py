"""Hydraulics methods: the presets naming the fits and the friction law, resolved in one place."""

import numpy as np
import pytest
from scipy import stats

from calc import flow
from calc.circulation import hydraulics_fluid_from_readings
from calc.errors import InputError
from calc.hydraulics_method import (
    DEFAULT_METHOD,
    HYDRAULICS_METHODS,
    HydraulicsMethod,
    list_hydraulics_methods,
    resolve_method,
)
from calc.rheology import VISCOMETER_FITS, ViscometerReadings, fit
from calc.rheology.viscometer import FIELD_STRESS

READINGS = ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7])

#: The user-visible names (case files, --method, worksheet functions, report) stay as they were.
NAMES = [
    "api13d_2010_hb",
    "api13d_1995_power_law",
    "newtonian",
    "bingham",
    "bingham_darby_1992",
    "power_law",
    "exact_laminar",
]


def test_names_and_default():
    assert HYDRAULICS_METHODS.names() == NAMES
    assert [m.name for m in list_hydraulics_methods()] == NAMES
    assert resolve_method() is resolve_method(DEFAULT_METHOD)
    # the friction laws' own default is the default hydraulics method's friction law
    assert resolve_method().friction == flow.DEFAULT_FRICTION_LAW


def test_every_preset_names_registered_fits_and_a_friction_law():
    laws = {m.name for m in flow.list_friction_laws()}
    for m in list_hydraulics_methods():
        assert m.friction in laws
        assert m.pipe_fit in VISCOMETER_FITS.names()
        assert m.annulus_fit in VISCOMETER_FITS.names()
        assert m.description and m.source


def test_api_1995_uses_two_pairs():
    """API RP 13D 3rd ed. (1995): n_p, K_p from 600/300 rpm in pipe, n_a, K_a from 100/3 rpm in
    the annulus."""
    m = resolve_method("api13d_1995_power_law")
    assert (m.pipe_fit, m.annulus_fit) == ("api13d_1995_pipe", "api13d_1995_annulus")
    assert m.fits == "api13d_1995_pipe | api13d_1995_annulus"
    fluid = hydraulics_fluid_from_readings(READINGS, m.name, density=1300.0)
    assert fluid.pipe_model == fit(READINGS, "api13d_1995_pipe").model
    assert fluid.annulus_model == fit(READINGS, "api13d_1995_annulus").model
    assert fluid.fits == m.fits


def test_unknown_name_lists_the_registered_ones():
    with pytest.raises(InputError) as e:
        resolve_method("api13d_2011_hb")
    msg = str(e.value)
    assert "hydraulics method" in msg and "did you mean 'api13d_2010_hb'" in msg
    assert all(n in msg for n in NAMES)


def test_overrides_are_checked_and_recorded():
    m = resolve_method("bingham", friction="newtonian")
    assert (m.name, m.friction, m.pipe_fit) == ("bingham", "newtonian", "bingham_two_speed")
    assert m.overrides == (("friction", "newtonian"),) and m.label == "bingham (friction=newtonian)"
    assert resolve_method("bingham").overrides == ()  # the registered preset is untouched
    assert resolve_method(m) is m
    with pytest.raises(InputError, match="viscometer fit"):
        resolve_method("bingham", pipe_fit="bingham_two_speeds")
    with pytest.raises(InputError, match="friction law"):
        resolve_method("bingham", friction="colebrook")
    with pytest.raises(InputError, match="override"):
        resolve_method("bingham", roughness="0.1")
    with pytest.raises(InputError, match="friction law"):
        HydraulicsMethod("mine", "nope", "hb_least_squares", "hb_least_squares")


def test_fluid_follows_an_overridden_preset():
    m = resolve_method("api13d_2010_hb", annulus_fit="hb_least_squares")
    fluid = hydraulics_fluid_from_readings(READINGS, m, density=1300.0)
    assert fluid.pipe_model == fit(READINGS, "api13d_2010_hb").model
    assert fluid.annulus_model == fit(READINGS, "hb_least_squares").model


def test_fit_notes_can_stay_with_the_fits():
    """The report shows the fits' notes on its rheology sheet; its fluid carries none."""
    r = ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 10, 4])  # 2θ3 − θ6 < 0
    with_notes = hydraulics_fluid_from_readings(r, density=1300.0)
    without = hydraulics_fluid_from_readings(r, density=1300.0, fit_notes=False)
    assert "tau_y_clipped" in {n.code for n in with_notes.notes} and without.notes == ()
    assert without.pipe_model == with_notes.pipe_model


def test_bingham_preset_is_the_field_pv_yp():
    """API RP 13B-1: PV = θ600 − θ300 [cP], YP = θ300 − PV [lbf/100 ft², a degree read as one];
    the fit feeds τy in instrument stress (0.5107 Pa per degree, R1-B1-F1), so τy = YP × the
    stress per degree."""
    m = resolve_method("bingham")
    assert m.fits == "bingham_two_speed" and m.friction == "bingham"
    fluid = hydraulics_fluid_from_readings(READINGS, "bingham", density=1300.0)
    pv_cp, yp = 56 - 37, 37 - (56 - 37)  # the field definitions on the readings themselves
    assert fluid.pipe_model.mu_p == pytest.approx(pv_cp * 1e-3, rel=1e-4)  # 1.7023 s⁻¹/rpm
    per_degree = READINGS.geometry.stress_per_reading
    assert fluid.pipe_model.tau_y == pytest.approx(yp * per_degree, rel=1e-12)
    assert fluid.annulus_model == fluid.pipe_model
    assert yp * FIELD_STRESS < fluid.pipe_model.tau_y  # instrument stress, 6.7 % above the field
    assert fluid.fits == "bingham_two_speed"


def test_power_law_preset_is_a_log_log_fit():
    """The power_law preset's fit is the straight line on log-log axes through all readings:
    n and log K from scipy.stats.linregress (reference library) of log τ on log γ̇."""
    m = resolve_method("power_law")
    assert m.fits == "power_law_loglog"
    fluid = hydraulics_fluid_from_readings(READINGS, "power_law", density=1300.0)
    line = stats.linregress(np.log(READINGS.shear_rate), np.log(READINGS.shear_stress))
    assert fluid.pipe_model.n == pytest.approx(line.slope, rel=1e-10)
    assert fluid.pipe_model.k == pytest.approx(np.exp(line.intercept), rel=1e-10)
    # the stress fit it replaces reads the 3-rpm stress about half; the log-log line does not
    at3 = READINGS.shear_rate[0]
    lsq = fit(READINGS, "power_law_least_squares").model
    ratio_lsq = lsq.stress(at3) / READINGS.shear_stress[0]
    ratio_log = fluid.pipe_model.stress(at3) / READINGS.shear_stress[0]
    assert abs(ratio_log - 1) < abs(ratio_lsq - 1)


def test_the_other_fits_are_one_override_away():
    lsq = "bingham_least_squares"
    m = resolve_method("bingham", pipe_fit=lsq, annulus_fit=lsq)
    assert m.fits == lsq and m.label == f"bingham (pipe_fit={lsq}, annulus_fit={lsq})"
    fluid = hydraulics_fluid_from_readings(READINGS, m, density=1300.0)
    assert fluid.pipe_model == fit(READINGS, lsq).model and fluid.fits == lsq
    p = resolve_method("power_law", pipe_fit="power_law_least_squares")
    assert p.fits == "power_law_least_squares | power_law_loglog"
