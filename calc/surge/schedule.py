"""Trip schedule: running and pulling speed limits per depth band as the bit moves between
surface and the bottom of the hole.

The planned trip takes the bit from the bottom of the hole to surface and back.  With the bit
at MD b the string is shorter (the bottom-hole assembly first, drill pipe filling the rest,
only the lower components when b is shallower than the assembly), and the whole exposed hole
(last shoe to hole bottom, and the weak points) feels the trip: the check depths above the bit
the friction, inertia and gel of the annulus above them, those below the bit the bit's pressure
change.  :func:`calc.surge.trip_speed_limits`' solver is applied with the bit at each band
edge and at each weak point; a band's limit is the lowest of the limits solved with the bit in
it (its two edges and the weak points inside).  Below the bit a check depth's pressure change
grows as the bit goes deeper; above the bit it is largest with the whole bottom-hole assembly
just above it, i.e. the bit at the check depth — solved for the weak points; for the plain
depths of the exposed hole between the solved bit depths this is an assumption, measured in
the tests.

References
----------
Burkhardt, J.A. (1961) Wellbore pressure surges produced by pipe movement. JPT 13(6), 595-605,
SPE-1546-G.  Trip-speed limits per depth: calc/METHODS.md §11.10 (common practice).
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass

import numpy as np

from calc.errors import InputError, check_positive
from calc.geometry import DrillString
from calc.notes import Note
from calc.surge.limits import (
    TripLimits,
    TripPoint,
    check_points,
    exposed_hole,
    limit_options,
    limits_at_points,
    limits_with_bit_at,
)
from calc.surge.solver import PEAK_FACTOR
from calc.values import Value

__all__ = ["TripBand", "TripSchedule", "trip_schedule", "well_at_bit_depth"]


@dataclass(frozen=True)
class TripBand:
    """One depth band of a trip schedule (SI).

    top_md, bottom_md              the bit's MD range of the band [m]
    running_limit, pulling_limit   highest average stand speeds while the bit is in the band [m/s]
    running_point, pulling_point   the check depth that governs each (:class:`TripPoint`)
    running_term, pulling_term     what governs ("friction", "inertia", "stopping", "gel",
                                   "static", "not limiting"; :class:`TripComponents`)
    running_bit_md, pulling_bit_md the bit depth (a band edge) at which each was found [m]
    """

    top_md: float
    bottom_md: float
    running_limit: float
    pulling_limit: float
    running_point: TripPoint
    pulling_point: TripPoint
    running_term: str
    pulling_term: str
    running_bit_md: float
    pulling_bit_md: float


@dataclass(frozen=True, eq=False)
class TripSchedule:
    """Running and pulling speed limits per depth band of the bit (SI).

    bands                    :class:`TripBand` from surface to the bottom of the hole
    top_md, bottom_md        the bands' MD ranges [m]
    running_limit, pulling_limit   per band [m/s]
    bit_md                   bit depths solved (the band edges below surface and the weak
                             points inside the hole) [m]
    at_bit                   :class:`TripLimits` with the bit at each ``bit_md`` (the last one:
                             the bit at the bottom, as :func:`calc.surge.trip_speed_limits`)
    band_length              band length asked [m]
    method                   surge model, inertia, gel, schedule
    """

    bands: tuple[TripBand, ...]
    top_md: np.ndarray
    bottom_md: np.ndarray
    running_limit: np.ndarray
    pulling_limit: np.ndarray
    bit_md: np.ndarray
    at_bit: tuple[TripLimits, ...]
    band_length: float
    method: str
    notes: tuple[Note, ...] = ()


def _open_inside_note() -> Note:
    return Note(
        "info",
        "schedule_open_string_inside_closed",
        "trip schedule of an open string: the check depths inside a band, each with the bit at "
        "it, are solved as a closed string (more surge and swab than the open string's, so "
        "those limits are on the safe side).",
        "trip speed",
    )


def well_at_bit_depth(well, bit_md: float):
    """The well with the bit pulled up to MD ``bit_md`` [m] (0 < bit_md ≤ the well's bit depth).

    The string keeps its components from the bit up: drill pipe ("fill") shortens first; a bit
    shallower than the fixed components keeps only the lower ones (the top one cut).  Tool
    drops and surface lines are left out (they do not enter surge and swab).

    >>> from calc.geometry import Bit, DrillString, Hole, HoleSection, StringComponent, Survey
    >>> from calc.geometry import Well
    >>> well = Well(Survey([0.0, 2000.0], [0.0, 0.0], [0.0, 0.0]),
    ...             Hole([HoleSection("hole", 0.0, 2000.0, 0.216, "open_hole", bit_size=0.216)]),
    ...             DrillString([StringComponent("collars", 0.165, 0.071, 150.0),
    ...                          StringComponent("pipe", 0.127, 0.1086, "fill")]),
    ...             Bit(0.216, tfa=5e-4), bit_depth=2000.0)
    >>> [round(float(x), 1) for x in well_at_bit_depth(well, 1000.0).component_lengths]
    [150.0, 850.0]
    >>> [round(float(x), 1) for x in well_at_bit_depth(well, 100.0).component_lengths]
    [100.0]
    """
    td = float(well.bit_depth)
    b = float(np.asarray(bit_md, dtype=float))
    if not np.isfinite(b) or b <= 0 or b > td + 1e-6:
        raise InputError("bit depth", b, "> 0 and <= the bit depth at the bottom {td}",
                         kind="depth", values=(Value("td", td, "depth"),))  # fmt: skip
    string = well.string
    fixed = string.fixed_length
    has_fill = any(c.is_fill for c in string.components)
    if not (has_fill and fixed < b) and abs(fixed - b) > 1e-6:
        comps, left = [], b
        for c in string.components:
            if c.is_fill or left <= 0:
                continue
            take = min(float(c.length), left)
            comps.append(dataclasses.replace(c, length=take))
            left -= take
        if left > 1e-6:  # no fill and the fixed string shorter: the bit cannot be this deep
            raise InputError("bit depth", b, "<= the string length {fixed}", kind="depth",
                             values=(Value("fixed", fixed, "depth"),))  # fmt: skip
        string = DrillString(comps)
    return dataclasses.replace(well, string=string, bit_depth=b, tool_drops=(), surface_lines=())


def _points_for(well_td, well_b, md_all, names_all):
    """Check depths with the bit at ``well_b``: the exposed hole of the bottom position (those
    below the bit feel the bit's pressure change), plus the bit where it is in open hole."""
    b = float(well_b.bit_depth)
    td = float(well_td.bit_depth)
    if abs(b - td) <= 1e-9:
        return md_all, names_all
    names = ["" if n == "bit" else n for n in names_all]
    md = np.asarray(md_all, dtype=float)
    top, _ = exposed_hole(well_td)
    if b > top and not np.any(np.isclose(md, b)):
        md = np.append(md, b)
        names.append("bit")
    return md, tuple(names)


def trip_schedule(
    well,
    fluid,
    *,
    window,
    weak_points=(),
    band_length: float = 304.8,
    bit_depths=None,
    fracture_margin: float = 0.0,
    pore_margin: float = 0.0,
    string_end: str = "auto",
    method: str | None = None,
    clinging="burkhardt",
    peak_factor: float = PEAK_FACTOR,
    eccentricity: float = 0.0,
    step: float = 30.0,
    speed_bracket: tuple[float, float] = (1e-4, 10.0),
    hydrostatic: str = "exact",
    acceleration_time: float | None = None,
    stand_gel: float | None = None,
) -> TripSchedule:
    """Running and pulling speed limits per depth band of the bit, surface to hole bottom.

    .. math:: V_{band} = \\min_{b \\in \\{b_{top},\\ b_{bottom},\\ \\text{weak points inside}\\}}
              V_{lim}(b)

    with V_lim(b) the limit of :func:`calc.surge.trip_speed_limits` (peak of steady surge,
    inertia and stand gel against the margins) with the bit at MD b and the whole exposed hole
    checked.

    Parameters
    ----------
    well, fluid, window, weak_points, fracture_margin, pore_margin, string_end, method,
    clinging, peak_factor, eccentricity, step, speed_bracket, hydrostatic, acceleration_time,
    stand_gel
        As :func:`calc.surge.trip_speed_limits`; ``well`` has the bit at the bottom of the
        hole (the start of the trip out, the end of the trip in).
    band_length : float
        Band length [m] (default 1000 ft: each band edge is one solve of the limits, about
        1 s for a string of 40 annular intervals); the last band ends at the bit depth.
    bit_depths : array_like, optional
        Band edges [m] instead (0 < MD ≤ the well's bit depth; surface and the bottom added).

    Returns
    -------
    TripSchedule
    """
    td = float(well.bit_depth)
    if bit_depths is None:
        bl = float(check_positive("schedule band length", band_length, "m"))
        if td / bl > 1000:
            raise InputError("schedule band length", bl, f">= {td / 1000:g} m (1000 bands)")
        edges = np.append(np.arange(0.0, td, bl), td)
    else:
        bl = float("nan")
        given = np.atleast_1d(np.asarray(bit_depths, dtype=float))
        bad = ~np.isfinite(given) | (given <= 0) | (given > td + 1e-6)
        if np.any(bad):
            raise InputError("bit depth", float(given[np.argmax(bad)]),
                             "> 0 and <= the bit depth at the bottom {td}", kind="depth",
                             values=(Value("td", td, "depth"),))  # fmt: skip
        edges = np.concatenate([[0.0], given, [td]])
    edges = np.unique(np.round(edges, 9))
    edges[-1] = td  # the bottom exactly (not rounded)
    opts = limit_options(
        well, fracture_margin, pore_margin, string_end, peak_factor, speed_bracket, clinging,
        acceleration_time, stand_gel,
    )  # fmt: skip
    stp = float(check_positive("check-depth step", step, "m"))
    md_all, names_all = check_points(well, tuple(weak_points), stp)
    # the bit at each band edge (every check depth outside the band is worst with the bit at
    # the nearer edge) ...
    depths = edges[1:]
    solves = []
    for b in depths:
        wb = well if b == depths[-1] else well_at_bit_depth(well, b)
        md, names = _points_for(well, wb, md_all, names_all)
        solves.append(
            limits_at_points(
                wb,
                fluid,
                md,
                names,
                window=window,
                weak_points=weak_points,
                method=method,
                eccentricity=eccentricity,
                hydrostatic=hydrostatic,
                **opts,
            )
        )
    # ... and each check depth inside a band with the bit at it (the whole bottom-hole assembly
    # just above it, the string as long as it gets for that depth): one solve for all of them
    inside = [(z, n) for z, n in zip(md_all, names_all, strict=True)
              if not np.any(np.isclose(z, edges))]  # fmt: skip
    z_in = np.array([z for z, _ in inside])
    in_notes = []
    if z_in.size:
        wells = [well_at_bit_depth(well, z) for z in z_in]
        nm_in = tuple(n or "bit" for _, n in inside)
        # an open string's split couples its intervals: these depths take the closed string's
        # surge, inertia and gel instead (each larger than the open string's: lower limits)
        in_opts = {**opts, "end": "closed"}
        r_in, p_in, rt_in, pt_in, in_notes = limits_with_bit_at(
            wells, fluid, nm_in, window=window, weak_points=weak_points, method=method,
            eccentricity=eccentricity, hydrostatic=hydrostatic, **in_opts,
        )  # fmt: skip
        if opts["end"] != "closed":
            in_notes = [*in_notes, _open_inside_note()]
        tvd_in = np.asarray(well.tvd_at(z_in), dtype=float)
    bands = []
    for k in range(edges.size - 1):
        lo, hi = edges[k], edges[k + 1]
        cands = []  # (limit, point, term, bit md) for running and pulling
        for x in solves[max(k - 1, 0) : k + 1]:
            r_c = (x.max_running_speed, x.running_point, x.running.term, x.bit_md)
            p_c = (x.max_pulling_speed, x.pulling_point, x.pulling.term, x.bit_md)
            cands.append((r_c, p_c))
        for j in np.flatnonzero((z_in > lo) & (z_in < hi)) if z_in.size else ():
            pt = TripPoint(index=-1, name=nm_in[j], md=float(z_in[j]), tvd=float(tvd_in[j]))
            cands.append(((float(r_in[j]), pt, rt_in[j], float(z_in[j])),
                          (float(p_in[j]), pt, pt_in[j], float(z_in[j]))))  # fmt: skip
        run = min((c[0] for c in cands), key=lambda c: c[0])
        pull = min((c[1] for c in cands), key=lambda c: c[0])
        bands.append(
            TripBand(
                top_md=float(lo),
                bottom_md=float(hi),
                running_limit=run[0],
                pulling_limit=pull[0],
                running_point=run[1],
                pulling_point=pull[1],
                running_term=run[2],
                pulling_term=pull[2],
                running_bit_md=run[3],
                pulling_bit_md=pull[3],
            )
        )
    # the notes of the bit at the bottom, then those of other bit depths whose code is new
    # (a count differs from depth to depth; the first occurrence stands for the code)
    notes = list(solves[-1].notes)
    codes = {n.code for n in notes}
    for n in [m for x in solves[:-1] for m in x.notes] + list(in_notes):
        if n.code not in codes:
            notes.append(n)
            codes.add(n.code)
    return TripSchedule(
        bands=tuple(bands),
        top_md=edges[:-1].copy(),
        bottom_md=edges[1:].copy(),
        running_limit=np.array([b.running_limit for b in bands]),
        pulling_limit=np.array([b.pulling_limit for b in bands]),
        bit_md=depths,
        at_bit=tuple(solves),
        band_length=bl,
        method=f"{solves[-1].method}; per depth band of the bit, the lower of the limits with "
        "the bit at the band's edges and weak points",
        notes=tuple(dict.fromkeys(notes)),
    )
