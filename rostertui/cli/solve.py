"""`rostertui solve WS [--time-limit S] [--workers N] [--seed N] [--json]`."""

from __future__ import annotations

import argparse
import signal
import sys
import threading
import time
from collections.abc import Iterator
from contextlib import contextmanager
from pathlib import Path
from typing import TextIO

from rostertui.cli.args import search_options
from rostertui.cli.output import EXIT_HARD, EXIT_OK, print_json, save_and_warn, warn
from rostertui.core.io.load import load_workspace
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver import SolveOptions, SolveOutcome, SolveProgress, solve
from rostertui.core.solver.model import estimate_build
from rostertui.core.solver.summary import bound_sources, improvement_story


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "solve",
        help="build the roster (writes WS/roster.toml)",
        description="Build the roster with the least penalty that keeps every hard rule. "
        "Progress goes to stderr; Ctrl-C stops early and keeps the best roster so far.",
    )
    p.add_argument("workspace", nargs="?", default=".", help="workspace folder (default: .)")
    search_options(p)
    p.add_argument("--no-decompose", dest="decompose", action="store_false",
                   help="skip the column-generation bound before the search (the time "
                   "goes to the search; the bound is then CP-SAT's and the LP's)")
    p.add_argument("--json", action="store_true", help="print one JSON object")
    p.set_defaults(run=lambda a: do_solve(
        a.workspace, time_limit=a.time_limit, workers=a.workers, seed=a.seed, as_json=a.json,
        decompose=a.decompose))


class ProgressLine:
    """One live line on stderr: rewritten in place on a terminal, a line per update else."""

    def __init__(self, stream: TextIO):
        self.stream = stream
        self.live = stream.isatty()
        self.last_text = ""
        self.latest = ""
        self.last_time = 0.0
        self.lock = threading.Lock()

    def __call__(self, p: SolveProgress) -> None:
        text = format_progress(p)
        with self.lock:
            self.latest = text
            now = time.monotonic()
            # off a terminal (a log file), at most one line a second; the last at close()
            if text == self.last_text or (not self.live and now - self.last_time < 1.0
                                          and self.last_text):
                return
            self.last_text, self.last_time = text, now
            if self.live:
                self.stream.write("\r\x1b[K" + text)
            else:
                self.stream.write(text + "\n")
            self.stream.flush()

    def close(self) -> None:
        with self.lock:
            if not self.live and self.latest and self.latest != self.last_text:
                self.stream.write(self.latest + "\n")
            elif self.live and self.last_text:
                self.stream.write("\n")
            self.stream.flush()


def format_progress(p: SolveProgress) -> str:
    if p.stage == "bound" and p.penalty is None:
        return f"{p.elapsed:7.1f} s  proving a bound (column generation)...  bound {p.bound}"
    if p.penalty is None:
        return f"{p.elapsed:7.1f} s  searching for a first roster...  bound {p.bound}"
    gap = 0.0 if p.penalty == 0 else max(0.0, (p.penalty - p.bound) / abs(p.penalty))
    text = f"{p.elapsed:7.1f} s  penalty {p.penalty:>8}  bound {p.bound:>8}  gap {gap:6.1%}"
    if p.changes is not None:
        text += f"  cells changed {p.changes:>4}"
    if p.found_by is not None:
        text += f"  by {p.found_by}"
    return text


@contextmanager
def ctrl_c_cancels(cancel: threading.Event) -> Iterator[None]:
    """First Ctrl-C stops the search and keeps the best roster; a second one aborts."""
    if threading.current_thread() is not threading.main_thread():
        yield
        return

    def handler(signum: int, frame: object) -> None:
        if cancel.is_set():
            raise KeyboardInterrupt
        cancel.set()
        print("\nstopping: keeping the best roster so far (Ctrl-C again to abort)",
              file=sys.stderr)

    previous = signal.signal(signal.SIGINT, handler)
    try:
        yield
    finally:
        signal.signal(signal.SIGINT, previous)


def do_solve(workspace: str | Path, *, time_limit: float = 60.0, workers: int = 0,
             seed: int = 0, as_json: bool = False, decompose: bool = True) -> int:
    deadline = time.monotonic() + time_limit  # the limit is for the whole command
    ws = load_workspace(workspace)
    warn(ws.warnings)
    warn_if_build_overruns(ws, time_limit, deadline)
    cancel = threading.Event()
    line = ProgressLine(sys.stderr)
    options = SolveOptions(time_limit=time_limit, workers=workers, seed=seed,
                           deadline=deadline, decompose=decompose)
    with ctrl_c_cancels(cancel):
        try:
            outcome = solve(ws, options, on_progress=line, cancel=cancel)
        finally:
            line.close()
    if outcome.roster is None:
        if as_json:
            print_json({"status": outcome.status, "objective": None, "bound": None,
                        "seconds": round(outcome.seconds, 3), "hard_violations": None})
        if outcome.status == "infeasible":
            print("No roster keeps every hard rule: the rules, cover, leave and locks "
                  "contradict each other. Nothing was written.", file=sys.stderr)
            print_explanation(ws, time_limit, workers)
        else:
            print(f"No roster found within {time_limit:g} s (not proven impossible either); "
                  "try a longer --time-limit. Nothing was written.", file=sys.stderr)
        return EXIT_HARD
    assert ws.path is not None and outcome.check is not None
    save_and_warn(outcome.roster, ws.path)
    if as_json:
        print_json({"status": outcome.status, "objective": outcome.objective,
                    "bound": outcome.bound, "seconds": round(outcome.seconds, 3),
                    "hard_violations": outcome.check.hard_violations})
    else:
        print(summary(ws, outcome))
    return EXIT_OK if outcome.check.compliant else EXIT_HARD


def warn_if_build_overruns(ws: Workspace, time_limit: float, deadline: float) -> None:
    """Say before starting when building the model alone will take longer than the
    time left (the estimate is from the model's size: `estimate_build`)."""
    est = estimate_build(ws)
    if est.seconds <= deadline - time.monotonic():
        return
    about = f"{est.seconds:.0f}" if est.seconds >= 2 else f"{est.seconds:.1f}"
    print(f"Building the model for {est.people} people x {est.days} days takes about "
          f"{about} s, more than --time-limit {time_limit:g}; the roster will take longer "
          "than asked.", file=sys.stderr, flush=True)


def print_explanation(ws: Workspace, time_limit: float, workers: int) -> None:
    """Why, on stderr (stdout may carry the JSON): `rostertui explain` without prices."""
    from rostertui.core.explain.run import explain

    budget = min(60.0, max(10.0, time_limit))
    print(f"Looking for why (at most {budget:g} s)...", file=sys.stderr, flush=True)
    result = explain(ws, budget, workers, price_requests=False)
    print("Why:", file=sys.stderr)
    for i, reason in enumerate(result.reasons, start=1):
        print(f"{i}. {reason.message}", file=sys.stderr)
    print("(rostertui explain WS --json gives the same as data.)", file=sys.stderr)


def summary(ws: Workspace, outcome: SolveOutcome) -> str:
    check = outcome.check
    assert check is not None and outcome.roster is not None
    gap = outcome.gap or 0.0
    proven = "proven optimal" if outcome.status == "optimal" else f"gap {gap:.1%} to the bound"
    lines = [
        f"{ws.unit.name}: roster for {ws.unit.start} to {ws.unit.end} written to "
        f"{(ws.path or Path('.')) / 'roster.toml'}",
        f"  status {outcome.status}: penalty {outcome.objective}, bound {outcome.bound} "
        f"({proven}), {outcome.seconds:.1f} s",
        f"  bounds: {bound_sources(outcome)}",
        f"  found by: {improvement_story(outcome)}",
        "  every hard rule kept" if check.compliant
        else f"  {check.hard_violations} hard violations",
    ]
    if check.by_kind:
        lines.append("  penalty by kind:")
        for kind, agg in sorted(check.by_kind.items(), key=lambda kv: -kv[1]["penalty"]):
            if agg["penalty"]:
                lines.append(f"    {kind:<26} {agg['units']:>6} units {agg['penalty']:>8}")
    asked = [r for r in ws.requests.request if ws.unit.in_period(r.date)]
    denied = [v for v in check.violations if v.kind == "request"]
    lines.append(f"  requests: {len(asked) - len(denied)} of {len(asked)} granted")
    names = {p.id: p.name for p in ws.staff.person}
    for v in denied:
        lines.append(f"    not granted: {names.get(v.person or '', v.person)}: {v.message}")
    return "\n".join(lines)
