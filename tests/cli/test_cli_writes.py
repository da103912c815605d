"""What the verbs say about writing: a file whose comments could not be kept names its
backup on stderr; a change of several files is one transaction."""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from rostertui.cli.main import main
from rostertui.core.io import save as save_module
from rostertui.core.io.load import load_workspace
from rostertui.core.io.transaction import JOURNAL
from rostertui.core.models.common import OFF
from tests.conftest import DEMO, FIXTURES, copy_ws


@pytest.fixture
def clinic(tmp_path: Path) -> Path:
    """The clinic demo with a fixed solved roster, whose first lines are comments."""
    dest = copy_ws(DEMO / "clinic", tmp_path, "clinic")
    shutil.copy(FIXTURES / "clinic_solved_roster.toml", dest / "roster.toml")
    return dest


def working_day(folder: Path) -> tuple[str, str]:
    ws = load_workspace(folder)
    assert ws.roster is not None
    pid = next(p for p in ws.person_ids if ws.roster.rows[p][10] != OFF)
    return pid, ws.unit.dates[10].isoformat()


def backup_of(ws: Path, name: str) -> Path:
    [found] = (ws / ".rostertui" / "backup").glob(f"{name}.*")
    return found


def test_absent_names_the_backups_on_stderr_when_comments_cannot_be_kept(
        clinic: Path, capsys: pytest.CaptureFixture[str],
        monkeypatch: pytest.MonkeyPatch) -> None:
    old = {n: (clinic / n).read_bytes() for n in ("requests.toml", "roster.toml")}
    pid, day = working_day(clinic)

    def broken(text: str, data: object) -> str:
        raise RuntimeError("a tomlkit corner case")

    monkeypatch.setattr(save_module, "merge_text", broken)
    assert main(["absent", str(clinic), pid, day]) in (0, 1)
    err = capsys.readouterr().err
    requests, roster = backup_of(clinic, "requests.toml"), backup_of(clinic, "roster.toml")
    assert requests.read_bytes() == old["requests.toml"]
    assert roster.read_bytes() == old["roster.toml"]
    assert ("warning: requests.toml: could not keep its comments and layout; the previous "
            f"text is kept in .rostertui/backup/{requests.name}\n") in err
    assert ("warning: roster.toml: always written fresh, so its comments are not kept; the "
            f"previous text is kept in .rostertui/backup/{roster.name}\n") in err
    again = load_workspace(clinic)  # and the leave is there, the shift cleared
    assert any(lv.person == pid for lv in again.requests.leave)
    assert again.roster is not None and again.roster.rows[pid][10] == OFF
    assert not (clinic / JOURNAL).exists()
    assert not [p for p in clinic.iterdir() if p.name.endswith(".tmp")]


def test_swap_names_the_roster_backup_and_a_second_swap_needs_none(
        clinic: Path, capsys: pytest.CaptureFixture[str]) -> None:
    ws = load_workspace(clinic)
    assert ws.roster is not None
    rows, day = ws.roster.rows, ws.unit.dates[3]
    a = ws.person_ids[0]
    b = next(p for p in ws.person_ids[1:] if rows[p][3] != rows[a][3])
    main(["swap", str(clinic), a, day.isoformat(), b])
    err = capsys.readouterr().err
    backup = backup_of(clinic, "roster.toml")
    assert f"warning: roster.toml: always written fresh, so its comments are not kept; " \
           f"the previous text is kept in .rostertui/backup/{backup.name}" in err
    main(["swap", str(clinic), a, day.isoformat(), b])  # the roster has no comment now
    assert "backup" not in capsys.readouterr().err
