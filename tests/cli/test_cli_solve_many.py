"""`rostertui solve-many`: the JSON at the end, a line per change off a terminal, exit
codes, the missing extra, a command that names no workspace."""

from __future__ import annotations

import json
import sys
from pathlib import Path
from typing import Any

import pytest

from rostertui.cli.main import main
from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from tests.conftest import units_folder

UNIT_KEYS = {"workspace", "name", "status", "solve_status", "penalty", "bound", "gap",
             "seconds", "error", "attempts", "retried", "written", "warnings"}


def test_json_names_every_unit_and_the_broken_ones_error(
        dask_cluster: Any, tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    root = units_folder(tmp_path, good=2)
    code = main(["solve-many", str(root), "--time-limit", "3", "--workers", "1",
                 "--scheduler", dask_cluster.scheduler_address, "--json"])
    captured = capsys.readouterr()
    assert code == 1  # one unit failed
    data = json.loads(captured.out)
    assert [u["name"] for u in data["units"]] == ["broken", "unit-1", "unit-2"]
    assert all(set(u) == UNIT_KEYS for u in data["units"])
    broken, good = data["units"][0], data["units"][1:]
    assert broken["status"] == "failed" and broken["written"] is False
    assert "unit.toml: days (line 5)" in broken["error"]
    for unit in good:
        assert unit["status"] == "done" and unit["written"] and unit["gap"] == 0.0
        ws = load_workspace(unit["workspace"])
        assert ws.roster is not None and ws.roster.solve is not None
        assert check_roster(ws).penalty == unit["penalty"] == ws.roster.solve.objective
    assert data["total"] == {**data["total"], "units": 3, "done": 2, "failed": 1,
                             "refused": 0, "retried": 0, "interrupted": False}
    # off a terminal: a line per change of state, and the total
    assert "broken  failed" in captured.err and "unit-1  done" in captured.err
    assert "total: 3 units: 2 done, 1 failed" in captured.err
    assert "broken: failed: 1 problem in the input:" in captured.err


def test_a_local_cluster_by_default_and_exit_0_when_every_roster_is_written(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    pytest.importorskip("distributed", reason="Dask distributed (the extra rostertui[many]) "
                        "is not installed")
    root = units_folder(tmp_path, good=2, broken=False)
    assert main(["solve-many", str(root / "unit-1"), str(root / "unit-2"),
                 "--time-limit", "3"]) == 0
    err = capsys.readouterr().err
    assert "local cluster of" in err and "total: 2 units: 2 done" in err


def test_without_the_extra_exit_2_naming_it(tmp_path: Path, monkeypatch: pytest.MonkeyPatch,
                                            capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.setitem(sys.modules, "distributed", None)  # import distributed: ImportError
    root = units_folder(tmp_path, good=1, broken=False)
    before = (root / "unit-1" / "roster.toml").read_bytes()
    assert main(["solve-many", str(root)]) == 2
    err = capsys.readouterr().err
    assert "pip install 'rostertui[many]'" in err
    assert (root / "unit-1" / "roster.toml").read_bytes() == before


def test_a_folder_that_holds_no_workspace_exits_2(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    pytest.importorskip("distributed", reason="Dask distributed (the extra rostertui[many]) "
                        "is not installed")
    (tmp_path / "empty").mkdir()
    assert main(["solve-many", str(tmp_path / "empty"), "--json"]) == 2
    captured = capsys.readouterr()
    assert captured.out == "" and "no sub-folder holds unit.toml" in captured.err
    assert main(["solve-many", str(tmp_path), "--time-limit", "0"]) == 2


def test_the_command_line_loads_without_dask() -> None:
    """Dask is imported only when solve-many opens a cluster."""
    import subprocess

    code = ("import sys, rostertui.cli.main, rostertui.core.many.client;"
            "print(sorted(m for m in sys.modules if m.split('.')[0] in ('dask', 'distributed')))")
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          check=True, cwd=Path(__file__).resolve().parents[2])
    assert done.stdout.strip() == "[]"
