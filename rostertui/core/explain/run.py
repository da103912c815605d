"""`explain(ws)`: pre-checks, a conflicting set, the gaps, the price of denied requests.

A set `cancel` event stops it within a fraction of a second: each CP-SAT search is
stopped (`stop_on_cancel`) and no further step starts; the explanation is then
marked `stopped` and holds only what was settled before (never decided when the
conflict search was cut short).
"""

from __future__ import annotations

import threading
import time
from collections.abc import Callable
from dataclasses import dataclass, field
from typing import Any

from rostertui.core.check import check_roster
from rostertui.core.explain.conflict import find_conflict
from rostertui.core.explain.gaps import cover_gaps
from rostertui.core.explain.precheck import prechecks
from rostertui.core.explain.reasons import Reason
from rostertui.core.explain.requests import RequestCost, denied, price
from rostertui.core.explain.sentences import conflict_reason
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.outcome import SolveOptions

Progress = Callable[[str], None]


@dataclass
class Explanation:
    feasible: bool
    decided: bool  # False: the time ran out before feasibility was settled
    reasons: list[Reason] = field(default_factory=list)
    requests: list[RequestCost] = field(default_factory=list)
    stopped: bool = False  # cancelled before the end: `decided` and the lists are partial

    def to_json(self, ws: Workspace) -> dict[str, Any]:
        """cli.md's shape; `requests` is added when denied requests were priced."""
        out: dict[str, Any] = {"feasible": self.feasible,
                               "reasons": [r.to_json() for r in self.reasons]}
        if self.requests:
            out["requests"] = [c.to_json(ws) for c in self.requests]
        return out


def explain(ws: Workspace, time_limit: float = 60.0, workers: int = 0,
            on_progress: Progress | None = None, price_requests: bool = True,
            cancel: threading.Event | None = None) -> Explanation:
    say = on_progress or (lambda _msg: None)
    stop = cancel or threading.Event()
    deadline = time.monotonic() + time_limit
    say("counting who is free for each shift")
    early = prechecks(ws)
    if stop.is_set():
        return Explanation(False, False, early, stopped=True)
    say("looking for hard items that cannot all hold")
    conflict = find_conflict(ws, 0.5 * time_limit, workers, on_progress=say, cancel=stop)
    if conflict.status == "feasible":
        out = Explanation(True, True)
        if price_requests and ws.roster is not None:
            out.requests = _price(ws, deadline, workers, say, stop)
        out.stopped = stop.is_set()
        return out
    if stop.is_set():  # the conflict found so far may not be one: nothing is settled
        return Explanation(False, False, early, stopped=True)
    if conflict.status == "unknown":
        return Explanation(False, False, [*early, Reason(
            f"Within {time_limit:g} s the solver neither found a roster nor proved that "
            "none exists; try a longer time limit.")])
    reasons = list(early)
    if conflict.items:
        reasons.append(conflict_reason(ws, conflict.items, conflict.minimal))
    say("looking for where the cover would fall short")
    left = max(1.0, deadline - time.monotonic())
    _status, gaps = cover_gaps(ws, left, workers, stop)
    reasons += gaps
    if not reasons:
        reasons.append(Reason("No roster keeps every hard rule, though no single rule, "
                              "cover, lock or leave is to blame: the skills and history "
                              "alone leave no way."))
    return Explanation(False, True, reasons, stopped=stop.is_set())


def _price(ws: Workspace, deadline: float, workers: int, say: Progress,
           cancel: threading.Event) -> list[RequestCost]:
    asks = denied(ws, check_roster(ws))
    out = []
    for i, r in enumerate(asks):
        left = deadline - time.monotonic()
        if left < 0.5 or cancel.is_set():
            break
        say(f"pricing denied request {i + 1} of {len(asks)}")
        each = max(0.5, min(20.0, left / (len(asks) - i)))
        cost = price(ws, r, SolveOptions(time_limit=each, workers=workers, lp_bound=False),
                     cancel)
        if cancel.is_set() and cost.status != "granted":
            break  # cut short: not "impossible", only not priced
        out.append(cost)
    return out
