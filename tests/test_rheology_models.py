"""Rheological models: formulas, limits (hypothesis), display units, validation."""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from addin import text
from calc.errors import InputError
from calc.rheology import (
    Bingham,
    CarreauYasuda,
    Cross,
    HerschelBulkley,
    Newtonian,
    PowerLaw,
)
from calc.rheology.viscometer import FIELD_STRESS

pos = st.floats(1e-3, 1e3, allow_nan=False, allow_infinity=False)
rates = st.lists(st.floats(1e-3, 1e4, allow_nan=False), min_size=1, max_size=20)


@settings(max_examples=60, deadline=None)
@given(tau_y=pos, k=pos, n=st.floats(0.1, 1.5), g=rates)
def test_hb_limits(tau_y, k, n, g):
    # HB with τy = 0 is the power law; with n = 1 it is Bingham (Herschel & Bulkley 1926,
    # exact identities of the formula τ = τy + Kγ̇ⁿ).
    g = np.array(g)
    np.testing.assert_allclose(
        HerschelBulkley(0.0, k, n).stress(g), PowerLaw(k, n).stress(g), rtol=1e-13
    )
    np.testing.assert_allclose(
        HerschelBulkley(tau_y, k, 1.0).stress(g), Bingham(tau_y, k).stress(g), rtol=1e-13
    )
    np.testing.assert_allclose(
        Bingham(0.0, k).apparent_viscosity(g), Newtonian(k).stress(g) / g, rtol=1e-13
    )


@settings(max_examples=40, deadline=None)
@given(tau_y=pos, k=pos, n=st.floats(0.1, 1.5), g=rates)
def test_inverse_shear_rate(tau_y, k, n, g):
    m = HerschelBulkley(tau_y, k, n)
    g = np.array(g)
    # exact inverse (τ − τy = Kγ̇ⁿ); compared in stress, since τ − τy loses digits when
    # Kγ̇ⁿ ≪ τy (floating-point cancellation, not a model error)
    np.testing.assert_allclose(m.stress(m.shear_rate(m.stress(g))), m.stress(g), rtol=1e-12)
    assert np.all(m.shear_rate(np.array([0.0, tau_y])) == 0.0)


def test_yield_type_attributes_for_flow_code():
    assert (Newtonian(0.02).tau_y, Newtonian(0.02).k, Newtonian(0.02).n) == (0.0, 0.02, 1.0)
    assert (Bingham(5.0, 0.02).k, Bingham(5.0, 0.02).n) == (0.02, 1.0)
    assert PowerLaw(0.5, 0.6).tau_y == 0.0


def test_scalar_in_scalar_out_and_vectorised():
    m = HerschelBulkley(3.0, 0.5, 0.6)
    assert isinstance(m.stress(10.0), float)
    assert m.stress(np.ones((2, 3))).shape == (2, 3)
    assert isinstance(Cross(1.0, 0.0, 1.0, 1.0).apparent_viscosity(2.0), float)


def test_apparent_viscosity_at_zero_shear():
    with pytest.raises(InputError, match="shear rate"):
        HerschelBulkley(3.0, 0.5, 0.6).apparent_viscosity(0.0)
    assert Newtonian(0.01).apparent_viscosity(0.0) == 0.01
    assert Cross(2.0, 0.1, 1.0, 0.8).apparent_viscosity(0.0) == 2.0
    assert HerschelBulkley(3.0, 0.5, 0.6).stress(0.0) == 3.0  # the yield limit
    with pytest.raises(InputError):
        PowerLaw(1.0, 0.5).stress(-1.0)
    with pytest.raises(InputError):
        PowerLaw(1.0, 0.5).stress(float("nan"))


def test_plateau_models_limits_and_slopes():
    # Cross (1965) and Carreau–Yasuda (Yasuda et al. 1981): η(0) = η₀, η(∞) → η∞ and, with
    # η∞ = 0, the high-shear log-log slope is −m (Cross) and n − 1 (Carreau–Yasuda) exactly
    # in the limit (asymptotes of the formulas).
    cy = CarreauYasuda(5.0, 0.0, 2.0, 0.4, 1.5)
    g = np.array([1e6, 1e7])
    slope = np.diff(np.log(cy.apparent_viscosity(g))) / np.diff(np.log(g))
    assert slope[0] == pytest.approx(0.4 - 1.0, abs=1e-6)
    cr = Cross(5.0, 0.0, 2.0, 0.7)
    g = np.array([1e12, 1e13])
    slope = np.diff(np.log(cr.apparent_viscosity(g))) / np.diff(np.log(g))
    assert slope[0] == pytest.approx(-0.7, abs=1e-6)
    assert CarreauYasuda(5.0, 0.01, 2.0, 0.4).apparent_viscosity(1e12) == pytest.approx(
        0.01, rel=1e-3
    )
    # Carreau–Yasuda with n = 1 is Newtonian (η ≡ η₀ when η∞ = 0)
    assert CarreauYasuda(3.0, 0.0, 1.0, 1.0).apparent_viscosity(123.0) == pytest.approx(3.0)


def test_display_units():
    m = HerschelBulkley(FIELD_STRESS * 6.0, FIELD_STRESS * 0.5, 0.7)
    line = text.model(m, "oilfield")
    assert "τy = 6 lbf/100ft²" in line and "K = 0.5 lbf·sⁿ/100ft²" in line
    p = text.model_parameters(Bingham(3.0, 0.025), "metric")
    assert p["μp"] == (pytest.approx(25.0), "mPa·s")
    assert text.model_parameters(Cross(1.0, 0.0, 2.0, 0.5), "oilfield")["λ"] == (2.0, "s")
    with pytest.raises(InputError):
        text.model(m, "imperial")


def test_parameters_are_si_values_with_kinds():
    """Models give their parameters as SI numbers with quantity kinds (no display units)."""
    vals = {v.name: (v.value, v.kind) for v in Bingham(3.0, 0.025).parameters()}
    assert vals == {"τy": (3.0, "stress"), "μp": (0.025, "viscosity")}


@pytest.mark.parametrize(
    "make",
    [
        lambda: Newtonian(0.0),
        lambda: Newtonian("1"),
        lambda: Bingham(-1.0, 0.02),
        lambda: PowerLaw(1.0, 0.0),
        lambda: HerschelBulkley(1.0, float("nan"), 0.5),
        lambda: Cross(1.0, 2.0, 1.0, 1.0),
        lambda: CarreauYasuda(1.0, 0.0, -1.0, 0.5),
    ],
)
def test_bad_parameters(make):
    with pytest.raises(InputError):
        make()
