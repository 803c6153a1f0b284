"""Hydraulics methods: named presets saying which fits and which friction law a calculation uses.

Three registries, three words:

* **friction laws** (:data:`calc.flow.FRICTION_LAWS`) compute a pressure gradient from a
  fluid's τy, K, n and the geometry;
* **viscometer fits** (:data:`calc.rheology.VISCOMETER_FITS`) turn dial readings into a model;
* **hydraulics methods** (:data:`HYDRAULICS_METHODS`, this module) are what a user names with
  ``method="..."`` (case files, ``--method``, worksheet functions, the report): each is a
  :class:`HydraulicsMethod` preset naming the viscometer fit that feeds the pipe, the one that
  feeds the annulus, and the friction law that computes the gradients.

:func:`resolve_method` is the one place a hydraulics-method name is read: ``None`` gives the
default preset (:data:`DEFAULT_METHOD`), an unknown name an
:class:`~calc.errors.InputError` listing the registered names with the nearest one.  Keyword
overrides replace a preset's fit or friction law (each checked against its registry) and are
kept on the result, so a variant is never mistaken for the published preset.

>>> m = resolve_method("api13d_1995_power_law")
>>> m.pipe_fit, m.annulus_fit, m.friction
('api13d_1995_pipe', 'api13d_1995_annulus', 'api13d_1995_power_law')
>>> resolve_method().name == DEFAULT_METHOD
True
>>> resolve_method("bingham", friction="newtonian").label
'bingham (friction=newtonian)'

The other fits stay one override away, e.g. the Bingham least-squares fit over all readings:

>>> lsq = "bingham_least_squares"
>>> resolve_method("bingham", pipe_fit=lsq, annulus_fit=lsq).fits
'bingham_least_squares'
"""

from __future__ import annotations

from dataclasses import dataclass, replace

from calc.errors import InputError, check_choice
from calc.flow import CONSTANT_SETS, FRICTION_LAWS
from calc.registry import NOT_ASSESSED, MethodRegistry, Verification
from calc.rheology import VISCOMETER_FITS
from calc.rheology.fit_viscometer import PRINTED_CONSTANT_FITS

__all__ = [
    "CONSTANT_SETS",
    "DEFAULT_METHOD",
    "HYDRAULICS_METHODS",
    "HydraulicsMethod",
    "list_hydraulics_methods",
    "resolve_method",
]

#: The hydraulics method used when none is named: API RP 13D (2010) Herschel-Bulkley.
DEFAULT_METHOD = "api13d_2010_hb"

# CONSTANT_SETS (from calc.flow): ``"exact"`` (field constants derived from SI, the default) or
# ``"as_printed"`` (the rounded constants printed in the published method, so an auditor can
# reproduce a printed worked example to its last digit; only ``api13d_1995_power_law`` has
# them, calc/METHODS.md §7.9).

#: Registered hydraulics methods (presets), by name.
HYDRAULICS_METHODS = MethodRegistry("hydraulics method")

#: The preset fields an override may replace, and the registry each value must name.
_OVERRIDABLE = {
    "friction": FRICTION_LAWS,
    "pipe_fit": VISCOMETER_FITS,
    "annulus_fit": VISCOMETER_FITS,
}


@dataclass(frozen=True)
class HydraulicsMethod:
    """One hydraulics method: the fits feeding pipe and annulus and the friction law.

    name         the registered name users give (``"api13d_2010_hb"``)
    friction     friction law of :data:`calc.flow.FRICTION_LAWS` for every gradient
    pipe_fit     viscometer fit (:data:`calc.rheology.VISCOMETER_FITS`) for flow inside pipe
                 (surface lines, drill string)
    annulus_fit  viscometer fit for the annulus
    description  one line for users choosing a method
    source       the published method
    constants    ``"exact"`` or ``"as_printed"`` (:data:`CONSTANT_SETS`)
    status       how the method has been checked (:class:`calc.registry.Verification`)
    overrides    ``(field, value)`` pairs that replaced the preset's own choices (empty for
                 the preset as registered)

    Examples
    --------
    >>> m = resolve_method("api13d_1995_power_law")
    >>> m.fits, m.friction
    ('api13d_1995_pipe | api13d_1995_annulus', 'api13d_1995_power_law')
    >>> resolve_method("newtonian", friction="bingham").label
    'newtonian (friction=bingham)'
    """

    name: str
    friction: str
    pipe_fit: str
    annulus_fit: str
    description: str = ""
    source: str = ""
    constants: str = "exact"
    status: Verification = NOT_ASSESSED
    overrides: tuple[tuple[str, str], ...] = ()

    def __post_init__(self):
        for key, registry in _OVERRIDABLE.items():
            registry.get(getattr(self, key))  # InputError naming the registry if unknown
        check_choice("constants", self.constants, CONSTANT_SETS)
        if self.constants != "exact" and not _has_printed(self):
            supported = [m.name for m in list_hydraulics_methods() if _has_printed(m)]
            raise InputError(
                "constants",
                self.constants,
                f"'exact' for hydraulics method '{self.name}'; '{self.constants}' is "
                "available for: " + ", ".join(supported),
                problem="no printed constants for this method",
            )

    @property
    def fits(self) -> str:
        """The fits used, as one text: ``"pipe | annulus"``, or one name when they agree."""
        if self.pipe_fit == self.annulus_fit:
            return self.pipe_fit
        return f"{self.pipe_fit} | {self.annulus_fit}"

    @property
    def label(self) -> str:
        """The name, with any overrides: ``"bingham (friction=newtonian)"``.

        A constant set other than the preset's shows as ``constants=as_printed``.
        """
        if not self.overrides:
            return self.name
        return f"{self.name} (" + ", ".join(f"{k}={v}" for k, v in self.overrides) + ")"


def _has_printed(m: HydraulicsMethod) -> bool:
    """Whether the friction law and both fits of ``m`` have a printed constant set."""
    law = FRICTION_LAWS.get(m.friction).func
    fits = {m.pipe_fit, m.annulus_fit}
    return "as_printed" in law.constant_sets and fits <= set(PRINTED_CONSTANT_FITS)


def _preset(name, friction, pipe_fit, annulus_fit, description, source, status=None) -> None:
    status = status or NOT_ASSESSED
    preset = HydraulicsMethod(
        name, friction, pipe_fit, annulus_fit, description, source, status=status
    )
    HYDRAULICS_METHODS.register(name, description, source, status)(preset)


_preset(
    "api13d_2010_hb",
    "api13d_2010_hb",
    "api13d_2010_hb",
    "api13d_2010_hb",
    "API Herschel-Bulkley estimate (τ_y from 3/6 rpm, n and K from 300/600 rpm), both paths",
    "API RP 13D 6th ed. (2010); Zamora & Power (2002) AADE-02-DFWM-HO-13",
)
_preset(
    "api13d_1995_power_law",
    "api13d_1995_power_law",
    "api13d_1995_pipe",
    "api13d_1995_annulus",
    "power law from 600/300 rpm in pipe and from 100/3 rpm in the annulus",
    "API RP 13D, 3rd ed. (1995)",
)
_preset(
    "newtonian",
    "newtonian",
    "newtonian_least_squares",
    "newtonian_least_squares",
    "Newtonian least-squares fit over all readings, both paths",
    "Newtonian least squares over the readings; Colebrook (1939)",
)
_preset(
    "bingham",
    "bingham",
    "bingham_two_speed",
    "bingham_two_speed",
    "Bingham plastic with the field PV/YP from 600/300 rpm, Colebrook on PV turbulent, both paths",
    "Bingham (1916); API RP 13B-1 (PV/YP); Hanks (1963); Bourgoyne et al. (1986) ch. 4",
)
_preset(
    "bingham_darby_1992",
    "bingham_darby_1992",
    "bingham_two_speed",
    "bingham_two_speed",
    "Bingham plastic (PV/YP from 600/300 rpm) with the Darby, Mun & Boger slurry friction "
    "factor, both paths",
    "Darby, Mun & Boger (1992) Chem. Eng. 99(9); Hanks (1963); API RP 13B-1",
)
_preset(
    "power_law",
    "power_law",
    "power_law_loglog",
    "power_law_loglog",
    "power law by log-log regression over all readings, both paths",
    "Ostwald–de Waele power law; log-log least squares (common practice); Dodge & Metzner (1959)",
)
_preset(
    "exact_laminar",
    "exact_laminar",
    "hb_least_squares",
    "hb_least_squares",
    "Herschel-Bulkley least-squares fit over all readings, both paths",
    "Kelessidis et al. (2006) J. Pet. Sci. Eng. 53:203-224",
)


def list_hydraulics_methods() -> list[HydraulicsMethod]:
    """The registered hydraulics methods, default first.

    Examples
    --------
    >>> [m.name for m in list_hydraulics_methods()][:2]
    ['api13d_2010_hb', 'api13d_1995_power_law']
    """
    return [info.func for info in HYDRAULICS_METHODS.describe()]


def resolve_method(method: str | HydraulicsMethod | None = None, **overrides) -> HydraulicsMethod:
    """The :class:`HydraulicsMethod` a name stands for; ``None`` → :data:`DEFAULT_METHOD`.

    Parameters
    ----------
    method : str, HydraulicsMethod or None
        A registered name (:data:`HYDRAULICS_METHODS`), a preset (returned as it is), or
        ``None`` for the default.
    **overrides : str
        ``friction=``, ``pipe_fit=``, ``annulus_fit=``: replace the preset's choice (each
        checked against its registry); ``constants=`` one of :data:`CONSTANT_SETS`; recorded
        in :attr:`HydraulicsMethod.overrides`.

    Raises
    ------
    calc.errors.InputError
        An unknown method name (listing the registered names, with the nearest one), an
        unknown override field, or an override naming no registered fit or friction law.

    Examples
    --------
    >>> resolve_method().name == DEFAULT_METHOD == "api13d_2010_hb"
    True
    >>> m = resolve_method("bingham", friction="newtonian")
    >>> m.friction, m.overrides
    ('newtonian', (('friction', 'newtonian'),))
    """
    if isinstance(method, HydraulicsMethod):
        preset = method
    else:
        preset = HYDRAULICS_METHODS.get(DEFAULT_METHOD if method is None else method).func
    if not overrides:
        return preset
    for key, value in overrides.items():
        if key == "constants":
            check_choice("constants", value, CONSTANT_SETS)
            continue
        if key not in _OVERRIDABLE:
            allowed = ", ".join([*_OVERRIDABLE, "constants"])
            raise InputError("hydraulics method override", key, allowed, problem="unknown")
        _OVERRIDABLE[key].get(value)
    changed = tuple((k, v) for k, v in overrides.items() if getattr(preset, k) != v)
    return replace(preset, **overrides, overrides=preset.overrides + changed)
