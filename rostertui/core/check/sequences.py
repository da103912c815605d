"""`forbidden-sequence` (rules.md, "Kinds"): `first` on day d, one of `then` on d+1.

The pair (last history day, first period day) is judged too.
"""

from __future__ import annotations

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid
from rostertui.core.check.result import Violation, violation
from rostertui.core.models.common import OFF
from rostertui.core.models.rules import ForbiddenSequence
from rostertui.core.models.workspace import EffectiveRule, Workspace


def forbidden_sequence(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`forbidden-sequence`: `first` on day d, one of `then` on d+1 (history's last day too)."""
    rule = eff.rule
    assert isinstance(rule, ForbiddenSequence)
    first = ws.select(rule.first)
    then: set[str] = set()
    for selector in rule.then:
        then |= ws.select(selector)
    out: list[Violation] = []
    for pid in eff.people:
        full, offset = grid.full(pid)
        for i in range(max(offset, 1), len(full)):
            before, after = full[i - 1], full[i]
            if before in first and after in then:
                d = i - offset
                shown = "a day off" if after == OFF else after
                out.append(violation(
                    eff, pid, (grid.date(d - 1), grid.date(d)), 1,
                    f"{before} on {fmt.day(grid.date(d - 1))} followed by {shown}",
                ))
    return out
