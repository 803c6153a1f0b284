"""Hole cleaning for a whole well: per-interval table, minimum rates, cuttings-loaded ECD."""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.circulation.pore_fracture import MarginTable, tabulate_margins
from calc.cleaning.indicators import (
    LARSEN_RANGE,
    VERDICTS,
    CCIResult,
    CleaningCriteria,
    LarsenResult,
    carrying_capacity_index,
    cleaning_score,
    larsen_critical_velocity,
    verdict_levels,
)
from calc.cleaning.transport import Cuttings, TransportResult, annular_transport
from calc.errors import InputError, check_choice, check_nonnegative, check_positive
from calc.notes import Note
from calc.numeric import bisect_increasing, depth_weights, scalar_or_array
from calc.span import Span
from calc.values import Value

__all__ = [
    "HoleCleaningResult",
    "LoadedProfile",
    "cuttings_ecd_increment",
    "hole_cleaning",
    "loaded_ecd_profile",
    "loaded_margins",
]

#: Default bracket for minimum-rate searches [m³/s] (≈ 1.6-3200 gpm).
RATE_BRACKET = (1e-4, 0.2)


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
        Interval below ``criteria.vertical_limit`` (vertical criteria apply).
    transport : TransportResult
        Velocities, slip, transport ratio, concentration, loaded density.
    cci : CCIResult
        Carrying capacity index (meaningful where ``vertical``).
    larsen : LarsenResult
        High-angle critical velocity and rate (meaningful where not ``vertical``).
    critical_ratio : float or ndarray
        Q/Q_crit (Larsen) [-].
    levels : dict of str to ndarray
        Per-criterion levels 0/1/2 (adequate/marginal/poor; -1 not applicable) and "overall".
    verdict : ndarray of str
        "adequate", "marginal" or "poor" per interval.
    minimum_rate : ndarray
        Smallest flow rate giving the ``require`` verdict in each interval [m³/s] (``inf`` where
        not reached inside the search bracket).
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
    critical_ratio: float | np.ndarray
    levels: dict[str, np.ndarray]
    verdict: np.ndarray
    minimum_rate: np.ndarray
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
                    "cci": float(np.asarray(self.cci.cci)[i]) if self.vertical[i] else None,
                    "critical_rate": None
                    if self.vertical[i]
                    else float(np.asarray(self.larsen.critical_rate)[i]),
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


def _minimum_rates(setting: _Setting, criteria, require, vertical, rate_bracket) -> np.ndarray:
    """Smallest rate giving ``require`` in each interval [m³/s] (``inf`` where the bracket's top
    does not): the score rises with the rate, so bisect on log q, every interval at once."""

    def score(qq):
        t2, c2, r2 = setting.evaluate(qq)
        return cleaning_score(
            criteria, require, vertical, np.asarray(t2.transport_ratio),
            np.asarray(t2.concentration), np.asarray(c2.cci), r2,
        )  # fmt: skip

    lo = np.full(setting.d_hole.shape, float(rate_bracket[0]))
    hi = np.full(setting.d_hole.shape, float(rate_bracket[1]))
    s_hi = score(hi)
    q_min = bisect_increasing(score, lo, hi, iterations=50, log=True)
    q_min = np.where(score(lo) >= 0, lo, q_min)
    return np.where(s_hi < 0, np.inf, q_min)


def _cleaning_notes(criteria, require, vertical, inc, q_min, levels, rate_bracket) -> list[Note]:
    notes = []
    if np.any(~vertical & (inc < LARSEN_RANGE[0])):
        notes.append(
            Note(
                "warning",
                "larsen_extrapolated",
                "Larsen-Pilehvari-Azar critical rate used between {vertical_limit:g}° and "
                "{larsen_low:g}°, below its stated range (45-60° is the hardest band).",
                "hole cleaning",
                values=(
                    Value("vertical_limit", float(criteria.vertical_limit)),
                    Value("larsen_low", float(LARSEN_RANGE[0])),
                ),
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


def hole_cleaning(
    well,
    fluid,
    q,
    *,
    rop,
    cuttings: Cuttings,
    method: str = "moore",
    criteria: CleaningCriteria | None = None,
    require: str = "adequate",
    rate_bracket: tuple[float, float] = RATE_BRACKET,
) -> HoleCleaningResult:
    """Hole cleaning in every annular interval of a well at flow rate(s) ``q``.

    For each interval: annular velocity, slip velocity (``method``), transport ratio, net rise
    velocity, in-situ cuttings concentration from ROP, bit size and rate, loaded density; the
    carrying capacity index for near-vertical intervals and the Larsen-Pilehvari-Azar critical
    rate for inclined ones; a verdict per interval against ``criteria``; the minimum rate for the
    ``require`` verdict in each interval (vectorised bisection on the rate) and the interval that
    controls it.

    Parameters
    ----------
    well : calc.geometry.Well
    fluid : calc.circulation.HydraulicsFluid
        Scalar density; the annulus model's (τ_y, K, n) are used.
    q : float or array_like
        Flow rate(s) [m³/s], > 0.  An array adds a leading axis to every per-interval array.
    rop : float
        Rate of penetration [m/s], ≥ 0.
    cuttings : Cuttings
    method : str
        Slip-velocity method (:data:`calc.cleaning.SLIP_METHODS`).
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
    Below ``criteria.vertical_limit`` (35°) the vertical criteria apply (transport ratio,
    concentration, CCI); at and above it the Larsen critical rate and the concentration — Larsen
    et al. is stated for 55-90°, so between 35° and 55° it is extrapolated (a note says so).
    Pipe rotation, eccentricity and cuttings beds are not modelled.

    References
    ----------
    See :mod:`calc.cleaning.slip`, :mod:`calc.cleaning.transport`, :mod:`calc.cleaning.indicators`.
    """
    criteria = CleaningCriteria() if criteria is None else criteria
    require = check_choice("require", require, ("adequate", "marginal"))
    qv = check_positive("flow rate", q, "m³/s")
    r = float(check_nonnegative("rate of penetration", rop, "m/s"))
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
    inc = np.asarray(a.inclination, dtype=float)
    vertical = inc < criteria.vertical_limit
    lar = larsen_critical_velocity(
        r, d2, d1, density=rho, k=params[1], tau_y=params[0], n=params[2],
        cuttings_size=cuttings.size, inclination=np.clip(inc, 0.0, 90.0),
    )  # fmt: skip
    setting = _Setting(
        d_hole=d2, d_pipe=d1, density=rho, params=params, cuttings=cuttings, rop=r,
        bit_diameter=float(well.bit.size), method=method,
        critical_rate=np.asarray(lar.critical_rate),
    )  # fmt: skip
    q_arr = np.asarray(qv, dtype=float)
    tr, cci, ratio = setting.evaluate(q_arr[..., None] if q_arr.ndim else q_arr)
    levels = verdict_levels(
        criteria, vertical, np.asarray(tr.transport_ratio), np.asarray(tr.concentration),
        np.asarray(cci.cci), ratio,
    )  # fmt: skip
    verdict = np.asarray(VERDICTS, dtype=object)[levels["overall"]]
    q_min = _minimum_rates(setting, criteria, require, vertical, rate_bracket)
    ctrl = int(np.argmax(q_min))
    notes = list(tr.notes) + list(cci.notes)
    notes += _cleaning_notes(criteria, require, vertical, inc, q_min, levels, rate_bracket)
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
        critical_ratio=scalar_or_array(ratio),
        levels=levels,
        verdict=verdict,
        minimum_rate=q_min,
        controlling_interval=spans[ctrl],
        controlling_rate=float(q_min[ctrl]),
        require=require,
        criteria=criteria,
        criteria_text=criteria.describe(),
        method=f"slip {tr.method}; CCI (Robinson); {lar.method}",
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
