"""`rostertui open WS`: the verb module (main.py wires it in)."""

from __future__ import annotations

import argparse
import subprocess
import sys
from pathlib import Path

import pytest

from rostertui.cli import open as open_verb
from rostertui.core.errors import InputError
from rostertui.tui.app import RosterApp

REPO = Path(__file__).resolve().parents[2]


def parser() -> argparse.ArgumentParser:
    p = argparse.ArgumentParser(prog="rostertui")
    open_verb.register(p.add_subparsers(dest="verb"))
    return p


def test_open_takes_a_workspace_defaulting_to_here() -> None:
    assert parser().parse_args(["open"]).workspace == "."
    assert parser().parse_args(["open", "ward-b"]).workspace == "ward-b"


def test_do_open_loads_then_runs_the_app(clinic: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    seen: list[RosterApp] = []

    def fake_run(self: RosterApp) -> None:
        seen.append(self)

    monkeypatch.setattr(RosterApp, "run", fake_run)
    args = parser().parse_args(["open", str(clinic)])
    assert args.run(args) == 0
    assert seen and seen[0].session.ws.path == clinic


def test_a_workspace_that_cannot_be_read_raises_input_error(tmp_path: Path) -> None:
    (tmp_path / "unit.toml").write_text('name = "x"\n', encoding="utf-8")
    with pytest.raises(InputError) as caught:
        open_verb.do_open(tmp_path)
    assert any(p.file == "staff.toml" for p in caught.value.problems)


def test_python_dash_m_reports_input_errors_with_exit_2(tmp_path: Path) -> None:
    done = subprocess.run([sys.executable, "-m", "rostertui", "open", str(tmp_path / "nope")],
                          capture_output=True, text=True, cwd=REPO, check=False)
    assert done.returncode == 2
    assert "no such workspace folder" in done.stderr
