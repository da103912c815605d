"""A property that needs no outside source: a 56-day roster checked whole, and the same
roster checked as two 28-day periods, the second rolled from the first by `next`.

Every violation `check` reports on the second workspace equals a violation of `check` on
the whole 56-day workspace that lies in the second half, and the other way round, for
every rule kind where the two readings agree by rules.md:

* per day or per pair of days: `min-rest` and `forbidden-sequence` (the pair across the
  boundary included: rules.md judges (last history day, first period day)),
  `not-available`, `complete-weekends` (the boundary falls on a Monday, so no weekend is
  cut by it), leave, cover and requests (carried into the new period, leave clipped);
* windows: `weekly-rest` aligned to Mondays, and to the period start when the window
  length divides the first period's (28 = 4 x 7): the windows that end in the second
  half; `rolling` windows that start in the second half;
* stretches: `min-consecutive-days`, `min-consecutive-off` (a stretch reaching the first
  history day is open, and the look-back makes it long enough anyway), and the maximum
  rules `max-consecutive-days`, `max-consecutive-shift` by their last day, whose units are
  by rules.md min(length - limit, days inside the period): a stretch across the boundary
  is charged its days in the second half only ("never charged twice");
* `max-average-weekly-hours` with `weeks` = 8: the second period's window is the whole
  56 days, so hours_before (exact, leave credit included) + the second half's hours is
  the whole's hours, compared with the same 48 x 8 limit (the message differs: it says
  how the hours split).

Exceptions, where rules.md reads the two differently on purpose:

* period-wide counts and totals: `max-shifts`, `min-shifts`, `hours`, `max-weekends`,
  `balance` count within each period (each month has its own cap or band);
* `rolling` weekly-rest windows that start in the first period and end in the second
  are judged by neither ("rolling windows start on period days");
* `max-average-weekly-hours` when the window is not the whole 56 days: the whole
  workspace, without history, averages over its own days; and for people under no such
  rule there is no hours_before at all;
* `period-start` windows when their length does not divide the first period's;
* weekends cut by the boundary (not here: it is a Monday) count in each period.
"""

from __future__ import annotations

import random
from collections import Counter
from datetime import date, timedelta
from pathlib import Path

import pytest

from rostertui.core.check import Violation, check_roster
from rostertui.core.cycle import Plan
from rostertui.core.io.load import load_workspace
from tests.core.check.helpers import write_ws

from .helpers import give_roster, roll

START = date(2027, 3, 1)  # a Monday; Lisbon's summer time begins on day 27 (28 March)
BOUNDARY = START + timedelta(days=28)
PEOPLE = ("a", "b", "c")

AGREE = """
[[rule]]
id = "rest"
kind = "min-rest"
hours = 11

[[rule]]
id = "weekly"
kind = "weekly-rest"
hours = 35

[[rule]]
id = "weekly-start"
kind = "weekly-rest"
hours = 24
align = "period-start"
weight = 2

[[rule]]
id = "weekly-rolling"
kind = "weekly-rest"
hours = 30
align = "rolling"
weight = 2

[[rule]]
id = "run"
kind = "max-consecutive-days"
days = 4
weight = 3

[[rule]]
id = "short-run"
kind = "min-consecutive-days"
days = 2
weight = 2

[[rule]]
id = "short-off"
kind = "min-consecutive-off"
days = 2
weight = 2

[[rule]]
id = "nights"
kind = "max-consecutive-shift"
shift = "N"
count = 2
weight = 5

[[rule]]
id = "no-day-after-night"
kind = "forbidden-sequence"
first = "N"
then = ["E", "D"]
weight = 4

[[rule]]
id = "whole-weekends"
kind = "complete-weekends"
weight = 3

[[rule]]
id = "no-wednesdays"
kind = "not-available"
days = ["wed"]
people = ["b"]
weight = 1
"""
AVERAGE = """
[[rule]]
id = "avg"
kind = "max-average-weekly-hours"
hours = 30
weeks = 8
weight = 1
"""
EXCEPTIONS = """
[[rule]]
id = "cap"
kind = "max-shifts"
count = 12
weight = 1

[[rule]]
id = "band"
kind = "hours"
max = 100
weight = 1

[[rule]]
id = "weekend-cap"
kind = "max-weekends"
count = 2
weight = 1
"""
COVER = '[[cover]]\nshift = "E"\nmin = 1\nideal = 2\nunder_weight = 3\n'
MAX_STRETCH = {"run", "nights"}
COMPARED = {"rest", "weekly", "weekly-start", "weekly-rolling", "run", "short-run",
            "short-off", "nights", "no-day-after-night", "whole-weekends", "no-wednesdays",
            "avg", "leave", "cover", "request"}


def requests_text(rng: random.Random) -> str:
    out = []
    for pid in PEOPLE:
        for _ in range(6):
            day = START + timedelta(days=rng.randrange(56))
            want = rng.choice(['want = "off"', 'want = "E"', 'avoid = "N"'])
            out.append(f'[[request]]\nperson = "{pid}"\ndate = {day}\n{want}\nweight = 2\n')
    # leave across the boundary (clipped in the new period), and one in each half
    first = BOUNDARY - timedelta(days=rng.randrange(1, 5))
    out.append(f'[[leave]]\nperson = "a"\nfrom = {first}\nto = {first + timedelta(days=6)}\n'
               'credit_hours = 8\n')
    for offset in (rng.randrange(0, 26), rng.randrange(30, 54)):
        day = START + timedelta(days=offset)
        out.append(f'[[leave]]\nperson = "c"\nfrom = {day}\nto = {day + timedelta(days=1)}\n'
                   'credit_hours = 7.5\n')
    return "\n".join(out)


def key(v: Violation) -> tuple:
    return (v.rule, v.kind, v.hard, v.person, v.dates, v.units, v.penalty, v.message,
            v.shift, v.skill)


def expected_in_second(v: Violation, look_back: int) -> tuple | None:
    """What the whole's violation `v` must look like in the second period, or None when
    it is not the second period's to report."""
    if v.rule not in COMPARED:
        return None
    if v.rule == "avg":
        return (v.rule, v.person, v.units, v.penalty)
    if not v.dates or v.dates[-1] < BOUNDARY:
        return None
    if v.rule == "weekly-rolling" and v.dates[0] < BOUNDARY:
        return None  # started in the first period: judged by neither (an exception)
    if v.rule in MAX_STRETCH:
        first, last = v.dates
        inside = (last - BOUNDARY).days + 1
        seen_from = max(first, BOUNDARY - timedelta(days=look_back))
        return (v.rule, v.person, (seen_from, last), min(v.units, inside))
    return key(v)


def actual(v: Violation) -> tuple:
    if v.rule == "avg":
        return (v.rule, v.person, v.units, v.penalty)
    if v.rule in MAX_STRETCH:
        return (v.rule, v.person, v.dates, v.units)
    return key(v)


def build(tmp_path: Path, seed: int, rules: str) -> tuple[Path, Plan, Path]:
    rng = random.Random(seed)
    rows = {pid: [rng.choice("--EDLN") for _ in range(56)] for pid in PEOPLE}
    common = {"rules": rules, "timezone": "Europe/Lisbon", "cover": COVER,
              "requests": requests_text(rng), "start": START.isoformat()}
    whole = write_ws(tmp_path / "whole", rows=rows, **common)  # type: ignore[arg-type]
    first = write_ws(tmp_path / "first", rows={p: r[:28] for p, r in rows.items()},
                     **common)  # type: ignore[arg-type]
    plan = roll(first, tmp_path / "second", force=True)
    give_roster(tmp_path / "second", {p: r[28:] for p, r in rows.items()})
    return whole, plan, tmp_path / "second"


SEEDS = range(12)


def compare(tmp_path: Path, seed: int, with_average: bool) -> tuple[Counter, Counter]:
    """(what check reports on the second workspace, what it reports on the whole in
    the second half), for one seeded 56-day roster."""
    rules = AGREE + EXCEPTIONS + (AVERAGE if with_average else "")
    whole, plan, second = build(tmp_path, seed, rules)
    ws2 = load_workspace(second)
    assert ws2.unit.start == BOUNDARY and ws2.history is not None
    look_back = len(ws2.history.rows["a"])
    assert look_back == (28 if with_average else 4)  # avg: 56 - 28 days; else run = 4
    if with_average:  # the window is the 56 days: known, so exact
        assert [h.basis for h in plan.hours_before.values()] == ["exact"] * 3
    found = [expected_in_second(v, look_back) for v in check_roster(load_workspace(whole))
             .violations]
    expected = Counter(f for f in found if f is not None)
    got = Counter(actual(v) for v in check_roster(ws2).violations if v.rule in COMPARED)
    return got, expected


@pytest.mark.parametrize("with_average", [True, False], ids=["avg-8-weeks", "no-average"])
@pytest.mark.parametrize("seed", SEEDS)
def test_second_period_reports_what_the_whole_reports_in_its_second_half(
    tmp_path: Path, seed: int, with_average: bool,
) -> None:
    got, expected = compare(tmp_path, seed, with_average)
    assert got == expected


def test_the_property_was_not_vacuous(tmp_path: Path) -> None:
    """Over the same seeds, every compared rule was broken somewhere in the second
    half, and so were a stretch and a pair that cross the boundary."""
    seen: Counter[str] = Counter()
    for seed in SEEDS:
        for with_average in (True, False):
            _, expected = compare(tmp_path / f"{seed}-{with_average}", seed, with_average)
            for item in expected:
                seen[item[0]] += 1
                if item[0] in MAX_STRETCH and item[2][0] < BOUNDARY:
                    seen["max stretch across the boundary"] += 1
                if item[0] in ("rest", "no-day-after-night") and item[4][0] < BOUNDARY:
                    seen["pair across the boundary"] += 1
    missing = (COMPARED | {"max stretch across the boundary", "pair across the boundary"}) \
        - set(seen)
    assert not missing, seen
