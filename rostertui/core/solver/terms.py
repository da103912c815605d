"""Named penalty terms: what each soft rule costs, for the objective and for reports."""

from __future__ import annotations

from dataclasses import dataclass, field
from datetime import date

from ortools.sat.python import cp_model

from rostertui.core.solver.cells import Cells
from rostertui.core.solver.logic import Lit


@dataclass(frozen=True)
class Term:
    """`weight` x `units` of penalty for one rule, person and dates."""

    rule: str
    kind: str
    person: str | None
    dates: tuple[date, ...]
    weight: int
    units: cp_model.BoolVarT | cp_model.IntVar | int  # a 0/1 literal or an integer variable, exact


@dataclass
class ModelBuilder:
    """Everything a rule family needs: the model, the cells, and where terms go."""

    model: cp_model.CpModel
    cells: Cells
    terms: list[Term] = field(default_factory=list)
    enforce: Lit | None = None  # explain: the switch of the hard item being posted

    def hard(self, constraint: cp_model.Constraint | None) -> None:
        """A hard rule's constraint: switched by `enforce` when explaining, else as is."""
        if constraint is not None and self.enforce is not None and self.enforce is not True:
            constraint.only_enforce_if(self.enforce)

    def add(self, rule: str, kind: str, person: str | None, dates: tuple[date, ...],
            weight: int, units: cp_model.IntVar | int | Lit) -> None:
        """Record a penalty term; constants and zero weights are kept simple."""
        if units is True:
            units = 1
        if weight == 0 or units is False or (isinstance(units, int) and units == 0):
            return
        self.terms.append(Term(rule, kind, person, dates, weight, units))

    def objective(self) -> cp_model.LinearExpr | int:
        return sum(t.weight * t.units for t in self.terms)
