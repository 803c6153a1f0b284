"""Notes of calc.rheology and calc.flow carry their numbers as values with kinds: the faces
show them in the case's units (addin.text), ``str()`` in SI."""

import numpy as np

from addin import text
from calc.flow import pipe_flow
from calc.rheology import ViscometerReadings, fit
from calc.rheology.viscometer import FIELD_STRESS


def _note(notes, code):
    return next(n for n in notes if n.code == code)


def test_yp_note_in_the_case_units():
    """YP = θ300 − PV = 2·14 − 30 = −2, read as lbf/100 ft² (API RP 13B-1 field definition)."""
    r = ViscometerReadings([600, 300, 6, 3], [30, 14, 3, 2])
    n = _note(r.notes, "yp_negative")
    assert n.value("yp").kind == "stress"
    assert n.value("yp").value == -2.0 * FIELD_STRESS
    assert text.note(n, "oilfield") == "YP = -2 lbf/100ft² < 0"
    assert text.note(n, "si") == "YP = -0.958 Pa < 0"  # 2 × 0.47880 Pa (lbf/100 ft² in SI)
    low = _note(r.notes, "low_shear_uncertain")
    assert "±1 lbf/100ft²" in text.note(low, "oilfield")  # one dial degree, field convention
    assert "(θ6 = 3, θ3 = 2)" in text.note(low, "metric")  # dial readings: plain numbers


def test_clipped_yield_stress_in_the_case_units():
    """2θ3 − θ6 = 8 − 10 < 0: the API HB estimate clips τy at 0 and says so in dial degrees."""
    r = ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 10, 4])
    n = _note(fit(r, "api13d_2010_hb").notes, "tau_y_clipped")
    assert text.note(n, "oilfield") == "2θ3 − θ6 = -2 < 0: τy set to 0"
    b = ViscometerReadings([600, 300, 200, 100], [100, 48, 33, 17])  # 2θ300 − θ600 < 0
    clipped = _note(fit(b, "bingham_two_speed").notes, "tau_y_clipped")
    # τy = 2τ300 − τ600 = −4° × 0.51068 Pa/° (R1-B1-F1 instrument stress) = −2.043 Pa
    assert clipped.value("tau_y").kind == "stress"
    assert str(clipped).endswith("two-speed yield stress -2.043 Pa < 0; set to 0")
    assert (
        text.note(clipped, "oilfield") == "two-speed yield stress -4.266 lbf/100ft² < 0; set to 0"
    )


def test_extrapolation_note_gives_shear_rates_as_ranges():
    r = ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7])
    (n,) = fit(r, "hb_least_squares").extrapolation_notes([0.5, 2000.0])
    used, fitted = n.value("used"), n.value("fitted")
    assert used.value == (0.5, 2000.0) and used.kind == "shear_rate"
    # the fitted range is that of the readings: 1.7023 s⁻¹ per rpm × 3 and × 600 rpm
    assert fitted.value == r.shear_rate_range
    assert "5.107-1021 1/s" in text.note(n, "oilfield")


def test_flow_count_note_counts_the_evaluations():
    """Newtonian pipe flow turns transitional above Re = 2100 (Hagen-Poiseuille limit, common
    practice); the sweep gives one note counting the rates, not one per rate."""
    d, mu, rho = 0.1, 0.001, 1000.0
    re = np.array([1000.0, 2500.0, 3000.0, 50000.0])
    q = re * mu / (rho * d) * np.pi * d**2 / 4
    res = pipe_flow(q, d, density=rho, tau_y=0.0, k=mu, n=1.0, method="newtonian")
    n = _note(res.notes, "transitional_flow")
    hits = int(np.count_nonzero(res.regime == 1))
    assert hits == 2
    assert n.value("hits").value == hits and n.value("evaluations").value == 4
    assert text.note(n, "oilfield").endswith("(2 of 4 evaluations).")
