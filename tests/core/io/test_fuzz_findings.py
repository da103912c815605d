"""Cases a fuzzing run over malformed workspaces found (each failed before its fix)."""

from __future__ import annotations

import os
from pathlib import Path

import pytest

from rostertui.core.errors import InputError
from rostertui.core.io.load import load_workspace


def _problems(folder: Path, **kw) -> list:
    with pytest.raises(InputError) as exc:
        load_workspace(folder, **kw)
    return exc.value.problems


def test_clock_times_with_non_ascii_digits_are_refused(good_ws: Path) -> None:
    path = good_ws / "shifts.toml"
    text = path.read_text(encoding="utf-8")
    first = text.index('start = "') + len('start = "')
    path.write_text(text[:first] + "\u0661\u0665:\u0660\u0660" + text[first + 5:],
                    encoding="utf-8")
    found = _problems(good_ws)
    assert any(p.file == "shifts.toml" and "clock time" in p.message for p in found)


def test_a_csv_field_past_the_csv_module_limit_is_a_message(good_ws: Path) -> None:
    csv_file = good_ws / "big.csv"
    csv_file.write_text("person,date,shift\n" + "x" * 200_000 + ",2027-03-01,E\n",
                        encoding="utf-8")
    found = _problems(good_ws, roster_file=csv_file)
    assert any(p.file == "big.csv" and p.line == 2 for p in found)


def test_a_dangling_link_in_place_of_requests_is_an_error(good_ws: Path) -> None:
    target = good_ws / "requests.toml"
    if target.exists():
        target.unlink()
    os.symlink(good_ws / "nowhere.toml", target)
    found = _problems(good_ws)
    assert any(p.file == "requests.toml" for p in found)


def test_a_named_pipe_in_place_of_a_file_is_refused_not_read(good_ws: Path) -> None:
    target = good_ws / "history.toml"
    if target.exists():
        target.unlink()
    os.mkfifo(target)
    found = _problems(good_ws)  # would block forever reading the pipe
    assert any(p.file == "history.toml" and "regular file" in p.message for p in found)


def test_a_file_given_as_the_workspace_says_it_is_a_file(good_ws: Path) -> None:
    found = _problems(good_ws / "unit.toml")
    assert "is a file" in found[0].message
