"""Rotation, stand-off eccentricity and tool-joint minor losses through circulate() on the
demo well (invented data).

External references: the rotation factor of each annular row is the laminar helical-flow slot
solution (checked against an independent quadrature in tests/test_flow_rotation.py; exact
Newtonian limit, Bird, Armstrong & Hassager 1987); the joint losses are recomputed here with
the reference library `fluids` (fluids.fittings.contraction_sharp method='Crane' = Crane
TP-410, diffuser_sharp = Borda–Carnot); the eccentricity factor is Haciislamoglu & Langlinais
(1990) (coefficients from memory, calc/METHODS.md §6.17).
"""

import dataclasses

import fluids.fittings
import numpy as np
import pytest

from calc.circulation import circulate
from calc.errors import InputError
from calc.flow.eccentricity import eccentricity_factor
from calc.flow.rotation import helical_gradient_ratio, surface_speed_ratio
from calc.geometry import DrillString, Well
from tests import demo_well as demo


def run(well=None, **kw):
    return circulate(
        well or demo.demo_well(0),
        demo.demo_fluid(None, 0),
        demo.demo_rate(0),
        **demo.demo_options(0),
        **kw,
    )


@pytest.fixture(scope="module")
def base():
    return run()


def test_rotation_changes_annular_loss_by_what_the_factor_says(base):
    rot = run(rpm=140.0)
    a0, a1 = base.annulus, rot.annulus
    n = demo.demo_fluid(None, 0).annulus_parameters[2]
    lam = surface_speed_ratio(140.0, demo.demo_well(0).flow_intervals().select("annulus")
                              .inner_diameter, a0.flow.velocity)  # fmt: skip
    laminar = np.asarray(a0.flow.regime) == 0
    expected = np.where(laminar, helical_gradient_ratio(np.broadcast_to(n, lam.shape), lam), 1.0)
    # in transitional rows the factor fades out: between R_rot and 1
    trans = np.asarray(a0.flow.regime) == 1
    assert np.allclose(a1.losses[laminar], a0.losses[laminar] * expected[laminar], rtol=1e-12)
    assert np.all(a1.losses[trans] >= a0.losses[trans] * expected[trans] - 1e-9)
    assert np.allclose(a1.losses, a0.losses * np.asarray(a1.flow.rotation_factor), rtol=1e-12)
    # shear-thinning demo mud: rotation lowers the annular loss, so ECD and SPP drop
    assert a1.total < a0.total and rot.ecd_bit < base.ecd_bit
    assert base.standpipe_pressure - rot.standpipe_pressure == pytest.approx(
        a0.total - a1.total, rel=1e-9
    )
    assert rot.rpm == 140.0


def test_joint_losses_option_adds_crane_and_borda_carnot_losses(base):
    k = run(joint_losses="bore_change_k")
    well = demo.demo_well(0)
    comps = {c.name: c for c in well.string.components}
    s = well.flow_intervals().select("string")
    q, rho = demo.demo_rate(0), demo.demo_fluid(None, 0).density
    covered = set(well.tool_covered)
    expected = 0.0
    for name, tj, length in zip(s.component, s.is_tool_joint, s.length, strict=True):
        c = comps[name]
        if not tj or name in covered:
            continue
        d1, d2 = min(c.tool_joint_id, c.id), max(c.tool_joint_id, c.id)
        kk = fluids.fittings.contraction_sharp(d2, d1, method="Crane")
        kk += fluids.fittings.diffuser_sharp(d1, d2)
        v1 = q / (np.pi / 4 * d1**2)
        expected += length / c.tool_joint_length * kk * 0.5 * rho * v1**2
    assert expected > 0
    assert k.standpipe_pressure - base.standpipe_pressure == pytest.approx(expected, rel=1e-9)
    assert k.annulus.total == base.annulus.total and k.joint_losses == "bore_change_k"


def test_standoff_sets_eccentricity_per_row(base):
    well = demo.demo_well(0)
    comps = [
        dataclasses.replace(c, standoff=0.4) if c.name == well.string.components[-1].name else c
        for c in well.string.components
    ]
    w2 = Well(well.survey, well.hole, DrillString(comps), well.bit, well.surface_lines,
              well.tool_drops, well.bit_depth)  # fmt: skip
    r = run(w2)
    a = w2.flow_intervals().select("annulus")
    e = np.where(a.component == comps[-1].name,
                 np.minimum((1 - 0.4) * np.sin(np.radians(a.inclination)), 0.95), 0.0)  # fmt: skip
    assert np.allclose(r.annulus_eccentricity, e, rtol=1e-12)
    assert np.any(e > 0.3)
    f = np.asarray(r.annulus.flow.eccentricity_factor)
    assert np.all(f[e == 0] == 1.0) and np.all(f[e > 0] < 1.0)
    # laminar rows: the Haciislamoglu-Langlinais laminar factor exactly
    lam = np.asarray(r.annulus.flow.regime) == 0
    n = demo.demo_fluid(None, 0).annulus_parameters[2]
    hl = eccentricity_factor(e, a.inner_diameter / a.outer_diameter, n, 0.0)
    assert np.allclose(r.annulus.losses[lam], base.annulus.losses[lam] * hl[lam], rtol=1e-12)
    assert base.annulus_eccentricity is None


@pytest.mark.parametrize("kw", [dict(rpm=-10.0), dict(rpm=900.0), dict(joint_losses="x")])
def test_bad_options(kw):
    with pytest.raises(InputError):
        run(**kw)


def test_bad_standoff():
    c = demo.demo_well(0).string.components[0]
    with pytest.raises(InputError) as exc:
        dataclasses.replace(c, standoff=1.5)
    assert "stand-off" in str(exc.value) and "1.5" in str(exc.value)
