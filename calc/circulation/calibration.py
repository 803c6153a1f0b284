"""Calibration of the friction prediction against a measured standpipe pressure.

The prediction splits the standpipe pressure into a *fixed* part — surface back-pressure, the
bit's jet loss and the suppliers' fixed tool drops — and a *frictional* part — surface lines,
drill string and annulus.  The friction multiplier scales only the frictional part:

.. math:: p_{meas} = p_{fixed} + m\\, p_{fric}\\quad\\Rightarrow\\quad
          m = \\frac{p_{meas} - p_{fixed}}{p_{fric}}

Why those parts: the bit loss follows from the nozzle areas and a discharge coefficient
(Bernoulli), and the tool drops come from a supplier's test; the friction correlations, the
rheology fit, the assumed open-hole size and the guessed surface equipment are where the
prediction is most uncertain.  Because the annular friction is scaled too, the calibrated
result also carries a changed ECD.  The factor fits one rate, one mud and one well state;
it is a calibration, not a measurement, and the result says so.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.circulation.hydrostatics import equivalent_circulating_density
from calc.circulation.loop import CirculationResult, circulate
from calc.errors import InputError, check_positive, check_range
from calc.notes import Note
from calc.numeric import float_or_array
from calc.values import Value

__all__ = [
    "ANNULUS_CALIBRATION_LABEL",
    "CALIBRATED_PARTS",
    "CALIBRATION_LABEL",
    "MULTIPLIER_RANGE",
    "STRING_CALIBRATION_LABEL",
    "FrictionCalibration",
    "TwoPartCalibration",
    "calibrate_friction",
    "calibrate_two_part",
    "ecd_deviation",
    "spp_deviation",
    "spp_deviation_percent",
]

#: Label carried by every calibration result.
CALIBRATION_LABEL = (
    "CALIBRATION: friction multiplier fitted to a measured standpipe pressure; it scales surface, "
    "string and annular friction (not the bit or fixed tool drops) and holds for these "
    "conditions only"
)

#: Relative SPP gap above which a note is given (beyond ±10 %: common practice,
#: calc/METHODS.md §16.5; user-settable).
DEFAULT_TOLERANCE = 0.10


@dataclass(frozen=True, eq=False)
class FrictionCalibration:
    """Measured versus predicted standpipe pressure and the friction multiplier.

    Attributes
    ----------
    label : str
        :data:`CALIBRATION_LABEL`.
    q : float or ndarray
        Flow rate [m³/s].
    measured_spp, predicted_spp : float or ndarray
        Standpipe pressures [Pa]; ``predicted_spp`` with multiplier 1.
    deviation : float or ndarray
        predicted − measured [Pa] (:func:`spp_deviation`).
    deviation_percent : float or ndarray
        100·(predicted − measured)/measured [%] (:func:`spp_deviation_percent`).
    fixed_loss, frictional_loss : float or ndarray
        The two parts of the prediction [Pa] (module docstring).
    multiplier : float or ndarray
        m = (measured − fixed)/frictional [-].
    predicted, calibrated : CirculationResult
        The uncalibrated result and the result recomputed with ``multiplier``.
    notes : tuple of Note
    """

    label: str
    q: float | np.ndarray
    measured_spp: float | np.ndarray
    predicted_spp: float | np.ndarray
    deviation: float | np.ndarray
    deviation_percent: float | np.ndarray
    fixed_loss: float | np.ndarray
    frictional_loss: float | np.ndarray
    multiplier: float | np.ndarray
    predicted: CirculationResult
    calibrated: CirculationResult
    notes: tuple[Note, ...]


def spp_deviation(predicted, measured):
    """Deviation of the predicted standpipe pressure from the measured one [Pa].

    Sign convention: **predicted − measured** (positive: the model predicts more than the gauge
    reads).  The one definition used by the calibration, the report and the JSON output.

    Examples
    --------
    >>> spp_deviation(2.0e7, 1.9e7)
    1000000.0
    """
    return float_or_array(np.asarray(predicted, dtype=float) - np.asarray(measured, dtype=float))


def spp_deviation_percent(predicted, measured):
    """Relative deviation of the predicted standpipe pressure [%]: 100·(predicted − measured) /
    measured (positive: the model predicts more; relative to the measurement).

    The one definition used by the calibration (its tolerance check), the report and the JSON.

    Examples
    --------
    >>> round(spp_deviation_percent(2.0e7, 1.9e7), 4)
    5.2632
    """
    m = np.asarray(measured, dtype=float)
    return float_or_array(100.0 * (np.asarray(predicted, dtype=float) - m) / m)


def ecd_deviation(predicted, measured):
    """Predicted − measured ECD (e.g. at a downhole gauge) [kg/m³] (positive: the model
    predicts a heavier ECD than the gauge reads).

    Examples
    --------
    Predicted 11.82 ppg against a gauge reading 11.75 ppg: 0.07 ppg heavier:

    >>> from calc.units import from_si, to_si
    >>> round(from_si(ecd_deviation(to_si(11.82, "ppg"), to_si(11.75, "ppg")), "ppg"), 6)
    0.07
    """
    return float_or_array(np.asarray(predicted, dtype=float) - np.asarray(measured, dtype=float))


def calibrate_friction(
    well, fluid, q, measured_spp, *, tolerance: float = DEFAULT_TOLERANCE, **circulate_options
) -> FrictionCalibration:
    """Deviation of the predicted standpipe pressure and the friction multiplier reproducing it.

    .. math:: m = \\frac{p_{meas} - (p_s + \\Delta p_{bit} + \\Delta p_{tools})}
                       {\\Delta p_{lines} + \\Delta p_{string} + \\Delta p_{ann}}

    Parameters
    ----------
    well, fluid :
        As for :func:`~calc.circulation.circulate`.
    q : float or array_like
        Flow rate(s) of the measurement [m³/s].
    measured_spp : float or array_like
        Measured standpipe pressure(s) [Pa], > 0, broadcast with ``q``.
    tolerance : float
        Relative gap above which a note is added (default 0.10, common practice —
        calc/METHODS.md §16.5).
    **circulate_options
        Any keyword of :func:`~calc.circulation.circulate` except ``friction_multiplier``.

    Returns
    -------
    FrictionCalibration

    Raises
    ------
    InputError
        ``measured_spp`` not above the fixed part of the prediction (no positive multiplier can
        reproduce it), or a ``friction_multiplier`` option given.

    Notes
    -----
    Exact for the model: the frictional losses are proportional to the multiplier, so the
    calibrated result reproduces ``measured_spp`` to rounding.  The deviation is also reported
    as a percentage of the prediction.

    Examples
    --------
    A vertical 3,000 m well (9-5/8 in casing to 1,500 m, 8-1/2 in open hole, 150 m of
    6-1/2 in collars under 5 in drill pipe, bit with 3x12 3x11 nozzles), 11.0 ppg mud:

    >>> from calc.bit import Bit
    >>> from calc.circulation import hydraulics_fluid_from_readings
    >>> from calc.geometry import DrillString, Hole, HoleSection, StringComponent, Survey, Well
    >>> from calc.rheology import ViscometerReadings
    >>> from calc.units import from_si, to_si
    >>> casing = HoleSection("9-5/8 in casing", 0.0, 1500.0, to_si(8.681, "in"))
    >>> pipe = [StringComponent("collars", to_si(6.5, "in"), to_si(2.8125, "in"), 150.0),
    ...         StringComponent("drill pipe", to_si(5.0, "in"), to_si(4.276, "in"), "fill")]
    >>> well = Well(Survey([0.0, 3000.0], [0.0, 0.0], [0.0, 0.0]),
    ...             Hole.from_casing([casing], 3000.0, bit_size=to_si(8.5, "in")),
    ...             DrillString(pipe), Bit(to_si(8.5, "in"), "3x12 3x11"), bit_depth=3000.0)
    >>> mud = ViscometerReadings.from_mapping({600: 56, 300: 37, 200: 29, 100: 20, 6: 8, 3: 7})
    >>> fluid = hydraulics_fluid_from_readings(mud, density=to_si(11.0, "ppg"))
    >>> q = to_si(500.0, "gpm")
    >>> cal = calibrate_friction(well, fluid, q, to_si(2000.0, "psi"))
    >>> round(from_si(cal.predicted_spp, "psi")), round(cal.multiplier, 3)
    (1917, 1.067)

    The multiplier is (measured − bit)/(string + annulus) and reproduces the gauge:

    >>> fixed, friction = cal.fixed_loss, cal.frictional_loss
    >>> bool(np.isclose(cal.multiplier, (to_si(2000.0, "psi") - fixed) / friction, rtol=1e-12))
    True
    >>> round(from_si(cal.calibrated.standpipe_pressure, "psi"), 6)
    2000.0
    """
    if "friction_multiplier" in circulate_options:
        raise InputError(
            "friction_multiplier",
            circulate_options["friction_multiplier"],
            "not given here: the calibration computes it",
        )
    tol = float(check_positive("tolerance", tolerance))
    meas = check_positive("measured standpipe pressure", measured_spp, "Pa")
    qv = check_positive("flow rate", q, "m³/s")
    shape = np.broadcast_shapes(qv.shape, meas.shape)
    qb = np.broadcast_to(qv, shape)
    mb = np.broadcast_to(meas, shape)
    base = circulate(well, fluid, qb if shape else float(qb), **circulate_options)
    spp = np.asarray(base.standpipe_pressure, dtype=float)
    fric = np.asarray(base.frictional_loss, dtype=float)
    fixed = spp - fric
    mb = np.broadcast_to(mb, np.broadcast_shapes(mb.shape, spp.shape))
    if np.any(mb <= fixed):
        i = np.flatnonzero((mb <= fixed).ravel())[0]
        raise InputError(
            "measured standpipe pressure",
            float(mb.ravel()[i]),
            "> the fixed part of the prediction (back-pressure + bit + tools = {fixed}), since "
            "only friction is calibrated",
            kind="pressure",
            values=(Value("fixed", float(fixed.ravel()[i]), "pressure"),),
        )
    mult = (mb - fixed) / fric
    dev = np.asarray(spp_deviation(spp, mb))
    pct = np.asarray(spp_deviation_percent(spp, mb))
    calibrated = circulate(
        well, fluid, qb if shape else float(qb), friction_multiplier=float_or_array(mult),
        **circulate_options,
    )  # fmt: skip
    notes = [Note("info", "calibration", CALIBRATION_LABEL, "friction multiplier")]
    big = np.abs(pct) > 100.0 * tol
    if np.any(big):
        notes.append(
            Note(
                "warning",
                "spp_gap",
                "measured and predicted standpipe pressure differ by up to {gap:.1f} % of the "
                "measurement (beyond ±{tolerance:.0f} %): check the rate, pump efficiency, "
                "nozzles, surface equipment and mud before trusting a calibration",
                "standpipe",
                values=(
                    Value("gap", float(np.max(np.abs(pct)))),
                    Value("tolerance", 100.0 * tol),
                ),
            )
        )
    return FrictionCalibration(
        label=CALIBRATION_LABEL,
        q=float_or_array(qb),
        measured_spp=float_or_array(mb),
        predicted_spp=float_or_array(spp),
        deviation=float_or_array(dev),
        deviation_percent=float_or_array(pct),
        fixed_loss=float_or_array(fixed),
        frictional_loss=float_or_array(fric),
        multiplier=float_or_array(mult),
        predicted=base,
        calibrated=calibrated,
        notes=tuple(notes),
    )


#: Labels of the two parts of :func:`calibrate_two_part`.
STRING_CALIBRATION_LABEL = (
    "CALIBRATION: string friction multiplier (surface lines and drill string) fitted so the "
    "predicted standpipe pressure equals the measured one with the annulus calibrated; holds "
    "for these conditions only"
)
ANNULUS_CALIBRATION_LABEL = (
    "CALIBRATION: annular friction multiplier fitted so the predicted ECD at the downhole gauge "
    "equals its reading; holds for these conditions only"
)
#: What a two-part calibration calibrated, by the measurements given.
CALIBRATED_PARTS = ("string and annulus", "whole loop", "annulus")
#: Multipliers outside this range get a warning note (common practice: a friction prediction
#: more than a factor 2 off, or half, points to a wrong input rather than to friction).
MULTIPLIER_RANGE = (0.5, 2.0)


@dataclass(frozen=True, eq=False)
class TwoPartCalibration:
    """Separate friction multipliers for the inside of the string and for the annulus (SI).

    Attributes
    ----------
    part : str
        What was calibrated (:data:`CALIBRATED_PARTS`): ``"string and annulus"`` (standpipe
        pressure and gauge), ``"whole loop"`` (standpipe pressure only: one multiplier on
        string and annulus, as :func:`calibrate_friction`), ``"annulus"`` (gauge only; the
        string keeps 1).
    q : float
        Flow rate [m³/s].
    string_multiplier, annulus_multiplier : float
        m_s on surface-line and string friction, m_a on annular friction [-].
    fixed_loss, string_friction, annulus_friction : float
        Back-pressure + tools + bit; surface + string friction; annular friction of the
        uncalibrated prediction [Pa].
    measured_spp, predicted_spp, calibrated_spp : float or None
        Standpipe pressures [Pa] (measured None without a measurement).
    gauge_md : float or None
        Gauge depth [m].
    gauge_ecd, predicted_gauge_ecd, calibrated_gauge_ecd : float or None
        ECD at the gauge: read, predicted (multipliers 1) and calibrated [kg/m³], each model
        value including ``gauge_increment``.
    gauge_increment : float
        ECD added at the gauge that friction does not scale (e.g. the cuttings load) [kg/m³].
    spp_absorbed_string, spp_absorbed_annulus : float or None
        How much of the SPP gap (predicted − measured) each multiplier removes:
        (1 − m_s)·string_friction and (1 − m_a)·annulus_friction [Pa]; they add up to the gap.
    gauge_absorbed_annulus : float or None
        The gauge gap (predicted − read) [kg/m³], all removed by the annulus multiplier.
    predicted, calibrated : CirculationResult
    labels : tuple of str
        The calibration labels of the parts calibrated.
    notes : tuple of Note
    """

    part: str
    q: float
    string_multiplier: float
    annulus_multiplier: float
    fixed_loss: float
    string_friction: float
    annulus_friction: float
    measured_spp: float | None
    predicted_spp: float
    calibrated_spp: float
    gauge_md: float | None
    gauge_ecd: float | None
    predicted_gauge_ecd: float | None
    calibrated_gauge_ecd: float | None
    gauge_increment: float
    spp_absorbed_string: float | None
    spp_absorbed_annulus: float | None
    gauge_absorbed_annulus: float | None
    predicted: CirculationResult
    calibrated: CirculationResult
    labels: tuple[str, ...]
    notes: tuple[Note, ...]


def _gauge_parts(res, md, increment):
    """(ECD at ``md`` with multiplier 1, its part without annular friction) [kg/m³]; the ECD
    is linear in the annular multiplier between them."""
    e1 = float(np.asarray(res.ecd_at(md))) + increment
    tvd = float(res.context.well.survey.tvd_at(md))
    e0 = float(
        equivalent_circulating_density(
            float(res.density), 0.0, tvd, back_pressure=res.back_pressure,
            hydrostatic=res.hydrostatic,
        )
    ) + increment  # fmt: skip
    return e1, e0


def calibrate_two_part(
    well,
    fluid,
    q,
    *,
    measured_spp=None,
    gauge_ecd=None,
    gauge_md=None,
    gauge_increment: float = 0.0,
    **circulate_options,
) -> TwoPartCalibration:
    """Friction multipliers for the string and the annulus from a measured standpipe pressure
    and a downhole gauge reading (either or both).

    The prediction is linear in the two multipliers:

    .. math::

        \\mathrm{ECD}_g = E_0 + m_a\\,(E_1 - E_0), \\qquad
        p_{SPP} = p_{fixed} + m_s\\,(\\Delta p_{lines} + \\Delta p_{string})
                  + m_a\\,\\Delta p_{ann}

    (E_1: the predicted ECD at the gauge, E_0: its part without annular friction, i.e. the
    static density plus back-pressure and ``gauge_increment``), so the gauge fixes m_a and the
    standpipe pressure then fixes m_s, exactly.  With the standpipe pressure only, one multiplier
    scales string and annulus together (:func:`calibrate_friction`, part ``"whole loop"``); with
    the gauge only, m_a is fitted and m_s stays 1 (part ``"annulus"``).

    Parameters
    ----------
    well, fluid :
        As for :func:`~calc.circulation.circulate`.
    q : float
        Flow rate of the measurements [m³/s], > 0 (one rate).
    measured_spp : float, optional
        Measured standpipe pressure [Pa], > 0.
    gauge_ecd, gauge_md : float, optional
        Downhole gauge ECD [kg/m³] and its MD [m] (0 < MD ≤ bit depth), both or neither.
    gauge_increment : float
        ECD increment at the gauge not due to friction (e.g. the cuttings load) [kg/m³], ≥ 0.
    **circulate_options
        Keywords of :func:`~calc.circulation.circulate` other than the multipliers.

    Returns
    -------
    TwoPartCalibration

    Raises
    ------
    InputError
        No measurement; a gauge reading at or below E_0 (no positive annular multiplier
        reproduces it); a standpipe pressure not above the fixed part plus the calibrated
        annulus; a multiplier option given.

    References
    ----------
    The split follows from the loop's pressure balance (calc/METHODS.md §23); a fit of
    measured against predicted losses is common practice, no single published source.

    Examples
    --------
    The well of :func:`calibrate_friction`, a 2,000 psi standpipe pressure and a gauge reading
    11.40 ppg at 2,900 m, where the model predicts 11.47 ppg:

    >>> from calc.bit import Bit
    >>> from calc.circulation import hydraulics_fluid_from_readings
    >>> from calc.geometry import DrillString, Hole, HoleSection, StringComponent, Survey, Well
    >>> from calc.rheology import ViscometerReadings
    >>> from calc.units import from_si, to_si
    >>> casing = HoleSection("9-5/8 in casing", 0.0, 1500.0, to_si(8.681, "in"))
    >>> pipe = [StringComponent("collars", to_si(6.5, "in"), to_si(2.8125, "in"), 150.0),
    ...         StringComponent("drill pipe", to_si(5.0, "in"), to_si(4.276, "in"), "fill")]
    >>> well = Well(Survey([0.0, 3000.0], [0.0, 0.0], [0.0, 0.0]),
    ...             Hole.from_casing([casing], 3000.0, bit_size=to_si(8.5, "in")),
    ...             DrillString(pipe), Bit(to_si(8.5, "in"), "3x12 3x11"), bit_depth=3000.0)
    >>> mud = ViscometerReadings.from_mapping({600: 56, 300: 37, 200: 29, 100: 20, 6: 8, 3: 7})
    >>> fluid = hydraulics_fluid_from_readings(mud, density=to_si(11.0, "ppg"))
    >>> cal = calibrate_two_part(well, fluid, to_si(500.0, "gpm"),
    ...                          measured_spp=to_si(2000.0, "psi"),
    ...                          gauge_ecd=to_si(11.40, "ppg"), gauge_md=2900.0)
    >>> round(from_si(cal.predicted_gauge_ecd, "ppg"), 2)
    11.47
    >>> cal.part, round(cal.string_multiplier, 3), round(cal.annulus_multiplier, 3)
    ('string and annulus', 1.123, 0.852)
    >>> spp, ecd = cal.calibrated_spp, cal.calibrated_gauge_ecd
    >>> round(from_si(spp, "psi"), 6), round(from_si(ecd, "ppg"), 6)
    (2000.0, 11.4)
    """
    for k in ("friction_multiplier", "annulus_multiplier"):
        if k in circulate_options:
            raise InputError(k, circulate_options[k], "not given here: the calibration fits it")
    if measured_spp is None and gauge_ecd is None:
        raise InputError(
            "calibration measurements", None, "a measured standpipe pressure, a gauge, or both"
        )
    if (gauge_ecd is None) != (gauge_md is None):
        raise InputError("gauge", (gauge_ecd, gauge_md), "both an ECD and its MD, or neither")
    qv = float(check_positive("flow rate", q, "m³/s"))
    inc = float(check_range("gauge increment", gauge_increment, 0.0, np.inf, "kg/m³"))
    base = circulate(well, fluid, qv, **circulate_options)
    spp = float(base.standpipe_pressure)
    s_fric = float(base.surface.total) + float(base.string.total)
    a_fric = float(base.annulus.total)
    fixed = spp - s_fric - a_fric
    meas = None if measured_spp is None else float(check_positive("measured standpipe pressure",
                                                                  measured_spp, "Pa"))  # fmt: skip
    notes = []
    e1 = e0 = read = None
    if gauge_ecd is not None:
        read = float(check_positive("gauge ECD", gauge_ecd, "kg/m³"))
        md = float(check_range("gauge MD", gauge_md, 0.0, base.bit_md, "m", lo_open=True))
        e1, e0 = _gauge_parts(base, md, inc)
        if not read > e0 or not e1 > e0:
            raise InputError(
                "gauge ECD",
                read,
                "> the static density plus back-pressure at the gauge ({static}), since only "
                "annular friction is calibrated",
                kind="density",
                values=(Value("static", e0, "density"),),
            )
        m_a = (read - e0) / (e1 - e0)
    if meas is not None and read is not None:
        part = "string and annulus"
        m_s = (meas - fixed - m_a * a_fric) / s_fric
        if not m_s > 0:
            raise InputError(
                "measured standpipe pressure",
                meas,
                "> the fixed part plus the calibrated annular friction ({floor}): the gauge "
                "already accounts for more than the measured standpipe pressure",
                kind="pressure",
                values=(Value("floor", fixed + m_a * a_fric, "pressure"),),
            )
        labels = (STRING_CALIBRATION_LABEL, ANNULUS_CALIBRATION_LABEL)
    elif meas is not None:
        part = "whole loop"
        if not meas > fixed:
            raise InputError(
                "measured standpipe pressure", meas,
                "> the fixed part of the prediction (back-pressure + bit + tools = {fixed})",
                kind="pressure", values=(Value("fixed", fixed, "pressure"),),
            )  # fmt: skip
        m_s = m_a = (meas - fixed) / (s_fric + a_fric)
        labels = (CALIBRATION_LABEL,)
    else:
        part, m_s = "annulus", 1.0
        labels = (ANNULUS_CALIBRATION_LABEL,)
    notes.append(
        Note(
            "info",
            "calibrated_part",
            "calibrated: {part}"
            + {
                "whole loop": " (standpipe pressure only: one multiplier on string and annulus)",
                "annulus": " (gauge only: the string friction is not calibrated)",
                "string and annulus": "",
            }[part],
            "calibration",
            values=(Value("part", part),),
        )
    )
    lo, hi = MULTIPLIER_RANGE
    for name, m in (("string", m_s), ("annulus", m_a)):
        if not lo <= m <= hi:
            notes.append(
                Note(
                    "warning",
                    "calibration_multiplier_unusual",
                    "the {part} friction multiplier {multiplier:.2f} is outside {low:.1f}–"
                    "{high:.1f}: check the inputs (rate, pump efficiency, nozzles, hole size, "
                    "gauge depth, mud) before using the calibration",
                    "calibration",
                    values=(
                        Value("part", name),
                        Value("multiplier", float(m)),
                        Value("low", lo),
                        Value("high", hi),
                    ),
                )
            )
    cal = circulate(
        well, fluid, qv, friction_multiplier=m_s, annulus_multiplier=m_a, **circulate_options
    )
    c_gauge = None
    if read is not None:
        c_gauge = float(np.asarray(cal.ecd_at(gauge_md))) + inc
    return TwoPartCalibration(
        part=part,
        q=qv,
        string_multiplier=float(m_s),
        annulus_multiplier=float(m_a),
        fixed_loss=fixed,
        string_friction=s_fric,
        annulus_friction=a_fric,
        measured_spp=meas,
        predicted_spp=spp,
        calibrated_spp=float(cal.standpipe_pressure),
        gauge_md=None if read is None else float(gauge_md),
        gauge_ecd=read,
        predicted_gauge_ecd=e1,
        calibrated_gauge_ecd=c_gauge,
        gauge_increment=inc,
        spp_absorbed_string=None if meas is None else (1.0 - m_s) * s_fric,
        spp_absorbed_annulus=None if meas is None else (1.0 - m_a) * a_fric,
        gauge_absorbed_annulus=None if read is None else e1 - read,
        predicted=base,
        calibrated=cal,
        labels=labels,
        notes=tuple(notes),
    )
