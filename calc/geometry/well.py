"""The well as it stands: survey, hole, string, bit, surface lines and tool drops, split into
flow intervals wherever the pipe or the hole changes.

SI throughout (m; angles in degrees).  :meth:`Well.flow_intervals` returns a frozen
struct-of-arrays, one row per interval: the string from surface down to the bit, then the
annulus from the bit up to surface.

Tool joints (calc/METHODS.md §13.2; default tool-joint length from memory, not yet checked): each
stretch of a component with tool joints is given as two sub-intervals over the same MD span, a
*body* share (1 - f) and a *tool-joint* share f of its length, f = tool-joint length / joint
length.  Summing ``length`` (or ``delta_tvd``) over the rows of one path therefore covers each
metre of the well exactly once.
"""

from __future__ import annotations

import difflib
from collections.abc import Sequence
from dataclasses import dataclass, field, fields

import numpy as np

from calc.bit import Bit
from calc.errors import InputError, check_positive
from calc.flow.area import cross_section_area
from calc.geometry.hole import Hole, HoleSection
from calc.geometry.string import DrillString
from calc.geometry.surface import SurfaceLine, ToolPressureDrop
from calc.geometry.survey import Survey
from calc.notes import Note
from calc.span import Span
from calc.values import Value

__all__ = ["DepthGrid", "FlowIntervals", "Well"]

_KIND_LABEL = {"casing": "casing", "liner": "liner", "open_hole": "open hole"}


def _frozen(a) -> np.ndarray:
    a = np.ascontiguousarray(a)
    a.setflags(write=False)
    return a


@dataclass(frozen=True, eq=False)
class FlowIntervals:
    """Flow intervals as read-only arrays (one element per interval).

    Attributes
    ----------
    path : ndarray of str
        ``"string"`` or ``"annulus"``.
    top_md, bottom_md : ndarray
        MD span of the interval [m].
    length : ndarray
        Flow length [m] = ``share × (bottom_md - top_md)``.
    share : ndarray
        Share of the span this row stands for: 1, or (1 - f) for a body and f for a tool-joint
        sub-interval.
    top_tvd, bottom_tvd : ndarray
        TVD at the span ends [m].
    inclination : ndarray
        Mean inclination over the span [degree]: arccos(ΔTVD/ΔMD), the angle whose cosine is
        the MD-average of cos I.
    outer_diameter : ndarray
        Flow-path outer diameter [m]: pipe (or tool-joint) ID in the string, governing hole or
        casing ID in the annulus.
    inner_diameter : ndarray
        0 in the string; pipe body or tool-joint OD in the annulus [m].
    component, section : ndarray of str
        String-component and hole-section names; ``component_index`` (bottom-up index into the
        string), ``section_index`` (into :attr:`Hole.sections`) and ``section_kind``
        ("casing", "liner" or "open_hole").
    is_tool_joint : ndarray of bool
    tool_joint_fraction : ndarray
        f used for the component (0 without tool joints).
    """

    path: np.ndarray
    top_md: np.ndarray
    bottom_md: np.ndarray
    length: np.ndarray
    share: np.ndarray
    top_tvd: np.ndarray
    bottom_tvd: np.ndarray
    inclination: np.ndarray
    outer_diameter: np.ndarray
    inner_diameter: np.ndarray
    component: np.ndarray
    component_index: np.ndarray
    section: np.ndarray
    section_index: np.ndarray
    section_kind: np.ndarray
    is_tool_joint: np.ndarray
    tool_joint_fraction: np.ndarray

    def __len__(self) -> int:
        return int(self.path.size)

    def select(self, mask) -> FlowIntervals:
        """The rows where ``mask`` is true (or of the path named by a string)."""
        if isinstance(mask, str):
            mask = self.path == mask
        return FlowIntervals(**{f.name: _frozen(getattr(self, f.name)[mask]) for f in fields(self)})

    @property
    def string(self) -> FlowIntervals:
        """String rows, surface down to the bit."""
        return self.select("string")

    @property
    def annulus(self) -> FlowIntervals:
        """Annulus rows, bit up to surface."""
        return self.select("annulus")

    @property
    def hydraulic_diameter(self) -> np.ndarray:
        """D_o - D_i [m] (pipe ID in the string; D_hole - D_pipe in the annulus)."""
        return self.outer_diameter - self.inner_diameter

    @property
    def flow_area(self) -> np.ndarray:
        """π/4·(D_o² - D_i²) [m²]."""
        return cross_section_area(self.outer_diameter, self.inner_diameter)

    @property
    def volume(self) -> np.ndarray:
        """Fluid volume of each row, flow area × length [m³]."""
        return self.flow_area * self.length

    @property
    def delta_tvd(self) -> np.ndarray:
        """Vertical extent this row stands for, share × (bottom_tvd - top_tvd) [m]."""
        return self.share * (self.bottom_tvd - self.top_tvd)

    def spans(self) -> tuple[Span, ...]:
        """Where each row lies: a :class:`~calc.span.Span` per row (path, component, hole
        section for annulus rows, tool-joint flag, MD and TVD span [m]).

        >>> from tests.demo_well import demo_well
        >>> s = demo_well().flow_intervals().annulus.spans()[-1]
        >>> (s.path, s.top_md)
        ('annulus', 0.0)
        """
        return tuple(
            Span(
                str(path),
                str(comp),
                str(sec) if path == "annulus" else "",
                bool(tj),
                float(top),
                float(bot),
                float(ttop),
                float(tbot),
            )
            for path, comp, sec, tj, top, bot, ttop, tbot in zip(
                self.path,
                self.component,
                self.section,
                self.is_tool_joint,
                self.top_md,
                self.bottom_md,
                self.top_tvd,
                self.bottom_tvd,
                strict=True,
            )
        )

    def to_records(self) -> list[dict]:
        """Rows as dictionaries (for tables and reports)."""
        names = [f.name for f in fields(self)]
        cols = [getattr(self, n).tolist() for n in names]
        return [dict(zip(names, row, strict=True)) for row in zip(*cols, strict=True)]


@dataclass(frozen=True, eq=False)
class DepthGrid:
    """Depth points for profiles: MD [m] increasing from surface to the bit, TVD [m],
    inclination [degree], governing hole diameter [m] and hole-section index."""

    md: np.ndarray
    tvd: np.ndarray
    inclination: np.ndarray
    hole_diameter: np.ndarray
    section_index: np.ndarray


@dataclass(frozen=True, eq=False)
class Well:
    """The circulating system's geometry for one bit depth.

    Parameters
    ----------
    survey : Survey
    hole : Hole
    string : DrillString
        Bottom (bit end) first.
    bit : Bit
    surface_lines : sequence of SurfaceLine
    tool_drops : sequence of ToolPressureDrop
        Fixed drops from suppliers' sheets; the string components each one's ``components``
        names must be in ``string`` (see :attr:`tool_covered`).
    bit_depth : float
        Bit MD [m]; ≤ the hole depth.
    split_at_stations : bool
        Also split intervals at survey stations (better TVD and inclination per interval).

    Raises
    ------
    InputError
        a tool drop covering a component that is not in the string (with the nearest name) or
        one already covered by another drop; bit below the hole depth; string longer than the
        bit depth (or not reaching surface); a pipe body or tool-joint OD at or above the
        hole/casing ID over its interval.

    Notes
    -----
    Warnings: the bit larger than the drift (or ID) of a casing it passed; the bit size differs
    from the open hole's; bit below the last survey station (projected).  With these, the
    notes of the survey, hole, string components and bit are collected in :attr:`notes`.

    Examples
    --------
    A vertical 3,000 m well: the string and the annulus are each split at the shoe (1,500 m)
    and at the top of the collars (2,850 m); each path is 3,000 m long:

    >>> from calc.bit import Bit
    >>> from calc.geometry import DrillString, Hole, HoleSection, StringComponent, Survey
    >>> from calc.units import to_si
    >>> casing = HoleSection("9-5/8 in casing", 0.0, 1500.0, to_si(8.681, "in"))
    >>> pipe = [StringComponent("collars", to_si(6.5, "in"), to_si(2.8125, "in"), 150.0),
    ...         StringComponent("drill pipe", to_si(5.0, "in"), to_si(4.276, "in"), "fill")]
    >>> well = Well(Survey([0.0, 3000.0], [0.0, 0.0], [0.0, 0.0]),
    ...             Hole.from_casing([casing], 3000.0, bit_size=to_si(8.5, "in")),
    ...             DrillString(pipe), Bit(to_si(8.5, "in"), "3x12 3x11"), bit_depth=3000.0)
    >>> fi = well.flow_intervals()
    >>> fi.string.length.tolist(), float(fi.annulus.length.sum())
    ([1500.0, 1350.0, 150.0], 3000.0)
    >>> well.bit_tvd, well.last_shoe.name, round(float(well.tvd_at(1000.0)), 9)
    (3000.0, '9-5/8 in casing', 1000.0)
    """

    survey: Survey
    hole: Hole
    string: DrillString
    bit: Bit
    surface_lines: Sequence[SurfaceLine] = ()
    tool_drops: Sequence[ToolPressureDrop] = ()
    bit_depth: float = 0.0
    split_at_stations: bool = True
    notes: tuple[Note, ...] = field(init=False, repr=False)
    component_lengths: np.ndarray = field(init=False, repr=False)
    _intervals: FlowIntervals = field(init=False, repr=False)

    def __post_init__(self):
        for name, cls in (
            ("survey", Survey),
            ("hole", Hole),
            ("string", DrillString),
            ("bit", Bit),
        ):
            if not isinstance(getattr(self, name), cls):
                raise InputError(name, type(getattr(self, name)).__name__, cls.__name__)
        lines = tuple(self.surface_lines)
        drops = tuple(self.tool_drops)
        for x in lines:
            if not isinstance(x, SurfaceLine):
                raise InputError("surface line", x, "SurfaceLine objects")
        for x in drops:
            if not isinstance(x, ToolPressureDrop):
                raise InputError("tool drop", x, "ToolPressureDrop objects")
        object.__setattr__(self, "surface_lines", lines)
        object.__setattr__(self, "tool_drops", drops)
        self._check_tool_components(drops)
        depth = float(check_positive("bit depth", self.bit_depth, "m"))
        object.__setattr__(self, "bit_depth", depth)
        if depth > self.hole.depth + 1e-6:
            raise InputError(
                "bit depth",
                depth,
                "<= hole depth {hole_depth}",
                problem="string longer than the hole",
                kind="depth",
                values=(Value("hole_depth", float(self.hole.depth), "depth"),),
            )
        lengths = _frozen(self.string.lengths_for(depth))
        object.__setattr__(self, "component_lengths", lengths)
        notes: list[Note] = [
            *self.survey.notes,
            *self.hole.notes,
            *self.string.notes,
            *self.bit.notes,
            *self.string.fill_note(depth),
        ]
        notes.extend(self._bit_notes())
        if depth > self.survey.md[-1] + 1e-6:
            notes.append(
                Note(
                    "info",
                    "survey_projected",
                    "bit depth {depth} is below the last survey station ({last}): path "
                    "projected along its tangent",
                    "survey",
                    values=(
                        Value("depth", depth, "depth"),
                        Value("last", float(self.survey.md[-1]), "depth"),
                    ),
                )
            )
        intervals = self._build_intervals()
        self._check_clearance(intervals)
        object.__setattr__(self, "_intervals", intervals)
        object.__setattr__(self, "notes", tuple(notes))

    # ------------------------------------------------------------------------- checks
    def _check_tool_components(self, drops) -> None:
        """Each name a tool drop covers must be a string component, covered by one drop only."""
        known = list(dict.fromkeys(self.string.component_names()))
        seen: dict[str, str] = {}
        for t in drops:
            for name in t.components:
                if name not in known:
                    near = difflib.get_close_matches(name, known, n=1, cutoff=0.4)
                    hint = f" (did you mean '{near[0]}'?)" if near else ""
                    raise InputError(
                        f"component covered by '{t.name}'",
                        name,
                        "a drill-string component name: " + "; ".join(known) + hint,
                        problem="not in the string",
                    )
                if name in seen:
                    raise InputError(
                        f"component covered by '{t.name}'",
                        name,
                        f"covered by one tool drop only (already by '{seen[name]}')",
                    )
                seen[name] = t.name

    @property
    def tool_covered(self) -> tuple[str, ...]:
        """String components whose bore loss a fixed tool drop includes (bit end first)."""
        covered = {c for t in self.tool_drops for c in t.components}
        return tuple(c for c in dict.fromkeys(self.string.component_names()) if c in covered)

    def _bit_notes(self) -> list[Note]:
        out = []
        size = self.bit.size
        for s in self.hole.cased_above(self.bit_depth):
            limit, what = (s.drift, "drift") if s.drift is not None else (s.diameter, "ID")
            if size > limit:
                out.append(
                    Note(
                        "warning",
                        "bit_above_drift",
                        "{size} bit will not pass the {limit} {what} of '{section}'",
                        s.name,
                        values=(
                            Value("size", float(size), "diameter"),
                            Value("limit", float(limit), "diameter"),
                            Value("what", what),
                            Value("section", s.name),
                        ),
                    )
                )
        k = self.hole.section_index_at(self.bit_depth)
        sec = self.hole.sections[k]
        if sec.is_open_hole and sec.bit_size is not None and abs(sec.bit_size - size) > 1e-4:
            out.append(
                Note(
                    "info",
                    "bit_size_differs",
                    "bit size {size} differs from the bit size of '{section}' ({section_bit})",
                    sec.name,
                    values=(
                        Value("size", float(size), "diameter"),
                        Value("section", sec.name),
                        Value("section_bit", float(sec.bit_size), "diameter"),
                    ),
                )
            )
        return out

    def _check_clearance(self, iv: FlowIntervals) -> None:
        ann = iv.path == "annulus"
        bad = ann & (iv.inner_diameter >= iv.outer_diameter)
        if not np.any(bad):
            return
        rows = np.flatnonzero(bad)
        k = rows[np.argmin(iv.top_md[rows])]
        sec = self.hole.sections[int(iv.section_index[k])]
        part = "tool joint" if iv.is_tool_joint[k] else "pipe OD"
        raise InputError(
            f"{'tool-joint OD' if iv.is_tool_joint[k] else 'OD'} of '{iv.component[k]}'",
            float(iv.inner_diameter[k]),
            f"< {_KIND_LABEL[sec.kind]} ID {{hole_id}} of '{{section}}' (at {{md}})",
            problem=f"{part} at or above the {_KIND_LABEL[sec.kind]} ID",
            kind="diameter",
            values=(
                Value("hole_id", float(iv.outer_diameter[k]), "diameter"),
                Value("section", sec.name),
                Value("md", float(iv.top_md[k]), "depth"),
            ),
        )

    # ------------------------------------------------------------------------- intervals
    def _breakpoints(self) -> np.ndarray:
        depth = self.bit_depth
        comp_tops = depth - np.cumsum(self.component_lengths)
        pts = [np.array([0.0, depth]), comp_tops, self.hole.boundaries()]
        if self.split_at_stations:
            pts.append(self.survey.md)
        b = np.unique(np.concatenate(pts))
        b = b[(b >= 0.0) & (b <= depth)]
        # drop slivers from rounding (< 1 mm)
        keep = np.concatenate([[True], np.diff(b) > 1e-3])
        b = b[keep]
        b[-1] = depth
        return b

    def _component_at(self, md) -> np.ndarray:
        """Bottom-up component index at MD(s) strictly inside a component."""
        cum = np.cumsum(self.component_lengths)
        h = self.bit_depth - np.asarray(md, dtype=float)
        return np.clip(np.searchsorted(cum, h, side="right"), 0, cum.size - 1)

    def _build_intervals(self) -> FlowIntervals:
        b = self._breakpoints()
        top, bot = b[:-1], b[1:]
        mid = 0.5 * (top + bot)
        ci = self._component_at(mid)
        si = np.asarray(self.hole.section_index_at(mid))
        comps = self.string.components
        frac_c = np.array([c.tool_joint_fraction for c in comps])
        od_c = np.array([c.od for c in comps])
        id_c = np.array([c.id for c in comps])
        tjod_c = np.array([c.tool_joint_od if c.has_tool_joints else c.od for c in comps])
        tjid_c = np.array([c.tool_joint_id if c.has_tool_joints else c.id for c in comps])
        names_c = np.array([c.name for c in comps], dtype=object)
        names_s = np.array([s.name for s in self.hole.sections], dtype=object)
        kinds_s = np.array([s.kind for s in self.hole.sections], dtype=object)
        dia_s = np.array([s.diameter for s in self.hole.sections])
        tvd = np.asarray(self.survey.tvd_at(b))
        ttop, tbot = tvd[:-1], tvd[1:]
        span = bot - top
        inc = np.degrees(np.arccos(np.clip((tbot - ttop) / span, -1.0, 1.0)))
        f = frac_c[ci]
        has_tj = f > 0
        # rows per span: body (share 1 - f, or 1), then tool joint where present
        span_idx = np.concatenate([np.arange(span.size), np.flatnonzero(has_tj)])
        is_tj = np.concatenate([np.zeros(span.size, bool), np.ones(int(has_tj.sum()), bool)])
        order = np.lexsort((is_tj, span_idx))
        span_idx, is_tj = span_idx[order], is_tj[order]
        share = np.where(is_tj, f[span_idx], 1.0 - f[span_idx])
        c = ci[span_idx]

        def rows(path: str, idx_order: np.ndarray) -> dict:
            k = span_idx[idx_order]
            tj = is_tj[idx_order]
            cc = c[idx_order]
            if path == "string":
                outer = np.where(tj, tjid_c[cc], id_c[cc])
                inner = np.zeros(k.size)
            else:
                outer = dia_s[si[k]]
                inner = np.where(tj, tjod_c[cc], od_c[cc])
            return {
                "path": np.full(k.size, path, dtype=object),
                "top_md": top[k],
                "bottom_md": bot[k],
                "length": share[idx_order] * span[k],
                "share": share[idx_order],
                "top_tvd": ttop[k],
                "bottom_tvd": tbot[k],
                "inclination": inc[k],
                "outer_diameter": outer,
                "inner_diameter": inner,
                "component": names_c[cc],
                "component_index": cc,
                "section": names_s[si[k]],
                "section_index": si[k],
                "section_kind": kinds_s[si[k]],
                "is_tool_joint": tj,
                "tool_joint_fraction": f[k],
            }

        down = np.arange(span_idx.size)
        # annulus: spans from the bit up; within a span keep body before tool joint
        up = np.lexsort((is_tj, -span_idx))
        s_rows, a_rows = rows("string", down), rows("annulus", up)
        return FlowIntervals(**{k: _frozen(np.concatenate([s_rows[k], a_rows[k]])) for k in s_rows})

    def flow_intervals(self) -> FlowIntervals:
        """Flow intervals: string from surface to the bit, then annulus from the bit up."""
        return self._intervals

    # ------------------------------------------------------------------------- depth helpers
    @property
    def last_shoe(self) -> HoleSection | None:
        """The deepest casing or liner whose shoe is at or above the bit (None in a well without
        one): its ``bottom`` [m] is the top of the exposed formation.

        >>> from tests.demo_well import demo_well
        >>> demo_well().last_shoe.kind
        'casing'
        """
        bit = float(self.bit_depth)
        cased = [sec for sec in self.hole.sections if not sec.is_open_hole and sec.bottom <= bit]
        return max(cased, key=lambda sec: sec.bottom) if cased else None

    @property
    def bit_tvd(self) -> float:
        """TVD of the bit [m]."""
        return float(self.survey.tvd_at(self.bit_depth))

    def tvd_at(self, md):
        """TVD [m] at MD(s) ``md`` [m] (vectorised)."""
        return self.survey.tvd_at(md)

    def string_depth_grid(self, step: float, extra_md: Sequence[float] = ()) -> DepthGrid:
        """Depth points for string-side profiles: the same points as :meth:`annulus_depth_grid`."""
        return self.annulus_depth_grid(step, extra_md)

    def annulus_depth_grid(self, step: float, extra_md: Sequence[float] = ()) -> DepthGrid:
        """Depth points for ECD/ESD profiles, surface to bit, every ``step`` [m].

        Interval boundaries (component tops, shoes, survey stations), the bit and ``extra_md``
        (weak points, sensors) [m] are always included, so piecewise-linear profiles are exact
        at every boundary.  The same points serve the string side.
        """
        step = float(check_positive("depth step", step, "m"))
        if self.bit_depth / step > 1e6:
            raise InputError("depth step", step, f">= {self.bit_depth / 1e6:g} m (1e6 points)")
        extra = np.asarray(extra_md, dtype=float).ravel()
        if np.any((extra < 0) | (extra > self.bit_depth)):
            raise InputError(
                "extra depth", extra.tolist(), f"between 0 and the bit depth {self.bit_depth:g} m"
            )
        md = np.unique(
            np.concatenate([np.arange(0.0, self.bit_depth, step), self._breakpoints(), extra])
        )
        return DepthGrid(
            md=_frozen(md),
            tvd=_frozen(self.survey.tvd_at(md)),
            inclination=_frozen(self.survey.inclination_at(md)),
            hole_diameter=_frozen(self.hole.diameter_at(md)),
            section_index=_frozen(self.hole.section_index_at(md)),
        )
