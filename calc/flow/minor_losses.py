"""Minor (form) losses at bore changes inside the string: tool joints.

Flow through a drill-pipe joint passes from the pipe bore D (area A2) into the smaller
tool-joint bore d (area A1) and back: a sudden contraction and a sudden expansion per joint.
With β = d/D and the velocity V1 in the small bore, the loss coefficients are

.. math:: K_c = 0.5\\,(1 - β^2) \\quad\\text{(sharp-edged contraction, Crane TP-410)}

          K_e = (1 - β^2)^2 \\quad\\text{(sudden expansion, Borda–Carnot)}

          Δp = N_j\\,(K_c + K_e)\\,\\tfrac12 ρ V_1^2

for N_j joints.  These are the turbulent-flow coefficients of the handbooks; in laminar flow
the form losses are smaller and Reynolds-dependent (Idelchik 1986, ch. 4), so the coefficient
method overstates them there (the caller notes laminar bores).

Options (:data:`JOINT_LOSS_METHODS`): ``"bore_friction"`` (default; friction of the joint's
bore over its length only, as the geometry's tool-joint sub-intervals give it) and
``"bore_change_k"`` (the same plus the contraction and expansion losses above).

References
----------
Crane Co. (1988). Flow of Fluids Through Valves, Fittings, and Pipe, Technical Paper 410,
p. A-26 (sudden contraction and enlargement).
Idelchik, I.E. (1986). Handbook of Hydraulic Resistance, 2nd ed., Hemisphere, ch. 4.
White, F.M. (2011). Fluid Mechanics, 7th ed., McGraw-Hill, §6.9 (Borda–Carnot expansion).
"""

from __future__ import annotations

import numpy as np

from calc.errors import InputError, check_choice, check_nonnegative, check_positive
from calc.registry import MethodRegistry, Verification

__all__ = [
    "JOINT_LOSS_METHODS",
    "JOINT_LOSS_OPTIONS",
    "check_joint_losses",
    "contraction_k",
    "expansion_k",
    "joint_minor_loss",
]

#: Tool-joint loss options: name → implementation (the loss added on top of bore friction).
JOINT_LOSS_METHODS = MethodRegistry("tool-joint loss option")


def _beta(d_small, d_large):
    ds = check_positive("small bore diameter", d_small, "m")
    dl = check_positive("large bore diameter", d_large, "m")
    if np.any(ds > dl):
        i = int(np.argmax(np.ravel(ds > dl)))
        raise InputError(
            "small bore diameter",
            float(np.ravel(ds)[i]),
            f"<= the large bore {np.ravel(dl)[i]:g} m",
        )
    return ds / dl


def contraction_k(d_small, d_large):
    """Sharp-edged sudden contraction K_c = 0.5(1 - β²), on the small-bore velocity [-].

    Examples
    --------
    Crane TP-410 (1988) p. A-26: β = 0.8 gives 0.5·(1 - 0.64) = 0.18:

    >>> round(float(contraction_k(0.08, 0.10)), 4)
    0.18
    """
    b = _beta(d_small, d_large)
    return 0.5 * (1.0 - b**2)


def expansion_k(d_small, d_large):
    """Sudden expansion (Borda–Carnot) K_e = (1 - β²)², on the small-bore velocity [-].

    Examples
    --------
    β = 0.8: (1 - 0.64)² = 0.1296:

    >>> round(float(expansion_k(0.08, 0.10)), 4)
    0.1296
    """
    b = _beta(d_small, d_large)
    return (1.0 - b**2) ** 2


def joint_minor_loss(q, d_joint, d_body, density, joints):
    """Contraction + expansion loss of ``joints`` tool joints, Δp = N(K_c + K_e)ρV₁²/2 [Pa].

    Parameters
    ----------
    q : array_like
        Flow rate [m³/s], > 0.
    d_joint : array_like
        Tool-joint bore d [m], 0 < d ≤ D.
    d_body : array_like
        Pipe body bore D [m].
    density : array_like
        Fluid density [kg/m³], > 0.
    joints : array_like
        Number of joints N [-], ≥ 0 (may be fractional: a length over the joint length).

    Returns
    -------
    numpy.ndarray
        Δp [Pa].

    Examples
    --------
    One 5 in drill-pipe joint (4.276 in bore, 3.25 in tool-joint bore), 500 gpm of 1318 kg/m³
    (11 ppg) mud: V₁ = 0.0315/(π/4·0.08255²) = 5.89 m/s, K = 0.211 + 0.178:

    >>> round(float(joint_minor_loss(0.0315451, 0.08255, 0.1086104, 1318.0, 1.0)))
    8917
    """
    qv = check_positive("flow rate", q, "m³/s")
    rho = check_positive("density", density, "kg/m³")
    n = check_nonnegative("number of joints", joints)
    k = contraction_k(d_joint, d_body) + expansion_k(d_joint, d_body)
    v1 = qv / (0.25 * np.pi * np.asarray(d_joint, dtype=float) ** 2)
    return n * k * 0.5 * rho * v1**2


def _no_minor_loss(q, d_joint, d_body, density, joints):
    """Zero: bore friction only (the default option)."""
    return np.zeros(np.broadcast_shapes(*(np.shape(x) for x in (q, d_joint, d_body, joints))))


JOINT_LOSS_METHODS.register(
    "bore_friction",
    "friction of the tool-joint bore over its length only (no form loss at the bore change)",
    "common practice: the tool-joint bore as one more pipe interval",
    status=Verification(
        "common_practice",
        "the usual hydraulics-programme treatment: the joint bore is one more pipe interval",
        ("ignores the contraction and expansion at each joint",),
    ),
)(_no_minor_loss)

JOINT_LOSS_METHODS.register(
    "bore_change_k",
    "bore friction plus a sharp contraction (Crane TP-410) and a Borda–Carnot expansion at "
    "every tool joint in the string",
    "Crane TP-410 (1988) p. A-26; Idelchik (1986) ch. 4",
    status=Verification(
        "reference_library",
        "tests/test_flow_minor_losses.py: K_c equals fluids.fittings.contraction_sharp("
        "method='Crane') and K_e equals fluids.fittings.diffuser_sharp (Rennels: "
        "Borda–Carnot) to 1e-12 over β in (0, 1]",
        (
            "turbulent-flow coefficients, applied as they are in laminar bores (an overstatement "
            "there); no loss modelled around the tool-joint OD in the annulus",
        ),
    ),
)(joint_minor_loss)

#: The option names, default first.
JOINT_LOSS_OPTIONS = ("bore_friction", "bore_change_k")


def check_joint_losses(option) -> str:
    """The tool-joint loss option, one of :data:`JOINT_LOSS_OPTIONS`.

    Examples
    --------
    >>> check_joint_losses("bore_change_k")
    'bore_change_k'
    """
    return check_choice("joint losses", option, JOINT_LOSS_OPTIONS)
