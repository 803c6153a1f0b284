"""Cement placement (calc.placement): hydrostatics, mass conservation, free fall, bad input,
the demo liner job.  Each check names its source beside it."""

from __future__ import annotations

import math

import numpy as np
import pytest

from calc.circulation import PressureWindow
from calc.errors import InputError
from calc.geometry import Survey
from calc.placement import (
    FluidTrain,
    PlacementFluid,
    PlacementGeometry,
    PlacementPoint,
    PumpStage,
    density_hierarchy,
    simulate_placement,
    train_hydrostatic,
)
from calc.units import G_N

L, D_S, D_H, D_P = 1500.0, 0.1086, 0.2159, 0.127  # vertical well [m]
A_S = math.pi / 4 * D_S**2
A_A = math.pi / 4 * (D_H**2 - D_P**2)
WIN = PressureWindow([0.0, 2000.0], [900.0, 900.0], [2600.0, 2600.0])


def _geom(fc=None):
    return PlacementGeometry(
        Survey([0.0, 2000.0], [0.0, 0.0], [0.0, 0.0]),
        [("string", 0.0, L, D_S, 0.0), ("annulus", L, 0.0, D_H, D_P)],
        L,
        float_collar_md=fc,
    )


def _train(mu=0.001, rho=(1200.0, 1900.0, 1200.0), vol=8.0):
    w = (0.0, mu, 1.0)
    return FluidTrain(
        (
            PlacementFluid("mud", "mud", rho[0], w, w),
            PlacementFluid("cement", "slurry", rho[1], w, w),
            PlacementFluid("mud", "displacement", rho[2], w, w),
        ),
        (vol,),
    )


def _run(mu=0.3, fc=None, stages=None, steps=400, **kw):
    stages = (PumpStage(0.01),) if stages is None else stages
    return simulate_placement(
        _geom(fc),
        _train(mu, **kw),
        stages,
        [PlacementPoint("shoe", "shoe", L)],
        window=WIN,
        method="newtonian",
        steps=steps,
    )


def test_hydrostatics_at_bump_equal_the_hand_sum():
    """Exact hand sum Σρ·g·h of the fluids in place (Bourgoyne et al. 1986, Applied Drilling
    Engineering, ch. 4: p = ρ·g·h per column) for a vertical well: at bump the displacement
    fills the string to the float collar, the cement the shoe track and the annulus to h_c."""
    fc = 1460.0
    tl = _run(fc=fc)
    h_track = L - fc
    h_c = (8.0 - A_S * h_track) / A_A
    p_str = G_N * (1200.0 * fc + 1900.0 * h_track)
    p_ann = G_N * (1900.0 * h_c + 1200.0 * (L - h_c))
    assert tl.string_hydrostatic[-1] == pytest.approx(p_str, rel=1e-10)
    assert tl.annulus_hydrostatic[-1] == pytest.approx(p_ann, rel=1e-10)
    assert tl.bump_differential == pytest.approx(p_ann - p_str, rel=1e-10)
    # static ECD at the shoe after the pumps stop = annulus column / (g·TVD)
    assert tl.static_ecd[0] == pytest.approx(p_ann / (G_N * L), rel=1e-10)
    # the top of cement sits h_c above the shoe
    assert tl.toc_md[-1] == pytest.approx(L - h_c, rel=1e-10)
    # and the worksheet-side stack formula gives the same column
    assert train_hydrostatic(L, [0.0, L - h_c], [1200.0, 1900.0]) == pytest.approx(p_ann)


def test_mass_is_conserved_at_every_step():
    """Mass (volume, incompressible) balance: pumped + initial well volume = liquid in the well
    + returned, to rounding (conservation of mass, exact)."""
    tl = _run(stages=(PumpStage(0.01, 4.0), PumpStage(0.0, duration=300.0), PumpStage(0.012)))
    v0 = tl.geometry.total_volume
    in_well = tl.fluid_volume_in_well.sum(axis=1)
    returned = tl.fluid_returned.sum(axis=1)
    np.testing.assert_allclose(in_well + returned, v0 + tl.pumped, rtol=0, atol=1e-9 * v0)
    np.testing.assert_allclose(returned, tl.returned, rtol=0, atol=1e-9 * v0)
    assert tl.pumped[-1] == pytest.approx(8.0 + A_S * L, rel=1e-9)  # bump: cement + string


def test_free_fall_rate_equals_the_two_leg_laminar_balance():
    """Free fall of a Newtonian train against the analytic two-leg balance (exact): with the
    string top at atmospheric pressure, Δp_hydrostatic = q·(R_string·L_liquid + R_ann·L) with
    Hagen-Poiseuille R = 128μ/(πD⁴) in the pipe and the concentric-annulus laminar solution
    R = 8μ/(π(r₂⁴ − r₁⁴ − (r₂² − r₁²)²/ln(r₂/r₁))) (Bird, Stewart & Lightfoot 2002, Transport
    Phenomena, 2nd ed., §2.3 and §2.4)."""
    mu = 0.3
    tl = _run(mu=mu, rho=(1000.0, 1900.0, 1000.0), vol=6.0)
    ff = np.flatnonzero(tl.free_fall & (tl.return_rate > 0))
    assert ff.size > 20
    r2, r1 = D_H / 2, D_P / 2
    r_ann = 8 * mu / (math.pi * (r2**4 - r1**4 - (r2**2 - r1**2) ** 2 / math.log(r2 / r1)))
    r_str = 128 * mu / (math.pi * D_S**4)
    vs = A_S * L
    lo, hi = tl.fluid_top_s[ff], tl.fluid_bottom_s[ff]
    rho = tl.train.density
    h_str = (np.clip(hi, 0, vs) - np.clip(lo, 0, vs)) / A_S
    h_ann = (np.clip(hi, vs, None) - np.clip(lo, vs, None)) / A_A
    dp = G_N * ((rho * h_str).sum(axis=1) - (rho * h_ann).sum(axis=1))
    l_liquid = L - tl.gap[ff] / A_S
    q_hand = dp / (r_str * l_liquid + r_ann * L)
    np.testing.assert_allclose(tl.return_rate[ff], q_hand, rtol=1e-6)
    # the column runs ahead of the pumps for a while, then behind them (gap refilled)
    assert np.any(tl.return_rate[ff] > tl.pump_rate[ff])
    assert np.all(tl.surface_pressure[ff] == 0.0)


def test_no_free_fall_when_friction_holds_the_column():
    """Very viscous fluids (μ = 50 Pa·s): the laminar resistance exceeds the imbalance; returns
    equal the pump rate throughout (the same two-leg balance, exact)."""
    tl = _run(mu=50.0, stages=(PumpStage(0.005),), steps=100)
    assert not tl.free_fall.any()
    np.testing.assert_array_equal(tl.return_rate, tl.pump_rate)
    assert np.all(tl.surface_pressure > 0)


def test_bad_input_names_input_value_and_allowed():
    with pytest.raises(InputError, match=r"pump rate.*-0.01.*≥ 0"):
        PumpStage(-0.01, 1.0)
    w = (0.0, 0.001, 1.0)
    with pytest.raises(InputError, match=r"fluid train.*displacement"):
        FluidTrain(
            (
                PlacementFluid("mud", "mud", 1200.0, w, w),
                PlacementFluid("cement", "slurry", 1900.0, w, w),
            ),
            (5.0,),
        )
    with pytest.raises(InputError, match="spacer and cement volume"):
        simulate_placement(
            _geom(),
            _train(vol=500.0),
            [PumpStage(0.01)],
            [PlacementPoint("shoe", "shoe", L)],
            window=WIN,
        )
    with pytest.raises(InputError, match=r"cement: volume.*-3"):
        _train(vol=-3.0)
    with pytest.raises(InputError, match="pump schedule"):
        simulate_placement(
            _geom(),
            _train(),
            [PumpStage(0.01, 3.0)],
            [PlacementPoint("shoe", "shoe", L)],
            window=WIN,
        )


def test_density_hierarchy_common_practice():
    """Density hierarchy (common practice: each fluid ≥ 10 % heavier than the one ahead)."""
    chk = density_hierarchy(_train())
    assert [(c.ahead, c.behind, c.ok) for c in chk] == [("mud", "cement", True)]
    assert chk[0].value == pytest.approx(700.0)
