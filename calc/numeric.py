"""Small vectorised numerical helpers shared across calc (scalar-in/scalar-out, bisection)."""

from __future__ import annotations

import numpy as np

__all__ = [
    "bisect_increasing",
    "depth_weights",
    "first_change",
    "first_positive",
    "float_or_array",
    "grid_with_switches",
    "scalar_or_array",
]


def bisect_increasing(fun, lo, hi, *, iterations: int = 64, log: bool = False):
    """Root of an increasing function on whole arrays at once (vectorised bisection).

    ``fun(x)`` must accept and return arrays of the broadcast shape of ``lo`` and ``hi`` and be
    non-decreasing in ``x`` (a jump through zero is allowed; the jump point is returned).  Where
    ``fun(lo) >= 0`` the result is ``lo``; where ``fun(hi) <= 0`` it is ``hi`` — callers check
    the bracket themselves when that matters.  ``log=True`` bisects on ``log(x)`` (``lo > 0``).

    >>> float(bisect_increasing(lambda x: x**2 - 2.0, 0.0, 2.0))  # doctest: +ELLIPSIS
    1.41421356...
    """
    lo, hi = np.broadcast_arrays(np.asarray(lo, dtype=float), np.asarray(hi, dtype=float))
    a = np.log(lo) if log else lo.copy()
    b = np.log(hi) if log else hi.copy()
    for _ in range(iterations):
        m = 0.5 * (a + b)
        x = np.exp(m) if log else m
        up = np.asarray(fun(x)) > 0.0
        b = np.where(up, m, b)
        a = np.where(up, a, m)
    m = 0.5 * (a + b)
    return np.exp(m) if log else m


def first_change(changed, a, b, *, iterations: int, points: int = 1, log: bool = False):
    """Narrow brackets ``[a, b]`` onto the first point where ``changed`` turns True.

    ``changed(x)`` maps an array ``(len(a), points)`` of trial points (row i inside bracket i)
    to booleans; it is False at ``a`` and True at ``b``.  Each step tries ``points`` equally
    spaced interior points of every bracket at once (``points=1``: bisection) and keeps the
    sub-bracket before the first True, so the bracket shrinks by ``points + 1`` per step.
    ``log=True`` spaces the points in ``log(x)`` (``a, b > 0``).  Returns the final (a, b).

    >>> a, b = first_change(lambda x: x > 0.3, np.array([0.0]), np.array([1.0]), iterations=20)
    >>> bool(a[0] <= 0.3 < b[0]), bool(b[0] - a[0] < 1e-6)
    (True, True)
    """
    a = np.log(np.asarray(a, dtype=float)) if log else np.asarray(a, dtype=float).copy()
    b = np.log(np.asarray(b, dtype=float)) if log else np.asarray(b, dtype=float).copy()
    frac = np.arange(1, points + 1) / (points + 1.0)
    rows = np.arange(a.size)
    for _ in range(iterations):
        x = a[:, None] + (b - a)[:, None] * frac[None, :]
        hit = np.asarray(changed(np.exp(x) if log else x), dtype=bool)
        j = np.where(hit.any(axis=1), np.argmax(hit, axis=1), points)  # first True (or b)
        ext = np.concatenate([a[:, None], x, b[:, None]], axis=1)
        a, b = ext[rows, j], ext[rows, j + 1]
    return (np.exp(a), np.exp(b)) if log else (a, b)


def grid_with_switches(regime_of, grid, *, iterations: int = 48, points: int = 1,
                       passes: int = 3):  # fmt: skip
    """``grid`` (> 0, increasing) with both ends of a tight bracket around every point where a
    column of ``regime_of`` changes: the scan on which a piecewise-increasing curve with jumps
    at regime changes shows its every local maximum (the left limit at each jump).

    ``regime_of(x)`` maps a 1-D array of points to an integer array ``(len(x), columns)`` (the
    flow regime of each interval).  Each cell of the grid in which a column changes is narrowed
    in ``log(x)`` onto that column's first change (:func:`first_change`, all cells and columns
    at once); ``passes`` repeats catch a second change of one column inside one cell.

    >>> g = grid_with_switches(lambda x: (x[:, None] > 2.5).astype(int), np.array([1.0, 4.0]))
    >>> g.size, bool(g[1] <= 2.5 < g[2]), bool(g[2] / g[1] - 1.0 < 1e-12)
    (4, True, True)
    """
    g = np.asarray(grid, dtype=float)
    r = np.asarray(regime_of(g))
    for _ in range(passes):
        k, col = np.nonzero(r[1:] != r[:-1])
        wide = g[k + 1] / g[k] > 1.0 + 1e-12
        k, col = k[wide], col[wide]
        if not k.size:
            break
        ra = r[k, col]

        def changed(x, col=col, ra=ra):
            reg = np.asarray(regime_of(x.reshape(-1))).reshape((*x.shape, -1))
            return np.take_along_axis(reg, col[:, None, None], axis=2)[..., 0] != ra[:, None]

        a, b = first_change(changed, g[k], g[k + 1], iterations=iterations, points=points,
                            log=True)  # fmt: skip
        g = np.unique(np.concatenate([g, a, b]))
        r = np.asarray(regime_of(g))
    return g


def first_positive(values):
    """Index along axis 0 of the first value > 0 in each column, and whether there is one.

    >>> first_positive(np.array([[-1.0, -1.0], [2.0, -1.0], [-1.0, -1.0]]))
    (array([1, 0]), array([ True, False]))
    """
    pos = np.asarray(values) > 0.0
    return np.argmax(pos, axis=0), pos.any(axis=0)


def scalar_or_array(x):
    """Python float for 0-d input, the array otherwise (scalar in, scalar out)."""
    arr = np.asarray(x)
    return float(arr) if arr.ndim == 0 else arr


def float_or_array(x):
    """``x`` as floats: a Python float for 0-d input, a float array otherwise.

    >>> float_or_array(3), float_or_array([1, 2]).dtype.name
    (3.0, 'float64')
    """
    arr = np.asarray(x, dtype=float)
    return float(arr) if arr.ndim == 0 else arr


def depth_weights(md, top, bottom) -> np.ndarray:
    """Fraction of each interval lying above each depth: ``W[j, i]`` ∈ [0, 1] (linear in MD).

    ``md`` [m] is 1-D (the depths, axis 0), ``top`` and ``bottom`` [m] the intervals' MD span
    (axis 1).  Summing an interval quantity times ``W`` gives its part above each depth.

    >>> depth_weights(np.array([0.0, 150.0, 400.0]), np.array([0.0, 100.0]),
    ...               np.array([100.0, 300.0])).tolist()
    [[0.0, 0.0], [1.0, 0.25], [1.0, 1.0]]
    """
    md, top, bottom = (np.asarray(x, dtype=float) for x in (md, top, bottom))
    return np.clip((md[:, None] - top[None, :]) / (bottom - top)[None, :], 0.0, 1.0)
