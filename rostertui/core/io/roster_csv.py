"""Read a roster made elsewhere from CSV with a header `person,date,shift`.

Extra columns (start, end, paid_hours of our own export) are allowed and ignored.
A person/date pair not in the file is off. Every bad row is reported with its line.
"""

from __future__ import annotations

import csv
import io
from datetime import date
from pathlib import Path
from typing import Any

from rostertui.core.errors import Problem
from rostertui.core.io.report import Report
from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster
from rostertui.core.models.unit import Unit

REQUIRED_COLUMNS = ("person", "date", "shift")
OFF_WORDS = {"", OFF, "off"}


def read_roster_csv(
    path: Path, unit: Unit, people: list[str], codes: set[str], report: Report
) -> Roster | None:
    label = path.name
    try:
        text = path.read_text(encoding="utf-8-sig")
    except (OSError, UnicodeDecodeError) as exc:
        report.error(label, (), f"cannot be read: {exc}")
        return None
    reader = csv.reader(io.StringIO(text, newline=""))
    try:
        return _read(reader, label, unit, people, codes, report)
    except csv.Error as exc:  # e.g. a field longer than the csv module's limit
        _bad(report, label, max(1, reader.line_num), f"not a readable CSV row ({exc})")
        return None


def _read(reader: Any, label: str, unit: Unit, people: list[str], codes: set[str],
          report: Report) -> Roster | None:
    header = next(reader, None)
    if header is None:
        report.error(label, (), "empty file; expected a header person,date,shift")
        return None
    names = [h.strip().lower() for h in header]
    missing = [c for c in REQUIRED_COLUMNS if c not in names]
    if missing:
        report.error(
            label, (), f"line 1: header lacks {', '.join(missing)}; expected person,date,shift"
        )
        return None
    col = {c: names.index(c) for c in REQUIRED_COLUMNS}
    rows = {pid: [OFF] * unit.days for pid in people}
    seen: dict[tuple[str, date], int] = {}
    known = set(people)
    for record in reader:
        lineno = reader.line_num
        if not any(field.strip() for field in record):
            continue
        if len(record) < len(names):
            _bad(report, label, lineno, f"{len(record)} fields; the header has {len(names)}")
            continue
        pid, raw_date, code = (record[col[c]].strip() for c in REQUIRED_COLUMNS)
        if pid not in known:
            _bad(report, label, lineno, f"unknown person {pid!r}")
            continue
        try:
            day = date.fromisoformat(raw_date)
        except ValueError:
            _bad(report, label, lineno, f"date {raw_date!r} is not a date like 2027-03-01")
            continue
        if not unit.in_period(day):
            _bad(report, label, lineno, f"date {day} is outside the period")
            continue
        code = OFF if code.lower() in OFF_WORDS else code
        if code != OFF and code not in codes:
            _bad(report, label, lineno, f"unknown shift code {code!r}")
            continue
        if (pid, day) in seen:
            _bad(report, label, lineno, f"{pid} on {day} is already given on line {seen[pid, day]}")
            continue
        seen[pid, day] = lineno
        rows[pid][(day - unit.start).days] = code
    return Roster(start=unit.start, days=unit.days, rows=rows)


def _bad(report: Report, label: str, lineno: int, message: str) -> None:
    report.problems.append(Problem(file=label, key="", message=message, line=lineno))
