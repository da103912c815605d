"""Column generation over the people, with the Lagrangian bound at every iteration.

Each iteration solves the restricted master (master.py), rounds its cover duals to
multiples of 1/SCALE, prices every person with those rounded duals (pricing.py, in
parallel threads: CP-SAT releases the interpreter while it searches), and adds every
row found with a negative reduced cost as a column. With the same rounded duals pi,

    L(pi) = sum over cover rows of row.term(pi)  +  sum over people of lower_p

is a lower bound on the penalty of every roster that keeps the hard rules, whatever
pi is and however early pricing stopped (lower_p is CP-SAT's proven bound of the
person's pricing problem); it is computed exactly, in fractions. At convergence it
equals the master LP's optimum (Lagrangian duality; Geoffrion 1974, "Lagrangean
relaxation for integer programming", Math. Programming Study 2), the bound of
Dantzig-Wolfe decomposition. The best L over the iterations is kept, and rounded up,
since every penalty is an integer. `balance` couples people as cover does; see below.

Dual smoothing (Wentges 1997, "Weighted Dantzig-Wolfe decomposition for linear
mixed-integer programming", Int. Trans. Oper. Res. 4) prices at a point between the
duals of the best bound so far and the master's; when that finds no column, the
master's own duals are priced before concluding (so convergence is exact).
"""

from __future__ import annotations

import math
import threading
import time
from collections.abc import Callable
from concurrent.futures import ThreadPoolExecutor
from dataclasses import dataclass, field
from fractions import Fraction

from ortools.sat.python import cp_model

from rostertui.core.models.common import OFF
from rostertui.core.models.rules import Balance
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.decompose.master import BalanceRow, Column, Duals, Master
from rostertui.core.solver.decompose.pricing import PersonModel, Priced, Row
from rostertui.core.solver.decompose.rows import CoverRow, cover_rows

SCALE = 1000  # duals are priced as multiples of 1/SCALE penalty
SMOOTHING = 0.5  # weight of the best bound's duals in the priced point
PRICE_CAP = 5.0  # seconds one person's pricing may take in one iteration
# `give_up`: at its checkpoint (run.STALL_AT, 0.3 of its time), a restricted master
# still above both STALL_RATIO x the LP relaxation's bound (at least 1) and
# LAGRANGIAN_RATIO x the Lagrangian bound so far (+ 1) is far from converging: near
# convergence the master nears the LP bound from above where that is strong and the
# Lagrangian bound rises to meet it where it is weak. From the iterations of column
# generation alone, 2 workers, seed 0, on the 60 s solves' 17 s shares (BENCHMARKS.md):
# 0.3 of the way in (about 5 s), Curtois-Qu 8 stood at 1.11 x its LP bound, with a
# Lagrangian bound of 923 against a master of 1372, and 9 at 408 against a Lagrangian
# bound of 359 (its LP bound, 39, is weak); both converge, at 11 and 8 s. The clinic and
# depot demos stood at 1.53 and 1.61 x their LP bounds with Lagrangian bounds of 0: they
# do not converge within their shares, and halfway the clinic stood at 1.22 x, so near
# the old ratio that it sometimes ran its whole share and the heuristics theirs, from
# an unconverged master, 24 s of a 60 s solve for a bound below the LP's. Values of
# ours, chosen from those runs, not from a source.
STALL_RATIO = 1.2
LAGRANGIAN_RATIO = 2.0


@dataclass(frozen=True)
class Checkpoint:
    """Column generation's checkpoint (`decompose(give_up=...)`): from time `at`
    (time.monotonic()) on, a master judged `far` from converging ends it."""

    at: float
    lp_bound: int | None = None  # the LP relaxation's bound, when solved
    roster: int | None = None  # the penalty of a roster already found

    def limit(self, lagrangian: Fraction | None) -> float:
        """The higher of STALL_RATIO x the LP relaxation's bound (at least 1) and
        LAGRANGIAN_RATIO x the Lagrangian bound so far + 1, or a roster's penalty (a
        converged master relaxes every roster, so it lies no higher), whichever is
        lower."""
        lp = STALL_RATIO * max(1.0, float(self.lp_bound or 0))
        lagrange = LAGRANGIAN_RATIO * max(0.0, float(lagrangian or 0)) + 1.0
        value = max(lp, lagrange)
        return value if self.roster is None else min(value, float(self.roster))

    def far(self, now: float, master: float, lagrangian: Fraction | None) -> bool:
        return now >= self.at and master > self.limit(lagrangian)


@dataclass(frozen=True)
class DecompositionProgress:
    elapsed: float
    iteration: int
    bound: int | None  # best Lagrangian bound so far, rounded up
    master: float | None  # the restricted master's optimum (an upper end for the bound)
    columns: int


@dataclass
class Decomposition:
    bound: int | None = None  # proven: no roster keeping the hard rules has less penalty
    lagrangian: Fraction | None = None  # the best bound before rounding up
    master_value: float | None = None
    # how much of its artificial variables the last master solution used: above 0, the
    # generated rows cannot meet every hard cover minimum even fractionally
    artificial: float = 0.0
    converged: bool = False
    stalled: bool = False  # given up at the checkpoint, far from converging (`give_up`)
    infeasible: bool = False  # proven: no roster keeps the hard rules
    iterations: int = 0
    seconds: float = 0.0
    columns: list[Column] = field(default_factory=list)
    weights: list[float] = field(default_factory=list)  # each column's weight in the master
    # rows pricing found that did not price out (never in the master): more rows for the
    # integer master over the pool (primal/pool.py) to fit together
    spare: list[Column] = field(default_factory=list)
    cover: list[CoverRow] = field(default_factory=list)  # the master's cover rows
    balances: list[BalanceRow] = field(default_factory=list)  # and its balance rows
    history: list[DecompositionProgress] = field(default_factory=list)
    # the last restricted master's duals (cover rows as in `cover`): at convergence,
    # the marginal value of one more person on each cover row (core/staffing/pressure.py)
    duals: Duals | None = None

    def heaviest(self) -> dict[int, tuple[str, ...]]:
        """Per person (index), the row the master LP weighs most (a start for the search)."""
        best: dict[int, tuple[float, tuple[str, ...]]] = {}
        for column, weight in zip(self.columns, self.weights, strict=False):
            if column.person not in best or weight > best[column.person][0]:
                best[column.person] = (weight, column.codes)
        return {p: codes for p, (_, codes) in best.items()}


class _Run:
    def __init__(self, ws: Workspace, cells: Cells, rows: list[CoverRow], workers: int,
                 seed: int):
        self.ws, self.cells, self.rows = ws, cells, rows
        self.workers = max(1, workers)
        self.seed = seed
        self.people = cells.people
        self.row_of: dict[tuple[int, int, str], list[int]] = {}
        for i, row in enumerate(rows):
            for p in row.holders:
                self.row_of.setdefault((p, row.day, row.code), []).append(i)
        self.balances = [e for e in ws.rules if isinstance(e.rule, Balance)
                         and e.rule.weight and len(e.people) >= 2]
        self.models: list[PersonModel] = []
        self.hints: list[tuple[str, ...] | None] = [None] * len(self.people)
        weights = [r.under for r in rows] + [r.over for r in rows] + [1]
        weights += [e.rule.weight for e in ws.rules if e.rule.weight is not None]
        weights += [r.weight for r in ws.requests.request]
        self.big = 10.0 * max(weights)
        self.balance_rows: list[BalanceRow] = []
        self.spare: dict[tuple[int, tuple[str, ...]], Column] = {}

    def build(self, deadline: float, cancel: threading.Event | None) -> bool:
        for pid in self.people:
            if time.monotonic() > deadline or (cancel is not None and cancel.is_set()):
                return False
            self.models.append(PersonModel(self.ws, pid, self.balances))
        for k, eff in enumerate(self.balances):
            found = [(p, m) for p, pm in enumerate(self.models) for m in pm.metrics
                     if m.rule == k]
            self.balance_rows.append(BalanceRow(
                eff.rule.weight or 0, tuple(p for p, _ in found),
                min(m.lo for _, m in found), max(m.hi for _, m in found)))
        return True

    def price(self, point: Point, limit: float,
              stop: Callable[[], bool] = lambda: False,
              only: list[int] | None = None) -> list[Priced]:
        """Price everyone (or the people `only`) at `point`; once `stop()` holds
        (cancel, deadline), the rest get the bound that needs no search, so the
        round's bound stays valid."""
        cover: list[dict[tuple[int, str], int]] = [{} for _ in self.people]
        for (p, d, code), found in self.row_of.items():
            value = sum(point.cover[i] for i in found)
            if value:
                cover[p][d, code] = int(value * SCALE)
        balance: list[dict[int, int]] = [{} for _ in self.people]
        for (k, p), up in point.upper.items():
            delta = up - point.lower[k, p]
            if delta:
                balance[p][k] = int(delta * SCALE)

        def one(p: int) -> Priced:
            pm = self.models[p]
            if stop():
                return Priced(pm.trivial(cover[p], balance[p], SCALE), [], False, True)
            return pm.price(cover[p], balance[p], SCALE, limit, self.hints[p], self.seed)

        people = list(range(len(self.people))) if only is None else only
        if self.workers == 1:
            return [one(p) for p in people]
        with ThreadPoolExecutor(self.workers, thread_name_prefix="rostertui-price") as pool:
            return list(pool.map(one, people))

    def bound(self, point: Point, priced: list[Priced]) -> Fraction:
        """L at `point`: exact, and valid for any point with nonnegative balance duals."""
        value = sum((row.term(point.cover[i]) for i, row in enumerate(self.rows)), Fraction(0))
        for k, bal in enumerate(self.balance_rows):
            up = bal.weight - sum(point.upper[k, p] for p in bal.people)
            down = sum(point.lower[k, p] for p in bal.people) - bal.weight
            value += min(up * bal.lo, up * bal.hi) + min(down * bal.lo, down * bal.hi)
        return value + sum((x.lower for x in priced), Fraction(0))

    def column(self, p: int, row: Row) -> Column:
        covered: list[int] = []
        for d, code in enumerate(row.codes):
            if code != OFF:
                covered += self.row_of.get((p, d, code), [])
        metrics = tuple((m.rule, v) for m, v in zip(self.models[p].metrics, row.metrics,
                                                    strict=True))
        return Column(p, row.codes, row.cost, tuple(covered), metrics)


@dataclass(frozen=True)
class Point:
    """Multipliers, each a multiple of 1/SCALE: cover rows, and the two balance rows per
    rule and person (nonnegative: they price inequalities)."""

    cover: list[Fraction]
    upper: dict[tuple[int, int], Fraction]
    lower: dict[tuple[int, int], Fraction]

    @staticmethod
    def of(duals: Duals) -> Point:
        return Point([_grid(v) for v in duals.cover],
                     {k: max(Fraction(0), _grid(v)) for k, v in duals.upper.items()},
                     {k: max(Fraction(0), _grid(v)) for k, v in duals.lower.items()})

    def toward(self, other: Point, weight: float) -> Point:
        """weight x self + (1 - weight) x other, back on the grid."""
        def mix(a: Fraction, b: Fraction) -> Fraction:
            return _grid(weight * float(a) + (1 - weight) * float(b))
        return Point([mix(a, b) for a, b in zip(self.cover, other.cover, strict=True)],
                     {k: max(Fraction(0), mix(v, other.upper[k])) for k, v in self.upper.items()},
                     {k: max(Fraction(0), mix(v, other.lower[k])) for k, v in self.lower.items()})


def _grid(value: float) -> Fraction:
    return Fraction(round(value * SCALE), SCALE)


def decompose(
    ws: Workspace,
    cells: Cells | None = None,
    *,
    deadline: float,
    workers: int = 1,
    seed: int = 0,
    on_progress: Callable[[DecompositionProgress], None] | None = None,
    cancel: threading.Event | None = None,
    target: int | None = None,
    give_up: Checkpoint | None = None,
) -> Decomposition:
    """Column generation until convergence, `deadline` (time.monotonic()), `cancel`, or
    a bound of `target` (a roster of that penalty is then proven optimal). With
    `give_up`: at the first iteration past its time, a master still far from
    converging ends it (`stalled`; see `Checkpoint`)."""
    started = time.monotonic()
    out = Decomposition()
    if cells is None:
        cells = Cells(ws, cp_model.CpModel())
    rows = cover_rows(cells)
    if rows is None or cells.lock_conflicts:
        out.infeasible = True
        return out
    run = _Run(ws, cells, rows, workers, seed)
    if not run.build(deadline, cancel):
        out.seconds = time.monotonic() - started
        return out
    master = Master(len(run.people), rows, run.balance_rows, run.big)

    def stopped() -> bool:
        return time.monotonic() >= deadline or (cancel is not None and cancel.is_set())

    def report(master_value: float | None) -> None:
        progress = DecompositionProgress(time.monotonic() - started, out.iterations, out.bound,
                                         master_value, len(master.columns))
        out.history.append(progress)
        if on_progress is not None:
            on_progress(progress)

    def limit() -> float:
        rounds = math.ceil(len(run.people) / run.workers)
        return max(0.05, min(PRICE_CAP, (deadline - time.monotonic()) / max(1, rounds)))

    best: Point | None = None

    def record(point: Point, priced: list[Priced]) -> None:
        nonlocal best
        value = run.bound(point, priced)
        if out.lagrangian is None or value > out.lagrangian:
            out.lagrangian, out.bound, best = value, max(0, math.ceil(value)), point

    def add_columns(priced: list[Priced], duals: Duals | None) -> int:
        added = 0
        for p, x in enumerate(priced):
            for row in x.rows:
                column = run.column(p, row)
                if duals is None or _reduced(column, duals) < -1e-6 * max(
                        1.0, abs(duals.convexity[p])):
                    added += master.add(column)
                else:
                    run.spare.setdefault((p, row.codes), column)
            if x.rows:
                run.hints[p] = x.rows[-1].codes
        return added

    zero = Point([Fraction(0)] * len(rows), dict.fromkeys(master.upper, Fraction(0)),
                 dict.fromkeys(master.lower, Fraction(0)))
    priced = run.price(zero, limit(), stopped)
    cap = PRICE_CAP
    while not stopped() and all(x.feasible for x in priced):
        # someone's first row takes longer than a round gives (Curtois-Qu 18, 84 days):
        # price them alone again, with twice the time each try, until the deadline
        missing = [p for p, x in enumerate(priced) if not x.rows and not x.optimal]
        if not missing:
            break
        cap *= 2
        again = run.price(zero, max(0.05, min(cap, deadline - time.monotonic())), stopped,
                          missing)
        for p, x in zip(missing, again, strict=True):
            priced[p] = x if x.lower >= priced[p].lower or not x.feasible else \
                Priced(priced[p].lower, x.rows, x.optimal, x.feasible)
    if any(not x.feasible for x in priced):
        out.infeasible = True
        out.seconds = time.monotonic() - started
        return out
    record(zero, priced)
    add_columns(priced, None)
    if any(not x.rows for x in priced):  # a person with no row found in time
        out.seconds = time.monotonic() - started
        return out
    report(None)
    while not stopped():
        duals = master.solve()
        if duals is None:
            break
        out.iterations += 1
        out.duals = duals
        out.master_value = duals.value
        out.artificial = duals.artificial
        exact = Point.of(duals)
        added = 0
        all_optimal = True
        for point in ([best.toward(exact, SMOOTHING)] if best is not None else []) + [exact]:
            priced = run.price(point, limit(), stopped)
            if any(not x.feasible for x in priced):
                out.infeasible = True
                break
            record(point, priced)
            all_optimal = all(x.optimal for x in priced)
            added = add_columns(priced, duals)
            if added or stopped():
                break
        report(duals.value)
        if out.infeasible:
            break
        if give_up is not None and give_up.far(time.monotonic(), duals.value, out.lagrangian):
            out.stalled = True
            break
        if target is not None and out.bound is not None and out.bound >= target:
            break
        top = math.ceil(duals.value - 1e-7 * max(1.0, abs(duals.value)))
        if duals.artificial <= 1e-7 and out.bound is not None and out.bound >= top:
            out.converged = True  # the bound cannot rise above the master's value
            break
        if added == 0 and all_optimal:
            if duals.artificial > 1e-7 and run.big < 1e9:
                run.big *= 10.0  # the artificial cost capped the duals: lift it
                master.set_big(run.big)
                continue
            out.converged = True
            break
    out.columns = master.columns
    out.weights = master.weights()
    out.spare = [c for key, c in run.spare.items() if not master.has(key)]
    out.cover, out.balances = rows, run.balance_rows
    out.seconds = time.monotonic() - started
    return out


def _reduced(column: Column, duals: Duals) -> float:
    """The column's reduced cost at the master's own duals."""
    p = column.person
    value = column.cost - sum(duals.cover[i] for i in column.rows)
    for k, m in column.metrics:
        value += (duals.upper[k, p] - duals.lower[k, p]) * float(m)
    return value - duals.convexity[p]
