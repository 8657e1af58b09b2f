"""The exceptions lotwright raises, one class per kind of problem.

They mirror the library's error kinds (and the command line's exit codes):
``InputError`` for a scenario or plan file (or table) that is wrong, with
where it is wrong; ``UsageError`` for an argument out of range;
``OutputError`` for a file that could not be written; ``InternalError`` for
a fault of lotwright itself. All derive from ``LotwrightError``.
"""

from __future__ import annotations

import os
from typing import Optional


class LotwrightError(Exception):
    """Any problem lotwright reports."""


class InputError(LotwrightError, ValueError):
    """A scenario file or table is wrong at ``file``, ``line``, ``column``.

    ``table`` is the file's name without ``.csv`` or ``.toml`` (``items``,
    ``demand``, ``scenario``...): for a scenario given as DataFrames it is the
    key the table was given under. ``line`` counts as in the CSV file (the
    header is line 1), so for a DataFrame ``row`` (0-based position,
    ``line - 2``) is set as well. ``column`` is 1-based, ``column_name`` the
    header's name. ``reason`` says what is wrong; ``str(error)`` reads like
    the command line's message.
    """

    def __init__(
        self,
        reason: str,
        file: str,
        line: Optional[int] = None,
        column: Optional[int] = None,
        column_name: Optional[str] = None,
    ):
        self.reason = reason
        self.file = file
        self.line = line
        self.column = column
        self.column_name = column_name
        self.row: Optional[int] = None
        super().__init__(self._text())

    @property
    def table(self) -> str:
        name = os.path.basename(self.file)
        for suffix in (".csv", ".toml"):
            if name.endswith(suffix):
                return name[: -len(suffix)]
        return name

    def _text(self) -> str:
        where = self.file
        if self.line is not None:
            where += f", line {self.line}"
        if self.column is not None:
            if self.column_name:
                where += f", column {self.column} ({self.column_name})"
            else:
                where += f", column {self.column}"
        return f"{where}: {self.reason}"

    def relocate(self, file: str, from_frame: bool) -> "InputError":
        """The same error shown at ``file`` (a table given in memory is
        read from a temporary folder whose path means nothing to the
        caller)."""
        moved = InputError(self.reason, file, self.line, self.column, self.column_name)
        if from_frame and self.line is not None and self.line >= 2:
            moved.row = self.line - 2
        return moved


class UsageError(LotwrightError, ValueError):
    """An argument is out of range or names nothing known."""


class OutputError(LotwrightError, OSError):
    """A file could not be written; ``path`` names it."""

    def __init__(self, reason: str, path: str):
        self.reason = reason
        self.path = path
        super().__init__(f"cannot write {path}: {reason}")


class InternalError(LotwrightError, RuntimeError):
    """A fault of lotwright itself; please report it with the input."""
