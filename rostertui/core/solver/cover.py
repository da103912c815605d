"""Cover (rules.md, built-in): hard `min`/`max`, soft `ideal` per entry and date."""

from __future__ import annotations

from datetime import date

from rostertui.core.models.common import WEEKDAYS
from rostertui.core.models.shifts import Cover
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.logic import bool_sum, excess
from rostertui.core.solver.terms import Build


def cover_days(cover: Cover, cells: Cells) -> list[int]:
    """Day indexes a cover entry applies to: its dates, its weekdays, or every day."""
    if cover.dates is not None:
        return sorted({(d - cells.start).days for d in cover.dates
                       if 0 <= (d - cells.start).days < cells.n})
    if cover.days is not None:
        wanted = {WEEKDAYS.index(w) for w in cover.days}
        return [d for d in range(cells.n) if cells.date(d).weekday() in wanted]
    return list(range(cells.n))


def add_cover(b: Build) -> None:
    cells, model = b.cells, b.model
    skills = [set(cells.ws.person_by_id[pid].skills) for pid in cells.people]
    for k, c in enumerate(cells.ws.shifts.cover):
        holders = [p for p in range(len(cells.people)) if c.skill is None or c.skill in skills[p]]
        for d in cover_days(c, cells):
            vars_, const = bool_sum(cells.var(p, d, c.shift) for p in holders)
            count = sum(vars_) + const if vars_ else const
            top = len(vars_) + const
            day: tuple[date, ...] = (cells.date(d),)
            past = d < cells.frozen  # fixed days: a shortfall there cannot be repaired
            if c.min is not None and not past:
                if top < c.min:
                    model.add_bool_or([])
                elif vars_:
                    model.add(count >= c.min)
            if c.max is not None and not past:
                if const > c.max:
                    model.add_bool_or([])
                elif vars_ and top > c.max:
                    model.add(count <= c.max)
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
