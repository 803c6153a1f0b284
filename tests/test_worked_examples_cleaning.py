"""Published worked example of cuttings slip velocity, walked step by step.

[GL] Guo, B. & Liu, G. (2011). *Applied Drilling Circulation Systems: Hydraulics, Calculations
     and Models*. Gulf Professional Publishing. Table 2.4 ("Cuttings Slip Velocity"), p. 56:
     the drag balance of eq. 2.90 with the Fang et al. (2008) drag correlation, eqs. 2.92-2.96.
     Inputs: particle diameter 0.25 in, sphericity 0.8, Newtonian fluid 6 cp, 12 ppg, cuttings
     specific gravity 2.7.  Printed: A′ = 1.7996, B′ = -0.8467, C′ = 0.1206, N_ReP = 240,
     f_p = 2.9350, v_sl = 0.5166 ft/s = 0.157 m/s.
"""

import numpy as np
import pytest

from calc.cleaning import fang_drag, slip_velocity
from calc.cleaning.slip import _FANG_A, _FANG_B, _FANG_C, _cubic
from calc.units import from_si, to_si

PSI = 0.8


def test_gl_table_2_4_coefficients():
    # [GL] Table 2.4: A′, B′, C′ at ψ = 0.8 (eqs. 2.93-2.95)
    assert _cubic(_FANG_A, PSI) == pytest.approx(1.7996, abs=5e-5)
    assert _cubic(_FANG_B, PSI) == pytest.approx(-0.8467, abs=5e-5)
    assert _cubic(_FANG_C, PSI) == pytest.approx(0.1206, abs=5e-5)


def test_gl_table_2_4_drag_at_printed_reynolds():
    # [GL] Table 2.4: f_p = 2.9350 at N_ReP = 240 (the Reynolds number is printed rounded; the
    # printed inputs give 239.8, where f_p = 2.9346)
    assert fang_drag(240.0, PSI) == pytest.approx(2.9350, abs=1.5e-3)


def test_gl_table_2_4_slip_velocity():
    # [GL] converts the cuttings SG with 62.4 lb/ft³ for water and the mud with 7.48 gal/ft³
    # (eq. 2.90: ρ_s − 7.48ρ_f, ρ_s in lb/ft³); the same convention is made explicit here.
    rho_s = to_si(2.7 * 62.4, "lb/ft**3")
    r = slip_velocity(to_si(0.25, "in"), rho_s, density=to_si(12.0, "ppg"), k=to_si(6.0, "cP"),
                      method="fang_2008", sphericity=PSI)  # fmt: skip
    assert r.reynolds == pytest.approx(240.0, abs=0.5)  # printed 240
    assert r.drag_coefficient == pytest.approx(2.9350, abs=1e-3)  # printed 2.9350
    assert from_si(r.velocity, "ft/s") == pytest.approx(0.5166, abs=5e-4)  # printed 0.5166
    assert r.velocity == pytest.approx(0.157, abs=5e-4)  # printed 0.157 m/s


def test_fang_creeping_flow_continues_as_stokes():
    # below the join the drag falls as 1/Re (Stokes-like slope), so f·Re is constant
    re = np.array([1e-4, 1e-3, 1e-2])
    f = fang_drag(re, PSI)
    assert np.allclose(f * re, f[0] * re[0], rtol=1e-12)


def test_fang_balance_is_monotone_in_particle_size():
    # exact physics: a larger particle of the same material settles faster (common practice)
    sizes = to_si(np.linspace(0.05, 1.0, 40), "in")
    r = slip_velocity(sizes, 2650.0, density=1300.0, k=0.01, method="fang_2008", sphericity=PSI)
    assert np.all(np.diff(r.velocity) > 0)
