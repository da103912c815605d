"""Repair: fewest changes, the past untouched, locks kept; checked by hand and by brute force."""

from __future__ import annotations

import dataclasses
import itertools
import os
import random
import tempfile
from datetime import date
from pathlib import Path

from hypothesis import assume, event, given, settings
from hypothesis import strategies as st

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.models.roster import Roster
from rostertui.core.models.unit import RepairSettings
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.absence import record_absence
from rostertui.core.repair.repair import default_from, repair
from rostertui.core.solver import SolveOptions
from tests.core.check.helpers import write_ws
from tests.strategies import SETTINGS, Spec, workspaces, write

D = [date(2027, 3, 1 + i) for i in range(5)]
OPTIONS = SolveOptions(time_limit=10, workers=2)
EARLY_COVER = '[[cover]]\nshift = "E"\nmin = 1\n'


def absent(ws: Workspace, person: str, first: date, last: date) -> Workspace:
    a = record_absence(ws, person, first, last, "sick")
    return dataclasses.replace(ws, requests=a.requests, roster=a.roster)


def small(tmp_path: Path, **kwargs: object) -> Workspace:
    rows = kwargs.pop("rows", {"a": "E E E E E", "b": "- - - - -", "c": "- - - - -"})
    return load_workspace(write_ws(tmp_path / "ws", rows=rows, cover=EARLY_COVER,
                                   **kwargs))  # type: ignore[arg-type]


def test_a_two_day_absence_is_covered_by_two_changes(tmp_path: Path) -> None:
    ws = absent(small(tmp_path), "a", D[1], D[2])
    assert check_roster(ws).hard_violations == 2  # E short on both days
    result = repair(ws, D[1], OPTIONS)
    assert result.outcome.status == "optimal" and result.outcome.check is not None
    assert result.outcome.check.compliant
    assert result.outcome.changes == 2
    assert sorted(c.cell.date for c in result.changed) == [D[1], D[2]]
    assert all(c.cell.after == "E" and c.cell.person in "bc" for c in result.changed)
    for c in result.changed:
        assert [v.kind for v in c.fixes] == ["cover"] and c.fixes[0].dates == (c.cell.date,)


def test_days_before_from_are_never_changed_and_their_shortfall_is_left(tmp_path: Path) -> None:
    ws = absent(small(tmp_path), "a", D[1], D[2])
    result = repair(ws, D[2], OPTIONS)  # day 1 is past: its short cover stays
    assert result.outcome.roster is not None and result.outcome.check is not None
    assert [c.cell.date for c in result.changed] == [D[2]]
    for pid in "abc":
        assert result.outcome.roster.rows[pid][:2] == ws.roster.rows[pid][:2]  # type: ignore[union-attr]
    hard = [v for v in result.outcome.check.violations if v.hard]
    assert [(v.kind, v.dates) for v in hard] == [("cover", (D[1],))]
    assert [(v.kind, v.dates) for v in result.past] == [("cover", (D[1],))]


def test_locks_are_kept(tmp_path: Path) -> None:
    locks = '[[lock]]\nperson = "b"\ndates = [2027-03-02, 2027-03-03]\n'
    ws = absent(small(tmp_path, locks=locks), "a", D[1], D[2])
    result = repair(ws, D[0], OPTIONS)
    assert result.outcome.roster is not None
    assert result.outcome.roster.rows["b"][1:3] == ["-", "-"]
    assert {c.cell.person for c in result.changed} == {"c"}


def test_the_change_weight_in_unit_toml_trades_changes_against_requests(
        tmp_path: Path) -> None:
    ask = '[[request]]\nperson = "b"\ndate = 2027-03-05\nwant = "E"\nweight = 50\n'
    cheap = small(tmp_path / "cheap", requests=ask, unit_extra="[repair]\nchange_weight = 10\n")
    dear = small(tmp_path / "dear", requests=ask)  # default 1000
    assert cheap.unit.repair.change_weight == 10 and dear.unit.repair.change_weight == 1000
    # granting b's request costs one change (b works E on day 5 too)
    granted = repair(cheap, D[0], OPTIONS)
    assert granted.outcome.changes == 1 and granted.changed[0].cell.person == "b"
    assert [v.kind for v in granted.changed[0].fixes] == ["request"]
    assert repair(dear, D[0], OPTIONS).outcome.changes == 0


def test_a_hard_breach_wholly_in_the_past_makes_repair_impossible_and_says_so(
        tmp_path: Path) -> None:
    rows = {"a": "E L E E E", "b": "- E - - -", "c": "- - - - -"}
    rest = '[[rule]]\nid = "rest"\nkind = "min-rest"\nhours = 11\n'
    ws = small(tmp_path, rows=rows, rules=rest)
    result = repair(ws, D[3], OPTIONS)  # L then E (9 h rest) on days 2-3, both fixed
    assert result.outcome.roster is None and result.outcome.status == "infeasible"
    assert [(v.rule, v.dates) for v in result.past] == [("rest", (D[1], D[2]))]
    fixed = repair(ws, D[0], OPTIONS)  # from the first day, it can be mended
    assert fixed.outcome.check is not None and fixed.outcome.check.compliant


def test_the_default_from_is_today_inside_the_period_else_its_first_day(
        tmp_path: Path) -> None:
    ws = small(tmp_path)
    assert default_from(ws, D[3]) == D[3]
    assert default_from(ws, date(2027, 2, 1)) == D[0]
    assert default_from(ws, date(2027, 6, 1)) == D[0]


@settings(max_examples=int(os.environ.get("ROSTERTUI_EXAMPLES", 80)), **SETTINGS)
@given(workspaces(max_people=2, max_days=3, max_codes=2), st.integers(0, 2),
       st.sampled_from([1, 1, 2, 5, 1000]), st.randoms(use_true_random=False))
def test_repair_is_the_cheapest_of_every_roster_that_keeps_the_past(
        spec: Spec, frozen: int, weight: int, rng: random.Random) -> None:
    """Enumerate every roster of a tiny unit that keeps the first `frozen` days: the
    least penalty + weight x cells changed among those keeping every hard rule (a cover
    shortfall on a fixed day excepted) must be the repair's."""
    with tempfile.TemporaryDirectory() as tmp:
        ws = load_workspace(write(spec, Path(tmp) / "ws"))
    assume(ws.roster is not None)
    n, people = ws.unit.days, ws.person_ids
    codes = ["-", *ws.shift_by_code]
    rows = {pid: [rng.choice(codes) for _ in range(n)] for pid in people}  # any roster at all
    ws = dataclasses.replace(
        ws, roster=ws.roster.model_copy(update={"rows": rows}),  # type: ignore[union-attr]
        unit=ws.unit.model_copy(update={"repair": RepairSettings(change_weight=weight)}))
    frozen = min(frozen, n - 1)
    start_from = ws.unit.dates[frozen]
    result = repair(ws, start_from, SolveOptions(time_limit=10, workers=2))
    current = {pid: (list(ws.roster.rows.get(pid, ())) + ["-"] * n)[:n]  # type: ignore[union-attr]
               for pid in people}
    best = None
    free = ["-", *ws.shift_by_code]
    for cells in itertools.product(free, repeat=len(people) * (n - frozen)):
        w = n - frozen
        rows = {pid: current[pid][:frozen] + list(cells[i * w:(i + 1) * w])
                for i, pid in enumerate(people)}
        check = check_roster(ws, Roster(start=ws.unit.start, days=n, rows=rows,
                                        lock=ws.roster.lock))  # type: ignore[union-attr]
        if any(v.hard and not (v.kind == "cover" and all(d < start_from for d in v.dates))
               for v in check.violations):
            continue
        changes = sum(rows[p][d] != current[p][d] for p in people for d in range(n))
        cost = check.penalty + weight * changes
        best = cost if best is None else min(best, cost)
    out = result.outcome
    event(f"repair {out.status}, {out.changes or 0} change(s)")
    if best is None:
        assert out.status == "infeasible"
        return
    assert out.status == "optimal" and out.roster is not None and out.objective is not None
    changes = sum(out.roster.rows[p][d] != current[p][d] for p in people for d in range(n))
    assert out.objective + weight * changes == best
    assert all(out.roster.rows[p][:frozen] == current[p][:frozen] for p in people)
