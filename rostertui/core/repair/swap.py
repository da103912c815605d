"""Exchange cells: two people on one date, one person on two dates, or two people on
two dates (each gives the other their cell on both dates: four cells)."""

from __future__ import annotations

from datetime import date

from rostertui.core.errors import EditError
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.diff import CellDiff, roster_diff
from rostertui.core.repair.rows import full_rows, normalised

Cell = tuple[str, date]


def swap_pairs(person: str, day: date, person2: str, day2: date | None) -> list[tuple[Cell, Cell]]:
    """The cell pairs a swap exchanges."""
    if day2 is None or day2 == day:
        if person == person2:
            raise EditError("a cell cannot be swapped with itself: give another person "
                            "or another date")
        return [((person, day), (person2, day))]
    if person == person2:
        return [((person, day), (person, day2))]
    return [((person, day), (person2, day)), ((person, day2), (person2, day2))]


def locked_cells(roster: Roster) -> set[Cell]:
    return {(lk.person, d) for lk in roster.lock for d in lk.dates}


def need_cell(ws: Workspace, person: str, day: date) -> None:
    if person not in ws.person_by_id:
        raise EditError(f"no person {person!r} in staff.toml")
    if not ws.unit.in_period(day):
        raise EditError(f"{day} is outside the period {ws.unit.start} to {ws.unit.end}")


def swap(ws: Workspace, roster: Roster | None, person: str, day: date, person2: str,
         day2: date | None = None) -> tuple[Roster, list[CellDiff]]:
    """The roster with the cells exchanged, and the cells that changed.

    Locked cells are refused, as for any hand edit. The [solve] record is dropped:
    it describes the solver's roster, not this one.
    """
    if roster is None:
        raise EditError("there is no roster.toml yet: solve first, then swap")
    for pid, d in ((person, day), (person2, day2 or day)):
        need_cell(ws, pid, d)
    pairs = swap_pairs(person, day, person2, day2)
    locked = locked_cells(roster)
    rows = full_rows(ws, roster)
    start = ws.unit.start
    for a, b in pairs:
        for pid, d in (a, b):
            if (pid, d) in locked:
                raise EditError(f"{pid} on {d} is locked; unlock it before swapping")
        (pa, da), (pb, db) = a, b
        ia, ib = (da - start).days, (db - start).days
        rows[pa][ia], rows[pb][ib] = rows[pb][ib], rows[pa][ia]
    new = normalised(ws, roster).model_copy(update={"rows": rows, "solve": None})
    return new, roster_diff(ws, roster, new)
