"""Run the solver: time limit, workers, seed, warm start, live progress, cancel.

The time limit is for the whole solve, the build included: one deadline (measured
from the call, or `SolveOptions.deadline` from the caller, who may count its own
loading), and each phase gets only what remains of it. The build takes what it
takes (`model.estimate_build` says beforehand how long); the warm start's completion
gets a bounded share, the LP relaxation its share and only when it can be built in
that share; with no roster yet, CP-SAT's first roster (primal/first.py) a small
share, so one shows within seconds; the column-generation bound (decompose/) its
share, the primal heuristics (primal/) theirs, CP-SAT the rest
(never less than `MIN_SEARCH`), less what is kept back for polishing and refereeing
the roster it returns. The bounds come before the search, not beside it: on 2 cores
a bound thread next to the CP-SAT workers costs the search more than it gives; and
with a proven bound the search stops as soon as it finds a roster that meets it.

The roster CP-SAT returns is then judged by the independent checker (the
referee): its penalty must equal the solver's objective and it must find no
hard violation; no bound may lie above it. A mismatch raises RefereeError: a bug,
never rounded away.
"""

from __future__ import annotations

import os
import threading
import time
from dataclasses import dataclass
from datetime import date, timedelta

from ortools.sat.python import cp_model

from rostertui.core.check import CheckResult, check_roster
from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster, SolveRecord, SolveStatus
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.decompose import Decomposition, DecompositionProgress, decompose
from rostertui.core.solver.decompose.loop import Checkpoint
from rostertui.core.solver.fixing import evaluate, fixed_copy, hint_solution, values_of
from rostertui.core.solver.keep import Keep
from rostertui.core.solver.lp_bound import Relaxation
from rostertui.core.solver.model import BuiltModel, build_model
from rostertui.core.solver.outcome import (
    ProgressCallback,
    RefereeError,
    SolveOptions,
    SolveOutcome,
)
from rostertui.core.solver.primal import Incumbent, improve, lns
from rostertui.core.solver.primal.first import first_roster
from rostertui.core.solver.primal.portfolio import EVALUATE_CAP, FIRST, LNS
from rostertui.core.solver.recorder import Recorder, watch_cancel

WARM_START = "warm start"  # the workspace's own roster

# -- the time budget --------------------------------------------------------------------
MIN_SEARCH = 1.0  # CP-SAT's least time (or the whole limit, if shorter): a small unit's
#                   first roster takes well under a second
STALL_AT = 0.3  # column generation's checkpoint, as a share of its time (loop.Checkpoint)
FIRST_SHARE = 0.1  # at most this share of the time left for a first roster before the bound
LNS_FIRST = 0.3  # ...and of neighbourhood search's, when there was none by then
HINT_SHARE = 0.2  # the warm start's completion: at most this share of the time left...
# ...and never more than this, however long the limit: the completion is propagation,
# 2.9 s on 2014 people x 28 days (BENCHMARKS.md); one not done in three times that
# is not near done, and the search makes better use of the time.
HINT_CAP = 10.0
# The completion is tried only with this much to spare beyond cloning and CP-SAT's
# overhead (else it would be stopped before it started); without, only the roster's
# cells are hinted.
HINT_MIN = 0.1
# Polish is kept back from the search (FINISH_PER_CONSTRAINT), not given a share, so
# its limit is only a guard against a solve that never ends: polishing a fixed roster
# takes 1.1 s at 2014 people; 60 s is over 50 times that, and running out raises
# RefereeError instead of hanging.
POLISH_CAP = 60.0
# Costs that grow with the built model, in seconds per constraint of its proto,
# measured by `bench/bench_limit.py --phases` on 2014 people x 28 days (1.02 M
# constraints, 0.50 M variables) on the development machine (x86_64, 2 cores,
# Python 3.11, OR-Tools 9.15):
FIX_PER_CONSTRAINT = 1.0e-6  # clone the model and fix every cell (hint, polish): 1.0 s
# Relaxation(model) reads every constraint in Python: 26-29 s there; 28-31 us a
# constraint on the clinic's rules from 100 to 2014 people, 38-41 on Curtois-Qu 12, 20.
LP_BUILD_PER_CONSTRAINT = 35e-6
# CP-SAT's own time beyond its limit (copying and loading the model before its clock
# starts, stopping after): 1.0 s there (2.98 s for a 2 s limit).
SEARCH_OVERHEAD_PER_CONSTRAINT = 1.0e-6
# After the search: polish 1.05 s, the referee's check 0.1-0.24 s, the CLI's save
# 0.2 s; kept back from CP-SAT's time, with a third to spare.
FINISH_PER_CONSTRAINT = 2.0e-6


def roster_from(built: BuiltModel, values: dict[tuple[int, int, str], int]) -> Roster:
    cells = built.cells
    rows = {pid: [OFF] * cells.n for pid in cells.people}
    for (p, d, code), v in values.items():
        if v:
            rows[cells.people[p]][d] = code
    locks = list(cells.ws.roster.lock) if cells.ws.roster is not None else []
    return Roster(start=cells.start, days=cells.n, rows=rows, lock=locks)


def _hint(built: BuiltModel, budget: float) -> Incumbent | None:
    """Warm start from the workspace's current roster, within `budget` seconds.

    The roster's cells alone leave CP-SAT to complete every auxiliary variable, which
    it often fails to do in time; so the roster is first fixed and solved (a matter
    of propagation), and the complete assignment becomes the hint, and the roster the
    first incumbent (returned). A roster that breaks a hard rule cannot be completed,
    and with too little time it is not tried: then its cells are hinted as they are.
    """
    roster = built.cells.ws.roster
    if roster is None:
        return None
    started = time.monotonic()
    cells = built.cells
    values = values_of(built, {p: roster.rows.get(pid, ()) for p, pid in enumerate(cells.people)})
    size = len(built.model.proto.constraints)
    if budget > FIX_PER_CONSTRAINT * size + SEARCH_OVERHEAD_PER_CONSTRAINT * size + HINT_MIN:
        exact = evaluate(built, values, min(HINT_CAP, budget - (time.monotonic() - started)
                                            - SEARCH_OVERHEAD_PER_CONSTRAINT * size))
        if exact is not None:
            hint_solution(built.model, exact[1])
            return Incumbent(values, exact[0], exact[1])
    hint = built.model.proto.solution_hint
    hint.vars.extend(var.index for var in cells.x.values())
    hint.values.extend(values[key] for key in cells.x)
    return None


def solve(
    ws: Workspace,
    options: SolveOptions | None = None,
    on_progress: ProgressCallback | None = None,
    cancel: threading.Event | None = None,
    keep: Keep | None = None,
) -> SolveOutcome:
    """Build and solve; the returned roster is refereed by the checker.

    With `keep` (repair), each cell changed from `keep.rows` costs `keep.weight` on
    top of the penalty and the first `keep.frozen` days stay as they are. The
    outcome's objective and bound are still the rules.md penalty: the bound is then
    proven for rosters changing no more cells than the one returned.

    The steps, in order: build, hint (the warm start), first roster, LP bound,
    decomposition bound and primal heuristics, search parameters, search, polish,
    referee; each takes what remains of one deadline (module docstring).
    """
    run = _build(ws, options or SolveOptions(), keep, cancel)
    incumbent = _warm_start(run)
    recorder = Recorder(run.built, time.monotonic(), on_progress, cancel)
    if incumbent is not None and keep is None:
        recorder.offer(incumbent.values, incumbent.objective, WARM_START)
    if run.options.decompose and keep is None and incumbent is None:
        _first_roster(run, recorder)
    if run.options.lp_bound and keep is None:
        _lp_bound(run, recorder)
    decomposition, floor = None, None
    if run.options.decompose and keep is None:
        decomposition, floor = _decompose_and_improve(run, recorder, incumbent)
    solver = _parameters(run, recorder)
    code, searched = _search(run, solver, recorder, floor)
    cp_bound = round(solver.best_objective_bound) if searched else 0
    outcome = _outcome(run, recorder, code, searched, cp_bound, decomposition)
    if recorder.best is None:
        if outcome.status in ("optimal", "feasible"):
            outcome.status = "unknown"
        outcome.wall_seconds = time.monotonic() - run.t0
        return outcome
    _polish_and_referee(run, recorder, outcome, cp_bound)
    outcome.wall_seconds = time.monotonic() - run.t0
    return outcome


@dataclass
class _Run:
    """One call of `solve`: what every step reads, and the seconds each phase took."""

    ws: Workspace
    options: SolveOptions
    keep: Keep | None
    cancel: threading.Event | None
    t0: float  # when solve() was called
    deadline: float  # time.monotonic() by which everything should be over
    workers: int
    built: BuiltModel
    size: int  # constraints of the built model's proto
    phases: dict[str, float]

    @property
    def finish(self) -> float:
        """Seconds kept back for polish and referee."""
        return FINISH_PER_CONSTRAINT * self.size

    def left(self) -> float:
        return self.deadline - time.monotonic() - self.finish


def _build(ws: Workspace, options: SolveOptions, keep: Keep | None,
           cancel: threading.Event | None) -> _Run:
    """Step 1: the model (build_model), the deadline started before it."""
    t0 = time.monotonic()
    deadline = options.deadline if options.deadline is not None else t0 + options.time_limit
    built = build_model(ws, keep)
    phases = {"build": time.monotonic() - t0}
    return _Run(ws, options, keep, cancel, t0, deadline, options.workers or os.cpu_count() or 1,
                built, len(built.model.proto.constraints), phases)


def _warm_start(run: _Run) -> Incumbent | None:
    """Step 2: the search hinted with the workspace's roster (`_hint`), when asked."""
    if not run.options.warm_start:
        return None
    t = time.monotonic()
    incumbent = _hint(run.built, HINT_SHARE * run.left())
    run.phases["hint"] = time.monotonic() - t
    return incumbent


def _first_roster(run: _Run, recorder: Recorder) -> None:
    """Step 3, with no roster to start from: a roster within seconds, however long the
    bounds take (the LP of a 100-person unit may use its whole share), kept as the
    best so far; neither a hint for the search nor a start for RINS (see
    `_decompose_and_improve` and primal/portfolio.py)."""
    recorder.report(0.0)  # something to show while the first roster is found
    t = time.monotonic()
    first = first_roster(run.built, t + FIRST_SHARE * run.left(), run.workers,
                         run.options.seed, run.cancel)
    if first is not None:
        recorder.offer(first.values, first.objective, FIRST)
    run.phases["first"] = time.monotonic() - t


def _lp_bound(run: _Run, recorder: Recorder) -> None:
    """Step 4: the LP relaxation's bound, within its share, if it can be built in it.

    Before the search, not beside it: a GLOP thread next to the CP-SAT workers cost
    5-8 % of penalty on Curtois-Qu 10 and 12 at 60 s on 2 cores (seeds 1 and 2:
    5051/5055 against 4843/4769 without, 4859/4762 with the LP first), while the LP
    itself takes 0.1-1.5 s there (10.5 s on instance 12).
    """
    recorder.report(0.0)  # something to show while the LP is solved
    t = time.monotonic()
    share = run.options.lp_share * run.left()
    if LP_BUILD_PER_CONSTRAINT * run.size < share:  # else building the LP alone overruns
        relaxation = Relaxation(run.built.model)
        rest = share - (time.monotonic() - t)
        if rest > 0:
            recorder.lp_bound = relaxation.solve(rest)
    run.phases["lp"] = time.monotonic() - t
    recorder.report(time.monotonic() - recorder.started)


def _decompose_and_improve(run: _Run, recorder: Recorder, incumbent: Incumbent | None
                           ) -> tuple[Decomposition, cp_model.Constraint | None]:
    """Step 5: the column-generation bound, the primal heuristics from it, the search's
    hint, and the proven bound as the objective's floor (returned, to be lifted after
    the search)."""
    built, options = run.built, run.options
    decomposition = _decompose(run.ws, built, options, recorder, run.left(), run.cancel)
    run.phases["decompose"] = decomposition.seconds
    # with no roster to start from, the converged master's rows are a good start
    # (Curtois-Qu 5-9: 1146/1954/1074/1500/462 against 1240/2140/1174/1729/562
    # without, BENCHMARKS.md); an unconverged master's are not (the clinic demo:
    # 768 against 652 at 60 s)
    improved = options.primal and bool(decomposition.columns) and not decomposition.stalled
    if improved:
        t = time.monotonic()
        recorder.stage = "improve"
        incumbent = improve(
            built, decomposition, incumbent,
            deadline=t + max(0.0, options.primal_share * run.left()),
            pool_share=options.pool_share, workers=run.workers,
            seed=options.seed, offer=recorder.offer, stop=recorder.should_stop,
            cancel=run.cancel)
        recorder.stage = "search"
        run.phases["improve"] = time.monotonic() - t
    if options.primal and options.lns_share > 0 and (not improved or incumbent is None):
        incumbent = _neighbourhoods(run, recorder, incumbent)  # nothing from a master
    # CP-SAT's first roster as it is is kept (the recorder holds it) but not hinted:
    # the search hinted with it did worse on the depot demo (438, 401 against 387 at
    # 60 s, seeds 0-1) than from scratch; neighbourhood search's roster from it is
    if incumbent is not None:
        hint_solution(built.model, incumbent.solution)
    elif decomposition.converged and not built.model.proto.solution_hint.vars:
        built.cells.hint_rows(decomposition.heaviest())
    floor = None
    if recorder.proven is not None and options.floor:  # need not prove the proven
        floor = built.model.add(built.builder.objective() >= recorder.proven)
    return decomposition, floor


def _neighbourhoods(run: _Run, recorder: Recorder, incumbent: Incumbent | None
                    ) -> Incumbent | None:
    """Large neighbourhood search (primal/lns.py) from the best roster so far, for its
    share of the time left. Returns the best roster it ends with (or `incumbent`)."""
    built = run.built
    budget = max(0.0, run.options.lns_share * run.left())
    t = time.monotonic()
    if recorder.best is None:  # the first roster's share was too short: more of it here
        first = first_roster(built, t + LNS_FIRST * budget, run.workers, run.options.seed,
                             run.cancel)
        if first is None:
            return incumbent
        recorder.offer(first.values, first.objective, FIRST)
    if incumbent is None or (recorder.best_objective is not None
                             and recorder.best_objective < incumbent.objective):
        assert recorder.best is not None
        exact = evaluate(built, recorder.best, EVALUATE_CAP)
        if exact is None:
            return incumbent
        incumbent = Incumbent(recorder.best, exact[0], exact[1])
    recorder.stage = "improve"
    try:
        return lns.search(built, incumbent, lns.blind(built), t + budget, run.workers,
                          run.options.seed,
                          lambda values, objective: recorder.offer(values, objective, LNS),
                          recorder.should_stop, run.cancel, lns.blind_round(built))
    finally:
        recorder.stage = "search"
        run.phases["lns"] = time.monotonic() - t


def _parameters(run: _Run, recorder: Recorder) -> cp_model.CpSolver:
    """Step 6: CP-SAT's parameters for the search: what is left of the time (never
    less than MIN_SEARCH), workers, seed."""
    options = run.options
    solver = cp_model.CpSolver()
    solver.parameters.max_time_in_seconds = max(
        min(MIN_SEARCH, options.time_limit),
        run.left() - SEARCH_OVERHEAD_PER_CONSTRAINT * run.size)
    solver.parameters.num_workers = run.workers
    solver.parameters.random_seed = options.seed
    solver.parameters.log_search_progress = options.log
    # A fuller LP in the search. Single 30 s runs on Curtois-Qu 5, 6, 7, 10 looked
    # 1-21 % better with it, but over 3 seeds at 20 s on 5, 9, 10 the medians are
    # within the noise (1249/1246, 481/476, 5277/5167 with/without): no measured gain
    # either way. Kept because BENCHMARKS.md was measured with it.
    solver.parameters.linearization_level = 2
    solver.best_bound_callback = lambda bound: recorder.report(
        time.monotonic() - recorder.started, round(bound))
    return solver


def _search(run: _Run, solver: cp_model.CpSolver, recorder: Recorder,
            floor: cp_model.Constraint | None
            ) -> tuple[cp_model.CpSolverStatus, bool]:
    """Step 7: the CP-SAT search (skipped when a roster already meets the proven
    bound), stopped on cancel; the floor lifted after it. Returns CP-SAT's status and
    whether it searched."""
    searched = not (recorder.best_objective is not None
                    and recorder.should_stop(recorder.best_objective))
    code = cp_model.FEASIBLE
    if searched:
        stop_watch = watch_cancel(solver, run.cancel, recorder)
        try:
            code = solver.solve(run.built.model, recorder)
        finally:
            if stop_watch is not None:
                stop_watch.set()
    if floor is not None:  # lifted: polish scores the roster by the rules alone
        domain = floor.proto.linear.domain
        domain.clear()
        domain.extend([cp_model.INT_MIN, cp_model.INT_MAX])
    return code, searched


STATUS: dict[cp_model.CpSolverStatus, SolveStatus] = {
    cp_model.OPTIMAL: "optimal",
    cp_model.FEASIBLE: "feasible",
    cp_model.INFEASIBLE: "infeasible",
    cp_model.MODEL_INVALID: "unknown",
}


def _outcome(run: _Run, recorder: Recorder, code: cp_model.CpSolverStatus, searched: bool,
             cp_bound: int, decomposition: Decomposition | None) -> SolveOutcome:
    """The outcome of the search, before polish: status, times, each method's bound."""
    seconds = time.monotonic() - recorder.started
    phases = run.phases
    phases["search"] = seconds - sum(phases.get(k, 0.0)
                                     for k in ("first", "lp", "decompose", "improve", "lns"))
    outcome = SolveOutcome(STATUS.get(code, "unknown"), None, None, None, seconds,
                           run.options.seed, build_seconds=phases["build"],
                           history=recorder.history, phases=phases,
                           decomposition=decomposition, improvements=recorder.improvements,
                           found_by=recorder.best_method)
    outcome.bounds = {name: b for name, b in (
        ("cp-sat", max(0, cp_bound) if recorder.best and searched and run.keep is None
         else None),
        ("lp", recorder.lp_bound), ("decomposition", recorder.dw_bound)) if b is not None}
    return outcome


def _polish_and_referee(run: _Run, recorder: Recorder, outcome: SolveOutcome,
                        cp_bound: int) -> None:
    """Steps 8 and 9: the best roster's exact objective (`polish`), every bound checked
    against it, and the checker's verdict (`referee`), into `outcome`."""
    assert recorder.best is not None and recorder.best_objective is not None
    built, keep = run.built, run.keep
    roster = roster_from(built, recorder.best)
    t = time.monotonic()
    total, changes = polish(built, recorder.best)
    run.phases["polish"] = time.monotonic() - t
    bound = max(cp_bound, recorder.proven or 0)
    for name in ("lp", "decomposition"):  # a bound is a promise: never above a roster
        if name in outcome.bounds and total - built.change_cost(changes) < outcome.bounds[name]:
            raise RefereeError(f"the {name} bound {outcome.bounds[name]} lies above the "
                               f"penalty {total} of a roster: the bound is wrong")
    if total <= bound:
        outcome.status = "optimal"
    cost = built.change_cost(changes)
    objective, bound = total - cost, max(0, bound - cost)
    if keep is not None:
        outcome.changes = changes
    roster.solve = SolveRecord(status=outcome.status, objective=objective,
                               bound=min(bound, objective), seconds=round(outcome.seconds, 3),
                               seed=run.options.seed)
    outcome.roster, outcome.objective, outcome.bound = roster, objective, min(bound, objective)
    outcome.first_seconds, outcome.best_seconds = recorder.first_seconds, recorder.best_seconds
    past = run.ws.unit.start + timedelta(days=keep.frozen) if keep is not None else None
    t = time.monotonic()
    outcome.check = referee(run.ws, roster, objective, past_before=past)
    run.phases["referee"] = time.monotonic() - t


def _decompose(ws: Workspace, built: BuiltModel, options: SolveOptions, recorder: Recorder,
               budget: float, cancel: threading.Event | None) -> Decomposition:
    """Column generation for at most its share of the `budget` seconds left, its bound
    shown as it rises."""
    started = time.monotonic()
    recorder.stage = "bound"

    def progress(p: DecompositionProgress) -> None:
        if p.bound is not None and p.bound > (recorder.dw_bound or 0):
            recorder.dw_bound = p.bound
        recorder.report(time.monotonic() - recorder.started)

    try:
        share = max(0.0, options.decompose_share * budget)
        # at its checkpoint, column generation still far from converging gives the rest
        # of its time (and the heuristics' share) back to the search
        give_up = Checkpoint(started + STALL_AT * share, recorder.lp_bound,
                             recorder.best_objective if recorder.best is not None else None)
        return decompose(ws, built.cells, deadline=started + share,
                         workers=options.workers or os.cpu_count() or 1, seed=options.seed,
                         on_progress=progress, cancel=cancel, give_up=give_up)
    finally:
        recorder.stage = "search"
        recorder.report(time.monotonic() - recorder.started)


def polish(built: BuiltModel, values: dict[tuple[int, int, str], int]) -> tuple[int, int]:
    """The exact objective of a found roster under the model: fix every cell, minimise.

    Penalty variables are only bounded from below during the search (logic.py);
    with the roster fixed, the minimum brings each down to its exact value. Returns
    the objective (penalty plus any change cost) and the number of changed cells
    the objective counts (repair; 0 otherwise).
    """
    fixed = fixed_copy(built, values)
    solver = cp_model.CpSolver()
    solver.parameters.num_workers = 1
    solver.parameters.max_time_in_seconds = POLISH_CAP
    if solver.solve(fixed) != cp_model.OPTIMAL:
        raise RefereeError("the solver could not evaluate its own roster exactly")
    changes = sum(solver.boolean_value(lit) for lit in built.changes)
    return round(solver.objective_value), changes


def referee(ws: Workspace, roster: Roster, objective: int | None,
            past_before: date | None = None) -> CheckResult:
    """The checker's verdict on the solver's roster; disagreement is a bug.

    `past_before` (repair): days before it were fixed, so a cover shortfall there is
    the past's, not the solver's.
    """
    result = check_roster(ws, roster)
    wrong = [v for v in result.violations if v.hard and not (
        past_before is not None and v.kind == "cover" and all(d < past_before for d in v.dates))]
    if wrong:
        first = wrong[0]
        raise RefereeError(
            f"the solver returned a roster with {len(wrong)} hard violation(s), "
            f"e.g. {first.rule}: {first.message}")
    if objective is not None and result.penalty != objective:
        raise RefereeError(
            f"the solver's objective {objective} differs from the checker's penalty "
            f"{result.penalty} for the same roster")
    return result
