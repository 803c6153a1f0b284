"""boreflow calculation layer: pure-Python drilling-fluid and slurry hydraulics (SI inside).

Modules, one per topic: ``units``, ``errors``, ``rheology``, ``geometry``, ``flow``, ``bit``,
``circulation``, ``cleaning``, ``surge``, ``slurry``, ``cautions``.
"""

__version__ = "0.1.0"
