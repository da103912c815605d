"""Saving: atomic writes, and load -> save -> load gives equal models for every file kind."""

from __future__ import annotations

import os
from datetime import date
from pathlib import Path

import pytest

from rostertui.core.io import atomic
from rostertui.core.io.load import load_workspace
from rostertui.core.io.save import dumps, dumps_preset, save
from rostertui.core.models.roster import Lock, Roster, SolveRecord
from rostertui.core.models.rules import PresetFile
from tests.conftest import DEMO, FIXTURES, copy_ws, example_cases

WORKSPACES = [FIXTURES / "good", *sorted(p for p in DEMO.glob("*") if p.is_dir()),
              *example_cases()]


@pytest.mark.parametrize("src", WORKSPACES, ids=[p.name for p in WORKSPACES])
def test_load_save_load_gives_equal_models(src: Path, tmp_path: Path) -> None:
    first = load_workspace(src)
    out = tmp_path / "saved"
    out.mkdir()
    files = [first.unit, first.staff, first.shifts, first.requests, first.history, first.roster]
    for model in files:
        if model is not None:
            save(model, out)
    for name in first.unit.include:
        if name.endswith(".toml"):
            dest = out / name
            dest.parent.mkdir(parents=True, exist_ok=True)
            dest.write_text((src / name).read_text())
    second = load_workspace(out)
    assert second.unit == first.unit
    assert second.staff == first.staff
    assert second.shifts == first.shifts
    assert second.requests == first.requests
    assert second.history == first.history
    assert second.roster == first.roster
    assert [r.rule for r in second.rules] == [r.rule for r in first.rules]


def test_preset_round_trip(tmp_path: Path) -> None:
    import tomllib

    from rostertui.core.io.presets import presets_dir

    for path in presets_dir().glob("*.toml"):
        preset = PresetFile.model_validate(tomllib.loads(path.read_text()))
        again = PresetFile.model_validate(tomllib.loads(dumps_preset(preset)))
        assert again == preset


def test_roster_toml_is_written_exactly_as_the_spec_shows() -> None:
    roster = Roster(
        start=date(2027, 3, 1),
        days=7,
        rows={"p07": ["E", "E", "L", "-", "-", "N", "N"]},
        lock=[Lock(person="p07", dates=[date(2027, 3, 1), date(2027, 3, 2)])],
        solve=SolveRecord(status="optimal", objective=1234, bound=1234, seconds=12.3, seed=0),
    )
    assert dumps(roster) == (
        "start = 2027-03-01\n"
        "days = 7\n"
        "\n"
        "[rows]\n"
        'p07 = ["E", "E", "L", "-", "-", "N", "N"]\n'
        "\n"
        "[[lock]]\n"
        'person = "p07"\n'
        "dates = [2027-03-01, 2027-03-02]\n"
        "\n"
        "[solve]\n"
        'status = "optimal"\n'
        "objective = 1234\n"
        "bound = 1234\n"
        "seconds = 12.3\n"
        "seed = 0\n"
    )


def test_person_ids_that_need_quotes_survive(tmp_path: Path) -> None:
    roster = Roster(start=date(2027, 3, 1), days=1, rows={"a.b": ["-"], "7": ["-"]})
    save(roster, tmp_path)
    import tomllib

    data = tomllib.loads((tmp_path / "roster.toml").read_text())
    assert data["rows"] == {"a.b": ["-"], "7": ["-"]}


def test_atomic_write_leaves_the_old_file_when_the_rename_fails(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    target = tmp_path / "staff.toml"
    target.write_text("old = 1\n")

    def broken_replace(src: str, dst: str) -> None:
        raise OSError("disk pulled out")

    monkeypatch.setattr(atomic.os, "replace", broken_replace)
    with pytest.raises(OSError):
        atomic.write_atomic(target, "new = 2\n")
    assert target.read_text() == "old = 1\n"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["staff.toml"]  # no temp left


def test_atomic_write_replaces_and_fsyncs(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    synced: list[int] = []
    real_fsync = os.fsync
    monkeypatch.setattr(atomic.os, "fsync", lambda fd: (synced.append(fd), real_fsync(fd)))
    target = tmp_path / "unit.toml"
    atomic.write_atomic(target, "name = 'x'\n")
    assert target.read_text() == "name = 'x'\n"
    assert len(synced) >= 1
    assert [p.name for p in tmp_path.iterdir()] == ["unit.toml"]


def test_saved_demo_copy_checks_the_same(tmp_path: Path) -> None:
    ws_dir = copy_ws(FIXTURES / "good", tmp_path)
    ws = load_workspace(ws_dir)
    save(ws.roster, ws_dir)
    assert load_workspace(ws_dir).roster == ws.roster
