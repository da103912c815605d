"""`not-available` (rules.md): no shift (or no such shift) on the named weekdays or
dates; neither named = every day.

A hard rule's cells get no variable at all (cells.py asks `blocked`); the encoder
posts the soft rule, and the hard one only when explaining (cells are then relaxed).
"""

from __future__ import annotations

from datetime import date, timedelta
from typing import TYPE_CHECKING

from rostertui.core.models.common import WEEKDAYS
from rostertui.core.models.rules import NotAvailable
from rostertui.core.models.workspace import EffectiveRule, Workspace
from rostertui.core.solver.logic import forbid

if TYPE_CHECKING:  # terms.py imports cells.py, which imports this module
    from rostertui.core.solver.shared import Shared
    from rostertui.core.solver.terms import ModelBuilder


def named_days(rule: NotAvailable, start: date, n: int) -> list[int]:
    """Day indexes a not-available rule names (days and dates combine; neither = all)."""
    if rule.days is None and rule.dates is None:
        return list(range(n))
    weekdays = {WEEKDAYS.index(w) for w in rule.days or []}
    dates = set(rule.dates or [])
    days = [(d, start + timedelta(days=d)) for d in range(n)]
    return [d for d, day in days if day.weekday() in weekdays or day in dates]


def blocked(ws: Workspace, codes: list[str], start: date, n: int) -> set[tuple[str, int, str]]:
    """(person, day, code) cells a hard not-available rule rules out."""
    out: set[tuple[str, int, str]] = set()
    for eff in ws.rules:
        rule = eff.rule
        if isinstance(rule, NotAvailable) and rule.weight is None:
            selected = ws.select(rule.shift) if rule.shift else frozenset(codes)
            for d in named_days(rule, start, n):
                for pid in eff.people:
                    for code in selected:
                        out.add((pid, d, code))
    return out


def not_available(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    """Soft part, and the hard part when explaining: otherwise hard not-available cells
    have no variable at all (`blocked`, read by cells.py)."""
    rule = eff.rule
    assert isinstance(rule, NotAvailable)
    cells = b.cells
    if rule.weight is None and not cells.relaxed:
        return
    codes = cells.ws.select(rule.shift) if rule.shift else frozenset(cells.codes)
    for pid in eff.people:
        p = cells.pindex[pid]
        for d in named_days(rule, cells.start, cells.n):
            works = cells.on(p, d, frozenset(codes))
            if rule.weight is None:
                b.hard(forbid(b.model, [works]))
            else:
                b.add(rule.id, rule.kind, pid, (cells.date(d),), rule.weight, works)
