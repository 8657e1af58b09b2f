"""lotwright from Python: least-cost lot sizing on the same engine as the
``lotwright`` command line.

``plan``, ``check``, ``compare``, ``roll`` and ``eoq`` do what the commands
of the same name do and return result objects with pandas DataFrames; a
scenario is a folder path, a :class:`Scenario` of DataFrames, or a dict of
tables. ``grid`` runs many plans or rolls on a Dask cluster. See
docs/python.md.
"""

from . import errors
from .commands import check, compare, eoq, plan, roll
from .errors import InputError, InternalError, LotwrightError, OutputError, UsageError
from .grids import grid, policies
from .results import CheckResult, CompareResult, EoqResult, PlanResult, RollResult
from .scenario import Scenario

__all__ = [
    "plan",
    "check",
    "compare",
    "roll",
    "eoq",
    "grid",
    "policies",
    "Scenario",
    "PlanResult",
    "CheckResult",
    "CompareResult",
    "RollResult",
    "EoqResult",
    "LotwrightError",
    "InputError",
    "UsageError",
    "OutputError",
    "InternalError",
    "errors",
]
