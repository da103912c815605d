"""Requests (rules.md, always soft): `weight` when a request is not honoured."""

from __future__ import annotations

from rostertui.core.solver.logic import negate
from rostertui.core.solver.terms import ModelBuilder


def add_requests(b: ModelBuilder) -> None:
    cells = b.cells
    for r in cells.ws.requests.request:
        p = cells.pindex.get(r.person)
        d = (r.date - cells.start).days
        if p is None or not 0 <= d < cells.n:
            continue
        if r.want == "off":
            broken = cells.works(p, d)
        elif r.want is not None:
            broken = negate(cells.var(p, d, r.want))
        else:
            broken = cells.var(p, d, r.avoid or "")
        b.add("request", "request", r.person, (r.date,), r.weight, broken)
