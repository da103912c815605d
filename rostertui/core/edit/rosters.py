"""Roster shapes the session needs: rows of people kept, the cells two rosters differ in
(by day index); full rows in staff order come from the core (`normalised`). Pure: no
textual."""

from __future__ import annotations

from dataclasses import dataclass

from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster


@dataclass(frozen=True)
class CellChange:
    person: str
    day: int
    before: str
    after: str


def keep_people(roster: Roster, ids: list[str]) -> Roster:
    """The roster without the rows and locks of people no longer in staff.toml."""
    keep = set(ids)
    return roster.model_copy(update={
        "rows": {pid: row for pid, row in roster.rows.items() if pid in keep},
        "lock": [lk for lk in roster.lock if lk.person in keep],
    })


def changed_cells(before: Roster, after: Roster) -> list[CellChange]:
    """Cells whose code differs, in row order then day order."""
    out: list[CellChange] = []
    for pid, new in after.rows.items():
        old = before.rows.get(pid, [OFF] * len(new))
        out += [CellChange(pid, i, a, b) for i, (a, b) in enumerate(zip(old, new, strict=False))
                if a != b]
    return out
