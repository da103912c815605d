"""Minimal change for repair: a penalty per cell that differs from a reference roster.

`Keep` says which roster to stay close to, how many leading days are frozen (fixed
to the reference, as the past is), and what one changed cell costs. The change
literals are kept apart from the rules.md penalty terms, so the penalty a repair
reports is still exactly the checker's.
"""

from __future__ import annotations

from dataclasses import dataclass

from rostertui.core.models.common import OFF
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.logic import Lit, negate

DEFAULT_CHANGE_WEIGHT = 1000


@dataclass(frozen=True)
class Keep:
    rows: dict[str, list[str]]  # the reference roster, one code per period day
    frozen: int = 0  # days [0, frozen) keep the reference codes, whatever they cost
    weight: int = DEFAULT_CHANGE_WEIGHT  # penalty per cell changed from the reference

    def code(self, pid: str, d: int) -> str:
        row = self.rows.get(pid, ())
        return row[d] if d < len(row) else OFF


def change_literals(cells: Cells, keep: Keep) -> list[Lit]:
    """One literal per free cell, true when the cell differs from the reference.

    A cell whose reference shift is no longer possible (leave recorded since) must
    change whatever the roster: it is a constant and left out of the objective.
    """
    out: list[Lit] = []
    for p, pid in enumerate(cells.people):
        for d in range(keep.frozen, cells.n):
            ref = keep.code(pid, d)
            lit = cells.works(p, d) if ref == OFF else negate(cells.var(p, d, ref))
            if not isinstance(lit, bool):
                out.append(lit)
    return out
