"""`rostertui export`: the verb's options, files, stdout, JSON and exit status, and the
long-form CSV read back by `rostertui check --roster` with the same penalty.

The verb is registered on a parser built here, so these tests do not depend on
which verbs `rostertui.cli.main` lists."""

from __future__ import annotations

import argparse
import json
import shutil
from pathlib import Path

import pytest

from rostertui.cli import export as export_verb
from rostertui.cli.check import do_check
from rostertui.core.errors import InputError
from tests.conftest import DEMO, FIXTURES, copy_ws
from tests.core.io.export.helpers import SCRIPT_NOTE, hostile_ws


def parser() -> argparse.ArgumentParser:
    p = argparse.ArgumentParser(prog="rostertui")
    export_verb.register(p.add_subparsers(dest="verb"))
    return p


def run(argv: list[str]) -> int:
    args = parser().parse_args(argv)
    return int(args.run(args))


@pytest.fixture
def clinic(tmp_path: Path) -> Path:
    """demo/clinic with the five-breach roster of tests/fixtures (5 hard violations)."""
    ws = copy_ws(DEMO / "clinic", tmp_path, "clinic")
    shutil.copyfile(FIXTURES / "clinic_breaches_roster.toml", ws / "roster.toml")
    return ws


def check_json(capsys: pytest.CaptureFixture[str], ws: Path, roster: Path | None) -> dict:
    capsys.readouterr()
    do_check(ws, roster=roster, as_json=True)
    return json.loads(capsys.readouterr().out)


def test_csv_round_trip_through_check_gives_the_same_penalty(
    clinic: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    assert run(["export", str(clinic), "--to", "csv"]) == 1  # hard violations: exit 1
    out = clinic / "export" / "roster.csv"
    assert capsys.readouterr().out.splitlines() == [str(out)]
    original = check_json(capsys, clinic, None)
    again = check_json(capsys, clinic, out)
    assert original["penalty"] == 1208 and original["hard_violations"] == 5
    assert again == original


def test_round_trip_of_hostile_names_and_notes(
    tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    ws = hostile_ws(tmp_path / "ws")
    out = tmp_path / "long.csv"
    assert run(["export", str(ws), "--to", "csv", "--out", str(out)]) == 0
    assert check_json(capsys, ws, out) == check_json(capsys, ws, None)
    grid = tmp_path / "grid.csv"
    assert run(["export", str(ws), "--to", "csv", "--grid", "--out", str(grid)]) == 0
    assert SCRIPT_NOTE in grid.read_text(encoding="utf-8-sig")


@pytest.mark.parametrize(("argv", "fmt", "names"), [
    (["--to", "csv", "--grid"], "csv-grid", ["roster-grid.csv"]),
    (["--to", "ics"], "ics", ["roster.ics"]),
    (["--to", "ics", "--per-person"], "ics-per-person", [f"c{i:02d}.ics" for i in range(1, 15)]),
    (["--to", "html"], "html", ["roster.html"]),
    (["--to", "audit-html"], "audit-html", ["audit.html"]),
])
def test_json_names_every_file_written(
    clinic: Path, capsys: pytest.CaptureFixture[str], argv: list[str], fmt: str,
    names: list[str],
) -> None:
    assert run(["export", str(clinic), *argv, "--json"]) == 1
    data = json.loads(capsys.readouterr().out)  # exactly one object on stdout
    assert data == {"written": data["written"], "format": fmt, "compliant": False}
    assert sorted(Path(p).name for p in data["written"]) == names
    assert all(Path(p).is_file() for p in data["written"])


def test_compliant_roster_exits_0(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = hostile_ws(tmp_path / "ws")
    out = tmp_path / "cal"
    assert run(["export", str(ws), "--to", "ics", "--per-person", "--out", str(out)]) == 0
    assert capsys.readouterr().out.split() == [str(out / f"p{i}.ics") for i in (1, 2, 3)]


def test_no_roster_exits_2_and_writes_nothing(
    tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    ws = copy_ws(DEMO / "clinic", tmp_path, "clinic")
    assert run(["export", str(ws), "--to", "html"]) == 2
    captured = capsys.readouterr()
    assert "roster.toml" in captured.err and captured.out == ""
    assert not (ws / "export").exists()


@pytest.mark.parametrize(("argv", "message"), [
    (["--to", "ics", "--grid"], "--grid goes with --to csv"),
    (["--to", "csv", "--per-person"], "--per-person goes with --to ics"),
])
def test_options_that_clash_exit_2(
    clinic: Path, capsys: pytest.CaptureFixture[str], argv: list[str], message: str
) -> None:
    assert run(["export", str(clinic), *argv]) == 2
    assert message in capsys.readouterr().err
    assert not (clinic / "export").exists()


def test_unknown_format_and_missing_to_are_usage_errors() -> None:
    for argv in (["export", ".", "--to", "pdf"], ["export", "."]):
        with pytest.raises(SystemExit) as exc:
            parser().parse_args(argv)
        assert exc.value.code == 2


def test_unreadable_workspace_raises_input_error(tmp_path: Path) -> None:
    ws = copy_ws(DEMO / "clinic", tmp_path, "clinic")
    (ws / "staff.toml").write_text("[[person]]\nid = 'x'\n")  # no name: invalid
    with pytest.raises(InputError):
        export_verb.do_export(ws, to="csv")
    assert not (ws / "export").exists()
