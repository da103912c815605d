"""The decision variables: one Boolean per *possible* (person, day, shift) cell.

No variable exists where leave, a shift's `requires`, a hard `not-available` rule
or a lock rules the cell out; such cells are the constant False. Days before the
period come from history as constants; without history a person is off there.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from datetime import date, timedelta

from ortools.sat.python import cp_model

from rostertui.core.models.common import OFF
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver import not_available
from rostertui.core.solver.logic import Lit


@dataclass
class Cells:
    ws: Workspace
    model: cp_model.CpModel
    people: list[str] = field(init=False)
    codes: list[str] = field(init=False)
    n: int = field(init=False)
    x: dict[tuple[int, int, str], cp_model.IntVar] = field(init=False, default_factory=dict)
    locked: dict[tuple[int, int], str] = field(init=False, default_factory=dict)
    lock_conflicts: list[tuple[int, int, str, str]] = field(init=False, default_factory=list)
    frozen: int = 0  # days [0, frozen) keep the current roster's codes (repair, the past)
    relaxed: bool = False  # explain: leave, locks, hard not-available become switchable

    def __post_init__(self) -> None:
        ws = self.ws
        self.people = ws.person_ids
        self.pindex = {pid: i for i, pid in enumerate(self.people)}
        self.codes = [s.code for s in ws.shifts.shift]
        self.n = ws.unit.days
        self.start = ws.unit.start
        self._on: dict[tuple[int, int, frozenset[str]], Lit] = {}
        history = ws.history.rows if ws.history is not None else {}
        self.history = [tuple(history.get(pid, ())) for pid in self.people]
        allowed = self._allowed()
        self._read_locks()
        self._freeze()
        for p, pid in enumerate(self.people):
            for d in range(self.n):
                lock = self.locked.get((p, d))
                for code in allowed[p][d]:
                    if lock is not None and code != lock:
                        continue
                    self.x[p, d, code] = self.model.new_bool_var(f"x[{pid},{d},{code}]")
                if lock is not None and lock != OFF and (p, d, lock) not in self.x:
                    self.lock_conflicts.append((p, d, lock, "the cell is ruled out"))
                cell = [self.x[p, d, c] for c in self.codes if (p, d, c) in self.x]
                if len(cell) > 1:
                    self.model.add_at_most_one(cell)
                if lock is not None and lock != OFF and cell:
                    self.model.add(cell[0] == 1)

    # -- which cells may hold a shift --------------------------------------------------
    def _allowed(self) -> list[list[list[str]]]:
        ws = self.ws
        leave: set[tuple[str, int]] = set()
        for lv in ws.requests.leave:
            for day in lv.dates():
                i = (day - self.start).days
                if 0 <= i < self.n:
                    leave.add((lv.person, i))
        blocked = not_available.blocked(ws, self.codes, self.start, self.n)
        shifts = ws.shift_by_code
        skills = {p.id: set(p.skills) for p in ws.staff.person}
        out: list[list[list[str]]] = []
        for pid in self.people:
            able = [c for c in self.codes if set(shifts[c].requires) <= skills[pid]]
            out.append([
                [] if (pid, d) in leave and not self.relaxed
                else [c for c in able if self.relaxed or (pid, d, c) not in blocked]
                for d in range(self.n)
            ])
        return out

    def _read_locks(self) -> None:
        roster = self.ws.roster
        if roster is None or self.relaxed:  # explaining: each lock is a switchable item
            return
        for lock in roster.lock:
            p = self.pindex.get(lock.person)
            row = roster.rows.get(lock.person)
            if p is None:
                continue
            for day in lock.dates:
                d = (day - self.start).days
                if 0 <= d < self.n:
                    self.locked[p, d] = row[d] if row is not None and d < len(row) else OFF

    def _freeze(self) -> None:
        """Days before `frozen` are fixed like locks, to the current roster's codes."""
        roster = self.ws.roster
        rows = roster.rows if roster is not None else {}
        for p, pid in enumerate(self.people):
            row = rows.get(pid, ())
            for d in range(min(self.frozen, self.n)):
                self.locked[p, d] = row[d] if d < len(row) else OFF

    # -- accessors ---------------------------------------------------------------------
    def date(self, d: int) -> date:
        return self.start + timedelta(days=d)

    def history_code(self, p: int, d: int) -> str | None:
        """Code on history day d < 0, or None before the person's history row."""
        row = self.history[p]
        i = len(row) + d
        return row[i] if 0 <= i < len(row) else None

    def var(self, p: int, d: int, code: str) -> Lit:
        if d < 0:
            return self.history_code(p, d) == code
        if d >= self.n:
            return False
        return self.x.get((p, d, code), False)

    def on(self, p: int, d: int, codes: frozenset[str]) -> Lit:
        """True when person p works one of `codes` on day d (history for d < 0)."""
        if d < 0:
            return self.history_code(p, d) in codes
        key = (p, d, codes)
        found = self._on.get(key)
        if found is None:
            lits = [self.x[p, d, c] for c in self.codes if c in codes and (p, d, c) in self.x]
            if not lits:
                found = False
            elif len(lits) == 1:
                found = lits[0]
            else:  # at most one shift a day, so the sum is the disjunction
                found = self.model.new_bool_var(f"on[{p},{d}]")
                self.model.add(found == sum(lits))
            self._on[key] = found
        return found

    def works(self, p: int, d: int) -> Lit:
        """True when person p works any shift on day d (history for d < 0; off before it)."""
        if d < 0:
            code = self.history_code(p, d)
            return code is not None and code != OFF
        if d >= self.n:
            return False
        return self.on(p, d, frozenset(self.codes))

    def hint_rows(self, rows: Mapping[int, Sequence[str]]) -> None:
        """Hint the search with a row of codes per person (index): a start that CP-SAT
        completes, or repairs where the rows break a rule."""
        for (p, d, code), var in self.x.items():
            row = rows.get(p)
            if row is not None:
                self.model.add_hint(var, int(row[d] == code))

    def cell(self, p: int, d: int) -> list[tuple[str, cp_model.IntVar]]:
        return [(c, self.x[p, d, c]) for c in self.codes if (p, d, c) in self.x]
