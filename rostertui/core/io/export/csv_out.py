"""CSV (RFC 4180: comma separated, CRLF line ends, quotes doubled) in two forms.

* Long form, one row per worked shift, for `check --roster` and pivot tables:
  `person,date,shift,start,end,paid_hours`, plain UTF-8 (no byte order mark: it is
  the interchange format, read by programs). Days off are not rows, so they read
  back as off.
  `start` and `end` are ISO 8601 local times with their UTC offset
  (`2027-03-27T22:00+00:00`): exact across midnight and DST.
* Grid form, for printing from a spreadsheet: one row per person, one column per
  date (ISO dates in the header), `-` for a day off, then shifts, paid hours
  (shifts + leave credit) and notes; it starts with a UTF-8 byte order mark so that
spreadsheets read accented names right.

Every field goes through `neutralise` (formula injection).
"""

from __future__ import annotations

import csv
import io
from collections.abc import Iterable

from rostertui.core.check.grid import paid_hours
from rostertui.core.io.export.common import (
    hours_text,
    need_roster,
    neutralise,
    notes,
    worked_cells,
)
from rostertui.core.models.common import OFF
from rostertui.core.models.workspace import Workspace

BOM = "\ufeff"
LONG_HEADER = ("person", "date", "shift", "start", "end", "paid_hours")


def to_csv(rows: Iterable[Iterable[str]], bom: bool = True) -> str:
    """RFC 4180 text: CRLF line ends, fields quoted when they hold , " CR or LF."""
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\r\n", quoting=csv.QUOTE_MINIMAL)
    for row in rows:
        writer.writerow([neutralise(field) for field in row])
    return (BOM if bom else "") + out.getvalue()


def long_csv(ws: Workspace) -> str:
    """The long form: one row per worked shift, staff order then date."""
    rows: list[tuple[str, ...]] = [LONG_HEADER]
    for cell in worked_cells(ws):
        rows.append((
            cell.person,
            cell.date.isoformat(),
            cell.code,
            cell.start.isoformat(timespec="minutes"),
            cell.end.isoformat(timespec="minutes"),
            hours_text(paid_hours(cell.shift)),
        ))
    return to_csv(rows, bom=False)


def grid_csv(ws: Workspace) -> str:
    """The grid form: one row per person (staff order), one column per date."""
    grid = need_roster(ws)
    noted = notes(ws)
    header = ["person", "name", *(d.isoformat() for d in grid.dates), "shifts", "hours", "notes"]
    rows: list[list[str]] = [header]
    for person in ws.staff.person:
        row = grid.rows[person.id]
        remarks = [
            f"{d.isoformat()}: {text}"
            for d in grid.dates
            for text in noted.get((person.id, d), [])
        ]
        rows.append([
            person.id,
            person.name,
            *row,
            str(sum(1 for code in row if code != OFF)),
            hours_text(grid.hours(person.id)),
            "; ".join(remarks),
        ])
    return to_csv(rows)
