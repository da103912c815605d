"""not-available: weekdays and dates combine, neither = every day (rules.md, "Kinds")."""

from __future__ import annotations

from datetime import date

from .helpers import of_kind


def test_not_available_days_and_dates_combine(check) -> None:
    rule = (
        '[[rule]]\nid = "na"\nkind = "not-available"\ndays = ["tue"]\n'
        "dates = [2027-03-04]\nweight = 3\n"
    )
    r = check(rows={"a": "E E E E -"}, rules=rule)
    assert [(v.dates, v.penalty) for v in of_kind(r, "not-available")] == [
        ((date(2027, 3, 2),), 3), ((date(2027, 3, 4),), 3)]
    assert of_kind(r, "not-available")[0].message == "E on 2 Mar, not available"


def test_not_available_with_neither_is_every_day_and_shift_filters(check) -> None:
    rule = '[[rule]]\nid = "na"\nkind = "not-available"\nshift = "N"\npeople = ["a"]\n'
    r = check(rows={"a": "N E N -", "b": "N N N N"}, rules=rule)
    assert [(v.person, v.dates[0].day) for v in of_kind(r, "not-available")] == [
        ("a", 1), ("a", 3)]
