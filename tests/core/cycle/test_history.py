"""history.toml of the next period: rows from history + roster, hours_before exact where
the days are known and estimated (said so) where they are not (cycle/history.py)."""

from __future__ import annotations

from pathlib import Path

import pytest

from rostertui.core.cycle.history import history_rows, hours_before, round_up
from rostertui.core.io.load import load_workspace
from tests.core.check.helpers import write_ws

# E is 8 h (07:00-15:00) in the helpers' shifts; a 2-week window over 1-week periods
AVG = '[[rule]]\nid = "avg"\nkind = "max-average-weekly-hours"\nhours = 40\nweeks = 2\n'


def ws_of(tmp_path: Path, **kw: object):
    return load_workspace(write_ws(tmp_path / "ws", **kw))  # type: ignore[arg-type]


def test_rows_are_the_last_days_of_history_then_roster(tmp_path: Path) -> None:
    ws = ws_of(tmp_path, rows={"a": "E L - N", "b": "- - - -"}, history={"a": "N N"})
    assert ws.roster is not None
    assert history_rows(ws, ws.roster, 3) == {"a": ["L", "-", "N"], "b": ["-", "-", "-"]}
    # asked for more than is known: what is known (b has no history)
    assert history_rows(ws, ws.roster, 10) == {"a": ["N", "N", "E", "L", "-", "N"],
                                               "b": ["-", "-", "-", "-"]}
    assert history_rows(ws, ws.roster, 0) == {}


def test_hours_before_exact_from_the_old_roster_with_leave_credit(tmp_path: Path) -> None:
    # old period 7 days, next 7 days, window 14 days: the 7 old days before the new start.
    # a: 3 x E = 24 h + 2 leave days x 7.5 h credit = 39 h (rules.md counts credit as hours)
    ws = ws_of(tmp_path, rows={"a": "E E E - - - -"}, rules=AVG,
               requests='[[leave]]\nperson = "a"\nfrom = 2027-03-04\nto = 2027-03-05\n'
                        'credit_hours = 7.5\n')
    assert ws.roster is not None
    [h] = hours_before(ws, ws.roster, 7).values()
    assert (h.person, h.hours, h.basis, h.unknown_days) == ("a", 39.0, "exact", 0)


def test_hours_before_takes_history_rows_when_the_window_reaches_into_them(tmp_path) -> None:
    # next period 4 days: window 14 days = 10 days before the new start = 7 old + 3 history
    ws = ws_of(tmp_path, rows={"a": "E - - - - - E"}, rules=AVG, history={"a": "E E E E E"})
    assert ws.roster is not None
    [h] = hours_before(ws, ws.roster, 4).values()
    assert (h.hours, h.basis) == (16 + 24, "exact")


def test_unknown_days_take_their_share_of_the_old_hours_before(tmp_path: Path) -> None:
    # old window (14 days to the old end) = 7 days before the old start, given as 35 h, of
    # which the 2 history rows show 8 h: 27 h over the 5 unknown days. The new window
    # (next 4 days) reaches 3 days before the old start: the 2 history days (8 h) and 1
    # unknown day = 1/5 x 27 = 5.4 h; plus 16 h in the old period.
    ws = ws_of(tmp_path, rows={"a": "E - - - - - E"}, rules=AVG, history={"a": "E -"},
               hours_before={"a": 35})
    assert ws.roster is not None
    [h] = hours_before(ws, ws.roster, 4).values()
    assert (h.hours, h.basis, h.unknown_days) == (16 + 8 + 5.4, "share", 1)


def test_with_nothing_known_the_unknown_days_count_at_the_limit(tmp_path: Path) -> None:
    # 3 unknown days at 40 h / 7 = 17.142857... h, rounded up to 1/100 h: 17.15; + 16 h
    ws = ws_of(tmp_path, rows={"a": "E - - - - - E"}, rules=AVG)
    assert ws.roster is not None
    [h] = hours_before(ws, ws.roster, 4).values()
    assert (h.hours, h.basis, h.unknown_days) == (33.15, "limit", 3)


def test_only_people_under_an_averaging_rule_whose_window_reaches_back(tmp_path) -> None:
    scoped = AVG + 'people = ["a"]\n'
    ws = ws_of(tmp_path, rows={"a": "E", "b": "E"}, rules=scoped)
    assert ws.roster is not None
    assert set(hours_before(ws, ws.roster, 1)) == {"a"}
    assert hours_before(ws, ws.roster, 14) == {}  # the window lies inside the new period


@pytest.mark.parametrize(("value", "expected"), [(0, 0.0), (7.5, 7.5)])
def test_round_up_keeps_exact_hundredths(value: float, expected: float) -> None:
    from fractions import Fraction

    assert round_up(Fraction(str(value))) == expected
    assert round_up(Fraction(1, 3)) == 0.34
