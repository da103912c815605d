"""The editing session: hand edits, locks, undo/redo, unsaved changes, saving."""

from __future__ import annotations

from datetime import date
from pathlib import Path

import pytest

from rostertui.core.edit.session import Session, changed_cells
from rostertui.core.errors import EditError
from rostertui.core.io.load import load_workspace
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace

RITA = "c13"  # on leave 15-18 Mar 2027, the first four days of the clinic's period


def test_without_roster_everyone_is_off_and_nothing_is_unsaved(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    assert set(s.roster.rows) == set(clinic_ws.person_ids)
    assert all(row == ["-"] * 28 for row in s.roster.rows.values())
    assert not s.dirty and not s.had_file and not s.can_undo


def test_a_shift_on_leave_is_a_hard_violation_at_that_cell(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    before = {(v.rule, v.person, v.dates) for v in s.check.violations}
    change = s.set_cell(RITA, 0, "E")
    assert change is not None and s.code(RITA, 0) == "E" and s.dirty
    new = [v for v in s.check.violations if (v.rule, v.person, v.dates) not in before]
    assert [(v.rule, v.hard, v.person, v.dates) for v in new if v.rule == "leave"] == [
        ("leave", True, RITA, (date(2027, 3, 15),))]


def test_codes_are_forgiven_their_case_and_unknown_ones_refused(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    s.set_cell("c01", 3, "n")
    assert s.code("c01", 3) == "N"
    with pytest.raises(EditError, match="no shift 'Q'; shifts: E, L, N"):
        s.set_cell("c01", 3, "Q")
    assert s.set_cell("c01", 3, "N") is None  # already there: no undo step
    for off in ("-", " ", "off", "OFF"):
        s.set_cell("c01", 3, "N")
        s.set_cell("c01", 3, off)
        assert s.code("c01", 3) == "-"


def test_a_locked_cell_refuses_edits_until_unlocked(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    s.set_cell("c01", 2, "L")
    assert s.toggle_lock("c01", 2) is True
    assert [(lk.person, lk.dates) for lk in s.roster.lock] == [("c01", [date(2027, 3, 17)])]
    with pytest.raises(EditError, match="locked"):
        s.set_cell("c01", 2, "E")
    s.toggle_lock("c01", 5)
    assert s.roster.lock[0].dates == [date(2027, 3, 17), date(2027, 3, 20)]
    assert s.toggle_lock("c01", 2) is False and s.toggle_lock("c01", 5) is False
    assert s.roster.lock == []
    s.set_cell("c01", 2, "E")
    assert s.code("c01", 2) == "E"


def test_undo_and_redo_walk_the_changes_and_unsaved_follows(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    s.set_cell("c01", 0, "E")
    s.set_cell("c01", 1, "L")
    s.toggle_lock("c01", 1)
    assert s.undo() is not None and s.roster.lock == []
    assert s.undo() is not None and s.code("c01", 1) == "-"
    assert s.undo() is not None and not s.dirty  # back to the file: nothing unsaved
    assert s.undo() is None
    s.redo()
    assert s.code("c01", 0) == "E" and s.dirty and s.can_redo
    s.set_cell("c02", 0, "N")  # a new change forgets what could be redone
    assert not s.can_redo


def test_save_writes_roster_toml_that_loads_back_the_same(clinic: Path) -> None:
    s = Session(load_workspace(clinic))
    s.set_cell("c01", 0, "E")
    s.set_cell("c05", 27, "N")
    s.toggle_lock("c01", 0)
    path = s.save()
    assert path == clinic / "roster.toml" and not s.dirty and s.had_file
    again = load_workspace(clinic)
    assert again.roster is not None
    assert again.roster.rows == s.roster.rows
    assert [(lk.person, lk.dates) for lk in again.roster.lock] == [("c01", [date(2027, 3, 15)])]
    assert not Session(again).dirty


def test_a_solved_roster_replaces_the_grid_undoably(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    rows = {pid: ["E"] + ["-"] * 27 for pid in clinic_ws.person_ids}
    s.replace(Roster(start=clinic_ws.unit.start, days=28, rows=rows), "solve")
    assert s.code("c07", 0) == "E" and s.dirty
    assert len(changed_cells(s.saved, s.roster)) == 14
    s.undo()
    assert s.code("c07", 0) == "-" and not s.dirty


def test_the_solver_sees_the_grid_not_the_file(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    s.set_cell("c01", 0, "E")
    s.toggle_lock("c01", 0)
    ws = s.workspace_for_solve()
    assert ws.roster is not None and ws.roster.rows["c01"][0] == "E"
    assert ws.roster.lock[0].person == "c01"
    assert clinic_ws.roster is None  # the loaded workspace is untouched


def test_a_hand_edit_drops_the_solve_record_and_undo_brings_it_back(
        clinic_ws: Workspace) -> None:
    from rostertui.core.models.roster import SolveRecord

    session = Session(clinic_ws)
    pid = clinic_ws.person_ids[0]
    solved = session.roster.model_copy(update={"solve": SolveRecord(
        status="feasible", objective=1234, bound=1000, seconds=5.0, seed=0)})
    session.replace(solved, "solve")
    assert session.roster.solve is not None and session.roster.solve.objective == 1234
    session.set_cell(pid, 0, "E")
    assert session.roster.solve is None  # its objective no longer describes the roster
    session.undo()
    assert session.roster.solve is not None and session.roster.solve.objective == 1234
