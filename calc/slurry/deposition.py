"""Deposition (limit) velocity of a settling slurry in a horizontal pipe.

* Durand (1952): V_D = F_L·√(2gD(S−1)), F_L from Durand's chart, here by the fit of Schiller &
  Herbich (1991), F_L = 1.3·C_v^0.125·(1 − e^(−6.9·d50[mm])).
* Wilson (1979) nomograph, by its fit for the peak over concentration (Wilson et al. 2006):
  V_sm = 8.8·[μ_s(S−1)/0.66]^0.55·D^0.7·d^1.75/(d² + 0.11·D^0.7), D [m], d [mm], μ_s = 0.44.

The governing value is the larger (the line must run above both).  calc/METHODS.md §25.3.

References
----------
Durand, R. (1952). The hydraulic transportation of coal and solid materials in pipes. Proc.
Colloquium on Hydraulic Transport, National Coal Board, London.
Schiller, R. E. & Herbich, J. B. (1991). Sediment transport in pipes. In Herbich (ed.),
Handbook of Dredging Engineering, McGraw-Hill.
Wilson, K. C. (1979). Deposition limit nomograms for particles of various densities in pipeline
flow. Proc. Hydrotransport 6, BHRA, Cranfield, 1-12.
Wilson, K. C., Addie, G. R., Sellgren, A. & Clift, R. (2006). Slurry Transport Using
Centrifugal Pumps, 3rd ed. Springer.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.errors import InputError, check_choice, check_positive
from calc.notes import Note
from calc.registry import Verification
from calc.slurry.methods import DEPOSITION_NAMES, SLURRY_METHODS
from calc.slurry.settling import G
from calc.values import Value

__all__ = [
    "DURAND_RANGE",
    "MU_S",
    "WILSON_RANGE",
    "DepositionResult",
    "deposition_velocities",
    "durand_deposition_velocity",
    "durand_fl",
    "wilson_deposition_velocity",
]

#: coefficient of sliding friction of the solids on the wall, 0.44 (Wilson et al. 2006; from
#: memory, not checked against the source — calc/METHODS.md §25.3)
MU_S = 0.44
#: Durand's data: pipe ID 0.02-0.6 m, d 0.1-25 mm (as summarised second-hand; §25.3)
DURAND_RANGE = {"d_pipe": (0.02, 0.6), "d50": (0.1e-3, 25e-3)}
#: the Wilson nomograph's chart: pipe ID 0.05-1.2 m, d 0.1-5 mm (from memory; §25.3)
WILSON_RANGE = {"d_pipe": (0.05, 1.2), "d50": (0.1e-3, 5e-3)}

_COMMON_CAVEAT = (
    "Horizontal pipe; an inclined line raises the deposition velocity (up to ~30 % near 30°, "
    "Wilson & Tse 1984): not applied (calc/METHODS.md §25.3)."
)


def _check_sizes(d_pipe, d50):
    d_pipe = check_positive("pipe ID", d_pipe, "m")
    d50 = check_positive("d50", d50, "m")
    if np.any(d50 >= d_pipe):
        raise InputError(
            "d50",
            float(np.max(d50)),
            "< the pipe ID {d}",
            kind="diameter",
            values=(Value("d", float(np.min(d_pipe)), "diameter"),),
        )
    return d_pipe, d50


def durand_fl(d50, cv):
    """Durand's F_L by the fit of Schiller & Herbich (1991) [-].

    .. math:: F_L = 1.3\\,C_v^{0.125}\\,[1 - \\exp(-6.9\\,d_{50})], \\quad d_{50}\\ [mm]

    Examples
    --------
    Coarse sand (d50 = 2 mm) at C_v = 0.15 is near Durand's plateau of about 1.0-1.1:

    >>> round(float(durand_fl(2e-3, 0.15)), 3)
    1.026
    """
    d_mm = np.asarray(d50, dtype=float) * 1e3
    return 1.3 * np.asarray(cv, dtype=float) ** 0.125 * (1.0 - np.exp(-6.9 * d_mm))


@SLURRY_METHODS.register(
    "durand_1952_deposition",
    "Durand limit-deposit velocity V_D = F_L·√(2gD(S−1)), F_L from the Schiller & Herbich "
    "fit of Durand's chart",
    "Durand (1952) Colloquium on Hydraulic Transport, NCB London; F_L fit: Schiller & Herbich "
    "(1991) Handbook of Dredging Engineering",
    status=Verification(
        "from_memory",
        "Formula and the F_L fit are recalled; tests/test_slurry.py checks the √D and √(S−1) "
        "scaling exactly and that F_L stays within Durand's chart band 0.4-1.4 (chart values "
        "from memory). No worked example of the sources reproduced.",
        (
            "The F_L fit (1.3, 0.125, 6.9) is from memory, not checked against Schiller & "
            "Herbich (calc/METHODS.md §25.3).",
            "Durand's data: pipe 0.02-0.6 m, d 0.1-25 mm, uniform sands; outside it a note.",
            _COMMON_CAVEAT,
        ),
    ),
)
def durand_deposition_velocity(d_pipe, d50, solids_density, fluid_density, cv):
    """Durand limit-deposit velocity V_D = F_L·√(2gD(S−1)) [m/s].

    Parameters
    ----------
    d_pipe : float
        Pipe ID [m].
    d50 : float
        Median particle size [m].
    solids_density, fluid_density : float
        [kg/m³]; S = ρ_s/ρ_f.
    cv : float
        Delivered volume concentration [-].

    References
    ----------
    Durand (1952); Schiller & Herbich (1991).

    Examples
    --------
    >>> round(float(durand_deposition_velocity(0.1016, 150e-6, 2600.0, 1000.0, 0.12)), 3)
    1.148
    """
    d_pipe, d50 = _check_sizes(d_pipe, d50)
    s = solids_density / fluid_density
    return durand_fl(d50, cv) * np.sqrt(2.0 * G * d_pipe * (s - 1.0))


@SLURRY_METHODS.register(
    "wilson_1979_deposition",
    "Wilson nomograph deposition velocity (peak over concentration), by its closed-form fit "
    "8.8·[μ_s(S−1)/0.66]^0.55·D^0.7·d^1.75/(d² + 0.11·D^0.7)",
    "Wilson (1979) Hydrotransport 6, BHRA; fit in Wilson, Addie, Sellgren & Clift (2006) "
    "Slurry Transport Using Centrifugal Pumps, 3rd ed.",
    status=Verification(
        "from_memory",
        "The fit's constants are recalled; tests/test_slurry.py checks its D^0.7 scaling for "
        "fine grains and its plateau for coarse ones (exact properties of the fit) and the "
        "order of magnitude against Durand. No chart value of the source reproduced.",
        (
            "The constants 8.8, 0.55, 0.66, 1.75, 0.11 and μ_s = 0.44 are from memory, not "
            "checked against the source (calc/METHODS.md §25.3).",
            "The nomograph covers pipe 0.05-1.2 m and d 0.1-5 mm (from memory); outside it a note.",
            _COMMON_CAVEAT,
        ),
    ),
)
def wilson_deposition_velocity(d_pipe, d50, solids_density, fluid_density, mu_s=MU_S):
    """Peak deposition velocity of the Wilson (1979) nomograph, by its fit [m/s].

    .. math:: V_{sm} = 8.8\\left[\\frac{μ_s(S-1)}{0.66}\\right]^{0.55}
              \\frac{D^{0.7} d^{1.75}}{d^2 + 0.11 D^{0.7}}, \\quad D\\ [m],\\ d\\ [mm]

    References
    ----------
    Wilson (1979); Wilson, Addie, Sellgren & Clift (2006).

    Examples
    --------
    >>> round(float(wilson_deposition_velocity(0.1016, 150e-6, 2600.0, 1000.0)), 3)
    1.488
    """
    d_pipe, d50 = _check_sizes(d_pipe, d50)
    s = solids_density / fluid_density
    d_mm = d50 * 1e3
    dp7 = d_pipe**0.7
    return 8.8 * (mu_s * (s - 1.0) / 0.66) ** 0.55 * dp7 * d_mm**1.75 / (d_mm**2 + 0.11 * dp7)


@dataclass(frozen=True)
class DepositionResult:
    """Deposition velocity by each method [m/s], the governing (largest) one and notes."""

    by_method: dict[str, float]
    governing: str
    velocity: float
    notes: tuple[Note, ...] = field(default=())


def _range_notes(name, ranges, d_pipe, d50, subject):
    notes = []
    for key, label, val in (("d_pipe", "pipe ID", d_pipe), ("d50", "d50", d50)):
        lo, hi = ranges[key]
        if not lo <= val <= hi:
            notes.append(
                Note(
                    "warning",
                    "slurry_outside_correlation_range",
                    "{label} {value} is outside the range {lo} to {hi} of the {method} data",
                    subject,
                    values=(
                        Value("label", label),
                        Value("value", float(val), "diameter"),
                        Value("lo", lo, "diameter"),
                        Value("hi", hi, "diameter"),
                        Value("method", name),
                    ),
                )
            )
    return notes


def deposition_velocities(
    d_pipe, d50, solids_density, fluid_density, cv, *, methods=DEPOSITION_NAMES, subject=""
) -> DepositionResult:
    """Deposition velocity of a horizontal line by each named method; the largest governs.

    Examples
    --------
    >>> r = deposition_velocities(0.1016, 150e-6, 2600.0, 1000.0, 0.12)
    >>> r.governing, round(r.velocity, 3)
    ('wilson_1979_deposition', 1.488)
    """
    funcs = {
        "durand_1952_deposition": lambda: durand_deposition_velocity(
            d_pipe, d50, solids_density, fluid_density, cv
        ),
        "wilson_1979_deposition": lambda: wilson_deposition_velocity(
            d_pipe, d50, solids_density, fluid_density
        ),
    }
    ranges = {"durand_1952_deposition": DURAND_RANGE, "wilson_1979_deposition": WILSON_RANGE}
    by = {}
    notes: list[Note] = []
    for m in methods:
        check_choice("deposition method", m, DEPOSITION_NAMES)
        by[m] = float(funcs[m]())
        notes += _range_notes(m, ranges[m], float(d_pipe), float(d50), subject)
    governing = max(by, key=by.get)
    return DepositionResult(by, governing, by[governing], tuple(notes))
