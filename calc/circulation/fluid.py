"""The fluid as the circulating-system calculation sees it, and which fit feeds which path.

A :class:`HydraulicsFluid` carries the density and two rheology models, one for the flow
inside pipe (surface lines, drill string) and one for the annulus.  Most methods use one fit
for both; the API RP 13D (1995) power-law method uses the 600/300-rpm pair in pipe and the
100/3-rpm pair in the annulus.  :func:`hydraulics_fluid_from_readings` picks the fits from one
table, :data:`FLUID_FITS` (``method`` → pipe fit, annulus fit, description, source).
"""

from __future__ import annotations

from dataclasses import dataclass

from calc.errors import InputError, check_positive
from calc.registry import MethodRegistry

__all__ = [
    "FLUID_FITS",
    "HydraulicsFluid",
    "hydraulics_fluid_from_readings",
    "model_parameters",
]


def model_parameters(model) -> tuple[float, float, float]:
    """(τ_y [Pa], K [Pa·sⁿ], n [-]) of a rheology model, as the friction methods take them.

    Herschel-Bulkley-type models expose ``tau_y, k, n``; a Bingham plastic is (τ_y, μ_p, 1); a
    power law (0, K, n); a Newtonian fluid (0, μ, 1).

    Examples
    --------
    >>> from types import SimpleNamespace
    >>> model_parameters(SimpleNamespace(mu=0.02))
    (0.0, 0.02, 1.0)
    """
    ty = getattr(model, "tau_y", None)
    k = getattr(model, "k", None)
    n = getattr(model, "n", None)
    if k is None:
        k = getattr(model, "mu_p", None)
        if k is None:
            k = getattr(model, "mu", None)
    if k is None:
        raise InputError(
            "rheology model",
            type(model).__name__,
            "a Newtonian, Bingham, power-law or Herschel-Bulkley model (with tau_y, k, n)",
        )
    ty = 0.0 if ty is None else ty
    n = 1.0 if n is None else n
    return float(ty), float(k), float(n)


@dataclass(frozen=True, eq=False)
class HydraulicsFluid:
    """Density and the rheology models used in pipe and in the annulus.

    Parameters
    ----------
    density : float or array_like
        Density [kg/m³], > 0.  An array makes :func:`~calc.circulation.circulate` sweep over
        densities (broadcast against the flow rates).
    pipe_model, annulus_model : rheology model
        Models with ``tau_y`` [Pa], ``k`` [Pa·sⁿ], ``n`` (or Bingham ``mu_p``, Newtonian
        ``mu`` [Pa·s]); :func:`model_parameters` reads them.
    label : str
        Free text for results ("D1 05:30, API HB fit").
    fits : str
        Which fits produced the models (filled in by :func:`hydraulics_fluid_from_readings`).
    pipe_fit, annulus_fit : calc.rheology.FitResult, optional
        The fits themselves (quality, intermediates), when built from readings.
    notes : tuple of Note
        The fits' notes; :func:`~calc.circulation.circulate` passes them on.
    """

    density: object
    pipe_model: object
    annulus_model: object
    label: str = ""
    fits: str = ""
    pipe_fit: object = None
    annulus_fit: object = None
    notes: tuple = ()

    def __post_init__(self):
        rho = check_positive("density", self.density, "kg/m³")
        object.__setattr__(self, "density", float(rho) if rho.ndim == 0 else rho)
        model_parameters(self.pipe_model)
        model_parameters(self.annulus_model)

    @property
    def pipe_parameters(self) -> tuple[float, float, float]:
        """(τ_y, K, n) for pipe flow."""
        return model_parameters(self.pipe_model)

    @property
    def annulus_parameters(self) -> tuple[float, float, float]:
        """(τ_y, K, n) for annular flow."""
        return model_parameters(self.annulus_model)


@dataclass(frozen=True)
class FitChoice:
    """Which rheology fit feeds the pipe and the annulus for one hydraulics method."""

    pipe: str
    annulus: str


#: method → (pipe fit, annulus fit); fit names of :data:`calc.rheology.VISCOMETER_FITS`.
FLUID_FITS = MethodRegistry("hydraulics method")


def _choice(name, pipe, annulus, description, source):
    FLUID_FITS.register(name, description, source)(FitChoice(pipe, annulus))


_choice(
    "api13d_2010_hb",
    "api13d_2010_hb",
    "api13d_2010_hb",
    "API Herschel-Bulkley estimate (τ_y from 3/6 rpm, n and K from 300/600 rpm), both paths",
    "API RP 13D 6th ed. (2010); Zamora & Power (2002) AADE-02-DFWM-HO-13",
)
_choice(
    "api13d_1995_power_law",
    "api13d_1995_pipe",
    "api13d_1995_annulus",
    "power law from 600/300 rpm in pipe and from 100/3 rpm in the annulus",
    "API RP 13D 3rd ed. (1995)",
)
_choice(
    "newtonian",
    "newtonian_least_squares",
    "newtonian_least_squares",
    "Newtonian least-squares fit over all readings, both paths",
    "least squares over the readings (common practice)",
)
_choice(
    "bingham",
    "bingham_least_squares",
    "bingham_least_squares",
    "Bingham plastic least-squares fit over all readings, both paths",
    "Bingham (1922); least squares over the readings (API RP 10B-2 practice)",
)
_choice(
    "power_law",
    "power_law_least_squares",
    "power_law_least_squares",
    "power-law least-squares fit (log-log) over all readings, both paths",
    "least squares over the readings (common practice)",
)
_choice(
    "exact_laminar",
    "hb_least_squares",
    "hb_least_squares",
    "Herschel-Bulkley least-squares fit over all readings, both paths",
    "Kelessidis et al. (2006) J. Pet. Sci. Eng. 53:203-224",
)


def hydraulics_fluid_from_readings(
    readings, method: str = "api13d_2010_hb", *, density=None, label: str = ""
) -> HydraulicsFluid:
    """The :class:`HydraulicsFluid` a hydraulics method uses, fitted from viscometer readings.

    Parameters
    ----------
    readings : calc.rheology.ViscometerReadings
        Dial readings of the check.
    method : str
        A hydraulics method (:data:`FLUID_FITS` names; the same names as :mod:`calc.flow`).
    density : float or array_like
        Fluid density [kg/m³] (the readings object carries none); required unless the readings
        object has a ``density`` attribute.
    label : str
        Text for results; default the readings' label if they carry one.

    Returns
    -------
    HydraulicsFluid
        With ``fits`` naming the :func:`calc.rheology.fit` methods used for pipe and annulus,
        ``pipe_fit``/``annulus_fit`` the :class:`~calc.rheology.FitResult` objects and their
        notes in ``notes``.

    Notes
    -----
    ============================  =========================  =========================
    method                        pipe                       annulus
    ============================  =========================  =========================
    api13d_2010_hb                API HB estimate            API HB estimate
    api13d_1995_power_law         power law, 600/300 rpm     power law, 100/3 rpm
    newtonian                     Newtonian least squares    same
    bingham                       Bingham least squares      same
    power_law                     power-law least squares    same
    exact_laminar                 HB least squares           same
    ============================  =========================  =========================

    The fit names are those of :data:`calc.rheology.VISCOMETER_FITS`.
    """
    from calc.rheology import fit

    choice: FitChoice = FLUID_FITS.get(method).func
    if density is None:
        density = getattr(readings, "density", None)
    if density is None:
        raise InputError("density", None, "the fluid density in kg/m³")
    pipe = fit(readings, choice.pipe)
    ann = pipe if choice.annulus == choice.pipe else fit(readings, choice.annulus)
    lab = label or str(getattr(readings, "label", "") or "")
    fits = choice.pipe if choice.pipe == choice.annulus else f"{choice.pipe} | {choice.annulus}"
    notes = tuple(dict.fromkeys((*pipe.notes, *ann.notes)))
    return HydraulicsFluid(
        density=density,
        pipe_model=pipe.model,
        annulus_model=ann.model,
        label=lab,
        fits=fits,
        pipe_fit=pipe,
        annulus_fit=ann,
        notes=notes,
    )
