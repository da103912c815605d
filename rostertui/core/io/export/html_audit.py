"""The audit report: one self-contained HTML page to file with a roster.

Unit, period and timezone; the verdict; the caution that presets are aids; the
rules in effect with their sources and where they come from; the penalty by
kind; every violation grouped by person (then cover and unit-wide ones), with
dates, the shifts worked on them and their times, the message, the source and
any note of the person for those dates.
"""

from __future__ import annotations

from collections import defaultdict
from datetime import date, timedelta

from rostertui.core.check import CheckResult, Violation, check_roster
from rostertui.core.check.grid import Grid
from rostertui.core.io.export.common import need_roster, notes, shift_times
from rostertui.core.io.export.html_page import esc, page, table
from rostertui.core.models.common import OFF, WEEKDAYS
from rostertui.core.models.workspace import EffectiveRule, Workspace
from rostertui.core.words import day, number

CAUTION = (
    "Rule presets are aids, not legal advice: local law, collective agreements and "
    "licensed practice decide which rules apply to this unit. Check the rules in effect "
    "below against them before relying on this report."
)
BUILT_IN = (
    "Built in and always hard: at most one shift per person per date; no shift on leave; "
    "shifts with required skills only for people holding them; locked cells; cover min and "
    "max. Always soft: cover ideal (per person short or over) and requests (their weight)."
)
SCOPE_KEYS = {"id", "kind", "people", "groups", "except_", "weight", "source", "note"}
SPAN_DAYS = 14  # show every day's shift for violations spanning at most this many days


def long_day(d: date) -> str:
    return f"{WEEKDAYS[d.weekday()].title()} {day(d)}"


def _value(v: object) -> str:
    if isinstance(v, list):
        return ", ".join(_value(x) for x in v)
    if isinstance(v, float):
        return number(v)
    return str(v)


def parameters(eff: EffectiveRule) -> str:
    """The kind's own parameters, e.g. "hours = 11" or "shift = N, count = 3"."""
    data = eff.rule.model_dump(exclude=SCOPE_KEYS, exclude_none=True)
    return ", ".join(f"{k} = {_value(v)}" for k, v in data.items())


def scope(ws: Workspace, eff: EffectiveRule) -> str:
    rule = eff.rule
    parts = []
    if rule.people is None and rule.groups is None:
        parts.append("everyone")
    if rule.groups is not None:
        parts.append("groups " + (", ".join(rule.groups) or "(none)"))
    if rule.people is not None:
        parts.append("people " + (", ".join(rule.people) or "(none)"))
    if rule.except_:
        parts.append("except " + ", ".join(rule.except_))
    return f"{'; '.join(parts)} ({len(eff.people)} of {len(ws.staff.person)})"


def rules_table(ws: Workspace) -> str:
    rows = [
        [f"<b>{esc(e.id)}</b>", esc(e.rule.kind), esc(parameters(e)), esc(scope(ws, e)),
         '<span class="hard">hard</span>' if e.hard else f"soft, weight {e.rule.weight}",
         esc(e.rule.source or "-"), esc(e.origin), esc(e.rule.note or "")]
        for e in ws.rules
    ]
    header = ("Rule", "Kind", "Parameters", "Applies to", "Hard / soft", "Source", "From",
              "Note")
    return table(header, rows) + f'<p class="small">{esc(BUILT_IN)}</p>'


def _dates(v: Violation) -> str:
    if len(v.dates) == 2 and (v.dates[1] - v.dates[0]).days > 1:
        return f"{long_day(v.dates[0])} to {long_day(v.dates[1])}"
    return ", ".join(long_day(d) for d in v.dates) or "the period"


def _shifts(ws: Workspace, grid: Grid, v: Violation) -> str:
    """The person's shifts on the violation's dates (every day of a short span)."""
    if v.person is None or v.person not in grid.rows or not v.dates:
        return ""
    first, last = min(v.dates), max(v.dates)
    span = (last - first).days + 1
    days = ([first + timedelta(days=i) for i in range(span)] if span <= SPAN_DAYS
            else list(v.dates))
    codes = [grid.rows[v.person][grid.index(d)] if grid.in_period(d) else "?" for d in days]
    if len(days) > 2:
        return " ".join(codes)
    return "; ".join(
        f"{day(d)}: off" if c in (OFF, "?")
        else f"{day(d)}: {c} {shift_times(ws.shift_by_code[c])}"
        for d, c in zip(days, codes, strict=True)
    )


def _violation_rows(ws: Workspace, grid: Grid, found: list[Violation]) -> str:
    noted = notes(ws)
    rows = []
    for v in sorted(found, key=lambda v: (v.dates[:1] or (ws.unit.end,), v.rule)):
        remarks = [t for d in v.dates for t in noted.get((v.person or "", d), [])]
        what = '<span class="hard">hard</span>' if v.hard else "soft"
        rows.append([
            esc(_dates(v)), esc(_shifts(ws, grid, v)), esc(v.rule), esc(v.kind), what,
            str(v.units), str(v.penalty),
            esc(v.message), esc(v.source or "-"), esc("; ".join(remarks)),
        ])
    header = ("Dates", "Shifts worked", "Rule", "Kind", "", "Units", "Penalty", "What",
              "Source", "Notes")
    return table(header, rows)


def violations_section(ws: Workspace, grid: Grid, result: CheckResult) -> list[str]:
    if not result.violations:
        return ["<p>No violations: every hard rule holds and no soft rule costs anything.</p>"]
    by_person: dict[str | None, list[Violation]] = defaultdict(list)
    for v in result.violations:
        by_person[v.person].append(v)
    out: list[str] = []
    for p in ws.staff.person:
        if by_person.get(p.id):
            hard = sum(1 for v in by_person[p.id] if v.hard)
            tag = f' &middot; <span class="hard">{hard} hard</span>' if hard else ""
            out.append(f"<h3>{esc(p.name)} ({esc(p.id)}){tag}</h3>")
            out.append(_violation_rows(ws, grid, by_person[p.id]))
    if by_person.get(None):
        out.append("<h3>Cover and unit-wide</h3>")
        out.append(_violation_rows(ws, grid, by_person[None]))
    return out


def penalty_table(result: CheckResult) -> str:
    hard: dict[str, int] = defaultdict(int)
    for v in result.violations:
        hard[v.kind] += int(v.hard)
    kinds = sorted(result.by_kind.items(), key=lambda kv: (-kv[1]["penalty"], kv[0]))
    rows = [[esc(k), str(hard[k]), str(agg["units"]), str(agg["penalty"])] for k, agg in kinds]
    rows.append(["<b>total</b>", f"<b>{result.hard_violations}</b>", "",
                 f"<b>{result.penalty}</b>"])
    return table(("Kind", "Hard entries", "Units", "Penalty"), rows)


def verdict(result: CheckResult) -> str:
    if result.compliant:
        return (f'<p class="verdict">Compliant: no hard rule broken; '
                f"penalty {result.penalty}.</p>")
    n = result.hard_violations
    return (f'<p class="verdict bad"><span class="hard">NOT compliant</span>: {n} hard '
            f"violation{'s' if n != 1 else ''}; penalty {result.penalty}.</p>")


def audit_html(ws: Workspace, result: CheckResult | None = None) -> str:
    """The audit report page; `result` defaults to checking the workspace's roster."""
    grid = need_roster(ws)
    result = result if result is not None else check_roster(ws)
    unit = ws.unit
    period = f"{day(unit.start)} {unit.start.year} to {day(unit.end)} {unit.end.year}"
    solve = ws.roster.solve if ws.roster is not None else None
    made = (f" &middot; roster from the solver ({esc(solve.status)}, "
            f"objective {esc(solve.objective)})" if solve is not None else "")
    body = [
        f"<h1>Audit report: {esc(unit.name)}</h1>",
        f'<p class="meta">Period {esc(period)} ({unit.days} days) &middot; timezone '
        f"{esc(unit.timezone)} &middot; {len(ws.staff.person)} people &middot; "
        f"{len(ws.rules)} rules{made}</p>",
        verdict(result),
        f'<p class="caution"><b>Caution.</b> {esc(CAUTION)}</p>',
        "<h2>Rules in effect</h2>",
        rules_table(ws),
        "<h2>Penalty by kind</h2>",
        penalty_table(result) if result.violations else "<p>No penalty.</p>",
        "<h2>Violations by person</h2>",
        *violations_section(ws, grid, result),
    ]
    return page(f"Audit report: {unit.name}, {period}", body)
