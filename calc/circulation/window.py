"""Former name of :mod:`calc.circulation.pressure_window`; kept only for an importer outside
calc/circulation (``calc/surge.py``) until it imports the new name.  Use
:mod:`calc.circulation.pressure_window` (or the names re-exported by :mod:`calc.circulation`)."""

from calc.circulation.pressure_window import (  # noqa: F401
    Margins,
    MarginTable,
    PressureWindow,
    TightestPoint,
    WeakPoint,
    limits_at,
    tabulate_margins,
)
