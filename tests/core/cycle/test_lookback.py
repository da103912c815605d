"""How many days of history each rule kind needs (cycle/lookback.py), and that a history
that short judges the first days as a longer one does."""

from __future__ import annotations

from datetime import date

import pytest

from rostertui.core.check import check_roster
from rostertui.core.cycle.lookback import history_days, needs, rule_need, weekend_run_before
from rostertui.core.io.load import load_workspace
from rostertui.core.models.rules import rule_adapter
from tests.core.check.helpers import write_ws

MONDAY = date(2027, 4, 12)
THURSDAY = date(2027, 4, 15)


def rule(text: dict[str, object]) -> object:
    return rule_adapter.validate_python({"id": "r", **text})


@pytest.mark.parametrize(("kind", "start", "expected"), [
    ({"kind": "min-rest", "hours": 11}, MONDAY, 2),  # 1 + ceil(13 / 24)
    ({"kind": "min-rest", "hours": 23}, MONDAY, 3),  # 1 + ceil(25 / 24)
    ({"kind": "min-rest", "hours": 46}, MONDAY, 3),
    ({"kind": "weekly-rest", "hours": 35}, MONDAY, 2),  # the window starts on the start
    ({"kind": "weekly-rest", "hours": 35}, THURSDAY, 5),  # ... on the Monday before
    ({"kind": "weekly-rest", "hours": 35, "align": "rolling"}, THURSDAY, 2),
    ({"kind": "weekly-rest", "hours": 35, "align": "period-start"}, THURSDAY, 2),
    ({"kind": "max-consecutive-days", "days": 6}, MONDAY, 6),
    ({"kind": "min-consecutive-off", "days": 2}, MONDAY, 2),
    ({"kind": "max-consecutive-shift", "shift": "N", "count": 4}, MONDAY, 4),
    ({"kind": "forbidden-sequence", "first": "N", "then": ["E"]}, MONDAY, 1),
    ({"kind": "max-average-weekly-hours", "hours": 48, "weeks": 17}, MONDAY, 119 - 28),
])
def test_days_needed_per_kind(kind: dict[str, object], start: date, expected: int) -> None:
    found = rule_need(rule(kind), start, 28)
    assert found is not None and found[0] == expected


def test_window_inside_the_period_and_counts_need_nothing() -> None:
    assert rule_need(rule({"kind": "max-average-weekly-hours", "hours": 48, "weeks": 4}),
                     MONDAY, 28) is None
    assert rule_need(rule({"kind": "hours", "max": 160}), MONDAY, 28) is None
    assert rule_need(rule({"kind": "max-shifts", "count": 20}), MONDAY, 28) is None


def test_weekend_run_before_counts_a_holiday_next_to_the_weekend() -> None:
    assert weekend_run_before(MONDAY, ["sat", "sun"], []) == 2
    assert weekend_run_before(MONDAY, ["sat", "sun"], [date(2027, 4, 9)]) == 3  # Fri
    assert weekend_run_before(THURSDAY, ["sat", "sun"], []) == 0


def test_the_longest_need_wins(tmp_path) -> None:
    rules = (
        '[[rule]]\nid = "rest"\nkind = "min-rest"\nhours = 11\n'
        '[[rule]]\nid = "run"\nkind = "max-consecutive-days"\ndays = 6\n'
    )
    ws = load_workspace(write_ws(tmp_path / "ws", rows={"a": "E"}, rules=rules))
    found = needs(ws.rules, MONDAY, 28, ["sat", "sun"], [])
    assert [(n.rule, n.days) for n in found] == [("run", 6), ("rest", 2)]
    assert history_days(found) == 6


def test_min_rest_look_back_is_needed_and_enough_for_the_worst_shift(tmp_path) -> None:
    # The longest shift (24 h) starting as late as can be (23:00): two days before the
    # start it ends 23:00 the day before, 8 h before an 07:00 start, a breach of 11 h;
    # three days before it ends 32 h before. So the 2 days of 1 + ceil((11 + 2) / 24)
    # are needed, and a third would change nothing.
    shifts = ('[[shift]]\ncode = "T"\nname = "Twenty-four"\nstart = "23:00"\nend = "23:00"\n'
              '[[shift]]\ncode = "E"\nname = "Early"\nstart = "07:00"\nend = "15:00"\n')
    rules = '[[rule]]\nid = "rest"\nkind = "min-rest"\nhours = 11\n'

    def breaches(name: str, history: str) -> int:
        folder = write_ws(tmp_path / name, rows={"a": "E"}, rules=rules, shifts=shifts,
                          history={"a": history})
        return check_roster(load_workspace(folder)).hard_violations

    assert breaches("two", "T -") == 1
    assert breaches("three", "T - -") == 0
