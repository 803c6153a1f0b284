"""Pressure gradient in pipes and annuli for Newtonian, Bingham, power-law and HB fluids.

The ``method`` of these functions is a *friction law*; the hydraulics method a user names
(which also says which viscometer fit feeds pipe and annulus) is resolved to one by
:func:`calc.hydraulics_method.resolve_method`.

Public API (SI throughout):

* :func:`pipe_flow`, :func:`annulus_flow` → :class:`FlowResult`
* :func:`critical_flow_rate` — per interval, the rate where laminar flow ends
* :func:`list_friction_laws` — the registered friction laws (``method="..."``,
  :data:`FRICTION_LAWS`):
  ``api13d_2010_hb`` (default), ``api13d_1995_power_law``, ``newtonian``, ``bingham``,
  ``power_law``, ``exact_laminar``
* :func:`cross_section_area`, :func:`mean_velocity` — A = (π/4)(D2² − D1²), V = Q/A;
* :func:`api_wall_shear` — the API RP 13D (2006/2010) laminar wall shear rate and stress
  (also the annular apparent viscosity of :mod:`calc.cleaning`);
* friction factors in :mod:`calc.flow.friction`, exact laminar solutions in
  :mod:`calc.flow.laminar_exact`, the eccentricity correction in :mod:`calc.flow.eccentricity`.

Newtonian fluid: ``tau_y=0, k=mu, n=1``; Bingham: ``tau_y=YP, k=PV, n=1``; power law:
``tau_y=0, k=K, n=n``.
"""

from calc.flow import methods_api, methods_classic, methods_exact  # noqa: F401  (registration)
from calc.flow.area import cross_section_area, mean_velocity
from calc.flow.core import (
    DEFAULT_FRICTION_LAW,
    annulus_flow,
    critical_flow_rate,
    list_friction_laws,
    pipe_flow,
)
from calc.flow.methods_api import api_wall_shear
from calc.flow.result import (
    CONSTANT_SETS,
    FRICTION_LAWS,
    REGIME_LABELS,
    FlowResult,
    regime_label,
)

__all__ = [
    "CONSTANT_SETS",
    "DEFAULT_FRICTION_LAW",
    "FRICTION_LAWS",
    "REGIME_LABELS",
    "FlowResult",
    "annulus_flow",
    "api_wall_shear",
    "critical_flow_rate",
    "cross_section_area",
    "list_friction_laws",
    "mean_velocity",
    "pipe_flow",
    "regime_label",
]
