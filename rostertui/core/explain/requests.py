"""What a denied request would cost: grant it with the fewest changes and compare.

For each request the current roster does not grant, the request becomes hard (a
lock on the cell for `want`, a hard not-available for `avoid`) and the roster is
repaired around it: as few cells as possible change (the unit's repair
`change_weight` each), nothing else moves. The difference in penalty is its
price; the violations the new roster adds are who pays it. Re-solving from
scratch instead would mix the request's price with whatever a fresh search finds
elsewhere.
"""

from __future__ import annotations

import dataclasses
import threading
from dataclasses import dataclass
from typing import Any

from rostertui.core.check import CheckResult, Violation, check_roster
from rostertui.core.explain import words
from rostertui.core.models import rules as R
from rostertui.core.models.common import OFF
from rostertui.core.models.requests import Request
from rostertui.core.models.roster import Lock
from rostertui.core.models.workspace import EffectiveRule, Workspace
from rostertui.core.repair.diff import CellDiff, roster_diff
from rostertui.core.repair.impact import impact
from rostertui.core.repair.rows import full_rows
from rostertui.core.solver.keep import Keep
from rostertui.core.solver.outcome import SolveOptions
from rostertui.core.solver.run import solve


@dataclass(frozen=True)
class RequestCost:
    request: Request
    status: str  # "granted" (priced), "impossible" (a hard rule forbids it), "unknown"
    cost: int | None  # penalty with it granted minus the current penalty
    paid_by: tuple[Violation, ...] = ()
    changed: tuple[CellDiff, ...] = ()  # the cells that move to grant it

    def message(self, ws: Workspace) -> str:
        r = self.request
        what = ("a day off" if r.want == "off" else f"{r.want}" if r.want
                else f"no {r.avoid}")
        head = f"{words.person(ws, r.person)} asked for {what} on {words.day(r.date)}"
        if self.status == "impossible":
            return f"{head}: no roster grants it and keeps every hard rule."
        if self.status == "unknown" or self.cost is None:
            return f"{head}: not priced within the time limit."
        payers = "; ".join(f"{v.person + ': ' if v.person else ''}{v.message}"
                           for v in self.paid_by)
        n = len(self.changed)
        return (f"{head}: granting it ({n} cell{'s' if n != 1 else ''} changed) would change "
                f"the penalty by {self.cost:+d}" + (f", paid by: {payers}" if payers else "")
                + ".")

    def to_json(self, ws: Workspace) -> dict[str, Any]:
        r = self.request
        return {"person": r.person, "date": r.date.isoformat(), "want": r.want,
                "avoid": r.avoid, "status": self.status, "cost": self.cost,
                "paid_by": [v.to_json() for v in self.paid_by],
                "changed": [c.to_json() for c in self.changed], "message": self.message(ws)}


def denied(ws: Workspace, check: CheckResult) -> list[Request]:
    """Requests of `ws` the checked roster does not grant, in file order."""
    missed = {(v.person, v.dates[0]) for v in check.violations if v.kind == "request"}
    return [r for r in ws.requests.request if (r.person, r.date) in missed]


def granted(ws: Workspace, r: Request) -> Workspace:
    """The workspace with request `r` made hard."""
    assert ws.roster is not None
    if r.avoid is not None:
        rule = R.NotAvailable(id="granted-request", kind="not-available", dates=[r.date],
                              shift=r.avoid, people=[r.person])
        return dataclasses.replace(ws, rules=[*ws.rules, EffectiveRule(rule, "explain",
                                                                       (r.person,))])
    rows = full_rows(ws, ws.roster)
    rows[r.person][(r.date - ws.unit.start).days] = OFF if r.want == "off" else str(r.want)
    locks = [*ws.roster.lock, Lock(person=r.person, dates=[r.date])]
    return dataclasses.replace(ws, roster=ws.roster.model_copy(
        update={"rows": rows, "lock": locks}))


def price(ws: Workspace, r: Request, options: SolveOptions,
          cancel: threading.Event | None = None) -> RequestCost:
    assert ws.roster is not None
    current = check_roster(ws)
    keep = Keep(rows=full_rows(ws, ws.roster), weight=ws.unit.repair.change_weight)
    out = solve(granted(ws, r), options, keep=keep, cancel=cancel)
    if out.roster is None:
        status = "impossible" if out.status == "infeasible" else "unknown"
        return RequestCost(r, status, None)
    after = check_roster(ws, out.roster)
    paid = [v for v in impact(current, after).created
            if not (v.kind == "request" and v.person == r.person and v.dates == (r.date,))]
    moved = tuple(roster_diff(ws, ws.roster, out.roster))
    return RequestCost(r, "granted", after.penalty - current.penalty, tuple(paid), moved)
