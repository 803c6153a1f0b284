"""Tool-joint minor losses against the reference library `fluids` (Bell, fluids.fittings:
contraction_sharp method='Crane' = Crane TP-410 sharp contraction; diffuser_sharp = Rennels,
which for a sudden expansion is the Borda–Carnot (1 - β²)²)."""

import fluids.fittings
import numpy as np
import pytest

from calc.errors import InputError
from calc.flow.minor_losses import (
    check_joint_losses,
    contraction_k,
    expansion_k,
    joint_minor_loss,
)


@pytest.mark.parametrize("beta", [0.2, 0.45, 0.6, 0.76, 0.9, 1.0])
def test_coefficients_match_fluids(beta):
    d2 = 0.1086
    d1 = beta * d2
    assert float(contraction_k(d1, d2)) == pytest.approx(
        fluids.fittings.contraction_sharp(d2, d1, method="Crane"), rel=1e-12, abs=1e-15
    )
    assert float(expansion_k(d1, d2)) == pytest.approx(
        fluids.fittings.diffuser_sharp(d1, d2), rel=1e-12, abs=1e-15
    )


def test_joint_loss_is_k_times_dynamic_pressure_of_the_joint_bore():
    # Δp = N (K_c + K_e) ρ V1²/2 (Crane TP-410 eq. for resistance coefficients)
    q, dj, db, rho, n = 0.03, 0.0826, 0.1086, 1300.0, 42.0
    v1 = q / (np.pi / 4 * dj**2)
    k = fluids.fittings.contraction_sharp(db, dj, method="Crane") + fluids.fittings.diffuser_sharp(
        dj, db
    )
    assert float(joint_minor_loss(q, dj, db, rho, n)) == pytest.approx(
        n * k * 0.5 * rho * v1**2, rel=1e-12
    )


def test_bad_input():
    with pytest.raises(InputError):
        contraction_k(0.12, 0.10)
    with pytest.raises(InputError) as exc:
        check_joint_losses("bore_k")
    assert "bore_friction" in str(exc.value)
