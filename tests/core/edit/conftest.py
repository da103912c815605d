"""Fixtures for the editing core's tests: a writable copy of the clinic demo."""

from __future__ import annotations

from pathlib import Path

import pytest

from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from tests.conftest import DEMO, copy_ws


@pytest.fixture
def clinic(tmp_path: Path) -> Path:
    """A copy of demo/clinic (no roster.toml: everyone starts off)."""
    return copy_ws(DEMO / "clinic", tmp_path, "clinic")


@pytest.fixture
def clinic_ws(clinic: Path) -> Workspace:
    return load_workspace(clinic)
