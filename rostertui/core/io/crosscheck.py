"""Checks that span files: every id, code and date a file names must exist and fit."""

from __future__ import annotations

import difflib
from collections.abc import Collection
from dataclasses import dataclass, field
from datetime import date

from rostertui.core.io.errors_map import KeyPath, key_path_text
from rostertui.core.io.report import Report
from rostertui.core.models.common import NIGHT_SELECTOR, OFF
from rostertui.core.models.history import History
from rostertui.core.models.requests import RequestsFile
from rostertui.core.models.roster import Roster
from rostertui.core.models.rules import NotAvailable, Rule, selectors_of
from rostertui.core.models.shifts import ShiftsFile
from rostertui.core.models.staff import Staff
from rostertui.core.models.unit import Unit

STAFF, SHIFTS, REQUESTS, HISTORY, ROSTER, UNIT = (
    "staff.toml",
    "shifts.toml",
    "requests.toml",
    "history.toml",
    "roster.toml",
    "unit.toml",
)


def near(value: str, known: Collection[str]) -> str:
    """ " (did you mean 'x'?)" for the closest known name, or "" with none close."""
    hint = difflib.get_close_matches(value, sorted(known), n=1, cutoff=0.6)
    return f" (did you mean {hint[0]!r}?)" if hint else ""


@dataclass
class KnownNames:
    """Names a file gives even where its entry is invalid (so errors do not cascade)."""

    people: set[str] = field(default_factory=set)
    codes: set[str] = field(default_factory=set)
    skills: set[str] = field(default_factory=set)


class CrossCheck:
    """Runs every cross-file check of one workspace into a Report.

    `unit` may be None when unit.toml itself was unreadable: the checks that need
    the period are then skipped, the others still run.
    """

    def __init__(
        self,
        unit: Unit | None,
        staff: Staff,
        shifts: ShiftsFile,
        report: Report,
        names: KnownNames | None = None,
    ):
        self.unit = unit
        self.report = report
        names = names or KnownNames()
        self.people = {p.id for p in staff.person} | names.people
        self.codes = {s.code for s in shifts.shift} | names.codes
        self.skills = {skill for p in staff.person for skill in p.skills} | names.skills
        self.used_skills = _used_skills(shifts)
        self.unnamed: list[tuple[str, KeyPath, str]] = []  # codes named while none is defined

    def finish(self) -> None:
        """What is said once for the whole workspace, after every file is checked."""
        if self.unnamed:
            files = sorted({file for file, _, _ in self.unnamed})
            file, path, code = self.unnamed[0]
            where = key_path_text(path)
            self.report.error(
                SHIFTS, (),
                f"no shift is defined, yet {len(self.unnamed)} shift code(s) are named in "
                f"{', '.join(files)} (the first: {code!r} at {file} {where}); add the "
                "[[shift]] entries (code, name, start, end) before a roster, history, "
                "request or rule names them",
            )

    # -- helpers -----------------------------------------------------------------------
    def person(self, file: str, path: KeyPath, pid: str) -> bool:
        if pid in self.people:
            return True
        self.report.error(file, path, f"unknown person {pid!r}{near(pid, self.people)}")
        return False

    def code(self, file: str, path: KeyPath, code: str, *, off_ok: bool = True) -> None:
        if code in self.codes or (off_ok and code == OFF):
            return
        if not self.codes:  # no shift at all: said once, by finish(), not per cell
            self.unnamed.append((file, path, code))
            return
        expected = sorted(self.codes) + ([OFF] if off_ok else [])
        self.report.error(
            file,
            path,
            f"unknown shift code {code!r}{near(code, self.codes)}; expected one of "
            + ", ".join(repr(c) for c in expected),
        )

    def in_period(self, file: str, path: KeyPath, day: date, what: str) -> None:
        if self.unit is not None and not self.unit.in_period(day):
            self.report.warn(
                file,
                path,
                f"{what} {day} is outside the period {self.unit.start} to {self.unit.end}; "
                "ignored",
            )

    # -- files -------------------------------------------------------------------------
    def staff(self, staff: Staff) -> None:
        seen: dict[str, int] = {}
        for i, p in enumerate(staff.person):
            if p.id in seen:
                self.report.error(
                    STAFF, ("person", i, "id"), f"person id {p.id!r} is already used by "
                    f"person[{seen[p.id]}]"
                )
            seen.setdefault(p.id, i)

    def shifts(self, shifts: ShiftsFile, staff: Staff) -> None:
        seen: dict[str, int] = {}
        for i, s in enumerate(shifts.shift):
            if s.code in seen:
                self.report.error(
                    SHIFTS, ("shift", i, "code"),
                    f"shift code {s.code!r} is already used by shift[{seen[s.code]}]",
                )
            seen.setdefault(s.code, i)
            for j, skill in enumerate(s.requires):
                self.skill(("shift", i, "requires", j), skill)
        for i, c in enumerate(shifts.cover):
            self.code(SHIFTS, ("cover", i, "shift"), c.shift, off_ok=False)
            if c.skill is not None:
                self.skill(("cover", i, "skill"), c.skill)
            for j, day in enumerate(c.dates or []):
                self.in_period(SHIFTS, ("cover", i, "dates", j), day, "cover date")
        self.staff_skills(staff)

    def skill(self, path: KeyPath, skill: str) -> None:
        if skill not in self.skills:
            self.report.error(
                SHIFTS, path,
                f"unknown skill {skill!r}: no one in staff.toml holds it"
                + near(skill, self.skills),
            )

    def staff_skills(self, staff: Staff) -> None:
        """A staff skill that nothing uses but is a near miss of one that is: a typo."""
        used = self.used_skills
        for i, p in enumerate(staff.person):
            for j, skill in enumerate(p.skills):
                if skill in used or len(skill) < 4:
                    continue
                hint = difflib.get_close_matches(skill, sorted(used), n=1, cutoff=0.85)
                if hint:
                    self.report.error(
                        STAFF, ("person", i, "skills", j),
                        f"unknown skill {skill!r}: no shift or cover uses it; "
                        f"did you mean {hint[0]!r}?",
                    )

    def requests(self, req: RequestsFile) -> None:
        for i, leave in enumerate(req.leave):
            self.person(REQUESTS, ("leave", i, "person"), leave.person)
            if self.unit is None:
                pass
            elif leave.last < self.unit.start or leave.from_ > self.unit.end:
                self.report.warn(
                    REQUESTS, ("leave", i),
                    f"leave {leave.from_} to {leave.last} lies outside the period; ignored",
                )
            elif leave.from_ < self.unit.start or leave.last > self.unit.end:
                self.report.warn(
                    REQUESTS, ("leave", i), "leave reaches outside the period; clipped to it"
                )
        for i, r in enumerate(req.request):
            self.person(REQUESTS, ("request", i, "person"), r.person)
            if r.want is not None and r.want != "off":
                if r.want == OFF:
                    self.report.error(
                        REQUESTS, ("request", i, "want"),
                        "write want = \"off\" for a day off (\"-\" is the roster's off code)",
                    )
                else:
                    self.code(REQUESTS, ("request", i, "want"), r.want, off_ok=False)
            if r.avoid is not None:
                self.code(REQUESTS, ("request", i, "avoid"), r.avoid, off_ok=False)
            self.in_period(REQUESTS, ("request", i, "date"), r.date, "request date")

    def history(self, hist: History) -> None:
        for pid, row in hist.rows.items():
            if self.person(HISTORY, ("rows", pid), pid):
                for j, code in enumerate(row):
                    self.code(HISTORY, ("rows", pid, j), code)
        for pid in hist.hours_before:
            self.person(HISTORY, ("hours_before", pid), pid)

    def roster(self, roster: Roster, label: str = ROSTER) -> None:
        unit = self.unit
        if unit is not None and (roster.start != unit.start or roster.days != unit.days):
            self.report.error(
                label, ("start",),
                f"the roster covers {roster.days} days from {roster.start}, but the unit's "
                f"period is {unit.days} days from {unit.start}",
            )
        for pid, row in roster.rows.items():
            if not self.person(label, ("rows", pid), pid):
                continue
            if len(row) != roster.days:
                self.report.error(
                    label, ("rows", pid),
                    f"row has {len(row)} codes; expected {roster.days}, one per day",
                )
            for j, code in enumerate(row):
                self.code(label, ("rows", pid, j), code)
        for pid in sorted(self.people - set(roster.rows)):
            self.report.warn(label, ("rows",), f"no row for {pid!r}; taken as off every day")
        for i, lock in enumerate(roster.lock):
            self.person(label, ("lock", i, "person"), lock.person)
            for j, day in enumerate(lock.dates):
                if self.unit is not None and not self.unit.in_period(day):
                    self.report.error(
                        label, ("lock", i, "dates", j),
                        f"locked date {day} is outside the period "
                        f"{self.unit.start} to {self.unit.end}",
                    )

    def unit_dates(self) -> None:
        assert self.unit is not None  # called once the unit loaded
        for i, day in enumerate(self.unit.holidays):
            self.in_period(UNIT, ("holidays", i), day, "holiday")

    def rule(self, file: str, index: int, rule: Rule) -> None:
        base = ("rule", index)
        for j, pid in enumerate(rule.people or []):
            self.person(file, (*base, "people", j), pid)
        for j, pid in enumerate(rule.except_):
            self.person(file, (*base, "except", j), pid)
        for key, selector in selectors_of(rule):
            path = (*base, *_split(key))
            if selector == NIGHT_SELECTOR and key != "metric":
                continue
            self.code(file, path, selector, off_ok=key.startswith("then"))
        if isinstance(rule, NotAvailable):
            for j, day in enumerate(rule.dates or []):
                self.in_period(file, (*base, "dates", j), day, "date")


def _split(key: str) -> tuple[str | int, ...]:
    if "[" in key:
        name, idx = key.rstrip("]").split("[")
        return (name, int(idx))
    return (key,)


def _used_skills(shifts: ShiftsFile) -> set[str]:
    used = {c.skill for c in shifts.cover if c.skill is not None}
    for s in shifts.shift:
        used.update(s.requires)
    return used
