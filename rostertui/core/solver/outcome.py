"""What a solve takes and gives: its options, its progress as it goes, its outcome,
and the error the referee raises (run.py)."""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field

from rostertui.core.check import CheckResult
from rostertui.core.errors import RosterError
from rostertui.core.models.roster import Roster, SolveStatus
from rostertui.core.solver.decompose import Decomposition

# The default limit of a solve: the command line's --time-limit default (cli/args.py),
# so a caller of the library gets what `rostertui solve` does.
DEFAULT_TIME_LIMIT = 60.0


class RefereeError(RosterError):
    """The checker disagrees with the solver about a roster: a bug in one of them."""


@dataclass(frozen=True)
class SolveOptions:
    time_limit: float = DEFAULT_TIME_LIMIT
    workers: int = 0  # 0 = every core
    seed: int = 0
    warm_start: bool = True  # hint the search with the workspace's current roster
    lp_bound: bool = True  # a bound from the LP relaxation (GLOP), solved before the search
    lp_share: float = 0.2  # at most this share of the time left (after build and hint) for the LP
    decompose: bool = True  # a bound by column generation (decompose/), before the search
    decompose_share: float = 0.3  # at most this share of the time left for it
    # the primal heuristics from the decomposition (primal/), after it and before the
    # CP-SAT search: this share of the time then left, the integer master over the pool
    # taking `pool_share` of that, RINS the rest
    primal: bool = True
    floor: bool = True  # the proven bound as the objective's lower end in the search
    primal_share: float = 0.5
    pool_share: float = 0.3
    # without a converged master (no heuristics from it), large neighbourhood search
    # (primal/lns.py) from the best roster so far, for this share of the time left,
    # before the CP-SAT search
    lns_share: float = 0.7
    log: bool = False
    # time.monotonic() by which the whole solve should be over (build, hint, LP, search,
    # polish, referee); None: time_limit from the call. A caller passes its own start +
    # time_limit so that its loading counts too.
    deadline: float | None = None


@dataclass(frozen=True)
class SolveProgress:
    elapsed: float
    penalty: int | None  # best roster found so far (None before the first)
    bound: int  # proven lower bound on the penalty
    changes: int | None = None  # repair: cells the best roster changes
    stage: str = "search"  # or "bound": column generation is proving the bound
    found_by: str | None = None  # the method that found the best roster so far


@dataclass
class SolveOutcome:
    status: SolveStatus
    roster: Roster | None
    objective: int | None
    bound: int | None
    seconds: float
    seed: int
    check: CheckResult | None = None
    build_seconds: float = 0.0
    first_seconds: float | None = None  # time to the first roster
    best_seconds: float | None = None  # time to the best roster
    history: list[SolveProgress] = field(default_factory=list)
    changes: int | None = None  # repair: cells changed from the reference roster
    wall_seconds: float = 0.0  # the whole solve(): build, hint, LP, search, polish, referee
    phases: dict[str, float] = field(default_factory=dict)  # seconds each phase took
    bounds: dict[str, int] = field(default_factory=dict)  # each method's proven bound
    decomposition: Decomposition | None = None  # the column generation's result
    # every better roster on the way: (seconds into the search, penalty, method)
    improvements: list[tuple[float, int, str]] = field(default_factory=list)
    found_by: str | None = None  # the method that found the roster returned

    @property
    def gap(self) -> float | None:
        if self.objective is None or self.bound is None:
            return None
        if self.objective == 0:
            return 0.0
        return max(0.0, (self.objective - self.bound) / abs(self.objective))


ProgressCallback = Callable[[SolveProgress], None]
