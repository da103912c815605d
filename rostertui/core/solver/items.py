"""Switchable hard items, for explaining why no roster keeps every hard rule.

Each hard item (a rule for one person, a cover entry on one date, a lock, a leave
entry) gets its own Boolean switch: its constraints hold only when the switch is
on. Asking CP-SAT which switches together make the model infeasible gives a set
of items that cannot all be kept.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from datetime import date

from ortools.sat.python import cp_model

from rostertui.core.models.common import OFF
from rostertui.core.solver.logic import forbid, negate
from rostertui.core.solver.terms import ModelBuilder


@dataclass(frozen=True)
class HardItem:
    kind: str  # "rule" | "cover" | "lock" | "leave"
    rule: str | None = None  # rule id; "cover", "lock", "leave" for the built-ins
    person: str | None = None
    dates: tuple[date, ...] = ()
    cover: int | None = None  # index of the [[cover]] entry
    leave: int | None = None  # index of the [[leave]] entry


@dataclass
class Items:
    model: cp_model.CpModel
    switches: dict[HardItem, cp_model.IntVar] = field(default_factory=dict)

    def switch(self, item: HardItem) -> cp_model.IntVar:
        found = self.switches.get(item)
        if found is None:
            found = self.switches[item] = self.model.new_bool_var(f"item[{len(self.switches)}]")
        return found

    def by_index(self) -> dict[int, HardItem]:
        return {var.index: item for item, var in self.switches.items()}


def add_leave_and_locks(b: ModelBuilder, items: Items) -> None:
    """With relaxed cells, leave and locks are posted here, each under its switch."""
    cells = b.cells
    ws = cells.ws
    for i, lv in enumerate(ws.requests.leave):
        days = [(day - cells.start).days for day in lv.dates()]
        days = [d for d in days if 0 <= d < cells.n]
        if not days or lv.person not in cells.pindex:
            continue
        who = cells.pindex[lv.person]
        b.enforce = items.switch(HardItem("leave", "leave", lv.person,
                                          tuple(cells.date(d) for d in days), leave=i))
        for d in days:
            b.hard(forbid(b.model, [cells.works(who, d)]))
    roster = ws.roster
    for lock in roster.lock if roster is not None else []:
        p = cells.pindex.get(lock.person)
        row = roster.rows.get(lock.person, []) if roster is not None else []
        if p is None:
            continue
        for day in lock.dates:
            d = (day - cells.start).days
            if not 0 <= d < cells.n:
                continue
            code = row[d] if d < len(row) else OFF
            b.enforce = items.switch(HardItem("lock", "lock", lock.person, (day,)))
            if code == OFF:
                b.hard(forbid(b.model, [cells.works(p, d)]))
            else:  # the locked shift must be worked (impossible if the cell cannot hold it)
                b.hard(forbid(b.model, [negate(cells.var(p, d, code))]))
    b.enforce = None
