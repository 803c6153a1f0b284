"""The hole: casing and liner strings and the open hole, with depths and inside diameters.

All lengths in metres, densities (shoe-test equivalent mud weights) in kg/m³.  At any depth
the innermost inside diameter of the sections covering it governs the annulus.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from dataclasses import dataclass, field

import numpy as np

from calc.errors import InputError, check_choice, check_nonnegative, check_order, check_positive
from calc.notes import Note
from calc.values import Value

__all__ = ["HOLE_KINDS", "WASHOUT_WARN", "Hole", "HoleSection"]

HOLE_KINDS = ("casing", "liner", "open_hole")
#: Effective-to-bit diameter ratio above which a note is given (~1.3, common practice —
#: calc/METHODS.md §16.3).
WASHOUT_WARN = 1.3


@dataclass(frozen=True)
class HoleSection:
    """One cased, lined or open-hole section.

    Parameters
    ----------
    name : str
        Label used in results and messages (e.g. "9-5/8 in intermediate casing").
    top, bottom : float
        Measured depths of the top and the bottom (shoe) [m]; 0 ≤ top < bottom.
    diameter : float
        Inside diameter [m] (casing or liner ID; open hole: the effective diameter used for
        hydraulics, i.e. caliper or bit size × washout factor).
    kind : {"casing", "liner", "open_hole"}
    drift : float, optional
        Drift diameter [m] of a casing or liner (≤ ID); the next bit must pass it.
    shoe_test : float, optional
        Leak-off or formation-integrity test at the shoe, as equivalent density [kg/m³].
    bit_size : float, optional
        Open hole only: the bit size that drilled it [m].
    od : float, optional
        Outside diameter of a casing or liner [m] (for reference; > ID).

    Examples
    --------
    >>> from calc.units import to_si
    >>> s = HoleSection("8-1/2 in open hole", 1500.0, 3000.0, to_si(8.5, "in"), "open_hole")
    >>> s.is_open_hole, round(s.diameter, 4)
    (True, 0.2159)
    """

    name: str
    top: float
    bottom: float
    diameter: float
    kind: str = "casing"
    drift: float | None = None
    shoe_test: float | None = None
    bit_size: float | None = None
    od: float | None = None

    def __post_init__(self):
        check_choice("hole section kind", self.kind, HOLE_KINDS)
        who = f"'{self.name}'"
        top = float(check_nonnegative(f"top of {who}", self.top, "m"))
        bottom = float(check_positive(f"bottom of {who}", self.bottom, "m"))
        check_order(f"bottom of {who}", bottom, ">", top, "top", "depth")
        dia = float(check_positive(f"inside diameter of {who}", self.diameter, "m"))
        object.__setattr__(self, "top", top)
        object.__setattr__(self, "bottom", bottom)
        object.__setattr__(self, "diameter", dia)
        if self.drift is not None:
            drift = float(check_positive(f"drift of {who}", self.drift, "m"))
            check_order(f"drift of {who}", drift, "<=", dia, "inside diameter", "diameter")
            object.__setattr__(self, "drift", drift)
        if self.od is not None:
            od = float(check_positive(f"OD of {who}", self.od, "m"))
            check_order(f"inside diameter of {who}", dia, "<", od, "OD", "diameter")
            object.__setattr__(self, "od", od)
        if self.shoe_test is not None:
            object.__setattr__(
                self,
                "shoe_test",
                float(check_positive(f"shoe test of {who}", self.shoe_test, "kg/m3")),
            )
        if self.bit_size is not None:
            if self.kind != "open_hole":
                raise InputError(
                    f"bit size of {who}", self.bit_size, "only for an open-hole section"
                )
            object.__setattr__(
                self, "bit_size", float(check_positive(f"bit size of {who}", self.bit_size, "m"))
            )

    @property
    def is_open_hole(self) -> bool:
        return self.kind == "open_hole"


@dataclass(frozen=True, eq=False)
class Hole:
    """The hole as a set of sections; the innermost inside diameter governs at each depth.

    Parameters
    ----------
    sections : sequence of HoleSection
        Casing, liner and open-hole sections; together they must cover MD 0 to ``depth``.
    depth : float, optional
        Hole depth (MD) [m]; default the deepest section bottom.  A shoe below it is an error.

    Notes
    -----
    Warnings (as :attr:`notes`): open-hole diameter below its bit size; effective diameter above
    1.3 × bit size (common practice).  Use :meth:`from_casing` to build the usual layout: casing
    and liner strings plus the open hole below the deepest shoe.

    Examples
    --------
    9-5/8 in casing (8.681 in ID) to 1,500 m, then 8-1/2 in hole with a 10 % washout
    (diameter ratio 1.1, 9.35 in) to 3,000 m; at the shoe the smaller diameter governs:

    >>> from calc.units import from_si, to_si
    >>> casing = HoleSection("9-5/8 in casing", 0.0, 1500.0, to_si(8.681, "in"))
    >>> h = Hole.from_casing([casing], 3000.0, bit_size=to_si(8.5, "in"), washout_factor=1.1)
    >>> [round(from_si(h.diameter_at(md), "in"), 3) for md in (1000.0, 1500.0, 2500.0)]
    [8.681, 8.681, 9.35]
    >>> h.boundaries().tolist()
    [0.0, 1500.0, 3000.0]
    """

    sections: tuple[HoleSection, ...]
    depth: float | None = None
    notes: tuple[Note, ...] = field(init=False, repr=False)
    _top: np.ndarray = field(init=False, repr=False)
    _bottom: np.ndarray = field(init=False, repr=False)
    _dia: np.ndarray = field(init=False, repr=False)

    def __post_init__(self):
        secs = tuple(self.sections)
        if not secs:
            raise InputError("hole sections", 0, "at least one section")
        for s in secs:
            if not isinstance(s, HoleSection):
                raise InputError("hole section", s, "HoleSection objects")
        object.__setattr__(self, "sections", secs)
        deepest = max(s.bottom for s in secs)
        depth = deepest if self.depth is None else float(check_positive("hole depth", self.depth))
        object.__setattr__(self, "depth", depth)
        top = np.array([s.top for s in secs])
        bottom = np.array([s.bottom for s in secs])
        _check_coverage(secs, top, bottom, depth)
        object.__setattr__(self, "notes", tuple(n for s in secs for n in _size_notes(s)))
        for name, arr in (
            ("_top", top),
            ("_bottom", bottom),
            ("_dia", np.array([s.diameter for s in secs])),
        ):
            arr.setflags(write=False)
            object.__setattr__(self, name, arr)

    @classmethod
    def from_casing(
        cls,
        casings: Iterable[HoleSection],
        depth: float,
        bit_size: float,
        diameter: float | None = None,
        washout_factor: float | None = None,
        name: str = "open hole",
    ) -> Hole:
        """Casing/liner strings plus the open hole from the deepest shoe to ``depth`` [m].

        The open-hole effective diameter [m] is ``diameter`` (caliper or assumed enlargement),
        else ``bit_size × washout_factor`` (a *diameter* ratio, ≥ 1 normally), else the bit size.
        """
        casings = tuple(casings)
        bit = float(check_positive("open-hole bit size", bit_size, "m"))
        if diameter is not None and washout_factor is not None:
            raise InputError(
                "open-hole diameter", (diameter, washout_factor), "a diameter or a washout factor"
            )
        if washout_factor is not None:
            dia = bit * float(check_positive("washout factor", washout_factor))
        elif diameter is not None:
            dia = float(check_positive("open-hole diameter", diameter, "m"))
        else:
            dia = bit
        shoe = max((c.bottom for c in casings), default=0.0)
        secs = list(casings)
        if depth > shoe:
            secs.append(HoleSection(name, shoe, depth, dia, "open_hole", bit_size=bit))
        return cls(tuple(secs), depth=depth)

    # ------------------------------------------------------------------------- look-ups
    def section_index_at(self, md):
        """Index into :attr:`sections` of the innermost section covering ``md`` [m] (vectorised).

        At a boundary between sections the one with the smaller ID wins.
        """
        mdv = np.asarray(md, dtype=float)
        if np.any((mdv < 0) | (mdv > self.depth + 1e-9)):
            bad = mdv[(mdv < 0) | (mdv > self.depth + 1e-9)].ravel()[0]
            raise InputError(
                "MD",
                float(bad),
                "within the hole, 0 to {depth}",
                kind="depth",
                values=(Value("depth", float(self.depth), "depth"),),
            )
        cover = (mdv[..., None] >= self._top - 1e-12) & (mdv[..., None] <= self._bottom + 1e-12)
        dia = np.where(cover, self._dia, np.inf)
        idx = np.argmin(dia, axis=-1)
        return int(idx) if idx.ndim == 0 else idx

    def diameter_at(self, md):
        """Governing (innermost) inside diameter [m] at ``md`` [m] (vectorised)."""
        out = self._dia[self.section_index_at(md)]
        return float(out) if np.ndim(out) == 0 else out

    def boundaries(self) -> np.ndarray:
        """Sorted unique section tops and bottoms within [0, depth] [m]."""
        b = np.concatenate([self._top, self._bottom, [0.0, self.depth]])
        return np.unique(np.clip(b, 0.0, self.depth))

    def cased_above(self, md: float) -> Sequence[HoleSection]:
        """Casing and liner sections with their top above ``md`` (those a bit at ``md`` passed)."""
        return [s for s in self.sections if not s.is_open_hole and s.top < md]


def _check_coverage(secs, top: np.ndarray, bottom: np.ndarray, depth: float) -> None:
    """Every section ends at or above the hole depth, and together they cover 0 → depth."""
    for s in secs:
        if s.bottom > depth + 1e-9:
            what = "shoe" if not s.is_open_hole else "bottom"
            raise InputError(
                f"{what} of '{s.name}'",
                s.bottom,
                "<= hole depth {depth}",
                problem=f"{what} below the hole depth",
                kind="depth",
                values=(Value("depth", depth, "depth"),),
            )
    reach = 0.0
    for k in np.argsort(top):
        if top[k] > reach + 1e-9:
            raise InputError(
                "hole sections",
                reach,
                "sections covering every depth from surface to the hole depth (the next "
                "section starts at {next_top})",
                problem="gap in the sections below this depth",
                kind="depth",
                values=(Value("next_top", float(top[k]), "depth"),),
            )
        reach = max(reach, bottom[k])
    if reach < depth - 1e-9:
        raise InputError(
            "hole sections",
            reach,
            "sections down to the hole depth {depth}",
            problem="nothing below this depth",
            kind="depth",
            values=(Value("depth", depth, "depth"),),
        )


def _size_notes(s: HoleSection) -> list[Note]:
    """Doubtful open-hole sizes: below the bit size, or washed out beyond WASHOUT_WARN."""
    if not (s.is_open_hole and s.bit_size is not None):
        return []
    ratio = s.diameter / s.bit_size
    if ratio < 1.0:
        return [
            Note(
                "warning",
                "open_hole_below_bit",
                "open-hole diameter {diameter} is below the bit size {bit_size}: "
                "under-gauge hole or a typing error?",
                s.name,
                values=(
                    Value("diameter", s.diameter, "diameter"),
                    Value("bit_size", s.bit_size, "diameter"),
                ),
            )
        ]
    if ratio > WASHOUT_WARN:
        return [
            Note(
                "warning",
                "large_washout",
                "effective diameter {diameter} is {ratio:.2f} × the bit size (above "
                "~1.3, common practice): check the caliper or washout factor",
                s.name,
                values=(Value("diameter", s.diameter, "diameter"), Value("ratio", float(ratio))),
            )
        ]
    return []
