"""forbidden-sequence: the pair (last history day, first period day) too, and a day
off as `then` (rules.md, "Kinds")."""

from __future__ import annotations

from datetime import date

from .helpers import of_kind


def test_forbidden_sequence_includes_history_pair_and_off(check) -> None:
    rule = (
        '[[rule]]\nid = "no-n-e"\nkind = "forbidden-sequence"\nfirst = "N"\n'
        'then = ["E", "D"]\n\n[[rule]]\nid = "no-l-off"\nkind = "forbidden-sequence"\n'
        'first = "L"\nthen = ["-"]\nweight = 2\n'
    )
    r = check(rows={"a": "E N D L - N"}, history={"a": "N N"}, rules=rule)
    found = [(v.rule, v.dates, v.units, v.penalty) for v in of_kind(r, "forbidden-sequence")]
    assert found == [
        ("no-n-e", (date(2027, 2, 28), date(2027, 3, 1)), 1, 0),
        ("no-n-e", (date(2027, 3, 2), date(2027, 3, 3)), 1, 0),
        ("no-l-off", (date(2027, 3, 4), date(2027, 3, 5)), 1, 2),
    ]
    assert of_kind(r, "forbidden-sequence")[0].message == "N on 28 Feb followed by E"
