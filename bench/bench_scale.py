"""The solver's scale series: generated units of 25, 50, 100 and 200 people x 28 days.

Not a test: run by hand, copy the table into BENCHMARKS.md.

    .venv/bin/python bench/bench_scale.py                       # 25 50 100 200, 60 s each
    .venv/bin/python bench/bench_scale.py --sizes 25 50 --time-limit 20

Each size runs in its own process so that its peak memory is its own. Measured:
load + build time, time to the first compliant roster, the penalty at the time limit
(with the solver's bound), and the peak resident memory of the process.
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

sys.path.insert(0, str(Path(__file__).resolve().parent))

from generate import write_unit  # noqa: E402

from rostertui.core.io.load import load_workspace  # noqa: E402
from rostertui.core.solver import SolveOptions, solve  # noqa: E402
from rostertui.core.solver.model import build_model  # noqa: E402


def run_one(people: int, time_limit: float, workers: int, out: mp.Queue) -> None:
    with tempfile.TemporaryDirectory() as tmp:
        folder = write_unit(Path(tmp) / "unit", people)
        t0 = time.perf_counter()
        ws = load_workspace(folder)
        load_s = time.perf_counter() - t0
        t0 = time.perf_counter()
        built = build_model(ws)
        build_s = time.perf_counter() - t0
        del built
        result = solve(ws, SolveOptions(time_limit=time_limit, workers=workers))
        peak_mib = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
        out.put({
            "people": people, "load_s": load_s, "build_s": build_s,
            "first_s": result.first_seconds, "status": result.status,
            "penalty": result.objective, "bound": result.bound,
            "compliant": bool(result.check and result.check.compliant),
            "solve_s": result.seconds, "peak_mib": peak_mib,
        })


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sizes", type=int, nargs="+", default=[25, 50, 100, 200])
    parser.add_argument("--time-limit", type=float, default=60.0)
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--json", action="store_true", help="print JSON rows instead")
    args = parser.parse_args()
    ctx = mp.get_context("spawn")
    rows = []
    print(f"# {platform.processor() or platform.machine()}, {os.cpu_count()} cores, "
          f"Python {platform.python_version()}, {args.workers} workers, "
          f"{args.time_limit:g} s limit", file=sys.stderr)
    for n in args.sizes:
        queue: mp.Queue = ctx.Queue()
        proc = ctx.Process(target=run_one, args=(n, args.time_limit, args.workers, queue))
        proc.start()
        row = queue.get()
        proc.join()
        rows.append(row)
        print(json.dumps(row), file=sys.stderr)
    if args.json:
        print(json.dumps(rows, indent=2))
        return 0
    print("| people x days | load + build (s) | first compliant roster (s) | penalty at "
          f"{args.time_limit:g} s | bound | status | peak memory (MiB) |")
    print("|---|---|---|---|---|---|---|")
    for r in rows:
        first = f"{r['first_s']:.1f}" if r["first_s"] is not None else "none"
        print(f"| {r['people']} x 28 | {r['load_s']:.2f} + {r['build_s']:.2f} | {first} | "
              f"{r['penalty']} | {r['bound']} | {r['status']} | {r['peak_mib']:.0f} |")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
