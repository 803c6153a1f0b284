"""Downhole temperature and density at T and p (calc/METHODS.md §20) against outside checks."""

from __future__ import annotations

import numpy as np
import pytest

from calc.circulation import circulate
from calc.downhole import (
    CirculatingInputs,
    DownholeConditions,
    MudComposition,
    TemperatureTable,
    circulating_temperature,
    column_pressure,
    diesel_density,
    downhole_profile,
    mud_density,
    water_density,
)
from calc.errors import InputError
from tests import demo_well as demo

P_ATM = 101_325.0
PPG = 0.45359237 / (231.0 * 0.0254**3)


@pytest.mark.parametrize(
    ("t", "p_abs", "v"),
    [
        # IAPWS-IF97 (2007) Table 5, region 1 verification values (from memory, not re-read).
        (300.0, 3.0e6, 0.100215168e-2),
        (300.0, 80.0e6, 0.971180894e-3),
        (500.0, 3.0e6, 0.120241800e-2),
    ],
)
def test_water_if97_table5(t, p_abs, v):
    assert 1.0 / water_density(t, p_abs - P_ATM) == pytest.approx(v, rel=1e-8)


def test_water_against_iapws95():
    """IAPWS-95 (Wagner & Pruss 2002) via the `iapws` package: 20–200 °C, 1–1,000 bar."""
    iapws = pytest.importorskip("iapws")
    for tc in (20.0, 60.0, 100.0, 150.0, 200.0):
        for bar in (1.0, 10.0, 100.0, 500.0, 1000.0):
            t, p = tc + 273.15, bar * 1e5
            ref = iapws.IAPWS95(T=t, P=p / 1e6).rho
            if tc >= 100.0 and bar < 20.0:
                continue  # steam at that state in IAPWS-95; region 1 is liquid only
            assert water_density(t, max(p - P_ATM, 0.0)) == pytest.approx(ref, rel=5e-5), (tc, bar)


def test_water_known_states():
    # Density of water at 4 °C, 1 atm: 999.97 kg/m³ (handbook value, CRC Handbook).
    assert water_density(277.13, 0.0) == pytest.approx(999.97, abs=0.02)
    # 20 °C, 1 atm: 998.21 kg/m³ (CRC Handbook of Chemistry and Physics, water density table).
    assert water_density(293.15, 0.0) == pytest.approx(998.21, abs=0.02)


def test_diesel_sorelle_form():
    # Sorelle et al. (1982) eq. 1 in field units (coefficients second-hand, METHODS §20):
    # 200 °F, 5,000 psig: 7.24032 - 2.84383e-3·200 + 2.75660e-5·5000 = 6.80986 lb/gal
    t = (200.0 - 32.0) / 1.8 + 273.15
    rho = diesel_density(t, 5000.0 * 6894.757293168361)
    assert rho / PPG == pytest.approx(7.24032 - 2.84383e-3 * 200 + 2.75660e-5 * 5000, rel=1e-12)


def test_sorelle_worked_example():
    """Sorelle et al. (1982) worked example, as reproduced second-hand (paper not reached):
    10 lb/gal invert at 120 °F, water 9 %, oil 78 %, solids 13 % by volume, 250 °F at
    10,000 ft: mean density of the column 9.85 lb/gal.  The paper's water is its own linear
    correlation; ours is IAPWS-IF97, so agreement is to 0.02 lb/gal."""
    comp = MudComposition(0.78, 0.09, 0.13, "diesel", "water")
    t0 = (120.0 - 32.0) / 1.8 + 273.15
    z = np.linspace(0.0, 10_000 * 0.3048, 401)
    temp = t0 + (250.0 - 120.0) / 1.8 * z / z[-1]
    rho0 = 10.0 * PPG
    p = column_pressure(z, lambda p: np.asarray(mud_density(rho0, comp, temp, p, t0)), g=9.80665)
    mean = p[-1] / (9.80665 * z[-1]) / PPG
    assert mean == pytest.approx(9.85, abs=0.02)


def test_solids_only_is_incompressible():
    # Exact: nothing compressible → the surface density everywhere.
    comp = MudComposition(0.0, 0.0, 1.0)
    assert mud_density(2000.0, comp, 450.0, 1e8, 293.15) == pytest.approx(2000.0, rel=1e-15)


def test_composition_from_ratio_and_bad_input():
    c = MudComposition.from_ratio(80.0, 0.2, oil_base="mineral_oil", water_base="brine")
    assert (c.oil, c.water) == pytest.approx((0.64, 0.16))
    with pytest.raises(InputError, match=r"oil/water ratio.*0, 100"):
        MudComposition.from_ratio(120.0, 0.1)
    with pytest.raises(InputError, match="freezing"):
        water_density(260.0)
    with pytest.raises(InputError, match="IAPWS-IF97"):
        water_density(700.0)
    with pytest.raises(InputError, match="geothermal gradient"):
        DownholeConditions(c, 293.15, -0.01).static_at(100.0)
    with pytest.raises(InputError, match="gradient"):
        TemperatureTable((0.0, 1000.0), (320.0, 300.0))


def test_extrapolation_note():
    c = MudComposition.from_ratio(80.0, 0.2, oil_base="diesel", water_base="brine")
    notes = c.range_notes([300.0, 500.0], [1e6, 1.2e8])
    codes = {n.code for n in notes}
    assert codes == {"density_model_extrapolated"} and len(notes) == 3


CIRC = dict(
    bit_md=3000.0, bit_tvd=3000.0, density=1200.0, heat_capacity=1675.0, pipe_radius=0.0635,
    well_radius=0.108, u_pipe=500.0, u_annulus=50.0, inlet_temperature=300.0,
    surface_temperature=294.26, gradient=0.0273,
)  # fmt: skip


def test_circulating_limits_and_equations():
    x = np.linspace(0.0, 3000.0, 3001)
    # Analytical limit: zero flow → the static geotherm (Holmes & Swift 1970 far field).
    r0 = circulating_temperature(x, flow_rate=0.0, **CIRC)
    assert np.allclose(r0.annulus, 294.26 + 0.0273 * x, rtol=0, atol=1e-12)
    # Very slow flow tends to the geotherm too (continuity of the exact solution).
    rs = circulating_temperature(x, flow_rate=1e-7, **CIRC)
    assert np.max(np.abs(rs.annulus[10:] - r0.annulus[10:])) < 0.05
    # The solution satisfies the two energy balances and both boundary conditions
    # (exact solution of the ODE system, checked by finite differences).
    r = circulating_temperature(x, flow_rate=0.03, **CIRC)
    d = x[1] - x[0]
    dtp = np.gradient(r.string, d)
    dta = np.gradient(r.annulus, d)
    tf = 294.26 + 0.0273 * x
    assert np.allclose(dtp[1:-1], r.a * (r.annulus - r.string)[1:-1], atol=2e-6)
    rhs = -(r.b * (tf - r.annulus) - r.a * (r.annulus - r.string))
    assert np.allclose(dta[1:-1], rhs[1:-1], atol=2e-6)
    assert r.string[0] == pytest.approx(300.0, abs=1e-9)
    assert r.annulus[-1] == pytest.approx(r.string[-1], abs=1e-9)
    # Circulation cools the bottom and warms the top (Holmes & Swift 1970, fig. shapes).
    assert r.bit < r0.bit and r.outlet > r.inlet


def test_profile_switched_off_equals_today(circulation_demo):
    """With nothing compressible the T/p profile reproduces today's ESD/ECD exactly."""
    r = circulation_demo
    off = DownholeConditions(MudComposition(0.0, 0.0, 1.0), 294.26, 0.0273)
    prof = downhole_profile(r, off)
    assert np.allclose(prof.ecd[1:], prof.ecd_surface[1:], rtol=1e-12, atol=0)
    assert prof.ecd_bit == pytest.approx(float(r.ecd_bit), rel=1e-12)
    assert prof.esd_bit == pytest.approx(float(r.esd_bit), rel=1e-12)


def test_profile_water_mud_hydrostatic_integral(circulation_demo):
    """The static pressure is the integral of the local density (trapezoid, checked again)."""
    r = circulation_demo
    cond = DownholeConditions(
        MudComposition(0.0, 0.885, 0.115), 294.26, 0.0273,
        circulating=CirculatingInputs(300.0, 1675.0, 500.0, 50.0),
    )  # fmt: skip
    prof = downhole_profile(r, cond)
    g = 9.80665
    integral = np.concatenate(
        ([0.0], np.cumsum(0.5 * (prof.rho_static[1:] + prof.rho_static[:-1]) * np.diff(prof.tvd)))
    )
    assert np.allclose(prof.p_static, integral * g, rtol=1e-9)
    assert prof.ecd_bit != pytest.approx(float(r.ecd_bit), abs=0.1)


@pytest.fixture(scope="module")
def circulation_demo():
    """The demo well, day-1 check (invented data; tests/demo_well.py)."""
    well, fluid, q = demo.demo_well(0), demo.demo_fluid(), demo.demo_rate(0)
    return circulate(well, fluid, q, **demo.demo_options(0))
