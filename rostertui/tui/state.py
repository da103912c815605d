"""The editing session behind the UI: the workspace, the current roster, its check.

Pure Python (no textual import), so every editing rule is unit-tested without a
terminal. A roster is treated as immutable: each change builds a new `Roster`
and pushes (before, after) on the undo stack, so undo, redo and "unsaved" are
plain comparisons. The checker and the statistics run after every change (a
few milliseconds for 100 people x 31 days).
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass
from pathlib import Path

from rostertui.core.check import CheckResult, check_roster
from rostertui.core.io.save import save
from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Lock, Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.stats import RosterStats, roster_stats

UNDO_DEPTH = 500


class EditRefused(ValueError):
    """A hand edit the session will not make; the message says why, in words."""


@dataclass(frozen=True)
class Change:
    """One undoable step."""

    label: str
    before: Roster
    after: Roster


@dataclass(frozen=True)
class CellChange:
    person: str
    day: int
    before: str
    after: str


def normalised(ws: Workspace, roster: Roster | None) -> Roster:
    """One row of `days` codes per person, in staff order (a missing row is off)."""
    n = ws.unit.days
    given = roster.rows if roster is not None else {}
    rows = {}
    for pid in ws.person_ids:
        row = list(given.get(pid, ()))[:n]
        rows[pid] = row + [OFF] * (n - len(row))
    if roster is None:
        return Roster(start=ws.unit.start, days=n, rows=rows)
    return roster.model_copy(update={"rows": rows, "start": ws.unit.start, "days": n})


def keep_people(roster: Roster, ids: list[str]) -> Roster:
    """The roster without the rows and locks of people no longer in staff.toml."""
    keep = set(ids)
    return roster.model_copy(update={
        "rows": {pid: row for pid, row in roster.rows.items() if pid in keep},
        "lock": [lk for lk in roster.lock if lk.person in keep],
    })


def changed_cells(before: Roster, after: Roster) -> list[CellChange]:
    """Cells whose code differs, in row order then day order."""
    out: list[CellChange] = []
    for pid, new in after.rows.items():
        old = before.rows.get(pid, [OFF] * len(new))
        out += [CellChange(pid, i, a, b) for i, (a, b) in enumerate(zip(old, new, strict=False))
                if a != b]
    return out


class Session:
    """The workspace being edited: current roster, its check and statistics, undo."""

    def __init__(self, ws: Workspace, roster: Roster | None = None):
        """`roster`: the roster being edited, when it is not the one on disk (after an
        editor changed another file, the unsaved hand edits carry over)."""
        self.ws = ws
        self.saved = normalised(ws, ws.roster)
        self.roster = normalised(ws, roster) if roster is not None else self.saved
        self.had_file = ws.roster is not None
        self._undo: list[Change] = []
        self._redo: list[Change] = []
        self.check: CheckResult
        self.stats: RosterStats
        self._evaluate()

    # -- reading ------------------------------------------------------------------------
    @property
    def dirty(self) -> bool:
        """Unsaved changes: the roster differs from the one on disk."""
        return self.roster != self.saved

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
        case is forgiven when only one code matches. Raises EditRefused."""
        text = typed.strip()
        if text in ("", OFF) or text.lower() == "off":
            return OFF
        if text in self.ws.shift_by_code:
            return text
        folded = [c for c in self.codes if c.lower() == text.lower()]
        if len(folded) == 1:
            return folded[0]
        raise EditRefused(f"no shift {text!r}; shifts: {', '.join(self.codes)} and - (off)")

    def workspace_for_solve(self) -> Workspace:
        """The workspace with the current roster (warm start, locks) in place of the file's."""
        return dataclasses.replace(self.ws, roster=self.roster)

    # -- changing -----------------------------------------------------------------------
    def set_cell(self, pid: str, day: int, typed: str) -> Change | None:
        """Put a shift code (or off) in a cell; None when it already holds it."""
        code = self.resolve_code(typed)
        self._need_cell(pid, day)
        if self.locked(pid, day):
            raise EditRefused("the cell is locked; unlock it first")
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

    def replace(self, roster: Roster, label: str) -> Change | None:
        """Take a whole roster (a solve's result) as the current one, undoably."""
        new = normalised(self.ws, roster)
        if new == self.roster:
            return None
        return self._apply(new, label)

    def undo(self) -> Change | None:
        if not self._undo:
            return None
        change = self._undo.pop()
        self._redo.append(change)
        self._set(change.before)
        return change

    def redo(self) -> Change | None:
        if not self._redo:
            return None
        change = self._redo.pop()
        self._undo.append(change)
        self._set(change.after)
        return change

    def save(self) -> Path:
        """Write roster.toml atomically; the session is then clean."""
        assert self.ws.path is not None, "a loaded workspace always has a path"
        path = save(self.roster, self.ws.path)
        self.saved = self.roster
        self.had_file = True
        return path

    # -- internals ----------------------------------------------------------------------
    def _need_cell(self, pid: str, day: int) -> None:
        if pid not in self.roster.rows:
            raise EditRefused(f"no person {pid!r} in staff.toml")
        if not 0 <= day < self.ws.unit.days:
            raise EditRefused(f"day {day + 1} is outside the period")

    def _apply(self, roster: Roster, label: str) -> Change:
        change = Change(label, self.roster, roster)
        self._undo.append(change)
        del self._undo[:-UNDO_DEPTH]
        self._redo.clear()
        self._set(roster)
        return change

    def _set(self, roster: Roster) -> None:
        self.roster = roster
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
        self.stats = roster_stats(self.ws, self.roster)
