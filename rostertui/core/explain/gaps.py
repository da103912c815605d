"""Where the gaps would be: cover minimums as heavy penalties, every other hard rule kept.

The roster that falls least short shows which shifts on which dates cannot be
staffed and by how many people, so the supervisor knows what to change (extra
staff, a leave moved, a rule relaxed).
"""

from __future__ import annotations

import threading

from ortools.sat.python import cp_model

from rostertui.core.check import check_roster
from rostertui.core.explain import words
from rostertui.core.explain.reasons import Reason
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.model import build_model
from rostertui.core.solver.primal.watch import stop_on_cancel
from rostertui.core.solver.run import roster_from


def cover_gaps(ws: Workspace, budget: float, workers: int = 0,
               cancel: threading.Event | None = None) -> tuple[str, list[Reason]]:
    """("found" | "infeasible" | "unknown", the gaps as reasons); a set `cancel` stops
    the search (the gaps of the best roster so far, as "unknown")."""
    built = build_model(ws, gap_weight=1)
    solver = cp_model.CpSolver()
    solver.parameters.max_time_in_seconds = max(0.5, budget)
    solver.parameters.num_workers = workers or 2
    with stop_on_cancel(solver, cancel):
        code = solver.solve(built.model)
    if code == cp_model.INFEASIBLE:
        return "infeasible", [Reason(
            "Even with every cover minimum relaxed, the other hard rules (leave, locks, "
            "rest, stretches, hours, weekends) cannot all hold.", ("cover",))]
    if code not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        return "unknown", []
    values = {key: solver.value(var) for key, var in built.cells.x.items()}
    roster = roster_from(built, values)
    out = []
    for v in check_roster(ws, roster).violations:
        if v.kind == "cover" and v.hard and "at least" in v.message:
            shift = words.shift(ws, v.shift or "")
            skill = f" with skill {v.skill}" if v.skill else ""
            out.append(Reason(
                f"At best, {shift} cover{skill} on {words.day(v.dates[0])} stays "
                f"{v.units} short ({v.message}).", ("cover",), (), v.dates,
                (v.shift or "", v.skill)))
    return ("found" if code == cp_model.OPTIMAL else "unknown"), out
