"""When a save cannot keep a file's comments and layout, the previous text is kept in
.rostertui/backup/ first and the save says so (rostertui/core/io/save.py)."""

from __future__ import annotations

import re
from datetime import datetime
from pathlib import Path

import pytest

from rostertui.core.errors import Problem
from rostertui.core.io import save as save_module
from rostertui.core.io.load import load_workspace
from rostertui.core.io.save import keep_backup, save
from rostertui.core.io.transaction import transaction
from rostertui.core.models.history import History
from rostertui.core.models.staff import Staff
from tests.conftest import DEMO, FIXTURES, copy_ws

STAMP = r"\d{8}T\d{6}"


def broken_merge(text: str, data: object) -> str:
    raise RuntimeError("a tomlkit corner case")


def backups(ws: Path) -> list[Path]:
    folder = ws / ".rostertui" / "backup"
    return sorted(folder.iterdir()) if folder.is_dir() else []


def renamed_first_person(ws: Path) -> Staff:
    staff = load_workspace(ws).staff
    people = [p.model_copy(update={"name": "Renamed"}) if i == 0 else p
              for i, p in enumerate(staff.person)]
    return staff.model_copy(update={"person": people})


def test_a_failed_merge_keeps_the_previous_text_and_says_where(
        tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    ws = copy_ws(DEMO / "clinic", tmp_path)
    old = (ws / "staff.toml").read_bytes()
    assert b"#" in old
    staff = renamed_first_person(ws)
    monkeypatch.setattr(save_module, "merge_text", broken_merge)
    notices: list[Problem] = []
    save(staff, ws, notices)
    [backup] = backups(ws)
    assert re.fullmatch(rf"staff\.toml\.{STAMP}", backup.name)
    assert backup.read_bytes() == old  # exactly the text the user had
    assert [str(n) for n in notices] == [
        "staff.toml: could not keep its comments and layout; the previous text is kept in "
        f".rostertui/backup/{backup.name}"]
    assert load_workspace(ws).staff == staff  # and the new file says what was meant


def test_a_merge_that_works_makes_no_backup(tmp_path: Path) -> None:
    ws = copy_ws(DEMO / "clinic", tmp_path)
    notices: list[Problem] = []
    save(renamed_first_person(ws), ws, notices)
    assert notices == [] and backups(ws) == []
    assert "#" in (ws / "staff.toml").read_text()


def test_a_file_that_is_not_toml_is_backed_up_before_it_is_replaced(tmp_path: Path) -> None:
    ws = copy_ws(DEMO / "clinic", tmp_path)
    history = load_workspace(ws).history
    assert history is not None
    (ws / "history.toml").write_text("[[ oops\n# half typed\n")
    notices: list[Problem] = []
    save(History.model_validate(history.model_dump()), ws, notices)
    [backup] = backups(ws)
    assert backup.read_text() == "[[ oops\n# half typed\n"
    assert [str(n) for n in notices] == [
        "history.toml: not valid TOML, so it was written fresh; the previous text is kept in "
        f".rostertui/backup/{backup.name}"]


def test_roster_toml_comments_are_kept_once_as_a_backup(tmp_path: Path) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    roster = load_workspace(ws).roster
    assert roster is not None
    old = "# my notes on this roster\n" + (ws / "roster.toml").read_text()
    (ws / "roster.toml").write_text(old)
    notices: list[Problem] = []
    save(roster, ws, notices)
    [backup] = backups(ws)
    assert backup.read_text() == old
    assert [str(n) for n in notices] == [
        "roster.toml: always written fresh, so its comments are not kept; the previous text "
        f"is kept in .rostertui/backup/{backup.name}"]
    save(roster, ws, notices)  # no comment left to lose: no second backup
    assert len(backups(ws)) == 1 and len(notices) == 1


def test_a_hash_inside_a_string_is_no_comment() -> None:
    assert save_module.has_comment("a = 1  # why\n")
    assert save_module.has_comment("a = '''\n#\n''' # here\n")
    assert not save_module.has_comment("note = \"shift #3\"\nother = '#4'\n")
    assert not save_module.has_comment('a = "say \\"#\\""\nb = """\n# not one\n"""\n')


def test_a_backup_never_overwrites_an_earlier_one(tmp_path: Path) -> None:
    when = datetime(2026, 12, 2, 10, 15, 0)
    first = keep_backup(tmp_path, "staff.toml", b"one", now=when)
    second = keep_backup(tmp_path, "staff.toml", b"two", now=when)
    assert first.name == "staff.toml.20261202T101500"
    assert second.name == "staff.toml.20261202T101500.1"
    assert (first.read_bytes(), second.read_bytes()) == (b"one", b"two")


def test_a_transaction_keeps_the_backup_and_notes_it(
        tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    ws = copy_ws(DEMO / "clinic", tmp_path)
    old = (ws / "staff.toml").read_bytes()
    monkeypatch.setattr(save_module, "merge_text", broken_merge)
    with transaction(ws, "test") as tx:
        tx.save(renamed_first_person(ws))
    [backup] = backups(ws)
    assert backup.read_bytes() == old
    assert [n.file for n in tx.notices] == ["staff.toml"]
    assert backup.name in tx.notices[0].message
