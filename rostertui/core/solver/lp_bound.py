"""A lower bound on the penalty from the linear relaxation of the CP-SAT model (GLOP).

CP-SAT finds rosters well but, on cover-driven units, proves weak bounds: its
presolve turns the aggregate rows (cover with shortfall and surplus, total hours,
counts per shift type) into clauses that never reach its own LP. Solving the plain
linear relaxation of the very same model with GLOP, which ships with OR-Tools,
keeps those rows whole. Every constraint of the model relaxes to linear rows:

* a clause `l1 or ... or lk`, enforced by e1..em: sum(li) + sum(1 - ej) >= 1;
* `bool_and` enforced by e: each literal >= e (>= sum(e) - (m - 1) for several);
* at-most-one / exactly-one: their sums;
* a linear constraint `lb <= expr <= ub` enforced by e: big-M from the variables'
  domains, so that it binds only when e = 1.

The LP optimum is a valid lower bound on the model's optimum, hence on the
penalty of every roster that keeps the hard rules.
"""

from __future__ import annotations

import math
import time
from collections.abc import Callable, Iterable
from typing import Any

from ortools.linear_solver import pywraplp
from ortools.sat import cp_model_pb2
from ortools.sat.python import cp_model

# A literal's (coefficient, LP variable, constant): x or 1 - x.
Lit = Callable[[int], tuple[float, object | None, float]]


class Relaxation:
    """The LP of a CP-SAT model, built at once (it reads the model) and solved later."""

    def __init__(self, model: cp_model.CpModel):
        self.solver, self.scale = _build(model)

    def solve(self, time_limit: float) -> int | None:
        """The LP optimum rounded up (the penalty is an integer), or None in time."""
        solver = self.solver
        solver.SetTimeLimit(max(1, int(time_limit * 1000)))
        started = time.monotonic()
        status = solver.Solve()
        if status != pywraplp.Solver.OPTIMAL or time.monotonic() - started > time_limit:
            return None
        value: float = solver.Objective().Value() * self.scale
        return math.ceil(value - 1e-6 * max(1.0, abs(value)))


def lp_bound(model: cp_model.CpModel, time_limit: float = 30.0) -> int | None:
    """The LP relaxation's optimum rounded up, or None when not solved in time."""
    return Relaxation(model).solve(time_limit)


def _build(model: cp_model.CpModel) -> tuple[pywraplp.Solver, float]:
    proto = model.proto
    solver = pywraplp.Solver.CreateSolver("GLOP")
    inf = solver.infinity()
    xs: list[Any] = []
    domains = [list(v.domain) for v in proto.variables]
    for domain in domains:
        xs.append(solver.NumVar(float(domain[0]), float(domain[-1]), ""))

    def lit(ref: int) -> tuple[float, object | None, float]:
        """(coefficient, variable, constant) of a literal: x or 1 - x."""
        if ref >= 0:
            return 1.0, xs[ref], 0.0
        return -1.0, xs[-ref - 1], 1.0

    def bounds(var_index: int) -> tuple[int, int]:
        return domains[var_index][0], domains[var_index][-1]

    for ct in proto.constraints:
        kind = _kind(ct)
        enforce = list(ct.enforcement_literal)
        if kind in ("bool_or", "at_most_one", "exactly_one", "bool_and"):
            refs = list(getattr(ct, kind).literals)
        if kind == "bool_or":
            _row(solver, [*refs, *(_neg(e) for e in enforce)], lit, 1.0, inf)
        elif kind == "bool_and":
            for ref in refs:  # ref >= sum(e) - (m - 1)
                row = solver.Constraint(-inf, float(len(enforce) - 1))
                c, x, k = lit(ref)
                row.SetCoefficient(x, -c)
                const = -k
                for e in enforce:
                    ce, xe, ke = lit(e)
                    row.SetCoefficient(xe, row.GetCoefficient(xe) + ce)
                    const += ke
                row.SetBounds(-inf, float(len(enforce) - 1) - const)
        elif kind in ("at_most_one", "exactly_one") and not enforce:
            lo = 1.0 if kind == "exactly_one" else -inf
            _row(solver, refs, lit, lo, 1.0)
        elif kind == "linear":
            _linear(solver, ct, enforce, xs, lit, bounds, inf)
        # other kinds are not used by the roster model; leaving a constraint out
        # only weakens the bound, never invalidates it
    objective = solver.Objective()
    for var, coef in zip(proto.objective.vars, proto.objective.coeffs, strict=True):
        if var >= 0:
            objective.SetCoefficient(xs[var], objective.GetCoefficient(xs[var]) + coef)
        else:  # a negated literal in the objective: coef * (1 - x)
            x = xs[-var - 1]
            objective.SetCoefficient(x, objective.GetCoefficient(x) - coef)
            objective.SetOffset(objective.offset() + coef)
    objective.SetOffset(objective.offset() + proto.objective.offset)
    objective.SetMinimization()
    return solver, (proto.objective.scaling_factor or 1.0)


KINDS = ("bool_or", "bool_and", "at_most_one", "exactly_one", "linear")


def _kind(ct: cp_model_pb2.ConstraintProto) -> str | None:
    for kind in KINDS:
        if getattr(ct, f"has_{kind}")():
            return kind
    return None


def _neg(ref: int) -> int:
    return -ref - 1


def _row(solver: pywraplp.Solver, refs: Iterable[int], lit: Lit, lo: float, hi: float) -> None:
    row = solver.Constraint(lo, hi)
    const = 0.0
    for ref in refs:
        c, x, k = lit(ref)
        row.SetCoefficient(x, row.GetCoefficient(x) + c)
        const += k
    row.SetBounds(lo - const, hi - const)


def _linear(solver: pywraplp.Solver, ct: cp_model_pb2.ConstraintProto, enforce: list[int],
            xs: list[Any], lit: Lit, bounds: Callable[[int], tuple[int, int]],
            inf: float) -> None:
    """lb <= expr <= ub, each side relaxed by big * (1 - e) for every enforcement e."""
    lin = ct.linear
    domain = list(lin.domain)
    lb, ub = domain[0], domain[-1]
    lo_sum = hi_sum = 0
    for var, coef in zip(lin.vars, lin.coeffs, strict=True):
        a, b = bounds(var)
        lo_sum += min(coef * a, coef * b)
        hi_sum += max(coef * a, coef * b)
    sides = []
    if lb > lo_sum:
        sides.append((True, lb, lb - lo_sum))
    if ub < hi_sum:
        sides.append((False, ub, hi_sum - ub))
    for lower, limit, big in sides:
        coefs: dict[int, float] = {}
        for var, coef in zip(lin.vars, lin.coeffs, strict=True):
            coefs[var] = coefs.get(var, 0.0) + coef
        shift = 0.0
        sign = 1.0 if lower else -1.0
        for e in enforce:  # lit = c * x + k, so big * (1 - lit) = big * (1 - k) - big * c * x
            c, _x, k = lit(e)
            var = e if e >= 0 else -e - 1
            coefs[var] = coefs.get(var, 0.0) - sign * big * c
            shift += sign * big * (1 - k)
        row = solver.Constraint(limit - shift, inf) if lower else \
            solver.Constraint(-inf, limit - shift)
        for var, coef in coefs.items():
            if coef:
                row.SetCoefficient(xs[var], coef)
