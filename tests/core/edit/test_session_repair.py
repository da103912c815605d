"""The session's repair steps: swap, its preview, absence; undo and redo restore both files
exactly; saving writes requests.toml too; editors keep an unsaved absence."""

from __future__ import annotations

import os
import signal
import subprocess
import sys
from datetime import date
from pathlib import Path

import pytest

from rostertui.core.edit.files import apply
from rostertui.core.edit.session import Session
from rostertui.core.errors import EditError
from rostertui.core.io.load import load_workspace
from rostertui.core.models.roster import Roster
from rostertui.core.models.staff import Staff
from rostertui.core.models.workspace import Workspace
from tests.conftest import REPO

START = date(2027, 3, 15)


def crafted(ws: Workspace) -> Roster:
    """c01 works L on day 0; c02 E on day 1 and L on day 3; c03 E on days 5-7."""
    rows = {pid: ["-"] * 28 for pid in ws.person_ids}
    rows["c01"][0] = "L"
    rows["c02"][1], rows["c02"][3] = "E", "L"
    rows["c03"][5:8] = ["E", "E", "E"]
    return Roster(start=START, days=28, rows=rows)


@pytest.fixture
def session(clinic_ws: Workspace) -> Session:
    s = Session(clinic_ws)
    s.replace(crafted(clinic_ws), "crafted")
    return s


def test_a_swap_is_previewed_without_change_and_undone_exactly(session: Session) -> None:
    before, undo_depth = session.roster, len(session._undo)
    plan = session.preview_swap("c01", 1, "c02", None)  # c01's off and c02's E on 16 Mar
    assert session.roster is before and len(session._undo) == undo_depth  # nothing applied
    assert [(c.person, c.date, c.before, c.after) for c in plan.cells] == [
        ("c01", date(2027, 3, 16), "-", "E"), ("c02", date(2027, 3, 16), "E", "-")]
    created = [(v.rule, v.person) for v in plan.impact.created if v.hard]
    assert ("daily-rest", "c01") in created  # L on the 15th, then E at 07:00 on the 16th
    change = session.swap("c01", 1, "c02")
    assert change is not None and session.code("c01", 1) == "E" and session.code("c02", 1) == "-"
    after = session.roster
    assert session.undo() is change
    assert session.roster == before and session.roster is before
    assert session.check == Session(session.ws, before).check
    session.redo()
    assert session.roster == after


def test_two_people_on_two_days_exchange_both_days(session: Session) -> None:
    session.swap("c01", 0, "c02", 3)  # c01 takes c02's days 0 and 3, and the reverse
    assert [session.code("c01", d) for d in (0, 3)] == ["-", "L"]
    assert [session.code("c02", d) for d in (0, 3)] == ["L", "-"]
    assert session.code("c02", 1) == "E"  # other days untouched


def test_a_swap_of_a_locked_or_same_cell_is_refused(session: Session) -> None:
    session.toggle_lock("c01", 0)
    with pytest.raises(EditError, match="locked"):
        session.preview_swap("c01", 0, "c02")
    with pytest.raises(EditError, match="itself"):
        session.swap("c02", 1, "c02", 1)
    assert session.swap("c04", 2, "c05", 2) is None  # both off: nothing to exchange


def test_an_absence_changes_both_files_and_undo_restores_both(session: Session) -> None:
    roster, requests = session.roster, session.requests
    leave_count = len(requests.leave)
    plan = session.absent("c03", date(2027, 3, 20), date(2027, 3, 21), "sick", 7.5)
    assert [(c.date.day, c.before) for c in plan.cleared] == [(20, "E"), (21, "E")]
    assert session.code("c03", 5) == "-" and session.code("c03", 6) == "-"
    assert session.code("c03", 7) == "E"
    assert len(session.requests.leave) == leave_count + 1
    assert session.ws.requests is session.requests  # the check and a solve see the leave
    assert session.workspace_for_solve().requests.leave[-1].reason == "sick"
    assert session.dirty and session.requests_dirty
    after_roster, after_requests = session.roster, session.requests
    session.undo()
    assert session.roster == roster and session.requests == requests
    assert not session.requests_dirty
    session.redo()
    assert session.roster == after_roster and session.requests == after_requests


def test_an_absence_outside_the_period_or_with_a_bad_credit_changes_nothing(
        session: Session) -> None:
    roster, requests, depth = session.roster, session.requests, len(session._undo)
    with pytest.raises(EditError, match="outside the period"):
        session.absent("c03", date(2027, 5, 1))
    with pytest.raises(EditError, match="credit_hours"):
        session.absent("c03", START, None, "sick", 30)
    with pytest.raises(EditError, match="ends"):
        session.absent("c03", date(2027, 3, 20), date(2027, 3, 19))
    assert (session.roster, session.requests, len(session._undo)) == (roster, requests, depth)


def test_save_writes_the_leave_to_requests_toml(clinic: Path) -> None:
    s = Session(load_workspace(clinic))
    s.replace(crafted(s.ws), "crafted")
    s.absent("c03", date(2027, 3, 20), reason="sick")
    s.save()
    assert [p.name for p in s.wrote] == ["roster.toml", "requests.toml"]
    again = load_workspace(clinic)
    assert again.requests == s.requests and not Session(again).dirty
    assert "# Leave is hard" in (clinic / "requests.toml").read_text(encoding="utf-8")
    s.set_cell("c01", 9, "E")
    s.save()
    assert [p.name for p in s.wrote] == ["roster.toml"]  # requests unchanged: not rewritten


def test_an_editor_change_keeps_an_unsaved_absence(clinic: Path) -> None:
    s = Session(load_workspace(clinic))
    s.replace(crafted(s.ws), "crafted")
    s.absent("c03", date(2027, 3, 20), reason="sick")
    people = [p.model_copy(update={"name": "Renamed"}) if p.id == "c01" else p
              for p in s.ws.staff.person]
    new = apply(s, [Staff(person=people)])
    assert new.ws.person_by_id["c01"].name == "Renamed"
    assert new.requests == s.requests and new.requests_dirty  # the leave is still unsaved
    assert new.code("c03", 5) == "-"


@pytest.mark.parametrize(("hook", "renamed"), [("ROSTERTUI_TEST_DIE_BEFORE_COMMIT", False),
                                               ("ROSTERTUI_TEST_DIE_AFTER_COMMIT", True)])
def test_an_editor_change_of_two_files_is_all_or_nothing_when_killed(
        clinic: Path, hook: str, renamed: bool) -> None:
    """apply() writes staff.toml and unit.toml in one transaction: a kill before its
    commit keeps both old files, a kill after it is finished by the next load."""
    code = (
        "import sys\n"
        "from rostertui.core.io.load import load_workspace\n"
        "from rostertui.core.models.staff import Staff\n"
        "from rostertui.core.edit.files import apply\n"
        "from rostertui.core.edit.session import Session\n"
        f"s = Session(load_workspace({str(clinic)!r}))\n"
        "people = [p.model_copy(update={'name': 'Renamed'}) if p.id == 'c01' else p\n"
        "          for p in s.ws.staff.person]\n"
        f"unit = open({str(clinic / 'unit.toml')!r}, encoding='utf-8').read()\n"
        "apply(s, [Staff(person=people)], {'unit.toml': unit + '\\n# edited\\n'})\n"
    )
    env = {**os.environ, hook: "1", "PYTHONPATH": str(REPO)}
    done = subprocess.run([sys.executable, "-c", code], env=env, cwd=REPO, timeout=120)
    assert done.returncode == -signal.SIGKILL
    ws = load_workspace(clinic)
    assert (ws.person_by_id["c01"].name == "Renamed") is renamed
    assert ("# edited" in (clinic / "unit.toml").read_text(encoding="utf-8")) is renamed
