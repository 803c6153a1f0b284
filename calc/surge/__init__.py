"""Surge and swab: pressure change from moving pipe, trip-speed limits, breaking circulation.

Steady-state method after Burkhardt (1961): the annulus is treated as a stationary-wall flow at
the *effective* velocity

.. math:: V_e = \\frac{Q_a}{A_a} + K_c V_p,\\qquad
          Q_a = V_p\\frac{\\pi}{4}D_1^2 - q_{rel}

(V_p pipe speed, D1 the local pipe OD, K_c the clinging constant, q_rel the flow entering an
open pipe relative to it; closed end q_rel = 0).  Any :mod:`calc.flow` method gives the
friction gradient at V_e in each annular interval; running in raises the pressure (surge),
pulling out lowers it by the same amount (swab) in this steady model.  Open end: q_rel is found
by a bracketed root search so that the annulus and the bore (friction at the velocity relative
to the pipe wall, plus the bit nozzles) give the same pressure change at the bit.

Clinging constants (fits to Burkhardt's chart; Guo & Liu 2011, eqs. 2.81-2.82):
laminar K_c = 0.275(D1/D2) + 0.25, turbulent K_c = 0.1(D1/D2) + 0.41, blended across the
friction method's transitional zone (:func:`clinging_constant_blended`, calc/METHODS.md §11.2).
For Newtonian laminar flow in a concentric annulus the exact value is
:func:`clinging_constant_exact_newtonian`.

A stand's peak pressure change adds the inertia of the mud column while the pipe speeds up and
the gel broken when it starts: max(gel, steady + inertia) (calc/METHODS.md §11.9); the trip
schedule gives the limits per depth band of the bit (§11.10).

Modules: :mod:`~calc.surge.clinging` (K_c), :mod:`~calc.surge.solver` (the solver shared by
every entry point, closed and open strings), :mod:`~calc.surge.pressure` (whole-well and flat
surge/swab), :mod:`~calc.surge.inertia` (inertial surge/swab, the peak of a stand),
:mod:`~calc.surge.limits` (trip-speed limits), :mod:`~calc.surge.schedule` (limits per depth
band of the bit), :mod:`~calc.surge.emw` (trip allowance and EMW), :mod:`~calc.surge.gel`
(breaking circulation, the gel at pipe start).  Every public name is importable from
:mod:`calc.surge`.

References
----------
Burkhardt, J.A. (1961) Wellbore pressure surges produced by pipe movement. JPT 13(6), 595-605,
SPE-1546-G.  Guo, B. & Liu, G. (2011) Applied Drilling Circulation Systems, ch. 2.
Bourgoyne, A.T. et al. (1986) Applied Drilling Engineering, SPE Textbook Series 2, ch. 4.
"""

from calc.surge.clinging import (
    clinging_constant,
    clinging_constant_blended,
    clinging_constant_exact_newtonian,
)
from calc.surge.emw import trip_allowance, trip_emw
from calc.surge.gel import (
    GEL_CHOICES,
    BreakCirculationResult,
    break_circulation_pressure,
    gel_break_pressure,
    pipe_start_gel_pressure,
)
from calc.surge.inertia import (
    DEFAULT_ACCELERATION_TIME,
    inertia_ratio,
    inertial_pressure,
    peak_trip_pressure,
    trip_acceleration,
)
from calc.surge.limits import (
    IntervalTripLimit,
    TripComponents,
    TripLimits,
    TripPoint,
    trip_speed_limit,
    trip_speed_limits,
)
from calc.surge.pressure import IntervalSurge, SurgeResult, interval_surge, surge_pressure
from calc.surge.schedule import TripBand, TripSchedule, trip_schedule, well_at_bit_depth
from calc.surge.solver import PEAK_FACTOR

__all__ = [
    "DEFAULT_ACCELERATION_TIME",
    "GEL_CHOICES",
    "PEAK_FACTOR",
    "BreakCirculationResult",
    "IntervalSurge",
    "IntervalTripLimit",
    "SurgeResult",
    "TripBand",
    "TripComponents",
    "TripLimits",
    "TripPoint",
    "TripSchedule",
    "break_circulation_pressure",
    "clinging_constant",
    "clinging_constant_blended",
    "clinging_constant_exact_newtonian",
    "gel_break_pressure",
    "inertia_ratio",
    "inertial_pressure",
    "interval_surge",
    "peak_trip_pressure",
    "pipe_start_gel_pressure",
    "surge_pressure",
    "trip_acceleration",
    "trip_allowance",
    "trip_emw",
    "trip_schedule",
    "trip_speed_limit",
    "trip_speed_limits",
    "well_at_bit_depth",
]
