"""The report's rheology at the check's temperatures, and the viscometer-gap notes.

:func:`temperature_table` carries the hydraulics method's fits of a check read at two or more
cup temperatures to a few temperatures in the measured range (calc/METHODS.md §21.1);
:func:`rheology_notes` gives the notes of the check that drives the hydraulics: a partly
plugged gap at 3/6 rpm (§21.3) and, with one temperature only, that downhole rheology is taken
as measured.  The hydraulics themselves stay at the cup rheology of the check until the
circulation takes per-interval conditions.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.circulation.fluid import HydraulicsFluid, hydraulics_fluid_from_readings
from calc.notes import Note
from calc.rheology import Model
from calc.rheology.temperature import fit_temperature_dependence
from calc.rheology.viscometer import gap_plug_notes

__all__ = ["TemperatureTable", "rheology_notes", "temperature_table"]

#: How many temperatures the table shows across the measured range (ends included).
TABLE_POINTS = 4


@dataclass(frozen=True)
class TemperatureTable:
    """Model parameters of one check at temperatures across its measured range.

    ``temperatures`` [K] ascending; ``measured`` whether each is a check temperature;
    ``pipe``/``annulus`` the method's models there; ``fits`` the method's fit names.
    """

    label: str
    fits: str
    temperatures: tuple[float, ...]
    measured: tuple[bool, ...]
    pipe: tuple[Model, ...]
    annulus: tuple[Model, ...]
    uses_pressure: bool
    notes: tuple[Note, ...] = ()

    @property
    def same_models(self) -> bool:
        """True when the method uses one fit for pipe and annulus."""
        return all(p == a for p, a in zip(self.pipe, self.annulus, strict=True))


def temperature_table(check, method, density: float) -> TemperatureTable | None:
    """The table for a check read at two or more temperatures; None otherwise."""
    reads = check.all_readings
    temps = [r.temperature for r in reads]
    if len(reads) < 2 or any(t is None for t in temps) or np.ptp(temps) == 0:
        return None
    fl = [
        hydraulics_fluid_from_readings(r, method, density=density, fit_notes=False) for r in reads
    ]
    press = check.pressures
    pp = None if all(p is None for p in press) else [0.0 if p is None else p for p in press]
    pipe = fit_temperature_dependence([f.pipe_model for f in fl], temps, pp)
    ann = fit_temperature_dependence([f.annulus_model for f in fl], temps, pp)
    grid = np.linspace(min(temps), max(temps), TABLE_POINTS)
    all_t = sorted({*map(float, grid), *map(float, temps)})
    # keep a measured temperature rather than a grid point within 0.5 K of it
    shown = [t for t in all_t if t in temps or min(abs(t - m) for m in temps) > 0.5]
    p0 = None if pp is None else pp[0]
    return TemperatureTable(
        label=check.label,
        fits=fl[0].fits,
        temperatures=tuple(shown),
        measured=tuple(t in temps for t in shown),
        pipe=tuple(pipe.model_at(t, p0) for t in shown),
        annulus=tuple(ann.model_at(t, p0) for t in shown),
        uses_pressure=ann.uses_pressure,
        notes=ann.notes,
    )


def rheology_notes(check, fluid: HydraulicsFluid) -> tuple[Note, ...]:
    """Gap-plug warnings at 3/6 rpm (τy of the annulus fit) and the one-temperature note."""
    notes = list(gap_plug_notes(check.readings, fluid.annulus_parameters[0]))
    temps = {r.temperature for r in check.all_readings}
    if len(temps) < 2 and check.readings.temperature is not None:
        dep = fit_temperature_dependence([fluid.annulus_model], [check.readings.temperature])
        notes.extend(dep.notes)
    return tuple(notes)
