"""Pricing: one person's own CP-SAT model, and the best rows for given cover duals.

The person's model is `build_model` on the workspace cut to that person, with no
cover and no `balance` (the rules that join people): the same rule encodings as the
full model, not a second copy. Its objective is the person's own penalty (their
soft rules and requests) less, per cell, the duals of the cover rows the cell counts
in, plus the balance duals times the person's metric of each balance rule. Duals
come in as integers over a common `scale` (rounded by the loop, which then uses the
rounded values in the bound too), so the objective is exact in integers and CP-SAT's
proven lower bound is a proven bound of the pricing problem.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass
from fractions import Fraction

from ortools.sat.python import cp_model

from rostertui.core.models.common import OFF
from rostertui.core.models.rules import Balance
from rostertui.core.models.workspace import EffectiveRule, Workspace
from rostertui.core.solver.balance import metric_of
from rostertui.core.solver.model import BuiltModel, build_model


def floor_safely(value: float) -> int:
    """An integer at or below the integer CP-SAT reports as `value`: exact while floats
    hold integers exactly (below 2**52), and lowered by the float's own error above."""
    if abs(value) < 2.0**52:
        return math.floor(value)
    return math.floor(value - abs(value) * 2.0**-50)


def one_person(ws: Workspace, pid: str) -> Workspace:
    """`ws` cut to one person: their rules (scoped to them alone), no cover, no balance."""
    rules = [dataclasses.replace(eff, people=(pid,)) for eff in ws.rules
             if pid in eff.people and not isinstance(eff.rule, Balance)]
    return dataclasses.replace(
        ws,
        staff=ws.staff.model_copy(update={"person": [ws.person_by_id[pid]]}),
        shifts=ws.shifts.model_copy(update={"cover": []}),
        rules=rules,
    )


@dataclass(frozen=True)
class Metric:
    """One person's value of one balance rule's metric, in the person's model."""

    rule: int  # index of the balance rule in the list PersonModel was given
    expr: cp_model.LinearExpr | int
    divisor: int  # the expression's value / divisor = the metric (hours are scaled)
    lo: Fraction
    hi: Fraction


@dataclass(frozen=True)
class Row:
    codes: tuple[str, ...]  # the row, "-" for off
    cost: int  # the person's own penalty
    metrics: tuple[Fraction, ...]  # per Metric of the person, its value


@dataclass(frozen=True)
class Priced:
    lower: Fraction  # proven lower bound of min (own penalty - dual value of the row)
    rows: list[Row]  # every row found on the way, the best last
    optimal: bool
    feasible: bool  # False: the person has no row that keeps their hard rules


class _Rows(cp_model.CpSolverSolutionCallback):
    def __init__(self, pricing: PersonModel):
        super().__init__()
        self.pricing = pricing
        self.found: list[Row] = []

    def on_solution_callback(self) -> None:
        pm = self.pricing
        codes = pm.codes_of({key: self.value(v) for key, v in pm.built.cells.x.items()})
        metrics = tuple(Fraction(self.value(m.expr), m.divisor) for m in pm.metrics)
        self.found.append(Row(codes, round(self.value(pm.own)), metrics))


class PersonModel:
    """One person's pricing model, built once and re-priced with new duals.

    `balances` lists the balance rules of the workspace (with two people or more in
    scope); the model gets the person's metric of each that applies to them.
    """

    def __init__(self, ws: Workspace, pid: str, balances: list[EffectiveRule]):
        self.pid = pid
        self.ws = one_person(ws, pid)
        self.built: BuiltModel = build_model(self.ws)
        self.own = self.built.builder.objective()
        self.n = self.built.cells.n
        self.codes = self.built.cells.codes
        self.metrics: list[Metric] = []
        built = self.built
        assert built.hours is not None and built.weekends is not None
        for k, eff in enumerate(balances):
            if pid not in eff.people:
                continue
            metric = eff.rule.metric  # type: ignore[union-attr]
            expr, lo, hi = metric_of(built.builder, metric, 0, built.hours, built.weekends)
            divisor = built.hours.scale if metric == "hours" else 1
            self.metrics.append(Metric(k, expr, divisor, Fraction(lo, divisor),
                                       Fraction(hi, divisor)))
        # every coefficient an integer: duals come in 1/scale, hours in 1/divisor
        self.factor = math.lcm(1, *(m.divisor for m in self.metrics))

    def codes_of(self, values: dict[tuple[int, int, str], int]) -> tuple[str, ...]:
        row = [OFF] * self.n
        for (_, d, code), v in values.items():
            if v:
                row[d] = code
        return tuple(row)

    def price(self, duals: dict[tuple[int, str], int], balance: dict[int, int], scale: int,
              time_limit: float, hint: tuple[str, ...] | None = None, seed: int = 0) -> Priced:
        """Minimise own penalty - sum of duals[day, code] / scale over the cells worked
        + sum of balance[rule] / scale x the person's metric of that rule."""
        model = self.built.model
        cells = self.built.cells.x
        f = self.factor
        value = sum(duals[d, code] * var for (_, d, code), var in cells.items()
                    if duals.get((d, code), 0))
        extra = sum(balance[m.rule] * (f // m.divisor) * m.expr for m in self.metrics
                    if balance.get(m.rule, 0))
        model.minimize(scale * f * self.own - f * value + extra)
        model.clear_hints()
        if hint is not None:
            self.built.cells.hint_rows({0: hint})
        solver = cp_model.CpSolver()
        solver.parameters.num_workers = 1
        solver.parameters.random_seed = seed
        solver.parameters.max_time_in_seconds = max(0.01, time_limit)
        rows = _Rows(self)
        status = solver.solve(model, rows)
        if status == cp_model.INFEASIBLE:
            return Priced(Fraction(0), [], True, False)
        unit = scale * f
        optimal = status == cp_model.OPTIMAL
        found = solver.best_objective_bound  # CP-SAT's proven bound (= the optimum if optimal)
        trivial = self.trivial(duals, balance, scale)
        if not math.isfinite(found):
            return Priced(trivial, rows.found, optimal, True)
        return Priced(max(trivial, Fraction(floor_safely(found), unit)), rows.found, optimal, True)

    def trivial(self, duals: dict[tuple[int, str], int], balance: dict[int, int], scale: int
                ) -> Fraction:
        """A bound needing no search: own penalty >= 0, the best dual each day, and each
        metric at its worst end."""
        best = sum(max(0, max((duals.get((d, c), 0) for c in self.codes), default=0))
                   for d in range(self.n))
        metrics = sum((min(balance.get(m.rule, 0) * m.lo, balance.get(m.rule, 0) * m.hi)
                       for m in self.metrics), Fraction(0))
        return Fraction(-best, scale) + metrics / scale
