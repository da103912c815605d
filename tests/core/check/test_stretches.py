"""Stretch rules: open vs closed edges, history, units charged inside the period
(rules.md "Terms": stretch; "Decisions on the fine print")."""

from __future__ import annotations

from datetime import date

from .helpers import of_kind

MAX6 = '[[rule]]\nid = "max-run"\nkind = "max-consecutive-days"\ndays = 6\nweight = 10\n'


def min_days(edges: str) -> str:
    return (
        '[[rule]]\nid = "min-run"\nkind = "min-consecutive-days"\ndays = 3\n'
        f'edges = "{edges}"\nweight = 5\n'
    )


def min_off(edges: str) -> str:
    return (
        '[[rule]]\nid = "min-off"\nkind = "min-consecutive-off"\ndays = 2\n'
        f'edges = "{edges}"\n'
    )


def test_max_run_units_are_days_over(check) -> None:
    r = check(rows={"a": "- E E E E E E E E -"}, rules=MAX6)
    [v] = of_kind(r, "max-consecutive-days")
    assert (v.units, v.penalty, v.hard) == (2, 20, False)
    assert v.dates == (date(2027, 3, 2), date(2027, 3, 9))
    assert v.message == "8 working days in a row; at most 6"


def test_open_stretches_count_as_they_are_for_maximum_rules(check) -> None:
    r = check(rows={"a": "E E E E E E E -", "b": "- E E E E E E E"}, rules=MAX6)
    assert [(v.person, v.units) for v in of_kind(r, "max-consecutive-days")] == [
        ("a", 1), ("b", 1)
    ]


def test_open_edges_exempt_edge_stretches_from_minimum(check) -> None:
    # stretches: E (open at start), E E (closed, 1 short), E (open at end)
    r = check(rows={"a": "E - E E - E"}, rules=min_days("open"))
    [v] = of_kind(r, "min-consecutive-days")
    assert (v.units, v.penalty) == (1, 5)
    assert v.dates == (date(2027, 3, 3), date(2027, 3, 4))
    assert v.message == "2 working days in a row; at least 3"


def test_closed_edges_judge_edge_stretches_too(check) -> None:
    r = check(rows={"a": "E - E E - E"}, rules=min_days("closed"))
    assert [v.units for v in of_kind(r, "min-consecutive-days")] == [2, 1, 2]
    assert of_kind(r, "min-consecutive-days")[0].penalty == 10


def test_min_off_open_and_closed(check) -> None:
    row = {"a": "- E - E E -"}
    assert [v.units for v in of_kind(check(rows=row, rules=min_off("open")), "min-consecutive-off")
            ] == [1]
    closed = of_kind(check(rows=row, rules=min_off("closed")), "min-consecutive-off")
    assert [(v.units, v.hard, v.penalty) for v in closed] == [(1, True, 0)] * 3
    assert closed[1].message == "1 days off in a row; at least 2"


def test_history_extends_a_stretch_charged_only_inside_the_period(check) -> None:
    # 7 history days + 1 period day = 8 in a row; 2 over the limit but only 1 in the period
    r = check(rows={"a": "E - - -"}, history={"a": "E E E E E E E"}, rules=MAX6)
    [v] = of_kind(r, "max-consecutive-days")
    assert v.units == 1
    assert v.dates == (date(2027, 2, 22), date(2027, 3, 1))
    assert v.message == "8 working days in a row; at most 6"


def test_history_extension_charges_full_excess_when_inside(check) -> None:
    r = check(rows={"a": "E E E E E -"}, history={"a": "- E E E"}, rules=MAX6)
    [v] = of_kind(r, "max-consecutive-days")
    assert (v.units, v.dates[0]) == (2, date(2027, 2, 26))


def test_stretch_only_in_history_is_not_judged(check) -> None:
    r = check(rows={"a": "- - E -"}, history={"a": "E E E E E E E E"}, rules=MAX6)
    assert of_kind(r, "max-consecutive-days") == []


def test_history_closes_the_start_of_an_edge_stretch(check) -> None:
    # history "- E" + period "E -": a closed stretch of 2 (1 short), dated from history
    r = check(rows={"a": "E - - E E E -"}, history={"a": "- E"}, rules=min_days("open"))
    [v] = of_kind(r, "min-consecutive-days")
    assert (v.units, v.dates) == (1, (date(2027, 2, 28), date(2027, 3, 1)))


def test_stretch_reaching_first_history_day_is_open(check) -> None:
    r = check(rows={"a": "E - - E E E -"}, history={"a": "E E"}, rules=min_days("open"))
    assert of_kind(r, "min-consecutive-days") == []
    r = check(rows={"a": "E - - E E E -"}, history={"a": "E"}, rules=min_days("closed"))
    assert [v.units for v in of_kind(r, "min-consecutive-days")] == [1]


def test_without_history_a_start_stretch_is_open(check) -> None:
    r = check(rows={"a": "- E E E -"}, rules=min_off("open"))
    assert of_kind(r, "min-consecutive-off") == []


def test_max_consecutive_shift_night_selector_with_history(check) -> None:
    rule = (
        '[[rule]]\nid = "nights"\nkind = "max-consecutive-shift"\nshift = "@night"\n'
        "count = 3\nweight = 7\n"
    )
    r = check(rows={"a": "N N - N N N N -"}, history={"a": "- N N"}, rules=rule)
    v1, v2 = of_kind(r, "max-consecutive-shift")
    assert (v1.units, v1.dates, v1.message) == (
        1, (date(2027, 2, 27), date(2027, 3, 2)), "4 N shifts in a row; at most 3"
    )
    assert (v2.units, v2.penalty) == (1, 7)
