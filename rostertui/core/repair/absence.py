"""Record an absence (a sick call, an emergency) as leave and clear its shifts.

The leave goes to requests.toml like any other; the person's shifts on those dates
become off in the roster, so the cover they held shows as short, ready for repair.
"""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date

from pydantic import ValidationError

from rostertui.core.errors import EditError
from rostertui.core.models.common import OFF
from rostertui.core.models.requests import Leave, RequestsFile
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.diff import CellDiff, roster_diff
from rostertui.core.repair.rows import full_rows, normalised


@dataclass(frozen=True)
class Absence:
    leave: Leave
    requests: RequestsFile  # requests.toml with the leave added
    roster: Roster | None  # the roster with the person's shifts cleared (None: no roster)
    cleared: list[CellDiff]  # the shifts the person no longer works


def record_absence(ws: Workspace, person: str, first: date, last: date | None = None,
                   reason: str | None = None, credit_hours: float | None = None) -> Absence:
    if person not in ws.person_by_id:
        raise EditError(f"no person {person!r} in staff.toml")
    last = last or first
    if last < first:
        raise EditError(f"the absence ends ({last}) before it starts ({first})")
    unit = ws.unit
    if last < unit.start or first > unit.end:
        raise EditError(f"{first} to {last} lies outside the period {unit.start} to {unit.end}")
    try:
        leave = Leave.model_validate({"person": person, "from": first,
                                      "to": last if last != first else None,
                                      "reason": reason, "credit_hours": credit_hours})
    except ValidationError as exc:
        why = "; ".join(f"leave.{'.'.join(map(str, e['loc']))}: {e['msg']}"
                        for e in exc.errors())
        raise EditError(f"requests.toml: {why}") from None
    requests = ws.requests.model_copy(update={"leave": [*ws.requests.leave, leave]})
    roster = ws.roster
    if roster is None:
        return Absence(leave, requests, None, [])
    rows = full_rows(ws, roster)
    for day in leave.dates():
        if unit.in_period(day):
            rows[person][(day - unit.start).days] = OFF
    new = normalised(ws, roster).model_copy(update={"rows": rows, "solve": None})
    cleared = roster_diff(ws, roster, new)
    return Absence(leave, requests, new if cleared else roster, cleared)
