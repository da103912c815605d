"""The restricted master LP of the decomposition (Dantzig & Wolfe 1960), solved by GLOP.

    minimise  sum_j cost_j * lam_j + sum_i (under_i * short_i + over_i * surplus_i)
                                   + big * sum_i (art+_i + art-_i)
    subject to  sum_{j of p} lam_j = 1                       for every person p
                sum_j a_ij lam_j - y_i + art+_i - art-_i = 0   for every cover row i
                lo_i <= y_i <= hi_i,  short_i >= ideal_i - y_i,  surplus_i >= y_i - ideal_i

    and for each balance rule b and person p in its scope (hi_b, lo_b in the metric's range)
                hi_b - sum_{j of p} m_bj lam_j >= 0  and  sum_{j of p} m_bj lam_j - lo_b >= 0
    at the cost weight_b * (hi_b - lo_b), never above the rule's penalty (weight x the
    spread, an hours spread rounded up).

A column j is one person's whole row: its own penalty, the cover rows it counts in
and its value m_bj of each balance metric. The artificial variables keep the LP
feasible before the columns can meet every hard minimum; they cap the duals at
`big`, which only slows the bound's rise: the bound itself (loop.py) holds for any
multipliers. The master only proposes them.
"""

from __future__ import annotations

from dataclasses import dataclass
from fractions import Fraction

from ortools.linear_solver import linear_solver_pb2, pywraplp

from rostertui.core.solver.decompose.rows import CoverRow


@dataclass(frozen=True)
class Column:
    person: int
    codes: tuple[str, ...]  # the row, "-" for off
    cost: int  # the person's own penalty for it
    rows: tuple[int, ...]  # cover rows (indexes) it counts in
    metrics: tuple[tuple[int, Fraction], ...] = ()  # (balance rule, the row's metric value)


@dataclass(frozen=True)
class BalanceRow:
    """A balance rule as the master sees it."""

    weight: int
    people: tuple[int, ...]
    lo: Fraction  # the metric's range over the people in scope
    hi: Fraction


@dataclass(frozen=True)
class Duals:
    cover: list[float]  # pi_i per cover row
    convexity: list[float]  # mu_p per person
    value: float  # the restricted master's optimum
    artificial: float  # how much of the artificial variables the optimum uses
    upper: dict[tuple[int, int], float]  # (balance rule, person) -> dual of hi_b >= m_p
    lower: dict[tuple[int, int], float]  # (balance rule, person) -> dual of m_p >= lo_b


class Master:
    def __init__(self, people: int, rows: list[CoverRow], balances: list[BalanceRow],
                 big: float):
        self.solver = pywraplp.Solver.CreateSolver("GLOP")
        self.rows = rows
        self.columns: list[Column] = []
        self._vars: list[pywraplp.Variable] = []
        self._seen: set[tuple[int, tuple[str, ...]]] = set()
        self._values: list[float] = []
        solver = self.solver
        inf = solver.infinity()
        objective = solver.Objective()
        objective.SetMinimization()
        self.convexity = [solver.Constraint(1.0, 1.0, f"conv[{p}]") for p in range(people)]
        self.cover = []
        self.artificial: list[pywraplp.Variable] = []
        for i, row in enumerate(rows):
            ct = solver.Constraint(0.0, 0.0, f"cover[{i}]")
            y = solver.NumVar(float(row.lo), float(row.hi), f"y[{i}]")
            ct.SetCoefficient(y, -1.0)
            for sign in (1.0, -1.0):
                art = solver.NumVar(0.0, inf, "")
                ct.SetCoefficient(art, sign)
                objective.SetCoefficient(art, big)
                self.artificial.append(art)
            if row.ideal is not None:
                if row.under:
                    short = solver.NumVar(0.0, inf, "")
                    solver.Add(short + y >= row.ideal)
                    objective.SetCoefficient(short, float(row.under))
                if row.over:
                    surplus = solver.NumVar(0.0, inf, "")
                    solver.Add(surplus - y >= -row.ideal)
                    objective.SetCoefficient(surplus, float(row.over))
            self.cover.append(ct)
        self.big = big
        self.upper: dict[tuple[int, int], pywraplp.Constraint] = {}
        self.lower: dict[tuple[int, int], pywraplp.Constraint] = {}
        for k, bal in enumerate(balances):
            hi = solver.NumVar(float(bal.lo), float(bal.hi), f"bal[{k}].hi")
            lo = solver.NumVar(float(bal.lo), float(bal.hi), f"bal[{k}].lo")
            objective.SetCoefficient(hi, float(bal.weight))
            objective.SetCoefficient(lo, -float(bal.weight))
            for p in bal.people:
                up = self.upper[k, p] = solver.Constraint(0.0, inf)
                up.SetCoefficient(hi, 1.0)
                down = self.lower[k, p] = solver.Constraint(0.0, inf)
                down.SetCoefficient(lo, -1.0)

    def set_big(self, big: float) -> None:
        self.big = big
        objective = self.solver.Objective()
        for art in self.artificial:
            objective.SetCoefficient(art, big)

    def has(self, key: tuple[int, tuple[str, ...]]) -> bool:
        """Whether the master holds the row `key` = (person, codes)."""
        return key in self._seen

    def add(self, column: Column) -> bool:
        """Add a column unless the same row of the same person is already there."""
        key = (column.person, column.codes)
        if key in self._seen:
            return False
        self._seen.add(key)
        lam = self.solver.NumVar(0.0, self.solver.infinity(), "")
        self.solver.Objective().SetCoefficient(lam, float(column.cost))
        self.convexity[column.person].SetCoefficient(lam, 1.0)
        for i in column.rows:
            self.cover[i].SetCoefficient(lam, 1.0)
        for k, value in column.metrics:
            self.upper[k, column.person].SetCoefficient(lam, -float(value))
            self.lower[k, column.person].SetCoefficient(lam, float(value))
        self.columns.append(column)
        self._vars.append(lam)
        return True

    def solve(self) -> Duals | None:
        solver = self.solver
        if solver.Solve() != pywraplp.Solver.OPTIMAL:
            # GLOP's warm start from the last basis can end ABNORMAL after many added
            # columns (seen on the clinic demo); the same LP from scratch solves
            solver = pywraplp.Solver.CreateSolver("GLOP")
            proto = linear_solver_pb2.MPModelProto()
            self.solver.ExportModelToProto(proto)
            solver.LoadModelFromProto(proto)
            if solver.Solve() != pywraplp.Solver.OPTIMAL:
                return None
        rows = solver.constraints()
        columns = solver.variables()

        def dual(ct: pywraplp.Constraint) -> float:
            return float(rows[ct.index()].dual_value())

        self._values = [columns[v.index()].solution_value() for v in self._vars]
        return Duals(
            cover=[dual(ct) for ct in self.cover],
            convexity=[dual(ct) for ct in self.convexity],
            value=solver.Objective().Value(),
            artificial=sum(columns[a.index()].solution_value() for a in self.artificial),
            upper={key: dual(ct) for key, ct in self.upper.items()},
            lower={key: dual(ct) for key, ct in self.lower.items()},
        )

    def weights(self) -> list[float]:
        """Each column's value in the last solution (for the heuristics to come)."""
        return list(self._values)
