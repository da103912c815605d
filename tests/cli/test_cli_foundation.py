"""The command line skeleton: help, version, new, check's input errors, exit codes."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

from rostertui import __version__
from rostertui.cli.main import main
from tests.conftest import DEMO, copy_ws


def snapshot(folder: Path) -> dict[str, bytes]:
    return {str(p.relative_to(folder)): p.read_bytes() for p in folder.rglob("*") if p.is_file()}


def test_version_and_help(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["--version"]) == 0
    assert capsys.readouterr().out.strip() == f"rostertui {__version__}"
    assert main(["--help"]) == 0
    out = capsys.readouterr().out
    for verb in ("check", "new", "demo"):
        assert verb in out


def test_python_dash_m_runs_the_same_cli() -> None:
    done = subprocess.run([sys.executable, "-m", "rostertui", "--version"],
                          capture_output=True, text=True, check=False)
    assert (done.returncode, done.stdout.strip()) == (0, f"rostertui {__version__}")


def test_a_wrong_command_exits_2(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["check", "--frobnicate"]) == 2
    assert "unrecognized arguments: --frobnicate" in capsys.readouterr().err


def test_a_bare_folder_means_open_it(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    """`rostertui WS` is `rostertui open WS` (cli.md); a folder that is no workspace: exit 2."""
    assert main([str(tmp_path / "frobnicate")]) == 2
    assert "no such workspace folder" in capsys.readouterr().err


def test_new_writes_a_valid_empty_workspace(tmp_path: Path,
                                            capsys: pytest.CaptureFixture[str]) -> None:
    ws = tmp_path / "ward"
    assert main(["new", str(ws)]) == 0
    assert sorted(p.name for p in ws.iterdir()) == [
        "requests.toml", "shifts.toml", "staff.toml", "unit.toml"]
    capsys.readouterr()
    assert main(["check", str(ws), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["compliant"] is True and data["violations"] == []


def test_new_never_overwrites(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = tmp_path / "ward"
    main(["new", str(ws)])
    (ws / "staff.toml").write_text('[[person]]\nid = "p1"\nname = "Mine"\n')
    before = snapshot(ws)
    assert main(["new", str(ws)]) == 2
    assert "already holds" in capsys.readouterr().err
    assert snapshot(ws) == before


def test_check_without_roster_validates_and_says_so(good_ws: Path,
                                                    capsys: pytest.CaptureFixture[str]) -> None:
    (good_ws / "roster.toml").unlink()
    assert main(["check", str(good_ws)]) == 0
    assert "no roster yet" in capsys.readouterr().out


@pytest.mark.parametrize("unit", ["clinic", "depot"])
def test_demo_units_are_valid(unit: str, capsys: pytest.CaptureFixture[str]) -> None:
    if not (DEMO / unit).is_dir():
        pytest.fail(f"demo/{unit} is missing")
    assert main(["check", str(DEMO / unit)]) == 0


def test_clinic_with_three_mistakes_reports_all_three_and_writes_nothing(
    tmp_path: Path, capsys: pytest.CaptureFixture[str]
) -> None:
    """The foundation's acceptance case, on a copy of the bundled clinic demo."""
    ws = copy_ws(DEMO / "clinic", tmp_path)
    # a typing slip in a skill the clinic's shifts ask for: "triage" -> "triagee"
    staff = (ws / "staff.toml").read_text()
    assert '"triage"' in staff and '"triage"' in (ws / "shifts.toml").read_text()
    (ws / "staff.toml").write_text(staff.replace('"triage"', '"triagee"', 1))
    requests = (ws / "requests.toml").read_text()
    (ws / "requests.toml").write_text(
        requests + '\n[[request]]\nperson = "ghost"\ndate = 2027-03-20\nwant = "off"\n')
    shifts = (ws / "shifts.toml").read_text()
    i = shifts.index('start = "')
    j = shifts.index('"', i + len('start = "'))
    (ws / "shifts.toml").write_text(shifts[:i] + 'start = "25:00' + shifts[j:])
    before = snapshot(ws)
    assert main(["check", str(ws)]) == 2
    err = capsys.readouterr().err
    assert "shifts.toml: shift[0].start (line" in err and "'25:00' is not a clock time" in err
    assert "requests.toml: request[" in err and "unknown person 'ghost'" in err
    assert "staff.toml: person[" in err and "unknown skill 'triagee'" in err
    assert "nothing was written" in err
    assert snapshot(ws) == before


def test_demo_copies_once_and_never_overwrites(tmp_path: Path,
                                               capsys: pytest.CaptureFixture[str]) -> None:
    target = tmp_path / "demo-here"
    assert main(["demo", str(target), "--no-open"]) == 0
    assert (target / "unit.toml").read_text() == (DEMO / "clinic" / "unit.toml").read_text()
    (target / "staff.toml").write_text((target / "staff.toml").read_text() + "\n# mine\n")
    assert main(["demo", str(target), "--no-open"]) == 0  # the same demo: kept as it is
    assert (target / "staff.toml").read_text().endswith("# mine\n")
    capsys.readouterr()
    assert main(["demo", str(target), "--unit", "depot", "--no-open"]) == 2
    assert "already holds another workspace" in capsys.readouterr().err
    assert (target / "unit.toml").read_text() == (DEMO / "clinic" / "unit.toml").read_text()
    assert (target / "staff.toml").read_text().endswith("# mine\n")
