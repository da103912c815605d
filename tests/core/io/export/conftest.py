"""Fixtures for the export tests: the hostile workspace, loaded, and the clinic demo
with the hand-made roster of tests/fixtures/clinic_breaches_roster.toml."""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from tests.conftest import DEMO, FIXTURES, copy_ws
from tests.core.io.export.helpers import hostile_ws


@pytest.fixture
def hostile(tmp_path: Path) -> Path:
    return hostile_ws(tmp_path / "hostile")


@pytest.fixture
def hostile_loaded(hostile: Path) -> Workspace:
    return load_workspace(hostile)


@pytest.fixture
def clinic_rostered(tmp_path: Path) -> Path:
    """A copy of demo/clinic whose roster.toml is the five-breach fixture roster."""
    ws = copy_ws(DEMO / "clinic", tmp_path, "clinic")
    shutil.copyfile(FIXTURES / "clinic_breaches_roster.toml", ws / "roster.toml")
    return ws
