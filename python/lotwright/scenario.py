"""Scenarios given in memory: tables as pandas DataFrames or dicts of columns.

A scenario in memory is written as the CSV files of docs/format.md into a
temporary folder and read there by the library's one reader, so it is checked
by the same rules and gets the same messages as a folder. An ``InputError``
is then shown at the table's file name (``items.csv``, line, column), with
``row`` the DataFrame's row position.
"""

from __future__ import annotations

import contextlib
import datetime as _dt
import json
import os
import tempfile
from typing import Any, Dict, Iterator, Mapping, Optional, Union

import pandas as pd

from .errors import InputError

#: The tables a scenario folder may hold, by the name of their file.
TABLES = (
    "items",
    "demand",
    "resources",
    "capacity",
    "routing",
    "costs",
    "receipts",
    "bom",
    "orders-firm",
)


def frame(table: Any) -> pd.DataFrame:
    """A DataFrame from a DataFrame, a dict of columns or a list of rows."""
    if isinstance(table, pd.DataFrame):
        return table
    return pd.DataFrame(table)


def _csv(table: Any) -> str:
    # Dates are written ISO (YYYY-MM-DD), as the files hold them; missing
    # values become empty cells, which take the column's default.
    return frame(table).to_csv(index=False, date_format="%Y-%m-%d", lineterminator="\n")


def _toml_value(value: Any) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        return repr(value)
    if isinstance(value, (_dt.date, _dt.datetime, pd.Timestamp)):
        return json.dumps(value.strftime("%Y-%m-%d"))
    return json.dumps(str(value))


def _toml(settings: Union[str, Mapping[str, Any]]) -> str:
    if isinstance(settings, str):
        return settings
    return "".join(f"{key} = {_toml_value(value)}\n" for key, value in settings.items())


class Scenario:
    """A scenario held in memory.

    ``settings`` is scenario.toml as a dict (``name``, ``start``, ``bucket``,
    ``periods``, optionally ``currency`` and ``frozen_periods``) or as TOML
    text; each table (``items``, ``demand``, ``resources``, ``capacity``,
    ``routing``, ``costs``, ``receipts``, ``bom``, ``orders_firm``) is a
    DataFrame, a dict of columns or a list of row dicts, with the columns
    of the CSV file of the same name.
    """

    def __init__(self, settings: Union[str, Mapping[str, Any]], **tables: Any):
        self.settings = settings
        self.tables: Dict[str, Any] = {}
        for key, table in tables.items():
            name = key.replace("_", "-")
            if name not in TABLES:
                raise TypeError(
                    f"unknown table {key!r}; tables are {', '.join(t.replace('-', '_') for t in TABLES)}"
                )
            if table is not None:
                self.tables[name] = table

    @classmethod
    def from_dict(cls, tables: Mapping[str, Any]) -> "Scenario":
        """From ``{"scenario": settings, "items": ..., "demand": ...}``."""
        tables = dict(tables)
        if "scenario" not in tables:
            raise TypeError("a scenario dict needs the key 'scenario' (the settings of scenario.toml)")
        settings = tables.pop("scenario")
        return cls(settings, **tables)

    @classmethod
    def read(cls, folder: Union[str, os.PathLike]) -> "Scenario":
        """The tables of a scenario folder as DataFrames of text cells (to
        change in a notebook and plan again); scenario.toml as its text."""
        folder = os.fspath(folder)
        with open(os.path.join(folder, "scenario.toml"), encoding="utf-8-sig") as f:
            settings = f.read()
        tables = {}
        for name in TABLES:
            path = os.path.join(folder, f"{name}.csv")
            if os.path.exists(path):
                tables[name.replace("-", "_")] = pd.read_csv(
                    path, dtype=str, keep_default_na=False, encoding="utf-8-sig"
                )
        return cls(settings, **tables)

    def write(self, folder: Union[str, os.PathLike]) -> None:
        """Writes the scenario as a folder of files (the folder may exist)."""
        folder = os.fspath(folder)
        os.makedirs(folder, exist_ok=True)
        with open(os.path.join(folder, "scenario.toml"), "w", encoding="utf-8") as f:
            f.write(_toml(self.settings))
        for name, table in self.tables.items():
            with open(os.path.join(folder, f"{name}.csv"), "w", encoding="utf-8", newline="") as f:
                f.write(_csv(table))


ScenarioLike = Union[str, os.PathLike, Scenario, Mapping[str, Any]]


class _Staging:
    """Temporary folders for tables given in memory, and the way back from
    a path in them to the name the caller knows."""

    def __init__(self, root: str):
        self.root = root
        self.names: Dict[str, str] = {}
        self.count = 0

    def folder(self, label: str) -> str:
        self.count += 1
        path = os.path.join(self.root, f"{self.count}")
        os.makedirs(path)
        self.names[path] = label
        return path

    def relocate(self, error: InputError) -> InputError:
        for path, label in self.names.items():
            if error.file == path or error.file.startswith(path + os.sep):
                inner = os.path.relpath(error.file, path)
                shown = inner if label == "" else os.path.join(label, inner)
                return error.relocate(shown, from_frame=inner.endswith(".csv"))
        return error


@contextlib.contextmanager
def staging() -> Iterator[_Staging]:
    """A place for in-memory inputs; InputErrors raised inside are shown at
    the caller's table names."""
    with tempfile.TemporaryDirectory(prefix="lotwright-") as root:
        stage = _Staging(root)
        try:
            yield stage
        except InputError as error:
            moved = stage.relocate(error)
            if moved is error:
                raise
            raise moved from None


def scenario_folder(stage: _Staging, scenario: ScenarioLike) -> str:
    """The folder the library reads: the path given, or the in-memory
    scenario written into the staging area."""
    if isinstance(scenario, (str, os.PathLike)):
        return os.fspath(scenario)
    if isinstance(scenario, Mapping):
        scenario = Scenario.from_dict(scenario)
    if not isinstance(scenario, Scenario):
        raise TypeError(
            "a scenario is a folder path, a lotwright.Scenario or a dict of tables, "
            f"not {type(scenario).__name__}"
        )
    folder = stage.folder("")
    scenario.write(folder)
    return folder


def history_folder(stage: _Staging, history: Any) -> str:
    """A folder of forecast snapshots: the path given, or a dict of tables
    by the date each snapshot's bucket starts."""
    if isinstance(history, (str, os.PathLike)):
        return os.fspath(history)
    if not isinstance(history, Mapping):
        raise TypeError("history is a folder path or a dict {date: table}")
    folder = stage.folder("history")
    for date, table in history.items():
        name = date.strftime("%Y-%m-%d") if hasattr(date, "strftime") else str(date)
        with open(os.path.join(folder, f"{name}.csv"), "w", encoding="utf-8", newline="") as f:
            f.write(_csv(table))
    return folder


def orders_file(stage: _Staging, orders: Any) -> str:
    """A plan file: the path given, or a table written as orders.csv."""
    if isinstance(orders, (str, os.PathLike)):
        return os.fspath(orders)
    folder = stage.folder("")
    path = os.path.join(folder, "orders.csv")
    with open(path, "w", encoding="utf-8", newline="") as f:
        f.write(_csv(orders))
    return path


def optional(value: Optional[Any]) -> Optional[Any]:
    """None for a missing value, also pandas' NaN (grid tables)."""
    if value is None:
        return None
    try:
        if pd.isna(value):
            return None
    except (TypeError, ValueError):
        pass
    return value
