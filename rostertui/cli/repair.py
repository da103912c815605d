"""`rostertui repair WS [--from DATE] [--time-limit S] [--json]`: minimal-change re-solve."""

from __future__ import annotations

import argparse
import sys
import threading
import time
from datetime import date
from pathlib import Path

from rostertui.cli.args import cell_line, day, iso_date, search_options, violation_line
from rostertui.cli.output import EXIT_HARD, EXIT_OK, fail, print_json, save_and_warn, warn
from rostertui.cli.solve import ProgressLine, ctrl_c_cancels, warn_if_build_overruns
from rostertui.core.errors import EditError
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.repair import RepairOutcome, default_from, repair
from rostertui.core.solver import SolveOptions


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "repair",
        help="re-solve with as few changes as possible, never touching days before --from",
        description="Solve again, changing as few cells of WS/roster.toml as possible "
        "(each change costs [repair] change_weight from unit.toml, default 1000) and none "
        "before --from (default: today when it lies in the period, else the first day). "
        "Locks are kept. Lists each changed cell and what it fixed; writes roster.toml.",
    )
    p.add_argument("workspace", nargs="?", default=".", help="workspace folder (default: .)")
    p.add_argument("--from", dest="start_from", type=iso_date, metavar="DATE",
                   help="first day that may change, YYYY-MM-DD")
    search_options(p)
    p.add_argument("--json", action="store_true", help="print one JSON object")
    p.set_defaults(run=lambda a: do_repair(
        a.workspace, start_from=a.start_from, time_limit=a.time_limit, workers=a.workers,
        seed=a.seed, as_json=a.json))


def do_repair(workspace: str | Path, *, start_from: date | None = None,
              time_limit: float = 60.0, workers: int = 0, seed: int = 0,
              as_json: bool = False) -> int:
    deadline = time.monotonic() + time_limit  # the limit is for the whole command
    ws = load_workspace(workspace)
    warn(ws.warnings)
    assert ws.path is not None
    warn_if_build_overruns(ws, time_limit, deadline)
    first = start_from or default_from(ws)
    options = SolveOptions(time_limit=time_limit, workers=workers, seed=seed,
                           deadline=deadline)
    cancel = threading.Event()
    line = ProgressLine(sys.stderr)
    with ctrl_c_cancels(cancel):
        try:
            result = repair(ws, first, options, on_progress=line, cancel=cancel)
        except EditError as exc:
            return fail(str(exc))
        finally:
            line.close()
    outcome = result.outcome
    if outcome.roster is not None:
        save_and_warn(outcome.roster, ws.path)
    if as_json:
        print_json({"status": outcome.status, "objective": outcome.objective,
                    "bound": outcome.bound, "seconds": round(outcome.seconds, 3),
                    "hard_violations": outcome.check.hard_violations if outcome.check else None,
                    "from": result.start_from.isoformat(),
                    "changed_cells": [c.to_json() for c in result.changed]})
    else:
        print(summary(ws, result))
    if outcome.check is None:
        return EXIT_HARD
    return EXIT_OK if outcome.check.compliant else EXIT_HARD


def summary(ws: Workspace, result: RepairOutcome) -> str:
    outcome = result.outcome
    lines = [f"Repair from {day(result.start_from)} {result.start_from.year}"
             + (" (earlier days kept as they were)" if result.start_from > ws.unit.start else "")]
    if outcome.roster is None or outcome.check is None:
        lines.append("No repaired roster keeps every hard rule"
                     + (" within the time limit" if outcome.status == "unknown" else "")
                     + ". Nothing was written.")
        if result.past:
            lines.append(f"These breaches lie before {result.start_from} and may not be "
                         "touched; repair from an earlier --from or fix them by hand:")
            lines += ["  " + violation_line(v) for v in result.past]
        else:
            lines.append("rostertui explain says which rules, cover, leave and locks collide.")
        return "\n".join(lines)
    n = len(result.changed)
    lines.append(f"{n} cell{'s' if n != 1 else ''} changed:" if n else "No cell needed to change.")
    for c in result.changed:
        fixed = "; ".join(v.message for v in c.fixes) or "makes room for another change"
        lines.append(f"  {cell_line(ws, c.cell)}   {fixed}")
    check = outcome.check
    proven = "fewest changes proven" if outcome.status == "optimal" else "not proven best"
    lines.append(f"Penalty {result.before.penalty} -> {outcome.objective} "
                 f"(status {outcome.status}, {proven}, {outcome.seconds:.1f} s).")
    past = [v for v in check.violations if v.hard and all(d < result.start_from for d in v.dates)]
    if check.compliant:
        lines.append("Every hard rule kept.")
    else:
        lines.append(f"{check.hard_violations} hard violation(s) remain"
                     + (f", {len(past)} of them before {result.start_from}, left as they were"
                        if past else "") + "; see rostertui check.")
    lines.append(f"Wrote {ws.path / 'roster.toml' if ws.path else 'roster.toml'}.")
    return "\n".join(lines)
