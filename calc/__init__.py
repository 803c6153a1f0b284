"""boreflow calculation layer: pure-Python drilling-fluid hydraulics (SI inside).

Packages and modules, one per topic: ``units`` (the pint registry; ``kinds`` holds its tables
as data), ``errors`` (InputError and the input checks), ``values``, ``notes`` and ``span``
(the structure results carry instead of display text), ``registry``, ``numeric``,
``cautions``, ``rheology``, ``geometry``, ``flow``, ``bit``, ``circulation``, ``cleaning``,
``surge`` and the operating window of flow rates.  ``calc`` never imports ``addin``.

``verification`` declares how every registered method has been checked; it is imported here so
the statuses are set whenever ``calc`` is imported.  :func:`list_methods` lists every registered
method of every registry with its source and status.
"""

__version__ = "0.1.0"

from calc.verification import list_methods  # sets every registry's statuses

__all__ = ["__version__", "list_methods"]
