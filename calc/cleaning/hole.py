"""Hole cleaning for a whole well: per-interval table, minimum rates, cuttings-loaded ECD."""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.circulation.pore_fracture import MarginTable, tabulate_margins
from calc.cleaning.deviated import (
    RUBIANDINI_RANGE,
    RubiandiniResult,
    check_rotary_speed,
    rubiandini_angle_slope_bound,
    rubiandini_critical_velocity,
)
from calc.cleaning.indicators import (
    LARSEN_RANGE,
    VERDICTS,
    CCIResult,
    CleaningCriteria,
    LarsenResult,
    carrying_capacity_index,
    cleaning_score,
    larsen_angle_slope_bound,
    larsen_critical_velocity,
    verdict_levels,
)
from calc.cleaning.transport import Cuttings, TransportResult, annular_transport
from calc.errors import InputError, check_choice, check_positive, check_range
from calc.flow.area import cross_section_area
from calc.notes import Note
from calc.numeric import bisect_increasing, depth_weights, scalar_or_array
from calc.span import Span
from calc.values import Value

__all__ = [
    "CLEANING_METHODS",
    "USES_ROTATION",
    "HoleCleaningResult",
    "IntervalRates",
    "LoadedProfile",
    "annulus_cleaning_rates",
    "cuttings_ecd_increment",
    "hole_cleaning",
    "loaded_ecd_profile",
    "loaded_margins",
]

#: Default bracket for minimum-rate searches [m³/s] (≈ 1.6-3200 gpm).
RATE_BRACKET = (1e-4, 0.2)

#: The cleaning methods applied in every interval, in table order: the vertical criteria
#: (transport ratio, concentration, CCI with the chosen slip method) and the two deviated-hole
#: methods of :mod:`calc.cleaning.deviated`.
CLEANING_METHODS = ("vertical_criteria", "rubiandini_1999", "larsen_1997")
#: Which of them use the string rotary speed.
USES_ROTATION = {"vertical_criteria": False, "rubiandini_1999": True, "larsen_1997": False}


@dataclass(frozen=True, eq=False)
class HoleCleaningResult:
    """Per-interval hole cleaning for the annulus, bit upwards (SI; arrays: rate axes + interval).

    Attributes
    ----------
    q : float or ndarray
        Flow rate(s) [m³/s].
    spans : tuple of Span
        Where each annular interval lies (item, hole section, tool-joint flag, MD/TVD span [m]).
    top_md, bottom_md : ndarray
        MD span of each interval [m].
    inclination : ndarray
        Mean inclination [degree].
    d_hole, d_pipe : ndarray
        Hole or casing ID and pipe (or tool-joint) OD [m].
    is_tool_joint : ndarray of bool
        The intervals as :meth:`calc.geometry.Well.flow_intervals` gives them.
    vertical : ndarray of bool
        Where the vertical criteria (transport ratio, CCI) apply: every interval (there is no
        inclination switch; above ``criteria.vertical_limit`` a note says they are used outside
        their near-vertical range).
    transport : TransportResult
        Velocities, slip, transport ratio, concentration, loaded density.
    cci : CCIResult
        Carrying capacity index.
    larsen : LarsenResult
        Larsen-Pilehvari-Azar critical velocity and rate.
    rubiandini : RubiandiniResult
        Rubiandini's minimum velocity and rate (uses ``rpm``).
    critical_ratio : float or ndarray
        Q/Q_crit of the more demanding deviated-hole method, Q/max(Q_Larsen, Q_Rubiandini) [-].
    levels : dict of str to ndarray
        Per-criterion levels 0/1/2 (adequate/marginal/poor; -1 not applicable) and "overall".
    verdict : ndarray of str
        "adequate", "marginal" or "poor" per interval.
    minimum_rate : ndarray
        Smallest flow rate giving the ``require`` verdict in each interval [m³/s] (``inf`` where
        not reached inside the search bracket).
    method_rates : dict of str to ndarray
        Per method of :data:`CLEANING_METHODS`: the smallest rate that method accepts as
        ``require`` in each interval [m³/s] (``inf`` where not reached).
    governing : ndarray of str
        The method whose rate is the largest (governs) in each interval.
    rpm : float
        String rotary speed used [rpm].
    rate_slope_bound : ndarray
        Upper bound of |d(minimum rate)/d(inclination)| [m³/s per degree]
        (:attr:`IntervalRates.slope_bound`).
    controlling_interval : Span
        The interval needing the highest rate.
    controlling_rate : float
        That rate [m³/s].
    require : str
        "adequate" or "marginal".
    criteria : CleaningCriteria
    criteria_text : str
    method : str
        Slip method and indicator sources.
    notes : tuple of Note
    """

    q: float | np.ndarray
    spans: tuple[Span, ...]
    top_md: np.ndarray
    bottom_md: np.ndarray
    inclination: np.ndarray
    d_hole: np.ndarray
    d_pipe: np.ndarray
    is_tool_joint: np.ndarray
    vertical: np.ndarray
    transport: TransportResult
    cci: CCIResult
    larsen: LarsenResult
    rubiandini: RubiandiniResult
    critical_ratio: float | np.ndarray
    levels: dict[str, np.ndarray]
    verdict: np.ndarray
    minimum_rate: np.ndarray
    method_rates: dict[str, np.ndarray]
    governing: np.ndarray
    rpm: float
    rate_slope_bound: np.ndarray
    controlling_interval: Span
    controlling_rate: float
    require: str
    criteria: CleaningCriteria
    criteria_text: str
    method: str
    notes: tuple[Note, ...] = field(default=())

    def table(self) -> list[dict]:
        """One dictionary per interval (single rate) for tables and reports, SI values; the
        ``"interval"`` entry is the interval's :class:`~calc.span.Span`."""
        if np.ndim(self.q) != 0:
            raise InputError("q", "a sweep", "a single rate for the table")
        t = self.transport
        rows = []
        for i, where in enumerate(self.spans):
            rows.append(
                {
                    "interval": where,
                    "top_md": float(self.top_md[i]),
                    "bottom_md": float(self.bottom_md[i]),
                    "inclination": float(self.inclination[i]),
                    "annular_velocity": float(np.asarray(t.annular_velocity)[i]),
                    "slip_velocity": float(np.asarray(t.slip_velocity)[i]),
                    "transport_ratio": float(np.asarray(t.transport_ratio)[i]),
                    "net_rise_velocity": float(np.asarray(t.net_rise_velocity)[i]),
                    "concentration": float(np.asarray(t.concentration)[i]),
                    "loaded_density": float(np.asarray(t.loaded_density)[i]),
                    "cci": float(np.asarray(self.cci.cci)[i]),
                    "critical_rate": float(np.asarray(self.larsen.critical_rate)[i]),
                    "rubiandini_critical_rate": float(np.asarray(self.rubiandini.critical_rate)[i]),
                    "rubiandini_factor": float(np.asarray(self.rubiandini.factor)[i]),
                    "larsen_angle_factor": float(np.asarray(self.larsen.angle_factor)[i]),
                    **{f"{m}_rate": float(self.method_rates[m][i]) for m in CLEANING_METHODS},
                    "governing": str(self.governing[i]),
                    "rate_slope_bound": float(self.rate_slope_bound[i]),
                    "minimum_rate": float(self.minimum_rate[i]),
                    "verdict": str(self.verdict[i]),
                }
            )
        return rows


@dataclass(frozen=True, eq=False)
class _Setting:
    """What every evaluation of one well shares: the annulus, the mud, cuttings and ROP."""

    d_hole: np.ndarray
    d_pipe: np.ndarray
    density: float
    params: tuple[float, float, float]
    cuttings: Cuttings
    rop: float
    bit_diameter: float
    method: str
    critical_rate: np.ndarray

    def evaluate(self, q):
        """Transport, CCI and Q/Q_crit at rates ``q`` (broadcast against the interval axis)."""
        ty, k, n = self.params
        tr = annular_transport(
            q, self.d_hole, self.d_pipe, density=self.density, k=k, tau_y=ty, n=n,
            cuttings=self.cuttings, rop=self.rop, bit_diameter=self.bit_diameter,
            method=self.method,
        )  # fmt: skip
        cci = carrying_capacity_index(tr.annular_velocity, density=self.density, k=k, tau_y=ty,
                                      n=n)  # fmt: skip
        return tr, cci, np.asarray(q) / self.critical_rate


def _vertical_minimum_rates(setting: _Setting, criteria, require, rate_bracket) -> np.ndarray:
    """Smallest rate meeting the vertical criteria (transport ratio, concentration, CCI) at
    ``require`` in each interval [m³/s] (``inf`` where the bracket's top does not): the score
    rises with the rate, so bisect on log q, every interval at once."""
    every = np.ones(setting.d_hole.shape, dtype=bool)

    def score(qq):
        t2, c2, _ = setting.evaluate(qq)
        return cleaning_score(
            criteria, require, every, np.asarray(t2.transport_ratio),
            np.asarray(t2.concentration), np.asarray(c2.cci), np.inf,
        )  # fmt: skip

    lo = np.full(setting.d_hole.shape, float(rate_bracket[0]))
    hi = np.full(setting.d_hole.shape, float(rate_bracket[1]))
    s_hi = score(hi)
    q_min = bisect_increasing(score, lo, hi, iterations=50, log=True)
    q_min = np.where(score(lo) >= 0, lo, q_min)
    return np.where(s_hi < 0, np.inf, q_min)


def _method_rates(setting, criteria, require, lar, rub, rate_bracket) -> dict[str, np.ndarray]:
    """Per method of CLEANING_METHODS, the smallest rate it accepts as ``require`` [m³/s]."""
    cr = criteria.critical_ratio(require)
    lo, hi = float(rate_bracket[0]), float(rate_bracket[1])
    out = {"vertical_criteria": _vertical_minimum_rates(setting, criteria, require, rate_bracket)}
    for name, res in (("rubiandini_1999", rub), ("larsen_1997", lar)):
        q = cr * np.asarray(res.critical_rate, dtype=float)
        out[name] = np.where(q > hi, np.inf, np.maximum(q, lo))
    return out


def _names_where(names: np.ndarray, mask: np.ndarray) -> str:
    return ", ".join(dict.fromkeys(str(x) for x in names[mask])) or "none"


def _range_notes(criteria, inc, governing) -> list[Note]:
    """A note for each method used outside its published inclination range (naming the method,
    the range and the governing methods there)."""
    notes = []
    ranges = (
        ("vertical_criteria", (0.0, float(criteria.vertical_limit)), "vertical_criteria_range"),
        ("larsen_1997", LARSEN_RANGE, "larsen_extrapolated"),
        ("rubiandini_1999", RUBIANDINI_RANGE, "rubiandini_range"),
    )
    for method, (lo, hi), code in ranges:
        out = (inc < lo) | (inc > hi)
        if not np.any(out):
            continue
        notes.append(
            Note(
                "warning",
                code,
                "{method} applied outside its published inclination range {lo:g}-{hi:g}° in "
                "{count} interval(s) (inclination {low:.1f}° to {high:.1f}°); governing there: "
                "{governing}.",
                "hole cleaning",
                values=(
                    Value("method", method),
                    Value("lo", float(lo)),
                    Value("hi", float(hi)),
                    Value("count", float(np.sum(out))),
                    Value("low", float(np.min(inc[out]))),
                    Value("high", float(np.max(inc[out]))),
                    Value("governing", _names_where(governing, out)),
                ),
            )
        )
    return notes


def _cleaning_notes(criteria, require, inc, q_min, levels, governing, rpm, rpm_given,
                    rate_bracket) -> list[Note]:  # fmt: skip
    notes = _range_notes(criteria, inc, governing)
    with_rpm = [m for m in CLEANING_METHODS if USES_ROTATION[m]]
    without = [m for m in CLEANING_METHODS if not USES_ROTATION[m]]
    notes.append(
        Note(
            "info",
            "rotation_use",
            "string rotary speed {rpm} rpm used by {with_rpm}; {without} have no rotation term.",
            "hole cleaning",
            values=(
                Value("rpm", float(rpm)),
                Value("with_rpm", ", ".join(with_rpm)),
                Value("without", ", ".join(without)),
            ),
        )
    )
    if not rpm_given:
        notes.append(
            Note(
                "warning",
                "rotary_speed_missing",
                "no string rotary speed given: 0 rpm assumed (the most demanding for "
                "rubiandini_1999).",
                "hole cleaning",
            )
        )
    if np.any(~np.isfinite(q_min)):
        notes.append(
            Note(
                "caution",
                "cleaning_rate_unreachable",
                f"no rate up to {{rate}} gives '{require}' cleaning in {{count}} interval(s).",
                "hole cleaning",
                values=(
                    Value("rate", float(rate_bracket[1]), "flow_rate"),
                    Value("count", float(np.sum(~np.isfinite(q_min)))),
                ),
            )
        )
    if np.any(levels["overall"] == 2):
        notes.append(
            Note("caution", "poor_cleaning", "poor hole cleaning predicted", "hole cleaning")
        )
    return notes


@dataclass(frozen=True)
class IntervalRates:
    """Minimum cleaning rates of one or more annular intervals, per method (SI).

    rates       method of :data:`CLEANING_METHODS` → rate [m³/s] (``inf`` where not reached)
    minimum     the largest of them [m³/s]
    governing   the method giving it
    larsen, rubiandini   the deviated-hole results behind their rates
    slope_bound upper bound of |d(minimum)/dθ| [m³/s per degree]: cr·A·max of the Larsen and
                Rubiandini velocity-slope bounds (the vertical criteria do not depend on θ);
                it does not fall with θ, so over a step θ₁ → θ₂ the larger endpoint value
                bounds the change (calc/METHODS.md §10.13)
    """

    rates: dict[str, np.ndarray]
    minimum: np.ndarray
    governing: np.ndarray
    larsen: LarsenResult
    rubiandini: RubiandiniResult
    slope_bound: np.ndarray


def annulus_cleaning_rates(
    d_hole,
    d_pipe,
    inclination,
    *,
    density,
    k,
    tau_y=0.0,
    n=1.0,
    cuttings: Cuttings,
    rop,
    bit_diameter,
    rpm=0.0,
    method: str = "moore",
    criteria: CleaningCriteria | None = None,
    require: str = "adequate",
    rate_bracket: tuple[float, float] = RATE_BRACKET,
) -> IntervalRates:
    """Minimum cleaning rate of annular interval(s) by every method, and which governs.

    The rule of :func:`hole_cleaning` for intervals given by their diameters [m] and
    inclination [degree] (arrays broadcast): vertical criteria, cr·Q_Rubiandini, cr·Q_Larsen;
    the largest governs.  ``rop`` [m/s] > 0, ``bit_diameter`` [m], ``rpm`` 0-600.

    Examples
    --------
    >>> r = annulus_cleaning_rates(0.2244, 0.127, 30.0, density=1342.0, k=0.186, tau_y=4.09,
    ...     n=0.737, cuttings=Cuttings(0.00635, 2600.0, 0.8), rop=0.0044, bit_diameter=0.2159,
    ...     rpm=140.0)
    >>> str(r.governing[0]), round(float(r.minimum[0]) / 6.309e-5)   # m³/s → gpm
    ('larsen_1997', 508)
    """
    criteria = CleaningCriteria() if criteria is None else criteria
    require = check_choice("require", require, ("adequate", "marginal"))
    r = float(check_positive("rate of penetration", rop, "m/s"))
    rpm_v = float(check_rotary_speed(rpm))
    d2, d1, inc = np.broadcast_arrays(
        np.atleast_1d(check_positive("hole diameter", d_hole, "m")),
        np.atleast_1d(np.asarray(d_pipe, dtype=float)),
        np.atleast_1d(check_range("inclination", inclination, 0.0, 180.0, "degree")),
    )
    gap = 0.5 * (d2 - d1)
    if np.any(cuttings.size >= gap):
        raise InputError(
            "cuttings size", float(cuttings.size), f"< the radial gap {gap.min():.4g} m"
        )
    inc_hole = np.where(inc > 90.0, 180.0 - inc, inc)
    lar = larsen_critical_velocity(
        r, d2, d1, density=density, k=k, tau_y=tau_y, n=n, cuttings_size=cuttings.size,
        inclination=inc_hole,
    )  # fmt: skip
    rub = rubiandini_critical_velocity(
        r, d2, d1, density=density, k=k, tau_y=tau_y, n=n, cuttings_size=cuttings.size,
        cuttings_density=cuttings.density, inclination=inc_hole, rpm=rpm_v,
    )  # fmt: skip
    q_dev = np.maximum(np.asarray(lar.critical_rate), np.asarray(rub.critical_rate))
    setting = _Setting(
        d_hole=d2, d_pipe=d1, density=float(density), params=(tau_y, k, n), cuttings=cuttings,
        rop=r, bit_diameter=float(bit_diameter), method=method, critical_rate=q_dev,
    )  # fmt: skip
    rates = _method_rates(setting, criteria, require, lar, rub, rate_bracket)
    stack = np.stack([rates[m] for m in CLEANING_METHODS])
    governing = np.asarray(CLEANING_METHODS, dtype=object)[np.argmax(stack, axis=0)]
    b_l = larsen_angle_slope_bound(r, d2, d1, density=density, k=k, tau_y=tau_y, n=n,
                                   cuttings_size=cuttings.size)  # fmt: skip
    b_r = rubiandini_angle_slope_bound(rub, density)
    bound = criteria.critical_ratio(require) * cross_section_area(d2, d1) * np.maximum(b_l, b_r)
    return IntervalRates(rates, stack.max(axis=0), governing, lar, rub, np.asarray(bound))


def hole_cleaning(
    well,
    fluid,
    q,
    *,
    rop,
    cuttings: Cuttings,
    rpm=None,
    method: str = "moore",
    criteria: CleaningCriteria | None = None,
    require: str = "adequate",
    rate_bracket: tuple[float, float] = RATE_BRACKET,
) -> HoleCleaningResult:
    """Hole cleaning in every annular interval of a well at flow rate(s) ``q``, 0-90° without a
    switch.

    For each interval: annular velocity, slip velocity (``method``), transport ratio, net rise
    velocity, in-situ cuttings concentration from ROP, bit size and rate, loaded density, the
    carrying capacity index, and the minimum velocities of the two deviated-hole methods
    (Rubiandini 1999, which uses ``rpm``; Larsen, Pilehvari & Azar 1997).  Every criterion is
    applied at every inclination; the minimum rate of an interval is the largest of

    * the vertical criteria's rate (transport ratio, concentration and CCI thresholds),
    * cr·Q_Rubiandini and cr·Q_Larsen (cr the Q/Q_crit threshold of ``require``),

    and the method giving it governs.  Each of these is continuous in inclination, so the
    governing rate is too: per degree it changes by no more than the fastest of them
    (calc/METHODS.md §10.13 states the bound).  The vertical criteria do not depend on
    inclination and Rubiandini's rate does not fall with it, so in 30-60° (as everywhere) the
    required rate is at least the near-vertical one.

    Parameters
    ----------
    well : calc.geometry.Well
    fluid : calc.circulation.HydraulicsFluid
        Scalar density; the annulus model's (τ_y, K, n) are used.
    q : float or array_like
        Flow rate(s) [m³/s], > 0.  An array adds a leading axis to every per-interval array.
    rop : float
        Rate of penetration [m/s], > 0.
    cuttings : Cuttings
        Must be smaller than every radial gap.
    rpm : float, optional
        String rotary speed [rpm], 0-600; None → 0 (a note says so).
    method : str
        Slip-velocity method of the vertical criteria (:data:`calc.cleaning.SLIP_METHODS`).
    criteria : CleaningCriteria, optional
        Verdict thresholds (defaults: common practice, see :class:`CleaningCriteria`).
    require : {"adequate", "marginal"}
        Verdict the minimum rates are computed for.
    rate_bracket : (float, float)
        Search bracket for minimum rates [m³/s].

    Returns
    -------
    HoleCleaningResult

    Notes
    -----
    Methods used outside their published inclination range get a note naming the method, the
    range and the governing method.  Eccentricity and cuttings beds are not modelled here.

    References
    ----------
    See :mod:`calc.cleaning.slip`, :mod:`calc.cleaning.transport`, :mod:`calc.cleaning.indicators`,
    :mod:`calc.cleaning.deviated`.
    """
    criteria = CleaningCriteria() if criteria is None else criteria
    require = check_choice("require", require, ("adequate", "marginal"))
    qv = check_positive("flow rate", q, "m³/s")
    r = float(check_positive("rate of penetration", rop, "m/s"))
    rpm_given = rpm is not None
    rpm_v = float(check_rotary_speed(0.0 if rpm is None else rpm))
    rho = check_positive("mud density", fluid.density, "kg/m³")
    if rho.ndim:
        raise InputError("fluid density", "an array", "one density for hole cleaning")
    rho = float(rho)
    params = fluid.annulus_parameters
    a = well.flow_intervals().annulus
    spans = a.spans()
    d2 = np.asarray(a.outer_diameter, dtype=float)
    d1 = np.asarray(a.inner_diameter, dtype=float)
    _check_cuttings_fit(cuttings, d2, d1, spans)
    inc = check_range("inclination", np.asarray(a.inclination, dtype=float), 0.0, 180.0, "degree")
    inc_hole = np.where(inc > 90.0, 180.0 - inc, inc)
    vertical = np.ones(inc.shape, dtype=bool)
    ty, k, n = params
    ir = annulus_cleaning_rates(
        d2, d1, inc, density=rho, k=k, tau_y=ty, n=n, cuttings=cuttings, rop=r,
        bit_diameter=float(well.bit.size), rpm=rpm_v, method=method, criteria=criteria,
        require=require, rate_bracket=rate_bracket,
    )  # fmt: skip
    lar, rub = ir.larsen, ir.rubiandini
    q_dev = np.maximum(np.asarray(lar.critical_rate), np.asarray(rub.critical_rate))
    setting = _Setting(
        d_hole=d2, d_pipe=d1, density=rho, params=params, cuttings=cuttings, rop=r,
        bit_diameter=float(well.bit.size), method=method, critical_rate=q_dev,
    )  # fmt: skip
    q_arr = np.asarray(qv, dtype=float)
    tr, cci, ratio = setting.evaluate(q_arr[..., None] if q_arr.ndim else q_arr)
    levels = verdict_levels(
        criteria, vertical, np.asarray(tr.transport_ratio), np.asarray(tr.concentration),
        np.asarray(cci.cci), ratio,
    )  # fmt: skip
    verdict = np.asarray(VERDICTS, dtype=object)[levels["overall"]]
    rates, q_min, governing = ir.rates, ir.minimum, ir.governing
    ctrl = int(np.argmax(q_min))
    notes = list(tr.notes) + list(rub.notes)
    notes += _cleaning_notes(criteria, require, inc_hole, q_min, levels, governing, rpm_v,
                             rpm_given, rate_bracket)  # fmt: skip
    return HoleCleaningResult(
        q=scalar_or_array(q_arr),
        spans=spans,
        top_md=np.asarray(a.top_md),
        bottom_md=np.asarray(a.bottom_md),
        inclination=inc,
        d_hole=d2,
        d_pipe=d1,
        is_tool_joint=np.asarray(a.is_tool_joint),
        vertical=vertical,
        transport=tr,
        cci=cci,
        larsen=lar,
        rubiandini=rub,
        critical_ratio=scalar_or_array(ratio),
        levels=levels,
        verdict=verdict,
        minimum_rate=q_min,
        method_rates=rates,
        governing=governing,
        rpm=rpm_v,
        rate_slope_bound=ir.slope_bound,
        controlling_interval=spans[ctrl],
        controlling_rate=float(q_min[ctrl]),
        require=require,
        criteria=criteria,
        criteria_text=criteria.describe(),
        method=f"vertical criteria: slip {tr.method}, CCI (Robinson); {rub.method}; {lar.method}",
        notes=tuple(dict.fromkeys(notes)),
    )


def _check_cuttings_fit(cuttings: Cuttings, d_hole, d_pipe, spans) -> None:
    """Cuttings must be smaller than every radial gap (InputError naming the tightest one)."""
    gap = 0.5 * (d_hole - d_pipe)
    if np.any(cuttings.size >= gap):
        i = int(np.argmin(gap))
        raise InputError(
            "cuttings size",
            float(cuttings.size),
            "< the radial gap {gap} of {where}",
            kind="diameter",
            values=(Value("gap", float(gap[i]), "diameter"), Value("where", spans[i])),
        )


def cuttings_ecd_increment(well, loaded_density, density, md, *, hydrostatic: str = "exact"):
    """Extra EMW from the cuttings load at measured depth(s) ``md`` [kg/m³].

    .. math:: \\Delta\\mathrm{ECD}(z) = \\frac{\\sum_i (\\rho_{eff,i} - \\rho)\\,g\\,w_i(z)\\,
              \\Delta TVD_i}{g\\,TVD(z)}

    w_i the fraction of annular interval i above z (linear in MD), ΔTVD_i its vertical extent
    (tool-joint rows carry their share).  Add it to the clean ECD for the loaded profile; the
    extra friction of the laden mud is neglected.

    Parameters
    ----------
    well : calc.geometry.Well
    loaded_density : array_like
        ρ_eff per annular interval [kg/m³] (leading rate axes allowed; last axis the intervals).
    density : float
        Clean mud density [kg/m³].
    md : array_like
        Measured depths [m], 0 < md ≤ bit depth.
    hydrostatic : {"exact", "0.052"}
        Cancels (g appears above and below); kept for symmetry with the circulation API.
    """
    a = well.flow_intervals().annulus
    mdv = check_positive("MD", md, "m")
    tvd = np.asarray(well.tvd_at(mdv), dtype=float)
    top, bot = np.asarray(a.top_md), np.asarray(a.bottom_md)
    w = depth_weights(mdv.ravel(), top, bot)
    extra = (np.asarray(loaded_density, dtype=float) - density) * np.asarray(a.delta_tvd)
    dp = extra @ w.T  # per unit g
    out = dp.reshape(dp.shape[:-1] + mdv.shape) / np.where(tvd > 0, tvd, np.inf)
    return scalar_or_array(out)


@dataclass(frozen=True, eq=False)
class LoadedProfile:
    """Clean and cuttings-loaded ECD on an MD grid (one rate): ``md``, ``tvd`` [m]; ``esd``,
    ``ecd``, ``ecd_loaded``, ``pore``, ``fracture`` [kg/m³]."""

    md: np.ndarray
    tvd: np.ndarray
    esd: np.ndarray
    ecd: np.ndarray
    ecd_loaded: np.ndarray
    pore: np.ndarray
    fracture: np.ndarray


def loaded_ecd_profile(circulation, cleaning: HoleCleaningResult, well, step: float = 30.0):
    """The circulation's clean ECD profile with the cuttings-loaded ECD beside it.

    ``circulation`` is a single-rate :class:`calc.circulation.CirculationResult` and ``cleaning``
    the :func:`hole_cleaning` result at the same rate; ECD_loaded = ECD + ΔECD from
    :func:`cuttings_ecd_increment`.
    """
    if np.ndim(cleaning.q) or np.ndim(circulation.q):
        raise InputError("q", "a sweep", "one rate for a loaded profile")
    if not np.isclose(float(cleaning.q), float(circulation.q), rtol=1e-9):
        raise InputError("cleaning rate", float(cleaning.q), f"= circulation rate {circulation.q}")
    p = circulation.profile(step)
    extra = cuttings_ecd_increment(
        well, cleaning.transport.loaded_density, float(circulation.density), p.md
    )
    return LoadedProfile(
        md=p.md, tvd=p.tvd, esd=np.asarray(p.esd), ecd=np.asarray(p.ecd),
        ecd_loaded=np.asarray(p.ecd) + extra, pore=p.pore, fracture=p.fracture,
    )  # fmt: skip


def loaded_margins(table: MarginTable, cleaning: HoleCleaningResult, well, density: float):
    """The margin table of a circulation with the cuttings load added to its ECD.

    .. math:: \\mathrm{ECD}_{loaded}(z) = \\mathrm{ECD}(z) + \\Delta\\mathrm{ECD}(z),\\quad
              m_{frac} = \\rho_{frac} - \\mathrm{ECD}_{loaded},\\quad
              m_{pore} = \\mathrm{ECD} - \\rho_{pore}

    ΔECD from :func:`cuttings_ecd_increment` at the table's check points; ``table.ecd`` (clean)
    is the single-rate margin table of :func:`calc.circulation.circulate` and ``cleaning`` the
    :func:`hole_cleaning` result at the same rate.  The returned table's ``ecd`` is the loaded
    ECD; its fracture margins and tightest point use it, while the pore margin stays on the
    clean ECD, the lower value (cuttings may be circulated out, leaving the clean ECD against
    the pore pressure).  The clean table is the argument itself.  Checked on the demo well in
    tests/test_loaded_ecd.py (a well is too large for a doctest).
    """
    if np.ndim(cleaning.q):
        raise InputError("q", "a sweep", "one rate for loaded margins")
    rho = float(check_positive("mud density", density, "kg/m³"))
    clean = np.asarray(table.ecd, dtype=float)
    extra = np.asarray(
        cuttings_ecd_increment(well, cleaning.transport.loaded_density, rho, table.md), dtype=float
    )
    return tabulate_margins(
        table.points, table.md, table.tvd, table.pore, table.fracture, clean + extra, table.esd,
        table.margins, ecd_pore=clean,
    )  # fmt: skip
