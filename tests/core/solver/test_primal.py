"""Primal heuristics from the decomposition (core/solver/primal/): their rosters keep
the hard rules, their objectives are the checker's penalties, they never make a roster
worse, and on Curtois & Qu they reach the published optima.

Methods: the integer master over the generated columns (restricted master heuristic;
Joncour, Michel, Sadykov, Sverdlov & Vanderbeck 2010, Electronic Notes in Discrete
Mathematics 36) and relaxation-induced neighbourhoods (RINS; Danna, Rothberg & Le Pape
2005, Math. Programming 102), on the master LP of column generation (Dantzig & Wolfe
1960; as for nurse rostering in Burke & Curtois 2014, EJOR 237).
"""

from __future__ import annotations

import dataclasses
import tempfile
import threading
import time
from fractions import Fraction
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver import SolveOptions, SolveProgress, solve
from rostertui.core.solver.decompose import decompose
from rostertui.core.solver.decompose.loop import LAGRANGIAN_RATIO, STALL_RATIO, Checkpoint
from rostertui.core.solver.decompose.pricing import one_person
from rostertui.core.solver.fixing import evaluate, rows_of, values_of
from rostertui.core.solver.model import build_model
from rostertui.core.solver.primal import portfolio, rins
from rostertui.core.solver.primal.first import first_roster
from rostertui.core.solver.primal.pool import integer_master
from rostertui.core.solver.summary import improvement_story
from tests.conftest import BENCHMARKS, FIXTURES, need_shared
from tests.strategies import SETTINGS, Spec, workspaces, write


def _load(spec: Spec, tmp: str) -> Workspace:
    ws = load_workspace(write(spec, Path(tmp) / "ws"))
    ws.roster = None
    return ws


def _roster(ws: Workspace, rows: dict[int, tuple[str, ...] | list[str]]) -> Roster:
    return Roster(start=ws.unit.start, days=ws.unit.days,
                  rows={pid: list(rows[p]) for p, pid in enumerate(ws.person_ids)})


@settings(max_examples=40, **SETTINGS)
@given(workspaces(max_people=4, max_days=10, max_codes=3))
def test_the_integer_master_scores_its_rosters_as_the_checker_does(spec: Spec) -> None:
    """Every roster the integer master over the pool finds keeps every hard rule (each
    row keeps its person's own rules, the master keeps cover), its reported objective
    is never below the checker's penalty (rows found on the way carry an upper end of
    their cost), nor below the decomposition bound. With every row's cost made exact
    (the checker on the person alone), the roster it proves best in the pool has
    exactly its objective as penalty: cover ideals and `balance` are counted in the
    integer master as rules.md counts them."""
    with tempfile.TemporaryDirectory() as tmp:
        ws = _load(spec, tmp)
        dw = decompose(ws, deadline=time.monotonic() + 20)
        if dw.infeasible or not dw.columns:
            return
        people = len(ws.person_ids)
        found: list[tuple[dict, int]] = []
        integer_master(dw, people, 20.0, 1, 0,
                       lambda rows, objective: found.append((rows, objective)))
        for rows, objective in found:
            result = check_roster(ws, _roster(ws, rows))
            assert result.compliant, [v.message for v in result.violations if v.hard]
            assert result.penalty <= objective
            assert dw.bound is None or dw.bound <= result.penalty  # the bound's promise
        alone = {p: one_person(ws, pid) for p, pid in enumerate(ws.person_ids)}

        def exact(column):  # noqa: ANN001, ANN202
            solo = alone[column.person]
            row = Roster(start=ws.unit.start, days=ws.unit.days,
                         rows={solo.person_ids[0]: list(column.codes)})
            return dataclasses.replace(column, cost=check_roster(solo, row).penalty)

        dw.columns = [exact(c) for c in dw.columns]
        dw.spare = [exact(c) for c in dw.spare]
        found.clear()
        proved = integer_master(dw, people, 20.0, 1, 0,
                                lambda rows, objective: found.append((rows, objective)))
    if proved and found:
        rows, objective = found[-1]
        assert check_roster(ws, _roster(ws, rows)).penalty == objective


@settings(max_examples=30, **SETTINGS)
@given(workspaces(max_people=4, max_days=10, max_codes=3), st.integers(0, 2**16))
def test_rins_never_makes_the_roster_worse_and_its_rosters_are_exact(
        spec: Spec, seed: int) -> None:
    """From the first roster CP-SAT finds, the neighbourhoods give only better rosters,
    each kept exactly as scored: the full model's objective of the returned roster is
    its checker penalty, and at most the start's."""
    with tempfile.TemporaryDirectory() as tmp:
        ws = _load(spec, tmp)
        dw = decompose(ws, deadline=time.monotonic() + 20)
        if dw.infeasible or not dw.columns:
            return
        built = build_model(ws)
        from ortools.sat.python import cp_model

        solver = cp_model.CpSolver()
        solver.parameters.stop_after_first_solution = True
        solver.parameters.num_workers = 1
        if solver.solve(built.model) not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
            return
        values = {key: solver.value(var) for key, var in built.cells.x.items()}
        exact = evaluate(built, values, 10.0)
        assert exact is not None
        start = rins.Incumbent(values, exact[0], exact[1])
        offered: list[int] = []
        best = rins.search(built, dw, start, time.monotonic() + 3.0, 1, seed,
                           lambda values, objective: offered.append(objective),
                           lambda objective: False)
    assert offered == sorted(offered, reverse=True)
    assert all(o < start.objective for o in offered)
    assert best.objective <= start.objective
    penalty = check_roster(ws, _roster(ws, rows_of(built, best.values))).penalty
    assert evaluate(built, best.values, 10.0)[0] == penalty <= best.objective


def test_rins_frees_exactly_where_the_lp_and_the_roster_disagree() -> None:
    ws = load_workspace(FIXTURES / "good")
    dw = decompose(ws, deadline=time.monotonic() + 30, workers=2)
    built = build_model(ws, None)
    lp = rins.marginals(dw)
    heaviest = dw.heaviest()
    values = values_of(built, heaviest)
    free = rins.disagreement(built, values, lp)
    for (p, d), codes in lp.items():
        weight = codes.get(heaviest[p][d], 0.0)
        assert ((p, d) in free) == (weight < rins.AGREE)
    assert all(abs(sum(codes.values()) - 1.0) < 1e-6 for codes in lp.values())


def test_solve_names_the_method_of_each_better_roster() -> None:
    ws = load_workspace(FIXTURES / "good")
    ws.roster = None
    out = solve(ws, SolveOptions(time_limit=15, workers=2))
    assert out.roster is not None and out.improvements
    methods = {method for _, _, method in out.improvements}
    assert methods <= {portfolio.POOL, portfolio.FIRST, portfolio.RINS, "CP-SAT search"}
    penalties = [penalty for _, penalty, _ in out.improvements]
    assert penalties == sorted(penalties, reverse=True) and len(set(penalties)) == len(penalties)
    assert out.found_by == out.improvements[-1][2]
    assert penalties[-1] >= out.objective  # the last one found, polished to the exact value
    assert out.improvements[-1][2] in improvement_story(out)
    found = [p.found_by for p in out.history if p.penalty is not None]
    assert found and found[-1] == out.found_by


def test_the_warm_start_is_the_first_incumbent_and_never_lost() -> None:
    """The workspace's own roster is the first roster on the way, named as such; the
    roster returned is never worse than it."""
    ws = load_workspace(FIXTURES / "good")
    assert ws.roster is not None
    before = check_roster(ws, ws.roster)
    out = solve(ws, SolveOptions(time_limit=10, workers=2))
    if before.compliant:
        assert out.improvements[0][2] == "warm start"
        assert out.improvements[0][1] == before.penalty
        assert out.objective is not None and out.objective <= before.penalty


def test_cancel_while_improving_keeps_the_best_roster() -> None:
    """Cancel as soon as a heuristic offers a roster: the solve stops at once with that
    roster (or a better one), refereed."""
    ws = load_workspace(FIXTURES / "good")
    ws.roster = None
    cancel = threading.Event()

    def progress(p) -> None:  # noqa: ANN001
        if p.found_by in (portfolio.POOL, portfolio.RINS):
            cancel.set()

    started = time.monotonic()
    out = solve(ws, SolveOptions(time_limit=60, workers=2), on_progress=progress,
                cancel=cancel)
    assert time.monotonic() - started < 30
    assert out.roster is not None and out.check is not None and out.check.compliant


def test_curtois_qu_2_is_solved_to_its_optimum_and_proven() -> None:
    """Curtois & Qu (2014), "Computational results on new staff scheduling benchmark
    instances" (technical report, University of Nottingham), instance 2: best known
    828, proven optimal by the decomposition bound (test_decompose.py)."""
    folder = BENCHMARKS / "workspaces" / "Instance2"
    need_shared(folder)
    ws = load_workspace(folder)
    ws.roster = None
    out = solve(ws, SolveOptions(time_limit=60, workers=2))
    assert out.status == "optimal" and out.objective == 828 == out.bound


def test_curtois_qu_5_comes_within_2_percent_of_the_best_known() -> None:
    """Curtois & Qu (2014), instance 5: best known 1143 (BEST_KNOWN.md); the solver
    before the primal heuristics gave 1240 at 60 s and 1234 at 300 s. The issue's
    target is 2 % at 300 s: the solve is given 300 s and stopped once it is there
    (4.5-30 s over seeds 0-3 here, the integer master's roster each time); a shorter
    limit shrinks the master's share and made the test depend on the machine's load."""
    folder = BENCHMARKS / "workspaces" / "Instance5"
    need_shared(folder)
    ws = load_workspace(folder)
    ws.roster = None
    target = int(1143 * 1.02)
    cancel = threading.Event()

    def stop_at_target(p: SolveProgress) -> None:
        if p.penalty is not None and p.penalty <= target:
            cancel.set()

    out = solve(ws, SolveOptions(time_limit=300, workers=2), on_progress=stop_at_target,
                cancel=cancel)
    assert out.check is not None and out.check.compliant
    assert out.objective is not None and 1143 <= out.objective <= target


def test_the_pool_is_not_searched_when_the_master_cannot_meet_cover(
        monkeypatch: pytest.MonkeyPatch) -> None:
    """With the master's artificial variables in use no mix of the pool's rows meets
    the cover minimums, so the integer master cannot find a roster: it is skipped and
    its time left to the search."""
    ws = load_workspace(FIXTURES / "good")
    ws.roster = None
    dw = decompose(ws, deadline=time.monotonic() + 30, workers=2)
    assert dw.columns and dw.artificial <= portfolio.ARTIFICIAL
    calls: list[int] = []
    monkeypatch.setattr(portfolio, "integer_master",
                        lambda *args, **kw: calls.append(1) or False)
    built = build_model(ws)
    kw = dict(deadline=time.monotonic() + 1, pool_share=0.5, workers=1, seed=0,
              offer=lambda *a: None, stop=lambda objective: False)
    portfolio.improve(built, dw, None, **kw)
    assert calls == [1]
    dw.artificial = 1.0
    portfolio.improve(built, dw, None, **kw)
    assert calls == [1]


def test_a_first_roster_shows_before_the_bound_and_rins_does_not_start_from_it(
        monkeypatch: pytest.MonkeyPatch) -> None:
    """With no roster of the user's, CP-SAT's first roster comes before column
    generation (a roster within seconds, however long the bound takes), exact as the
    checker scores it. RINS does not start from it when the pool gives nothing (measured
    worse than the plain search on the clinic demo, BENCHMARKS.md)."""
    ws = load_workspace(FIXTURES / "good")
    ws.roster = None
    dw = decompose(ws, deadline=time.monotonic() + 30, workers=2)
    assert dw.columns
    built = build_model(ws)
    first = first_roster(built, time.monotonic() + 10, 1, 0)
    assert first is not None
    result = check_roster(ws, _roster(ws, rows_of(built, first.values)))
    assert result.compliant and result.penalty == first.objective
    monkeypatch.setattr(portfolio, "integer_master", lambda *args, **kw: False)
    offers: list[str] = []
    kw = dict(deadline=time.monotonic() + 2, pool_share=0.3, workers=1, seed=0,
              offer=lambda v, o, m: offers.append(m), stop=lambda objective: False)
    assert portfolio.improve(built, dw, None, **kw) is None and offers == []

    out = solve(ws, SolveOptions(time_limit=10, workers=2))
    assert out.improvements and out.improvements[0][2] == portfolio.FIRST
    assert out.improvements[0][0] <= out.phases["first"] + 0.5


def test_column_generation_far_from_converging_gives_its_time_back(
        monkeypatch: pytest.MonkeyPatch) -> None:
    """Past the checkpoint, a master value above the stall value ends column
    generation (`stalled`); the heuristics then do not run and the search gets their
    time. The stall value is the higher of STALL_RATIO x the LP relaxation's bound and
    LAGRANGIAN_RATIO x the Lagrangian bound so far (+ 1), or a roster's penalty if lower
    (no converged master can lie above a roster's penalty)."""
    assert Checkpoint(0.0).limit(None) == max(STALL_RATIO, 1.0)  # no bound yet: 1.2
    assert Checkpoint(0.0, lp_bound=100).limit(None) == 100 * STALL_RATIO
    # a rising Lagrangian bound keeps a master that is converging from below (Curtois-Qu
    # 9 at 0.3 of its share: LP 39, Lagrangian 359, master 408; it converges at 406)
    assert Checkpoint(0.0, lp_bound=39).limit(Fraction(359)) == 2 * 359 + 1
    assert not Checkpoint(0.0, lp_bound=39).far(0.0, 408.3, Fraction(359))
    # the clinic demo at the same point: master 758 against LP 496, Lagrangian bound 0
    assert Checkpoint(0.0, lp_bound=496).far(0.0, 758.4, Fraction(0))
    assert not Checkpoint(0.0, lp_bound=496).far(0.0, 590.0, Fraction(0))
    assert Checkpoint(0.0, lp_bound=300).limit(Fraction(100)) == 300 * STALL_RATIO
    assert Checkpoint(0.0, lp_bound=100).limit(Fraction(300)) == LAGRANGIAN_RATIO * 300 + 1
    assert Checkpoint(0.0, lp_bound=100, roster=110).limit(None) == 110
    assert Checkpoint(0.0, roster=7).limit(Fraction(50)) == 7
    assert not Checkpoint(10.0, roster=7).far(9.9, 1000.0, None)  # not yet its time
    assert Checkpoint(10.0, roster=7).far(10.0, 7.5, None)
    assert not Checkpoint(10.0, lp_bound=100).far(10.0, 100 * STALL_RATIO, None)
    ws = load_workspace(FIXTURES / "good")
    ws.roster = None
    full = decompose(ws, deadline=time.monotonic() + 30, workers=1)
    assert full.converged and full.master_value is not None and full.master_value > 5
    stalled = decompose(ws, deadline=time.monotonic() + 30, workers=1,
                        give_up=Checkpoint(time.monotonic(), roster=2))
    assert stalled.stalled and not stalled.converged and stalled.iterations == 1
    kept = decompose(ws, deadline=time.monotonic() + 30, workers=1,
                     give_up=Checkpoint(time.monotonic(), lp_bound=10**6))
    assert not kept.stalled and kept.converged  # within the ratio of the other bound

    from rostertui.core.solver import run
    calls: list[int] = []
    real = run.decompose
    monkeypatch.setattr(run, "decompose", lambda *a, **k: real(
        *a, **{**k, "give_up": Checkpoint(time.monotonic(), roster=2)}))
    monkeypatch.setattr(run, "improve", lambda *a, **k: calls.append(1))
    out = solve(ws, SolveOptions(time_limit=10, workers=2))
    assert out.decomposition is not None and out.decomposition.stalled
    assert calls == [] and out.roster is not None and out.check is not None


def test_a_person_whose_first_row_is_slow_is_priced_again(
        monkeypatch: pytest.MonkeyPatch) -> None:
    """The first pricing round may end before a person's model finds any row (on 84
    days it took longer than a round's 5 s); that person is priced again with more
    time instead of column generation giving up with no bound."""
    from rostertui.core.solver.decompose import pricing
    from rostertui.core.solver.decompose.pricing import Priced

    ws = load_workspace(FIXTURES / "good")
    real = pricing.PersonModel.price
    seen: list[float] = []

    def slow_first(self, duals, balance, scale, time_limit, hint=None, seed=0):  # noqa: ANN001, ANN202
        if self.pid == ws.person_ids[0] and not seen:
            seen.append(time_limit)
            return Priced(self.trivial(duals, balance, scale), [], False, True)
        return real(self, duals, balance, scale, time_limit, hint, seed)

    monkeypatch.setattr(pricing.PersonModel, "price", slow_first)
    dw = decompose(ws, deadline=time.monotonic() + 30, workers=1)
    assert seen and dw.columns and dw.converged
    assert any(c.person == 0 for c in dw.columns)
