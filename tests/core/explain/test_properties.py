"""explain agrees with the solver on random workspaces, and its sets are minimal."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

from hypothesis import event, given, settings

from rostertui.core.explain.conflict import _infeasible, find_conflict
from rostertui.core.io.load import load_workspace
from rostertui.core.solver import SolveOptions, solve
from rostertui.core.solver.model import build_model
from tests.strategies import SETTINGS, Spec, workspaces, write


@settings(max_examples=int(os.environ.get("ROSTERTUI_EXAMPLES", 40)), **SETTINGS)
@given(workspaces(max_people=3, max_days=5, max_codes=2))
def test_a_conflict_exactly_when_the_solver_finds_no_roster(spec: Spec) -> None:
    with tempfile.TemporaryDirectory() as tmp:
        ws = load_workspace(write(spec, Path(tmp) / "ws"))
    out = solve(ws, SolveOptions(time_limit=10, workers=2))
    found = find_conflict(ws, 20)
    event(f"solver {out.status}, explain {found.status}, {len(found.items)} item(s)")
    if out.status == "infeasible":
        assert found.status == "infeasible"
    else:
        assert out.roster is not None and found.status == "feasible"
        return
    built = build_model(ws, explain=True)
    assert built.items is not None
    for it in found.items:
        built.items.switch(it)
    assert _infeasible(built.model, built.items, found.items, 10, 2) is True
    if found.minimal:
        for it in found.items:
            rest = [k for k in found.items if k != it]
            assert _infeasible(built.model, built.items, rest, 10, 2) is False
