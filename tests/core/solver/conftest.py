"""Fixtures for the solver's tests: tiny workspaces solved through the real path."""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

import pytest

from rostertui.core.io.load import load_workspace
from rostertui.core.solver import SolveOptions, SolveOutcome, solve
from tests.core.check.helpers import write_ws


@pytest.fixture
def solve_ws(tmp_path: Path) -> Callable[..., SolveOutcome]:
    """Write a workspace (see write_ws; `rows` only name the people), solve it to
    optimality and return the outcome; the referee inside solve() has already
    checked the roster against the checker."""
    counter = iter(range(1_000_000))

    def run(people: list[str], days: int, **kwargs: object) -> SolveOutcome:
        rows = {pid: ["-"] * days for pid in people}
        folder = write_ws(tmp_path / f"ws{next(counter)}", rows=rows, days=days,
                          **kwargs)  # type: ignore[arg-type]
        (folder / "roster.toml").unlink()
        ws = load_workspace(folder)
        return solve(ws, SolveOptions(time_limit=20, workers=2))

    return run
