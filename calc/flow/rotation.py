"""Effect of string rotation on the annular friction gradient: laminar helical flow.

A rotating string adds an azimuthal (Couette) shear to the axial flow in the annulus.  For a
shear-thinning fluid the total shear rate rises, the apparent viscosity falls, and the axial
pressure gradient needed for the same flow rate drops: the viscous coupling of axial and
rotational flow.  This module solves that coupled laminar problem for a power-law fluid in the
narrow-slot form of the annulus (gap h = (D2 - D1)/2, inner wall moving at U = ωD1/2) and
returns the rotation factor

.. math:: R_{rot} = \\frac{(dp/dL)_{rotating}}{(dp/dL)_{not\\ rotating}} \\le 1
          \\quad (n \\le 1), \\qquad R_{rot} = 1 \\text{ for } n = 1.

The slot equations (axial stress τz = G·h·ξ, ξ = y/h - 1/2, azimuthal stress τθ = T uniform
across the gap, |τ| = K·γ̇ⁿ with γ̇ the magnitude of the shear-rate vector), in the scales
τ* = K(V/h)ⁿ, g = G·h/τ*, t = T/τ*, s = √(g²ξ² + t²), m = (1 - n)/n:

.. math:: \\int_{-1/2}^{1/2} g\\,ξ^2 s^{m}\\,dξ = 1 \\quad\\text{(axial flow rate)},\\qquad
          \\int_{-1/2}^{1/2} t\\,s^{m}\\,dξ = λ = U/V \\quad\\text{(wall speed)}

and R_rot = g/g₀ with g₀ the root for λ = 0: g₀ = (2(1/n + 2)·2^{1/n+1})ⁿ.  The factor depends
only on n and λ = U/V (the ratio of the string's surface speed to the mean annular velocity).

What the model leaves out, and field and flow-loop data show (Marken et al. 1992; Ahmed &
Miska 2008): rotation raises annular loss in eccentric annuli and in transitional or turbulent
flow (secondary flows, Taylor vortices, cuttings lifted from the low side).  This factor is the
viscous shear-thinning effect only; it is applied to laminar flow (faded out across the
method's transitional band) and is an optimistic (lower) estimate of the ECD where the string
lies eccentric.

References
----------
Savins, J.G. & Wallick, G.C. (1966). Viscosity profiles, discharge rates, pressures, and
torques for a rheologically complex fluid in a helical flow. AIChE J. 12(2), 357-363.
Luo, Y. & Peden, J.M. (1990). Flow of non-Newtonian fluids through eccentric annuli.
SPE Production Engineering 5(1), 91-96 (helical flow of power-law fluids in annuli).
Bird, R.B., Armstrong, R.C. & Hassager, O. (1987). Dynamics of Polymeric Liquids, vol. 1,
2nd ed., Wiley (helical annular flow of generalised Newtonian fluids).
(Equations derived here from the momentum balance of the slot; the sources were not checked
for a printed example, calc/METHODS.md §22.)
"""

from __future__ import annotations

import numpy as np

from calc.errors import InputError, check_finite, check_range
from calc.registry import MethodRegistry, Verification

__all__ = [
    "ROTATION_METHODS",
    "RPM_MAX",
    "VALIDITY",
    "check_rpm",
    "helical_gradient_ratio",
    "outside_validity",
    "rotation_factor",
    "surface_speed_ratio",
]

#: Largest accepted string rotary speed [rpm]: top drives and rotary tables turn drill strings
#: at a few hundred rpm (common practice); 600 rpm is also where Rubiandini's rotation term
#: changes sign (calc/cleaning/deviated.py uses the same limit).
RPM_MAX = 600.0

#: Range where the factor is applied without a note: flow index n (0.2 ≤ n ≤ 1: shear-thinning
#: drilling fluids, common practice), diameter ratio D1/D2 ≥ 0.5 (the narrow-slot form; our
#: limit: the slot's error grows as the gap widens) and speed ratio λ = U/V ≤ 20 (our limit:
#: the quadrature resolves the solution to 1e-9 there).
VALIDITY = {"n": (0.2, 1.0), "diameter_ratio": (0.5, 1.0), "speed_ratio": (0.0, 20.0)}

#: Gauss-Legendre nodes and weights on ξ ∈ [0, 1/2] (the integrands are even in ξ).
_NODES, _WEIGHTS = np.polynomial.legendre.leggauss(64)
_XI = 0.25 * (_NODES + 1.0)
_W = 0.25 * _WEIGHTS

#: Rotation corrections of the annular friction gradient: name → implementation.
ROTATION_METHODS = MethodRegistry("rotation correction")


def check_rpm(rpm) -> np.ndarray:
    """String rotary speed [rpm] in [0, RPM_MAX]; InputError naming value and range otherwise.

    Examples
    --------
    >>> float(check_rpm(140.0))
    140.0
    >>> check_rpm(-5.0)
    Traceback (most recent call last):
    ...
    calc.errors.InputError: rotary speed = -5: not allowed; allowed: in [0, 600] rpm
    """
    v = check_finite("rotary speed", rpm, "rpm")
    bad = (v < 0) | (v > RPM_MAX)
    if np.any(bad):
        raise InputError(
            "rotary speed",
            float(np.ravel(v)[np.argmax(np.ravel(bad))]),
            f"in [0, {RPM_MAX:g}] rpm",
        )
    return v


def surface_speed_ratio(rpm, d_pipe, velocity):
    """λ = U/V, U = π·D1·N/60 the string's surface speed, V the mean annular velocity [-].

    Examples
    --------
    5 in pipe at 120 rpm moves its surface at π·0.127·2 = 0.798 m/s; at 0.5 m/s mean
    annular velocity λ = 1.596:

    >>> round(float(surface_speed_ratio(120.0, 0.127, 0.5)), 3)
    1.596
    """
    return (
        np.pi
        * np.asarray(d_pipe, dtype=float)
        * np.asarray(rpm, dtype=float)
        / 60.0
        / (np.asarray(velocity, dtype=float))
    )


def _integrals(g, t, m):
    """The slot integrals over ξ ∈ [-1/2, 1/2] (twice the half-gap sums) for (g, t, m)."""
    xi = _XI
    s2 = (g[:, None] * xi) ** 2 + t[:, None] ** 2
    sm = s2 ** (0.5 * m[:, None])
    smm2 = sm / s2
    i_x2 = 2.0 * (sm * xi**2) @ _W
    i_0 = 2.0 * sm @ _W
    i_x4m = 2.0 * (smm2 * xi**4) @ _W
    i_x2m = 2.0 * (smm2 * xi**2) @ _W
    i_0m = 2.0 * smm2 @ _W
    return i_x2, i_0, i_x4m, i_x2m, i_0m


def _g0(n):
    """Axial-gradient scale g₀ for λ = 0: ∫ g₀^{1/n}|ξ|^{1/n+1} dξ = 1 over the gap."""
    a = 1.0 / n
    return (0.5 * (a + 2.0) * 2.0 ** (a + 2.0)) ** n


def helical_gradient_ratio(n, speed_ratio):
    """Laminar rotation factor R_rot(n, λ) of a power-law fluid in a slot [-].

    Solves the two slot equations (module docstring) for (g, t) by Newton's method in
    (ln g, ln t) and returns g/g₀.

    Parameters
    ----------
    n : array_like
        Flow behaviour index [-], 0 < n ≤ 1.
    speed_ratio : array_like
        λ = U/V ≥ 0, wall speed over mean axial velocity [-].

    Returns
    -------
    numpy.ndarray
        R_rot [-]; 1 for λ = 0 or n = 1, decreasing in λ for n < 1.

    Examples
    --------
    Newtonian fluid: axial and rotational flows do not interact, so R_rot = 1 exactly:

    >>> float(helical_gradient_ratio(1.0, 3.0))
    1.0

    A shear-thinning fluid (n = 0.5) with the wall moving at twice the mean velocity:

    >>> round(float(helical_gradient_ratio(0.5, 2.0)), 4)
    0.9298
    """
    n_arr, lam = np.broadcast_arrays(
        np.asarray(n, dtype=float), np.asarray(speed_ratio, dtype=float)
    )
    shape = n_arr.shape
    nn = np.atleast_1d(n_arr).ravel().copy()
    ll = np.atleast_1d(lam).ravel().copy()
    out = np.ones_like(nn)
    act = (ll > 0) & (np.abs(nn - 1.0) > 1e-12)
    if np.any(act):
        out[act] = _solve(nn[act], ll[act])
    return out.reshape(shape)


def _solve(n, lam):
    """Newton iteration on (ln g, ln t) for the slot equations; returns g/g₀."""
    m = (1.0 - n) / n
    g0 = _g0(n)
    g = g0.copy()
    # start t from the Newtonian-like estimate with the apparent viscosity at λ: t ≈ λ·g/6
    t = np.maximum(lam * g / 6.0, 1e-12)
    for _ in range(200):
        i_x2, i_0, i_x4m, i_x2m, i_0m = _integrals(g, t, m)
        f1 = g * i_x2 - 1.0
        f2 = t * i_0 - lam
        # Jacobian w.r.t. (ln g, ln t)
        a11 = g * i_x2 + m * g**3 * i_x4m
        a12 = m * g * t**2 * i_x2m
        a21 = m * t * g**2 * i_x2m
        a22 = t * i_0 + m * t**3 * i_0m
        det = a11 * a22 - a12 * a21
        dlg = (-f1 * a22 + f2 * a12) / det
        dlt = (-f2 * a11 + f1 * a21) / det
        dlg = np.clip(dlg, -1.0, 1.0)
        dlt = np.clip(dlt, -1.0, 1.0)
        g = g * np.exp(dlg)
        t = t * np.exp(dlt)
        if np.all((np.abs(dlg) < 1e-13) & (np.abs(dlt) < 1e-13)):
            break
    return g / g0


def rotation_factor(rpm, d_hole, d_pipe, velocity, n, turbulent_weight=0.0):
    """Rotation factor on the annular friction gradient, faded out with the turbulent weight.

    .. math:: R = 1 + (1 - w)\\,(R_{rot}(n, λ) - 1), \\qquad λ = \\frac{π D_1 N/60}{V}

    Parameters
    ----------
    rpm : array_like
        String rotary speed N [rpm], 0 ≤ N ≤ :data:`RPM_MAX`.
    d_hole, d_pipe : array_like
        Hole (D2) and pipe (D1) diameters [m]; D1/D2 enters only the validity check.
    velocity : array_like
        Mean annular velocity V [m/s], > 0.
    n : array_like
        Flow behaviour index of the fluid's annulus fit [-] (1 for Bingham: no effect; the
        yield stress is not part of this model).
    turbulent_weight : array_like
        0 laminar, 1 turbulent (the method's transitional-band position); the laminar factor
        applies at w = 0 and none at w = 1 (our choice: the laminar model says nothing
        about turbulent flow).

    Returns
    -------
    numpy.ndarray
        R [-], ≤ 1 for n ≤ 1.

    Examples
    --------
    140 rpm, 5 in pipe in 8-1/2 in hole, 0.6 m/s, n = 0.6, laminar: the factor lowers the
    gradient; at w = 1 (turbulent) it is 1:

    >>> r = rotation_factor(140.0, 0.2159, 0.127, 0.6, 0.6)
    >>> round(float(r), 3)
    0.964
    >>> float(rotation_factor(140.0, 0.2159, 0.127, 0.6, 0.6, turbulent_weight=1.0))
    1.0
    """
    rpm = check_rpm(rpm)
    v = check_finite("annular velocity", velocity, "m/s")
    if np.any(v <= 0):
        raise InputError("annular velocity", float(np.ravel(v)[np.argmin(np.ravel(v))]), "> 0 m/s")
    n = check_range("flow behaviour index n", n, 0.0, np.inf, lo_open=True)
    w = np.clip(np.asarray(turbulent_weight, dtype=float), 0.0, 1.0)
    lam = surface_speed_ratio(rpm, d_pipe, v)
    # n > 1 (shear-thickening) would raise the gradient; the model holds, the fluid is unusual
    r = helical_gradient_ratio(n, lam)
    return 1.0 + (1.0 - w) * (r - 1.0)


def outside_validity(rpm, d_hole, d_pipe, velocity, n) -> np.ndarray:
    """Mask of evaluations with rpm > 0 outside :data:`VALIDITY` (for the caller's note).

    Examples
    --------
    3-1/2 in pipe in 8-1/2 in hole (D1/D2 = 0.41 < 0.5) is outside the slot range:

    >>> outside_validity(140.0, [0.2159, 0.2159], [0.127, 0.0889], 0.6, 0.6).tolist()
    [False, True]
    """
    kappa = np.asarray(d_pipe, dtype=float) / np.asarray(d_hole, dtype=float)
    lam = surface_speed_ratio(rpm, d_pipe, velocity)
    n = np.asarray(n, dtype=float)
    n_lo, n_hi = VALIDITY["n"]
    return (np.asarray(rpm) > 0) & (
        (n < n_lo)
        | (n > n_hi)
        | (kappa < VALIDITY["diameter_ratio"][0])
        | (lam > VALIDITY["speed_ratio"][1])
    )


ROTATION_METHODS.register(
    "helical_slot_power_law",
    "laminar helical flow of a power-law fluid in the narrow-slot annulus: the rotating "
    "string lowers the axial gradient of a shear-thinning fluid; faded out in turbulent flow",
    "Savins & Wallick (1966) AIChE J. 12(2); Luo & Peden (1990) SPE Prod. Eng. 5(1); "
    "equations derived from the slot momentum balance",
    status=Verification(
        "independent_reimplementation",
        "tests/test_flow_rotation.py: the Newton solver agrees with a separate "
        "scipy.integrate.quad + scipy.optimize.brentq solution of the same slot equations to "
        "1e-8, and with the exact Newtonian limit (factor 1 at any speed, Bird, Armstrong & "
        "Hassager 1987); no printed example of the papers was checked",
        (
            "laminar, concentric, power-law: the yield stress, eccentric secondary flow, "
            "Taylor vortices and cuttings are not modelled; field and flow-loop data show "
            "rotation raising annular loss in eccentric annuli, so the ECD with this factor "
            "is an optimistic estimate",
            "narrow-slot form; applied without a note for 0.2 <= n <= 1, D1/D2 >= 0.5, "
            "U/V <= 20 (our limits)",
        ),
    ),
)(rotation_factor)
