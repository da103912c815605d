"""The solver on random workspaces (hypothesis): refereed, and optimal by brute force.

Workspaces come from tests/strategies.py: every rule kind, hard or soft, history,
leave, requests, DST zones. The current roster in each workspace serves as the
warm start (often one that breaks hard rules).
"""

from __future__ import annotations

import itertools
import tempfile
from pathlib import Path

from hypothesis import assume, given, settings

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.models.roster import Roster
from rostertui.core.solver import SolveOptions, solve
from tests.strategies import SETTINGS, Spec, workspaces, write


def solved(spec: Spec):  # noqa: ANN201
    with tempfile.TemporaryDirectory() as tmp:
        ws = load_workspace(write(spec, Path(tmp) / "ws"))
        return ws, solve(ws, SolveOptions(time_limit=10, workers=2))


@settings(max_examples=60, **SETTINGS)
@given(workspaces())
def test_objective_equals_the_checkers_penalty_and_no_hard_rule_breaks(spec: Spec) -> None:
    ws, out = solved(spec)
    assume(out.status != "infeasible")
    assert out.roster is not None, out.status
    result = check_roster(ws, out.roster)
    assert result.compliant
    assert result.penalty == out.objective
    assert out.bound is not None and out.bound <= out.objective


@settings(max_examples=40, **SETTINGS)
@given(workspaces(max_people=2, max_days=3, max_codes=2))
def test_the_optimum_is_the_best_of_every_possible_roster(spec: Spec) -> None:
    """Enumerate every roster of a tiny unit and check each: the least penalty among
    the compliant ones must be the solver's optimum, and none compliant means the
    solver must say infeasible."""
    ws, out = solved(spec)
    people = ws.person_ids
    options = ["-", *ws.shift_by_code]
    n = ws.unit.days
    best = None
    for cells in itertools.product(options, repeat=len(people) * n):
        rows = {pid: list(cells[i * n:(i + 1) * n]) for i, pid in enumerate(people)}
        locks = list(ws.roster.lock) if ws.roster is not None else []
        result = check_roster(ws, Roster(start=ws.unit.start, days=n, rows=rows, lock=locks))
        if result.compliant and (best is None or result.penalty < best):
            best = result.penalty
    if best is None:
        assert out.status == "infeasible"
    else:
        assert out.status == "optimal"
        assert out.objective == best
