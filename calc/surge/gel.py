"""Breaking circulation: the pressure to break a gelled mud column in the bore and annulus.

Force balance of a gelled plug on its wall, τ_g × wall area = Δp × flow area, gives
Δp = 4τ_g·L/(D_outer − D_inner) per interval (D_inner = 0 in a pipe bore).

References
----------
Bourgoyne, A.T. et al. (1986) Applied Drilling Engineering, SPE Textbook Series 2, ch. 4
(from memory) — also common practice.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.errors import InputError, check_nonnegative, check_positive
from calc.notes import Note
from calc.numeric import scalar_or_array
from calc.surge.emw import trip_emw
from calc.values import Value

__all__ = [
    "GEL_CHOICES",
    "BreakCirculationResult",
    "break_circulation_pressure",
    "check_gel",
    "gel_break_pressure",
    "pipe_start_gel_pressure",
]

#: Which gel of the mud check applies when (common practice, calc/METHODS.md §11.8):
#: the pipe starting at each stand has stood still only for the connection (tens of seconds
#: to a couple of minutes), so the 10-second gel; circulation broken after the trip or a
#: static period (a survey, a flow check, the whole trip), so the 10-minute gel.
GEL_CHOICES = {"stand": "10s", "break_circulation": "10min"}


def check_gel(name: str, gel_strength) -> float | None:
    """A gel strength [Pa] ≥ 0 (one value), or None (not given: no gel term)."""
    if gel_strength is None:
        return None
    g = np.asarray(gel_strength, dtype=float)
    if g.ndim or not np.isfinite(g) or g < 0:
        raise InputError(name, float(g) if not g.ndim else "an array", "one stress >= 0 Pa")
    return float(g)


def gel_break_pressure(gel_strength, d_outer, length, d_inner=0.0):
    """Pressure to break a gelled column in one interval, 4τ_g·L/(D_outer − D_inner) [Pa].

    Force balance of the plug on its walls: τ_g × wall area = Δp × flow area; a pipe bore when
    ``d_inner`` is 0 (then D_outer is the bore).

    Parameters
    ----------
    gel_strength : array_like
        Gel strength τ_g [Pa], ≥ 0.
    d_outer : array_like
        Pipe bore, or hole/casing ID [m], > 0.
    length : array_like
        Interval length [m], ≥ 0.
    d_inner : array_like
        Pipe OD for an annulus [m], 0 ≤ d_inner < d_outer.

    References
    ----------
    Bourgoyne et al. (1986) Applied Drilling Engineering, ch. 4 (from memory) — also common
    practice.

    >>> round(gel_break_pressure(5.0, 0.1, 1000.0) / 1e6, 3)  # 4·5·1000/0.1
    0.2
    """
    tg = check_nonnegative("gel strength", gel_strength, "Pa")
    do = check_positive("outer diameter", d_outer, "m")
    ln = check_nonnegative("interval length", length, "m")
    di = check_nonnegative("inner diameter", d_inner, "m")
    tg, do, ln, di = np.broadcast_arrays(tg, do, ln, di)
    if np.any(di >= do):
        i = np.unravel_index(int(np.argmax(di >= do)), di.shape)
        raise InputError(
            "inner diameter",
            float(di[i]),
            "< outer diameter {outer}",
            kind="diameter",
            values=(Value("outer", float(do[i]), "diameter"),),
        )
    return scalar_or_array(4.0 * tg * ln / (do - di))


def pipe_start_gel_pressure(gel_strength, d_hole, d_pipe, length, *, d_bore=None,
                            bore_length=None, string_end="closed"):  # fmt: skip
    """Pressure to break the gel when the pipe starts moving: per annular interval and the cap
    at the bit [Pa].

    .. math:: \\Delta p_i = \\frac{4\\tau_g L_i}{D_{2,i} - D_{1,i}},\\qquad
              p_{bit} \\le \\sum_j \\frac{4\\tau_g L_j}{D_{b,j}}\\ \\text{(open string)}

    A closed string pushes the gelled annulus column ahead of it: the pressure at a depth is the
    sum of the annular intervals above it (:func:`gel_break_pressure`).  An open string lets the
    mud yield in the bore instead, so the pressure at the bit (and at every depth) is at most the
    bore's gel-break pressure: the cap (``inf`` for a closed string).

    Parameters
    ----------
    gel_strength : float
        Gel strength τ_g [Pa], ≥ 0 (the 10-second gel for a stand, :data:`GEL_CHOICES`).
    d_hole, d_pipe, length : array_like
        Annular intervals from surface to the bit [m].
    d_bore, bore_length : array_like, optional
        Bore diameter and length of the string intervals [m] (open string).
    string_end : {"closed", "open"}

    Returns
    -------
    (ndarray, float)
        Gel-break pressure per annular interval [Pa] and the cap at the bit [Pa].

    References
    ----------
    Bourgoyne et al. (1986) Applied Drilling Engineering, ch. 4 (from memory) — also common
    practice (calc/METHODS.md §11.8).

    >>> dp, cap = pipe_start_gel_pressure(5.0, 0.2, 0.1, 1000.0)
    >>> round(float(dp[0])), cap  # 4·5·1000/(0.2 − 0.1)
    (200000, inf)
    """
    ann = np.atleast_1d(gel_break_pressure(gel_strength, d_hole, length, d_pipe)).astype(float)
    if string_end == "closed" or d_bore is None:
        return ann, float("inf")
    lb = length if bore_length is None else bore_length
    bore = np.atleast_1d(gel_break_pressure(gel_strength, d_bore, lb))
    return ann, float(np.sum(bore))


@dataclass(frozen=True)
class BreakCirculationResult:
    """Pressure to break the gel and start circulation (SI).

    pressure            total over the string and annulus [Pa]
    string_pressure     Σ 4τ_g L/D over the bore [Pa]
    annulus_pressure    Σ 4τ_g L/(D2 − D1) over the annulus [Pa]
    annulus_intervals   per annular interval [Pa]; ``string_intervals`` per bore interval
    bottom_emw          ρ + annulus_pressure/(g·TVD_bit) [kg/m³] (what the open hole feels)
    """

    pressure: float
    string_pressure: float
    annulus_pressure: float
    string_intervals: np.ndarray
    annulus_intervals: np.ndarray
    bottom_emw: float
    gel_strength: float
    method: str
    notes: tuple[Note, ...] = ()


def break_circulation_pressure(
    well, gel_strength, *, density, hydrostatic: str = "exact"
) -> BreakCirculationResult:
    """Pressure needed to break circulation after a static period, from the gel strength.

    .. math:: \\Delta p = \\sum_{bore} \\frac{4\\tau_g L}{D} + \\sum_{annulus}
              \\frac{4\\tau_g L}{D_2 - D_1}

    Force balance of a gelled plug on its wall: τ_g × wall area = Δp × flow area.

    Parameters
    ----------
    well : calc.geometry.Well
    gel_strength : float
        Gel strength τ_g [Pa] (usually the 10-minute gel; common practice).
    density : float
        Mud density [kg/m³] (for the bottom-hole EMW).

    References
    ----------
    Bourgoyne et al. (1986) Applied Drilling Engineering, ch. 4 (pressure to break circulation;
    from memory) — also common practice.

    >>> # 4·τ·L/D for 1000 m of 0.1 m pipe at 5 Pa gives 0.2 MPa
    >>> round(4 * 5.0 * 1000.0 / 0.1 / 1e6, 3)
    0.2
    """
    tg = float(check_nonnegative("gel strength", gel_strength, "Pa"))
    rho = float(check_positive("mud density", density, "kg/m³"))
    iv = well.flow_intervals()
    s, a = iv.string, iv.annulus
    sp = np.atleast_1d(gel_break_pressure(tg, s.outer_diameter, s.length))
    ap = np.atleast_1d(gel_break_pressure(tg, a.outer_diameter, a.length, a.inner_diameter))
    emw = trip_emw(rho, float(ap.sum()), well.bit_tvd, hydrostatic=hydrostatic)
    return BreakCirculationResult(
        pressure=float(sp.sum() + ap.sum()),
        string_pressure=float(sp.sum()),
        annulus_pressure=float(ap.sum()),
        string_intervals=sp,
        annulus_intervals=ap,
        bottom_emw=emw,
        gel_strength=tg,
        method="gel plug force balance 4τ_g·L/D per interval (Bourgoyne et al. 1986; common "
        "practice)",
    )
