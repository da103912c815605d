"""Swaps and absences on small hand-made rosters."""

from __future__ import annotations

import dataclasses
from datetime import date
from pathlib import Path

import pytest

from rostertui.core.check import check_roster
from rostertui.core.errors import EditError
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.absence import record_absence
from rostertui.core.repair.diff import CellDiff
from rostertui.core.repair.impact import impact
from rostertui.core.repair.swap import swap
from tests.core.check.helpers import write_ws

D = [date(2027, 3, 1 + i) for i in range(4)]
COVER = """
[[cover]]
shift = "E"
min = 1
"""


@pytest.fixture
def ws(tmp_path: Path) -> Workspace:
    folder = write_ws(tmp_path / "ws", rows={"a": "E E - N", "b": "- L E E", "c": "L - - -"},
                      cover=COVER, rules='[[rule]]\nid = "rest"\nkind = "min-rest"\nhours = 11\n',
                      locks='[[lock]]\nperson = "c"\ndates = [2027-03-01]\n')
    return load_workspace(folder)


def test_two_people_one_date_exchange_two_cells(ws: Workspace) -> None:
    roster, changed = swap(ws, ws.roster, "a", D[1], "b")
    assert changed == [CellDiff("a", D[1], "E", "L"), CellDiff("b", D[1], "L", "E")]
    assert roster.rows["a"] == ["E", "L", "-", "N"] and roster.rows["b"] == ["-", "E", "E", "E"]
    assert roster.solve is None


def test_one_person_two_dates_exchange_two_cells(ws: Workspace) -> None:
    roster, changed = swap(ws, ws.roster, "a", D[0], "a", D[3])
    assert roster.rows["a"] == ["N", "E", "-", "E"]
    assert len(changed) == 2


def test_two_people_two_dates_exchange_four_cells(ws: Workspace) -> None:
    roster, changed = swap(ws, ws.roster, "a", D[1], "b", D[2])
    assert roster.rows["a"] == ["E", "L", "E", "N"] and roster.rows["b"] == ["-", "E", "-", "E"]
    assert {(c.person, c.date) for c in changed} == {("a", D[1]), ("b", D[1]),
                                                     ("a", D[2]), ("b", D[2])}


def test_a_swap_reports_the_rest_breach_it_creates(ws: Workspace) -> None:
    # a takes b's L on day 2 and E on day 3: L (ends 22:00) then E (07:00) is 9 h rest;
    # b loses the L -> E pair it had
    roster, _ = swap(ws, ws.roster, "a", D[1], "b", D[2])
    effect = impact(check_roster(ws), check_roster(ws, roster))
    created = sorted((v.person, v.dates) for v in effect.created if v.kind == "min-rest")
    resolved = [(v.person, v.dates) for v in effect.resolved if v.kind == "min-rest"]
    assert created == [("a", (D[1], D[2]))]
    assert resolved == [("b", (D[1], D[2]))]


@pytest.mark.parametrize(("args", "words"), [
    (("a", D[0], "a", None), "with itself"),
    (("a", D[0], "c", None), "locked"),
    (("zz", D[0], "a", None), "no person 'zz'"),
    (("a", date(2027, 4, 1), "b", None), "outside the period"),
])
def test_refused_swaps_say_why(ws: Workspace, args: tuple[object, ...], words: str) -> None:
    with pytest.raises(EditError, match=words):
        swap(ws, ws.roster, *args)


def test_an_absence_becomes_leave_and_its_shifts_go_short(ws: Workspace) -> None:
    absence = record_absence(ws, "b", D[2], D[3], "sick")
    assert absence.requests.leave[-1].reason == "sick"
    assert absence.requests.leave[-1].dates() == [D[2], D[3]]
    assert absence.roster is not None and absence.roster.rows["b"] == ["-", "L", "-", "-"]
    assert absence.cleared == [CellDiff("b", D[2], "E", "-"), CellDiff("b", D[3], "E", "-")]
    after = dataclasses.replace(ws, requests=absence.requests, roster=absence.roster)
    created = impact(check_roster(ws), check_roster(after)).created
    assert sorted(v.dates for v in created if v.kind == "cover" and v.hard) == [(D[2],), (D[3],)]
    assert not [v for v in check_roster(after).violations if v.kind == "leave"]


def test_an_absence_outside_the_period_is_refused(ws: Workspace) -> None:
    with pytest.raises(EditError, match="outside the period"):
        record_absence(ws, "a", date(2027, 5, 1))
    with pytest.raises(EditError, match="before it starts"):
        record_absence(ws, "a", D[2], D[1])
