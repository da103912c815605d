"""Shared fixtures: paths to the repo's demos and fixtures, and to ../shared when present."""

from __future__ import annotations

import shutil
from datetime import date
from pathlib import Path

import pytest

REPO = Path(__file__).resolve().parents[1]
FIXTURES = REPO / "tests" / "fixtures"
DEMO = REPO / "demo"
SHARED = REPO.parent / "shared"
EXAMPLES = SHARED / "spec" / "examples"
BENCHMARKS = SHARED / "benchmarks" / "curtois-qu"


def example_cases() -> list[Path]:
    return sorted(EXAMPLES.glob("case-*")) if EXAMPLES.is_dir() else []


def need_shared(path: Path) -> None:
    """Skip, with the reason, when the project's ../shared folder is not beside this clone."""
    if not path.exists():
        pytest.skip(f"{path} not found: ../shared (spec examples, benchmarks) is not beside "
                    "this clone")


@pytest.fixture
def good_ws(tmp_path: Path) -> Path:
    """A writable copy of tests/fixtures/good."""
    dest = tmp_path / "ws"
    shutil.copytree(FIXTURES / "good", dest)
    return dest


def copy_ws(src: Path, tmp_path: Path, name: str = "ws") -> Path:
    dest = tmp_path / name
    shutil.copytree(src, dest)
    for p in dest.rglob("*"):
        p.chmod(0o644 if p.is_file() else 0o755)
    return dest


def two_working_days(folder: Path, first_day: int = 10) -> tuple[str, date, date]:
    """A person and two consecutive dates from `first_day` on which they work."""
    from rostertui.core.io.load import load_workspace
    from rostertui.core.models.common import OFF

    ws = load_workspace(folder)
    assert ws.roster is not None
    for pid in ws.person_ids:
        row = ws.roster.rows[pid]
        for d in range(first_day, ws.unit.days - 1):
            if row[d] != OFF and row[d + 1] != OFF:
                return pid, ws.unit.dates[d], ws.unit.dates[d + 1]
    raise AssertionError("nobody works two days in a row")


@pytest.fixture(scope="session")
def dask_cluster():
    """A local Dask cluster of 2 single-threaded worker processes for the solve-many
    tests, its scheduler configured as solve-many's own (one worker death per task);
    the tests skip, with the reason, when the extra is not installed."""
    pytest.importorskip("distributed", reason="Dask distributed (the extra rostertui[many]) "
                        "is not installed")
    import dask
    from distributed import LocalCluster

    from rostertui.core.many.cluster import SCHEDULER_CONFIG

    with dask.config.set(SCHEDULER_CONFIG):
        cluster = LocalCluster(n_workers=2, threads_per_worker=1, processes=True,
                               dashboard_address=":0")
    yield cluster
    cluster.close()


def units_folder(tmp_path: Path, good: int = 3, broken: bool = True) -> Path:
    """A folder of small workspaces: `good` copies of tests/fixtures/good (4 people x 7
    days, solved to optimality in about a second) and one whose unit.toml says
    `days = -1`."""
    root = tmp_path / "units"
    root.mkdir()
    for i in range(good):
        copy_ws(FIXTURES / "good", root, f"unit-{i + 1}")
    if broken:
        ws = copy_ws(FIXTURES / "good", root, "broken")
        unit = ws / "unit.toml"
        unit.write_text(unit.read_text().replace("days = 7", "days = -1"))
    return root


def temporaries(folder: Path) -> list[Path]:
    """Temporary files (`.name.pid-random.tmp`) left anywhere under `folder`."""
    return [p for p in folder.rglob(".*.tmp")]
