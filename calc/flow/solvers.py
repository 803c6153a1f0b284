"""Vectorised bracketed root finding for the monotone 1-D inversions of :mod:`calc.flow`.

Every inversion in this package (wall stress from flow rate, the zero-shear radius of the
annulus, Hanks' critical stress ratio, the Dodge-Metzner and Colebrook friction factors, the
critical velocity) is a monotone problem in one unknown per array element.  They are solved for
whole arrays at once: one numpy pass per iteration, never a per-element Python loop.

The bracketing solver is the ITP method (interpolate, truncate, project), which never needs more
iterations than bisection plus one and is superlinear on smooth functions.

References
----------
Oliveira, I. F. D. & Takahashi, R. H. C. (2020). An enhancement of the bisection method average
performance preserving minmax optimality. ACM Trans. Math. Software 47(1), article 5.
"""

from __future__ import annotations

from collections.abc import Callable

import numpy as np

__all__ = ["expand_bracket", "itp_solve", "newton_increasing_concave", "solve_positive"]

#: ITP slack n0: iterations allowed beyond bisection's count (Oliveira & Takahashi use 1; a
#: larger slack lets the interpolation steps work on one-sided convergence).
N0_SLACK = 2


def itp_solve(
    func: Callable[[np.ndarray], np.ndarray],
    lo,
    hi,
    *,
    xtol: float = 0.0,
    rtol: float = 1e-13,
    maxiter: int = 200,
    f_lo=None,
    f_hi=None,
) -> np.ndarray:
    """Root of an increasing function on ``[lo, hi]``, element by element, vectorised.

    ``func`` maps an array of trial points (same shape as ``lo``) to residuals; it must be
    increasing in each element with ``func(lo) <= 0 <= func(hi)``.  Where ``func(lo) >= 0`` the
    result is ``lo``; where ``func(hi) <= 0`` it is ``hi``.

    Parameters
    ----------
    func : callable
        Residual, increasing in its argument [any].
    lo, hi : array_like
        Bracket ends [same unit as the unknown].
    xtol, rtol : float
        Stop when the bracket is narrower than ``2·(xtol + rtol·max(|lo|, |hi|))``.
    maxiter : int
        Safety cap on iterations (the ITP bound is reached well before it).
    f_lo, f_hi : array_like, optional
        ``func(lo)``, ``func(hi)`` when already known (saves two evaluations).

    Returns
    -------
    numpy.ndarray
        The roots [unit of the unknown].

    Examples
    --------
    >>> r = itp_solve(lambda x: x**3 - 2.0, np.array([0.0, 1.0]), np.array([2.0, 3.0]))
    >>> bool(np.allclose(r, 2 ** (1 / 3), rtol=1e-12))
    True
    """
    a = np.array(lo, dtype=float, copy=True)
    b = np.array(hi, dtype=float, copy=True)
    a, b = np.broadcast_arrays(a, b)
    shape = a.shape
    a, b = np.atleast_1d(a).copy(), np.atleast_1d(b).copy()
    ya = f_lo if f_lo is not None else func(a.reshape(shape))
    yb = f_hi if f_hi is not None else func(b.reshape(shape))
    ya = np.broadcast_to(np.asarray(ya, dtype=float), shape).ravel().copy()
    yb = np.broadcast_to(np.asarray(yb, dtype=float), shape).ravel().copy()
    a, b = a.ravel(), b.ravel()
    out = 0.5 * (a + b)
    done = np.zeros(a.shape, dtype=bool)
    at_lo = ya >= 0
    at_hi = (~at_lo) & (yb <= 0)
    out[at_lo] = a[at_lo]
    out[at_hi] = b[at_hi]
    done |= at_lo | at_hi
    eps = xtol + rtol * np.maximum(np.abs(a), np.abs(b))
    eps = np.where(eps > 0, eps, np.finfo(float).tiny)
    width0 = np.where(done, 2 * eps, b - a)
    n_half = np.ceil(np.log2(np.maximum(width0 / (2 * eps), 1.0)))
    n_max = n_half + N0_SLACK
    kappa2 = 2.0
    for j in range(maxiter):
        done |= (b - a) <= 2 * eps
        if np.all(done):
            break
        width = b - a
        kappa1 = 0.2 / np.where(width0 > 0, width0, 1.0)
        x_half = 0.5 * (a + b)
        r = np.maximum(eps * 2.0 ** np.maximum(n_max - j, 0) - 0.5 * width, 0.0)
        delta = np.maximum(kappa1 * width**kappa2, eps)  # ≥ eps: closes one-sided brackets
        denom = yb - ya
        safe = np.isfinite(denom) & (denom > 0)
        x_f = np.where(safe, (yb * a - ya * b) / np.where(safe, denom, 1.0), x_half)
        sigma = np.sign(x_half - x_f)
        x_t = np.where(delta <= np.abs(x_half - x_f), x_f + sigma * delta, x_half)
        x_itp = np.where(np.abs(x_t - x_half) <= r, x_t, x_half - sigma * r)
        x_itp = np.where(done, out, x_itp)
        y = np.broadcast_to(np.asarray(func(x_itp.reshape(shape)), dtype=float), shape).ravel()
        up = (~done) & (y > 0)
        dn = (~done) & (y < 0)
        hit = (~done) & (y == 0)
        b[up], yb[up] = x_itp[up], y[up]
        a[dn], ya[dn] = x_itp[dn], y[dn]
        a[hit] = b[hit] = x_itp[hit]
    live = ~(at_lo | at_hi)
    out[live] = 0.5 * (a[live] + b[live])
    return out.reshape(shape)


def expand_bracket(
    func: Callable[[np.ndarray], np.ndarray],
    hi,
    *,
    factor: float = 2.0,
    maxiter: int = 200,
) -> np.ndarray:
    """Grow ``hi`` by ``factor`` where ``func(hi) < 0`` until ``func(hi) >= 0`` everywhere.

    ``func`` must be increasing and eventually non-negative.  Returns the new upper bounds.

    >>> expand_bracket(lambda x: x - 10.0, np.array([1.0, 20.0])).tolist()
    [16.0, 20.0]
    """
    b = np.array(hi, dtype=float, copy=True)
    for _ in range(maxiter):
        low = np.asarray(func(b)) < 0
        if not np.any(low):
            return b
        b[low] *= factor
    raise RuntimeError("expand_bracket: no sign change found")  # pragma: no cover


def newton_increasing_concave(
    g: Callable[[np.ndarray], tuple[np.ndarray, np.ndarray]],
    x0,
    *,
    rtol: float = 1e-14,
    maxiter: int = 100,
) -> np.ndarray:
    """Vectorised Newton iteration for an increasing, concave residual ``g(x)``.

    ``g`` returns ``(value, derivative)``.  For an increasing concave function every Newton
    step lands at or below the root, and from there the iterates rise monotonically to it, so
    the iteration needs no bracket.  Used for the Colebrook and Dodge-Metzner equations written
    in ``x = 1/√f``.

    >>> x = newton_increasing_concave(lambda x: (np.log(x), 1 / x), np.array([0.5, 3.0]))
    >>> bool(np.allclose(x, 1.0))
    True
    """
    x = np.array(x0, dtype=float, copy=True)
    for _ in range(maxiter):
        val, der = g(x)
        step = val / der
        x_new = x - step
        # a step from the right of the root can overshoot far left; keep x positive
        x_new = np.where(x_new > 0, x_new, 0.5 * x)
        if np.all(np.abs(x_new - x) <= rtol * np.abs(x_new)):
            return x_new
        x = x_new
    return x


def solve_positive(
    func: Callable[[np.ndarray], np.ndarray],
    guess,
    *,
    factor: float = 4.0,
    rtol: float = 1e-12,
) -> np.ndarray:
    """Root of an increasing ``func`` of a positive unknown, starting from ``guess``.

    Brackets by dividing/multiplying ``guess`` by ``factor`` until the residual changes sign,
    then solves in ln x with :func:`itp_solve`.  Vectorised.

    >>> float(solve_positive(lambda x: x**2 - 9.0, 1.0))
    3.0
    """
    g = np.atleast_1d(np.array(guess, dtype=float))
    lo = g / factor
    hi = g * factor
    for _ in range(400):
        f_lo = np.asarray(func(lo))
        bad = f_lo > 0
        if not np.any(bad):
            break
        lo[bad] /= factor
    for _ in range(400):
        f_hi = np.asarray(func(hi))
        bad = f_hi < 0
        if not np.any(bad):
            break
        hi[bad] *= factor
    x = itp_solve(
        lambda x: func(np.exp(x)), np.log(lo), np.log(hi), xtol=rtol, rtol=0.0, f_lo=f_lo, f_hi=f_hi
    )
    out = np.exp(x)
    return out.reshape(np.shape(guess)) if np.ndim(guess) == 0 else out
