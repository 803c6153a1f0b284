"""Bit hydraulics: nozzles and TFA, nozzle velocity, bit pressure drop, power, HSI, jet impact,
and nozzle selection for maximum bit hydraulic power or maximum jet impact force.

Modules: :mod:`~calc.bit.nozzles` (sizes, parsing, TFA), :mod:`~calc.bit.hydraulics` (the
formulas below, :class:`Bit`, :func:`bit_hydraulics`), :mod:`~calc.bit.optimisation`
(parasitic-loss law, optimum nozzles, nozzle sets from stock).  Every public name is
importable from :mod:`calc.bit`.

SI throughout (m, m², m³/s, kg/m³, Pa, W, N).  Nozzle sizes are given as the trade designates
them, in whole 32nds of an inch ("12" = 12/32 in); they are converted to metres here.

The governing relations (calc/METHODS.md §8.1–§8.6; SI forms derived from Bernoulli with a discharge
coefficient C_d):

* TFA  A = Σ (π/4)·d_i²
* nozzle (jet) velocity  v_n = Q/A
* bit pressure drop  ΔP_b = ρQ²/(2C_d²A²)
* bit hydraulic power  P_b = ΔP_b·Q;  HSI = P_b/(π d_bit²/4)
* jet impact force  F_j = C_d·Q·√(2ρΔP_b)  (= ρ·Q·C_d·√(2ΔP_b/ρ))

References
----------
.. [1] Bourgoyne, A.T., Millheim, K.K., Chenevert, M.E., Young, F.S. (1986). *Applied Drilling
   Engineering*, SPE Textbook Series 2, ch. 4 (bit hydraulics, nozzle selection).
.. [2] Guo, B., Liu, G. (2011). *Applied Drilling Circulation Systems: Hydraulics, Calculations
   and Models*. Gulf Professional Publishing, eqs. 4.15–4.21.
.. [3] Lyons, W.C. (ed.) (1996). *Standard Handbook of Petroleum & Natural Gas Engineering*,
   vol. 1, eqs. 4-77, 4-78, 4-81.
"""

from calc.bit.hydraulics import (
    DEFAULT_DISCHARGE_COEFFICIENT,
    HSI_WARN,
    JET_VELOCITY_WARN,
    Bit,
    BitHydraulics,
    bit_hydraulic_power,
    bit_hydraulics,
    bit_pressure_drop,
    hsi,
    impact_force,
    nozzle_velocity,
)
from calc.bit.nozzles import NOZZLE_RANGE, NOZZLE_UNIT, NozzleSet, parse_nozzles, total_flow_area
from calc.bit.optimisation import (
    OPTIMISATION_CRITERIA,
    TURBULENT_PARASITIC_EXPONENT,
    NozzleCombination,
    NozzleOptimum,
    ParasiticLoss,
    fit_parasitic_loss,
    nozzle_combinations,
    optimum_nozzles,
    parasitic_loss_from_model,
)

__all__ = [
    "DEFAULT_DISCHARGE_COEFFICIENT",
    "HSI_WARN",
    "JET_VELOCITY_WARN",
    "NOZZLE_RANGE",
    "NOZZLE_UNIT",
    "OPTIMISATION_CRITERIA",
    "TURBULENT_PARASITIC_EXPONENT",
    "Bit",
    "BitHydraulics",
    "NozzleCombination",
    "NozzleOptimum",
    "NozzleSet",
    "ParasiticLoss",
    "bit_hydraulic_power",
    "bit_hydraulics",
    "bit_pressure_drop",
    "fit_parasitic_loss",
    "hsi",
    "impact_force",
    "nozzle_combinations",
    "nozzle_velocity",
    "optimum_nozzles",
    "parasitic_loss_from_model",
    "parse_nozzles",
    "total_flow_area",
]
