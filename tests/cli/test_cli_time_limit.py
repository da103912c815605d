"""`solve` and `repair` say before starting when building the model alone outlasts
--time-limit (the estimate is made to exceed it here; its arithmetic is tested in
tests/core/solver/test_time_budget.py)."""

from __future__ import annotations

import dataclasses
from pathlib import Path

import pytest

from rostertui.cli import solve as cli_solve
from rostertui.cli.main import main
from rostertui.core.solver.model import estimate_build
from tests.conftest import FIXTURES, copy_ws


@pytest.fixture
def slow_estimate(monkeypatch: pytest.MonkeyPatch) -> None:
    def estimate(ws):  # noqa: ANN001, ANN202
        return dataclasses.replace(estimate_build(ws), seconds=14.2)

    monkeypatch.setattr(cli_solve, "estimate_build", estimate)


def test_solve_warns_on_stderr_before_starting(
        tmp_path: Path, capsys: pytest.CaptureFixture[str], slow_estimate: None) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    assert main(["solve", str(ws), "--time-limit", "3", "--workers", "2", "--json"]) == 0
    captured = capsys.readouterr()
    warning = ("Building the model for 4 people x 7 days takes about 14 s, more than "
               "--time-limit 3; the roster will take longer than asked.")
    assert warning in captured.err
    assert captured.err.index(warning) < captured.err.index("penalty")  # before the search
    assert "takes about" not in captured.out  # stdout keeps only the JSON


def test_repair_warns_the_same_way(
        tmp_path: Path, capsys: pytest.CaptureFixture[str], slow_estimate: None) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    main(["repair", str(ws), "--time-limit", "3", "--workers", "2"])
    assert "takes about 14 s, more than --time-limit 3" in capsys.readouterr().err


def test_no_warning_when_the_build_fits(tmp_path: Path,
                                        capsys: pytest.CaptureFixture[str]) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    assert main(["solve", str(ws), "--time-limit", "3", "--workers", "2"]) == 0
    assert "takes about" not in capsys.readouterr().err
