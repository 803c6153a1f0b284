"""The fluid train of a cement job and where each fluid is, by volume (calc/METHODS.md §24).

Positions are kept as a *path volume* ``s`` [m³]: 0 at the top of the string, growing down the
string to the shoe (``s = V_string``) and on up the annulus to surface (``s = V_total``).
The fluids move as plugs of constant volume: interfaces move by volume, without mixing,
channelling or contamination (an assumption, calc/METHODS.md §24.1).  With ``P`` the volume
pumped and ``R`` the volume returned at surface, the interface that entered the string when
``P_j`` had been pumped is at

.. math:: s_j = R - P_j

(the liquid above it entered later; a string not full of liquid has its liquid top at
``s = R - P > 0``, the free-fall gap).  Positions in measured depth follow from the segments'
flow areas; TVD from the survey, so hydrostatic columns are exact for the survey's path.
"""

from __future__ import annotations

import itertools
from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np

from calc.circulation.hydrostatics import gravity_for
from calc.errors import InputError, check_finite, check_positive
from calc.flow.area import cross_section_area
from calc.geometry.hole import Hole
from calc.geometry.survey import Survey
from calc.numeric import float_or_array
from calc.values import Value

__all__ = [
    "FLUID_ROLES",
    "FluidTrain",
    "PlacementFluid",
    "PlacementGeometry",
    "liner_job_geometry",
    "train_hydrostatic",
]

#: What each fluid of a train is: the mud in the well before the job, a spacer or wash, a
#: cement slurry, the displacement fluid behind the top plug.
FLUID_ROLES = ("mud", "spacer", "slurry", "displacement")


@dataclass(frozen=True)
class PlacementFluid:
    """One fluid of the train: density and the friction model parameters in pipe and annulus.

    Parameters
    ----------
    name : str
    role : {"mud", "spacer", "slurry", "displacement"}
    density : float
        [kg/m³], > 0.
    pipe, annulus : tuple of float
        (τ_y [Pa], K [Pa·sⁿ], n [-]) the friction law takes (``calc.circulation.model_parameters``
        of the fitted model).

    Examples
    --------
    >>> PlacementFluid("water", "spacer", 1000.0, (0.0, 0.001, 1.0), (0.0, 0.001, 1.0)).density
    1000.0
    """

    name: str
    role: str
    density: float
    pipe: tuple[float, float, float]
    annulus: tuple[float, float, float]

    def __post_init__(self):
        if self.role not in FLUID_ROLES:
            raise InputError(f"{self.name}: role", self.role, f"one of {', '.join(FLUID_ROLES)}")
        object.__setattr__(
            self, "density", float(check_positive(f"{self.name}: density", self.density, "kg/m³"))
        )
        for leg in ("pipe", "annulus"):
            ty, k, n = (float(x) for x in getattr(self, leg))
            if not (np.isfinite(ty) and ty >= 0 and k > 0 and n > 0):
                raise InputError(
                    f"{self.name}: {leg} rheology", (ty, k, n), "τ_y ≥ 0 Pa, K > 0, n > 0"
                )
            object.__setattr__(self, leg, (ty, k, n))


@dataclass(frozen=True, eq=False)
class PlacementGeometry:
    """The flow path of a placement: string segments (surface → shoe), then annulus segments
    (shoe → surface), with path volumes.

    Attributes (arrays, one per segment in flow order)
    ---------------------------------------------------
    leg : ndarray of str — ``"string"`` or ``"annulus"``
    md_start, md_end : measured depth where the flow enters/leaves the segment [m]
    d_outer, d_inner : flow-path diameters [m] (d_inner 0 in the string)
    area : flow area [m³/m]; ``s_start``, ``s_end`` path volume at the ends [m³]
    survey : Survey (TVD of any MD); ``shoe_md``, ``float_collar_md``, ``hole_depth`` [m]

    Examples
    --------
    >>> g = PlacementGeometry(Survey([0.0, 1000.0], [0.0, 0.0], [0.0, 0.0]),
    ...     [("string", 0.0, 1000.0, 0.1, 0.0), ("annulus", 1000.0, 0.0, 0.2, 0.12)], 1000.0)
    >>> round(g.string_volume, 4), round(g.total_volume, 4)
    (7.854, 27.9602)
    """

    survey: Survey
    segments: Sequence[tuple[str, float, float, float, float]]
    shoe_md: float
    float_collar_md: float | None = None
    hole_depth: float | None = None
    leg: np.ndarray = field(init=False, repr=False)
    md_start: np.ndarray = field(init=False, repr=False)
    md_end: np.ndarray = field(init=False, repr=False)
    d_outer: np.ndarray = field(init=False, repr=False)
    d_inner: np.ndarray = field(init=False, repr=False)
    area: np.ndarray = field(init=False, repr=False)
    s_start: np.ndarray = field(init=False, repr=False)
    s_end: np.ndarray = field(init=False, repr=False)

    def __post_init__(self):
        segs = list(self.segments)
        if not segs:
            raise InputError("placement segments", segs, "at least one string and annulus segment")
        leg = np.array([s[0] for s in segs])
        a, b, do, di = (np.array([float(s[i]) for s in segs]) for i in range(1, 5))
        if np.any(do <= di) or np.any(do <= 0) or np.any(di < 0):
            raise InputError(
                "placement segment diameters",
                (do.tolist(), di.tolist()),
                "0 ≤ inner < outer diameter",
            )
        area = cross_section_area(do, di)
        vol = area * np.abs(b - a)
        s_end = np.cumsum(vol)
        shoe = float(check_finite("shoe MD", self.shoe_md, "m"))
        fc = shoe if self.float_collar_md is None else float(self.float_collar_md)
        if not 0.0 < fc <= shoe:
            raise InputError(
                "float collar MD",
                fc,
                "0 < float collar ≤ shoe MD {shoe}",
                kind="depth",
                values=(Value("shoe", shoe, "depth"),),
            )
        td = shoe if self.hole_depth is None else float(self.hole_depth)
        if td < shoe:
            raise InputError(
                "hole depth",
                td,
                "≥ the shoe MD {shoe}",
                kind="depth",
                values=(Value("shoe", shoe, "depth"),),
            )
        for name, val in (
            ("leg", leg),
            ("md_start", a),
            ("md_end", b),
            ("d_outer", do),
            ("d_inner", di),
            ("area", area),
            ("s_end", s_end),
            ("s_start", s_end - vol),
        ):
            val.setflags(write=False)
            object.__setattr__(self, name, val)
        object.__setattr__(self, "float_collar_md", fc)
        object.__setattr__(self, "hole_depth", td)
        object.__setattr__(self, "shoe_md", shoe)

    @property
    def string_volume(self) -> float:
        """Volume inside the string, surface to shoe [m³]."""
        return float(self.s_end[self.leg == "string"][-1])

    @property
    def total_volume(self) -> float:
        """String plus annulus volume [m³]."""
        return float(self.s_end[-1])

    @property
    def annulus_volume(self) -> float:
        """Annulus volume, shoe to surface [m³]."""
        return self.total_volume - self.string_volume

    def s_at(self, leg: str, md):
        """Path volume [m³] of a measured depth ``md`` [m] in ``leg``."""
        m = np.asarray(md, dtype=float)
        idx = np.flatnonzero(self.leg == leg)
        out = np.full(m.shape, np.nan)
        for i in idx:  # few segments; each point lies in one
            a, b = self.md_start[i], self.md_end[i]
            lo, hi = min(a, b), max(a, b)
            inside = (m >= lo) & (m <= hi) & np.isnan(out)
            out = np.where(inside, self.s_start[i] + self.area[i] * np.abs(m - a), out)
        if np.any(np.isnan(out)):
            raise InputError(f"{leg} MD", float(m.flat[0]), "a depth on that path")
        return float_or_array(out)

    @property
    def float_collar_s(self) -> float:
        """Path volume of the float collar (where the top plug lands) [m³]."""
        return float(self.s_at("string", self.float_collar_md))

    def md_of(self, s):
        """(segment index, MD [m]) of path volume(s) ``s`` [m³] (clipped to the path)."""
        s = np.clip(np.asarray(s, dtype=float), 0.0, self.total_volume)
        i = np.clip(np.searchsorted(self.s_end, s, side="left"), 0, self.leg.size - 1)
        frac = (s - self.s_start[i]) / self.area[i]
        sign = np.sign(self.md_end[i] - self.md_start[i])
        return i, self.md_start[i] + sign * frac

    def columns(self, lo, hi):
        """Length [m] and vertical height [m] of the path between volumes ``lo`` and ``hi``
        inside each segment: arrays of shape ``lo.shape + (segments,)``."""
        lo = np.asarray(lo, dtype=float)[..., None]
        hi = np.asarray(hi, dtype=float)[..., None]
        a = np.clip(lo, self.s_start, self.s_end)
        b = np.clip(hi, self.s_start, self.s_end)
        b = np.maximum(a, b)
        sign = np.sign(self.md_end - self.md_start)
        md_a = self.md_start + sign * (a - self.s_start) / self.area
        md_b = self.md_start + sign * (b - self.s_start) / self.area
        lo_md = np.minimum(self.md_start, self.md_end)
        hi_md = np.maximum(self.md_start, self.md_end)
        md_a, md_b = np.clip(md_a, lo_md, hi_md), np.clip(md_b, lo_md, hi_md)  # rounding
        length = np.abs(md_b - md_a)
        tvd_a = np.asarray(self.survey.tvd_at(md_a), dtype=float)
        tvd_b = np.asarray(self.survey.tvd_at(md_b), dtype=float)
        return length, np.abs(tvd_b - tvd_a)


def liner_job_geometry(
    survey: Survey,
    hole: Hole,
    *,
    pipe_od: float,
    pipe_id: float,
    liner_od: float,
    liner_id: float,
    liner_top: float,
    shoe: float,
    float_collar: float | None = None,
    split_md: Sequence[float] = (),
) -> PlacementGeometry:
    """The flow path of a liner run on drill pipe: pipe to the liner top, liner to the shoe;
    annulus liner × hole (open hole and casing overlap), then pipe × casing to surface.

    Segments break at every hole-section boundary and at ``split_md`` (check points), so a
    check point is always a segment end.  Tool joints of the running string are left out (body
    only: the volume between pipe and casing above the liner top is a few tenths of a per cent
    larger than with joints).

    Examples
    --------
    >>> from calc.geometry import HoleSection
    >>> from calc.units import to_si
    >>> sv = Survey([0.0, 3000.0], [0.0, 0.0], [0.0, 0.0])
    >>> hole = Hole.from_casing([HoleSection("csg", 0.0, 2000.0, 0.2244)], 3000.0,
    ...                         bit_size=0.2159)
    >>> g = liner_job_geometry(sv, hole, pipe_od=0.127, pipe_id=0.1086, liner_od=0.1778,
    ...                        liner_id=0.1571, liner_top=1800.0, shoe=2990.0)
    >>> [(s[1], s[2], round(s[3], 4)) for s in g.segments if s[0] == "annulus"]
    [(2990.0, 2000.0, 0.2159), (2000.0, 1800.0, 0.2244), (1800.0, 0.0, 0.2244)]
    """
    vals = {}
    for name, v in (
        ("pipe OD", pipe_od),
        ("pipe ID", pipe_id),
        ("liner OD", liner_od),
        ("liner ID", liner_id),
        ("liner top", liner_top),
        ("shoe", shoe),
    ):
        vals[name] = float(check_positive(name, v, "m"))
    if vals["pipe ID"] >= vals["pipe OD"]:
        raise InputError(
            "pipe ID",
            pipe_id,
            "< pipe OD {od}",
            kind="diameter",
            values=(Value("od", vals["pipe OD"], "diameter"),),
        )
    if vals["liner ID"] >= vals["liner OD"]:
        raise InputError(
            "liner ID",
            liner_id,
            "< liner OD {od}",
            kind="diameter",
            values=(Value("od", vals["liner OD"], "diameter"),),
        )
    if not vals["liner top"] < vals["shoe"] <= hole.depth:
        raise InputError(
            "liner shoe",
            shoe,
            "deeper than the liner top {top} and ≤ hole depth {td}",
            kind="depth",
            values=(Value("top", liner_top, "depth"), Value("td", hole.depth, "depth")),
        )
    breaks = sorted(
        {
            0.0,
            vals["liner top"],
            vals["shoe"],
            *hole.boundaries().tolist(),
            *[float(x) for x in split_md],
        }
    )
    breaks = [b for b in breaks if 0.0 <= b <= vals["shoe"]]
    segs: list[tuple[str, float, float, float, float]] = []
    for a, b in itertools.pairwise(breaks):
        d = vals["pipe ID"] if b <= vals["liner top"] else vals["liner ID"]
        segs.append(("string", a, b, d, 0.0))
    for a, b in itertools.pairwise(breaks[::-1]):
        mid = 0.5 * (a + b)
        d_hole = float(hole.diameter_at(mid))
        d_in = vals["pipe OD"] if mid < vals["liner top"] else vals["liner OD"]
        if d_in >= d_hole:
            raise InputError(
                "liner/pipe OD",
                d_in,
                f"< the hole or casing ID {{hole}} at {mid:.0f} m",
                kind="diameter",
                values=(Value("hole", d_hole, "diameter"),),
            )
        segs.append(("annulus", a, b, d_hole, d_in))
    return PlacementGeometry(survey, tuple(segs), vals["shoe"], float_collar, hole.depth)


@dataclass(frozen=True, eq=False)
class FluidTrain:
    """The mud in the well, then the pumped fluids in order (the last one the displacement,
    pumped until the plug bumps).

    ``volumes`` [m³] of the pumped fluids but the displacement (its volume follows from the
    plug).  ``start``, ``end``: cumulative pumped volume at which each fluid starts and ends
    entering the string (the mud: −∞ to 0; the displacement: to +∞).

    Examples
    --------
    >>> w = (0.0, 0.001, 1.0)
    >>> t = FluidTrain((PlacementFluid("mud", "mud", 1200.0, w, w),
    ...                 PlacementFluid("cement", "slurry", 1900.0, w, w),
    ...                 PlacementFluid("mud", "displacement", 1200.0, w, w)), (10.0,))
    >>> t.start.tolist(), t.end.tolist()
    ([-inf, 0.0, 10.0], [0.0, 10.0, inf])
    """

    fluids: tuple[PlacementFluid, ...]
    volumes: tuple[float, ...]
    start: np.ndarray = field(init=False, repr=False)
    end: np.ndarray = field(init=False, repr=False)

    def __post_init__(self):
        fl = tuple(self.fluids)
        if len(fl) < 3 or fl[0].role != "mud":
            raise InputError(
                "fluid train",
                [f.name for f in fl],
                "the mud in the well first, then at least one pumped fluid and the displacement",
            )
        if fl[-1].role != "displacement":
            raise InputError(
                "fluid train",
                [f.name for f in fl],
                "a displacement fluid last (behind the top plug)",
            )
        if any(f.role in ("mud", "displacement") for f in fl[1:-1]):
            raise InputError(
                "fluid train",
                [f.role for f in fl],
                "spacers and slurries between the mud and the displacement",
            )
        if not any(f.role == "slurry" for f in fl):
            raise InputError("fluid train", [f.name for f in fl], "at least one cement slurry")
        vols = tuple(float(v) for v in self.volumes)
        if len(vols) != len(fl) - 2:
            raise InputError(
                "fluid volumes",
                vols,
                f"{len(fl) - 2} volumes (each fluid between mud and displacement)",
            )
        for f, v in zip(fl[1:-1], vols, strict=True):
            if not (np.isfinite(v) and v > 0):
                raise InputError(f"{f.name}: volume", v, "> 0", kind="volume")
        cum = np.concatenate([[0.0], np.cumsum(vols)])
        start = np.concatenate([[-np.inf], cum])
        end = np.concatenate([cum, [np.inf]])
        for name, v in (("start", start), ("end", end)):
            v.setflags(write=False)
            object.__setattr__(self, name, v)
        object.__setattr__(self, "fluids", fl)
        object.__setattr__(self, "volumes", vols)

    @property
    def density(self) -> np.ndarray:
        """Density of each fluid [kg/m³]."""
        return np.array([f.density for f in self.fluids])

    @property
    def cement_end(self) -> float:
        """Pumped volume at the top plug (end of the last fluid ahead of the displacement)."""
        return float(self.end[-2])

    @property
    def lead_cement_start(self) -> float:
        """Pumped volume at which the first slurry starts."""
        i = next(i for i, f in enumerate(self.fluids) if f.role == "slurry")
        return float(self.start[i])

    def _unclipped(self, pumped, returned, total_volume: float):
        p = np.asarray(pumped, dtype=float)[..., None]
        r = np.asarray(returned, dtype=float)[..., None]
        # the mud in the well entered "before the job": as if pumped from -V_total to 0
        start = np.where(np.isinf(self.start), -total_volume, self.start)
        lo = r - np.minimum(p, self.end)
        hi = np.where(p > start, r - start, lo)
        return p, r, lo, hi

    def intervals(self, pumped, returned, total_volume: float):
        """Path-volume interval [lo, hi] [m³] of each fluid at pumped ``P`` and returned ``R``
        volumes (arrays of shape ``P.shape + (fluids,)``; lo = hi where a fluid is not in the
        well): lo = R − min(P, end), hi = R − start, clipped to [max(R − P, 0), V_total]
        (the mud in the well before the job counts as pumped from −V_total to 0)."""
        p, r, lo, hi = self._unclipped(pumped, returned, total_volume)
        top = np.maximum(r - p, 0.0)
        return np.clip(lo, top, total_volume), np.clip(hi, top, total_volume)

    def returned(self, pumped, returned, total_volume: float):
        """Volume of each fluid returned at surface [m³] (shape ``P.shape + (fluids,)``): the
        part of its interval beyond ``V_total``."""
        _, _, lo, hi = self._unclipped(pumped, returned, total_volume)
        return np.maximum(hi, total_volume) - np.maximum(lo, total_volume)


def train_hydrostatic(tvd, top_tvds, densities, *, hydrostatic: str = "exact"):
    """Hydrostatic pressure [Pa] at ``tvd`` [m] under a stack of fluids: fluid *i* fills from
    ``top_tvds[i]`` down to the next top (the first top is the surface of the column).

    .. math:: p(h) = g \\sum_i \\rho_i\\,\\max(0,\\ \\min(h, h_{i+1}) - h_i)

    Examples
    --------
    1,000 m of 1,200 kg/m³ mud over 500 m of 1,900 kg/m³ cement, at 1,500 m TVD
    (Σρ·g·h = (1200·1000 + 1900·500)·9.80665):

    >>> round(train_hydrostatic(1500.0, [0.0, 1000.0], [1200.0, 1900.0]) / 1e6, 4)
    21.0843
    """
    tops = np.asarray(check_finite("fluid tops TVD", top_tvds, "m"), dtype=float)
    rho = np.asarray(check_positive("fluid densities", densities, "kg/m³"), dtype=float)
    if tops.ndim != 1 or tops.shape != rho.shape or tops.size == 0:
        raise InputError(
            "fluid tops and densities",
            (tops.tolist(), rho.tolist()),
            "two lists of the same length (at least one fluid)",
        )
    if np.any(np.diff(tops) < 0):
        raise InputError("fluid tops TVD", tops.tolist(), "increasing with depth")
    h = np.asarray(check_finite("tvd", tvd, "m"), dtype=float)[..., None]
    bottoms = np.concatenate([tops[1:], [np.inf]])
    col = np.clip(np.minimum(h, bottoms) - tops, 0.0, None)
    return float_or_array(gravity_for(hydrostatic) * np.sum(rho * col, axis=-1))
