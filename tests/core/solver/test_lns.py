"""Large neighbourhood search around the best roster (core/solver/primal/lns.py).

Method: large neighbourhood search (Shaw 1998, "Using constraint programming and local
search methods to solve vehicle routing problems", CP-98, LNCS 1520; Pisinger & Ropke
2010, "Large neighborhood search", Handbook of Metaheuristics): its rosters only get
better, each is scored exactly as the checker scores it, its neighbourhoods are the
shapes they claim to be, and as they widen to the whole roster it reaches the optimum
that CP-SAT proves on the full model.
"""

from __future__ import annotations

import random
import tempfile
import threading
import time
from pathlib import Path

from hypothesis import given, settings
from hypothesis import strategies as st
from ortools.sat.python import cp_model

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver import SolveOptions, solve
from rostertui.core.solver.fixing import evaluate, rows_of
from rostertui.core.solver.model import BuiltModel, build_model
from rostertui.core.solver.primal import lns
from rostertui.core.solver.primal.portfolio import LNS
from tests.conftest import REPO
from tests.strategies import SETTINGS, Spec, workspaces, write


def _load(spec: Spec, tmp: str) -> Workspace:
    ws = load_workspace(write(spec, Path(tmp) / "ws"))
    ws.roster = None
    return ws


def _first(built: BuiltModel) -> lns.Incumbent | None:
    solver = cp_model.CpSolver()
    solver.parameters.stop_after_first_solution = True
    solver.parameters.num_workers = 1
    if solver.solve(built.model) not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        return None
    values = {key: solver.value(var) for key, var in built.cells.x.items()}
    exact = evaluate(built, values, 10.0)
    assert exact is not None
    return lns.Incumbent(values, exact[0], exact[1])


def _penalty(ws: Workspace, built: BuiltModel, values: lns.Values) -> int:
    rows = rows_of(built, values)
    roster = Roster(start=ws.unit.start, days=ws.unit.days,
                    rows={pid: rows[p] for p, pid in enumerate(ws.person_ids)})
    return check_roster(ws, roster).penalty


@settings(max_examples=30, **SETTINGS)
@given(workspaces(max_people=5, max_days=12, max_codes=3), st.integers(0, 2**16))
def test_neighbourhood_search_only_improves_and_reaches_the_proven_optimum(
        spec: Spec, seed: int) -> None:
    """From CP-SAT's first roster: every roster offered is better than the one before
    and scored as the checker scores it; with time, the neighbourhoods widen (the
    whole roster at last) until the optimum CP-SAT proves on the full model."""
    with tempfile.TemporaryDirectory() as tmp:
        ws = _load(spec, tmp)
    built = build_model(ws)
    start = _first(built)
    if start is None:
        return
    solver = cp_model.CpSolver()
    solver.parameters.num_workers = 1
    solver.parameters.max_time_in_seconds = 20.0
    if solver.solve(build_model(ws).model) != cp_model.OPTIMAL:
        return
    optimum = round(solver.objective_value)
    offered: list[tuple[lns.Values, int]] = []
    best = lns.search(built, start, lns.blind(built), time.monotonic() + 20.0, 1, seed,
                      lambda values, objective: offered.append((values, objective)),
                      lambda objective: objective <= optimum)
    objectives = [o for _, o in offered]
    assert objectives == sorted(objectives, reverse=True)
    assert all(o < start.objective for o in objectives)
    assert best.objective == optimum
    assert _penalty(ws, built, best.values) == optimum  # polish-free: the search's value
    for values, objective in offered:
        assert _penalty(ws, built, values) <= objective  # never better than claimed


@given(st.integers(1, 60), st.integers(1, 60), st.integers(1, 5000), st.integers(0, 99))
def test_a_day_window_holds_everyone_over_consecutive_days_within_the_cap(
        people: int, days: int, most: int, seed: int) -> None:
    free = lns.day_window(random.Random(seed), people, days, most)
    dates = sorted({d for _, d in free})
    who = {p for p, _ in free}
    assert dates == list(range(dates[0], dates[-1] + 1)) and 0 <= dates[0] <= dates[-1] < days
    if len(dates) > 1 or people <= most:  # a window: everyone, as many days as fit
        assert who == set(range(people))
        assert len(free) <= max(most, people)
        assert len(dates) == max(1, min(days, most // people))
    else:  # one day is more than the cap: part of the people on it
        assert len(free) == most


@given(st.integers(1, 60), st.integers(1, 60), st.integers(1, 5000), st.integers(0, 99))
def test_people_rows_are_whole_rows_within_the_cap(people: int, days: int, most: int,
                                                   seed: int) -> None:
    rng = random.Random(seed)
    free = lns.people_rows(rng, rng.sample(range(people), people), days, most)
    who = {p for p, _ in free}
    assert free == {(p, d) for p in who for d in range(days)}
    assert len(who) == max(1, min(people, most // days))


def test_solve_names_neighbourhood_search_when_it_finds_a_better_roster() -> None:
    """The clinic demo has no converged master within seconds, so the primal
    heuristics do not run and neighbourhood search starts from CP-SAT's first roster:
    its gains are named in the outcome's story, and the referee accepts the roster."""
    ws = load_workspace(REPO / "demo" / "clinic")
    ws.roster = None
    cancel = threading.Event()
    out = solve(ws, SolveOptions(time_limit=10.0, workers=1, seed=0, lns_share=0.9), None,
                cancel)
    methods = {method for _, _, method in out.improvements}
    assert LNS in methods
    assert out.check is not None and out.check.penalty == out.objective
