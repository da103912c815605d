"""hours (exact sums, deviation rounded up, leave credit), max-average-weekly-hours
(rules.md, "Kinds"; fine print on hours)."""

from __future__ import annotations

from .helpers import SHIFTS, of_kind

PAID = SHIFTS + (
    '\n[[shift]]\ncode = "H"\nname = "Half"\nstart = "08:00"\nend = "16:00"\npaid_hours = 7.5\n'
    '\n[[shift]]\ncode = "S"\nname = "Seven six"\nstart = "08:00"\nend = "16:00"\n'
    "paid_hours = 7.6\n"
)


def hours_rule(weight: int | None = None, **bounds: float) -> str:
    text = '[[rule]]\nid = "h"\nkind = "hours"\n'
    text += "".join(f"{k} = {v}\n" for k, v in bounds.items())
    return text + (f"weight = {weight}\n" if weight else "")


def test_hours_deviation_is_rounded_up(check) -> None:
    row = {"a": "H H H -"}  # 22.5 h
    [v] = of_kind(check(rows=row, shifts=PAID, rules=hours_rule(max=22)), "hours")
    assert (v.units, v.hard, v.message) == (1, True, "22.5 h in the period; at most 22 h")
    [v] = of_kind(check(rows=row, shifts=PAID, rules=hours_rule(min=24)), "hours")
    assert (v.units, v.message) == (2, "22.5 h in the period; at least 24 h")
    [v] = of_kind(check(rows=row, shifts=PAID, rules=hours_rule(3, target=20)), "hours")
    assert (v.units, v.penalty) == (3, 9)


def test_hours_are_summed_exactly(check) -> None:
    # ten shifts of 7.6 h are 76 h exactly (a float sum gives 75.99999999999999)
    row = {"a": "S S S S S S S S S S -"}
    r = check(rows=row, shifts=PAID, rules=hours_rule(1, min=76, max=76, target=76))
    assert of_kind(r, "hours") == []


def test_soft_hours_with_bounds_and_target_gives_two_violations(check) -> None:
    r = check(rows={"a": "E E E -"}, rules=hours_rule(5, max=20, target=16))  # 24 h
    assert [(v.units, v.penalty) for v in of_kind(r, "hours")] == [(4, 20), (8, 40)]


def test_leave_credit_counts_on_every_leave_day(check) -> None:
    requests = '[[leave]]\nperson = "a"\nfrom = 2027-03-03\nto = 2027-03-05\ncredit_hours = 7.5\n'
    r = check(rows={"a": "E E - - - -"}, requests=requests, rules=hours_rule(min=40))
    [v] = of_kind(r, "hours")
    assert (v.units, v.message) == (2, "38.5 h in the period; at least 40 h")


def test_average_weekly_hours_without_history(check) -> None:
    rule = '[[rule]]\nid = "avg"\nkind = "max-average-weekly-hours"\nhours = 48\nweeks = 17\n'
    # 14 days, 13 x 8 h = 104 h > 48 x 2 = 96 -> 8 over
    row = {"a": "E E E E E E E E E E E E E -"}
    [v] = of_kind(check(rows=row, rules=rule), "max-average-weekly-hours")
    assert (v.units, v.message) == (8, "104 h over 2 weeks = 52.00 h/week; at most 48 h/week")


def test_average_weekly_hours_rounds_up_over_fractional_weeks(check) -> None:
    rule = '[[rule]]\nid = "avg"\nkind = "max-average-weekly-hours"\nhours = 40\nweeks = 17\n'
    # 10 days: limit 40 x 10/7 = 57.14 h; 8 x 8 h = 64 h -> 6.86 over -> 7
    [v] = of_kind(check(rows={"a": "E E E E E E E E - -"}, rules=rule), "max-average-weekly-hours")
    assert v.units == 7
