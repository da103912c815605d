"""The conflicting items as sentences naming shifts, skills, people and dates."""

from __future__ import annotations

from datetime import date, timedelta

from rostertui.core.explain import words
from rostertui.core.explain.reasons import Reason, unique
from rostertui.core.models.common import OFF
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.items import HardItem


def conflict_reason(ws: Workspace, items: list[HardItem], minimal: bool) -> Reason:
    near = {d for it in items for d in it.dates}
    people: list[str] = []
    parts: list[str] = []
    for kind in ("cover", "leave", "lock", "rule"):
        chosen = sorted((it for it in items if it.kind == kind), key=_order)
        if kind == "leave":
            texts, who = _leave_clauses(ws, chosen)
        else:
            said = [sentence(ws, it, near) for it in chosen]
            texts, who = [t for t, _ in said], [p for _, ps in said for p in ps]
        parts += texts
        people += who
    rules = unique([it.rule or it.kind for it in items])
    head = "No roster can keep all of these at once: "
    tail = "" if minimal else " (the time ran out before this set was made as small as it can be)"
    return Reason(head + "; ".join(parts) + "." + tail, rules, unique(people),
                  tuple(sorted(near)))


def _leave_clauses(ws: Workspace, leave: list[HardItem]) -> tuple[list[str], list[str]]:
    """One clause per leave span and reason: "a and b are on leave Sat 20 Mar"."""
    groups: dict[str, list[str]] = {}
    for it in leave:
        assert it.leave is not None and it.person is not None
        lv = ws.requests.leave[it.leave]
        why = f" ({lv.reason})" if lv.reason else ""
        groups.setdefault(f"{words.span(lv.from_, lv.last)}{why}", []).append(it.person)
    texts = [f"{words.people(ws, pids)} {'is' if len(pids) == 1 else 'are'} on leave {when}"
             for when, pids in groups.items()]
    return texts, [p for pids in groups.values() for p in pids]


def _order(it: HardItem) -> tuple[int, str, tuple[date, ...]]:
    rank = {"cover": 0, "leave": 1, "lock": 2, "rule": 3}[it.kind]
    return rank, it.person or "", it.dates


def sentence(ws: Workspace, it: HardItem, near: set[date]) -> tuple[str, list[str]]:
    """One item in words, and the people it names."""
    if it.kind == "cover":
        assert it.cover is not None
        c = ws.shifts.cover[it.cover]
        shift = ws.shift_by_code[c.shift]
        holders = [p.id for p in ws.staff.person
                   if (c.skill is None or c.skill in p.skills)
                   and set(shift.requires) <= set(p.skills)]
        who = (f"{len(holders)} qualified: {words.people(ws, holders)}" if holders
               else "nobody holds the skills it needs")
        return (f"{words.shift(ws, c.shift)} cover on {words.day(it.dates[0])} needs "
                f"{words.cover_need(ws, c)} ({who})", holders)
    assert it.person is not None
    name = words.person(ws, it.person)
    if it.kind == "leave":
        assert it.leave is not None
        lv = ws.requests.leave[it.leave]
        why = f" ({lv.reason})" if lv.reason else ""
        return f"{name} is on leave {words.span(lv.from_, lv.last)}{why}", [it.person]
    if it.kind == "lock":
        code = _locked_code(ws, it.person, it.dates[0])
        what = "off" if code == OFF else words.shift(ws, code)
        return f"{name} is locked to {what} on {words.day(it.dates[0])}", [it.person]
    rule = next(e.rule for e in ws.rules if e.rule.id == it.rule)
    context = _fixed_nearby(ws, it.person, near)
    return f"{name} must keep {words.rule_with_source(rule)}{context}", [it.person]


def _locked_code(ws: Workspace, pid: str, d: date) -> str:
    row = ws.roster.rows.get(pid, []) if ws.roster is not None else []
    i = (d - ws.unit.start).days
    return row[i] if 0 <= i < len(row) else OFF


def _fixed_nearby(ws: Workspace, pid: str, near: set[date]) -> str:
    """Shifts that cannot move (history, locks) within a day of the conflict's dates."""
    found: list[str] = []
    window = {d + timedelta(days=k) for d in near for k in (-1, 0, 1)}
    history = ws.history.rows.get(pid, []) if ws.history is not None else []
    for back, code in enumerate(reversed(history), start=1):
        day = ws.unit.start - timedelta(days=back)
        if day in window and code != OFF:
            found.append(f"worked {words.shift(ws, code)} on {words.day(day)}, before the period")
    roster = ws.roster
    for lock in roster.lock if roster is not None else []:
        if lock.person != pid:
            continue
        for d in lock.dates:
            code = _locked_code(ws, pid, d)
            if d in window and code != OFF:
                found.append(f"is locked to {words.shift(ws, code)} on {words.day(d)}")
    return f"; and {words.person(ws, pid)} " + " and ".join(found) if found else ""
