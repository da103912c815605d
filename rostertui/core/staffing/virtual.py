"""Extra people who exist only in memory: one more pair of hands for a what-if or a plan.

An extra person has the skills asked for and no contract: the rules' scopes were
resolved when the workspace was loaded (`EffectiveRule.people`), so a person added
afterwards is in no rule's scope, has no requests and no history (off before the
period). Only the shifts' `requires` and cover see them, which is what a bank or
agency shift is. Where they may work is limited by hard `not-available` rules of
their own (origin `ORIGIN`), so the solver and the checker both read it through the
same path as any other rule. The workspace on disk is never touched: this returns a
copy, and the real roster files never name these people.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from datetime import date

from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster
from rostertui.core.models.rules import NotAvailable
from rostertui.core.models.staff import Person, Staff
from rostertui.core.models.workspace import EffectiveRule, Workspace

ORIGIN = "extra staff (in memory)"
PREFIX = "extra"  # extra people's ids: extra-1, extra-2, ... (never a real person's id)


@dataclass(frozen=True)
class Extra:
    """One extra person: their skills and the (date, shift) cells they may work; with
    `cells` None, any shift their skills allow on any day."""

    skills: tuple[str, ...]
    cells: frozenset[tuple[date, str]] | None = None
    name: str = "extra staff"


def free_id(ws: Workspace, n: int) -> str:
    """The n-th extra person's id, not taken by anyone on the staff list."""
    taken = set(ws.person_ids)
    k = n
    while f"{PREFIX}-{k}" in taken:
        k += 1000
    return f"{PREFIX}-{k}"


def with_extra(ws: Workspace, extras: Sequence[Extra]) -> tuple[Workspace, list[str]]:
    """A copy of `ws` with the extra people on its staff list (and an off row each in
    its roster, if it has one); returns it and their ids in order."""
    ids = [free_id(ws, i + 1) for i in range(len(extras))]
    people = [Person(id=pid, name=f"{x.name} {i + 1}", skills=list(x.skills))
              for i, (pid, x) in enumerate(zip(ids, extras, strict=True))]
    rules = list(ws.rules)
    codes = [s.code for s in ws.shifts.shift]
    for pid, x in zip(ids, extras, strict=True):
        if x.cells is not None:
            rules.extend(_only(pid, x.cells, ws.dates, codes))
    roster = ws.roster
    if roster is not None:
        rows = dict(roster.rows)
        rows.update({pid: [OFF] * roster.days for pid in ids})
        roster = roster.model_copy(update={"rows": rows, "solve": None})
    copy = dataclasses.replace(
        ws, staff=Staff(person=[*ws.staff.person, *people]), rules=rules, roster=roster)
    return copy, ids


def _only(pid: str, cells: Iterable[tuple[date, str]], dates: Sequence[date],
          codes: Sequence[str]) -> list[EffectiveRule]:
    """Hard not-available rules that leave `pid` only `cells`."""
    allowed: dict[date, set[str]] = {}
    for day, code in cells:
        allowed.setdefault(day, set()).add(code)
    out: list[EffectiveRule] = []
    never = [d for d in dates if d not in allowed]
    if never:
        out.append(_rule(f"{pid}-days", pid, dates=never))
    for day in sorted(allowed):
        for code in codes:
            if code not in allowed[day]:
                out.append(_rule(f"{pid}-{day.isoformat()}-{code}", pid, dates=[day], shift=code))
    return out


def _rule(rid: str, pid: str, *, dates: list[date], shift: str | None = None) -> EffectiveRule:
    rule = NotAvailable.model_validate(
        {"id": rid, "kind": "not-available", "people": [pid], "dates": dates, "shift": shift,
         "source": ORIGIN})
    return EffectiveRule(rule=rule, origin=ORIGIN, people=(pid,))


def real_rows(roster: Roster, ids: Iterable[str]) -> Roster:
    """`roster` without the extra people's rows."""
    gone = set(ids)
    return roster.model_copy(
        update={"rows": {pid: row for pid, row in roster.rows.items() if pid not in gone}})
