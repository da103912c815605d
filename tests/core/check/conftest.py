"""Fixtures building tiny hand-made workspaces in tmp_path (see helpers.write_ws)."""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

import pytest

from rostertui.core.check import CheckResult, check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace

from .helpers import write_ws


@pytest.fixture
def make_ws(tmp_path: Path) -> Callable[..., Workspace]:
    """Build and load a workspace (see `write_ws` for the arguments)."""
    counter = iter(range(1_000_000))

    def build(**kwargs: object) -> Workspace:
        folder = write_ws(tmp_path / f"ws{next(counter)}", **kwargs)  # type: ignore[arg-type]
        return load_workspace(folder)

    return build


@pytest.fixture
def check(make_ws: Callable[..., Workspace]) -> Callable[..., CheckResult]:
    """Build, load and check a workspace in one call."""

    def run(**kwargs: object) -> CheckResult:
        return check_roster(make_ws(**kwargs))

    return run
