"""The fluid as the circulating-system calculation sees it, fitted for a hydraulics method.

A :class:`HydraulicsFluid` carries the density and two rheology models, one for the flow
inside pipe (surface lines, drill string) and one for the annulus.  Most hydraulics methods use
one fit for both; the API RP 13D (1995) power-law method uses the 600/300-rpm pair in pipe and
the 100/3-rpm pair in the annulus.  :func:`hydraulics_fluid_from_readings` fits the readings as
the method's preset (:class:`calc.hydraulics_method.HydraulicsMethod`) says.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.errors import InputError, check_positive
from calc.hydraulics_method import HydraulicsMethod, resolve_method
from calc.notes import Note
from calc.rheology import FitResult, Model, fit

__all__ = [
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

    Examples
    --------
    A Bingham fluid in the pipe, a power law in the annulus, read as (τ_y, K, n):

    >>> from calc.rheology import Bingham, PowerLaw
    >>> f = HydraulicsFluid(1318.0, Bingham(9.0, 0.019), PowerLaw(0.9, 0.55))
    >>> f.pipe_parameters, f.annulus_parameters
    ((9.0, 0.019, 1.0), (0.0, 0.9, 0.55))
    """

    density: float | np.ndarray
    pipe_model: Model
    annulus_model: Model
    label: str = ""
    fits: str = ""
    pipe_fit: FitResult | None = None
    annulus_fit: FitResult | None = None
    notes: tuple[Note, ...] = ()

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


def hydraulics_fluid_from_readings(
    readings,
    method: str | HydraulicsMethod | None = None,
    *,
    density=None,
    label: str = "",
    fit_notes: bool = True,
) -> HydraulicsFluid:
    """The :class:`HydraulicsFluid` a hydraulics method uses, fitted from viscometer readings.

    Parameters
    ----------
    readings : calc.rheology.ViscometerReadings
        Dial readings of the check.
    method : str, HydraulicsMethod or None
        A hydraulics method (:data:`calc.hydraulics_method.HYDRAULICS_METHODS` names, or a
        preset from :func:`~calc.hydraulics_method.resolve_method`); None → the default,
        ``api13d_2010_hb``.
    density : float or array_like
        Fluid density [kg/m³] (the readings object carries none); required unless the readings
        object has a ``density`` attribute.
    label : str
        Text for results; default the readings' label if they carry one.
    fit_notes : bool
        Carry the fits' notes in ``notes`` (which :func:`~calc.circulation.circulate` passes
        on); False where a face shows the fits' notes elsewhere (the report's rheology sheet).

    Returns
    -------
    HydraulicsFluid
        With ``fits`` naming the :func:`calc.rheology.fit` methods used for pipe and annulus,
        ``pipe_fit``/``annulus_fit`` the :class:`~calc.rheology.FitResult` objects and (with
        ``fit_notes``) their notes in ``notes``.

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

    Examples
    --------
    The API RP 13D (1995) method fits the power law through 600/300 rpm for the pipe
    (n = 3.32·log₁₀(θ600/θ300)) and through 100/3 rpm for the annulus
    (n = 0.657·log₁₀(θ100/θ3)):

    >>> import math
    >>> from calc.rheology import ViscometerReadings
    >>> mud = ViscometerReadings.from_mapping({600: 56, 300: 37, 200: 29, 100: 20, 6: 8, 3: 7})
    >>> f = hydraulics_fluid_from_readings(mud, "api13d_1995_power_law", density=1318.0)
    >>> f.fits
    'api13d_1995_pipe | api13d_1995_annulus'
    >>> round(f.pipe_parameters[2], 3), round(3.32 * math.log10(56 / 37), 3)
    (0.598, 0.598)
    >>> round(f.annulus_parameters[2], 3), round(0.657 * math.log10(20 / 7), 3)
    (0.3, 0.3)
    """
    preset = resolve_method(method)
    if density is None:
        density = getattr(readings, "density", None)
    if density is None:
        raise InputError("density", None, "the fluid density in kg/m³")
    const = preset.constants
    pipe = fit(readings, preset.pipe_fit, constants=const)
    ann = (
        pipe
        if preset.annulus_fit == preset.pipe_fit
        else fit(readings, preset.annulus_fit, constants=const)
    )
    lab = label or str(getattr(readings, "label", "") or "")
    notes = tuple(dict.fromkeys((*pipe.notes, *ann.notes))) if fit_notes else ()
    return HydraulicsFluid(
        density=density,
        pipe_model=pipe.model,
        annulus_model=ann.model,
        label=lab,
        fits=preset.fits,
        pipe_fit=pipe,
        annulus_fit=ann,
        notes=notes,
    )
