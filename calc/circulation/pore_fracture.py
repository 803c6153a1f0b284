"""The pressure window (pore and fracture EMW versus TVD), weak points and user margins.

Pore and fracture pressures are given as equivalent mud weights (EMW, kg/m³) at stations of
true vertical depth and interpolated linearly in TVD between the stations; above the first and
below the last station the end value is held (and :func:`calc.circulation.circulate` puts a
note on the result when it had to do that).  A :class:`WeakPoint` is a named depth (measured
depth) with its own fracture EMW (a shoe test, a depleted sand) and optionally a pore EMW; at
that depth it takes precedence over the window.

Not to be confused with :mod:`calc.window`, the operating window of *flow rates*.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Literal

import numpy as np

from calc.errors import InputError, check_nonnegative, check_positive
from calc.numeric import float_or_array
from calc.span import Span
from calc.values import Value

__all__ = [
    "CHECK_POINT_ROLES",
    "MARGIN_STATES",
    "CheckPoint",
    "MarginTable",
    "Margins",
    "PressureWindow",
    "TightestPoint",
    "WeakPoint",
    "as_plain",
    "fracture_margin",
    "limits_at",
    "margin_status",
    "pore_margin",
    "tabulate_margins",
    "worst_status",
]


@dataclass(frozen=True, eq=False)
class PressureWindow:
    """Pore and fracture pressure as EMW versus TVD.

    .. math:: \\rho_{pore}(h) = \\mathrm{interp}(h;\\ h_i, \\rho_{pore,i}),\\quad
              \\rho_{frac}(h) = \\mathrm{interp}(h;\\ h_i, \\rho_{frac,i})

    Parameters
    ----------
    tvd : array_like
        Station true vertical depths [m], ≥ 0 and strictly increasing.
    pore : array_like
        Pore-pressure EMW at each station [kg/m³], > 0.
    fracture : array_like
        Fracture-pressure EMW at each station [kg/m³], > pore at every station.

    Notes
    -----
    Linear interpolation in TVD; constant extrapolation outside the stations (see
    :meth:`covers`).  A single station gives a constant window.

    Examples
    --------
    >>> w = PressureWindow([1000.0, 2000.0], [1050.0, 1250.0], [1600.0, 1800.0])
    >>> w.pore_at(1500.0), w.fracture_at(2500.0)
    (1150.0, 1800.0)
    """

    tvd: np.ndarray
    pore: np.ndarray
    fracture: np.ndarray

    def __post_init__(self):
        tvd = np.atleast_1d(check_nonnegative("pressure window TVD", self.tvd, "m"))
        pore = np.atleast_1d(check_positive("pore EMW", self.pore, "kg/m³"))
        frac = np.atleast_1d(check_positive("fracture EMW", self.fracture, "kg/m³"))
        if tvd.ndim != 1 or pore.shape != tvd.shape or frac.shape != tvd.shape:
            raise InputError(
                "pressure window",
                f"{tvd.size} TVD, {pore.size} pore, {frac.size} fracture values",
                "one pore and one fracture EMW per TVD station",
            )
        if tvd.size > 1 and np.any(np.diff(tvd) <= 0):
            bad = int(np.flatnonzero(np.diff(tvd) <= 0)[0]) + 1
            raise InputError("pressure window TVD", float(tvd[bad]), "strictly increasing depths")
        if np.any(pore >= frac):
            i = int(np.flatnonzero(pore >= frac)[0])
            raise InputError(
                f"pore EMW at TVD station {i + 1}",
                float(pore[i]),
                "< fracture EMW there ({fracture}; station TVD {tvd})",
                kind="density",
                values=(
                    Value("fracture", float(frac[i]), "density"),
                    Value("tvd", float(tvd[i]), "depth"),
                ),
            )
        for name, arr in (("tvd", tvd), ("pore", pore), ("fracture", frac)):
            arr.setflags(write=False)
            object.__setattr__(self, name, arr)

    def pore_at(self, tvd):
        """Pore EMW [kg/m³] at TVD [m] (linear between stations, end values held)."""
        return float_or_array(np.interp(np.asarray(tvd, dtype=float), self.tvd, self.pore))

    def fracture_at(self, tvd):
        """Fracture EMW [kg/m³] at TVD [m] (linear between stations, end values held)."""
        return float_or_array(np.interp(np.asarray(tvd, dtype=float), self.tvd, self.fracture))

    def covers(self, tvd):
        """True where ``tvd`` [m] lies within the first and last stations (no extrapolation)."""
        t = np.asarray(tvd, dtype=float)
        res = (t >= self.tvd[0]) & (t <= self.tvd[-1])
        return bool(res) if res.ndim == 0 else res


@dataclass(frozen=True)
class WeakPoint:
    """A named depth with its own limits (shoe test, depleted sand …).

    Parameters
    ----------
    name : str
        Label shown in results ("9-5/8 in shoe").
    md : float
        Measured depth [m], ≥ 0.
    fracture : float
        Fracture (or shoe-test) EMW [kg/m³], > 0.
    pore : float or None
        Pore EMW [kg/m³] if known (< fracture); None → taken from the window.
    """

    name: str
    md: float
    fracture: float
    pore: float | None = None

    def __post_init__(self):
        if not isinstance(self.name, str) or not self.name.strip():
            raise InputError("weak point name", self.name, "a non-empty text")
        object.__setattr__(self, "md", float(check_nonnegative(f"{self.name}: md", self.md, "m")))
        frac = float(check_positive(f"{self.name}: fracture EMW", self.fracture, "kg/m³"))
        object.__setattr__(self, "fracture", frac)
        if self.pore is not None:
            pore = float(check_positive(f"{self.name}: pore EMW", self.pore, "kg/m³"))
            if pore >= frac:
                raise InputError(
                    f"{self.name}: pore EMW",
                    pore,
                    "< fracture EMW ({fracture})",
                    kind="density",
                    values=(Value("fracture", frac, "density"),),
                )
            object.__setattr__(self, "pore", pore)


@dataclass(frozen=True)
class Margins:
    """The user's required margins [kg/m³] (programme values; all user-settable).

    Parameters
    ----------
    fracture : float
        ECD must stay at least this far below the fracture EMW (0.5 ppg ≈ 59.9 kg/m³ is a
        customary value, common practice — calc/METHODS.md §16.5; default 0: only crossing is
        flagged).
    pore : float
        ECD must stay at least this far above the pore EMW (default 0).
    """

    fracture: float = 0.0
    pore: float = 0.0

    def __post_init__(self):
        object.__setattr__(
            self, "fracture", float(check_nonnegative("fracture margin", self.fracture, "kg/m³"))
        )
        object.__setattr__(
            self, "pore", float(check_nonnegative("pore margin", self.pore, "kg/m³"))
        )


#: Kinds of margin check point (:attr:`CheckPoint.role`).
CHECK_POINT_ROLES = ("depth", "shoe", "bit", "window_station", "weak_point")


@dataclass(frozen=True)
class CheckPoint:
    """One depth where the margins are checked.

    ``role`` says what it is: ``"depth"`` (a point of the depth grid, no name), ``"shoe"``
    (the last casing or liner shoe, or a weak point there), ``"bit"``, ``"window_station"``
    (a station of the pressure window, at its TVD) or ``"weak_point"``; ``name`` is the
    shoe's, weak point's or ``"bit"`` ("" for grid points and window stations); ``md``,
    ``tvd`` [m].  The faces turn it into words (``addin.text.check_point``).

    Examples
    --------
    >>> p = CheckPoint("shoe", "9-5/8 in shoe", 1500.0, 1480.0).place
    >>> p.path, p.item, p.top_md, p.bottom_md
    ('annulus', '9-5/8 in shoe', 1500.0, 1500.0)
    """

    role: Literal["depth", "shoe", "bit", "window_station", "weak_point"]
    name: str
    md: float
    tvd: float

    def __post_init__(self):
        if self.role not in CHECK_POINT_ROLES:
            raise ValueError(f"check point role {self.role!r} not in {CHECK_POINT_ROLES}")

    @property
    def place(self) -> Span:
        """The point as a :class:`~calc.span.Span` in the annulus (top = bottom), for notes."""
        return Span(
            "annulus",
            self.name or ("window station" if self.role == "window_station" else ""),
            top_md=self.md,
            bottom_md=self.md,
            top_tvd=self.tvd,
            bottom_tvd=self.tvd,
        )


@dataclass(frozen=True)
class TightestPoint:
    """Where the ECD comes closest to a limit.

    ``point`` the :class:`CheckPoint`; ``md``, ``tvd`` its depths [m]; ``margin`` [kg/m³]
    (limit distance, fracture − ECD or ECD − pore, :func:`fracture_margin` /
    :func:`pore_margin`); ``limit`` ``"fracture"`` or ``"pore"``; ``required`` the user's margin
    for that limit [kg/m³].  For a sweep every field is an array over the sweep (``point`` and
    ``limit`` object arrays).
    """

    point: CheckPoint | np.ndarray
    md: float | np.ndarray
    tvd: float | np.ndarray
    margin: float | np.ndarray
    limit: str | np.ndarray
    required: float | np.ndarray


@dataclass(frozen=True, eq=False)
class MarginTable:
    """Margins at the check points (exposed formation: last shoe to the bit, weak points).

    ``points`` (:class:`CheckPoint`), ``md``, ``tvd`` [m]: the check points; ``pore``,
    ``fracture``: limits there [kg/m³]; ``ecd``, ``esd`` [kg/m³]; ``fracture_margin`` =
    fracture − ECD; ``pore_margin`` = ECD − pore; ``static_pore_margin`` = ESD − pore (all
    [kg/m³], leading sweep axes, last axis the points).
    """

    points: tuple[CheckPoint, ...]
    md: np.ndarray
    tvd: np.ndarray
    pore: np.ndarray
    fracture: np.ndarray
    ecd: np.ndarray
    esd: np.ndarray
    fracture_margin: np.ndarray
    pore_margin: np.ndarray
    static_pore_margin: np.ndarray
    tightest: TightestPoint
    margins: Margins = field(default_factory=Margins)

    def index(self, role: str) -> int | None:
        """Index of the first check point of ``role`` ("shoe", "bit" …), None if there is none."""
        return next((i for i, p in enumerate(self.points) if p.role == role), None)


def fracture_margin(fracture, ecd):
    """Margin to fracture [kg/m³]: fracture EMW − ECD (positive = below the fracture limit).

    The one definition the results, the report and the operating window use.

    Examples
    --------
    ECD 11.8 ppg under a 13.0 ppg fracture gradient: 1.2 ppg of margin:

    >>> from calc.units import from_si, to_si
    >>> round(float(from_si(fracture_margin(to_si(13.0, "ppg"), to_si(11.8, "ppg")), "ppg")), 6)
    1.2
    """
    return np.asarray(fracture, dtype=float) - np.asarray(ecd, dtype=float)


def pore_margin(ecd, pore):
    """Margin to pore pressure [kg/m³]: ECD (or ESD) − pore EMW (positive = above the pore
    limit).

    Examples
    --------
    ECD 11.8 ppg over a 10.9 ppg pore pressure: 0.9 ppg of margin:

    >>> from calc.units import from_si, to_si
    >>> round(float(from_si(pore_margin(to_si(11.8, "ppg"), to_si(10.9, "ppg")), "ppg")), 6)
    0.9
    """
    return np.asarray(ecd, dtype=float) - np.asarray(pore, dtype=float)


#: Margin states, best first (:func:`margin_status`).
MARGIN_STATES = ("ok", "near_limit", "exceeded")


def margin_status(margin: float, required: float | None = None) -> str:
    """State of a margin [kg/m³ or Pa]: ``"exceeded"`` below 0 (limit crossed),
    ``"near_limit"`` below the required margin, else ``"ok"``.

    Examples
    --------
    >>> margin_status(-1.0), margin_status(20.0, 50.0), margin_status(80.0, 50.0)
    ('exceeded', 'near_limit', 'ok')
    """
    if margin < 0:
        return "exceeded"
    if required is not None and margin < required:
        return "near_limit"
    return "ok"


def worst_status(*states: str) -> str:
    """The worst of several :func:`margin_status` states.

    Examples
    --------
    >>> worst_status("ok", "near_limit", "ok"), worst_status("near_limit", "exceeded")
    ('near_limit', 'exceeded')
    """
    return max(states, key=MARGIN_STATES.index)


def as_plain(v):
    """numpy scalars and 0-d arrays → Python scalars; other arrays unchanged."""
    if isinstance(v, np.ndarray):
        return v.item() if v.ndim == 0 else v
    return v.item() if isinstance(v, np.generic) else v


def limits_at(md, tvd, names, window: PressureWindow | None, weak_points=()):
    """Pore and fracture EMW at check points; weak points override the window at their MD.

    ``names`` are the check points' names (a weak point applies where its name is).  Returns
    ``(pore, fracture)`` arrays [kg/m³]; where neither a window nor a weak point gives a value
    the entry is ``inf`` (fracture) / ``0`` (pore): no limit.

    Examples
    --------
    The window interpolates in TVD; a weak point at its check point overrides the fracture EMW:

    >>> w = PressureWindow([1000.0, 2000.0], [1050.0, 1250.0], [1600.0, 1800.0])
    >>> sand = WeakPoint("Sand B", 1500.0, 1550.0)
    >>> pore, frac = limits_at([1500.0, 1500.0], [1500.0, 1500.0], ["", "Sand B"], w, [sand])
    >>> pore.tolist(), frac.tolist()
    ([1150.0, 1150.0], [1700.0, 1550.0])
    """
    md = np.asarray(md, dtype=float)
    tvd = np.asarray(tvd, dtype=float)
    if window is not None:
        pore = np.asarray(window.pore_at(tvd), dtype=float).copy()
        frac = np.asarray(window.fracture_at(tvd), dtype=float).copy()
    else:
        pore = np.zeros_like(tvd)
        frac = np.full_like(tvd, np.inf)
    for wp in weak_points:
        at = np.array([n == wp.name for n in names])
        frac[at] = wp.fracture
        if wp.pore is not None:
            pore[at] = wp.pore
    return pore, frac


def tabulate_margins(
    points, md, tvd, pore, fracture, ecd, esd, margins: Margins, ecd_pore=None
) -> MarginTable:
    """Margins at every check point and the tightest one.

    .. math:: m_{frac} = \\rho_{frac} - \\mathrm{ECD},\\quad
              m_{pore} = \\mathrm{ECD}_{pore} - \\rho_{pore}

    The tightest point is the smallest of the two margins over all points (plain distance to the
    limit, not reduced by the required margin; ``required`` is reported beside it).  ``ecd`` and
    ``esd`` carry leading sweep axes; the last axis runs over the points.  ``ecd_pore`` is the
    ECD the pore margin is taken from (default ``ecd``): the cuttings-loaded table
    (:func:`calc.cleaning.loaded_margins`) takes the fracture margin from the loaded ECD and the
    pore margin from the clean ECD, the lower (conservative) value on each side.

    Examples
    --------
    Shoe and bit: the shoe has 100 kg/m³ to fracture, the bit 150 kg/m³ to pore and 250 to
    fracture, so the shoe's fracture margin is the tightest:

    >>> pts = (CheckPoint("shoe", "shoe", 1500.0, 1500.0), CheckPoint("bit", "bit", 3000.0, 3000.0))
    >>> t = tabulate_margins(pts, [1500.0, 3000.0], [1500.0, 3000.0],
    ...                      pore=[1100.0, 1250.0], fracture=[1500.0, 1650.0],
    ...                      ecd=[1400.0, 1400.0], esd=[1380.0, 1370.0], margins=Margins(60.0))
    >>> t.fracture_margin.tolist(), t.pore_margin.tolist()
    ([100.0, 250.0], [300.0, 150.0])
    >>> t.tightest.point.name, t.tightest.limit, t.tightest.margin, t.index("bit")
    ('shoe', 'fracture', 100.0, 1)

    With a separate ECD for the pore side:

    >>> t = tabulate_margins(("a",), [100.0], [100.0], [1000.0], [1500.0], [1300.0], [1250.0],
    ...                      Margins(), ecd_pore=[1200.0])
    >>> float(t.fracture_margin[0]), float(t.pore_margin[0]), float(t.static_pore_margin[0])
    (200.0, 200.0, 250.0)
    """
    ecd = np.asarray(ecd, dtype=float)
    esd = np.asarray(esd, dtype=float)
    fm = fracture_margin(fracture, ecd)
    pm = pore_margin(ecd if ecd_pore is None else np.asarray(ecd_pore, dtype=float), pore)
    spm = pore_margin(esd, pore)
    both = np.stack([fm, pm], axis=-2)  # (..., 2, P)
    flat = both.reshape((*both.shape[:-2], -1))
    idx = np.argmin(flat, axis=-1)
    which, point = np.divmod(idx, fm.shape[-1])
    margin = np.take_along_axis(flat, idx[..., None], axis=-1)[..., 0]
    points_arr = np.empty(len(points), dtype=object)
    points_arr[:] = list(points)
    limit_arr = np.array(["fracture", "pore"], dtype=object)
    req = np.array([margins.fracture, margins.pore])

    def pick(a, i):
        return as_plain(np.asarray(a)[i])

    tight = TightestPoint(
        point=as_plain(points_arr[point]),
        md=pick(md, point),
        tvd=pick(tvd, point),
        margin=as_plain(margin),
        limit=pick(limit_arr, which),
        required=pick(req, which),
    )
    return MarginTable(
        points=tuple(points),
        md=md,
        tvd=tvd,
        pore=pore,
        fracture=fracture,
        ecd=ecd,
        esd=esd,
        fracture_margin=fm,
        pore_margin=pm,
        static_pore_margin=spm,
        tightest=tight,
        margins=margins,
    )
