"""The decomposition bound (core/solver/decompose/): valid, exact where it must be, and
the published optima of Curtois & Qu where they are proven.

Method: Dantzig-Wolfe decomposition with column generation, the Lagrangian bound at
every iteration (Dantzig & Wolfe 1960, Operations Research 8; as for nurse rostering in
Burke & Curtois 2014, EJOR 237, and He & Qu 2012, Computers & OR 39).
"""

from __future__ import annotations

import itertools
import random
import tempfile
import time
from fractions import Fraction
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from ortools.sat.python import cp_model

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver import SolveOptions, solve
from rostertui.core.solver.decompose import decompose, loop
from rostertui.core.solver.decompose.pricing import PersonModel, one_person
from rostertui.core.solver.outcome import RefereeError
from rostertui.core.solver.summary import bound_sources
from tests.conftest import BENCHMARKS, FIXTURES, need_shared
from tests.strategies import SETTINGS, Spec, workspaces, write


def _load(spec: Spec, tmp: str) -> Workspace:
    return load_workspace(write(spec, Path(tmp) / "ws"))


def _optimum(ws: Workspace) -> int | None:
    """The least penalty of a roster keeping every hard rule, by trying them all."""
    people, n = ws.person_ids, ws.unit.days
    options = ["-", *ws.shift_by_code]
    locks = list(ws.roster.lock) if ws.roster is not None else []
    best = None
    for cells in itertools.product(options, repeat=len(people) * n):
        rows = {pid: list(cells[i * n:(i + 1) * n]) for i, pid in enumerate(people)}
        result = check_roster(ws, Roster(start=ws.unit.start, days=n, rows=rows, lock=locks))
        if result.compliant and (best is None or result.penalty < best):
            best = result.penalty
    return best


@settings(max_examples=40, **SETTINGS)
@given(workspaces(max_people=2, max_days=3, max_codes=2), st.integers(0, 2**16))
def test_the_bound_is_never_above_the_optimum_even_at_wrong_duals(
        spec: Spec, noise: int) -> None:
    """Every roster of a tiny unit is checked; the bound may never exceed the best, and
    'infeasible' must be true. The bound holds for any multipliers, not only the LP's
    optimal duals: with `noise`, every dual the master gives is perturbed at random
    before it is priced, and the bound must still hold (its validity rests on exact
    arithmetic at the point priced, not on the LP's accuracy)."""
    rng = random.Random(noise)
    original = loop.Point.of

    def perturbed(duals):  # noqa: ANN001, ANN202
        point = original(duals)
        if noise % 2:
            return point
        return loop.Point([c + Fraction(rng.randint(-5000, 5000), 1000) for c in point.cover],
                          {k: v + Fraction(rng.randint(0, 3000), 1000)
                           for k, v in point.upper.items()},
                          {k: v + Fraction(rng.randint(0, 3000), 1000)
                           for k, v in point.lower.items()})

    with tempfile.TemporaryDirectory() as tmp:
        ws = _load(spec, tmp)
        loop.Point.of = perturbed  # type: ignore[method-assign]
        try:
            out = decompose(ws, deadline=time.monotonic() + 20)
        finally:
            loop.Point.of = original  # type: ignore[method-assign]
        best = _optimum(ws)
    if out.infeasible:
        assert best is None
    elif best is not None and out.bound is not None:
        assert out.bound <= best


@settings(max_examples=30, **SETTINGS)
@given(workspaces(min_people=1, max_people=1, max_days=6, max_codes=2))
def test_with_one_person_the_bound_is_the_optimum(spec: Spec) -> None:
    """With one person every cover count is 0 or 1, where the cover penalty is linear,
    so the master LP's optimum is a whole row: the converged bound is the optimum."""
    with tempfile.TemporaryDirectory() as tmp:
        ws = _load(spec, tmp)
        out = decompose(ws, deadline=time.monotonic() + 30)
        best = _optimum(ws)
    if best is None:
        return  # infeasible: the first test holds the bound to account
    assert not out.infeasible
    assert out.converged
    assert out.bound == best


@settings(max_examples=30, **SETTINGS)
@given(workspaces(max_people=3, max_days=10, max_codes=3), st.integers(0, 2**16))
def test_the_pricing_model_scores_a_fixed_row_as_the_checker_does(spec: Spec,
                                                                   seed: int) -> None:
    """Fix a random row in a person's pricing model and minimise with no duals: the
    objective is the checker's penalty of that row in the person's own workspace
    (no cover, no balance), or infeasible exactly when the checker finds a hard break."""
    rng = random.Random(seed)
    with tempfile.TemporaryDirectory() as tmp:
        ws = _load(spec, tmp)
        pid = rng.choice(ws.person_ids)
        pm = PersonModel(ws, pid, [])
        n = ws.unit.days
        row = [rng.choice(["-", *ws.shift_by_code]) for _ in range(n)]
        model = pm.built.model.clone()
        for (_, d, code), var in pm.built.cells.x.items():
            model.add(model.get_bool_var_from_proto_index(var.index) == int(row[d] == code))
        can_hold = all(code == "-" or (0, d, code) in pm.built.cells.x
                       for d, code in enumerate(row))
        model.minimize(pm.own)
        solver = cp_model.CpSolver()
        solver.parameters.num_workers = 1
        status = solver.solve(model)
        mine = one_person(ws, pid)
        locks = list(mine.roster.lock) if mine.roster is not None else []
        result = check_roster(mine, Roster(start=ws.unit.start, days=n, rows={pid: row},
                                           lock=locks))
    if result.compliant:
        assert can_hold and status == cp_model.OPTIMAL
        assert round(solver.objective_value) == result.penalty
    else:
        assert not can_hold or status == cp_model.INFEASIBLE


@pytest.mark.parametrize(("instance", "optimum"), [(2, 828), (3, 1001), (4, 1716)])
def test_the_bound_meets_the_published_optimum_of_curtois_and_qu(instance: int,
                                                                 optimum: int) -> None:
    """Curtois & Qu (2014), "Computational results on new staff scheduling benchmark
    instances" (technical report, University of Nottingham), instances 2, 3 and 4:
    828, 1001 and 1716 are the best values published for them (branch and price,
    Gurobi, IP&VNS, as quoted in ../shared/benchmarks/curtois-qu/BEST_KNOWN.md, whose
    note that they are optimal is from memory). Rosters of exactly these penalties
    exist (our solver finds them, BENCHMARKS.md), so a bound above them would be
    wrong; this one meets them, which proves them optimal."""
    folder = BENCHMARKS / "workspaces" / f"Instance{instance}"
    need_shared(folder)
    ws = load_workspace(folder)
    out = decompose(ws, deadline=time.monotonic() + 120, workers=2)
    assert out.converged
    assert out.bound == optimum


def test_solve_reports_the_bound_and_referees_it(tmp_path: Path,
                                                 monkeypatch: pytest.MonkeyPatch) -> None:
    ws = load_workspace(FIXTURES / "good")
    out = solve(ws, SolveOptions(time_limit=10, workers=2))
    assert out.roster is not None and out.objective is not None
    assert "decomposition" in out.bounds
    assert out.bounds["decomposition"] <= out.objective
    assert out.roster.solve is not None and out.roster.solve.bound == out.bound
    assert "column generation" in bound_sources(out)
    # a bound above a roster the checker scored is refused, never reported
    real = loop.decompose

    def inflated(*args, **kw):  # noqa: ANN002, ANN003, ANN202
        found = real(*args, **kw)
        found.bound = out.objective + 1
        kw["on_progress"] and kw["on_progress"](loop.DecompositionProgress(
            0.0, 1, found.bound, None, 0))
        return found

    from rostertui.core.solver import run
    monkeypatch.setattr(run, "decompose", inflated)
    with pytest.raises(RefereeError, match="decomposition bound"):
        solve(ws, SolveOptions(time_limit=10, workers=2, warm_start=False))


def test_a_pricing_bound_is_never_rounded_up() -> None:
    from rostertui.core.solver.decompose.pricing import floor_safely

    assert floor_safely(5.0) == 5 and floor_safely(-3.5) == -4
    big = float(2**60 + 2**10)  # beyond the floats that hold every integer
    assert floor_safely(big) <= 2**60 + 2**10
    assert floor_safely(-big) <= -(2**60 + 2**10)
