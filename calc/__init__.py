"""boreflow calculation layer: pure-Python drilling-fluid hydraulics (SI inside).

Packages and modules, one per topic: ``units`` (the pint registry; ``kinds`` holds its tables
as data), ``errors`` (InputError and the input checks), ``values``, ``notes`` and ``span``
(the structure results carry instead of display text), ``registry``, ``numeric``,
``cautions``, ``rheology``, ``geometry``, ``flow``, ``bit``, ``circulation``, ``cleaning``,
``surge`` and the operating window of flow rates.  ``calc`` never imports ``addin``.
"""

__version__ = "0.1.0"
