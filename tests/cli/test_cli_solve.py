"""`rostertui solve`: progress on stderr, roster.toml written with [solve], JSON, exit codes."""

from __future__ import annotations

import json
import tomllib
from pathlib import Path

import pytest

from rostertui.cli.main import main
from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from tests.conftest import DEMO, FIXTURES, copy_ws


def test_solve_json_writes_the_roster_and_prints_the_spec_shape(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    assert main(["solve", str(ws), "--time-limit", "10", "--workers", "2", "--json"]) == 0
    captured = capsys.readouterr()
    data = json.loads(captured.out)
    assert set(data) == {"status", "objective", "bound", "seconds", "hard_violations"}
    assert data["hard_violations"] == 0 and data["status"] in ("optimal", "feasible")
    saved = tomllib.loads((ws / "roster.toml").read_text())
    assert saved["solve"]["objective"] == data["objective"]
    assert saved["solve"]["status"] == data["status"]
    assert saved["lock"] == [{"person": "t03", "dates": saved["lock"][0]["dates"]}]
    loaded = load_workspace(ws)
    assert check_roster(loaded).penalty == data["objective"]
    assert "penalty" in captured.err  # the progress line


def test_solve_human_summary(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = copy_ws(DEMO / "clinic", tmp_path)
    assert main(["solve", str(ws), "--time-limit", "8", "--workers", "2"]) == 0
    out = capsys.readouterr().out
    assert "every hard rule kept" in out
    assert "requests:" in out and "granted" in out
    assert "status" in out and "bound" in out


def test_no_roster_keeps_every_hard_rule_exit_1_and_nothing_written(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    (ws / "roster.toml").unlink()
    shifts = (ws / "shifts.toml").read_text()
    (ws / "shifts.toml").write_text(shifts + '\n[[cover]]\nshift = "N"\nmin = 9\n')
    before = {p.name: p.read_bytes() for p in ws.iterdir() if p.is_file()}
    assert main(["solve", str(ws), "--time-limit", "10", "--json"]) == 1
    captured = capsys.readouterr()
    assert json.loads(captured.out)["status"] == "infeasible"
    assert "No roster keeps every hard rule" in captured.err
    assert {p.name: p.read_bytes() for p in ws.iterdir() if p.is_file()} == before


def test_bad_input_exits_2_without_solving(tmp_path: Path,
                                           capsys: pytest.CaptureFixture[str]) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    (ws / "unit.toml").write_text((ws / "unit.toml").read_text().replace("days = 7", "days = -1"))
    assert main(["solve", str(ws)]) == 2
    assert "unit.toml: days" in capsys.readouterr().err


def test_the_summary_names_each_bound_and_no_decompose_leaves_it_out(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    assert main(["solve", str(ws), "--time-limit", "10", "--workers", "2"]) == 0
    out = capsys.readouterr().out
    assert "bounds: " in out and "column generation" in out
    found = next(line for line in out.splitlines() if line.startswith("  found by: "))
    assert any(m in found for m in ("CP-SAT search", "integer master", "RINS", "warm start"))
    assert main(["solve", str(ws), "--time-limit", "5", "--workers", "2", "--no-decompose"]) == 0
    out = capsys.readouterr().out
    assert "bounds: " in out and "column generation" not in out


def test_the_progress_line_says_when_the_bound_is_being_proved() -> None:
    from rostertui.cli.solve import format_progress
    from rostertui.core.solver import SolveProgress

    assert "proving a bound" in format_progress(SolveProgress(1.0, None, 412, stage="bound"))
    assert "bound      412" in format_progress(SolveProgress(2.0, 500, 412))
    assert "searching for a first roster" in format_progress(SolveProgress(1.0, None, 412))
    assert format_progress(SolveProgress(2.0, 500, 412, found_by="RINS")).endswith("by RINS")
    assert " by " not in format_progress(SolveProgress(2.0, 500, 412))
