"""Inertial surge and swab: the pressure to accelerate the mud column when the pipe speeds up
or slows down, and the acceleration a trip assumes.

A rigid, incompressible mud column (no pressure waves): the mud displaced by the pipe must
accelerate with it.  With the pipe accelerating at a_p, the mud in annular interval i
accelerates at a_f,i and the pressure change at the bottom of the column is

.. math:: \\Delta p_{inertia} = \\sum_i \\rho\\, a_{f,i}\\, L_i,\\qquad
          a_{f,i} = r_i\\, a_p

with the ratio r_i from continuity:

* closed string (float valve): r_i = D₁,ᵢ²/(D₂,ᵢ² − D₁,ᵢ²) (the full pipe OD displaces mud);
* open string: the steel displacement splits between the annulus and the bore so that both
  columns need the same pressure at the bit (nozzle inertia neglected).  With q̇ the
  acceleration of the flow entering the pipe relative to it,

  .. math:: \\dot q = a_p\\,\\frac{\\sum_i L_i A_{o,i}/A_{a,i} + \\sum_j L_j}
                               {\\sum_i L_i/A_{a,i} + \\sum_j L_j/A_{b,j}},\\qquad
            r_i = \\frac{A_{o,i} - \\dot q/a_p}{A_{a,i}}

  (A_o pipe cross-section πD₁²/4, A_a annulus area, A_b bore area; i annular, j bore
  intervals); for one uniform interval r = (D₁² − D_b²)/(D₂² − D₁² + D_b²).

Running in, accelerating raises the pressure (surge) and stopping lowers it; pulling out the
signs are reversed.  The acceleration a trip assumes: the pipe reaches its peak speed V_peak in
a stated time t_a, a_p = V_peak/t_a (deceleration over the same time when the stand stops).

References
----------
Burkhardt, J.A. (1961) Wellbore pressure surges produced by pipe movement. JPT 13(6), 595-605,
SPE-1546-G (inertial term; the closed- and open-pipe ratios from memory, not checked against
the source — derived here from continuity; calc/METHODS.md §11.9).
Bourgoyne, A.T. et al. (1986) Applied Drilling Engineering, SPE Textbook Series 2, ch. 4
(surge pressure due to pipe acceleration; from memory).
"""

from __future__ import annotations

import numpy as np

from calc.errors import InputError, check_choice, check_nonnegative, check_positive
from calc.flow import cross_section_area
from calc.numeric import scalar_or_array

__all__ = [
    "DEFAULT_ACCELERATION_TIME",
    "check_acceleration_time",
    "inertia_ratio",
    "inertial_pressure",
    "peak_trip_pressure",
    "trip_acceleration",
]

#: Time for the pipe to reach its peak speed from rest (and to stop again) [s], default 2 s:
#: an assumption of ours (common practice: the block is brought to speed within a few seconds
#: of lifting the slips); give the rig's own value where the block-position log shows it.
DEFAULT_ACCELERATION_TIME = 2.0


def check_acceleration_time(acceleration_time) -> float | None:
    """An acceleration time [s] > 0, or None (no inertia)."""
    if acceleration_time is None:
        return None
    t = np.asarray(acceleration_time, dtype=float)
    if t.ndim or not np.isfinite(t) or t <= 0:
        raise InputError("acceleration time", float(t) if not t.ndim else "an array",
                         "one time > 0 s (to reach the peak speed from rest)")  # fmt: skip
    return float(t)


def trip_acceleration(peak_speed, acceleration_time):
    """Pipe acceleration when the peak speed is reached in the acceleration time [m/s²].

    .. math:: a_p = V_{peak} / t_a

    Parameters
    ----------
    peak_speed : array_like
        Peak pipe speed [m/s], ≥ 0.
    acceleration_time : float
        Time to reach it from rest [s], > 0 (an assumption; :data:`DEFAULT_ACCELERATION_TIME`).

    >>> trip_acceleration(1.0, 2.0)
    0.5
    """
    v = check_nonnegative("peak speed", peak_speed, "m/s")
    t = check_acceleration_time(acceleration_time)
    if t is None:
        raise InputError("acceleration time", None, "one time > 0 s")
    return scalar_or_array(v / t)


def inertia_ratio(d_hole, d_pipe, length, *, d_bore=None, bore_length=None, string_end="closed"):
    """Mud acceleration over pipe acceleration in each annular interval, r_i [-].

    Closed: r_i = D₁²/(D₂² − D₁²).  Open: r_i = (A_o,i − q̇/a_p)/A_a,i with the split q̇ of the
    module docstring (both columns need the same pressure at the bit).

    Parameters
    ----------
    d_hole, d_pipe, length : array_like
        Annular intervals from surface to the bit: hole/casing ID, pipe OD, length [m].
    d_bore, bore_length : array_like, optional
        Bore diameter and length of the string intervals [m] (open string; the bore lengths
        default to the annular ones).
    string_end : {"closed", "open"}

    >>> round(float(inertia_ratio(0.2, 0.1, 1000.0)), 6)  # 0.01/(0.04 - 0.01)
    0.333333
    >>> round(float(inertia_ratio(0.2, 0.1, 1000.0, d_bore=0.05, string_end="open")), 6)
    0.230769
    """
    end = check_choice("string end", string_end, ("closed", "open"))
    d2 = np.atleast_1d(check_positive("hole diameter", d_hole, "m")).astype(float)
    d1 = np.atleast_1d(check_positive("pipe outside diameter", d_pipe, "m")).astype(float)
    ln = np.atleast_1d(check_nonnegative("interval length", length, "m")).astype(float)
    d2, d1, ln = np.broadcast_arrays(d2, d1, ln)
    if np.any(d1 >= d2):
        raise InputError("pipe outside diameter", float(d1[np.argmax(d1 >= d2)]),
                         "< hole diameter")  # fmt: skip
    a_o, a_a = cross_section_area(d1), cross_section_area(d2, d1)
    if end == "closed":
        return scalar_or_array(a_o / a_a) if np.ndim(d_hole) else float((a_o / a_a)[0])
    if d_bore is None:
        raise InputError("bore diameter", None, "the pipe bore for an open string")
    db = np.atleast_1d(check_positive("bore diameter", d_bore, "m")).astype(float)
    lb = ln if bore_length is None else np.atleast_1d(bore_length).astype(float)
    db, lb = np.broadcast_arrays(db, lb)
    a_b = cross_section_area(db)
    qdot = (np.sum(ln * a_o / a_a) + np.sum(lb)) / (np.sum(ln / a_a) + np.sum(lb / a_b))
    r = (a_o - qdot) / a_a
    return scalar_or_array(r) if np.ndim(d_hole) else float(r[0])


def inertial_pressure(density, acceleration, d_hole, d_pipe, length, *, d_bore=None,
                      bore_length=None, string_end="closed"):  # fmt: skip
    """Inertial pressure change of the mud column per annular interval, ρ·r_i·a_p·L_i [Pa].

    .. math:: \\Delta p_i = \\rho\\, r_i\\, a_p\\, L_i

    (magnitude; + surge when the pipe running in accelerates, − when it stops).  Sum the
    intervals above a depth for the pressure change there.

    Parameters
    ----------
    density : float
        Mud density [kg/m³].
    acceleration : array_like
        Pipe acceleration a_p [m/s²], ≥ 0 (:func:`trip_acceleration`); leading result axes.
    d_hole, d_pipe, length, d_bore, bore_length, string_end
        As :func:`inertia_ratio`.

    References
    ----------
    Burkhardt (1961), inertial term (from memory; the ratios derived from continuity,
    calc/METHODS.md §11.9).

    >>> round(float(inertial_pressure(1000.0, 0.5, 0.2, 0.1, 1000.0)), 3)  # 1000·(1/3)·0.5·1000
    166666.667
    """
    rho = float(check_positive("mud density", density, "kg/m³"))
    a = np.asarray(check_nonnegative("pipe acceleration", acceleration, "m/s²"), dtype=float)
    r = np.asarray(inertia_ratio(d_hole, d_pipe, length, d_bore=d_bore,
                                 bore_length=bore_length, string_end=string_end))  # fmt: skip
    ln = np.broadcast_to(np.asarray(length, dtype=float), r.shape)
    return scalar_or_array(rho * a[..., None] * (r * ln) if r.ndim else rho * a * r * ln)


def peak_trip_pressure(steady, inertia, gel):
    """Peak pressure change of a stand from its parts, max(gel, steady + inertia) [Pa].

    .. math:: \\Delta p_{peak} = \\max\\left(\\Delta p_{gel},\\
              \\Delta p_{steady}(V_{peak}) + \\Delta p_{inertia}\\right)

    The gel holds the mud until the pressure reaches the gel-break pressure, before it flows;
    once it flows, friction (the steady surge at the speed reached) and inertia (while the pipe
    speeds up) act together and are both largest at the end of a constant acceleration, when
    the peak speed is reached.  The gel and the flowing terms act at different moments, so the
    larger of the two governs, not their sum (a stated model: calc/METHODS.md §11.9).

    Parameters
    ----------
    steady, inertia, gel : array_like
        Magnitudes [Pa], ≥ 0.

    >>> peak_trip_pressure(3.0e5, 1.0e5, 2.0e5), peak_trip_pressure(1.0e5, 0.5e5, 2.0e5)
    (400000.0, 200000.0)
    """
    s = check_nonnegative("steady surge", steady, "Pa")
    i = check_nonnegative("inertial pressure", inertia, "Pa")
    g = check_nonnegative("gel-break pressure", gel, "Pa")
    return scalar_or_array(np.maximum(g, s + i))
