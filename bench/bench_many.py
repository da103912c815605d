"""solve-many's scale series: 1, 4, 8 and 16 generated units of 25 people x 28 days,
solved one after another and on a local Dask cluster, total wall time side by side.

Not a test: run by hand, copy the table into BENCHMARKS.md. Needs the extra
(`pip install 'rostertui[many]'`).

    .venv/bin/python bench/bench_many.py                         # 1 4 8 16 units, 60 s each
    .venv/bin/python bench/bench_many.py --units 1 2 --limit 3   # a smoke run

Both ways use the same limit and search threads per unit (`--workers`, default 1) and
do the same work per unit: the task (load + solve, `core/many/task.py`), the client's
referee and the write of roster.toml. One after another runs in a child process, so
its peak memory is its own; the cluster's peak is the largest of its worker
processes'. The cluster's wall time includes starting it (shown apart too); the local
cluster runs cores / workers units at once.
"""

from __future__ import annotations

import argparse
import json
import multiprocessing as mp
import os
import platform
import resource
import sys
import tempfile
import time
from pathlib import Path
from typing import Any

sys.path.insert(0, str(Path(__file__).resolve().parent))

from generate import write_unit  # noqa: E402

from rostertui.core.many.client import ManyRun  # noqa: E402
from rostertui.core.many.cluster import DaskCluster, units_at_once  # noqa: E402
from rostertui.core.many.files import read_files  # noqa: E402
from rostertui.core.many.task import UnitOptions, solve_unit  # noqa: E402
from rostertui.core.many.write import accept, digest, write_if_unchanged  # noqa: E402

PEOPLE, DAYS = 25, 28


def make_units(root: Path, count: int) -> list[Path]:
    return [write_unit(root / f"unit-{i:02d}", PEOPLE, DAYS, seed=i) for i in range(count)]


def sequential(folders: list[Path], options: UnitOptions, out: Any) -> None:
    """One after another, in this (child) process."""
    t0 = time.perf_counter()
    done, penalties = 0, []
    for folder in folders:
        files = read_files(folder)
        result = solve_unit(files, options)
        if result.roster_toml is not None:
            roster, check = accept(files, result.roster_toml, result.objective)
            write_if_unchanged(folder, roster, digest(files.get("roster.toml")))
            done += 1
            penalties.append(check.penalty)
    out.put({"seconds": time.perf_counter() - t0, "done": done, "penalties": penalties,
             "peak_mib": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024})


def on_cluster(folders: list[Path], options: UnitOptions) -> dict[str, Any]:
    t0 = time.perf_counter()
    run = ManyRun(folders, options)
    with DaskCluster(run.news, workers_per_unit=options.workers) as cluster:
        started = time.perf_counter() - t0
        run.run(cluster)

        def peak() -> float:
            return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024

        peaks = cluster.client.run(peak)
    return {"seconds": time.perf_counter() - t0, "start_s": started,
            "done": run.count("done"), "retried": sum(u.retried for u in run.units),
            "penalties": [u.penalty for u in run.units if u.status == "done"],
            "peak_mib": max(peaks.values(), default=0.0)}


def mean(values: list[Any]) -> str:
    return f"{sum(values) / len(values):.0f}" if values else "-"


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--units", type=int, nargs="+", default=[1, 4, 8, 16])
    parser.add_argument("--limit", "--time-limit", dest="limit", type=float, default=60.0,
                        help="seconds per unit (default 60)")
    parser.add_argument("--workers", type=int, default=1, help="search threads per unit")
    parser.add_argument("--json", action="store_true", help="print JSON rows instead")
    args = parser.parse_args()
    options = UnitOptions(time_limit=args.limit, workers=args.workers)
    at_once = units_at_once(args.workers)
    rows = []
    for count in args.units:
        with tempfile.TemporaryDirectory() as tmp:
            seq_folders = make_units(Path(tmp) / "seq", count)
            par_folders = make_units(Path(tmp) / "par", count)
            spawn = mp.get_context("spawn")
            out: mp.Queue[dict[str, Any]] = spawn.Queue()
            child = spawn.Process(target=sequential, args=(seq_folders, options, out))
            child.start()
            seq = out.get()
            child.join()
            par = on_cluster(par_folders, options)
        rows.append({"units": count, "sequential": seq, "cluster": par})
        print(f"{count} units done", file=sys.stderr, flush=True)
    if args.json:
        print(json.dumps(rows, indent=2))
        return 0
    print(f"{PEOPLE} people x {DAYS} days per unit, {args.limit:g} s and {args.workers} "
          f"search thread(s) per unit; local cluster of {at_once} worker(s); "
          f"{os.cpu_count()} cores, {platform.machine()}, Python {platform.python_version()}")
    print()
    print("| units | one after another (s) | local cluster (s) | of which starting it (s) "
          "| speed-up | rosters (seq / cluster) | mean penalty (seq / cluster) "
          "| peak MiB (seq / worker) |")
    print("|---|---|---|---|---|---|---|---|")
    for r in rows:
        s, c = r["sequential"], r["cluster"]
        print(f"| {r['units']} | {s['seconds']:.1f} | {c['seconds']:.1f} | {c['start_s']:.1f} "
              f"| {s['seconds'] / c['seconds']:.2f} x | {s['done']} / {c['done']} "
              f"| {mean(s['penalties'])} / {mean(c['penalties'])} "
              f"| {s['peak_mib']:.0f} / {c['peak_mib']:.0f} |")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
