"""Rheometer tables: plateau, shear-thinning region, log-log power law, Cross, Carreau-Yasuda."""

import numpy as np
import pytest

from calc.errors import InputError
from calc.rheology import (
    CarreauYasuda,
    Cross,
    HerschelBulkley,
    PowerLaw,
    RheometerTable,
    find_plateau,
    fit,
    fit_all,
)

G = np.geomspace(1e-3, 1e3, 31)


def table_of(model, g=G, **kw):
    return RheometerTable(g, stress=model.stress(g), **kw)


def test_power_law_loglog_exact():
    # exact data of τ = Kγ̇ⁿ: the straight line on log-log axes has slope n, intercept log K
    t = table_of(PowerLaw(2.5, 0.42))
    f = fit(t, "power_law_loglog")
    assert f.model.n == pytest.approx(0.42, rel=1e-10)
    assert f.model.k == pytest.approx(2.5, rel=1e-10)
    assert f.quality.r2 == pytest.approx(1.0)


@pytest.mark.parametrize(
    ("true", "method"),
    [
        (Cross(2.0, 0.01, 5.0, 0.8), "cross"),
        (Cross(0.5, 0.0, 0.2, 0.6), "cross"),
        (CarreauYasuda(5.0, 0.002, 2.0, 0.4, 1.5), "carreau_yasuda"),
        (CarreauYasuda(1.0, 0.001, 10.0, 0.3, 2.0), "carreau_yasuda"),
    ],
)
def test_plateau_models_recover_parameters(true, method):
    # exact synthetic tables of the Cross (1965) and Carreau–Yasuda (Yasuda et al. 1981) models
    f = fit(table_of(true), method)
    for name in ("eta0", "lam"):
        assert getattr(f.model, name) == pytest.approx(getattr(true, name), rel=1e-4)
    assert f.model.eta_inf == pytest.approx(true.eta_inf, abs=1e-6 * true.eta0)
    extra = ("m",) if method == "cross" else ("n", "a")
    for name in extra:
        assert getattr(f.model, name) == pytest.approx(getattr(true, name), rel=1e-4)
    assert f.quality.rmse < 1e-8


def test_carreau_high_shear_slope_is_n_minus_1():
    # Carreau–Yasuda with η∞ = 0: d log η / d log γ̇ → n − 1 (asymptote of the formula); the
    # log-log power-law fit over the shear-thinning region of a wide table finds it.
    true = CarreauYasuda(10.0, 0.0, 50.0, 0.35, 2.0)
    g = np.geomspace(1e-4, 1e4, 41)
    f = fit(table_of(true, g), "power_law_loglog")
    assert f.model.n - 1.0 == pytest.approx(0.35 - 1.0, abs=0.01)
    fc = fit(table_of(true, g), "carreau_yasuda")
    slope = np.diff(np.log10(fc.model.apparent_viscosity([1e8, 1e9])))[0]
    assert slope == pytest.approx(0.35 - 1.0, abs=1e-4)


def test_plateau_and_onset():
    # Cross with η∞ = 0: η = 0.9η₀ where (λγ̇)^m = 1/9, i.e. γ̇ = 9^(−1/m)/λ (exact)
    true = Cross(3.0, 0.0, 4.0, 0.9)
    g = np.geomspace(1e-4, 1e2, 121)
    p = find_plateau(g, true.apparent_viscosity(g))
    assert p.found and p.n_points > 5
    assert p.onset_rate == pytest.approx(9 ** (-1 / 0.9) / 4.0, rel=0.05)
    assert p.eta0 == pytest.approx(3.0, rel=0.01)
    f = fit(RheometerTable(g, viscosity=true.apparent_viscosity(g)), "cross")
    assert "plateau" in [n.code for n in f.notes]
    # a mud-like HB table has no zero-shear plateau
    hb = table_of(HerschelBulkley(3.0, 0.4, 0.6), np.geomspace(5, 1000, 8))
    assert not hb.plateau().found


def test_table_units_and_validation():
    t = RheometerTable.from_units(
        [60, 600], viscosity=[500, 100], shear_rate_unit="1/min", viscosity_unit="cP"
    )
    np.testing.assert_allclose(t.shear_rate, [1.0, 10.0])
    np.testing.assert_allclose(t.stress, [0.5, 1.0])
    with pytest.raises(InputError):
        RheometerTable.from_units([1, 10], stress=[1, 2], stress_unit="furlong")
    with pytest.raises(InputError):
        RheometerTable([1, 10], stress=[1, 2], viscosity=[1, 0.2])
    with pytest.raises(InputError, match="falls"):
        RheometerTable([1, 10], stress=[2, 1])
    with pytest.raises(InputError):
        RheometerTable([1, 1], stress=[1, 2])
    with pytest.raises(InputError):
        RheometerTable([1, 2], stress=[1, float("nan")])
    with pytest.raises(InputError):
        RheometerTable([1], stress=[1])
    with pytest.raises(InputError, match="at least"):
        fit(RheometerTable([1, 2, 3], stress=[1, 2, 3]), "cross")


def test_table_ranking_prefers_true_model():
    fs = fit_all(table_of(CarreauYasuda(5.0, 0.002, 2.0, 0.4, 1.5)))
    assert fs.ranking[0].method in ("carreau_yasuda", "cross")
    assert fs.best.model.name in ("Carreau-Yasuda", "Cross")
    assert fs.ranking[0].space.startswith("log10")
    # the viscometer readings of a mud, seen as a table: HB ranks first
    from calc.rheology import ViscometerReadings

    r = ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7])
    assert fit_all(r.to_table()).ranking[0].method == "hb_least_squares"


# ---------------------------------------------------------------- properties (hypothesis)
from hypothesis import given, settings  # noqa: E402
from hypothesis import strategies as st  # noqa: E402

_vals = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True),
    st.integers(-5, 1000),
    st.text(max_size=2),
    st.none(),
    st.booleans(),
)


@settings(max_examples=60, deadline=None)
@given(g=st.lists(_vals, max_size=8), v=st.lists(_vals, max_size=8))
def test_bad_table_input_is_input_error_never_crash_or_nan(g, v):
    try:
        t = RheometerTable(g, stress=v)
    except InputError:
        return
    for method in ("power_law_loglog", "hb_least_squares", "cross", "carreau_yasuda"):
        try:
            f = fit(t, method)
        except InputError:
            continue
        assert np.all(np.isfinite(f.model.stress(t.shear_rate)))
        assert np.all(np.isfinite(f.quality.residuals))
