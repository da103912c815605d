"""Rest rules in real elapsed time (rules.md: min-rest, weekly-rest).

min-rest: a pair of consecutive shifts (the days between them off) whose gap is
below the limit is a breach; such pairs are listed from the real clock times of
each date (DST-aware) and forbidden, or charged one unit each.

weekly-rest: a window passes when some uninterrupted off-duty interval inside it
lasts `hours`. Such an interval ends where a shift starts (or at the window end)
and begins at the latest end of every earlier shift (or the window start): one
literal per possible end, true only when every earlier shift ended long enough
before it; the window passes when one of them is true.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Literal

from ortools.sat.python import cp_model

from rostertui.core.models.rules import MinRest, WeeklyRest
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.clock import ShiftClock
from rostertui.core.solver.logic import Lit, all_of, breach, forbid, negate
from rostertui.core.solver.terms import ModelBuilder

if TYPE_CHECKING:
    from rostertui.core.solver.shared import Shared

MAX_SPAN_DAYS = 2  # a shift lasts at most 24 h (25 h across DST): it ends by day + 2


class OffRuns:
    """Shared literals: person p is off on every day of [a, z] (history as constants)."""

    def __init__(self, b: ModelBuilder):
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


def min_rest(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    rule = eff.rule
    clock, runs = shared.clock, shared.runs
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
                            b.hard(forbid(b.model, lits))
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


def weekly_rest(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    rule = eff.rule
    clock = shared.clock
    assert isinstance(rule, WeeklyRest)
    need = round(rule.hours * 60)
    cells = b.cells
    for f in windows(cells, rule.window_days, rule.align):
        lo, hi = clock.midnight(f), clock.midnight(f + rule.window_days)
        last = f + rule.window_days - 1
        dates = (cells.date(f), cells.date(last))
        for pid in eff.people:
            p = cells.pindex[pid]
            ends = _rest_ends(b, p, f, last, lo, hi, need, clock)
            if rule.weight is None:
                if ends is not True:
                    b.hard(b.model.add_bool_or(ends))  # empty: the window can never pass
            elif ends is not True:
                short = b.model.new_bool_var(f"{rule.id}.{pid}.{f}")
                b.model.add_bool_or([short, *ends])
                b.add(rule.id, rule.kind, pid, dates, rule.weight, short)


def _rest_ends(b: ModelBuilder, p: int, f: int, last: int, lo: int, hi: int, need: int,
               clock: ShiftClock) -> list[cp_model.IntVar] | Literal[True]:
    """One literal per day j of the window (and one for the window end): true only if
    the off-duty interval that ends where day j's shift starts (or at the window end)
    lasts `need` minutes inside the window. That interval starts at the latest end of
    every earlier shift (or at the window start), so each earlier shift ending too
    late is excluded; no shift starts in between, since j's is the next one.

    True when the window passes whatever is worked (e.g. all history).
    """
    cells, model = b.cells, b.model
    ends: list[cp_model.IntVar] = []
    for j in range(f, last + 2):
        if j <= last:
            starts = [(lit, min(clock.span(j, code)[0], hi))
                      for code, lit in _codes_on(cells, p, j)]
            starts = [(lit, at) for lit, at in starts if at - lo >= need]
            if not starts:
                continue
        else:
            starts = [(True, hi)]
            if hi - lo < need:
                continue
        clauses: list[list[Lit]] = []  # each: not all of these together with y
        for k in range(f - MAX_SPAN_DAYS - 1, j):
            for code, lit_c in _codes_on(cells, p, k):
                finish = max(clock.span(k, code)[1], lo)
                bad = [lit_b for lit_b, at in starts if at - finish < need]
                if len(bad) == len(starts):
                    clauses.append([lit_c])
                else:
                    clauses += [[lit_c, lit_b] for lit_b in bad]
        if any(all(x is True for x in clause) for clause in clauses):
            continue  # a history shift already rules this interval out
        if j > last and not clauses:
            return True
        y = model.new_bool_var(f"rest[{p},{f},{j}]")
        if j <= last:
            needed = [lit for lit, _ in starts]
            if not any(lit is True for lit in needed):
                model.add_bool_or(needed).only_enforce_if(y)
        for clause in clauses:
            forbid(model, [y, *clause])
        ends.append(y)
    return ends
