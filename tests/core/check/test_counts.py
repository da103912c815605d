"""max/min-shifts (rules.md, "Kinds")."""

from __future__ import annotations


def test_max_and_min_shifts_with_and_without_selector(check) -> None:
    rules = (
        '[[rule]]\nid = "most"\nkind = "max-shifts"\ncount = 3\nweight = 4\n\n'
        '[[rule]]\nid = "nights"\nkind = "max-shifts"\nshift = "@night"\ncount = 1\n\n'
        '[[rule]]\nid = "least"\nkind = "min-shifts"\ncount = 6\nweight = 2\n'
    )
    r = check(rows={"a": "E N N E E -"}, rules=rules)
    most, nights, least = r.violations
    assert (most.kind, most.units, most.penalty, most.message) == (
        "max-shifts", 2, 8, "5 shifts; at most 3")
    assert (nights.units, nights.hard, nights.message) == (1, True, "2 N shifts; at most 1")
    assert (least.kind, least.units, least.penalty, least.message) == (
        "min-shifts", 1, 2, "5 shifts; at least 6")
    assert most.dates == ()
