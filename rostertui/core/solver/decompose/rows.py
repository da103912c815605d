"""Cover rows of the master: one per cover entry and date, with its exact Lagrangian term.

The count of a row is the number of people it counts (holders of the entry's skill,
or anyone) on its shift that day. Dualising "count = sum of the people's rows" with a
multiplier pi gives, for any pi, the lower bound

    L(pi) = sum over rows of  min over counts y of  f(y) + pi * y
          + sum over people of  min over their rows r of  cost(r) - sum of pi over rows r counts in

(f: the row's soft `ideal` penalty; y ranges over the hard `min`..`max`, cut to the
people who could be there). `term` is the first part for one row, exactly, in
fractions: no rounding can make the bound invalid.
"""

from __future__ import annotations

from dataclasses import dataclass
from fractions import Fraction

from rostertui.core.solver.cells import Cells
from rostertui.core.solver.cover import cover_days


@dataclass(frozen=True)
class CoverRow:
    entry: int  # index in shifts.toml's [[cover]]
    day: int
    code: str
    holders: tuple[int, ...]  # people (indexes) the row counts who could work it that day
    lo: int  # the count's hard range
    hi: int
    ideal: int | None
    under: int  # penalty per person short of ideal
    over: int  # penalty per person over ideal

    def penalty(self, count: int) -> int:
        if self.ideal is None:
            return 0
        return self.under * max(0, self.ideal - count) + self.over * max(0, count - self.ideal)

    def candidates(self) -> list[int]:
        """Counts where f(y) + pi * y can be least: f is convex with one kink, at ideal."""
        found = {self.lo, self.hi}
        if self.ideal is not None and self.lo < self.ideal < self.hi:
            found.add(self.ideal)
        return sorted(found)

    def term(self, pi: Fraction) -> Fraction:
        return min(self.penalty(y) + pi * y for y in self.candidates())


def cover_rows(cells: Cells) -> list[CoverRow] | None:
    """Every cover row with a hard range or a penalty; None when a hard range is empty
    (no roster keeps cover, so there is no bound to prove)."""
    ws = cells.ws
    skills = [set(ws.person_by_id[pid].skills) for pid in cells.people]
    rows: list[CoverRow] = []
    for k, c in enumerate(ws.shifts.cover):
        counted = [p for p in range(len(cells.people)) if c.skill is None or c.skill in skills[p]]
        for d in cover_days(c, cells):
            holders = tuple(p for p in counted if (p, d, c.shift) in cells.x)
            lo = max(0, c.min or 0)
            hi = len(holders) if c.max is None else min(c.max, len(holders))
            if lo > hi:
                return None
            if c.ideal is None and lo == 0 and hi == len(holders):
                continue  # neither a hard range nor a penalty: nothing to price
            rows.append(CoverRow(k, d, c.shift, holders, lo, hi, c.ideal,
                                 c.under_weight or 0, c.over_weight or 0))
    return rows
