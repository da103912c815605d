"""Soft requests from a CSV (a spreadsheet, a form export) added to a workspace.

Columns: `person` and `date` (required); what is asked, in a `want` column (`off` or a
shift code), an `avoid` column (a shift code), or one `request` column (`off`, `N` for
"want N", `avoid N`); exactly one per row. `weight` (a whole number, default 1) and `note`
are optional. A shift code's case is forgiven when only one code matches; `-` means off.

Dates: `2027-03-05`; `5.3.2027` (day first); `05/03/2027` or `3/5/2027`, read day first
or month first, whichever falls in the period (both: ambiguous, refused). Every date must
fall in the period.

Duplicates: a row asking what an earlier row asks (same person, date, want/avoid) is an
error; a row identical to a request already in requests.toml (weight and note included)
is skipped, so importing the same file twice adds nothing; one that differs only in
weight or note is an error (edit requests.toml instead).

`plan_requests` reads, checks against the workspace and then has the loader judge the
whole would-be workspace, so every problem comes back on its CSV line; nothing is written.
"""

from __future__ import annotations

import re
from collections import Counter
from dataclasses import dataclass, field
from datetime import date
from pathlib import Path

from pydantic import ValidationError

from rostertui.core.errors import InputError, Problem
from rostertui.core.intake.sheet import Row, Sheet, read_sheet
from rostertui.core.intake.trial import relabel, trial_load
from rostertui.core.io.crosscheck import near
from rostertui.core.io.save import render
from rostertui.core.models.common import OFF
from rostertui.core.models.requests import Request, RequestsFile
from rostertui.core.models.rules import MAX_WEIGHT
from rostertui.core.models.workspace import Workspace

REQUIRED = ("person", "date")
OPTIONAL = ("want", "avoid", "request", "weight", "note")
ALIASES = {"person id": "person", "id": "person", "day": "date", "notes": "note",
           "comment": "note", "comments": "note"}


@dataclass
class RequestsImport:
    """What an import would do: the requests to add and the rows skipped (each with its
    CSV line), every problem, and requests.toml's data afterwards."""

    label: str
    added: list[tuple[int, Request]] = field(default_factory=list)
    skipped: list[tuple[int, Request]] = field(default_factory=list)
    problems: list[Problem] = field(default_factory=list)
    requests: RequestsFile | None = None  # None while there are problems

    @property
    def ok(self) -> bool:
        return not self.problems

    def per_person(self) -> dict[str, int]:
        return dict(Counter(r.person for _, r in self.added))

    def skipped_notices(self) -> list[Problem]:
        return [Problem(self.label, "", f"{r.person} on {r.date}: already in requests.toml; "
                        "skipped", line) for line, r in self.skipped]


def plan_requests(path: Path, ws: Workspace) -> RequestsImport:
    """Read `path` and check it against `ws` (whose `requests` are the current ones) and
    then with the loader; nothing is written. `ws.path` is the workspace folder."""
    out = read_requests_csv(Path(path), ws)
    if out.ok and out.added:
        _loader_verdict(out, ws)
    return out


def read_requests_csv(path: Path, ws: Workspace) -> RequestsImport:
    sheet = read_sheet(path, required=REQUIRED, optional=OPTIONAL, aliases=ALIASES)
    out = RequestsImport(sheet.label)
    if sheet.rows and not {"want", "avoid", "request"} & set(sheet.columns):
        sheet.bad(1, "", "the header needs a want, avoid or request column saying what "
                  "is asked (off, a shift code, avoid and a shift code)")
    elif not sheet.problems and not sheet.rows:
        sheet.bad(None, "", "holds a header but no requests; one row per request")
    existing = list(ws.requests.request)
    seen: dict[tuple[str, date, str | None, str | None], int] = {}
    for row in [] if sheet.problems else sheet.rows:
        request = _request(sheet, row, ws)
        if request is None:
            continue
        key = (request.person, request.date, request.want, request.avoid)
        if key in seen:
            sheet.bad(row.line, "", f"the same request as line {seen[key]} "
                      f"({request.person} on {request.date})")
            continue
        seen[key] = row.line
        same = [i for i, r in enumerate(existing)
                if (r.person, r.date, r.want, r.avoid) == key]
        if any(existing[i] == request for i in same):
            out.skipped.append((row.line, request))
        elif same:
            old = existing[same[0]]
            sheet.bad(row.line, "", f"requests.toml already holds this request (request"
                      f"[{same[0]}], weight {old.weight}, note {old.note or 'none'}); change "
                      "it there, or leave this row out")
        else:
            out.added.append((row.line, request))
    out.problems = sorted(sheet.problems, key=lambda p: p.line or 0)
    if out.ok:
        out.requests = ws.requests.model_copy(
            update={"request": [*existing, *(r for _, r in out.added)]})
    return out


def _request(sheet: Sheet, row: Row, ws: Workspace) -> Request | None:
    before = len(sheet.problems)
    pid = row.get("person")
    if not pid:
        sheet.bad(row.line, "person", "empty person; give the person's id from staff.toml")
    elif pid not in ws.person_by_id:
        sheet.bad(row.line, "person", f"unknown person {pid!r}{near(pid, ws.person_ids)}")
    day = _date(sheet, row, ws)
    asked = _asked(sheet, row, ws)
    weight = _weight(sheet, row)
    note = row.get("note").replace("\r\n", "\n").replace("\r", "\n") or None
    if len(sheet.problems) > before or asked is None or day is None:
        return None
    want, avoid = asked
    try:
        return Request(person=pid, date=day, want=want, avoid=avoid, weight=weight, note=note)
    except ValidationError as exc:
        for err in exc.errors(include_url=False):
            column = str(err["loc"][0]) if err["loc"] else ""
            sheet.bad(row.line, column, err["msg"].removeprefix("Value error, "))
        return None


def _weight(sheet: Sheet, row: Row) -> int:
    text = row.get("weight")
    if not text:
        return 1
    if re.fullmatch(r"\+?[0-9]+", text) and 1 <= int(text) <= MAX_WEIGHT:
        return int(text)
    sheet.bad(row.line, "weight", f"weight {text!r} is not a whole number from 1 to "
              f"{MAX_WEIGHT}")
    return 1


def _asked(sheet: Sheet, row: Row, ws: Workspace) -> tuple[str | None, str | None] | None:
    """(want, avoid) of a row, or None (and the problem)."""
    given = [(c, row.get(c)) for c in ("want", "avoid", "request") if row.get(c)]
    if len(given) != 1:
        what = " and ".join(c for c, _ in given) if given else "none of want, avoid, request"
        sheet.bad(row.line, "", f"{what} given; fill exactly one per row (want: off or a "
                  "shift code; avoid: a shift code)")
        return None
    column, text = given[0]
    if column == "request":
        words = text.split(None, 1)
        if len(words) == 2 and words[0].lower() in ("want", "avoid"):
            column, text = words[0].lower(), words[1].strip()
        else:
            column = "want"
    if text.lower() in ("off", OFF):
        if column == "avoid":
            sheet.bad(row.line, given[0][0], "avoid takes a shift code; for a day off ask "
                      "want off")
            return None
        return "off", None
    code = _code(text, ws)
    if code is None:
        codes = ", ".join(s.code for s in ws.shifts.shift) or "none defined yet"
        sheet.bad(row.line, given[0][0], f"unknown shift code {text!r}"
                  f"{near(text, [s.code for s in ws.shifts.shift])}; shifts: {codes}"
                  + ("" if column == "avoid" else "; or off"))
        return None
    return (code, None) if column == "want" else (None, code)


def _code(text: str, ws: Workspace) -> str | None:
    if text in ws.shift_by_code:
        return text
    folded = [s.code for s in ws.shifts.shift if s.code.lower() == text.lower()]
    return folded[0] if len(folded) == 1 else None


def _date(sheet: Sheet, row: Row, ws: Workspace) -> date | None:
    text = row.get("date")
    unit = ws.unit
    period = f"the period {unit.start} to {unit.end}"
    if not text:
        sheet.bad(row.line, "date", "empty date; write it as YYYY-MM-DD, e.g. "
                  f"{unit.start}")
        return None
    readings = _readings(text)
    if not readings:
        sheet.bad(row.line, "date", f"{text!r} is not a date; write it as YYYY-MM-DD, "
                  f"e.g. {unit.start}")
        return None
    inside = [d for d in readings if unit.in_period(d)]
    if len(inside) == 1:
        return inside[0]
    if inside:
        sheet.bad(row.line, "date", f"{text!r} could be {inside[0]} or {inside[1]}; write "
                  "it as YYYY-MM-DD")
    else:
        sheet.bad(row.line, "date", f"{readings[0]} is outside {period}")
    return None


def _readings(text: str) -> list[date]:
    """The dates `text` can mean: one for ISO and day.month.year, up to two for a/b/year."""
    found: list[tuple[int, int, int]] = []
    if m := re.fullmatch(r"([0-9]{4})-([0-9]{2})-([0-9]{2})", text):
        found = [(int(m[1]), int(m[2]), int(m[3]))]
    elif m := re.fullmatch(r"([0-9]{1,2})\.([0-9]{1,2})\.([0-9]{4})", text):
        found = [(int(m[3]), int(m[2]), int(m[1]))]
    elif m := re.fullmatch(r"([0-9]{1,2})/([0-9]{1,2})/([0-9]{4})", text):
        found = [(int(m[3]), int(m[2]), int(m[1])), (int(m[3]), int(m[1]), int(m[2]))]
    dates = []
    for y, mo, d in found:
        try:
            dates.append(date(y, mo, d))
        except ValueError:
            continue
    return list(dict.fromkeys(dates))


def _loader_verdict(out: RequestsImport, ws: Workspace) -> None:
    """Write the would-be requests.toml into a scratch copy and load it; problems (and
    warnings) about the new entries come back on their CSV lines."""
    assert out.requests is not None and ws.path is not None
    text = render(out.requests, ws.path).text
    first = len(out.requests.request) - len(out.added)
    lines = {first + k: line for k, (line, _) in enumerate(out.added)}
    try:
        trial = trial_load({"requests.toml": text}, ws.path, ws.unit.include)
    except InputError as exc:
        out.problems = relabel(exc.problems, "requests.toml", "request", lines, out.label)
        out.requests = None
        return
    mine = relabel(trial.warnings, "requests.toml", "request", lines, out.label)
    out.problems = [p for p in mine if p.file == out.label]
    if out.problems:
        out.requests = None
