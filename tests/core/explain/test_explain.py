"""explain on hand-built workspaces whose conflict is known."""

from __future__ import annotations

import threading
from datetime import date
from pathlib import Path

import pytest

from rostertui.core.explain.conflict import _infeasible, find_conflict
from rostertui.core.explain.precheck import prechecks
from rostertui.core.explain.run import explain
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.items import HardItem
from rostertui.core.solver.model import build_model
from tests.core.check.helpers import write_ws

D = [date(2027, 3, 1 + i) for i in range(7)]
REST = ('[[rule]]\nid = "daily-rest"\nkind = "min-rest"\nhours = 11\n'
        'source = "Directive 2003/88/EC, Art. 3"\n')
RN = {"a": ["rn"], "b": ["rn"], "c": ["rn"], "d": []}
OFF4 = "- - - -"


def ws_of(tmp_path: Path, **kwargs: object) -> Workspace:
    rows = kwargs.pop("rows", {"a": OFF4, "b": OFF4, "c": OFF4, "d": OFF4})
    return load_workspace(write_ws(tmp_path / "ws", rows=rows, skills=RN,
                                   **kwargs))  # type: ignore[arg-type]


def minimal(ws: Workspace, items: list[HardItem]) -> bool:
    """Every item is needed: without any one of them a roster exists."""
    built = build_model(ws, explain=True)
    assert built.items is not None
    for s in items:  # switches are made in the same order: same items, same keys
        built.items.switch(s)
    assert _infeasible(built.model, built.items, items, 10, 2) is True
    return all(_infeasible(built.model, built.items, [k for k in items if k != it], 10, 2)
               is False for it in items)


def test_night_cover_beyond_the_people_free(tmp_path: Path) -> None:
    """Two rn on the night of 3 Mar; of the three rn, a and b are on leave."""
    ws = ws_of(tmp_path, cover='[[cover]]\nshift = "N"\nskill = "rn"\nmin = 2\n'
                               'dates = [2027-03-03]\n',
               requests='[[leave]]\nperson = "a"\nfrom = 2027-03-02\nto = 2027-03-04\n'
                        '[[leave]]\nperson = "b"\nfrom = 2027-03-03\nreason = "course"\n')
    found = find_conflict(ws, 20)
    assert found.status == "infeasible" and found.minimal
    kinds = sorted((it.kind, it.person or "", it.dates[:1]) for it in found.items)
    assert kinds == [("cover", "", (D[2],)), ("leave", "a", (D[1],)), ("leave", "b", (D[2],))]
    assert minimal(ws, found.items)
    pre = prechecks(ws)
    assert len(pre) == 1 and pre[0].dates == (D[2],)
    assert "only 1 can work it: c" in pre[0].message
    assert "a and b are on leave" in pre[0].message
    result = explain(ws, 20)
    assert not result.feasible
    conflict = next(r for r in result.reasons if r.message.startswith("No roster"))
    assert "Night (N) cover on Wed 3 Mar needs at least 2 people with skill rn" in conflict.message
    assert "a is on leave Tue 2 Mar to Thu 4 Mar" in conflict.message
    assert "b is on leave Wed 3 Mar (course)" in conflict.message
    assert set(conflict.people) >= {"a", "b"} and D[2] in conflict.dates
    gap = [r for r in result.reasons if r.message.startswith("At best")]
    assert [(r.dates, "1 short" in r.message) for r in gap] == [((D[2],), True)]


def test_the_third_would_break_daily_rest_after_a_locked_late(tmp_path: Path) -> None:
    """E cover (07:00) on 3 Mar needs an rn: of the three, a and b are on leave, and c's
    locked late shift on 2 Mar ends at 22:00, 9 h before."""
    ws = ws_of(tmp_path, rows={"a": OFF4, "b": OFF4, "c": "- L - -", "d": OFF4},
               rules=REST,
               cover='[[cover]]\nshift = "E"\nskill = "rn"\nmin = 1\ndates = [2027-03-03]\n',
               requests='[[leave]]\nperson = "a"\nfrom = 2027-03-03\n'
                        '[[leave]]\nperson = "b"\nfrom = 2027-03-03\n',
               locks='[[lock]]\nperson = "c"\ndates = [2027-03-02]\n')
    found = find_conflict(ws, 20)
    got = sorted((it.kind, it.rule or "", it.person or "") for it in found.items)
    assert got == [("cover", "cover", ""), ("leave", "leave", "a"), ("leave", "leave", "b"),
                   ("lock", "lock", "c"), ("rule", "daily-rest", "c")]
    assert found.minimal and minimal(ws, found.items)
    reason = next(r for r in explain(ws, 20).reasons if r.message.startswith("No roster"))
    assert ("c must keep daily-rest (at least 11 h rest between shifts; "
            "Directive 2003/88/EC, Art. 3)") in reason.message
    assert "c is locked to Late (L) on Tue 2 Mar" in reason.message
    assert set(reason.people) == {"a", "b", "c"}


def test_a_lock_against_daily_rest_alone(tmp_path: Path) -> None:
    ws = ws_of(tmp_path, rows={"a": "L E - -", "b": OFF4, "c": OFF4, "d": OFF4},
               rules=REST, locks='[[lock]]\nperson = "a"\ndates = [2027-03-01, 2027-03-02]\n')
    pre = prechecks(ws)
    assert [(r.rules, r.people, r.dates) for r in pre] == [
        (("daily-rest", "lock"), ("a",), (D[0], D[1]))]
    assert "9 h 00 min rest" in pre[0].message
    found = find_conflict(ws, 20)
    assert sorted((it.kind, it.dates) for it in found.items) == [
        ("lock", (D[0],)), ("lock", (D[1],)), ("rule", ())]
    assert minimal(ws, found.items)


def test_an_hours_minimum_beyond_the_period(tmp_path: Path) -> None:
    rules = '[[rule]]\nid = "contract"\nkind = "hours"\nmin = 40\npeople = ["d"]\n'
    ws = ws_of(tmp_path, rules=rules,
               requests='[[leave]]\nperson = "d"\nfrom = 2027-03-01\n')
    pre = prechecks(ws)
    assert len(pre) == 1 and pre[0].people == ("d",) and pre[0].rules == ("contract",)
    # three free days, the longest shift (N, 22:00-07:00) 9 h each
    assert "at least 40 h" in pre[0].message and "at most 27 h fit" in pre[0].message
    assert "(1 day on leave" in pre[0].message
    found = find_conflict(ws, 20)
    assert [(it.kind, it.rule, it.person) for it in found.items] == [("rule", "contract", "d")]


def test_a_feasible_workspace_says_so(tmp_path: Path) -> None:
    ws = ws_of(tmp_path, rules=REST, cover='[[cover]]\nshift = "E"\nmin = 1\n')
    result = explain(ws, 20)
    assert result.feasible and result.reasons == []
    assert result.to_json(ws) == {"feasible": True, "reasons": []}


def test_a_denied_request_is_priced_with_who_pays(tmp_path: Path) -> None:
    """One E a day for a or b; both ask 1 Mar off (a weight 3, b weight 5): the roster
    gives it to b. Granting a's costs b's request: +5 - 3 = +2."""
    requests = ('[[request]]\nperson = "a"\ndate = 2027-03-01\nwant = "off"\nweight = 3\n'
                '[[request]]\nperson = "b"\ndate = 2027-03-01\nwant = "off"\nweight = 5\n')
    shifts = '[[shift]]\ncode = "E"\nname = "Early"\nstart = "07:00"\nend = "15:00"\n'
    ws = load_workspace(write_ws(tmp_path / "ws", rows={"a": "E -", "b": "- E"},
                                 shifts=shifts, requests=requests,
                                 cover='[[cover]]\nshift = "E"\nmin = 1\nmax = 1\n'))
    result = explain(ws, 20)
    assert result.feasible
    [cost] = result.requests
    assert (cost.request.person, cost.status, cost.cost) == ("a", "granted", 2)
    assert [(v.kind, v.person) for v in cost.paid_by] == [("request", "b")]
    assert sorted((c.person, c.before, c.after) for c in cost.changed) == [
        ("a", "E", "-"), ("b", "-", "E")]  # granted by swapping 1 Mar, nothing else moves
    assert "+2" in cost.message(ws)


@pytest.mark.parametrize("seconds", [0.01])
def test_no_time_means_undecided_not_wrong(tmp_path: Path, seconds: float) -> None:
    ws = ws_of(tmp_path, rules=REST, cover='[[cover]]\nshift = "E"\nmin = 1\n')
    result = explain(ws, seconds)
    assert result.feasible or not result.decided


def test_a_days_minimums_together_beyond_the_skilled_people_free(tmp_path: Path) -> None:
    """E and L each need an rn on 3 Mar: each alone can be met by c, both cannot."""
    cover = ('[[cover]]\nshift = "E"\nskill = "rn"\nmin = 1\ndates = [2027-03-03]\n'
             '[[cover]]\nshift = "L"\nskill = "rn"\nmin = 1\ndates = [2027-03-03]\n')
    ws = ws_of(tmp_path, cover=cover,
               requests='[[leave]]\nperson = "a"\nfrom = 2027-03-03\n'
                        '[[leave]]\nperson = "b"\nfrom = 2027-03-03\n')
    pre = prechecks(ws)
    assert len(pre) == 1 and pre[0].dates == (D[2],)
    assert pre[0].message.startswith("On Wed 3 Mar the cover minimums need 2 people with "
                                     "skill rn at once (E 1, L 1), but only 1 is free that day: c")
    assert set(pre[0].people) == {"a", "b", "c"}
    found = find_conflict(ws, 20)
    assert sorted(it.kind for it in found.items) == ["cover", "cover", "leave", "leave"]
    assert minimal(ws, found.items)


def test_a_cancel_before_the_search_stops_it_unsettled(tmp_path: Path) -> None:
    ws = ws_of(tmp_path, rules=REST, cover='[[cover]]\nshift = "E"\nmin = 1\n')
    cancel = threading.Event()
    cancel.set()
    result = explain(ws, 20, cancel=cancel)
    assert result.stopped and not result.decided and not result.feasible


def test_a_cancel_while_pricing_keeps_the_verdict_and_says_stopped(tmp_path: Path) -> None:
    """The pricing step is cut short: the verdict stands, the prices are partial."""
    requests = ('[[request]]\nperson = "a"\ndate = 2027-03-01\nwant = "off"\nweight = 3\n'
                '[[request]]\nperson = "b"\ndate = 2027-03-01\nwant = "off"\nweight = 5\n')
    shifts = '[[shift]]\ncode = "E"\nname = "Early"\nstart = "07:00"\nend = "15:00"\n'
    ws = load_workspace(write_ws(tmp_path / "ws", rows={"a": "E -", "b": "- E"},
                                 shifts=shifts, requests=requests,
                                 cover='[[cover]]\nshift = "E"\nmin = 1\nmax = 1\n'))
    cancel = threading.Event()

    def progress(text: str) -> None:
        if text.startswith("pricing"):
            cancel.set()

    result = explain(ws, 20, on_progress=progress, cancel=cancel)
    assert result.feasible and result.decided and result.stopped
    assert all(c.status == "granted" for c in result.requests)  # none wrongly "impossible"
    assert not explain(ws, 20).stopped
