"""Cover (rules.md, built-in): hard `min`/`max`, soft `ideal` per entry and date."""

from __future__ import annotations

from collections.abc import Callable
from datetime import date

from ortools.sat.python import cp_model

from rostertui.core.models.common import WEEKDAYS
from rostertui.core.models.shifts import Cover
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.logic import Lit, bool_sum, excess
from rostertui.core.solver.terms import ModelBuilder

CoverSwitch = Callable[[int, int], Lit]  # (cover entry, day) -> its switch


def cover_days(cover: Cover, cells: Cells) -> list[int]:
    """Day indexes a cover entry applies to: its dates, its weekdays, or every day."""
    if cover.dates is not None:
        return sorted({(d - cells.start).days for d in cover.dates
                       if 0 <= (d - cells.start).days < cells.n})
    if cover.days is not None:
        wanted = {WEEKDAYS.index(w) for w in cover.days}
        return [d for d in range(cells.n) if cells.date(d).weekday() in wanted]
    return list(range(cells.n))


def add_cover(b: ModelBuilder, items: CoverSwitch | None = None, gap_weight: int | None = None
              ) -> list[tuple[int, int, cp_model.IntVar | int]]:
    """Cover constraints and ideal penalties. `items` (explain) gives each minimum and
    maximum on each date its own switch; `gap_weight` turns each minimum into a
    penalty of that weight per person short, returning (entry, day, shortfall)."""
    cells, model = b.cells, b.model
    gaps: list[tuple[int, int, cp_model.IntVar | int]] = []
    skills = [set(cells.ws.person_by_id[pid].skills) for pid in cells.people]
    for k, c in enumerate(cells.ws.shifts.cover):
        holders = [p for p in range(len(cells.people)) if c.skill is None or c.skill in skills[p]]
        for d in cover_days(c, cells):
            vars_, const = bool_sum(cells.var(p, d, c.shift) for p in holders)
            count = sum(vars_) + const if vars_ else const
            top = len(vars_) + const
            day: tuple[date, ...] = (cells.date(d),)
            past = d < cells.frozen  # fixed days: a shortfall there cannot be repaired
            b.enforce = items(k, d) if items is not None else None
            if c.min is not None and not past and gap_weight is not None:
                short: cp_model.IntVar | int = max(0, c.min - const)
                if vars_:
                    short = excess(model, c.min - count, c.min - top, c.min - const,
                                   f"cover[{k}].{d}.gap")
                gaps.append((k, d, short))
            elif c.min is not None and not past:
                if top < c.min:
                    b.hard(model.add_bool_or([]))
                elif vars_:
                    b.hard(model.add(count >= c.min))
            if c.max is not None and not past:
                if const > c.max:
                    b.hard(model.add_bool_or([]))
                elif vars_ and top > c.max:
                    b.hard(model.add(count <= c.max))
            b.enforce = None
            if c.ideal is not None:
                name = f"cover[{k}].{d}"
                if c.under_weight:
                    if vars_:
                        short = excess(model, c.ideal - count, c.ideal - top, c.ideal - const,
                                       f"{name}.under")
                        b.add("cover", "cover", None, day, c.under_weight, short)
                    else:
                        b.add("cover", "cover", None, day, c.under_weight, max(0, c.ideal - const))
                if c.over_weight:
                    if vars_:
                        over = excess(model, count - c.ideal, const - c.ideal, top - c.ideal,
                                      f"{name}.over")
                        b.add("cover", "cover", None, day, c.over_weight, over)
                    else:
                        b.add("cover", "cover", None, day, c.over_weight, max(0, const - c.ideal))
    return gaps
