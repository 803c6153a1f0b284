"""Eccentric-annulus correction: Haciislamoglu & Langlinais (1990).

The correlation gives R = (dp/dL)_eccentric / (dp/dL)_concentric for power-law fluids as a
function of the eccentricity e = 2δ/(D2 - D1) (δ the offset of the pipe centre), the diameter
ratio k = D1/D2 and the flow index n, one form for laminar and one for turbulent flow.

References
----------
Haciislamoglu, M. & Langlinais, J. (1990). Non-Newtonian flow in eccentric annuli.
J. Energy Resour. Technol. 112(3), 163-169.  Coefficients from memory, not yet
checked against the source (calc/METHODS.md §6.17); the turbulent form is often credited to
Haciislamoglu & Cartalos (1994), SPE 28304.
"""

from __future__ import annotations

import numpy as np

from calc.errors import check_range

__all__ = [
    "VALIDITY",
    "eccentricity_factor",
    "eccentricity_factor_laminar",
    "eccentricity_factor_turbulent",
    "eccentricity_from_standoff",
]

#: Validity ranges of the correlation (from memory, not yet checked against the
#: source — calc/METHODS.md §6.17).
VALIDITY = {"eccentricity": (0.0, 0.95), "diameter_ratio": (0.3, 0.9), "n": (0.4, 1.0)}


def eccentricity_factor_laminar(e, diameter_ratio, n):
    """Laminar ratio R = 1 - 0.072(e/n)k^0.8454 - 1.5e²√n·k^0.1852 + 0.96e³√n·k^0.2527 [-].

    Parameters: e eccentricity [-] in [0, 1); diameter_ratio k = D1/D2 [-]; n flow index [-].

    Examples
    --------
    >>> float(eccentricity_factor_laminar(0.0, 0.6, 0.7))
    1.0
    """
    e = np.asarray(e, dtype=float)
    k = np.asarray(diameter_ratio, dtype=float)
    sn = np.sqrt(np.asarray(n, dtype=float))
    return (
        1.0
        - 0.072 * (e / n) * k**0.8454
        - 1.5 * e**2 * sn * k**0.1852
        + 0.96 * e**3 * sn * k**0.2527
    )


def eccentricity_factor_turbulent(e, diameter_ratio, n):
    """Turbulent ratio R = 1 - 0.048(e/n)k^0.8454 - (2/3)e²√n·k^0.1852 + 0.285e³√n·k^0.2527.

    Examples
    --------
    Concentric (e = 0) is 1; a 5 in pipe lying at e = 0.95 (the correlation's upper limit) in
    8-1/2 in hole (k = 0.588, n = 0.7) loses less than concentric, less so in turbulent flow
    than in laminar flow:

    >>> float(eccentricity_factor_turbulent(0.0, 0.588, 0.7))
    1.0
    >>> round(float(eccentricity_factor_turbulent(0.95, 5 / 8.5, 0.7)), 3)
    0.681
    >>> round(float(eccentricity_factor_laminar(0.95, 5 / 8.5, 0.7)), 3)
    0.513
    """
    e = np.asarray(e, dtype=float)
    k = np.asarray(diameter_ratio, dtype=float)
    sn = np.sqrt(np.asarray(n, dtype=float))
    return (
        1.0
        - 0.048 * (e / n) * k**0.8454
        - (2.0 / 3.0) * e**2 * sn * k**0.1852
        + 0.285 * e**3 * sn * k**0.2527
    )


def eccentricity_factor(e, diameter_ratio, n, turbulent_weight):
    """Gradient multiplier for an eccentric annulus, blended by regime.

    .. math:: R = R_{lam} + w(R_{turb} - R_{lam})

    Parameters
    ----------
    e : array_like
        Eccentricity 2δ/(D2 - D1) [-], 0 ≤ e < 1.
    diameter_ratio : array_like
        D1/D2 [-].
    n : array_like
        Flow behaviour index [-] (1 for Newtonian and Bingham fluids).
    turbulent_weight : array_like
        w = 0 laminar, 1 turbulent; in the transitional band the caller passes the linear
        position of Re between the method's laminar and turbulent limits (our choice: it keeps
        the corrected gradient continuous where the method's friction factor is).

    Returns
    -------
    numpy.ndarray
        R [-]; R ≤ 1 in laminar flow for any e < 1, k ≤ 1.

    Notes
    -----
    Validity (from memory, unverified): 0 ≤ e ≤ 0.95, 0.3 ≤ k ≤ 0.9, 0.4 ≤ n ≤ 1; outside it
    the flow functions attach a note.  Within a regime eccentric loss is lower than concentric,
    but transition comes earlier, which this correction does not model.

    Examples
    --------
    w = 0 gives the laminar ratio, w = 1 the turbulent one, w = 0.5 their mean:

    >>> k, n = 5 / 8.5, 0.7
    >>> lam = float(eccentricity_factor_laminar(0.5, k, n))
    >>> turb = float(eccentricity_factor_turbulent(0.5, k, n))
    >>> r = eccentricity_factor(0.5, k, n, np.array([0.0, 0.5, 1.0]))
    >>> bool(np.allclose(r, [lam, (lam + turb) / 2, turb], rtol=1e-15))
    True
    """
    r_lam = eccentricity_factor_laminar(e, diameter_ratio, n)
    r_turb = eccentricity_factor_turbulent(e, diameter_ratio, n)
    w = np.asarray(turbulent_weight, dtype=float)
    return r_lam + w * (r_turb - r_lam)


def eccentricity_from_standoff(standoff, inclination):
    """Eccentricity of a string held off the low side by its stand-off, e = (1 - s)·sin θ [-].

    .. math:: e = (1 - s)\\,\\sin θ, \\qquad s = \\frac{c_{low}}{c}, \\quad c = (D_2 - D_1)/2

    The stand-off s is the gap left on the low side as a share of the concentric gap (1:
    centred, 0: lying on the wall; the trade's "stand-off ratio" of centralised strings).  In
    a horizontal hole the string lies on the low side at that stand-off (e = 1 - s); in a
    vertical hole it is taken as centred on average (e = 0); between, the sin θ weight follows
    the share of the string's weight pressing it to the low side.  The sin θ interpolation is
    our stated model, not a published correlation.

    Parameters
    ----------
    standoff : array_like
        Stand-off ratio s [-], 0 ≤ s ≤ 1.
    inclination : array_like
        Hole inclination θ [rad], 0 ≤ θ ≤ π (measured from vertical).

    Returns
    -------
    numpy.ndarray
        e [-], 0 ≤ e ≤ 1; capped at 0.95 (the upper end of the Haciislamoglu & Langlinais
        range) so the eccentricity factor stays within the correlation.

    Examples
    --------
    A string lying on the wall (s = 0) in horizontal hole is at the cap; at 60° with s = 0.5
    the eccentricity is 0.5·sin 60° = 0.433; vertical hole is concentric:

    >>> float(eccentricity_from_standoff(0.0, np.pi / 2))
    0.95
    >>> round(float(eccentricity_from_standoff(0.5, np.radians(60.0))), 3)
    0.433
    >>> float(eccentricity_from_standoff(0.3, 0.0))
    0.0
    """
    s = check_range("stand-off", standoff, 0.0, 1.0)
    th = check_range("inclination", inclination, 0.0, np.pi, "rad")
    e = (1.0 - s) * np.abs(np.sin(th))
    return np.minimum(e, VALIDITY["eccentricity"][1])
