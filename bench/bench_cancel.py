"""How long Esc takes to stop an explanation (F10) and a solve (F5), and how long a key
takes to answer while the solver runs: through the app itself, with the pilot.

Not a test: run by hand on a quiet machine (never beside the test suite or another
benchmark), copy the table into BENCHMARKS.md. The tests only check that Esc stops
them (tests/tui/test_app_explain.py, test_app_solve.py); the seconds are here.

    .venv/bin/python bench/bench_cancel.py                      # 100 people x 31 days
    .venv/bin/python bench/bench_cancel.py --people 20 --days 14 --repeat 1   # smoke

Each measurement waits until the work is under way (the explanation's conflict
search, the solve's search after its first roster), then presses Esc and times
until the screen reports the end. The workspace is tests/tui/bigws.py's.
"""

from __future__ import annotations

import argparse
import asyncio
import statistics
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from rostertui.core.io.load import load_workspace  # noqa: E402
from rostertui.core.models.workspace import Workspace  # noqa: E402
from rostertui.tui.app import RosterApp  # noqa: E402
from rostertui.tui.screens.explain import ExplainScreen  # noqa: E402
from rostertui.tui.screens.help import HelpScreen  # noqa: E402
from rostertui.tui.screens.solve import SolveScreen, SolveSettings  # noqa: E402
from tests.tui.bigws import make_big_workspace  # noqa: E402

SIZE = (120, 40)


async def until(pilot, done, limit: float) -> bool:
    deadline = time.monotonic() + limit
    while not done() and time.monotonic() < deadline:
        await pilot.pause(0.005)
    return done()


async def explain_stop(ws: Workspace, settings: SolveSettings) -> float | None:
    app = RosterApp(ws, settings)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.press("f10")
        screen = app.screen
        assert isinstance(screen, ExplainScreen)
        if not await until(pilot, lambda: screen.step.startswith("looking for hard items")
                           or screen.phase != "running", 60) or screen.phase != "running":
            return None  # over before Esc: nothing to measure
        await pilot.pause(0.2)  # into the search
        t = time.monotonic()
        await pilot.press("escape")
        await until(pilot, lambda: screen.phase != "running", 120)
        return time.monotonic() - t


async def solve_stop(ws: Workspace, settings: SolveSettings) -> float | None:
    app = RosterApp(ws, settings)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.press("f5", "enter")
        screen = app.screen
        assert isinstance(screen, SolveScreen)
        if not await until(pilot, lambda: screen.last_penalty is not None
                           or screen.phase != "running", settings.time_limit):
            return None
        if screen.phase != "running":
            return None
        t = time.monotonic()
        await pilot.press("escape")
        await until(pilot, lambda: screen.phase != "running", settings.time_limit + 30)
        return time.monotonic() - t


async def key_while_solving(ws: Workspace, settings: SolveSettings) -> float | None:
    app = RosterApp(ws, settings)
    async with app.run_test(size=SIZE) as pilot:
        await pilot.press("f5", "enter")
        screen = app.screen
        await pilot.pause(0.5)
        if screen.phase != "running":
            return None
        t = time.monotonic()
        app.simulate_key("f1")
        while not isinstance(app.screen, HelpScreen) and time.monotonic() - t < 10:
            await asyncio.sleep(0.001)
        took = time.monotonic() - t
        await pilot.press("escape", "escape")
        await until(pilot, lambda: screen.phase != "running", settings.time_limit + 30)
        return took


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--people", type=int, default=100)
    parser.add_argument("--days", type=int, default=31)
    parser.add_argument("--limit", type=float, default=60.0, help="solve time limit, s")
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--repeat", type=int, default=5)
    args = parser.parse_args()
    settings = SolveSettings(time_limit=args.limit, workers=args.workers)
    with tempfile.TemporaryDirectory() as tmp:
        ws = load_workspace(make_big_workspace(Path(tmp) / "ws", args.people, args.days))
        print(f"{args.people} people x {args.days} days, {args.workers} workers, "
              f"{args.repeat} runs each\n")
        print("| what | median s | max s | runs measured |")
        print("|---|---:|---:|---:|")
        for name, measure in (("Esc stops the explanation", explain_stop),
                              ("Esc stops the solve", solve_stop),
                              ("F1 answers while solving", key_while_solving)):
            times = [t for t in (asyncio.run(measure(ws, settings))
                                 for _ in range(args.repeat)) if t is not None]
            if times:
                print(f"| {name} | {statistics.median(times):.2f} | {max(times):.2f} "
                      f"| {len(times)} |")
            else:
                print(f"| {name} | - | - | 0 (over before the key) |")


if __name__ == "__main__":
    main()
