"""Hydrostatics, ESD/ECD formulas, the pressure window and the margin logic.

External references: the 0.052 psi/ft per ppg constant (common practice) and its exact form
12/231 (calc/METHODS.md §0.4, derived from NIST SP 811 App. B definitions); the ECD definition
(calc/METHODS.md §9.3); Bourgoyne et al. (1986) *Applied Drilling Engineering*, ch. 4.
"""

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from calc.circulation.hydrostatics import (
    FIELD_HYDROSTATIC_CONSTANT,
    equivalent_circulating_density,
    equivalent_density,
    gravity_for,
    hydrostatic_pressure,
)
from calc.circulation.pore_fracture import (
    CheckPoint,
    Margins,
    PressureWindow,
    WeakPoint,
    tabulate_margins,
)
from calc.errors import InputError
from calc.units import G_N, from_si, to_si

densities = st.floats(6.5, 22.0)  # ppg, usual mud range (common practice, calc/METHODS.md §16.2)
depths = st.floats(1.0, 40000.0)  # ft


@given(densities, depths)
def test_052_option_equals_the_field_formula(rho_ppg, tvd_ft):
    # p[psi] = 0.052·ρ[ppg]·TVD[ft] — the rig formula (common practice).
    field = FIELD_HYDROSTATIC_CONSTANT * rho_ppg * tvd_ft
    si = hydrostatic_pressure(to_si(rho_ppg, "ppg"), to_si(tvd_ft, "ft"), hydrostatic="0.052")
    assert from_si(si, "psi") == pytest.approx(field, rel=1e-12)


@given(densities, depths)
def test_exact_option_equals_12_over_231(rho_ppg, tvd_ft):
    # Exact field constant 12/231 psi/ft per ppg (calc/METHODS.md §0.4: lbf = lb·gₙ, gal = 231 in³).
    field = 12.0 / 231.0 * rho_ppg * tvd_ft
    si = hydrostatic_pressure(to_si(rho_ppg, "ppg"), to_si(tvd_ft, "ft"))
    assert from_si(si, "psi") == pytest.approx(field, rel=1e-12)


def test_exact_is_rho_g_h_and_052_is_one_per_mille_high():
    # ρ·gₙ·h by definition (gₙ = 9.80665 m/s², CGPM 1901); 0.052/(12/231) − 1 = 0.10 %
    # (calc/METHODS.md §9.1: 0.10 % higher).
    assert hydrostatic_pressure(1200.0, 3000.0) == pytest.approx(1200.0 * G_N * 3000.0, rel=1e-15)
    ratio = hydrostatic_pressure(1200.0, 3000.0, hydrostatic="0.052") / hydrostatic_pressure(
        1200.0, 3000.0
    )
    assert ratio == pytest.approx(0.052 * 231.0 / 12.0, rel=1e-14)
    assert 0.0009 < ratio - 1.0 < 0.0011


def test_mud_weight_to_balance_pore_pressure_textbook_example():
    # Bourgoyne et al. (1986) ADE ch. 4, first worked example: pore pressure 8,500 psi at
    # 12,200 ft needs 8,500/(0.052·12,200) = 13.4 ppg (from memory, not yet checked against the
    # source — calc/METHODS.md §9.1).
    rho = equivalent_density(to_si(8500.0, "psi"), to_si(12200.0, "ft"), hydrostatic="0.052")
    assert from_si(rho, "ppg") == pytest.approx(13.4, abs=0.05)


@given(densities, st.floats(0.0, 3000.0), depths, st.floats(0.0, 1000.0))
def test_ecd_identity_field_form(rho_ppg, dp_psi, tvd_ft, ps_psi):
    # ECD = ρ + (ΣΔp_ann + p_s)/(0.052·TVD) (calc/METHODS.md §9.3, field units) with the 0.052
    # option.
    field = rho_ppg + (dp_psi + ps_psi) / (0.052 * tvd_ft)
    si = equivalent_circulating_density(
        to_si(rho_ppg, "ppg"),
        to_si(dp_psi, "psi"),
        to_si(tvd_ft, "ft"),
        back_pressure=to_si(ps_psi, "psi"),
        hydrostatic="0.052",
    )
    assert from_si(si, "ppg") == pytest.approx(field, rel=1e-12)
    assert si >= to_si(rho_ppg, "ppg") * (1 - 1e-15)  # ECD ≥ ESD (losses ≥ 0)


def test_ecd_identity_si_and_emw_round_trip():
    # ECD = ρ + ΔP/(g·TVD) in SI (calc/METHODS.md §9.3); EMW of ρ·g·h is ρ (exact identity).
    rho, dp, h = 1318.0, 1.7e6, 3052.5
    assert equivalent_circulating_density(rho, dp, h) == pytest.approx(rho + dp / (G_N * h))
    for opt in ("exact", "0.052"):
        p = hydrostatic_pressure(rho, h, hydrostatic=opt)
        assert equivalent_density(p, h, hydrostatic=opt) == pytest.approx(rho, rel=1e-14)


def test_broadcasting_and_scalar_out():
    out = hydrostatic_pressure(np.array([1000.0, 1200.0])[:, None], np.array([1.0, 2.0, 3.0]))
    assert out.shape == (2, 3)
    assert isinstance(hydrostatic_pressure(1000.0, 1.0), float)
    assert out[1, 2] == pytest.approx(1200.0 * G_N * 3.0)


def test_bad_inputs():
    with pytest.raises(InputError, match="hydrostatic"):
        gravity_for("0.05")
    with pytest.raises(InputError, match="density"):
        hydrostatic_pressure(-1.0, 10.0)
    with pytest.raises(InputError, match="tvd"):
        equivalent_density(1e5, 0.0)
    with pytest.raises(InputError, match="tvd"):
        hydrostatic_pressure(1000.0, float("nan"))


# ------------------------------------------------------------------ pressure window and margins
def _window():
    # demo window (workbooks/demo-case.toml, invented data), first three stations
    tvd = to_si(np.array([500.0, 2500.0, 5000.0]), "ft")
    return PressureWindow(
        tvd, to_si(np.array([8.6, 8.7, 8.8]), "ppg"), to_si(np.array([11.8, 13.2, 14.0]), "ppg")
    )


def test_window_interpolates_linearly_in_tvd_and_holds_ends():
    w = _window()
    # midway between 500 and 2500 ft: linear interpolation (exact arithmetic)
    mid = to_si(1500.0, "ft")
    assert from_si(w.pore_at(mid), "ppg") == pytest.approx(8.65, rel=1e-12)
    assert from_si(w.fracture_at(mid), "ppg") == pytest.approx(12.5, rel=1e-12)
    assert from_si(w.fracture_at(to_si(100.0, "ft")), "ppg") == pytest.approx(11.8)
    assert from_si(w.fracture_at(to_si(9000.0, "ft")), "ppg") == pytest.approx(14.0)
    assert w.covers(to_si(1000.0, "ft")) and not w.covers(to_si(9000.0, "ft"))
    arr = w.pore_at(to_si(np.array([500.0, 2500.0]), "ft"))
    assert from_si(arr, "ppg") == pytest.approx([8.6, 8.7])


def test_window_bad_inputs():
    with pytest.raises(InputError, match="strictly increasing"):
        PressureWindow([100.0, 100.0], [1000.0, 1000.0], [1500.0, 1500.0])
    with pytest.raises(InputError, match="pore EMW at TVD"):
        PressureWindow([100.0, 200.0], [1000.0, 1600.0], [1500.0, 1500.0])
    with pytest.raises(InputError, match="one pore"):
        PressureWindow([100.0, 200.0], [1000.0], [1500.0, 1600.0])
    with pytest.raises(InputError, match="pore EMW"):
        WeakPoint("sand", 3000.0, 1500.0, pore=1600.0)
    with pytest.raises(InputError, match="fracture margin"):
        Margins(fracture=-1.0)


def test_tightest_point_and_limit_named():
    # Hand-made table: three points, ECD 1400 everywhere.  Fracture margins 200, 60, 300;
    # pore margins 300, 350, 80 → the tightest is point "b" on the fracture side (60).
    md = np.array([1.0, 2.0, 3.0])
    names = tuple(CheckPoint("weak_point", n, m, m) for n, m in zip("abc", md, strict=True))
    pore = np.array([1100.0, 1050.0, 1320.0])
    frac = np.array([1600.0, 1460.0, 1700.0])
    ecd = np.full(3, 1400.0)
    t = tabulate_margins(names, md, md, pore, frac, ecd, ecd - 10, Margins(50.0, 20.0))
    assert t.tightest.point.name == "b" and t.tightest.limit == "fracture"
    assert t.tightest.margin == pytest.approx(60.0)
    assert t.tightest.required == pytest.approx(50.0)
    # a sweep: second row has ECD 1250 → pore side at "c" (−70) is tightest
    ecd2 = np.array([ecd, np.full(3, 1250.0)])
    t2 = tabulate_margins(names, md, md, pore, frac, ecd2, ecd2, Margins())
    assert [p.name for p in t2.tightest.point] == ["b", "c"]
    assert list(t2.tightest.limit) == ["fracture", "pore"]
    assert t2.tightest.margin == pytest.approx([60.0, -70.0])
    assert t2.static_pore_margin.shape == (2, 3)
