"""Collects the problems and warnings of one load, with key paths and lines."""

from __future__ import annotations

from dataclasses import dataclass, field

from rostertui.core.errors import Problem
from rostertui.core.io.errors_map import KeyPath, key_path_text
from rostertui.core.io.toml_lines import line_of


@dataclass
class Report:
    """Problems (errors) and warnings of one load; line maps per file for locating keys."""

    lines: dict[str, dict[KeyPath, int]] = field(default_factory=dict)
    problems: list[Problem] = field(default_factory=list)
    warnings: list[Problem] = field(default_factory=list)

    def _make(self, file: str, path: KeyPath, message: str) -> Problem:
        line = line_of(self.lines.get(file, {}), path) if path else None
        return Problem(file=file, key=key_path_text(path), message=message, line=line)

    def error(self, file: str, path: KeyPath, message: str) -> None:
        self.problems.append(self._make(file, path, message))

    def warn(self, file: str, path: KeyPath, message: str) -> None:
        self.warnings.append(self._make(file, path, message))
