"""Cursor-move and edit cost on 100 people x 31 days: a measurement, not a test
(pytest does not collect it). Run: .venv/bin/python bench/bench_grid.py

Wall time per key through the pilot includes the pilot's own waiting (a no-op key is
the baseline); CPU time per key is what the app spends (process time, same baseline).
"""
import asyncio
import statistics
import sys
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))
from rostertui.core.io.load import load_workspace  # noqa: E402
from rostertui.tui.app import RosterApp  # noqa: E402
from tests.tui.bigws import make_big_workspace  # noqa: E402


async def measure(pilot, keys):
    wall, cpu = [], []
    for k in keys:
        t, c = time.perf_counter(), time.process_time()
        await pilot.press(k)
        await pilot.pause()
        wall.append(time.perf_counter() - t)
        cpu.append(time.process_time() - c)
    return statistics.median(wall) * 1000, statistics.median(cpu) * 1000


async def main():
    ws = load_workspace(make_big_workspace(Path(tempfile.mkdtemp()) / "big"))
    for size in ((80, 24), (200, 50)):
        app = RosterApp(ws)
        async with app.run_test(size=size) as pilot:
            await pilot.pause()
            print(size, "violations", len(app.session.check.violations))
            for label, keys in (("no-op key", ["f12"] * 30),
                                ("cursor move", ["right"] * 20 + ["down"] * 40 + ["left"] * 10),
                                ("page down/up", ["pagedown", "pageup"] * 5),
                                ("edit + recheck", ["E", "L", "N", "minus"] * 5)):
                w, c = await measure(pilot, keys)
                print(f"  {label:15} wall {w:6.1f} ms   cpu {c:6.1f} ms (medians)")

if __name__ == "__main__":
    asyncio.run(main())
