"""`rostertui solve-many WS... [--time-limit S] [--workers N] [--seed N] [--scheduler ADDRESS]
[--json]`: many workspaces at once on a Dask cluster (the extra `rostertui[many]`)."""

from __future__ import annotations

import argparse
import shutil
import sys
import threading
import time
from pathlib import Path
from typing import TextIO

from rostertui.cli.output import EXIT_HARD, EXIT_INPUT, EXIT_OK, fail, print_json
from rostertui.core.many.client import ManyRun
from rostertui.core.many.cluster import (
    ClusterUnreachable,
    DaskCluster,
    MissingExtra,
    require_dask,
)
from rostertui.core.many.files import find_workspaces
from rostertui.core.many.task import UnitOptions
from rostertui.core.many.units import UnitState
from rostertui.core.solver.outcome import DEFAULT_TIME_LIMIT

EXIT_INTERRUPTED = 130  # 128 + SIGINT, as shells report a run stopped by Ctrl-C
REDRAW_EVERY = 0.25  # seconds between two redraws of the live block, at least


def register(verbs: argparse._SubParsersAction) -> None:
    p = verbs.add_parser(
        "solve-many",
        help="solve many workspaces at once on a Dask cluster (writes each WS/roster.toml)",
        description="Solve many workspaces at once, each as one task on a Dask cluster: a "
        "local one sized to this machine, or a running one (--scheduler). Each roster is "
        "checked here and written as it arrives, unless its roster.toml changed meanwhile. "
        "Progress goes to stderr; Ctrl-C cancels what is left and keeps what is written. "
        "Needs the extra: pip install 'rostertui[many]'.",
    )
    p.add_argument("workspaces", nargs="+", metavar="WS",
                   help="workspace folders, or folders whose sub-folders are workspaces")
    p.add_argument("--time-limit", type=float, default=DEFAULT_TIME_LIMIT, metavar="S",
                   help="seconds to search, per unit (default 60)")
    p.add_argument("--workers", type=int, default=1, metavar="N",
                   help="search threads per unit (default 1; 0 = every core of its worker); "
                   "a local cluster solves cores / N units at once")
    p.add_argument("--seed", type=int, default=0, metavar="N", help="random seed (default 0)")
    p.add_argument("--no-decompose", dest="decompose", action="store_false",
                   help="skip the column-generation bound (as `solve --no-decompose`)")
    p.add_argument("--scheduler", metavar="ADDRESS",
                   help="a running Dask scheduler (tcp://host:8786) instead of a local "
                   "cluster; the workspace files travel to its workers")
    p.add_argument("--json", action="store_true",
                   help="print one JSON object at the end (every unit's outcome)")
    p.set_defaults(run=lambda a: do_solve_many(
        a.workspaces, time_limit=a.time_limit, workers=a.workers, seed=a.seed,
        scheduler=a.scheduler, as_json=a.json, decompose=a.decompose))


def do_solve_many(workspaces: list[str | Path], *, time_limit: float = DEFAULT_TIME_LIMIT,
                  workers: int = 1, seed: int = 0, scheduler: str | None = None,
                  as_json: bool = False, decompose: bool = True,
                  units_at_a_time: int | None = None) -> int:
    if time_limit <= 0:
        return fail(f"--time-limit {time_limit:g}: give a number of seconds above 0")
    if workers < 0:
        return fail(f"--workers {workers}: give 0 (every core) or more")
    try:
        require_dask()
    except MissingExtra as exc:
        return fail(str(exc))
    folders = find_workspaces([Path(w) for w in workspaces])  # InputError: exit 2
    options = UnitOptions(time_limit=time_limit, workers=workers, seed=seed,
                          decompose=decompose)
    board = Board(sys.stderr)
    run = ManyRun(folders, options, on_change=board.changed)
    board.run = run
    try:
        with DaskCluster(run.news, scheduler=scheduler, workers_per_unit=workers,
                         units=units_at_a_time) as cluster:
            where = (f"the cluster at {scheduler}" if scheduler else
                     f"a local cluster of {cluster.units} worker"
                     f"{'s' if cluster.units != 1 else ''}")
            board.start(f"{len(folders)} units on {where}, {time_limit:g} s each, "
                        f"{workers or 'every'} search thread{'s' if workers != 1 else ''} "
                        "per unit")
            run.run(cluster)
    except ClusterUnreachable as exc:
        board.run = None
        return fail(f"{exc}; nothing written")
    except KeyboardInterrupt:  # a second Ctrl-C while the cluster closes
        run.interrupted = True
    finally:
        board.close()
    report_problems(run)
    if as_json:
        print_json(as_data(run, scheduler))
    if run.interrupted:
        written = sum(1 for u in run.units if u.written)
        print(f"interrupted: {written} roster{'s' if written != 1 else ''} written are kept; "
              f"{run.count('cancelled')} unit(s) cancelled", file=sys.stderr)
        return EXIT_INTERRUPTED
    if run.nothing_read:
        return EXIT_INPUT
    return EXIT_OK if run.all_done else EXIT_HARD


def report_problems(run: ManyRun) -> None:
    """After the board: each unit's whole error and warnings (the board shows one line)."""
    for unit in run.units:
        for warning in unit.warnings:
            print(f"{unit.name}: warning: {warning}", file=sys.stderr)
        if unit.error and unit.status != "cancelled":
            print(f"{unit.name}: {unit.status}: {unit.error}", file=sys.stderr)


def as_data(run: ManyRun, scheduler: str | None) -> dict[str, object]:
    return {
        "units": [u.as_json() for u in run.units],
        "total": {"units": len(run.units), "done": run.count("done"),
                  "failed": run.count("failed"), "refused": run.count("refused"),
                  "cancelled": run.count("cancelled"),
                  "retried": sum(1 for u in run.units if u.retried),
                  "seconds": round(run.seconds, 3), "interrupted": run.interrupted},
        "cluster": scheduler or "local",
    }


# -- the live lines -----------------------------------------------------------------------
def unit_line(unit: UnitState, width: int, now: float) -> str:
    text = f"  {unit.name:<{width}}  {unit.status:<8}"
    if unit.status in ("solving", "done") and (unit.penalty is not None
                                               or unit.bound is not None):
        penalty = "-" if unit.penalty is None else str(unit.penalty)
        bound = "-" if unit.bound is None else str(unit.bound)
        text += f"  penalty {penalty:>6}  bound {bound:>6}"
        if unit.gap is not None:
            text += f"  gap {unit.gap:5.1%}"
    if unit.status == "solving" and unit.started_at is not None:
        text += f"  {now - unit.started_at:5.1f} s"
    elif unit.seconds is not None and unit.status != "cancelled":
        text += f"  {unit.seconds:5.1f} s"
    if unit.retried:
        text += f"  (retried: {unit.attempts} attempts)"
    if unit.status == "done":
        text += "  written"
    elif unit.error and unit.status in ("failed", "refused"):
        first = unit.error.splitlines()
        text += "  " + (first[1].strip() if len(first) > 1 and first[0].endswith(":")
                        else first[0])
    return text


def total_line(run: ManyRun, now: float) -> str:
    counts = [f"{run.count(s)} {s}" for s in ("done", "solving", "queued", "failed", "refused",
                                              "cancelled") if run.count(s) or s in ("done",)]
    return f"  total: {len(run.units)} units: {', '.join(counts)}  {now - run.started:6.1f} s"


class Board:
    """One line per unit and a total on stderr: redrawn in place on a terminal (and every
    second, for the clocks), else one line per change of a unit's state."""

    def __init__(self, stream: TextIO):
        self.stream = stream
        self.live = stream.isatty()
        self.run: ManyRun | None = None
        self.lock = threading.Lock()
        self.drawn = 0  # lines of the block on screen
        self.last_draw = 0.0
        self.shown: dict[str, str] = {}  # the state last printed per unit (off a terminal)
        self.stop = threading.Event()
        self.ticker: threading.Thread | None = None
        self.started = False

    def start(self, title: str) -> None:
        self.started = True
        self.stream.write(f"solve-many: {title}\n")
        self.stream.flush()
        if self.live:
            self.ticker = threading.Thread(target=self._tick, daemon=True)
            self.ticker.start()
        self.redraw(force=True)

    def changed(self, unit: UnitState) -> None:
        if self.live:
            self.redraw(force=unit.finished)
            return
        with self.lock:
            if self.shown.get(unit.name) == unit.status + str(unit.attempts):
                return
            self.shown[unit.name] = unit.status + str(unit.attempts)
            assert self.run is not None
            width = max(len(u.name) for u in self.run.units)
            now = time.monotonic()
            self.stream.write(f"[{now - self.run.started:6.1f} s]"
                              + unit_line(unit, width, now).rstrip() + "\n")
            self.stream.flush()

    def _tick(self) -> None:
        while not self.stop.wait(1.0):
            self.redraw(force=True)

    def redraw(self, force: bool = False) -> None:
        if not self.live or self.run is None:
            return
        with self.lock:
            now = time.monotonic()
            if not force and now - self.last_draw < REDRAW_EVERY:
                return
            self.last_draw = now
            width = max(len(u.name) for u in self.run.units)
            columns = max(20, shutil.get_terminal_size().columns - 1)
            lines = [unit_line(u, width, now) for u in self.run.units]
            lines.append(total_line(self.run, now))
            out = f"\x1b[{self.drawn}F" if self.drawn else ""
            out += "".join("\x1b[2K" + line[:columns] + "\n" for line in lines)
            self.drawn = len(lines)
            self.stream.write(out)
            self.stream.flush()

    def close(self) -> None:
        self.stop.set()
        if self.ticker is not None:
            self.ticker.join()
        if self.run is None or not self.started:
            return
        if self.live:
            self.redraw(force=True)
        else:
            self.stream.write(total_line(self.run, time.monotonic()).strip() + "\n")
            self.stream.flush()
