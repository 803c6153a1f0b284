"""Cross-section area and mean velocity of a pipe or concentric annulus: the one place of
A = (π/4)(D2² − D1²) and V = Q/A in calc (flow, cleaning, geometry and bit use them)."""

from __future__ import annotations

import numpy as np

__all__ = ["cross_section_area", "mean_velocity"]


def cross_section_area(d_outer, d_inner=0.0):
    """Cross-section area A = (π/4)(D2² − D1²) [m²]; a full circle for ``d_inner`` = 0.

    Parameters
    ----------
    d_outer : array_like
        Pipe inside diameter, or hole/casing inside diameter D2 [m].
    d_inner : array_like
        Pipe outside diameter D1 [m] of an annulus; 0 for a pipe.

    Returns
    -------
    numpy.ndarray
        Area [m²] (0-d for scalar input).

    Examples
    --------
    >>> round(float(cross_section_area(0.2, 0.1)), 8)
    0.02356194
    """
    return np.pi / 4.0 * (np.asarray(d_outer, dtype=float) ** 2 - np.asarray(d_inner) ** 2)


def mean_velocity(q, d_outer, d_inner=0.0):
    """Mean velocity V = Q/A [m/s] in a pipe (``d_inner`` = 0) or concentric annulus.

    Field form for the annulus AV[ft/min] = 24.51·Q[gpm]/(D2² − D1²)[in²]
    (calc/METHODS.md §6.1; 24.51 = 77/π exactly); the tests prove it equals this SI form.

    Parameters
    ----------
    q : array_like
        Flow rate [m³/s].
    d_outer, d_inner : array_like
        As for :func:`cross_section_area` [m].

    Examples
    --------
    >>> round(float(mean_velocity(0.01, 0.2, 0.1)), 6)
    0.424413
    """
    return np.asarray(q, dtype=float) / cross_section_area(d_outer, d_inner)
