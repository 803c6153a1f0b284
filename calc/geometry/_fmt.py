"""Message formatting for geometry checks: SI values shown in the user's unit system."""

from __future__ import annotations

from calc.units import from_si, label, unit_for


def show(value_si: float, kind: str, units: str = "oilfield") -> str:
    """``value_si`` (SI) as text in the unit of ``kind`` in the named unit system.

    >>> show(0.168275, "diameter")
    '6.625 in'
    >>> show(2423.16, "depth")
    '7,950 ft'
    """
    unit = unit_for(kind, units)
    v = from_si(float(value_si), unit)
    if kind in ("depth", "length"):
        text = f"{v:,.0f}" if abs(v) >= 100 else f"{v:,.1f}"
    else:
        text = f"{v:.5g}" if abs(v) < 1000 else f"{v:,.0f}"
    return f"{text} {label(unit)}"
