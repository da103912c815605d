"""Published versions: numbered, timestamped, never overwritten, readable back."""

from __future__ import annotations

from datetime import UTC, datetime
from pathlib import Path

import pytest

from rostertui.core.errors import InputError
from rostertui.core.io import published as pub
from rostertui.core.io.load import load_workspace
from rostertui.core.models.roster import Roster
from tests.core.check.helpers import write_ws


@pytest.fixture
def ws_folder(tmp_path: Path) -> Path:
    return write_ws(tmp_path / "ws", rows={"a": "E L - N", "b": "- E E -"})


def roster_of(folder: Path) -> Roster:
    ws = load_workspace(folder)
    assert ws.roster is not None
    return ws.roster


def test_versions_count_up_and_keep_time_note_and_roster(ws_folder: Path) -> None:
    roster = roster_of(ws_folder)
    when = datetime(2027, 2, 20, 9, 30, tzinfo=UTC)
    first = pub.publish(ws_folder, roster, "first draft", now=when)
    second = pub.publish(ws_folder, roster.model_copy(update={"rows": {
        **roster.rows, "a": ["-", "-", "-", "-"]}}), "after the swap")
    assert (first.version, second.version) == (1, 2)
    assert pub.versions(ws_folder) == [1, 2]
    back = pub.load_published(ws_folder, 1)
    assert back is not None
    assert back.roster == roster
    assert back.meta.at == when and back.meta.note == "first draft"
    last = pub.load_published(ws_folder)
    assert last is not None and last.version == 2 and last.roster.rows["a"] == ["-"] * 4


def test_publish_never_replaces_a_version_even_when_its_number_was_taken_meanwhile(
        ws_folder: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    roster = roster_of(ws_folder)
    pub.publish(ws_folder, roster, "one")
    v1 = pub.path_of(ws_folder, 1).read_bytes()
    # another publish raced us: it wrote 002 after we listed the folder
    pub.path_of(ws_folder, 2).write_text("# someone else's version\n")
    real = pub.versions
    calls = iter([[1]])
    monkeypatch.setattr(pub, "versions", lambda folder: next(calls, None) or real(folder))
    done = pub.publish(ws_folder, roster, "three")
    assert done.version == 3
    assert pub.path_of(ws_folder, 1).read_bytes() == v1
    assert pub.path_of(ws_folder, 2).read_text() == "# someone else's version\n"
    assert not [p for p in pub.folder_of(ws_folder).iterdir() if p.name.endswith(".tmp")]


def test_a_missing_version_is_an_input_error_naming_the_file(ws_folder: Path) -> None:
    assert pub.load_published(ws_folder) is None
    pub.publish(ws_folder, roster_of(ws_folder))
    with pytest.raises(InputError) as err:
        pub.load_published(ws_folder, 7)
    assert "published/007.toml" in str(err.value) and "published: 1" in str(err.value)


def test_a_published_file_is_a_roster_the_checker_reads(ws_folder: Path) -> None:
    done = pub.publish(ws_folder, roster_of(ws_folder), "note")
    ws = load_workspace(ws_folder, roster_file=done.path)
    assert ws.roster == roster_of(ws_folder)
