"""Weekends: runs of weekend days and holidays inside the period (rules.md, "Terms",
"Decisions on the fine print"); max-weekends and complete-weekends."""

from __future__ import annotations

from datetime import date

from .helpers import of_kind

RULES = (
    '[[rule]]\nid = "whole"\nkind = "complete-weekends"\nweight = 20\n\n'
    '[[rule]]\nid = "few"\nkind = "max-weekends"\ncount = 1\nweight = 9\n'
)


def test_partial_weekend_and_max_weekends(check) -> None:
    # 2027-03-01 is a Monday: weekends 6-7 Mar and 13-14 Mar
    r = check(rows={"a": "- - - - - E - - - - - - E E"}, rules=RULES)
    [part] = of_kind(r, "complete-weekends")
    assert (part.dates, part.units, part.penalty) == ((date(2027, 3, 6), date(2027, 3, 7)), 1, 20)
    assert part.message == "weekend 6 Mar-7 Mar worked in part"
    [most] = of_kind(r, "max-weekends")
    assert (most.units, most.penalty, most.message) == (1, 9, "2 weekends worked; at most 1")


def test_holiday_next_to_a_weekend_joins_it(check) -> None:
    r = check(rows={"a": "- - - - E E E"}, rules=RULES, unit_extra="holidays = [2027-03-05]")
    assert of_kind(r, "complete-weekends") == []
    r = check(rows={"a": "- - - - E - -"}, rules=RULES, unit_extra="holidays = [2027-03-05]")
    [v] = of_kind(r, "complete-weekends")
    assert v.message == "weekend 5 Mar-7 Mar worked in part"


def test_lone_weekday_holiday_is_a_one_day_weekend(check) -> None:
    r = check(rows={"a": "- - E - - E -"}, rules=RULES, unit_extra="holidays = [2027-03-03]")
    assert of_kind(r, "complete-weekends")[0].dates[0] == date(2027, 3, 6)
    [most] = of_kind(r, "max-weekends")
    assert most.message == "2 weekends worked; at most 1"


def test_weekend_cut_by_the_period_edge_still_counts(check) -> None:
    # period Sun 7 Mar .. Sat 13 Mar: two one-day weekends inside the period
    r = check(rows={"a": "E - - - - - E"}, start="2027-03-07", rules=RULES)
    assert of_kind(r, "complete-weekends") == []
    assert of_kind(r, "max-weekends")[0].units == 1


def test_unit_weekend_days(check) -> None:
    r = check(rows={"a": "- - - - E - -"}, rules=RULES, unit_extra='weekend = ["fri", "sat"]')
    assert of_kind(r, "complete-weekends")[0].dates == (date(2027, 3, 5), date(2027, 3, 6))
