"""The drill string, listed from the bit upwards: BHA tools, collars, heavy-weight and drill pipe.

All lengths and diameters in metres.  One component may have ``length="fill"``: it takes the
length that brings the string to surface for a given bit depth.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np

from calc.errors import InputError, check_nonnegative, check_order, check_positive, check_range
from calc.notes import Note
from calc.units import to_si
from calc.values import Value

__all__ = ["FILL", "DrillString", "StringComponent"]

FILL = "fill"
#: Default joint length when tool joints are given without one: 30 ft, API range 2 (common
#: practice).
DEFAULT_JOINT_LENGTH = to_si(30.0, "ft")
#: Default tool-joint (upset) length per joint: 1.5 ft (a tool joint is about 1.5–3 ft
#: per 30 ft joint; from memory, not yet checked against the source — calc/METHODS.md §13.2).
DEFAULT_TOOL_JOINT_LENGTH = to_si(1.5, "ft")
#: Tolerance when the component lengths must add up to the bit depth [m].
LENGTH_TOLERANCE = 0.01


@dataclass(frozen=True)
class StringComponent:
    """One string component (a tool, a run of collars, heavy-weight or drill pipe).

    Parameters
    ----------
    name : str
    od, id : float
        Body outside and inside diameters [m]; 0 ≤ id < od.
    length : float or "fill"
        Length [m], or ``"fill"`` to fill to surface (at most one component per string).
    tool_joint_od, tool_joint_id : float, optional
        Tool-joint (upset) outside and inside diameters [m]; OD ≥ body OD, 0 ≤ ID < OD.
        Without ``tool_joint_od`` the component is treated as uniform.
    joint_length : float, optional
        Length of one joint, tool joint included [m]; default 30 ft (range 2, common practice).
    tool_joint_length : float, optional
        Length of the tool joint (box + pin upset) per joint [m]; default 1.5 ft (from memory,
        not yet checked against the source — calc/METHODS.md §13.2).
    float_valve : bool
        The component carries a float (non-return) valve.
    standoff : float, optional
        Stand-off ratio 0 ≤ s ≤ 1 of this component in the hole (1 centred, 0 on the wall);
        given, the annulus around it is eccentric by
        :func:`calc.flow.eccentricity.eccentricity_from_standoff` (calc/METHODS.md §22);
        without it, the loop's single eccentricity (default concentric) applies.

    Attributes
    ----------
    tool_joint_fraction : float
        ``tool_joint_length / joint_length`` (0 without tool joints): the share of the
        component's length given to tool-joint sub-intervals (calc/METHODS.md §13.2).
    notes : tuple of Note
        Interpretations made (defaulted joint or tool-joint length).

    Examples
    --------
    5 in drill pipe filling to surface, with 6-5/8 in tool joints 0.5 m long in 9.4 m joints:
    the joints take 0.5/9.4 = 5.3 % of its length:

    >>> from calc.units import to_si
    >>> dp = StringComponent("drill pipe", to_si(5.0, "in"), to_si(4.276, "in"), "fill",
    ...                      tool_joint_od=to_si(6.625, "in"), tool_joint_id=to_si(3.25, "in"),
    ...                      joint_length=9.4, tool_joint_length=0.5)
    >>> dp.is_fill, dp.has_tool_joints, round(dp.tool_joint_fraction, 4)
    (True, True, 0.0532)
    """

    name: str
    od: float
    id: float
    length: float | str
    tool_joint_od: float | None = None
    tool_joint_id: float | None = None
    joint_length: float | None = None
    tool_joint_length: float | None = None
    float_valve: bool = False
    standoff: float | None = None
    tool_joint_fraction: float = field(init=False)
    notes: tuple[Note, ...] = field(init=False, repr=False)

    def __post_init__(self):
        who = f"'{self.name}'"
        od = float(check_positive(f"OD of {who}", self.od, "m"))
        idd = float(check_nonnegative(f"ID of {who}", self.id, "m"))
        check_order(f"ID of {who}", idd, "<", od, "OD", "diameter", "ID at or above the OD")
        object.__setattr__(self, "od", od)
        object.__setattr__(self, "id", idd)
        if isinstance(self.length, str):
            if self.length.strip().lower() != FILL:
                raise InputError(f"length of {who}", self.length, "a length in m or 'fill'")
            object.__setattr__(self, "length", FILL)
        else:
            object.__setattr__(
                self, "length", float(check_positive(f"length of {who}", self.length, "m"))
            )
        notes = []
        frac = 0.0
        if self.tool_joint_od is None:
            for extra in ("tool_joint_id", "joint_length", "tool_joint_length"):
                if getattr(self, extra) is not None:
                    raise InputError(
                        f"{extra.replace('_', ' ')} of {who}",
                        getattr(self, extra),
                        "only together with a tool-joint OD",
                    )
        else:
            tj_od = float(check_positive(f"tool-joint OD of {who}", self.tool_joint_od, "m"))
            check_order(f"tool-joint OD of {who}", tj_od, ">=", od, "body OD", "diameter")
            tj_id = idd if self.tool_joint_id is None else self.tool_joint_id
            tj_id = float(check_nonnegative(f"tool-joint ID of {who}", tj_id, "m"))
            check_order(f"tool-joint ID of {who}", tj_id, "<", tj_od, "tool-joint OD", "diameter")
            jl, tjl = self.joint_length, self.tool_joint_length
            if jl is None:
                jl = DEFAULT_JOINT_LENGTH
                notes.append(
                    Note(
                        "info",
                        "default_joint_length",
                        "joint length not given: 30 ft assumed (range 2)",
                        self.name,
                    )
                )
            if tjl is None:
                tjl = DEFAULT_TOOL_JOINT_LENGTH
                notes.append(
                    Note(
                        "info",
                        "default_tool_joint_length",
                        "tool-joint length not given: 1.5 ft per joint assumed",
                        self.name,
                    )
                )
            jl = float(check_positive(f"joint length of {who}", jl, "m"))
            tjl = float(check_positive(f"tool-joint length of {who}", tjl, "m"))
            check_order(f"tool-joint length of {who}", tjl, "<", jl, "joint length", "length")
            if jl < to_si(15.0, "ft") or jl > to_si(50.0, "ft"):
                notes.append(
                    Note(
                        "warning",
                        "odd_joint_length",
                        "joint length {length} is outside ~15–50 ft: metres typed as feet, or "
                        "the reverse?",
                        self.name,
                        values=(Value("length", jl, "length"),),
                    )
                )
            for name, v in (
                ("tool_joint_od", tj_od),
                ("tool_joint_id", tj_id),
                ("joint_length", jl),
                ("tool_joint_length", tjl),
            ):
                object.__setattr__(self, name, v)
            frac = tjl / jl
        object.__setattr__(self, "float_valve", bool(self.float_valve))
        if self.standoff is not None:
            so = float(check_range(f"stand-off of {who}", self.standoff, 0.0, 1.0))
            object.__setattr__(self, "standoff", so)
        object.__setattr__(self, "tool_joint_fraction", frac)
        object.__setattr__(self, "notes", tuple(notes))

    @property
    def has_tool_joints(self) -> bool:
        return self.tool_joint_od is not None

    @property
    def is_fill(self) -> bool:
        return self.length == FILL


@dataclass(frozen=True, eq=False)
class DrillString:
    """The string from the bit upwards.

    Parameters
    ----------
    components : sequence of StringComponent
        Bottom (bit end) first.  At most one may have ``length="fill"``.

    Examples
    --------
    >>> s = DrillString([StringComponent("collars", 0.165, 0.071, 100.0),
    ...                  StringComponent("pipe", 0.127, 0.1086, "fill")])
    >>> [round(float(x), 3) for x in s.lengths_for(1000.0)]
    [100.0, 900.0]
    """

    components: tuple[StringComponent, ...]
    notes: tuple[Note, ...] = field(init=False, repr=False)

    def __post_init__(self):
        comps = tuple(self.components)
        if not comps:
            raise InputError("drill string", 0, "at least one component")
        for c in comps:
            if not isinstance(c, StringComponent):
                raise InputError("string component", c, "StringComponent objects")
        fills = [c.name for c in comps if c.is_fill]
        if len(fills) > 1:
            raise InputError(
                "components with length 'fill'", ", ".join(fills), "at most one per string"
            )
        object.__setattr__(self, "components", comps)
        object.__setattr__(self, "notes", tuple(n for c in comps for n in c.notes))

    @property
    def fixed_length(self) -> float:
        """Sum of the lengths of the components that are not ``"fill"`` [m]."""
        return float(sum(c.length for c in self.components if not c.is_fill))

    def lengths_for(self, bit_depth: float) -> np.ndarray:
        """Component lengths [m], bottom up, for the bit at MD ``bit_depth`` [m].

        Raises
        ------
        InputError
            the fixed components are longer than the bit depth ("string longer than the
            hole"), or (no fill component) they do not add up to the bit depth within 1 cm.
        """
        depth = float(check_positive("bit depth", bit_depth, "m"))
        fixed = self.fixed_length
        has_fill = any(c.is_fill for c in self.components)
        if fixed > depth + LENGTH_TOLERANCE or (has_fill and fixed >= depth):
            raise InputError(
                "drill string length",
                fixed,
                "< bit depth {depth}"
                + (
                    " (the rest of the string is filled by the 'fill' component)"
                    if has_fill
                    else ""
                ),
                problem="string longer than the bit depth",
                kind="depth",
                values=(Value("depth", depth, "depth"),),
            )
        if not has_fill and abs(fixed - depth) > LENGTH_TOLERANCE:
            raise InputError(
                "drill string length",
                fixed,
                "= bit depth {depth}, or one component with length 'fill'",
                problem="string does not reach surface",
                kind="depth",
                values=(Value("depth", depth, "depth"),),
            )
        out = np.array([depth - fixed if c.is_fill else c.length for c in self.components])
        if not has_fill:
            out *= depth / fixed  # absorb the sub-centimetre mismatch
        return out

    def fill_note(self, bit_depth: float) -> tuple[Note, ...]:
        """An info note stating the length given to the ``"fill"`` component, if any."""
        lengths = self.lengths_for(bit_depth)
        for c, length in zip(self.components, lengths, strict=True):
            if c.is_fill:
                msg = "'{name}' filled to surface: {length}"
                vals = (Value("name", c.name), Value("length", float(length), "length"))
                return (Note("info", "string_filled", msg, c.name, values=vals),)
        return ()

    def component_names(self) -> Sequence[str]:
        return [c.name for c in self.components]
