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

from calc.circulation.loop import CirculationResult, circulate
from calc.errors import InputError, check_positive
from calc.notes import Note
from calc.numeric import float_or_array
from calc.values import Value

__all__ = [
    "CALIBRATION_LABEL",
    "FrictionCalibration",
    "calibrate_friction",
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
