"""Nozzle sizes in 32nds of an inch: parsing, port check and total flow area (TFA).

A = Σ (π/4)·d_i², d_i = N_i·(1/32 in).

References
----------
Bourgoyne, A.T., Millheim, K.K., Chenevert, M.E., Young, F.S. (1986). *Applied Drilling
Engineering*, SPE Textbook Series 2, ch. 4.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

import numpy as np

from calc.errors import InputError
from calc.flow.area import cross_section_area
from calc.notes import Note
from calc.units import si_factor

__all__ = ["NOZZLE_RANGE", "NOZZLE_UNIT", "NozzleSet", "parse_nozzles", "total_flow_area"]

#: One 32nd of an inch [m] (in = 0.0254 m exactly, NIST SP 811 via calc.units).
NOZZLE_UNIT = si_factor("in") / 32.0
#: Usual nozzle sizes, 6/32 to 32/32 in (common practice, calc/METHODS.md §16.4).
NOZZLE_RANGE = (6, 32)


@dataclass(frozen=True)
class NozzleSet:
    """Parsed nozzle sizes (32nds of an inch; 0 = blanked) with their port count and notes.

    Examples
    --------
    Lapeyrouse (2002), "Bit nozzle selection" example: three 17/32 in jets, 0.664979 in²
    (printed; exact 3·(π/4)·(17/32)² = 0.6649807 in²):

    >>> from calc.units import from_si
    >>> round(from_si(parse_nozzles("3x17").tfa, "in**2"), 6)
    0.664981
    """

    sizes: tuple[int, ...]
    ports: int | None
    notes: tuple[Note, ...] = ()

    @property
    def tfa(self) -> float:
        """Total flow area [m²]."""
        return total_flow_area(self.sizes)


_GROUP = re.compile(r"^\s*(\d+)\s*[x×*]\s*(\d+(?:\.\d*)?)\s*$", re.IGNORECASE)


def _parse_text(text: str) -> list[float]:
    sizes: list[float] = []
    compact = re.sub(r"\s*([x×*])\s*", r"\1", text.strip())
    for part in re.split(r"[,;+\s]+", compact):
        if not part:
            continue
        m = _GROUP.match(part)
        if m:
            sizes.extend([float(m.group(2))] * int(m.group(1)))
            continue
        try:
            sizes.append(float(part))
        except ValueError as exc:
            raise InputError(
                "nozzles", text, "sizes in 32nds such as '12, 12, 11' or '3x12 3x11'"
            ) from exc
    return sizes


def parse_nozzles(nozzles, ports: int | None = None) -> NozzleSet:
    """Read nozzle sizes in 32nds of an inch ("3x12 3x11", "12,12,11", or a list of numbers).

    Parameters
    ----------
    nozzles : str or sequence of int
        Nozzle sizes in 1/32 in; ``"NxS"`` means N nozzles of size S; 0 is a blanked port.
    ports : int, optional
        Number of nozzle ports of the bit; more nozzles than ports is an error.

    Notes
    -----
    Sizes must be whole 32nds (common practice, calc/METHODS.md §16.4): ``0.375`` is refused with
    the hint "12/32?". Sizes outside 6–32 and fewer nozzles than ports give notes.

    Examples
    --------
    >>> parse_nozzles("3x12 3x11").sizes
    (12, 12, 12, 11, 11, 11)
    """
    raw = _parse_text(nozzles) if isinstance(nozzles, str) else nozzles
    try:
        arr = np.asarray(raw, dtype=float).ravel()
    except (TypeError, ValueError) as exc:
        raise InputError("nozzles", nozzles, "sizes in 32nds of an inch") from exc
    if arr.size == 0:
        raise InputError("nozzles", nozzles, "at least one nozzle size in 32nds")
    if not np.all(np.isfinite(arr)) or np.any(arr < 0):
        bad = arr[~np.isfinite(arr) | (arr < 0)][0]
        raise InputError("nozzle size", float(bad), "whole 32nds of an inch, >= 0 (0 = blanked)")
    frac = np.abs(arr - np.round(arr)) > 1e-9
    if np.any(frac):
        bad = float(arr[frac][0])
        hint = f" ({bad:g} in → {bad * 32:g}/32?)" if bad < 2 else ""
        raise InputError("nozzle size", bad, f"whole 32nds of an inch, e.g. 12{hint}")
    sizes = tuple(round(x) for x in arr)
    notes: list[Note] = []
    if ports is not None:
        if isinstance(ports, bool) or int(ports) != ports or ports <= 0:
            raise InputError("nozzle ports", ports, "a whole number > 0")
        ports = int(ports)
        if len(sizes) > ports:
            raise InputError(
                "nozzle count",
                f"{len(sizes)} nozzles for {ports} ports ({nozzles!s})",
                f"at most {ports} nozzles (one per port; 0 = blanked)",
                problem="nozzles do not match the port count",
            )
        if len(sizes) < ports:
            notes.append(
                Note(
                    "info",
                    "ports_unlisted",
                    f"{ports - len(sizes)} of {ports} ports have no nozzle listed: "
                    "taken as blanked",
                    "bit",
                )
            )
    lo, hi = NOZZLE_RANGE
    odd = [s for s in sizes if s != 0 and not lo <= s <= hi]
    if odd:
        notes.append(
            Note(
                "warning",
                "unusual_nozzle_size",
                f"nozzle size(s) {odd} /32 in outside the usual 6–32: check the unit",
                "bit",
            )
        )
    if all(s == 0 for s in sizes):
        raise InputError("nozzles", nozzles, "at least one open (non-zero) nozzle")
    return NozzleSet(sizes, ports, tuple(notes))


def total_flow_area(nozzles_32nds, ports: int | None = None):
    """Total flow area [m²] of nozzles given in 32nds of an inch.

    A = Σ (π/4)(N_i·in/32)²; in field units TFA[in²] = Σ N_i²/1303.8 (1303.8 = 4096/π).

    Parameters
    ----------
    nozzles_32nds : str, sequence of int, or 2-D array
        Nozzle sizes [1/32 in] (0 = blanked).  A 2-D integer array is read as one nozzle set
        per row and gives one TFA per row (no text parsing or port check).
    ports : int, optional
        Port count (see :func:`parse_nozzles`).

    Examples
    --------
    >>> from calc.units import from_si
    >>> round(from_si(total_flow_area([12, 12, 12, 11, 11, 11]), "in**2"), 4)
    0.6098
    """
    if not isinstance(nozzles_32nds, str) and np.ndim(nozzles_32nds) == 2:
        n = np.asarray(nozzles_32nds, dtype=float)
        return np.sum(cross_section_area(n * NOZZLE_UNIT), axis=-1)
    sizes = np.asarray(parse_nozzles(nozzles_32nds, ports).sizes, dtype=float)
    return float(np.sum(cross_section_area(sizes * NOZZLE_UNIT)))
