"""The session's saves: one transaction for both files, notices the app shows, and
publishing in the same transaction as the save."""

from __future__ import annotations

from datetime import date
from pathlib import Path

import pytest

from rostertui.core.edit.session import Session
from rostertui.core.io import save as save_module
from rostertui.core.io.load import load_workspace
from rostertui.core.io.published import load_published
from rostertui.core.io.transaction import JOURNAL


def test_a_save_that_cannot_keep_comments_gives_a_notice(
        clinic: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    s = Session(load_workspace(clinic))
    s.set_cell("c01", 2, "E")
    s.absent("c03", date(2027, 3, 20), reason="sick")
    old = (clinic / "requests.toml").read_bytes()

    def broken(text: str, data: object) -> str:
        raise RuntimeError("a tomlkit corner case")

    monkeypatch.setattr(save_module, "merge_text", broken)
    s.save()
    assert [p.name for p in s.wrote] == ["roster.toml", "requests.toml"]
    [backup] = (clinic / ".rostertui" / "backup").iterdir()
    assert backup.read_bytes() == old
    assert s.notices == ["requests.toml: could not keep its comments and layout; the previous "
                         f"text is kept in .rostertui/backup/{backup.name}"]
    assert not s.dirty and not (clinic / JOURNAL).exists()
    s.set_cell("c01", 3, "E")
    s.save()
    assert s.notices == []  # each save says only what it did


def test_publish_saves_and_keeps_the_version_together(clinic: Path) -> None:
    s = Session(load_workspace(clinic))
    s.set_cell("c01", 2, "E")
    s.absent("c03", date(2027, 3, 20), reason="sick")
    done = s.publish("first")
    assert done.version == 1 and not s.dirty
    assert [p.name for p in s.wrote] == ["roster.toml", "requests.toml"]
    again = load_workspace(clinic)
    published = load_published(clinic, 1)
    assert published is not None and published.roster == again.roster == s.roster
    assert again.requests == s.requests
    assert sorted(p.name for p in clinic.iterdir() if p.name.startswith(".")) == []
