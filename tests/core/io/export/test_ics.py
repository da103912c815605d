"""iCalendar export, parsed back with the `icalendar` library: one event per worked
cell, exact UTC instants across midnight and DST, the zone's VTIMEZONE, stable UIDs."""

from __future__ import annotations

from datetime import UTC, date, datetime, timedelta
from pathlib import Path

import pytest
from icalendar import Calendar

from rostertui.core.io.export import ics_all, ics_per_person
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from tests.core.check.helpers import write_ws
from tests.core.io.export.helpers import FORMULA_NAME, SCRIPT_NOTE, SHIFTS, worked

NOW = datetime(2027, 3, 1, 12, 0, tzinfo=UTC)


def events(text: str) -> list:
    return list(Calendar.from_ical(text).walk("VEVENT"))


def utc(event, key: str) -> datetime:
    return event.decoded(key).astimezone(UTC)


def by_uid(text: str) -> dict[str, object]:
    return {str(e["UID"]): e for e in events(text)}


def test_one_event_per_worked_cell_with_zone_definition(hostile_loaded: Workspace) -> None:
    text = ics_all(hostile_loaded, NOW)
    cal = Calendar.from_ical(text)
    found = events(text)
    assert len(found) == worked()
    zones = list(cal.walk("VTIMEZONE"))
    assert [str(z["TZID"]) for z in zones] == ["Europe/Lisbon"]
    assert {str(z.name) for z in zones[0].subcomponents} == {"STANDARD", "DAYLIGHT"}
    for e in found:
        assert e["DTSTART"].params["TZID"] == "Europe/Lisbon"
        assert e["DTEND"].params["TZID"] == "Europe/Lisbon"
        assert e.decoded("DTSTAMP") == NOW


@pytest.mark.parametrize(("zone", "day", "start_utc", "end_utc"), [
    # Lisbon springs forward at 01:00 on 28 Mar 2027: 22:00 WET -> 07:00 WEST, 8 h
    ("Europe/Lisbon", "2027-03-27", datetime(2027, 3, 27, 22, tzinfo=UTC),
     datetime(2027, 3, 28, 6, tzinfo=UTC)),
    # London falls back at 02:00 on 31 Oct 2027: 22:00 BST -> 07:00 GMT, 10 h
    ("Europe/London", "2027-10-30", datetime(2027, 10, 30, 21, tzinfo=UTC),
     datetime(2027, 10, 31, 7, tzinfo=UTC)),
])
def test_night_across_dst_parses_back_to_the_right_instants(
    tmp_path: Path, zone: str, day: str, start_utc: datetime, end_utc: datetime
) -> None:
    folder = write_ws(tmp_path / "ws", rows={"p1": "N"}, start=day, timezone=zone,
                      shifts=SHIFTS)
    ws = load_workspace(folder)
    (event,) = events(ics_all(ws, NOW))
    assert event.decoded("DTSTART").tzinfo is not None
    assert utc(event, "DTSTART") == start_utc
    assert utc(event, "DTEND") == end_utc
    assert event.decoded("DTEND").date() == date.fromisoformat(day) + timedelta(days=1)


def test_night_ends_the_next_day(hostile_loaded: Workspace) -> None:
    uids = by_uid(ics_all(hostile_loaded, NOW))
    night = next(e for uid, e in uids.items() if uid.startswith("p3-2027-03-22@"))
    assert night.decoded("DTSTART").date() == date(2027, 3, 22)
    assert night.decoded("DTEND").date() == date(2027, 3, 23)
    assert utc(night, "DTEND") - utc(night, "DTSTART") == timedelta(hours=9)


def test_uids_are_stable_across_exports_and_unique_within_one(
    hostile_loaded: Workspace,
) -> None:
    first = [str(e["UID"]) for e in events(ics_all(hostile_loaded, NOW))]
    later = NOW + timedelta(days=3)
    second = [str(e["UID"]) for e in events(ics_all(hostile_loaded, later))]
    assert first == second
    assert len(set(first)) == len(first) == worked()
    seq = [int(e["SEQUENCE"]) for e in events(ics_all(hostile_loaded, later))]
    assert min(seq) > max(int(e["SEQUENCE"]) for e in events(ics_all(hostile_loaded, NOW)))


def test_a_changed_shift_keeps_its_uid(tmp_path: Path) -> None:
    a = load_workspace(write_ws(tmp_path / "a", rows={"p1": "E -"}, shifts=SHIFTS))
    b = load_workspace(write_ws(tmp_path / "b", rows={"p1": "N -"}, shifts=SHIFTS))
    (ea,), (eb,) = events(ics_all(a, NOW)), events(ics_all(b, NOW))
    assert str(ea["UID"]) == str(eb["UID"])
    assert str(ea["SUMMARY"]) != str(eb["SUMMARY"])


def test_utc_unit_needs_no_zone_definition(tmp_path: Path) -> None:
    ws = load_workspace(write_ws(tmp_path / "ws", rows={"p1": "N"}, shifts=SHIFTS))
    text = ics_all(ws, NOW)
    assert "VTIMEZONE" not in text
    (event,) = events(text)
    assert utc(event, "DTEND") == datetime(2027, 3, 2, 7, tzinfo=UTC)


def test_names_and_notes_survive_as_text(hostile_loaded: Workspace) -> None:
    uids = by_uid(ics_all(hostile_loaded, NOW))
    cell = next(e for uid, e in uids.items() if uid.startswith("p1-2027-03-23@"))
    assert str(cell["SUMMARY"]) == f"{FORMULA_NAME}: Early (E)"
    description = str(cell["DESCRIPTION"])
    assert SCRIPT_NOTE in description.splitlines()
    assert description.splitlines()[0] == "Ward & <i>B</i>"


def test_one_calendar_per_person(hostile_loaded: Workspace) -> None:
    files = ics_per_person(hostile_loaded, NOW)
    assert sorted(files) == ["p1.ics", "p2.ics", "p3.ics"]
    p1 = events(files["p1.ics"])
    assert [str(e["SUMMARY"]) for e in p1] == ["Early (E)", "Early (E)", "Night (N)"]
    assert str(Calendar.from_ical(files["p1.ics"])["X-WR-CALNAME"]).startswith(FORMULA_NAME)
    assert sum(len(events(t)) for t in files.values()) == worked()
    all_uids = set(by_uid(ics_all(hostile_loaded, NOW)))
    assert {str(e["UID"]) for t in files.values() for e in events(t)} == all_uids
