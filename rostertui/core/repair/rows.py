"""A roster shaped to the unit: one row of `days` codes per person in staff order."""

from __future__ import annotations

from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace


def full_rows(ws: Workspace, roster: Roster | None) -> dict[str, list[str]]:
    """One row of `days` codes per person in staff.toml (a missing row or cell is off)."""
    n = ws.unit.days
    given = roster.rows if roster is not None else {}
    rows = {}
    for pid in ws.person_ids:
        row = list(given.get(pid, ()))[:n]
        rows[pid] = row + [OFF] * (n - len(row))
    return rows


def normalised(ws: Workspace, roster: Roster | None) -> Roster:
    """The roster (an empty one for None) with full rows over the unit's period."""
    rows = full_rows(ws, roster)
    if roster is None:
        return Roster(start=ws.unit.start, days=ws.unit.days, rows=rows)
    return roster.model_copy(update={"rows": rows, "start": ws.unit.start,
                                     "days": ws.unit.days})
