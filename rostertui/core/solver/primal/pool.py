"""The integer master over the pool: one generated row per person, chosen by CP-SAT.

Column generation leaves a pool of whole rows per person (the master's columns and
the rows pricing found on the way). The restricted master with its weights made
0/1 (choose exactly one row per person, cover counted as in the master, `balance`
as in the full model) is a small integer program whose every solution is a roster
keeping each person's own hard rules and the cover minimums and maximums: the
"restricted master heuristic" of branch-and-price (Joncour, Michel, Sadykov,
Sverdlov & Vanderbeck 2010, "Column generation based primal heuristics", Electronic
Notes in Discrete Mathematics 36). Its objective is the rules.md penalty of that
roster (an upper end of it while CP-SAT searches, exact at the optimum); the caller
judges each roster by the full model and the checker.
"""

from __future__ import annotations

import math
import threading
from collections.abc import Callable
from fractions import Fraction

from ortools.sat.python import cp_model

from rostertui.core.solver.decompose import Decomposition
from rostertui.core.solver.decompose.master import Column
from rostertui.core.solver.primal.watch import stop_on_cancel

Rows = dict[int, tuple[str, ...]]  # person (index) -> codes, "-" for off


def pool_columns(dw: Decomposition) -> list[Column]:
    """The master's columns and the spare rows, each (person, row) once."""
    seen: set[tuple[int, tuple[str, ...]]] = set()
    found: list[Column] = []
    for column in [*dw.columns, *dw.spare]:
        key = (column.person, column.codes)
        if key not in seen:
            seen.add(key)
            found.append(column)
    return found


class _Found(cp_model.CpSolverSolutionCallback):
    def __init__(self, pick: dict[int, list[tuple[cp_model.IntVar, Column]]],
                 on_rows: Callable[[Rows, int], None], stop: Callable[[int], bool]):
        super().__init__()
        self.pick, self.on_rows, self.stop = pick, on_rows, stop

    def on_solution_callback(self) -> None:
        rows = {p: next(c.codes for z, c in options if self.boolean_value(z))
                for p, options in self.pick.items()}
        objective = round(self.objective_value)
        self.on_rows(rows, objective)
        if self.stop(objective):
            self.stop_search()


def integer_master(dw: Decomposition, people: int, time_limit: float, workers: int,
                   seed: int, on_rows: Callable[[Rows, int], None],
                   stop: Callable[[int], bool] = lambda objective: False,
                   cutoff: int | None = None,
                   cancel: threading.Event | None = None) -> bool:
    """Search the pool for `time_limit` seconds, calling `on_rows` with every better
    roster (rows and the integer master's objective) and stopping once
    `stop(objective)` holds. `cutoff`: only rosters with a penalty below it are wanted
    (the incumbent's). True when the pool was searched to the end (its best roster
    found, or none there)."""
    columns = pool_columns(dw)
    pick: dict[int, list[tuple[cp_model.IntVar, Column]]] = {p: [] for p in range(people)}
    model = cp_model.CpModel()
    for j, column in enumerate(columns):
        pick[column.person].append((model.new_bool_var(f"z[{j}]"), column))
    if any(not options for options in pick.values()):
        return False  # someone without a row: no roster in the pool
    objective: list[cp_model.LinearExprT] = []
    for options in pick.values():
        model.add_exactly_one(z for z, _ in options)
        objective += [c.cost * z for z, c in options if c.cost]
    counts: list[list[cp_model.IntVar]] = [[] for _ in dw.cover]
    for options in pick.values():
        for z, c in options:
            for i in c.rows:
                counts[i].append(z)
    for i, row in enumerate(dw.cover):
        y = model.new_int_var(row.lo, row.hi, f"y[{i}]")
        model.add(y == sum(counts[i]))
        if row.ideal is not None and row.under:
            short = model.new_int_var(0, max(0, row.ideal - row.lo), f"short[{i}]")
            model.add(short >= row.ideal - y)
            objective.append(row.under * short)
        if row.ideal is not None and row.over:
            surplus = model.new_int_var(0, max(0, row.hi - row.ideal), f"surplus[{i}]")
            model.add(surplus >= y - row.ideal)
            objective.append(row.over * surplus)
    for k, bal in enumerate(dw.balances):
        _balance(model, k, bal.weight, bal.people, pick, bal.lo, bal.hi, objective)
    total = sum(objective)
    if cutoff is not None:
        model.add(total <= cutoff - 1)
    model.minimize(total)
    heaviest = dw.heaviest()
    for p, options in pick.items():
        for z, c in options:
            model.add_hint(z, int(heaviest.get(p) == c.codes))
    solver = cp_model.CpSolver()
    solver.parameters.max_time_in_seconds = max(0.05, time_limit)
    solver.parameters.num_workers = max(1, workers)
    solver.parameters.random_seed = seed
    with stop_on_cancel(solver, cancel):
        status = solver.solve(model, _Found(pick, on_rows, stop))
    return status in (cp_model.OPTIMAL, cp_model.INFEASIBLE)


def _balance(model: cp_model.CpModel, k: int, weight: int, people: tuple[int, ...],
             pick: dict[int, list[tuple[cp_model.IntVar, Column]]], lo: Fraction,
             hi: Fraction, objective: list[cp_model.LinearExprT]) -> None:
    """weight x (max - min of the metric over `people`, rounded up), as rules.md counts
    it; the metric is a fraction (hours), so it is scaled to integers first."""
    values = {p: [(z, dict(c.metrics).get(k, Fraction(0))) for z, c in pick[p]]
              for p in people}
    scale = math.lcm(1, lo.denominator, hi.denominator,
                     *(v.denominator for pairs in values.values() for _, v in pairs))
    top = model.new_int_var(int(lo * scale), int(hi * scale), f"bal[{k}].max")
    low = model.new_int_var(int(lo * scale), int(hi * scale), f"bal[{k}].min")
    for pairs in values.values():
        expr = sum(int(v * scale) * z for z, v in pairs)
        model.add(top >= expr)
        model.add(low <= expr)
    span = int((hi - lo) * scale)
    units = model.new_int_var(0, -(-span // scale), f"bal[{k}].units")
    model.add(units * scale >= top - low)
    objective.append(weight * units)
