"""Result objects of the commands: the command line's JSON, as attributes and
pandas DataFrames.

Every figure comes from the JSON (or the CSV files) the library renders for
the command line, so a result here states the same numbers as ``lotwright
plan --json`` and ``plan --out``; these classes only reshape them.
"""

from __future__ import annotations

import io
import os
import shutil
import tempfile
from typing import Any, Dict, List, Optional

import pandas as pd

from .errors import OutputError

_KINDS = ("setup", "holding", "unit", "backlog", "overtime")


def _flat_costs(row: Dict[str, Any]) -> Dict[str, Any]:
    """A row with its ``costs`` dict spread into ``setup_cost``,
    ``holding_cost``... columns."""
    row = dict(row)
    costs = row.pop("costs", None) or {}
    for kind in _KINDS:
        row[f"{kind}_cost"] = costs.get(kind)
    return row


def _table(rows: List[Dict[str, Any]], first: List[str]) -> pd.DataFrame:
    """Rows as a DataFrame with the columns ``first`` in front (the JSON's
    keys come sorted)."""
    table = pd.DataFrame(rows)
    front = [c for c in first if c in table.columns] if rows else first
    return table.reindex(columns=front + [c for c in table.columns if c not in front])


class _Result:
    """Common ground: the JSON as ``json`` and its keys as attributes."""

    def __init__(self, data: Dict[str, Any]):
        self.json = data

    def __getattr__(self, name: str) -> Any:
        data = self.__dict__.get("json", {})
        if name in data:
            return data[name]
        raise AttributeError(name)

    def __repr__(self) -> str:
        figures = ", ".join(
            f"{key}={self.json[key]!r}"
            for key in ("status", "total_cost", "lower_bound", "gap")
            if key in self.json
        )
        return f"<{type(self).__name__} {figures}>"


class PlanResult(_Result):
    """The answer of :func:`lotwright.plan`.

    ``status``, ``total_cost``, ``lower_bound``, ``gap``, ``method``,
    ``solver``, ``costs`` (by kind), ``notes``, ``cautions`` as in the JSON;
    DataFrames ``orders``, ``records`` (stock record per item and bucket),
    ``load`` (per resource and bucket), ``comparison`` (one row per
    method), ``items``, ``shortages``, ``overloads``, ``violations``.
    """

    def __init__(self, data: Dict[str, Any], files: Dict[str, bytes]):
        super().__init__(data)
        self.files = files
        self.orders = _table(
            data["orders"],
            ["item", "period", "date", "release_period", "release_date", "quantity", "kind"],
        )
        self.records = self._csv("records.csv")
        self.load = self._csv("load.csv")
        self.comparison = _table(
            [_flat_costs(r) for r in data["comparison"]],
            ["method", "status", "feasible", "total_cost", *[f"{k}_cost" for k in _KINDS], "setups"],
        )
        self.items = _table([_flat_costs(r) for r in data["items"]], ["item"])
        self.shortages = pd.DataFrame(data.get("shortages", []))
        self.overloads = pd.DataFrame(data.get("overloads", []))
        self.violations = pd.DataFrame(data.get("violations", []))

    def _csv(self, name: str) -> pd.DataFrame:
        return pd.read_csv(io.BytesIO(self.files[name]), keep_default_na=False, na_values=[""])

    def write(self, folder: str, force: bool = False) -> None:
        """Writes the plan's files into ``folder``, whole or not at all
        (under a temporary sibling name, then renamed); an existing folder
        is replaced only with ``force``."""
        write_folder(folder, self.files, force)


def write_folder(folder: str, files: Dict[str, bytes], force: bool) -> None:
    """Writes ``files`` into a new folder whole or not at all."""
    folder = os.path.abspath(folder)
    if os.path.exists(folder) and not force:
        raise OutputError("the folder exists; pass force=True to replace it", folder)
    parent = os.path.dirname(folder)
    try:
        os.makedirs(parent, exist_ok=True)
        staging = tempfile.mkdtemp(prefix=".lotwright-", dir=parent)
        for name, data in files.items():
            with open(os.path.join(staging, name), "wb") as f:
                f.write(data)
        if os.path.exists(folder):
            shutil.rmtree(folder)
        os.rename(staging, folder)
    except OSError as error:
        raise OutputError(str(error), folder) from None


class CheckResult(_Result):
    """The answer of :func:`lotwright.check`: ``feasible``, ``total_cost``,
    ``best_cost``, ``saving``; DataFrames ``findings``, ``shortages``,
    ``overloads``, ``violations``."""

    def __init__(self, data: Dict[str, Any]):
        super().__init__(data)
        self.findings = pd.DataFrame(data.get("findings", []))
        self.shortages = pd.DataFrame(data.get("shortages", []))
        self.overloads = pd.DataFrame(data.get("overloads", []))
        self.violations = pd.DataFrame(data.get("violations", []))


class CompareResult(_Result):
    """The answer of :func:`lotwright.compare`: ``a`` and ``b`` (dicts of
    each side's figures), ``difference`` (B - A); DataFrames ``sides`` (one
    row per side), ``items`` and ``resources`` (flattened, ``a_`` and ``b_``
    columns). ``status``, ``total_cost``, ``lower_bound`` and ``gap`` are
    B's."""

    def __init__(self, data: Dict[str, Any]):
        super().__init__(data)
        self.sides = pd.DataFrame([_flat_costs(data["a"]), _flat_costs(data["b"])], index=["a", "b"])
        self.items = pd.json_normalize(data["items"], sep="_")
        self.resources = pd.json_normalize(data["resources"], sep="_")
        for key in ("status", "total_cost", "lower_bound", "gap"):
            self.json.setdefault(key, data["b"][key])


def roll_status(statuses: Dict[str, int]) -> str:
    """One word for a run's weekly statuses: the worst one seen."""
    for word in ("infeasible", "unknown", "feasible"):
        if statuses.get(word, 0) > 0:
            return word
    return "optimal"


class RollResult(_Result):
    """The answer of :func:`lotwright.roll`: DataFrames ``methods`` (one row
    per method: realised cost by kind, fill rate, stability, the weeks'
    statuses and largest gap) and ``weeks`` (one row per method and week)."""

    def __init__(self, data: Dict[str, Any]):
        super().__init__(data)
        rows, weeks = [], []
        for m in data["methods"]:
            realised = m["realised"]
            row = {"method": m["method"], "status": roll_status(m["statuses"])}
            row.update(_flat_costs({k: v for k, v in realised.items()}))
            row["mean_share_changed"] = m["stability"]["mean_share_changed"]
            row.update({f"stability_{k}": v for k, v in m["stability"].items() if k != "mean_share_changed"})
            row.update({f"weeks_{k}": v for k, v in m["statuses"].items()})
            row["largest_gap"] = m["largest_gap"]
            rows.append(row)
            for w in m["weeks"]:
                weeks.append({"method": m["method"], **w})
        self.methods = pd.DataFrame(rows)
        self.weeks = pd.DataFrame(weeks)


class EoqResult(_Result):
    """The answer of :func:`lotwright.eoq`: ``eoq``, ``total_cost``,
    ``orders``, ``cycle`` and the other keys of ``eoq --json``."""
