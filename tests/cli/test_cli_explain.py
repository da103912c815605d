"""`rostertui explain` and `solve` explaining an infeasible workspace."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from rostertui.cli.main import main
from tests.core.check.helpers import write_ws

LEAVE = ('[[leave]]\nperson = "a"\nfrom = 2027-03-02\nto = 2027-03-04\n'
         '[[leave]]\nperson = "b"\nfrom = 2027-03-03\n')
COVER = '[[cover]]\nshift = "N"\nmin = 2\ndates = [2027-03-03]\n'


def workspace(tmp_path: Path, requests: str = LEAVE) -> Path:
    return write_ws(tmp_path / "ws", rows={"a": "- - - -", "b": "- - - -", "c": "- - - -"},
                    cover=COVER, requests=requests)


def test_explain_json_names_the_cover_and_the_leave(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = workspace(tmp_path)
    assert main(["explain", str(ws), "--json", "--time-limit", "20"]) == 1
    data = json.loads(capsys.readouterr().out)
    assert data["feasible"] is False and set(data) == {"feasible", "reasons"}
    for reason in data["reasons"]:
        assert set(reason) == {"message", "rules", "people", "dates"}
    conflict = next(r for r in data["reasons"] if r["message"].startswith("No roster"))
    assert sorted(conflict["rules"]) == ["cover", "leave"]
    assert {"a", "b"} <= set(conflict["people"]) and "2027-03-03" in conflict["dates"]


def test_explain_says_feasible_and_exits_0(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = workspace(tmp_path, requests="")
    assert main(["explain", str(ws), "--json", "--no-requests"]) == 0
    assert json.loads(capsys.readouterr().out) == {"feasible": True, "reasons": []}
    assert main(["explain", str(ws)]) == 0
    assert "a roster exists that keeps every hard rule" in capsys.readouterr().out


def test_solve_that_finds_no_roster_explains_on_stderr(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = workspace(tmp_path)
    (ws / "roster.toml").unlink()
    assert main(["solve", str(ws), "--json", "--time-limit", "10"]) == 1
    captured = capsys.readouterr()
    assert json.loads(captured.out)["status"] == "infeasible"  # stdout: the JSON alone
    assert "Why:" in captured.err and "a is on leave" in captured.err
    assert not (ws / "roster.toml").exists()
