"""Built-in constraints (rules.md, "Built into every workspace", "Always soft"):
leave, requires, lock, cover, requests; and the report's JSON shape."""

from __future__ import annotations

from datetime import date

from rostertui.core.check import check_locks, check_roster
from rostertui.core.models.roster import Roster

from .helpers import SHIFTS, of_kind

COVER = """
[[cover]]
shift = "E"
min = 1
ideal = 2
under_weight = 100
over_weight = 20
"""


def test_cover_below_min_and_ideal_gives_two_entries(check) -> None:
    r = check(rows={"a": "- E", "b": "- -"}, cover=COVER)
    hard, soft, short = of_kind(r, "cover")
    assert (hard.hard, hard.units, hard.penalty, hard.dates) == (True, 1, 0, (date(2027, 3, 1),))
    assert hard.message == "0 on E on 1 Mar; at least 1"
    assert (soft.hard, soft.units, soft.penalty, soft.message) == (
        False, 2, 200, "0 on E on 1 Mar; ideal 2")
    assert (short.units, short.penalty, short.message) == (1, 100, "1 on E on 2 Mar; ideal 2")
    assert r.hard_violations == 1 and not r.compliant
    assert r.by_kind == {"cover": {"units": 4, "penalty": 300}}
    assert hard.to_json() == {
        "rule": "cover", "kind": "cover", "hard": True, "person": None,
        "dates": ["2027-03-01"], "units": 1, "penalty": 0,
        "message": "0 on E on 1 Mar; at least 1", "source": None, "shift": "E", "skill": None,
    }


def test_cover_max_over_ideal_and_zero_weight_not_reported(check) -> None:
    cover = COVER + '\n[[cover]]\nshift = "L"\nmax = 1\nideal = 1\nunder_weight = 5\n'
    r = check(rows={"a": "E L", "b": "E L", "c": "E E"}, cover=cover)
    found = [(v.message, v.units, v.penalty) for v in of_kind(r, "cover")]
    assert found == [
        ("3 on E on 1 Mar; ideal 2", 1, 20),
        ("1 on E on 2 Mar; ideal 2", 1, 100),
        ("0 on L on 1 Mar; ideal 1", 1, 5),
        ("2 on L on 2 Mar; at most 1", 1, 0),  # over ideal with over_weight 0: not reported
    ]


def test_skill_cover_days_and_dates(check) -> None:
    cover = (
        '[[cover]]\nshift = "N"\nskill = "rn"\nmin = 1\ndays = ["tue"]\n\n'
        '[[cover]]\nshift = "E"\nmin = 2\ndates = [2027-03-03]\n'
    )
    r = check(rows={"a": "N N N", "b": "- E E"}, cover=cover, skills={"b": ["rn"]})
    found = [(v.message, v.skill) for v in of_kind(r, "cover")]
    assert found == [
        ("0 on N (rn) on 2 Mar; at least 1", "rn"), ("1 on E on 3 Mar; at least 2", None)
    ]


def test_leave_and_requires(check) -> None:
    shifts = SHIFTS.replace('code = "N"\n', 'code = "N"\nrequires = ["rn"]\n')
    requests = '[[leave]]\nperson = "a"\nfrom = 2027-03-02\nto = 2027-03-03\n'
    r = check(rows={"a": "N N - E", "b": "N - - -"}, shifts=shifts, requests=requests,
              skills={"b": ["rn"]})
    found = [(v.kind, v.person, v.dates[0].day, v.message) for v in r.violations]
    assert found == [
        ("requires", "a", 1, "N on 1 Mar requires rn"),
        ("leave", "a", 2, "N on 2 Mar, a leave day"),
        ("requires", "a", 2, "N on 2 Mar requires rn"),
    ]
    assert all(v.hard and v.rule == v.kind and v.source is None for v in r.violations)
    assert "shift" not in r.violations[0].to_json()


def test_requests(check) -> None:
    requests = (
        '[[request]]\nperson = "a"\ndate = 2027-03-01\nwant = "off"\nweight = 3\n\n'
        '[[request]]\nperson = "a"\ndate = 2027-03-02\nwant = "L"\n\n'
        '[[request]]\nperson = "a"\ndate = 2027-03-03\navoid = "E"\nweight = 2\n\n'
        '[[request]]\nperson = "a"\ndate = 2027-03-04\nwant = "off"\nweight = 9\n'
    )
    r = check(rows={"a": "E - E -"}, requests=requests)
    found = [(v.rule, v.units, v.penalty, v.message) for v in r.violations]
    assert found == [
        ("request", 1, 3, "asked for the day off on 1 Mar, has E"),
        ("request", 1, 1, "asked for L on 2 Mar, has -"),
        ("request", 1, 2, "asked not to work E on 3 Mar, has E"),
    ]
    assert r.compliant and r.penalty == 6


def test_person_without_a_row_is_off_every_day(make_ws) -> None:
    ws = make_ws(rows={"a": "E E"}, people=["a", "b"], cover=COVER)
    result = check_roster(ws, Roster(start=date(2027, 3, 1), days=2, rows={}))
    assert [v.units for v in result.violations if v.hard] == [1, 1]
    assert check_roster(ws).penalty == 2 * 100


def test_locks_never_break_in_a_single_roster_but_check_locks_compares(make_ws) -> None:
    locks = '[[lock]]\nperson = "a"\ndates = [2027-03-01, 2027-03-02]\n'
    ws = make_ws(rows={"a": "E L -"}, locks=locks)
    assert of_kind(check_roster(ws), "lock") == []
    before = ws.roster
    assert before is not None
    after = Roster(start=before.start, days=3, rows={"a": ["E", "-", "-"]})
    [v] = check_locks(ws, before, after)
    assert (v.rule, v.kind, v.hard, v.person, v.dates) == (
        "lock", "lock", True, "a", (date(2027, 3, 2),))
    assert v.message == "locked L on 2 Mar changed to -"
    assert check_locks(ws, before, before) == []


def test_result_json_shape(check) -> None:
    rule = '[[rule]]\nid = "r"\nkind = "max-shifts"\ncount = 0\nweight = 2\nsource = "src"\n'
    r = check(rows={"a": "E -"}, rules=rule)
    out = r.to_json()
    assert list(out) == ["compliant", "hard_violations", "penalty", "by_kind", "violations"]
    assert out["violations"] == [{
        "rule": "r", "kind": "max-shifts", "hard": False, "person": "a", "dates": [],
        "units": 1, "penalty": 2, "message": "1 shifts; at most 0", "source": "src",
    }]
