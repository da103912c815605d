"""Running the solver: progress, cancel keeping the best roster, warm start, the referee.

Behaviour only: how fast a cancel takes effect is for bench/, not for assertions
here (a loaded machine would fail them)."""

from __future__ import annotations

import threading
from pathlib import Path

import pytest

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.io.save import save
from rostertui.core.solver import SolveOptions, SolveProgress, solve
from rostertui.core.solver.outcome import RefereeError
from rostertui.core.solver.run import referee
from tests.conftest import DEMO, FIXTURES, copy_ws


@pytest.mark.parametrize("unit", ["clinic", "depot"])
def test_demo_units_solve_to_compliant_rosters_the_checker_agrees_with(unit: str) -> None:
    ws = load_workspace(DEMO / unit)
    seen: list[SolveProgress] = []
    out = solve(ws, SolveOptions(time_limit=15, workers=2), on_progress=seen.append)
    assert out.status in ("optimal", "feasible")
    result = check_roster(ws, out.roster)
    assert result.compliant
    assert result.penalty == out.objective
    assert out.bound is not None and out.bound <= out.objective
    assert out.gap is not None and 0 <= out.gap <= 1
    improving = [p.penalty for p in seen if p.penalty is not None]
    assert improving and improving[-1] >= out.objective
    assert all(a >= b for a, b in zip(improving, improving[1:], strict=False))


def test_cancel_keeps_the_best_roster_so_far() -> None:
    ws = load_workspace(DEMO / "clinic")
    cancel = threading.Event()

    def first_roster_then_cancel(p: SolveProgress) -> None:
        if p.penalty is not None:
            cancel.set()

    options = SolveOptions(time_limit=120, workers=2, decompose=False)
    out = solve(ws, options, on_progress=first_roster_then_cancel, cancel=cancel)
    assert out.wall_seconds < options.time_limit  # stopped by the cancel, not the limit
    assert out.roster is not None and out.status in ("feasible", "optimal")
    assert check_roster(ws, out.roster).compliant


def test_cancel_while_the_bound_is_proved_keeps_the_first_roster() -> None:
    ws = load_workspace(DEMO / "clinic")
    cancel = threading.Event()

    def cancel_while_bounding(p: SolveProgress) -> None:
        if p.stage == "bound" and p.elapsed > 1.0:
            cancel.set()

    options = SolveOptions(time_limit=120, workers=2)
    out = solve(ws, options, on_progress=cancel_while_bounding, cancel=cancel)
    assert cancel.is_set()
    assert out.wall_seconds < options.time_limit  # stopped by the cancel, not the limit
    # column generation was cut short by the cancel: neither converged nor given up
    assert out.decomposition is not None
    assert not out.decomposition.converged and not out.decomposition.stalled
    assert out.roster is not None and check_roster(ws, out.roster).compliant


def test_warm_start_from_the_current_roster_never_starts_worse(tmp_path: Path) -> None:
    ws_dir = copy_ws(DEMO / "clinic", tmp_path)
    first = solve(load_workspace(ws_dir), SolveOptions(time_limit=8, workers=2))
    save(first.roster, ws_dir)
    again = solve(load_workspace(ws_dir), SolveOptions(time_limit=3, workers=2))
    assert again.objective <= first.objective


def test_referee_rejects_an_objective_the_checker_disagrees_with() -> None:
    ws = load_workspace(FIXTURES / "good")
    roster = solve(ws, SolveOptions(time_limit=10, workers=2)).roster
    penalty = check_roster(ws, roster).penalty
    assert referee(ws, roster, penalty).penalty == penalty
    with pytest.raises(RefereeError, match="differs from the checker's penalty"):
        referee(ws, roster, penalty + 1)


def test_referee_rejects_a_roster_with_a_hard_violation() -> None:
    ws = load_workspace(FIXTURES / "good")
    bad = ws.roster.model_copy(deep=True)
    bad.rows["t02"][2] = "E"  # a leave day
    with pytest.raises(RefereeError, match="hard violation"):
        referee(ws, bad, check_roster(ws, bad).penalty)


def test_locks_from_the_current_roster_are_kept(tmp_path: Path) -> None:
    ws = load_workspace(FIXTURES / "good")
    out = solve(ws, SolveOptions(time_limit=10, workers=2))
    assert out.roster.rows["t03"][:2] == ws.roster.rows["t03"][:2]
    assert out.roster.lock == ws.roster.lock
