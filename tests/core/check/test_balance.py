"""balance: spread of a metric over the people in scope (rules.md, "Kinds", "Scope")."""

from __future__ import annotations

from .helpers import SHIFTS, of_kind


def balance(metric: str, scope: str = "") -> str:
    return f'[[rule]]\nid = "fair"\nkind = "balance"\nmetric = "{metric}"\nweight = 6\n{scope}'


def test_balance_units_are_max_minus_min(check) -> None:
    r = check(rows={"a": "N N E -", "b": "E - - -", "c": "N - - -"}, rules=balance("nights"))
    [v] = of_kind(r, "balance")
    assert (v.person, v.dates, v.units, v.penalty) == (None, (), 2, 12)
    assert v.message == "nights: 2 for a, 0 for b"


def test_balance_over_fewer_than_two_people_is_never_violated(check) -> None:
    rows = {"a": "E E E -", "b": "- - - -"}
    assert of_kind(check(rows=rows, rules=balance("shifts", 'people = ["a"]\n')), "balance") == []
    assert of_kind(check(rows=rows, rules=balance("shifts", "people = []\n")), "balance") == []
    assert len(of_kind(check(rows=rows, rules=balance("shifts")), "balance")) == 1


def test_balance_of_hours_rounds_the_spread_up(check) -> None:
    shifts = SHIFTS + (
        '\n[[shift]]\ncode = "H"\nname = "Half"\nstart = "08:00"\nend = "16:00"\n'
        "paid_hours = 7.5\n"
    )
    r = check(rows={"a": "H H -", "b": "E - -"}, shifts=shifts, rules=balance("hours"))
    [v] = of_kind(r, "balance")
    assert (v.units, v.message) == (7, "hours: 15 h for a, 8 h for b")


def test_balance_weekends_and_one_shift_code(check) -> None:
    rows = {"a": "- - - - - E E", "b": "L - - - - - -"}
    assert of_kind(check(rows=rows, rules=balance("weekends")), "balance")[0].units == 1
    [v] = of_kind(check(rows=rows, rules=balance("shift:E")), "balance")
    assert v.message == "shift:E: 2 for a, 0 for b"
