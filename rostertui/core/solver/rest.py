"""Rest rules in real elapsed time (rules.md: min-rest, weekly-rest).

min-rest: a pair of consecutive shifts (the days between them off) whose gap is
below the limit is a breach; such pairs are listed from the real clock times of
each date (DST-aware) and forbidden, or charged one unit each.

weekly-rest: a window passes when some uninterrupted off-duty interval inside it
lasts `hours`. Every such interval runs from the end of a shift on day i (or from
the window start, when nothing is worked from two days before it) to the start of
a shift on day j (or the window end), with every day between off. One literal per
(i, j) is true exactly when that interval exists and is long enough; the window
passes when one of them is true.
"""

from __future__ import annotations

from rostertui.core.models.rules import MinRest, WeeklyRest
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.clock import ShiftClock
from rostertui.core.solver.logic import Lit, all_of, any_of, breach, forbid, negate
from rostertui.core.solver.terms import Build

MAX_SPAN_DAYS = 2  # a shift lasts at most 24 h (25 h across DST): it ends by day + 2


class OffRuns:
    """Shared literals: person p is off on every day of [a, z] (history as constants)."""

    def __init__(self, b: Build):
        self.b = b
        self._runs: dict[tuple[int, int, int], Lit] = {}

    def off(self, p: int, a: int, z: int) -> Lit:
        if a > z:
            return True
        key = (p, a, z)
        found = self._runs.get(key)
        if found is None:
            lits = [negate(self.b.cells.works(p, d)) for d in range(a, z + 1)]
            found = self._runs[key] = all_of(self.b.model, lits, f"off[{p},{a},{z}]")
        return found


def _codes_on(cells: Cells, p: int, d: int) -> list[tuple[str, Lit]]:
    """(code, literal) for every shift person p might work on day d (history included)."""
    if d < 0:
        code = cells.history_code(p, d)
        return [(code, True)] if code is not None and code != "-" else []
    return list(cells.cell(p, d))


def add_min_rest(b: Build, eff: EffectiveRule, clock: ShiftClock, runs: OffRuns) -> None:
    rule = eff.rule
    assert isinstance(rule, MinRest)
    need = round(rule.hours * 60)
    reach = int(need // (24 * 60)) + MAX_SPAN_DAYS + 1  # days apart a short gap can span
    cells = b.cells
    for pid in eff.people:
        p = cells.pindex[pid]
        first = -len(cells.history[p])
        for i in range(first, cells.n - 1):
            before = _codes_on(cells, p, i)
            if not before:
                continue
            for j in range(max(i + 1, 0), min(i + reach, cells.n - 1) + 1):
                between = runs.off(p, i + 1, j - 1)
                if between is False:
                    continue
                for a_code, a_lit in before:
                    end = clock.span(i, a_code)[1]
                    for b_code, b_lit in cells.cell(p, j):
                        if clock.span(j, b_code)[0] - end >= need:
                            continue
                        lits = [a_lit, b_lit, between]
                        if rule.weight is None:
                            forbid(b.model, lits)
                        else:
                            b.add(rule.id, rule.kind, pid, (cells.date(i), cells.date(j)),
                                  rule.weight, breach(b.model, lits))


def windows(cells: Cells, days: int, align: str) -> list[int]:
    """First day of every window that ends by the period end (monday / period-start /
    rolling)."""
    if align == "rolling":
        firsts = range(0, cells.n)
    else:
        first = -cells.start.weekday() if align == "monday" else 0
        firsts = range(first, cells.n, days)
    return [f for f in firsts if f + days <= cells.n]


def add_weekly_rest(b: Build, eff: EffectiveRule, clock: ShiftClock, runs: OffRuns) -> None:
    rule = eff.rule
    assert isinstance(rule, WeeklyRest)
    need = round(rule.hours * 60)
    cells = b.cells
    for f in windows(cells, rule.window_days, rule.align):
        lo, hi = clock.midnight(f), clock.midnight(f + rule.window_days)
        last = f + rule.window_days - 1
        dates = (cells.date(f), cells.date(last))
        for pid in eff.people:
            p = cells.pindex[pid]
            options = _rest_options(b, p, f, last, lo, hi, need, clock, runs)
            if rule.weight is None:
                if options is not True:
                    b.model.add_bool_or([o for o in options if o is not False] or [False])
            else:
                ok = True if options is True else any_of(b.model, options)
                b.add(rule.id, rule.kind, pid, dates, rule.weight, negate(ok))


def _rest_options(b: Build, p: int, f: int, last: int, lo: int, hi: int, need: int,
                  clock: ShiftClock, runs: OffRuns) -> list[Lit] | bool:
    """Literals, one per way the window [lo, hi) can hold a long enough rest."""
    cells = b.cells
    start_day = f - MAX_SPAN_DAYS
    # (day, end instant or None for "nothing worked since start_day", literal)
    preds: list[tuple[int, int | None, Lit]] = [(start_day - 1, None, True)]
    for i in range(start_day, last + 1):
        for code, lit in _codes_on(cells, p, i):
            end = clock.span(i, code)[1]
            # the shift must be the latest to end so far: a longer one the day or two
            # before would still be running when this one ends
            hidden = [
                lit2 for k in (i - 1, i - 2) for code2, lit2 in _codes_on(cells, p, k)
                if clock.span(k, code2)[1] > end
            ]
            preds.append((i, end, all_of(b.model, [lit, *(negate(h) for h in hidden)])))
    options: list[Lit] = []
    for i, end, guard in preds:
        if guard is False:
            continue
        free_from = lo if end is None else max(end, lo)
        if hi - free_from < need:
            continue
        for j in range(max(i + 1, f), last + 2):  # j = last + 1: rest until the window end
            between = _between(b, p, i, end, j, clock, runs)
            if between is False:
                break
            if j == last + 1:
                options.append(all_of(b.model, [guard, between]))
                continue
            good = [lit for code, lit in cells.cell(p, j)
                    if min(clock.span(j, code)[0], hi) - free_from >= need]
            if good:
                options.append(all_of(b.model, [guard, between, any_of(b.model, good)]))
    if any(o is True for o in options):
        return True
    return options


def _between(b: Build, p: int, i: int, end: int | None, j: int, clock: ShiftClock,
             runs: OffRuns) -> Lit:
    """Nothing interrupts the rest from day i's shift (ending at `end`) to day j.

    Days i+1 and i+2 may hold a shift that ends before `end` (one lying inside a
    longer shift); every other day between must be off.
    """
    cells = b.cells
    parts: list[Lit] = []
    for k in range(i + 1, min(i + MAX_SPAN_DAYS, j - 1) + 1):
        if end is None:
            parts.append(negate(cells.works(p, k)))
            continue
        breaking = frozenset(code for code, _ in _codes_on(cells, p, k)
                             if clock.span(k, code)[1] > end)
        if k < 0:
            parts.append(not breaking)
        else:
            parts.append(negate(cells.on(p, k, breaking)) if breaking else True)
    parts.append(runs.off(p, i + MAX_SPAN_DAYS + 1, j - 1))
    return all_of(b.model, parts)
