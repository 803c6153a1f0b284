"""Method-specific input requirements (each raises :class:`calc.errors.InputError`)."""

from __future__ import annotations

import numpy as np

from calc.errors import InputError
from calc.flow.result import FlowCase
from calc.values import Value

__all__ = ["require_n_at_most", "require_n_one", "require_no_yield"]

_N_ONE_TOL = 1e-9


def _first(arr, bad):
    return float(np.asarray(arr).ravel()[np.flatnonzero(bad)[0]])


def require_no_yield(case: FlowCase, method: str) -> None:
    """``tau_y`` must be 0 (Newtonian and power-law methods)."""
    bad = case.tau_y != 0
    if np.any(bad):
        raise InputError(
            "yield stress tau_y",
            _first(case.tau_y, bad),
            f"0 Pa for method '{method}' (use 'api13d_2010_hb', 'bingham' or 'exact_laminar' "
            "for a yield stress)",
        )


def require_n_one(case: FlowCase, method: str) -> None:
    """``n`` must be 1 (Newtonian and Bingham methods); tolerance 1e-9."""
    bad = np.abs(case.n - 1.0) > _N_ONE_TOL
    if np.any(bad):
        raise InputError(
            "flow behaviour index n",
            _first(case.n, bad),
            f"1 for method '{method}' (k is then the viscosity or plastic viscosity)",
        )


def require_n_at_most(case: FlowCase, method: str, n_max: float = 2.0) -> None:
    """``n`` ≤ n_max: the bounds 3470 - 1370n and the Dodge-Metzner solve need n < 2.5."""
    bad = case.n > n_max
    if np.any(bad):
        raise InputError(
            "flow behaviour index n",
            _first(case.n, bad),
            "0 < n <= {n_max:g} for '{method}'",
            values=(Value("n_max", float(n_max)), Value("method", method)),
        )
