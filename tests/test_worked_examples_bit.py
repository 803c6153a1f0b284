"""Published worked example of bit-nozzle pressure drop and nozzle area.

Source
------
[LAP] Lapeyrouse, N.J. (2002). *Formulas and Calculations for Drilling, Production and
      Workover*, 2nd ed., Gulf Professional Publishing, "Bit nozzle selection — optimized
      hydraulics", example (13.0 ppg; 420 gpm at 3,000 psi and 275 gpm at 1,300 psi; jets
      17-17-17).  Only the steps legible in the public reprint are used (the flow-rate
      optimisation steps are not; see tests/WORKED_EXAMPLES.md).

[LAP] writes P_b = Q²·MW/(10,858·A²) (psi, gpm, ppg, in²); 10,858 = 12,032·0.95² to 4 figures,
i.e. our ρQ²/(2C_d²A²) with C_d = 0.95 (12,032 being 1/8.311e-5, calc/METHODS.md §0.4).
"""

import pytest

from calc.bit import bit_pressure_drop, total_flow_area
from calc.units import from_si, to_si


def test_lap_tfa_three_17s():
    """[LAP] step 1: 17-17-17 nozzles, area 0.664979 in² (printed).  Exact: 3·(π/4)(17/32)²
    = 0.6649807 in²; the printed sixth figure is 2 units lower (the source's intermediate
    rounding), so agreement is to 2.5e-6 relative."""
    tfa = from_si(total_flow_area([17, 17, 17]), "in**2")
    assert tfa == pytest.approx(0.664979, rel=3e-6)


def test_lap_constant_10858_is_cd_095():
    """[LAP]: 10,858 in P_b = Q²MW/(10,858A²) is C_d = 0.95 in our Bernoulli form: the exact
    field constant is 0.95²/8.30984e-5 = 10,860.6 (calc/METHODS.md §0.4), 0.024 % from the printed
    one."""
    q, mw, a = 400.0, 12.0, 0.5  # any values: the identity is exact up to the printed constant
    ours = from_si(
        bit_pressure_drop(to_si(q, "gpm"), to_si(mw, "ppg"), to_si(a, "in**2"), 0.95), "psi"
    )
    assert ours == pytest.approx(q**2 * mw / (10_858 * a**2), rel=3e-4)


def test_lap_impact_nozzle_area():
    """[LAP] impact-force branch: Q_opt = 297 gpm, P_b = 1,489 psi, nozzle area
    = √(297²·13.0/(10,858·1,489)) = √0.070927 = 0.26632 in² (all printed).  Our bit pressure
    drop with C_d = 0.95 through that area at that rate returns the printed 1,489 psi."""
    p = bit_pressure_drop(to_si(297.0, "gpm"), to_si(13.0, "ppg"), to_si(0.26632, "in**2"), 0.95)
    assert from_si(p, "psi") == pytest.approx(1_489, abs=0.5 + 1_489 * 3e-4)  # 10,858 vs 10,860.6
    assert 297.0**2 * 13.0 / (10_858 * 1_489) == pytest.approx(0.070927, abs=5e-7)
