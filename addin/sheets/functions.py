"""The module xlwings imports: every boreflow worksheet function, by family.

Point xlwings at it with ``UDF Modules = addin.sheets.functions`` (see
``workbooks/worksheet-functions.md``).  Each family lives in its own ``fn_*`` module; importing
them here puts every decorated function in this module's namespace, where xlwings finds it.
"""

from addin.sheets.fn_bit import *  # noqa: F403
from addin.sheets.fn_cleaning import *  # noqa: F403
from addin.sheets.fn_cleaning_beds import *  # noqa: F403
from addin.sheets.fn_downhole import *  # noqa: F403
from addin.sheets.fn_flow import *  # noqa: F403
from addin.sheets.fn_pressure import *  # noqa: F403
from addin.sheets.fn_pumps import *  # noqa: F403
from addin.sheets.fn_rheology import *  # noqa: F403
from addin.sheets.fn_rheology_temperature import *  # noqa: F403
from addin.sheets.fn_slurry import *  # noqa: F403
from addin.sheets.fn_surge import *  # noqa: F403
from addin.sheets.fn_units import *  # noqa: F403
from addin.sheets.framework import FUNCTIONS, MARK

__all__ = ["FUNCTIONS", "MARK", *(name for name in FUNCTIONS)]
