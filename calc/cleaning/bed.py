"""Stationary cuttings beds in high-angle intervals, and the circulation to clean before a trip.

Model (calc/METHODS.md §10.15): the *equilibrium bed* below the critical transport velocity of
Larsen, Pilehvari & Azar (1997).  Where the mean annular velocity is below the critical velocity
V_crit (:func:`calc.cleaning.larsen_critical_velocity`), cuttings settle and the bed grows
until the mean velocity in the open area above it has risen to V_crit:

.. math:: A_{open} = Q / V_{crit},\\qquad A_{bed} = \\max(A_{ann} - Q/V_{crit},\\ 0)

Geometry: the pipe lies on the low side of the hole (touching the wall), the bed fills the hole
up to a horizontal plane at height h above the low side; bed area, open area and wetted
perimeter are circular-segment formulas (exact geometry).  The flow over the bed is treated as
an equivalent concentric annulus with the open area and the hydraulic diameter of the open area
(4A/P, bed surface counted as wall), so the existing annulus friction law of
:func:`calc.flow.annulus_flow` gives its pressure gradient (no second friction formula).

A bed is considered only at and above ``onset`` (35°, the high-angle limit of
:class:`calc.cleaning.CleaningCriteria`, where the project switches to the Larsen criterion):
below about 30-35° cuttings slide back down the low side rather than rest in a bed (common
practice).  Larsen et al. state their correlation for 55-90°; between 35° and 55° it is
extrapolated (a note says so).
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.cleaning.indicators import LARSEN_RANGE, CleaningCriteria, larsen_critical_velocity
from calc.cleaning.transport import Cuttings
from calc.errors import InputError, check_less, check_nonnegative, check_positive, check_range
from calc.flow import annulus_flow
from calc.flow.area import cross_section_area
from calc.hydraulics_method import resolve_method
from calc.notes import Note
from calc.numeric import bisect_increasing, scalar_or_array
from calc.registry import MethodRegistry, Verification
from calc.span import Span
from calc.units import G_N as _G
from calc.values import Value

__all__ = [
    "BED_METHODS",
    "BED_ONSET",
    "CIRCULATION_FACTORS",
    "BedGeometry",
    "CleanupCirculation",
    "CuttingsBedResult",
    "WellBeds",
    "bed_geometry",
    "bed_height",
    "circulation_factor",
    "cleanup_circulation",
    "cuttings_bed",
    "no_bed_rate",
    "well_cuttings_beds",
]

#: Inclination from which a stationary bed is considered [degree]: the high-angle limit of
#: :class:`calc.cleaning.CleaningCriteria` (common practice; calc/METHODS.md §10.13).
BED_ONSET = CleaningCriteria().vertical_limit

#: Registered bed models (one so far).
BED_METHODS = MethodRegistry("cuttings-bed model")

#: Bottoms-up multipliers before a trip by inclination band and hole size (common practice,
#: values from memory, not checked against a source; calc/METHODS.md §10.16):
#: ((band upper limit [degree], ...), (hole size [m], ...), rows = band, columns = hole size).
CIRCULATION_FACTORS = (
    (10.0, 30.0, 60.0, 180.0),
    (0.2159, 0.31115, 0.4445),  # 8-1/2, 12-1/4, 17-1/2 in (× 0.0254 m/in, exact)
    ((1.3, 1.3, 1.5), (1.4, 1.4, 1.7), (1.6, 1.8, 2.5), (1.7, 2.0, 3.0)),
)


@dataclass(frozen=True)
class BedGeometry:
    """Cross-section of an annulus with a bed of height h (pipe on the low side), SI.

    bed_area, open_area [m²]; wetted_perimeter of the open area [m] (hole arc and pipe above
    the bed plus the bed surface); hydraulic_diameter 4·A_open/P [m].
    """

    bed_area: float | np.ndarray
    open_area: float | np.ndarray
    wetted_perimeter: float | np.ndarray
    hydraulic_diameter: float | np.ndarray


def _segment(d, h):
    """Area, arc length and chord of the part of a circle (diameter d) below height h."""
    r = 0.5 * d
    h = np.clip(h, 0.0, d)
    c = np.clip((r - h) / r, -1.0, 1.0)
    theta = np.arccos(c)  # half the angle at the centre
    area = r * r * theta - (r - h) * np.sqrt(np.maximum(2.0 * r * h - h * h, 0.0))
    return area, d * theta, 2.0 * np.sqrt(np.maximum(h * (d - h), 0.0))


def bed_geometry(height, d_hole, d_pipe) -> BedGeometry:
    """Bed area, open area and hydraulic diameter above a bed of ``height`` [m].

    .. math::
        A_{bed} = S(D_2, h) - S(D_1, \\min(h, D_1)),\\quad
        S(D, h) = R^2\\theta - (R - h)\\sqrt{2Rh - h^2},\\ \\cos\\theta = (R - h)/R

        P = (\\pi D_2 - D_2\\theta_2) + (\\pi D_1 - D_1\\theta_1) + (c_2 - c_1),\\quad
        c = 2\\sqrt{h(D - h)},\\quad D_h = 4A_{open}/P

    The pipe (D1) lies on the low side of the hole (D2); h from the low side, 0 ≤ h ≤ D2.

    Examples
    --------
    >>> g = bed_geometry(0.1, 0.2, 0.0)  # half an open pipe: D_h = 4(πR²/2)/(πR + D)
    >>> round(g.hydraulic_diameter, 6), round(4 * (np.pi * 0.01 / 2) / (np.pi * 0.1 + 0.2), 6)
    (0.122203, 0.122203)
    """
    d2 = check_positive("hole diameter", d_hole, "m")
    d1 = check_nonnegative("pipe diameter", d_pipe, "m")
    check_less("pipe diameter", d1, d2, "hole diameter", "diameter")
    h = check_range("bed height", height, 0.0, float(np.max(d2)), "m")
    a2, arc2, c2 = _segment(d2, h)
    hp = np.minimum(h, d1)
    a1, arc1, c1 = _segment(np.where(d1 > 0, d1, 1.0), np.where(d1 > 0, hp, 0.0))
    a1 = np.where(d1 > 0, a1, 0.0)
    arc1 = np.where(d1 > 0, arc1, 0.0)
    c1 = np.where(d1 > 0, c1, 0.0)
    bed = a2 - a1
    open_ = cross_section_area(d2, d1) - bed
    per = (np.pi * d2 - arc2) + (np.pi * d1 - arc1) + (c2 - c1)
    dh = np.where(per > 0, 4.0 * open_ / np.where(per > 0, per, 1.0), 0.0)
    return BedGeometry(
        bed_area=scalar_or_array(bed),
        open_area=scalar_or_array(open_),
        wetted_perimeter=scalar_or_array(per),
        hydraulic_diameter=scalar_or_array(dh),
    )


def bed_height(bed_area, d_hole, d_pipe):
    """Bed height [m] holding ``bed_area`` [m²] (inverse of :func:`bed_geometry`, bisection).

    Examples
    --------
    >>> round(bed_height(np.pi * 0.01 / 2, 0.2, 0.0), 9)  # half the circle: h = R
    0.1
    """
    d2 = check_positive("hole diameter", d_hole, "m")
    d1 = check_nonnegative("pipe diameter", d_pipe, "m")
    a = check_nonnegative("bed area", bed_area, "m²")
    if np.any(a > cross_section_area(d2, d1) * (1 + 1e-12)):
        raise InputError("bed area", float(np.max(a)), "≤ the annulus area")

    def excess(h):
        return np.asarray(bed_geometry(h, d2, d1).bed_area) - a

    lo = np.zeros(np.broadcast(a, d2, d1).shape)
    h = bisect_increasing(excess, lo, lo + d2, iterations=60)
    return scalar_or_array(np.where(a > 0, h, 0.0))


@dataclass(frozen=True, eq=False)
class CuttingsBedResult:
    """Equilibrium cuttings bed per annular interval at rate(s) q (SI; arrays broadcast).

    forms                   True where a stationary bed forms (inclination ≥ onset, V < V_crit)
    critical_velocity       Larsen critical velocity V_crit [m/s]
    no_bed_rate             smallest rate with no stationary bed, V_crit·A_ann [m³/s] (inf
                            below the onset: no bed considered)
    bed_area, bed_fraction  A_bed [m²] and A_bed/A_ann [-]
    bed_height              h [m] from the low side
    open_area               A_ann − A_bed [m²]
    velocity_clean          Q/A_ann [m/s]; velocity_over_bed Q/A_open [m/s]
    hydraulic_diameter      of the open area [m] (D2 − D1 without a bed)
    gradient_clean, gradient_bed   frictional pressure gradient without and with the bed
                            (concentric annulus law; the bed one on the equivalent annulus)
                            [Pa/m]
    method, notes
    """

    q: float | np.ndarray
    inclination: float | np.ndarray
    forms: np.ndarray
    critical_velocity: float | np.ndarray
    no_bed_rate: float | np.ndarray
    bed_area: float | np.ndarray
    bed_fraction: float | np.ndarray
    bed_height: float | np.ndarray
    open_area: float | np.ndarray
    velocity_clean: float | np.ndarray
    velocity_over_bed: float | np.ndarray
    hydraulic_diameter: float | np.ndarray
    gradient_clean: float | np.ndarray
    gradient_bed: float | np.ndarray
    method: str
    notes: tuple[Note, ...] = field(default=())


_SOURCE = (
    "Larsen, Pilehvari & Azar (1997) SPE Drill. & Compl. 12(2):129-135 (critical transport "
    "velocity; equilibrium bed below it)"
)


@BED_METHODS.register(
    "larsen_1997_equilibrium_bed",
    "Equilibrium bed: the bed grows until Q/A_open = V_crit (Larsen); circular-segment geometry "
    "with the pipe on the low side; friction over the bed by the annulus law on an equivalent "
    "annulus with the open area and its hydraulic diameter",
    _SOURCE,
    status=Verification(
        "from_memory",
        "Geometry checked against exact circle-segment values (half circle, buried pipe) and "
        "the continuity Q = V_over·A_open = V_crit·A_open in tests/test_cleaning_bed.py; the "
        "bed closure and the Larsen constants are recalled, not checked against the paper.",
        (
            "The equilibrium-bed closure (velocity over the bed = V_crit) is recalled from "
            "Larsen et al., not checked against the paper (calc/METHODS.md §10.15).",
            "Larsen et al. state 55-90°; used from 35° with a note.",
            "V_crit held at its value for the clean annulus while the bed grows.",
            "No pipe rotation, no bed porosity or sliding layer; steady state.",
        ),
    ),
)
def cuttings_bed(
    q,
    d_hole,
    d_pipe,
    *,
    inclination,
    rop,
    density,
    k,
    tau_y=0.0,
    n=1.0,
    cuttings_size,
    method: str | None = None,
    onset: float = BED_ONSET,
) -> CuttingsBedResult:
    """Equilibrium stationary-bed height and area, velocity over the bed and its friction.

    .. math::
        A_{bed} = \\max\\!\\left(A_{ann} - \\frac{Q}{V_{crit}},\\ 0\\right)\\ \\text{for}\\
        \\theta \\ge \\theta_{onset},\\qquad V_{over} = \\frac{Q}{A_{ann} - A_{bed}}

    V_crit from :func:`calc.cleaning.larsen_critical_velocity` for the clean annulus; h from
    :func:`bed_height`; gradients from :func:`calc.flow.annulus_flow` (friction law of the
    hydraulics ``method``): clean on (D2, D1), with the bed on the equivalent concentric
    annulus with area A_open and hydraulic diameter D_h:
    D2e, D1e = (s ± D_h)/2, s = 4A_open/(πD_h).

    Parameters
    ----------
    q : array_like
        Flow rate [m³/s], > 0.
    d_hole, d_pipe : array_like
        Hole (or casing ID) and pipe OD [m].
    inclination : array_like
        [degree], 0-180.
    rop : float
        Rate of penetration [m/s], ≥ 0.
    density, k, tau_y, n : array_like
        Mud density [kg/m³] and Herschel-Bulkley τ_y [Pa], K [Pa·sⁿ], n [-].
    cuttings_size : float
        d50 [m].
    method : str, optional
        Hydraulics method whose friction law is used (None: the default).
    onset : float
        Inclination from which a bed is considered [degree] (default 35°).

    Returns
    -------
    CuttingsBedResult

    Notes
    -----
    Valid (as far as Larsen et al. tested) for 55-90°, water-based muds, no pipe rotation; a
    note flags intervals between ``onset`` and 55°.  The bed is the steady state for the
    current rate; it does not say how long the bed takes to build or to erode.

    References
    ----------
    Larsen, T.I., Pilehvari, A.A. & Azar, J.J. (1997) Development of a new cuttings-transport
    model for high-angle wellbores including horizontal wells. SPE Drilling & Completion
    12(2), 129-135.

    Examples
    --------
    >>> r = cuttings_bed(0.02, 0.2159, 0.127, inclination=70.0, rop=0.0049, density=1318.0,
    ...                  k=0.02, tau_y=7.0, n=1.0, cuttings_size=0.00635)
    >>> bool(r.forms), 0.0 < r.bed_fraction < 1.0
    (True, True)
    >>> abs(r.velocity_over_bed - r.critical_velocity) < 1e-9  # equilibrium
    True
    """
    qv = check_positive("flow rate", q, "m³/s")
    d2 = check_positive("hole diameter", d_hole, "m")
    d1 = check_nonnegative("pipe diameter", d_pipe, "m")
    check_less("pipe diameter", d1, d2, "hole diameter", "diameter")
    inc = check_range("inclination", inclination, 0.0, 180.0, "degree")
    onset = float(check_range("bed onset inclination", onset, 0.0, 90.0, "degree"))
    lar = larsen_critical_velocity(
        rop, d2, d1, density=density, k=k, tau_y=tau_y, n=n, cuttings_size=cuttings_size,
        inclination=np.clip(inc, 0.0, 90.0),
    )  # fmt: skip
    a_ann = cross_section_area(d2, d1)
    v_crit = np.asarray(lar.critical_velocity, dtype=float)
    high = np.asarray(inc >= onset)
    v_clean = qv / a_ann
    forms = high & (v_clean < v_crit)
    a_open = np.where(forms, qv / v_crit, a_ann)
    a_bed = np.where(forms, a_ann - a_open, 0.0)
    shape = np.broadcast(qv, d2, d1, inc).shape
    d2b, d1b = np.broadcast_to(d2, shape), np.broadcast_to(d1, shape)
    h = np.asarray(bed_height(np.broadcast_to(a_bed, shape), d2b, d1b), dtype=float)
    g = bed_geometry(h, d2b, d1b)
    dh = np.asarray(g.hydraulic_diameter, dtype=float)
    open_ = np.asarray(g.open_area, dtype=float)
    s = 4.0 * open_ / (np.pi * dh)
    d2e, d1e = 0.5 * (s + dh), 0.5 * (s - dh)
    law = resolve_method(method).friction
    clean = annulus_flow(qv, d2, d1, density=density, tau_y=tau_y, k=k, n=n, method=law)
    bedf = annulus_flow(
        np.broadcast_to(qv, shape), np.where(forms, d2e, d2b), np.where(forms, d1e, d1b),
        density=density, tau_y=tau_y, k=k, n=n, method=law,
    )  # fmt: skip
    notes = []
    lo = LARSEN_RANGE[0]
    if np.any(forms & (inc < lo)):
        notes.append(
            Note(
                "warning",
                "bed_angle_extrapolated",
                "cuttings bed from the Larsen-Pilehvari-Azar critical velocity between "
                "{onset:g}° and {larsen_low:g}°, below the correlation's stated range.",
                "cuttings beds",
                values=(Value("onset", onset), Value("larsen_low", float(lo))),
            )
        )
    if np.any(np.asarray(a_bed) > 0.5 * a_ann):
        notes.append(
            Note(
                "caution",
                "thick_cuttings_bed",
                "a stationary cuttings bed fills more than half of the annulus in some "
                "interval: risk of pack-off and stuck pipe.",
                "cuttings beds",
            )
        )
    return CuttingsBedResult(
        q=scalar_or_array(qv),
        inclination=scalar_or_array(inc),
        forms=forms,
        critical_velocity=scalar_or_array(v_crit),
        no_bed_rate=scalar_or_array(np.where(high, v_crit * a_ann, np.inf)),
        bed_area=scalar_or_array(a_bed),
        bed_fraction=scalar_or_array(a_bed / a_ann),
        bed_height=scalar_or_array(h),
        open_area=scalar_or_array(open_),
        velocity_clean=scalar_or_array(np.broadcast_to(v_clean, shape)),
        velocity_over_bed=scalar_or_array(qv / open_),
        hydraulic_diameter=scalar_or_array(dh),
        gradient_clean=scalar_or_array(np.broadcast_to(clean.gradient, shape)),
        gradient_bed=scalar_or_array(bedf.gradient),
        method=f"larsen_1997_equilibrium_bed: {_SOURCE}; friction {law}",
        notes=tuple(notes),  # Larsen's own range note: only where a bed forms (above)
    )


def no_bed_rate(d_hole, d_pipe, *, rate_bracket=(1e-4, 0.2), **kwargs):
    """Smallest flow rate at which no stationary bed forms [m³/s] (``inf`` where none in the
    bracket or below the onset), by bisection on the bed area (:func:`calc.numeric.
    bisect_increasing` on log q); keyword arguments as for :func:`cuttings_bed`.

    The bed area falls to zero as q rises, so −A_bed(q) is increasing and its first zero is the
    rate sought; with V_crit held at its clean-annulus value it equals V_crit·A_ann (a check).

    Examples
    --------
    >>> kw = dict(inclination=70.0, rop=0.0049, density=1318.0, k=0.02, tau_y=7.0, n=1.0,
    ...           cuttings_size=0.00635)
    >>> q0 = no_bed_rate(0.2159, 0.127, **kw)
    >>> r = cuttings_bed(q0, 0.2159, 0.127, **kw)
    >>> bool(abs(q0 / r.no_bed_rate - 1) < 1e-6)
    True
    """
    d2 = check_positive("hole diameter", d_hole, "m")
    d1 = check_nonnegative("pipe diameter", d_pipe, "m")
    lo_q, hi_q = (float(x) for x in rate_bracket)
    if not 0 < lo_q < hi_q:
        raise InputError("rate bracket", (lo_q, hi_q), "0 < low < high [m³/s]")

    def minus_bed(qq):
        r = cuttings_bed(qq, d2, d1, **kwargs)
        # a step function: +1 where no bed (the bed area is exactly 0 at and above the rate)
        return np.where(np.asarray(r.bed_area) > 0, -1.0, 1.0)

    shape = np.broadcast(d2, d1, np.asarray(kwargs.get("inclination", 0.0))).shape
    lo = np.full(shape, lo_q)
    hi = np.full(shape, hi_q)
    q0 = bisect_increasing(minus_bed, lo, hi, iterations=60, log=True)
    still = np.asarray(cuttings_bed(hi, d2, d1, **kwargs).bed_area) > 0
    high = np.asarray(kwargs.get("inclination", 0.0)) >= kwargs.get("onset", BED_ONSET)
    return scalar_or_array(np.where(still | ~np.broadcast_to(high, shape), np.inf, q0))


def circulation_factor(inclination, d_hole):
    """Bottoms-up multiplier before a trip for an interval (common practice, from memory):
    the band of :data:`CIRCULATION_FACTORS` holding the inclination and the nearest hole-size
    column.

    Examples
    --------
    >>> circulation_factor([5.0, 45.0, 80.0], 0.2159).tolist()
    [1.3, 1.6, 1.7]
    """
    inc = check_range("inclination", inclination, 0.0, 180.0, "degree")
    d = check_positive("hole diameter", d_hole, "m")
    bands, sizes, table = CIRCULATION_FACTORS
    b = np.searchsorted(np.asarray(bands), inc, side="left")
    s = np.argmin(np.abs(np.asarray(d)[..., None] - np.asarray(sizes)), axis=-1)
    return scalar_or_array(np.asarray(table)[np.minimum(b, len(bands) - 1), s])


@dataclass(frozen=True, eq=False)
class CleanupCirculation:
    """Circulation before a trip (SI): annular volume [m³], bottoms-up time at q [s], the
    factor per interval [-], the weighted bottoms-up count Σ V_i·m_i/Σ V_i [-] and the
    circulating time Σ V_i·m_i/q [s]; ``worst_factor`` the largest interval factor."""

    q: float
    annular_volume: float
    bottoms_up_time: float
    factors: np.ndarray
    bottoms_up_count: float
    circulating_time: float
    worst_factor: float


def cleanup_circulation(q, d_hole, d_pipe, length, inclination) -> CleanupCirculation:
    """Bottoms-up count and circulating time to clean the hole before a trip.

    .. math:: N_{BU} = \\frac{\\sum_i V_i m_i}{\\sum_i V_i},\\qquad t = \\frac{\\sum_i V_i m_i}{Q}

    V_i = A_ann,i·L_i the annular volume of interval i, m_i its multiplier
    (:func:`circulation_factor`, by inclination band and hole size; common practice, values
    from memory, not checked against a source).

    Parameters
    ----------
    q : float
        Flow rate [m³/s], > 0.
    d_hole, d_pipe, length, inclination : array_like
        Per annular interval: hole (casing) ID and pipe OD [m], length [m], inclination
        [degree].

    Examples
    --------
    >>> c = cleanup_circulation(0.03, [0.2159, 0.2159], [0.127, 0.127], [1000.0, 1000.0],
    ...                         [0.0, 80.0])
    >>> round(c.bottoms_up_count, 3), round(c.circulating_time / c.bottoms_up_time, 3)
    (1.5, 1.5)
    """
    qv = float(check_positive("flow rate", q, "m³/s"))
    d2 = np.atleast_1d(check_positive("hole diameter", d_hole, "m"))
    d1 = np.atleast_1d(check_nonnegative("pipe diameter", d_pipe, "m"))
    ln = np.atleast_1d(check_nonnegative("interval length", length, "m"))
    vol = cross_section_area(d2, d1) * ln
    m = np.atleast_1d(circulation_factor(inclination, d2))
    total = float(vol.sum())
    if total <= 0:
        raise InputError("annular volume", total, "> 0 m³")
    weighted = float((vol * m).sum())
    return CleanupCirculation(
        q=qv,
        annular_volume=total,
        bottoms_up_time=total / qv,
        factors=m,
        bottoms_up_count=weighted / total,
        circulating_time=weighted / qv,
        worst_factor=float(m.max()),
    )


@dataclass(frozen=True, eq=False)
class WellBeds:
    """Cuttings beds along a well at one rate (SI).

    spans, top_md, bottom_md, length [m]: the annular intervals; ``bed``: the per-interval
    :class:`CuttingsBedResult`; extra_loss [Pa]: Σ max(gradient_bed − gradient_clean, 0)·L over
    the bed intervals (no credit for a predicted drop, see :func:`well_cuttings_beds`);
    ecd_increment [kg/m³]: that loss as EMW at the bit, extra_loss/(g·TVD_bit); worst: index of
    the interval with the largest bed fraction (None without a bed); no_bed_rate [m³/s]: the largest
    no-bed rate over the intervals at or above the onset (inf: none there); max_inclination
    [degree]; cleanup: :class:`CleanupCirculation`.
    """

    spans: tuple[Span, ...]
    top_md: np.ndarray
    bottom_md: np.ndarray
    length: np.ndarray
    bed: CuttingsBedResult
    extra_loss: float
    ecd_increment: float
    worst: int | None
    no_bed_rate: float
    max_inclination: float
    onset: float
    cleanup: CleanupCirculation
    notes: tuple[Note, ...] = field(default=())


def well_cuttings_beds(
    well, fluid, q, *, rop, cuttings: Cuttings, method: str | None = None, onset=BED_ONSET
):
    """:func:`cuttings_bed` in every annular interval of a well at one rate, the extra
    friction as ECD at the bit, and :func:`cleanup_circulation`.

    .. math:: \\Delta ECD_{bit} = \\frac{\\sum_i \\max(G_{bed,i} - G_{clean,i},\\ 0)\\, L_i}
              {g\\,TVD_{bit}}

    The hydraulic-diameter treatment of the open area can give *less* friction than the clean
    concentric annulus where a thin bed fills the narrow gap under the pipe of a tight annulus
    (tool joints, collars): laminar flow in a non-circular section is poorly described by D_h.
    Such intervals are not credited (their extra loss counts as zero; note
    ``bed_friction_not_credited``), so the ECD increment is never negative.

    Checked on the demo well and an invented high-angle well in tests/test_cleaning_bed.py (a
    well is too large for a doctest; :func:`cuttings_bed` carries the example).
    """
    qv = check_positive("flow rate", q, "m³/s")
    if np.ndim(qv):
        raise InputError("q", "a sweep", "one rate for cuttings beds")
    rho = float(check_positive("mud density", fluid.density, "kg/m³"))
    ty, k, n = fluid.annulus_parameters
    a = well.flow_intervals().annulus
    d2 = np.asarray(a.outer_diameter, dtype=float)
    d1 = np.asarray(a.inner_diameter, dtype=float)
    inc = np.clip(np.asarray(a.inclination, dtype=float), 0.0, 180.0)
    r = cuttings_bed(
        float(qv), d2, d1, inclination=inc, rop=rop, density=rho, k=k, tau_y=ty, n=n,
        cuttings_size=cuttings.size, method=method, onset=onset,
    )  # fmt: skip
    length = np.asarray(a.length, dtype=float)
    diff = (np.asarray(r.gradient_bed) - np.asarray(r.gradient_clean)) * r.forms
    extra = float(np.sum(np.maximum(diff, 0.0) * length))
    notes = list(r.notes)
    if np.any(diff < 0):
        notes.append(
            Note(
                "info",
                "bed_friction_not_credited",
                "in {count} bed interval(s) the open-area hydraulic diameter gives less friction "
                "than the clean annulus (the bed fills the narrow gap under the pipe); no credit "
                "is taken: their extra loss counts as zero.",
                "cuttings beds",
                values=(Value("count", float(np.sum(diff < 0))),),
            )
        )
    notes.append(
        Note(
            "info",
            "bottoms_up_common_practice",
            "the bottoms-up multipliers before a trip (by inclination band and hole size) are "
            "common practice, values recalled, not checked against a published source: a "
            "planning figure; circulate until the shakers clean up.",
            "circulation before a trip",
        )
    )
    tvd_bit = float(well.tvd_at(float(well.bit_depth)))
    frac = np.asarray(r.bed_fraction)
    high = inc >= onset
    return WellBeds(
        spans=a.spans(),
        top_md=np.asarray(a.top_md),
        bottom_md=np.asarray(a.bottom_md),
        length=length,
        bed=r,
        extra_loss=extra,
        ecd_increment=extra / (_G * tvd_bit) if tvd_bit > 0 else 0.0,
        worst=int(np.argmax(frac)) if np.any(r.forms) else None,
        no_bed_rate=float(np.max(np.asarray(r.no_bed_rate)[high])) if high.any() else np.inf,
        max_inclination=float(inc.max()),
        onset=float(onset),
        cleanup=cleanup_circulation(float(qv), d2, d1, length, inc),
        notes=tuple(notes),
    )
