"""Directional survey: stations (MD, inclination, azimuth) → TVD, north, east by minimum curvature.

Angles at this module's boundary are in **degrees** (inclination from vertical, azimuth from
north, clockwise); lengths are in metres.  Dogleg severity is returned in SI (rad/m) so that
:func:`calc.units.from_si` takes it to °/100 ft or °/30 m (kind ``"dogleg"``).
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.errors import InputError, check_finite, check_range
from calc.notes import Note
from calc.units import to_si
from calc.values import Value

__all__ = ["Survey"]

#: Dogleg severity above which a survey gets a warning note: 10°/100 ft (common practice,
#: calc/METHODS.md §16.3), stored in rad/m.
DOGLEG_WARN = to_si(10.0, "deg_per_100ft")
#: Inclination above which a note says the value is unusual (0–~120° usual: common
#: practice, calc/METHODS.md §16.3).
INCLINATION_WARN_DEG = 120.0
#: Below this dogleg angle [rad] the arc formulas use their straight-line limits.
_SMALL = 1e-12


def _tangent(inc_rad, azi_rad):
    """Unit tangent (north, east, down) for inclination and azimuth in radians."""
    s = np.sin(inc_rad)
    return np.stack([s * np.cos(azi_rad), s * np.sin(azi_rad), np.cos(inc_rad)], axis=-1)


def _dogleg(t1, t2):
    """Angle between unit tangents [rad], 2·asin(|t2 - t1|/2) (accurate for small angles)."""
    half = np.clip(np.linalg.norm(t2 - t1, axis=-1) / 2.0, 0.0, 1.0)
    return 2.0 * np.arcsin(half)


def _arc_weights(beta, frac):
    """Weights (w1, w2) so that the arc position is r1 + ΔMD·(w1·t1 + w2·t2).

    On a circular arc of dogleg β and length ΔMD, at the fraction s of its length (φ = sβ):
    r(φ) = r1 + ΔMD/(β sin β)·[(cos(β - φ) - cos β)·t1 + (1 - cos φ)·t2], evaluated without
    cancellation as w1 = 2 sin(β - φ/2) sin(φ/2)/(β sin β), w2 = 2 sin²(φ/2)/(β sin β).
    For β → 0 the limits are w1 = s - s²/2, w2 = s²/2 (a straight line).
    """
    small = beta < _SMALL
    b = np.where(small, 1.0, beta)
    phi = frac * b
    denom = b * np.sin(b)
    half = np.sin(phi / 2.0)
    w1 = 2.0 * np.sin(b - phi / 2.0) * half / denom
    w2 = 2.0 * half**2 / denom
    w1 = np.where(small, frac - frac**2 / 2.0, w1)
    w2 = np.where(small, frac**2 / 2.0, w2)
    return w1, w2


@dataclass(frozen=True, eq=False)
class Survey:
    """A directional survey evaluated by the minimum-curvature method.

    Between stations the well path is the circular arc joining the two tangent directions:

    ΔN = ΔMD/2·(sin I₁ cos A₁ + sin I₂ cos A₂)·RF,  ΔE = ΔMD/2·(sin I₁ sin A₁ + sin I₂ sin A₂)·RF,
    ΔTVD = ΔMD/2·(cos I₁ + cos I₂)·RF,  RF = (2/β)·tan(β/2),

    with β the dogleg angle between the station tangents.

    Parameters
    ----------
    md : array_like
        Measured depths of the stations [m], strictly increasing, ≥ 0.
    inclination : array_like
        Inclination from vertical at each station [degree], in [0, 180].
    azimuth : array_like
        Azimuth from north, clockwise [degree], in [0, 360).
    tie_in_tvd : float, optional
        TVD of the first station [m]; default its MD (a vertical path above the first station).
    reported_tvd : array_like, optional
        TVDs listed with the survey [m], checked (never used): TVD > MD is an
        :class:`~calc.errors.InputError`, a difference from minimum curvature above
        ``max(0.3 m, 0.05 % of MD)`` gives a warning note.

    Attributes
    ----------
    tvd, north, east : numpy.ndarray
        Station coordinates [m].
    dogleg : numpy.ndarray
        Dogleg angle of each segment [degree] (one fewer than stations).
    dogleg_severity : numpy.ndarray
        Dogleg angle per length of each segment [rad/m] (SI; ``from_si(x, "deg_per_100ft")``).
    notes : tuple of Note
        Doglegs above 10°/100 ft (common practice), inclinations above 120°, TVD differences.

    Notes
    -----
    Below the last station the path is projected straight along the last tangent (the usual
    "projection to bit"); above the first station it is vertical.  Minimum curvature is exact
    for any path made of circular arcs between stations.

    References
    ----------
    .. [1] Bourgoyne, A.T., Millheim, K.K., Chenevert, M.E., Young, F.S. (1986). *Applied
       Drilling Engineering*, SPE Textbook Series 2, ch. 8 (directional surveying).
    .. [2] Sawaryn, S.J., Thorogood, J.L. (2005). A compendium of directional calculations
       based on the minimum curvature method. SPE Drilling & Completion 20(1), 24–36.

    Examples
    --------
    >>> s = Survey([0.0, 100.0], [0.0, 0.0], [0.0, 0.0])
    >>> float(s.tvd_at(50.0))
    50.0
    """

    md: np.ndarray
    inclination: np.ndarray
    azimuth: np.ndarray
    tie_in_tvd: float | None = None
    reported_tvd: np.ndarray | None = None
    tvd: np.ndarray = field(init=False, repr=False)
    north: np.ndarray = field(init=False, repr=False)
    east: np.ndarray = field(init=False, repr=False)
    dogleg: np.ndarray = field(init=False, repr=False)
    dogleg_severity: np.ndarray = field(init=False, repr=False)
    notes: tuple[Note, ...] = field(init=False, repr=False)

    def __post_init__(self):
        md, inc, azi = _stations(self.md, self.inclination, self.azimuth)
        t = _tangent(np.radians(inc), np.radians(azi))
        beta = _dogleg(t[:-1], t[1:])
        if np.any(beta > np.pi - 1e-6):
            k = int(np.flatnonzero(beta > np.pi - 1e-6)[0])
            raise InputError(
                f"dogleg between stations {k + 1} and {k + 2}",
                float(np.degrees(beta[k])),
                "< 180° (the arc between opposite directions is undefined)",
            )
        steps = np.diff(md)
        w1, w2 = _arc_weights(beta, 1.0)
        d = steps[:, None] * (w1[:, None] * t[:-1] + w2[:, None] * t[1:])
        tvd0 = md[0] if self.tie_in_tvd is None else float(self.tie_in_tvd)
        if tvd0 > md[0] + 1e-9:
            raise InputError(
                "survey tie-in TVD",
                tvd0,
                "<= first station MD {md}",
                kind="depth",
                values=(Value("md", float(md[0]), "depth"),),
            )
        pos = np.zeros((md.size, 3))
        pos[0, 2] = tvd0
        pos[1:] = pos[0] + np.cumsum(d, axis=0)
        dls = beta / steps
        notes = _station_notes(md, inc, dls)
        for name, value in (("md", md), ("inclination", inc), ("azimuth", azi)):
            value.setflags(write=False)
            object.__setattr__(self, name, value)
        for name, value in (
            ("tvd", pos[:, 2]),
            ("north", pos[:, 0]),
            ("east", pos[:, 1]),
            ("dogleg", np.degrees(beta)),
            ("dogleg_severity", dls),
        ):
            value = np.ascontiguousarray(value)
            value.setflags(write=False)
            object.__setattr__(self, name, value)
        if self.reported_tvd is not None:
            notes.extend(self._check_reported(check_finite("reported TVD", self.reported_tvd)))
        object.__setattr__(self, "notes", tuple(notes))

    def _check_reported(self, tvd_rep: np.ndarray) -> list[Note]:
        tvd_rep = tvd_rep.ravel()
        if tvd_rep.size != self.md.size:
            raise InputError(
                "reported TVD", tvd_rep.size, f"{self.md.size} values, one per station"
            )
        over = tvd_rep > self.md + 1e-6
        if np.any(over):
            k = int(np.flatnonzero(over)[0])
            raise InputError(
                "reported TVD",
                float(tvd_rep[k]),
                f"<= MD ({{md}} at station {k + 1})",
                problem="TVD greater than MD",
                kind="depth",
                values=(Value("md", float(self.md[k]), "depth"),),
            )
        tol = np.maximum(0.3, 5e-4 * self.md)
        diff = np.abs(tvd_rep - self.tvd)
        out = []
        for k in np.flatnonzero(diff > tol):
            out.append(
                Note(
                    "warning",
                    "tvd_mismatch",
                    "listed TVD {listed} at {md} differs from minimum curvature ({tvd}): check "
                    "the survey or the method used for the listing",
                    "survey",
                    values=(
                        Value("listed", float(tvd_rep[k]), "depth"),
                        Value("md", float(self.md[k]), "depth"),
                        Value("tvd", float(self.tvd[k]), "depth"),
                    ),
                )
            )
        return out

    # ---------------------------------------------------------------- evaluation along the path
    def _locate(self, md):
        mdv = check_finite("MD", md)
        if np.any(mdv < 0):
            raise InputError("MD", float(mdv[mdv < 0].ravel()[0]), ">= 0 m")
        return mdv

    def position_at(self, md):
        """(north, east, tvd) [m] at measured depth(s) ``md`` [m], on the arcs between stations.

        Returns an array of shape ``np.shape(md) + (3,)``.
        """
        mdv = self._locate(md)
        n = self.md.size
        t = _tangent(np.radians(self.inclination), np.radians(self.azimuth))
        pos = np.stack([self.north, self.east, self.tvd], axis=-1)
        if n == 1:
            seg = np.zeros(mdv.shape, dtype=int)
        else:
            seg = np.clip(np.searchsorted(self.md, mdv, side="right") - 1, 0, n - 2)
        out = np.empty((*mdv.shape, 3))
        above = mdv < self.md[0]
        below = mdv > self.md[-1]
        inside = ~(above | below)
        # above the first station: vertical
        out[above] = pos[0] + (mdv[above] - self.md[0])[:, None] * np.array([0.0, 0.0, 1.0])
        # below the last station: straight along the last tangent
        out[below] = pos[-1] + (mdv[below] - self.md[-1])[:, None] * t[-1]
        if n > 1 and np.any(inside):
            k = seg[inside]
            dmd = self.md[k + 1] - self.md[k]
            frac = (mdv[inside] - self.md[k]) / dmd
            beta = np.radians(self.dogleg[k])
            w1, w2 = _arc_weights(beta, frac)
            out[inside] = pos[k] + dmd[:, None] * (w1[:, None] * t[k] + w2[:, None] * t[k + 1])
        elif np.any(inside):
            out[inside] = pos[0]
        return out

    def tvd_at(self, md):
        """True vertical depth [m] at measured depth(s) ``md`` [m] (scalar in → float out)."""
        out = self.position_at(md)[..., 2]
        return float(out) if out.ndim == 0 else out

    def inclination_at(self, md):
        """Inclination [degree] at ``md`` [m] on the arcs between stations.

        Arc tangent t(φ) = [sin(β - φ)·t₁ + sin φ·t₂]/sin β, cos I = t_z.
        """
        mdv = self._locate(md)
        n = self.md.size
        if n == 1:
            out = np.full(mdv.shape, self.inclination[0])
            return float(out) if out.ndim == 0 else out
        t = _tangent(np.radians(self.inclination), np.radians(self.azimuth))
        k = np.clip(np.searchsorted(self.md, mdv, side="right") - 1, 0, n - 2)
        dmd = self.md[k + 1] - self.md[k]
        frac = np.clip((mdv - self.md[k]) / dmd, 0.0, 1.0)
        beta = np.radians(self.dogleg[k])
        small = beta < _SMALL
        b = np.where(small, 1.0, beta)
        a1 = np.where(small, 1.0 - frac, np.sin((1.0 - frac) * b) / np.sin(b))
        a2 = np.where(small, frac, np.sin(frac * b) / np.sin(b))
        tz = a1 * t[k, 2] + a2 * t[k + 1, 2]
        norm = np.linalg.norm(a1[..., None] * t[k] + a2[..., None] * t[k + 1], axis=-1)
        out = np.degrees(np.arccos(np.clip(tz / norm, -1.0, 1.0)))
        out = np.where(mdv < self.md[0], 0.0, out)
        out = np.where(mdv > self.md[-1], self.inclination[-1], out)
        return float(out) if out.ndim == 0 else out


def _stations(md, inclination, azimuth) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The survey columns as float arrays: finite, equally long, MD ≥ 0 and strictly
    increasing, inclination in [0, 180]°, azimuth in [0, 360)°."""
    md = check_finite("survey MD", md).astype(float).ravel()
    inc = check_finite("survey inclination", inclination).astype(float).ravel()
    azi = check_finite("survey azimuth", azimuth).astype(float).ravel()
    if md.size == 0:
        raise InputError("survey stations", 0, "at least one station (MD, inclination, azimuth)")
    if not (md.size == inc.size == azi.size):
        raise InputError(
            "survey columns",
            (md.size, inc.size, azi.size),
            "MD, inclination and azimuth lists of the same length",
        )
    if md[0] < 0:
        raise InputError("survey MD", float(md[0]), ">= 0 m")
    steps = np.diff(md)
    if np.any(steps <= 0):
        k = int(np.flatnonzero(steps <= 0)[0])
        raise InputError(
            f"survey MD at station {k + 2}",
            float(md[k + 1]),
            "strictly increasing MD (previous station {previous})",
            kind="depth",
            values=(Value("previous", float(md[k]), "depth"),),
        )
    check_range("survey inclination", inc, 0.0, 180.0, "degree")
    check_range("survey azimuth", azi, 0.0, 360.0, "degree", hi_open=True)
    return md, inc, azi


def _station_notes(md: np.ndarray, inc: np.ndarray, dls: np.ndarray) -> list[Note]:
    """Doubtful stations: doglegs above DOGLEG_WARN, inclinations above INCLINATION_WARN_DEG."""
    notes: list[Note] = []
    for k in np.flatnonzero(dls > DOGLEG_WARN):
        notes.append(
            Note(
                "warning",
                "high_dogleg",
                "dogleg {dls:.1f} between {top} and {bottom} exceeds {limit:.0f} "
                "(common practice): check the survey",
                "survey",
                values=(
                    Value("dls", float(dls[k]), "dogleg"),
                    Value("top", float(md[k]), "depth"),
                    Value("bottom", float(md[k + 1]), "depth"),
                    Value("limit", float(DOGLEG_WARN), "dogleg"),
                ),
            )
        )
    for k in np.flatnonzero(inc > INCLINATION_WARN_DEG):
        notes.append(
            Note(
                "warning",
                "unusual_inclination",
                "inclination {inc:g}° at {md} is above 120°: check it is not an azimuth or "
                "a typing error",
                "survey",
                values=(Value("inc", float(inc[k])), Value("md", float(md[k]), "depth")),
            )
        )
    return notes
