"""solve-many's pure parts, without a cluster: workspaces as data and back, the task,
the client's referee and its compare-and-refuse write."""

from __future__ import annotations

import tomllib
from pathlib import Path

import pytest

from rostertui.core.check import check_roster
from rostertui.core.errors import InputError
from rostertui.core.io.load import load_workspace
from rostertui.core.io.save import dumps
from rostertui.core.many.files import find_workspaces, place_files, read_files
from rostertui.core.many.task import UnitOptions, solve_unit
from rostertui.core.many.write import (
    NotAccepted,
    RosterChanged,
    accept,
    digest,
    write_if_unchanged,
)
from rostertui.core.models.roster import Roster
from tests.conftest import FIXTURES, copy_ws, temporaries, units_folder

QUICK = UnitOptions(time_limit=5, workers=1)


def test_a_folder_of_workspaces_and_a_workspace_are_both_found(tmp_path: Path) -> None:
    root = units_folder(tmp_path, good=2)
    (root / "notes").mkdir()  # a sub-folder without unit.toml is not a unit
    found = find_workspaces([root])
    assert [p.name for p in found] == ["broken", "unit-1", "unit-2"]
    assert find_workspaces([root / "unit-2", root / "unit-2"]) == [root / "unit-2"]
    with pytest.raises(InputError) as err:
        find_workspaces([root / "notes", tmp_path / "nowhere"])
    text = err.value.summary()
    assert "notes" in text and "unit.toml" in text and "no such folder" in text


def test_files_travel_with_included_local_presets_and_load_back(tmp_path: Path) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    (ws / ".hidden.toml").write_text("x = 1\n")
    (tmp_path / "common.toml").write_text((ws / "presets" / "local.toml").read_text())
    unit = ws / "unit.toml"
    unit.write_text(unit.read_text().replace('"presets/local.toml"', '"../common.toml"'))
    files = read_files(ws)
    assert "../common.toml" in files and ".hidden.toml" not in files
    assert {"unit.toml", "staff.toml", "shifts.toml", "roster.toml"} <= set(files)
    there = place_files(files, tmp_path / "elsewhere")
    assert (there.parent / "common.toml").is_file()
    original, copy = load_workspace(ws), load_workspace(there)
    assert [r.rule.id for r in copy.rules] == [r.rule.id for r in original.rules]
    assert check_roster(copy).penalty == check_roster(original).penalty


def test_the_task_returns_a_refereed_roster_with_its_solve_record(tmp_path: Path) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    result = solve_unit(read_files(ws), QUICK)
    assert result.roster_toml is not None and result.error is None
    record = tomllib.loads(result.roster_toml)["solve"]
    assert record["objective"] == result.objective and record["status"] == result.solve_status
    roster, check = accept(read_files(ws), result.roster_toml, result.objective)
    assert check.compliant and check.penalty == result.objective
    assert check_roster(load_workspace(ws), roster).penalty == result.objective


def test_bad_input_is_a_result_with_the_loaders_words(tmp_path: Path) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    (ws / "unit.toml").write_text((ws / "unit.toml").read_text().replace("days = 7",
                                                                        "days = -1"))
    result = solve_unit(read_files(ws), QUICK)
    assert result.bad_input and result.roster_toml is None
    assert result.error is not None and "unit.toml: days (line" in result.error


def test_a_roster_the_checker_refuses_is_not_accepted(tmp_path: Path) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    result = solve_unit(read_files(ws), QUICK)
    assert result.roster_toml is not None
    roster = Roster.model_validate(tomllib.loads(result.roster_toml))
    roster.rows = {pid: ["-"] * roster.days for pid in roster.rows}  # no cover at all
    everyone_off = dumps(roster)
    with pytest.raises(NotAccepted, match="checker does not accept"):
        accept(read_files(ws), everyone_off, result.objective)
    with pytest.raises(NotAccepted, match="objective"):  # right roster, wrong penalty claimed
        accept(read_files(ws), result.roster_toml, (result.objective or 0) + 1)


def test_a_roster_changed_since_sending_is_never_overwritten(tmp_path: Path) -> None:
    ws = copy_ws(FIXTURES / "good", tmp_path)
    files = read_files(ws)
    result = solve_unit(files, QUICK)
    assert result.roster_toml is not None
    roster, _ = accept(files, result.roster_toml, result.objective)
    edited = (ws / "roster.toml").read_bytes() + b"# my own change\n"
    (ws / "roster.toml").write_bytes(edited)
    with pytest.raises(RosterChanged, match="roster.toml changed after the unit was sent"):
        write_if_unchanged(ws, roster, digest(files["roster.toml"]))
    assert (ws / "roster.toml").read_bytes() == edited
    (ws / "roster.toml").unlink()
    with pytest.raises(RosterChanged, match="deleted"):
        write_if_unchanged(ws, roster, digest(files["roster.toml"]))
    assert not (ws / "roster.toml").exists()
    write_if_unchanged(ws, roster, None)  # absent then, absent now: written
    assert load_workspace(ws).roster == roster and temporaries(ws) == []
