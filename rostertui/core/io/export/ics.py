"""iCalendar (RFC 5545) files, written with the `icalendar` library.

* One event per worked shift, DTSTART/DTEND in the unit's timezone (TZID) with the
  zone's VTIMEZONE definition for the period; the instants are the checker's, so a
  night across a DST change lasts 11 h or 13 h, and a night ends the next day.
* UID policy: `<person>-<date>@<unit slug>.rostertui` - one event per person and
  date, so re-exporting after a change of shift on that date updates the event
  rather than adding a second one. The UID does not depend on the shift code.
* SEQUENCE is the number of whole minutes from 2020-01-01 00:00 UTC to the export
  and DTSTAMP the export instant, so each new export is the newer revision of every
  event for clients that compare SEQUENCE (or DTSTAMP when SEQUENCE ties).
* `ics_all`: one calendar with everyone (SUMMARY "Name: Night (N)");
  `ics_per_person`: one calendar per person, `<person-id>.ics` (SUMMARY "Night (N)").
"""

from __future__ import annotations

from datetime import UTC, datetime, timedelta
from typing import cast
from zoneinfo import ZoneInfo

from icalendar import Calendar, Event, Timezone, vDDDTypes

from rostertui.core.check.grid import paid_hours
from rostertui.core.io.export.common import (
    Cell,
    hours_text,
    need_roster,
    notes,
    shift_times,
    unit_slug,
    worked_cells,
)
from rostertui.core.models.workspace import Workspace

PRODID = "-//rostertui//roster export//EN"
SEQUENCE_EPOCH = datetime(2020, 1, 1, tzinfo=UTC)


def event_uid(ws: Workspace, cell: Cell) -> str:
    """Stable per person and date (never per shift code): a re-export updates."""
    return f"{cell.person}-{cell.date.isoformat()}@{unit_slug(ws)}.rostertui"


def _stamp(now: datetime | None) -> tuple[datetime, int]:
    stamp = (now or datetime.now(UTC)).astimezone(UTC).replace(second=0, microsecond=0)
    return stamp, max(0, int((stamp - SEQUENCE_EPOCH).total_seconds()) // 60)


def _calendar(ws: Workspace, name: str) -> Calendar:
    cal = Calendar()
    cal.add("prodid", PRODID)
    cal.add("version", "2.0")
    cal.add("calscale", "GREGORIAN")
    cal.add("method", "PUBLISH")
    cal.add("x-wr-calname", name)
    cal.add("x-wr-timezone", ws.unit.timezone)
    tz = ZoneInfo(ws.unit.timezone)
    probe = datetime(ws.unit.start.year, ws.unit.start.month, ws.unit.start.day, tzinfo=tz)
    if vDDDTypes(probe).params.get("TZID"):  # UTC is written as "...Z" and needs none
        first = ws.unit.start - timedelta(days=1)
        last = ws.unit.end + timedelta(days=3)
        cal.add_component(
            Timezone.from_tzinfo(tz, tzid=ws.unit.timezone, first_date=first, last_date=last)
        )
    return cal


def _event(
    ws: Workspace, cell: Cell, summary: str, note: list[str], stamp: datetime, seq: int
) -> Event:
    shift = cell.shift
    event = Event()
    event.add("uid", event_uid(ws, cell))
    event.add("dtstamp", stamp)
    event.add("sequence", seq)
    event.add("dtstart", cell.start)
    event.add("dtend", cell.end)
    event.add("summary", summary)
    lines = [
        ws.unit.name,
        f"{shift.name} ({shift.code}) {shift_times(shift)}, "
        f"{hours_text(paid_hours(shift))} paid hours",
        *note,
    ]
    event.add("description", "\n".join(lines))
    event.add("categories", [shift.code])
    event.add("transp", "OPAQUE")
    return event


def ics_all(ws: Workspace, now: datetime | None = None) -> str:
    """One calendar holding everyone's shifts."""
    stamp, seq = _stamp(now)
    names = {p.id: p.name for p in ws.staff.person}
    noted = notes(ws)
    cal = _calendar(ws, ws.unit.name)
    for cell in worked_cells(ws):
        summary = f"{names[cell.person]}: {cell.shift.name} ({cell.code})"
        note = noted.get((cell.person, cell.date), [])
        cal.add_component(_event(ws, cell, summary, note, stamp, seq))
    return cast(str, cal.to_ical().decode("utf-8"))


def ics_per_person(ws: Workspace, now: datetime | None = None) -> dict[str, str]:
    """One calendar per person (everyone in staff.toml, even with no shift, so that a
    re-export empties a calendar too): file name `<person-id>.ics` -> text."""
    stamp, seq = _stamp(now)
    noted = notes(ws)
    grid = need_roster(ws)
    by_person: dict[str, list[Cell]] = {pid: [] for pid in ws.person_ids}
    for cell in worked_cells(ws, grid):
        by_person[cell.person].append(cell)
    out: dict[str, str] = {}
    for person in ws.staff.person:
        cal = _calendar(ws, f"{person.name} - {ws.unit.name}")
        for cell in by_person[person.id]:
            summary = f"{cell.shift.name} ({cell.code})"
            note = noted.get((cell.person, cell.date), [])
            cal.add_component(_event(ws, cell, summary, note, stamp, seq))
        out[f"{person.id}.ics"] = cal.to_ical().decode("utf-8")
    return out
