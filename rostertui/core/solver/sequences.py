"""`forbidden-sequence` (rules.md): `first` on day d followed by one of `then` on d+1.

The pair (last history day, first period day) is judged too.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from rostertui.core.models.common import OFF
from rostertui.core.models.rules import ForbiddenSequence
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.logic import Lit, any_of, breach, forbid, negate
from rostertui.core.solver.terms import ModelBuilder

if TYPE_CHECKING:
    from rostertui.core.solver.shared import Shared


def forbidden_sequence(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    rule = eff.rule
    assert isinstance(rule, ForbiddenSequence)
    cells, ws = b.cells, b.cells.ws
    first = ws.select(rule.first)
    then: set[str] = set()
    for selector in rule.then:
        then |= ws.select(selector)
    shift_then = frozenset(then - {OFF})
    for pid in eff.people:
        p = cells.pindex[pid]
        for d in range(0 if cells.history[p] else 1, cells.n):
            before: Lit = cells.on(p, d - 1, frozenset(first))
            if before is False:
                continue
            after: list[Lit] = [cells.on(p, d, shift_then)] if shift_then else []
            if OFF in then:
                after.append(negate(cells.works(p, d)))
            follows = any_of(b.model, after)
            dates = (cells.date(d - 1), cells.date(d))
            if rule.weight is None:
                b.hard(forbid(b.model, [before, follows]))
            else:
                b.add(rule.id, rule.kind, pid, dates, rule.weight,
                      breach(b.model, [before, follows]))
