"""Roster statistics (rostertui.core.stats) on hand-made workspaces: exact numbers,
group summaries, the JSON shape, and agreement with the checker's balance metrics."""

from __future__ import annotations

import json
import subprocess
import sys
from collections.abc import Callable
from datetime import date
from fractions import Fraction
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from rostertui.core.check.balance import metric_value
from rostertui.core.check.grid import Grid
from rostertui.core.io.load import load_workspace
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.stats import EVERYONE, RosterStats, roster_stats
from tests.core.check.helpers import SHIFTS, write_ws

# E is paid 7.5 h (nominal 8 h); D and L are 8 h; N (22:00-07:00) is a night by the
# default flag (7 h inside 23:00-06:00); X (20:00-01:00, 2 h inside) is not; Y
# (21:00-03:00, 4 h inside) is.
STATS_SHIFTS = SHIFTS.replace('end = "15:00"', 'end = "15:00"\npaid_hours = 7.5') + """
[[shift]]
code = "X"
name = "Evening"
start = "20:00"
end = "01:00"

[[shift]]
code = "Y"
name = "Short night"
start = "21:00"
end = "03:00"
"""

Build = Callable[..., Workspace]
Stats = Callable[..., RosterStats]


@pytest.fixture
def make_ws(tmp_path: Path) -> Build:
    """Build and load a workspace (see `tests.core.check.helpers.write_ws`)."""
    counter = iter(range(1_000_000))

    def build(**kwargs: object) -> Workspace:
        kwargs.setdefault("shifts", STATS_SHIFTS)
        folder = write_ws(tmp_path / f"ws{next(counter)}", **kwargs)  # type: ignore[arg-type]
        return load_workspace(folder)

    return build


@pytest.fixture
def stats(make_ws: Build) -> Stats:
    def run(**kwargs: object) -> RosterStats:
        return roster_stats(make_ws(**kwargs))

    return run


# -- hours -------------------------------------------------------------------------------
def test_hours_are_paid_hours_plus_leave_credit_exactly(stats: Stats) -> None:
    # 2027-03-01 is a Monday. Leave 3-4 Mar credits 7.6 h a day; 4 Mar-ahead leave outside
    # the period (8 Mar) credits nothing.
    requests = """
[[leave]]
person = "a"
from = 2027-03-03
to = 2027-03-04
credit_hours = 7.6
[[leave]]
person = "a"
from = 2027-03-08
credit_hours = 8
"""
    rules = '[[rule]]\nid = "band"\nkind = "hours"\nmin = 30\nmax = 50\ntarget = 40\nweight = 1\n'
    s = stats(rows={"a": "E E - - D L -", "b": "- - - - - - -"}, requests=requests, rules=rules)
    a = s.person("a")
    assert a.paid_hours == Fraction(15) + 16  # 2 x 7.5 (paid_hours, not the 8 h clock) + D + L
    assert a.leave_hours == Fraction(76, 5)  # 2 x 7.6, exact (not 15.1999...)
    assert a.hours == Fraction(31) + Fraction(76, 5)
    assert (a.hours_rule, a.hours_min, a.hours_max, a.hours_target) == ("band", 30, 50, 40)
    assert a.hours_deviation == Fraction(231, 5) - 40  # 46.2 - 40 = 6.2, not rounded
    assert s.person("b").hours == 0 and s.person("b").hours_deviation == -40


def test_hours_bounds_come_from_the_first_rules_that_give_them(stats: Stats) -> None:
    rules = """
[[rule]]
id = "night-team"
kind = "hours"
groups = ["nights"]
max = 20
[[rule]]
id = "everyone"
kind = "hours"
min = 10
max = 30
[[rule]]
id = "later"
kind = "hours"
target = 99
weight = 1
"""
    s = stats(rows={"a": "D D", "b": "D -", "c": "- -"}, rules=rules,
              groups={"a": ["nights"]})
    a, b = s.person("a"), s.person("b")
    assert (a.hours_rule, a.hours_min, a.hours_max, a.hours_target) == (
        "night-team", 10, 20, 99)  # max from night-team, min from everyone, target later
    assert a.hours_deviation == 16 - 99
    assert (b.hours_rule, b.hours_min, b.hours_max, b.hours_target) == ("everyone", 10, 30, 99)
    assert b.hours_deviation == 8 - 99


def test_no_hours_rule_means_no_bounds_and_no_deviation(stats: Stats) -> None:
    p = stats(rows={"a": "D"}).person("a")
    assert (p.hours_rule, p.hours_min, p.hours_max, p.hours_target) == (None, None, None, None)
    assert p.hours_deviation is None and p.hours == 8


# -- shifts and nights -------------------------------------------------------------------
def test_shift_counts_and_nights_by_the_default_night_flag(stats: Stats) -> None:
    p = stats(rows={"a": "N X Y - E E L"}).person("a")
    assert p.shifts == 6
    assert p.by_shift == {"E": 2, "D": 0, "L": 1, "N": 1, "X": 1, "Y": 1}
    assert list(p.by_shift) == ["E", "D", "L", "N", "X", "Y"]  # shifts.toml order
    assert p.nights == 2  # N and Y; X has only 2 h between 23:00 and 06:00


def test_an_explicit_night_flag_wins(stats: Stats) -> None:
    shifts = STATS_SHIFTS.replace('code = "X"\nname = "Evening"',
                                  'code = "X"\nname = "Evening"\nnight = true')
    shifts = shifts.replace('code = "N"\nname = "Night"',
                            'code = "N"\nname = "Night"\nnight = false')
    p = stats(rows={"a": "N X Y"}, shifts=shifts).person("a")
    assert p.nights == 2  # X and Y, not N


# -- weekends and holidays ---------------------------------------------------------------
def test_a_holiday_joins_the_weekend_and_a_lone_one_is_a_weekend(stats: Stats) -> None:
    # 2027-03-01 Mon .. 14 Sun. Fri 5 Mar is a holiday joined to Sat-Sun 6-7; Wed 10 Mar
    # is a lone holiday (a one-day weekend); 13-14 is a plain weekend: 3 weekends.
    unit = "holidays = [2027-03-05, 2027-03-10]"
    s = stats(rows={
        "a": "- - - - E - - - - - - - - -",  # only the holiday Friday
        "b": "- - - - E E E - - D - - - L",  # the whole long weekend, the lone holiday, Sun
        "c": "D D D D - - - D D - D D - -",  # weekdays only
    }, unit_extra=unit)
    assert (s.weekends_in_period, s.holidays_in_period) == (3, 2)
    a, b, c = s.person("a"), s.person("b"), s.person("c")
    assert (a.weekend_days, a.weekends, a.holidays) == (1, 1, 1)
    assert (b.weekend_days, b.weekends, b.holidays) == (5, 3, 2)
    assert (c.weekend_days, c.weekends, c.holidays) == (0, 0, 0)


def test_a_weekend_cut_by_the_period_edge_still_counts(stats: Stats) -> None:
    # 2027-03-07 is a Sunday: the period opens on the tail of a weekend.
    p = stats(rows={"a": "D - - - - - -"}, start="2027-03-07").person("a")
    assert (p.weekend_days, p.weekends) == (1, 1)


# -- requests ----------------------------------------------------------------------------
REQUESTS = """
[[request]]
person = "a"
date = 2027-03-01
want = "off"
[[request]]
person = "a"
date = 2027-03-02
want = "off"
[[request]]
person = "a"
date = 2027-03-03
want = "E"
[[request]]
person = "a"
date = 2027-03-04
want = "E"
[[request]]
person = "a"
date = 2027-03-05
avoid = "N"
[[request]]
person = "a"
date = 2027-03-06
avoid = "N"
[[request]]
person = "a"
date = 2027-03-07
avoid = "N"
[[request]]
person = "a"
date = 2027-04-01
want = "off"
[[request]]
person = "b"
date = 2027-03-01
want = "L"
"""


def test_requests_granted_and_denied_in_all_three_forms(make_ws: Build) -> None:
    ws = make_ws(rows={"a": "- D E L D N -", "b": "L - - - - - -"}, requests=REQUESTS)
    assert any("2027-04-01" in str(w) for w in ws.warnings)  # outside the period: ignored
    s = roster_stats(ws)
    a = s.person("a")
    # off: 1 Mar granted, 2 Mar denied (D); want E: 3 Mar granted, 4 Mar denied (L);
    # avoid N: 5 Mar granted (D), 6 Mar denied (N), 7 Mar granted (off)
    assert (a.requests_granted, a.requests_denied, a.requests_asked) == (4, 3, 7)
    b = s.person("b")
    assert (b.requests_granted, b.requests_denied) == (1, 0)


# -- longest stretch ---------------------------------------------------------------------
def test_longest_stretch_runs_on_into_history(stats: Stats) -> None:
    s = stats(
        rows={"a": "E E - D D D -", "b": "- D D - - - -", "c": "D - D D D - -",
              "d": "- - - - - - -"},
        history={"a": "- N N N", "b": "D D D D D D", "d": "D D D D D"},
    )
    assert s.person("a").longest_stretch == 5  # N N N (history) + E E
    assert s.person("b").longest_stretch == 2  # history's 6 days end before a day off
    assert s.person("c").longest_stretch == 3  # no history row: the period's own days
    assert s.person("d").longest_stretch == 0  # a stretch wholly in history is not counted


def test_longest_stretch_is_open_at_the_period_end(stats: Stats) -> None:
    assert stats(rows={"a": "- - D D D D"}).person("a").longest_stretch == 4


# -- groups ------------------------------------------------------------------------------
def test_groups_mean_and_spread(stats: Stats) -> None:
    rules = """
[[rule]]
id = "t"
kind = "hours"
people = ["a"]
target = 20
weight = 1
[[rule]]
id = "band"
kind = "hours"
people = ["b"]
min = 10
max = 20
[[rule]]
id = "floor"
kind = "hours"
people = ["c"]
min = 5
"""
    # 2027-03-01 Mon; weekends 6-7 and 13-14 Mar.
    s = stats(
        rows={
            "a": "N N D - - D D - - - - - - -",  # 2 nights, 1 weekend, 9+9+8x3 h: +22 vs 20
            "b": "- - - - - - - - - - - - D -",  # 0 nights, 1 weekend, 8 h: -7 vs midpoint 15
            "c": "N N N N - - - - - - - - - -",  # 4 nights, 0 weekends, lone min: no deviation
        },
        rules=rules, groups={"a": ["ward", "rn"], "b": ["rn"], "c": ["ward"]},
    )
    assert [(g.group, g.everyone) for g in s.groups] == [
        ("ward", False), ("rn", False), (EVERYONE, True)]  # first appearance, then everyone
    ward, rn, everyone = s.group("ward"), s.group("rn"), s.everyone
    assert ward.members == ("a", "c") and rn.members == ("a", "b") and everyone.people == 3
    assert (ward.nights.mean, ward.nights.spread) == (3, 2)
    assert (ward.weekends.mean, ward.weekends.spread) == (Fraction(1, 2), 1)
    assert (ward.hours_deviation.count, ward.hours_deviation.mean) == (1, 22)  # c left out
    assert ward.hours_deviation.spread == 0
    assert (rn.nights.mean, rn.nights.spread) == (1, 2)
    assert (rn.weekends.mean, rn.weekends.spread) == (1, 0)
    assert (rn.hours_deviation.count, rn.hours_deviation.mean) == (2, Fraction(15, 2))
    assert rn.hours_deviation.spread == 29
    assert (everyone.nights.mean, everyone.nights.spread) == (2, 4)
    assert (everyone.weekends.mean, everyone.weekends.spread) == (Fraction(2, 3), 1)
    assert everyone.hours_deviation.count == 2


def test_a_group_named_everyone_stays_apart_from_the_everyone_entry(stats: Stats) -> None:
    s = stats(rows={"a": "N", "b": "-"}, groups={"a": ["everyone"]})
    assert [(g.group, g.everyone, g.people) for g in s.groups] == [
        ("everyone", False, 1), ("everyone", True, 2)]
    assert s.group(EVERYONE).people == 1 and s.everyone.people == 2


def test_a_group_with_nobody_measured_has_no_mean(stats: Stats) -> None:
    g = stats(rows={"a": "D"}, groups={"a": ["g"]}).group("g")
    assert g.hours_deviation.count == 0
    assert g.hours_deviation.mean is None and g.hours_deviation.spread is None
    assert g.to_json()["hours_deviation"] == {
        "count": 0, "mean": None, "spread": None, "min": None, "max": None}


# -- no roster, explicit roster ----------------------------------------------------------
def test_without_a_roster_everything_is_zero(tmp_path: Path) -> None:
    folder = write_ws(
        tmp_path / "ws", rows={"a": "D D", "b": "N N"}, history={"a": "D D D"},
        groups={"a": ["g"]}, shifts=STATS_SHIFTS,
        requests='[[leave]]\nperson = "a"\nfrom = 2027-03-01\ncredit_hours = 8\n'
                 '[[request]]\nperson = "a"\ndate = 2027-03-02\nwant = "off"\n',
    )
    (folder / "roster.toml").unlink()
    ws = load_workspace(folder)
    assert ws.roster is None
    s = roster_stats(ws)
    assert not s.has_roster
    for p in s.people:
        assert (p.hours, p.leave_hours, p.shifts, p.nights, p.weekends, p.weekend_days,
                p.holidays, p.requests_asked, p.longest_stretch) == (0, 0, 0, 0, 0, 0, 0, 0, 0)
        assert set(p.by_shift.values()) == {0}
    assert [g.group for g in s.groups] == ["g", EVERYONE]
    assert s.everyone.nights.mean == 0


def test_an_explicit_roster_replaces_the_workspace_roster(make_ws: Build) -> None:
    ws = make_ws(rows={"a": "D D D"})
    other = Roster(start=date(2027, 3, 1), days=3, rows={"a": ["N", "-", "N"]})
    s = roster_stats(ws, other)
    assert (s.person("a").nights, s.person("a").shifts, s.has_roster) == (2, 2, True)
    assert roster_stats(ws).person("a").by_shift["D"] == 3


# -- JSON --------------------------------------------------------------------------------
PERSON_KEYS = {
    "person", "name", "groups", "hours", "paid_hours", "leave_hours", "hours_rule",
    "hours_min", "hours_max", "hours_target", "hours_deviation", "shifts", "by_shift",
    "nights", "weekend_days", "weekends", "holidays", "requests_asked", "requests_granted",
    "requests_denied", "longest_stretch",
}
SUMMARY_KEYS = {"count", "mean", "spread", "min", "max"}


def test_json_shape(stats: Stats) -> None:
    rules = '[[rule]]\nid = "t"\nkind = "hours"\ntarget = 10\nweight = 1\n'
    s = stats(rows={"a": "E N -", "b": "- - D"}, groups={"a": ["g"]}, rules=rules)
    data = json.loads(json.dumps(s.to_json()))  # plain JSON types only
    assert set(data) == {"people", "groups"}
    assert [p["person"] for p in data["people"]] == ["a", "b"]
    a = data["people"][0]
    assert set(a) == PERSON_KEYS
    assert a["hours"] == 16.5 and a["hours_deviation"] == 6.5 and a["hours_target"] == 10.0
    assert a["hours_min"] is None and a["groups"] == ["g"]
    assert a["by_shift"] == {"E": 1, "D": 0, "L": 0, "N": 1, "X": 0, "Y": 0}
    assert isinstance(a["shifts"], int) and isinstance(a["hours"], float)
    assert [(g["group"], g["everyone"]) for g in data["groups"]] == [
        ("g", False), ("everyone", True)]
    everyone = data["groups"][1]
    assert set(everyone) == {
        "group", "everyone", "people", "members", "nights", "weekends", "hours_deviation"}
    assert everyone["members"] == ["a", "b"] and everyone["people"] == 2
    for key in ("nights", "weekends", "hours_deviation"):
        assert set(everyone[key]) == SUMMARY_KEYS
    assert everyone["nights"] == {"count": 2, "mean": 0.5, "spread": 1, "min": 0, "max": 1}
    assert everyone["hours_deviation"] == {
        "count": 2, "mean": 2.25, "spread": 8.5, "min": -2.0, "max": 6.5}


def test_good_fixture(good_ws: Path) -> None:
    """tests/fixtures/good worked by hand: a 7.5 h E, leave credit 7.5, holiday Friday
    26 Mar joined to the weekend, a night stretch through history."""
    s = roster_stats(load_workspace(good_ws))
    t02, t03 = s.person("t02"), s.person("t03")
    assert (t02.hours, t02.leave_hours, t02.hours_deviation) == (
        Fraction(91, 2), 15, Fraction(19, 2))
    assert (t02.weekend_days, t02.weekends, t02.holidays) == (3, 1, 1)
    assert (t03.nights, t03.longest_stretch, t03.requests_denied) == (4, 4, 1)
    assert s.person("t01").requests_granted == 1


# -- agreement with the checker ----------------------------------------------------------
DAYS = 14
PEOPLE = ("a", "b", "c", "d")


@pytest.fixture(scope="module")
def random_ws(tmp_path_factory: pytest.TempPathFactory) -> Workspace:
    folder = write_ws(
        tmp_path_factory.mktemp("stats") / "ws",
        rows={p: " ".join("-" * DAYS) for p in PEOPLE}, shifts=STATS_SHIFTS,
        start="2027-03-22", timezone="Europe/Lisbon", unit_extra="holidays = [2027-03-26]",
        requests='[[leave]]\nperson = "b"\nfrom = 2027-03-24\nto = 2027-03-25\n'
                 'credit_hours = 7.6\n',
        history={"a": "N N E E"},
    )
    return load_workspace(folder)


codes = st.sampled_from(["E", "D", "L", "N", "X", "Y", "-"])


@settings(
    max_examples=80, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture]
)
@given(st.lists(st.lists(codes, min_size=DAYS, max_size=DAYS), min_size=4, max_size=4))
def test_agrees_with_the_balance_metrics(random_ws: Workspace, cells: list[list[str]]) -> None:
    roster = Roster(start=date(2027, 3, 22), days=DAYS, rows=dict(zip(PEOPLE, cells, strict=True)))
    s = roster_stats(random_ws, roster)
    grid = Grid(random_ws, roster)
    for p in s.people:
        assert p.nights == metric_value(grid, "nights", p.person)
        assert p.weekends == metric_value(grid, "weekends", p.person)
        assert p.hours == metric_value(grid, "hours", p.person)
        assert p.shifts == metric_value(grid, "shifts", p.person)
        for code, k in p.by_shift.items():
            assert k == metric_value(grid, f"shift:{code}", p.person)
        assert p.longest_stretch <= DAYS + len(grid.hist[p.person])
    nights = [p.nights for p in s.people]
    assert s.everyone.nights.spread == max(nights) - min(nights)


def test_the_statistics_stay_pure() -> None:
    """Importing the statistics loads neither the UI, the solver library nor the CLI."""
    code = (
        "import sys, rostertui.core.stats;"
        "print(sorted(m for m in sys.modules if m.split('.')[0] in ('textual', 'ortools')"
        " or m.startswith('rostertui.cli')))"
    )
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          check=True, cwd=Path(__file__).resolve().parents[2])
    assert done.stdout.strip() == "[]"
