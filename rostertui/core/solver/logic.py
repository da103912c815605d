"""Literals that may be constants; AND / OR over them; penalty units.

Two kinds of helpers. `all_of` and `any_of` give literals *equal* to their
function of the roster, for use anywhere. The penalty helpers (`breach`,
`excess`, `ceil_div`, `absolute`, `spread`) only bound their variable from below
by its true value: the objective keeps it down, and a lean model searches far
better (on Curtois-Qu instance 2: 828 reached in about 5 s instead of 47 s with
fully reified penalties). After the search, `run.polish` fixes the roster and
minimises again, which brings every such variable down to its exact value, so the
objective reported is exactly the rules.md penalty of the roster returned.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence

from ortools.sat.python import cp_model

Lit = cp_model.BoolVarT | bool  # a Boolean variable, its negation, or a constant
Expr = cp_model.LinearExprT


def negate(lit: Lit) -> Lit:
    if isinstance(lit, bool):
        return not lit
    return lit.Not()


def _variables(lits: Iterable[Lit], absorbing: bool) -> list[cp_model.BoolVarT] | None:
    """The variables among `lits`, without repeats; None if one is the constant `absorbing`
    (False for a conjunction, True for a disjunction). Other constants drop out."""
    found: list[cp_model.BoolVarT] = []
    for lit in lits:
        if lit is absorbing:
            return None
        if not isinstance(lit, bool):
            found.append(lit)
    return list(dict.fromkeys(found))


def all_of(model: cp_model.CpModel, lits: Iterable[Lit], name: str = "") -> Lit:
    """A literal equal to the conjunction of `lits` (constants folded away)."""
    rest = _variables(lits, absorbing=False)
    if rest is None:
        return False
    if len(rest) <= 1:
        return rest[0] if rest else True
    b = model.new_bool_var(name or "and")
    model.add_bool_and(rest).only_enforce_if(b)
    model.add_bool_or([r.Not() for r in rest]).only_enforce_if(b.Not())
    return b


def any_of(model: cp_model.CpModel, lits: Iterable[Lit], name: str = "") -> Lit:
    """A literal equal to the disjunction of `lits` (constants folded away)."""
    rest = _variables(lits, absorbing=True)
    if rest is None:
        return True
    if len(rest) <= 1:
        return rest[0] if rest else False
    b = model.new_bool_var(name or "or")
    model.add_bool_or(rest).only_enforce_if(b)
    for r in rest:
        model.add_implication(r, b)
    return b


def forbid(model: cp_model.CpModel, lits: Sequence[Lit]) -> cp_model.Constraint | None:
    """Hard: not all of `lits` at once. Returns the constraint (None when it always holds)."""
    clause: list[Lit] = []
    for lit in lits:
        if lit is False:
            return None
        if lit is not True:
            clause.append(negate(lit))
    if not clause:
        return model.add_bool_or([])  # a constant breach: the model is infeasible
    return model.add_bool_or(clause)


def bool_sum(lits: Iterable[Lit]) -> tuple[list[cp_model.BoolVarT], int]:
    """Split into variables and a constant count of True."""
    vars_: list[cp_model.BoolVarT] = []
    const = 0
    for lit in lits:
        if lit is True:
            const += 1
        elif lit is not False:
            vars_.append(lit)
    return vars_, const


def breach(model: cp_model.CpModel, lits: Sequence[Lit], name: str = "") -> Lit:
    """Penalty literal: at least the conjunction of `lits` (1 when all hold)."""
    vars_ = _variables(lits, absorbing=False)
    if vars_ is None:
        return False
    if len(vars_) <= 1:
        return vars_[0] if vars_ else True
    b = model.new_bool_var(name or "breach")
    model.add_bool_or([b, *(v.Not() for v in vars_)])
    return b


def excess(model: cp_model.CpModel, expr: Expr, lo: int, hi: int, name: str) -> cp_model.IntVar:
    """Penalty units: at least max(0, expr), for expr known to lie in [lo, hi]."""
    u = model.new_int_var(0, max(hi, 0), name)
    model.add(u >= expr)
    return u


def absolute(model: cp_model.CpModel, expr: Expr, lo: int, hi: int, name: str
             ) -> cp_model.IntVar:
    """Penalty units: at least |expr|, for expr known to lie in [lo, hi]."""
    u = model.new_int_var(0, max(abs(lo), abs(hi)), name)
    model.add(u >= expr)
    model.add(u >= -expr)
    return u


def ceil_div(model: cp_model.CpModel, value: cp_model.IntVar, divisor: int, hi: int,
             name: str) -> cp_model.IntVar | int:
    """Penalty units: at least ceil(value / divisor), for a value in [0, hi]."""
    if divisor == 1:
        return value
    u = model.new_int_var(0, -(-hi // divisor), name)
    model.add(divisor * u >= value)
    return u
