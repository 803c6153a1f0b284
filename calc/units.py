"""Units: the one pint registry, oilfield units, named unit systems, SI at the boundary.

Everything inside :mod:`calc` is SI (m, kg, s, Pa, m³/s, kg/m³, Pa·s, 1/s, K).  Values are
brought to SI where they enter and taken out where they leave, through :func:`to_si` and
:func:`from_si`, which use this module's single registry :data:`ureg`.

Oilfield units added to pint's defaults (every factor is exact from the definitions in
NIST SP 811 (2008), Appendix B: ft = 0.3048 m, in = 0.0254 m, lb = 0.45359237 kg,
lbf = lb·gₙ, gₙ = 9.80665 m/s², US gal = 231 in³, oil barrel = 42 US gal):

================  ==========================================  ==========================
name              definition                                  trade spelling accepted
================  ==========================================  ==========================
ppg               pound / US gallon                           ppg, lb/gal, lbm/gal
gpm               US gallon / minute                          gpm, gal/min
bbl_oil           42 US gallons (pint's ``oil_barrel``)       bbl, bbls
bpm_oil           oil barrel / minute                         bbl/min, bpm
lbf_per_100ft_sq        lbf / (100 ft²)                             lbf/100ft2, lb/100ft², #/100ft2
sg                1000 kg/m³ (specific gravity to water)      sg, SG, s.g.
in32              inch / 32 (nozzle sizes)                    32nds, /32
================  ==========================================  ==========================

pint's own names that clash with the trade are *not* redefined (the registry refuses
redefinitions): pint's ``bbl`` is the 31.5-gallon barrel, ``cp`` is a cup and ``bpm`` would be
beats per minute.  User text goes through :func:`parse_unit`, which maps the trade spellings
(``bbl``, ``bbl/min``, ``bpm``, ``cp``) to the oilfield meanings before pint sees them.

Named unit systems (:data:`UNIT_SYSTEMS`): ``"oilfield"`` (US field units), ``"si"`` (strict
SI) and ``"metric"`` (metric field units: m, mm, kg/m³, bar, L/min, mPa·s, Pa).  Each maps a
quantity kind (``"pressure"``, ``"density"`` …) to a unit; :func:`unit_for` looks one up.

A consistency index K has units of stress × sⁿ; since the sⁿ part is already SI, K converts
with the factor of its stress unit (lbf·sⁿ/100 ft² like lbf/100 ft², Pa·sⁿ like Pa).
"""

from __future__ import annotations

import re
from functools import lru_cache

import numpy as np
import pint

from calc.errors import InputError
from calc.kinds import KINDS, LABELS, UNIT_SYSTEMS

__all__ = [
    "G_N",
    "KINDS",
    "UNIT_SYSTEMS",
    "convert",
    "from_si",
    "label",
    "parse_unit",
    "si_factor",
    "to_si",
    "unit_for",
    "ureg",
]

#: Standard acceleration of gravity gₙ [m/s²] (CGPM 1901; NIST SP 811 App. B, exact).
G_N = 9.80665

ureg = pint.UnitRegistry(on_redefinition="raise", autoconvert_offset_to_baseunit=True)
for _definition in (
    "ppg = pound / gallon",
    "gpm = gallon / minute",
    "bbl_oil = oil_barrel",
    "bpm_oil = oil_barrel / minute",
    "lbf_per_100ft_sq = force_pound / (100 * foot ** 2)",
    "sg = 1000 * kilogram / meter ** 3",
    "in32 = inch / 32",
    "ppf = pound / foot",
    "deg_per_100ft = degree / (100 * foot)",
    "deg_per_30m = degree / (30 * meter)",
    "degF_per_100ft = delta_degF / (100 * foot)",
    "degC_per_100m = kelvin / (100 * meter)",
):
    ureg.define(_definition)

# Trade spellings → registry expressions.  Applied to whole tokens of the user's text, in order.
_TEXT_ALIASES: tuple[tuple[str, str], ...] = (
    (r"lbf?s\^?n/100\s*ft(?:2|²|\^2|\*\*2)", "lbf_per_100ft_sq"),  # K in lbf·sⁿ/100ft²
    (r"(?:lbf?|#)\s*/\s*100\s*(?:ft|sq\.?\s*ft)(?:2|²|\^2|\*\*2)?", "lbf_per_100ft_sq"),
    (r"lbm?/gal", "ppg"),
    (r"bbls?\s*/\s*min", "bpm_oil"),
    (r"bpm", "bpm_oil"),
    (r"bbls?", "bbl_oil"),
    (r"gal\s*/\s*min", "gpm"),
    (r"lpm", "L/min"),
    (r"s\.g\.|SG", "sg"),
    (r"cp|cps", "cP"),
    (r"mpa[·.*]s|mPa[·.]s", "mPa*s"),
    (r"pa[·.]s|Pa[·.]s", "Pa*s"),
    (r"32nds?|/32|1/32\s*in", "in32"),
    (r"(?:°F|deg\s*F|degF)\s*/\s*100\s*ft", "degF_per_100ft"),
    (r"(?:°C|deg\s*C|degC)\s*/\s*100\s*m", "degC_per_100m"),
    (r"°F|deg\s*F|degF|F°", "degF"),
    (r"°C|deg\s*C|degC|C°", "degC"),
    (r"hrs?", "hour"),
    (r"klbf|klb", "kip"),
    (r"sec", "second"),
)
_ALIAS_RES = tuple(
    (re.compile(rf"(?<![A-Za-z_]){pat}(?![A-Za-z_0-9])"), rep) for pat, rep in _TEXT_ALIASES
)
_POWER_RE = re.compile(r"(?<=[A-Za-z])([23])(?![0-9])")  # ft2 → ft**2, m3 → m**3
_SUPER = {"²": "**2", "³": "**3", "·": "*", "⋅": "*", "μ": "u", "µ": "u"}


#: Longest unit text accepted (characters).  The longest spelling the program writes or
#: documents is under 20 characters (``lbf·s^n/100ft²``); the bound keeps parsing time
#: small and fixed (pint's parser and the alias patterns grow faster than linearly with
#: the length of unknown text: 40,000 characters took over 10 s).
MAX_UNIT_TEXT = 64


def label(unit: str) -> str:
    """Display label for a unit text, e.g. ``label("lbf_per_100ft_sq") == "lbf/100ft²"``.

    Examples
    --------
    >>> label("lbf_per_100ft_sq"), label(unit_for("density", "metric"))
    ('lbf/100ft²', 'kg/m³')
    """
    return LABELS.get(unit, unit)


def _normalise(text: str) -> str:
    out = text.strip()
    for k, v in _SUPER.items():
        out = out.replace(k, v)
    for rx, rep in _ALIAS_RES:
        out = rx.sub(rep, out)
    out = _POWER_RE.sub(r"**\1", out)
    return out


@lru_cache(maxsize=512)
def parse_unit(text: str, kind: str | None = None) -> pint.Unit:
    """Parse a unit as a user writes it and return the registry unit.

    Trade spellings are mapped first (``bbl`` → 42-gal barrel, ``cp`` → centipoise,
    ``lbf/100ft2``, ``ppg``, ``32nds`` …).  With ``kind`` given (a key of :data:`KINDS`),
    the unit must have that kind's dimensionality.

    Raises
    ------
    InputError
        unknown unit text, text longer than :data:`MAX_UNIT_TEXT` characters, or a unit of
        the wrong dimension for ``kind``.

    Examples
    --------
    >>> round(si_factor("bbl"), 12)
    0.158987294928
    >>> str(parse_unit("cp"))
    'centipoise'
    """
    if kind == "dimensionless" and isinstance(text, str) and text.strip() in ("", "1", "-"):
        return ureg.dimensionless
    if not isinstance(text, str) or not text.strip():
        raise InputError("unit", text, "a unit name such as 'psi', 'ppg', 'gpm', 'kg/m3'")
    if len(text) > MAX_UNIT_TEXT:
        raise InputError(
            "unit",
            text,
            f"a unit name of at most {MAX_UNIT_TEXT} characters such as 'psi', 'ppg', 'gpm'",
            problem="too long",
        )
    expr = _normalise(text)
    try:
        unit = ureg.parse_units(expr)
    except Exception as exc:  # pint raises several types for bad text
        raise InputError(
            "unit", text, "a known unit (e.g. psi, bar, ppg, sg, kg/m3, gpm, bbl/min, L/min, cP)"
        ) from exc
    if kind is not None:
        if kind not in KINDS:
            raise InputError("unit kind", kind, ", ".join(sorted(KINDS)))
        want = KINDS[kind]
        got = ureg.Quantity(1.0, unit).dimensionality
        if want == "":
            ok = got == ureg.Quantity(1.0, "").dimensionality
        else:
            ok = got == ureg.get_dimensionality(want)
        if not ok:
            examples = ", ".join(label(UNIT_SYSTEMS[s][kind]) for s in ("oilfield", "metric", "si"))
            raise InputError(
                f"unit for {kind.replace('_', ' ')}", text, f"a unit of {kind} such as {examples}"
            )
    return unit


@lru_cache(maxsize=512)
def _affine(text: str, kind: str | None) -> tuple[float, float]:
    """(scale, offset) with value_SI = scale·value + offset."""
    unit = parse_unit(text, kind)
    q0 = ureg.Quantity(0.0, unit).to_base_units().magnitude
    q1 = ureg.Quantity(1.0, unit).to_base_units().magnitude
    return float(q1 - q0), float(q0)


def si_factor(unit: str, kind: str | None = None) -> float:
    """Multiplier that takes a value in ``unit`` to SI base units (non-offset units only).

    Examples
    --------
    The gallon is exactly 231 in³ and the inch 0.0254 m (international yard and pound, 1959),
    so 1 gpm = 231·0.0254³/60 m³/s and the oil barrel is 42 gallons:

    >>> round(si_factor("gpm") / (231 * 0.0254**3 / 60), 12)
    1.0
    >>> round(si_factor("bbl") / si_factor("gal"), 12)
    42.0
    """
    scale, offset = _affine(unit, kind)
    if offset != 0.0:
        raise InputError("unit", unit, "a unit without an offset (use to_si for temperatures)")
    return scale


def _as_values(value, name: str):
    try:
        arr = np.asarray(value, dtype=float)
    except (TypeError, ValueError) as exc:
        raise InputError(name, value, "a number or an array of numbers") from exc
    return arr


def to_si(value, unit: str, kind: str | None = None, name: str = "value"):
    """Convert ``value`` (scalar or array) from ``unit`` to SI base units.

    Examples
    --------
    1 psi = 0.45359237 kg · 9.80665 m/s² / (0.0254 m)² exactly; 1 ppg = 0.45359237 kg per
    231·0.0254³ m³ (119.826 kg/m³):

    >>> round(to_si(1.0, "psi"), 9)
    6894.757293168
    >>> round(to_si(11.0, "ppg", kind="density"), 4)
    1318.0907
    """
    scale, offset = _affine(unit, kind)
    arr = _as_values(value, name)
    out = arr * scale + offset
    return float(out) if out.ndim == 0 else out


def from_si(value, unit: str, kind: str | None = None, name: str = "value"):
    """Convert ``value`` from SI base units to ``unit`` (inverse of :func:`to_si`).

    Examples
    --------
    Water at 1000 kg/m³ is 8.345 ppg and 1.0 sg; 1 bar is 14.504 psi:

    >>> round(from_si(1000.0, "ppg"), 3), round(from_si(1000.0, "sg"), 3)
    (8.345, 1.0)
    >>> round(from_si(1e5, "psi"), 3)
    14.504
    """
    scale, offset = _affine(unit, kind)
    arr = _as_values(value, name)
    out = (arr - offset) / scale
    return float(out) if out.ndim == 0 else out


def convert(value, from_unit: str, to_unit: str, kind: str | None = None):
    """Convert between two units of the same dimension.

    Examples
    --------
    12.43 bbl/min is 12.43·42 = 522.06 gpm (42 US gallons to the oil barrel):

    >>> round(convert(12.43, "bbl/min", "gpm"), 6)
    522.06
    >>> round(convert(68, "cP", "Pa*s"), 6)
    0.068
    """
    si = to_si(value, from_unit, kind)
    if kind is None:
        a = ureg.Quantity(1.0, parse_unit(from_unit)).dimensionality
        b = ureg.Quantity(1.0, parse_unit(to_unit)).dimensionality
        if a != b:
            raise InputError("unit", to_unit, f"a unit with the dimension of '{from_unit}'")
    return from_si(si, to_unit, kind)


def unit_for(kind: str, system: str = "oilfield") -> str:
    """Unit text for a quantity kind in a named unit system.

    Examples
    --------
    >>> unit_for("pressure", "metric")
    'bar'
    >>> [label(unit_for("density", s)) for s in ("oilfield", "metric", "si")]
    ['ppg', 'kg/m³', 'kg/m³']
    """
    sys_ = system.strip().lower() if isinstance(system, str) else system
    if sys_ not in UNIT_SYSTEMS:
        raise InputError("unit system", system, ", ".join(UNIT_SYSTEMS))
    if kind not in UNIT_SYSTEMS[sys_]:
        raise InputError("quantity kind", kind, ", ".join(UNIT_SYSTEMS[sys_]))
    return UNIT_SYSTEMS[sys_][kind]
