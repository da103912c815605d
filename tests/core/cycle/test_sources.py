"""The monthly cycle against outside sources; each test names its source.

- nidirect, "Calculating your working time" (UK average weekly working time over a
  17-week reference period, 48 h limit; Working Time Regulations 1998, reg. 4): 40 h a
  week for 17 weeks plus 12 h of overtime in each of the first 10 weeks is 800 h,
  800 / 17 = 47.06 h a week, within 48; the same figures as tests/core/check/
  test_sources.py, here reached by rolling three periods instead of typing hours_before.
- Directive 2003/88/EC (EU Working Time Directive), Art. 3: 11 consecutive hours of
  daily rest per 24-hour period, across the boundary of two roster periods.
"""

from __future__ import annotations

import tomllib
from datetime import date
from pathlib import Path

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from tests.core.check.helpers import SHIFTS, of_kind, write_ws

from .helpers import give_roster, roll

# E: 8 h (Mon-Fri), X: 12 h of overtime (Sat), O: 1 h more (Sun)
WEEK_SHIFTS = """
[[shift]]
code = "E"
name = "Day"
start = "09:00"
end = "17:00"

[[shift]]
code = "X"
name = "Overtime"
start = "08:00"
end = "20:00"

[[shift]]
code = "O"
name = "One hour"
start = "10:00"
end = "11:00"
"""
# soft, so each period can be rolled without --force: the figures are the source's
AVERAGE = (
    '[[rule]]\nid = "avg-48"\nkind = "max-average-weekly-hours"\nhours = 48\nweeks = 17\n'
    'weight = 1\nsource = "nidirect, Calculating your working time"\n'
)


def weeks(pattern: str, n: int) -> list[str]:
    return pattern.split() * n


def three_periods(tmp_path: Path, sunday: str) -> tuple[Path, Path, Path]:
    """Weeks 1-7, 8-13 and 14-17 of the example (from Monday 4 Jan 2027) as three
    workspaces, each rolled from the one before after its roster was worked."""
    over, normal = f"E E E E E X {sunday}", f"E E E E E {sunday} -"
    p1 = write_ws(tmp_path / "p1", rows={"a": weeks(over, 7)}, rules=AVERAGE,
                  shifts=WEEK_SHIFTS, start="2027-01-04")
    roll(p1, tmp_path / "p2", days=42)
    give_roster(tmp_path / "p2", {"a": weeks(over, 3) + weeks(normal, 3)})
    roll(tmp_path / "p2", tmp_path / "p3", days=28)
    give_roster(tmp_path / "p3", {"a": weeks(normal, 4)})
    return p1, tmp_path / "p2", tmp_path / "p3"


def test_nidirect_17_week_average_reproduced_across_three_rolled_periods(tmp_path) -> None:
    _p1, p2, p3 = three_periods(tmp_path, "-")
    # week 13 ends 4 Apr; the window of the second period reaches 4 weeks before the
    # first: nothing is known there, so those 28 days count at 48 / 7 h (the reading
    # for someone without hours_before) and say so
    second = tomllib.loads((p2 / "history.toml").read_text())
    assert second["hours_before"] == {"a": 7 * 52 + 28 * 48 / 7}
    assert "counted at the weekly limit" in (p2 / "history.toml").read_text()
    # the third period's window is the example's 17 weeks: the first 13 are known
    ws = load_workspace(p3)
    assert ws.unit.start == date(2027, 4, 5) and ws.history is not None
    assert ws.history.hours_before == {"a": 640.0}  # 13 x 40 + 10 x 12
    assert len(ws.history.rows["a"]) == 13 * 7
    assert of_kind(check_roster(ws), "max-average-weekly-hours") == []  # 800 / 17 = 47.06


def test_nidirect_one_more_hour_a_week_is_one_hour_over(tmp_path: Path) -> None:
    # one more hour in each of the 17 weeks: 817 h > 48 x 17 = 816 h
    _p1, _p2, p3 = three_periods(tmp_path, "O")
    ws = load_workspace(p3)
    assert ws.history is not None and ws.history.hours_before == {"a": 653.0}
    [v] = of_kind(check_roster(ws), "max-average-weekly-hours")
    assert v.units == 1
    assert v.message == (
        "817 h over 17 weeks (653 h before the period + 164 h in it) = 48.06 h/week; "
        "at most 48 h/week"
    )


DAILY_REST = (
    '[[rule]]\nid = "daily-rest"\nkind = "min-rest"\nhours = 11\n'
    'source = "Directive 2003/88/EC, Art. 3"\n'
)


def test_directive_2003_88_art3_rest_breach_across_the_boundary(tmp_path: Path) -> None:
    # a night (22:00-07:00) on the last day of the old period, an early (07:00) on the
    # first day of the new one: no rest at all between them
    old = write_ws(tmp_path / "march", rows={"a": "E - - - - - N"}, rules=DAILY_REST,
                   shifts=SHIFTS)
    roll(old, tmp_path / "next")
    new = tmp_path / "next"
    give_roster(new, {"a": "E - - - - - -"})
    [v] = of_kind(check_roster(load_workspace(new)), "min-rest")
    assert v.hard and v.source == "Directive 2003/88/EC, Art. 3"
    assert v.dates == (date(2027, 3, 7), date(2027, 3, 8))
    assert v.message == (
        "0 h 00 min rest between N (ends 07:00 on 8 Mar) and E (starts 07:00 on 8 Mar); "
        "needs 11 h"
    )
    # a late (14:00) instead: 7 h, still short; a day off first: kept
    give_roster(new, {"a": "L - - - - - -"})
    assert len(of_kind(check_roster(load_workspace(new)), "min-rest")) == 1
    give_roster(new, {"a": "- E - - - - -"})
    assert of_kind(check_roster(load_workspace(new)), "min-rest") == []
