"""Properties of every report, on random rosters (hypothesis): totals add up, hard
entries cost nothing, soft entries cost units x weight, maximum stretch rules never
charge more days than the period holds."""

from __future__ import annotations

from datetime import date

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from rostertui.core.check import check_roster
from rostertui.core.models.roster import Roster

from .helpers import write_ws

RULES = """
[[rule]]
id = "daily-rest"
kind = "min-rest"
hours = 11
weight = 3
[[rule]]
id = "weekly"
kind = "weekly-rest"
hours = 35
align = "rolling"
[[rule]]
id = "max-run"
kind = "max-consecutive-days"
days = 4
weight = 7
[[rule]]
id = "min-off"
kind = "min-consecutive-off"
days = 2
edges = "closed"
weight = 2
[[rule]]
id = "nights"
kind = "max-consecutive-shift"
shift = "@night"
count = 2
[[rule]]
id = "hours"
kind = "hours"
min = 40
max = 70
target = 56
weight = 1
[[rule]]
id = "whole"
kind = "complete-weekends"
weight = 5
[[rule]]
id = "fair"
kind = "balance"
metric = "hours"
weight = 2
"""
COVER = '[[cover]]\nshift = "E"\nmin = 1\nideal = 2\nunder_weight = 10\nover_weight = 1\n'
DAYS = 14
PEOPLE = ("a", "b", "c")
WEIGHTS = {"daily-rest": 3, "max-run": 7, "min-off": 2, "hours": 1, "whole": 5, "fair": 2}


@pytest.fixture(scope="module")
def ws(tmp_path_factory):
    from rostertui.core.io.load import load_workspace

    folder = write_ws(
        tmp_path_factory.mktemp("inv") / "ws",
        rows={p: " ".join("-" * DAYS) for p in PEOPLE},
        rules=RULES, cover=COVER, history={"a": "N N E E", "b": "-"},
        timezone="Europe/Lisbon", start="2027-03-22",
    )
    return load_workspace(folder)


rows = st.lists(st.sampled_from(["E", "D", "L", "N", "-"]), min_size=DAYS, max_size=DAYS)


@settings(
    max_examples=60, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture]
)
@given(st.tuples(rows, rows, rows))
def test_report_invariants(ws, cells) -> None:
    roster = Roster(start=date(2027, 3, 22), days=DAYS, rows=dict(zip(PEOPLE, cells, strict=True)))
    result = check_roster(ws, roster)
    assert result.penalty == sum(k["penalty"] for k in result.by_kind.values())
    assert result.hard_violations == sum(1 for v in result.violations if v.hard)
    assert result.compliant == (result.hard_violations == 0)
    for v in result.violations:
        assert v.units > 0
        if v.hard:
            assert v.penalty == 0
        elif v.kind != "cover":
            assert v.penalty == v.units * WEIGHTS[v.rule]
        if v.kind == "max-consecutive-days":
            inside = (v.dates[1] - max(v.dates[0], roster.start)).days + 1
            assert v.units <= inside
