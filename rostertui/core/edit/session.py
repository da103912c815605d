"""The editing session: the workspace, the current roster, its check.

Pure Python (no textual import), so every editing rule is unit-tested without a
terminal; the UI edits through it. A roster is treated as immutable: each change
builds a new `Roster` and pushes (before, after) on the undo stack, so undo, redo and "unsaved" are
plain comparisons. The requests file is held the same way: an absence adds leave
and clears shifts in one step, so a step records both files, and undo restores both
exactly. The session's workspace always carries the current requests, so the check,
the statistics and a solve see the leave. The checker and the statistics run after
every change (a few milliseconds for 100 people x 31 days).
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass
from datetime import date
from pathlib import Path

from rostertui.core.check import CheckResult, check_roster
from rostertui.core.edit.plans import AbsencePlan, SwapPlan, date_of, plan_absence, plan_swap
from rostertui.core.edit.rosters import changed_cells
from rostertui.core.errors import EditError, Problem
from rostertui.core.io.published import Published, stage_publish
from rostertui.core.io.transaction import Transaction, transaction
from rostertui.core.models.common import OFF
from rostertui.core.models.requests import RequestsFile
from rostertui.core.models.roster import Lock, Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.rows import normalised
from rostertui.core.stats import RosterStats, roster_stats

__all__ = ["Change", "Session", "changed_cells"]

UNDO_DEPTH = 500


@dataclass(frozen=True)
class Change:
    """One undoable step: both files as they were before it and after it."""

    label: str
    before: Roster
    after: Roster
    requests_before: RequestsFile
    requests_after: RequestsFile


class Session:
    """The workspace being edited: current roster, its check and statistics, undo."""

    def __init__(self, ws: Workspace, roster: Roster | None = None,
                 requests: RequestsFile | None = None):
        """`roster`, `requests`: the ones being edited, when they are not those on disk
        (after an editor changed another file, the unsaved changes carry over)."""
        self.saved = normalised(ws, ws.roster)
        self.saved_requests = ws.requests
        self.ws = ws if requests is None else dataclasses.replace(ws, requests=requests)
        self.roster = normalised(ws, roster) if roster is not None else self.saved
        self.had_file = ws.roster is not None
        self.wrote: list[Path] = []  # the files the last save wrote
        self.notices: list[str] = []  # what the last save wants known (a backup kept)
        self._undo: list[Change] = []
        self._redo: list[Change] = []
        self.check: CheckResult
        self.stats: RosterStats
        self._evaluate()

    # -- reading ------------------------------------------------------------------------
    @property
    def requests(self) -> RequestsFile:
        return self.ws.requests

    @property
    def dirty(self) -> bool:
        """Unsaved changes: the roster or the requests differ from those on disk."""
        return self.roster != self.saved or self.requests_dirty

    @property
    def requests_dirty(self) -> bool:
        return self.requests != self.saved_requests

    def unsaved_changes(self) -> int:
        """Cells changed, plus one for changed locks and one per leave or request entry
        added or removed since the files were read or saved."""
        count = len(changed_cells(self.saved, self.roster))
        count += int(self.saved.lock != self.roster.lock)
        for new, old in ((self.requests.leave, self.saved_requests.leave),
                         (self.requests.request, self.saved_requests.request)):
            count += sum(1 for x in new if x not in old) + sum(1 for x in old if x not in new)
        return count

    @property
    def can_undo(self) -> bool:
        return bool(self._undo)

    @property
    def can_redo(self) -> bool:
        return bool(self._redo)

    @property
    def codes(self) -> list[str]:
        return [s.code for s in self.ws.shifts.shift]

    def code(self, pid: str, day: int) -> str:
        return self.roster.rows[pid][day]

    def locked(self, pid: str, day: int) -> bool:
        return day in self._locks.get(pid, ())

    def locked_cells(self) -> dict[str, frozenset[int]]:
        return dict(self._locks)

    def resolve_code(self, typed: str) -> str:
        """The shift code a typed text means ("-", "off", "" and " " mean off);
        case is forgiven when only one code matches. Raises EditError."""
        text = typed.strip()
        if text in ("", OFF) or text.lower() == "off":
            return OFF
        if text in self.ws.shift_by_code:
            return text
        folded = [c for c in self.codes if c.lower() == text.lower()]
        if len(folded) == 1:
            return folded[0]
        raise EditError(f"no shift {text!r}; shifts: {', '.join(self.codes)} and - (off)")

    def workspace_for_solve(self) -> Workspace:
        """The workspace with the current roster (warm start, locks) in place of the file's."""
        return dataclasses.replace(self.ws, roster=self.roster)

    # -- changing -----------------------------------------------------------------------
    def set_cell(self, pid: str, day: int, typed: str) -> Change | None:
        """Put a shift code (or off) in a cell; None when it already holds it."""
        code = self.resolve_code(typed)
        self._need_cell(pid, day)
        if self.locked(pid, day):
            raise EditError("the cell is locked; unlock it first")
        old = self.roster.rows[pid]
        if old[day] == code:
            return None
        row = list(old)
        row[day] = code
        rows = {**self.roster.rows, pid: row}
        shown = "off" if code == OFF else code
        # the [solve] record describes the solver's roster, not a hand-edited one
        return self._apply(self.roster.model_copy(update={"rows": rows, "solve": None}),
                           f"{pid} day {day + 1}: {old[day]} -> {shown}")

    def toggle_lock(self, pid: str, day: int) -> bool:
        """Lock or unlock a cell; returns the new state (True = locked)."""
        self._need_cell(pid, day)
        locks: dict[str, set[int]] = {p: set(d) for p, d in self._locks.items()}
        now = day not in locks.setdefault(pid, set())
        if now:
            locks[pid].add(day)
        else:
            locks[pid].discard(day)
        dates = self.ws.unit.dates
        order = [lk.person for lk in self.roster.lock] + [pid]
        seen: list[str] = []
        for p in order:
            if p not in seen and locks.get(p):
                seen.append(p)
        new_locks = [Lock(person=p, dates=[dates[i] for i in sorted(locks[p])]) for p in seen]
        verb = "lock" if now else "unlock"
        self._apply(self.roster.model_copy(update={"lock": new_locks}),
                    f"{verb} {pid} day {day + 1}")
        return now

    def preview_swap(self, pid: str, day: int, pid2: str, day2: int | None = None) -> SwapPlan:
        """What exchanging the cells would change and do to the check; nothing applied.
        Two people on two days exchange both days (four cells). Raises EditError."""
        first = date_of(self.ws, day)
        second = date_of(self.ws, day2) if day2 is not None else None
        return plan_swap(self.ws, self.roster, pid, first, pid2, second, self.check)

    def swap(self, pid: str, day: int, pid2: str, day2: int | None = None) -> Change | None:
        """Exchange the cells, undoably; None when they hold the same codes."""
        plan = self.preview_swap(pid, day, pid2, day2)
        return self._apply(normalised(self.ws, plan.roster), plan.label) if plan.cells else None

    def absent(self, pid: str, first: date, last: date | None = None, reason: str | None = None,
               credit_hours: float | None = None) -> AbsencePlan:
        """Record an absence as leave and clear the person's shifts on those days, in one
        undoable step. Raises EditError (nothing changed) with the reason."""
        plan = plan_absence(self.ws, self.roster, pid, first, last, reason or None, credit_hours,
                            self.check)
        self._apply(normalised(self.ws, plan.roster), plan.label, plan.requests)
        return plan

    def replace(self, roster: Roster, label: str) -> Change | None:
        """Take a whole roster (a solve's or a repair's result) as the current one, undoably."""
        new = normalised(self.ws, roster)
        if new == self.roster:
            return None
        return self._apply(new, label)

    def add_requests(self, requests: RequestsFile, label: str) -> Change | None:
        """Take a whole requests file holding more requests (an import), undoably; the
        roster is unchanged. None when it equals the current one."""
        if requests == self.requests:
            return None
        return self._apply(self.roster, label, requests)

    def undo(self) -> Change | None:
        if not self._undo:
            return None
        change = self._undo.pop()
        self._redo.append(change)
        self._set(change.before, change.requests_before)
        return change

    def redo(self) -> Change | None:
        if not self._redo:
            return None
        change = self._redo.pop()
        self._undo.append(change)
        self._set(change.after, change.requests_after)
        return change

    def save(self) -> Path:
        """Write roster.toml, and requests.toml when it changed (comments kept), in one
        transaction (both files or neither); the session is then clean. Returns the
        roster's path; `wrote` and `notices` tell the rest."""
        assert self.ws.path is not None, "a loaded workspace always has a path"
        with transaction(self.ws.path, "save") as tx:
            wrote = self._stage_save(tx)
        self._saved(wrote, tx.notices)
        return wrote[0]

    def publish(self, note: str = "") -> Published:
        """Save (as `save`) and keep the roster as the next published version, all in
        one transaction, so the version is exactly what the files hold."""
        assert self.ws.path is not None, "a loaded workspace always has a path"
        with transaction(self.ws.path, "publish") as tx:
            wrote = self._stage_save(tx)
            done = stage_publish(tx, self.roster, note)
        self._saved(wrote, tx.notices)
        return done

    def _stage_save(self, tx: Transaction) -> list[Path]:
        requests = [tx.save(self.requests)] if self.requests_dirty else []
        return [tx.save(self.roster), *requests]

    def _saved(self, wrote: list[Path], notices: list[Problem]) -> None:
        self.wrote = wrote
        self.notices = [str(p) for p in notices]
        self.saved_requests = self.requests
        self.saved = self.roster
        self.had_file = True

    # -- internals ----------------------------------------------------------------------
    def _need_cell(self, pid: str, day: int) -> None:
        if pid not in self.roster.rows:
            raise EditError(f"no person {pid!r} in staff.toml")
        if not 0 <= day < self.ws.unit.days:
            raise EditError(f"day {day + 1} is outside the period")

    def _apply(self, roster: Roster, label: str, requests: RequestsFile | None = None) -> Change:
        requests = self.requests if requests is None else requests
        change = Change(label, self.roster, roster, self.requests, requests)
        self._undo.append(change)
        del self._undo[:-UNDO_DEPTH]
        self._redo.clear()
        self._set(roster, requests)
        return change

    def _set(self, roster: Roster, requests: RequestsFile) -> None:
        self.roster = roster
        if requests is not self.ws.requests:  # leave counts: check and solve must see it
            self.ws = dataclasses.replace(self.ws, requests=requests)
        self._evaluate()

    def _evaluate(self) -> None:
        start = self.ws.unit.start
        n = self.ws.unit.days
        locks: dict[str, set[int]] = {}
        for lock in self.roster.lock:
            for d in lock.dates:
                i = (d - start).days
                if 0 <= i < n:
                    locks.setdefault(lock.person, set()).add(i)
        self._locks = {p: frozenset(days) for p, days in locks.items()}
        self.check = check_roster(self.ws, self.roster)
        self.stats = roster_stats(self.ws, self.roster, self.check)
