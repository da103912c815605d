"""`roster_stats`: the statistics of a roster, computed on the checker's `Grid`; whether a
request is honoured is the checker's verdict (`CheckResult.requests`)."""

from __future__ import annotations

from fractions import Fraction

from rostertui.core.check.builtin import request_outcomes
from rostertui.core.check.grid import Grid, exact
from rostertui.core.check.result import CheckResult, RequestOutcome
from rostertui.core.check.stretches import stretches
from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster
from rostertui.core.models.rules import HoursRule
from rostertui.core.models.workspace import Workspace
from rostertui.core.stats.result import EVERYONE, GroupStats, PersonStats, RosterStats, Summary


def _hours_rules(ws: Workspace, pid: str) -> list[HoursRule]:
    """The effective `hours` rules whose scope includes the person, in rule order."""
    return [eff.rule for eff in ws.rules if isinstance(eff.rule, HoursRule) and pid in eff.people]


def _first(rules: list[HoursRule], key: str) -> Fraction | None:
    """`min`, `max` or `target` from the first of the rules that gives it (a unit often
    keeps a hard band and a soft target in two rules)."""
    for rule in rules:
        value = getattr(rule, key)
        if value is not None:
            return exact(value)
    return None


def _requests(grid: Grid, outcomes: list[RequestOutcome]) -> dict[str, list[bool]]:
    """Per person, whether each request inside the period was honoured (the checker's
    verdicts)."""
    found: dict[str, list[bool]] = {pid: [] for pid in grid.rows}
    for o in outcomes:
        found[o.request.person].append(o.honoured)
    return found


def _working(code: str) -> bool:
    return code != OFF


def _person(
    ws: Workspace, grid: Grid, pid: str, honoured: list[bool], weekend_days: frozenset[int],
    holidays: frozenset[int], rostered: bool,
) -> PersonStats:
    person = ws.person_by_id[pid]
    row = grid.rows[pid]
    leave = sum(grid.leave[pid].values(), Fraction(0)) if rostered else Fraction(0)
    worked = [i for i, code in enumerate(row) if code != OFF]
    rules = _hours_rules(ws, pid)
    longest = max((b - a + 1 for a, b, _, _ in stretches(grid, pid, _working)), default=0)
    return PersonStats(
        person=pid,
        name=person.name,
        groups=tuple(person.groups),
        hours=grid.paid(pid) + leave,
        paid_hours=grid.paid(pid),
        leave_hours=leave,
        hours_rule=rules[0].id if rules else None,
        hours_min=_first(rules, "min"),
        hours_max=_first(rules, "max"),
        hours_target=_first(rules, "target"),
        shifts=len(worked),
        by_shift={code: row.count(code) for code in grid.codes_order},
        nights=sum(1 for code in row if code in grid.night_codes),
        weekend_days=sum(1 for i in worked if i in weekend_days),
        weekends=grid.worked_weekends(pid),
        holidays=sum(1 for i in worked if i in holidays),
        requests_granted=sum(honoured),
        requests_denied=len(honoured) - sum(honoured),
        longest_stretch=longest,
    )


def _group(name: str, everyone: bool, people: list[PersonStats]) -> GroupStats:
    deviations = [d for p in people if (d := p.hours_deviation) is not None]
    return GroupStats(
        group=name,
        everyone=everyone,
        members=tuple(p.person for p in people),
        nights=Summary.of([p.nights for p in people]),
        weekends=Summary.of([p.weekends for p in people]),
        hours_deviation=Summary.of(deviations),
    )


def roster_stats(ws: Workspace, roster: Roster | None = None,
                 check: CheckResult | None = None) -> RosterStats:
    """Per-person and per-group statistics of `roster` (default: `ws.roster`).

    `check`: the checker's result for that roster, when at hand: its grid and its
    verdicts on the requests are used, not worked out again.

    With no roster at all, every person has zero of everything: no shifts, no hours
    (leave credit is not counted either) and no request granted or denied; the
    hours bounds are still given, so a deviation is minus the reference.
    """
    roster = roster if roster is not None else ws.roster
    rostered = roster is not None
    grid = check.grid if check is not None and check.grid is not None else Grid(ws, roster)
    outcomes = check.requests if check is not None else request_outcomes(ws, grid)
    weekend_days = frozenset(i for a, b in grid.weekends for i in range(a, b + 1))
    holidays = frozenset(grid.index(d) for d in set(ws.unit.holidays) if grid.in_period(d))
    honoured = _requests(grid, outcomes) if rostered else {pid: [] for pid in grid.rows}
    people = [
        _person(ws, grid, pid, honoured[pid], weekend_days, holidays, rostered)
        for pid in ws.person_ids
    ]
    codes: list[str] = []
    for p in people:
        codes += [g for g in p.groups if g not in codes]
    groups = [_group(code, False, [p for p in people if code in p.groups]) for code in codes]
    groups.append(_group(EVERYONE, True, people))
    return RosterStats(
        people=people,
        groups=groups,
        has_roster=rostered,
        weekends_in_period=len(grid.weekends),
        holidays_in_period=len(holidays),
    )
